package lattice

import (
	"math/bits"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestHypercube(t *testing.T) {
	for d := 1; d <= 8; d++ {
		g, err := Hypercube(d)
		require.NoError(t, err)
		n := 1 << d
		// 2^d sites, d·2^(d−1) bonds (common practice).
		require.Equal(t, n, g.Len())
		require.Equal(t, d*n/2, g.NumBonds())
		require.Equal(t, d, g.Dim())
		requireValid(t, g)
		for k := 0; k < g.NumBonds(); k++ {
			b := g.Bond(k)
			// site i bonds to i XOR 2^k (job-format contract).
			assert.Equal(t, 1, bits.OnesCount(uint(b.I^b.J)))
		}
		// Squared distance = Hamming distance (job-format contract).
		var p, q []float64
		for i := 0; i < n; i += 3 {
			for j := 0; j < n; j += 5 {
				p, q = g.Pos(p, i), g.Pos(q, j)
				var s float64
				for c := range p {
					s += (p[c] - q[c]) * (p[c] - q[c])
				}
				assert.Equal(t, float64(bits.OnesCount(uint(i^j))), s)
			}
		}
		if d <= 6 {
			// Eigenvalues d − 2k with multiplicity C(d, k): Christandl, Datta,
			// Ekert, Landahl, PRL 92, 187902 (2004) (references.md).
			var want []float64
			for k := 0; k <= d; k++ {
				for range binom(d, k) {
					want = append(want, float64(d-2*k))
				}
			}
			sortFloats(want)
			assert.InDeltaSlice(t, want, eigenvalues(t, g), 1e-10)
		}
	}
	for _, d := range []int{0, -1, MaxHypercubeDimension + 1} {
		_, err := Hypercube(d)
		requireInputError(t, err, fault.Invalid, "dimension")
	}
}

func binom(n, k int) int {
	r := 1
	for i := 1; i <= k; i++ {
		r = r * (n - k + i) / i
	}
	return r
}
