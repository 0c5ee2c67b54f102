package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestChainCounts(t *testing.T) {
	for _, tc := range []struct {
		n        int
		periodic bool
		bonds    int // n−1 open, n periodic for n ≥ 3 (job-format contract)
	}{
		{1, false, 0}, {1, true, 0}, {2, false, 1}, {2, true, 1},
		{3, false, 2}, {3, true, 3}, {10, false, 9}, {10, true, 10},
	} {
		g, err := Chain(tc.n, tc.periodic)
		require.NoError(t, err)
		assert.Equal(t, tc.n, g.Len())
		assert.Equal(t, tc.bonds, g.NumBonds(), "n=%d periodic=%v", tc.n, tc.periodic)
		requireValid(t, g)
		for i := 0; i < tc.n; i++ {
			assert.Equal(t, []float64{float64(i), 0}, g.Pos(nil, i)) // job-format contract
		}
	}
}

func TestChainSpectra(t *testing.T) {
	for _, n := range []int{3, 4, 7, 12} {
		// Path P_N: 2cos(πk/(N+1)), cycle C_N: 2cos(2πk/N) (references.md, [derived]).
		g, err := Chain(n, false)
		require.NoError(t, err)
		got := eigenvalues(t, g)
		want := make([]float64, n)
		for k := 1; k <= n; k++ {
			want[n-k] = 2 * math.Cos(math.Pi*float64(k)/float64(n+1))
		}
		assert.InDeltaSlice(t, want, got, 1e-12)

		g, err = Chain(n, true)
		require.NoError(t, err)
		got = eigenvalues(t, g)
		want = want[:0]
		for k := 0; k < n; k++ {
			want = append(want, 2*math.Cos(2*math.Pi*float64(k)/float64(n)))
		}
		sortFloats(want)
		assert.InDeltaSlice(t, want, got, 1e-12)
	}
}

func TestChainErrors(t *testing.T) {
	for _, n := range []int{0, -3, MaxSites + 1} {
		_, err := Chain(n, false)
		requireInputError(t, err, fault.Invalid, "sites")
	}
}
