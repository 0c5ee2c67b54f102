package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestComplete(t *testing.T) {
	for _, n := range []int{1, 2, 3, 6, 11} {
		g, err := Complete(n)
		require.NoError(t, err)
		requireValid(t, g)
		assert.Equal(t, n*(n-1)/2, g.NumBonds()) // common practice
		// Spectrum {N−1, −1×(N−1)} (references.md).
		if n > 1 {
			v := eigenvalues(t, g)
			for _, e := range v[:n-1] {
				assert.InDelta(t, -1, e, 1e-12)
			}
			assert.InDelta(t, float64(n-1), v[n-1], 1e-12)
		}
	}
	_, err := Complete(0)
	requireInputError(t, err, fault.Invalid, "sites")
	t.Setenv("AMPWALK_MEMORY_LIMIT", "1000000")
	_, err = Complete(1000) // ≈ 8·10⁶ bytes of bonds alone
	requireInputError(t, err, fault.TooLarge, "sites")
}

func TestStar(t *testing.T) {
	for _, leaves := range []int{1, 2, 5, 9} {
		g, err := Star(leaves)
		require.NoError(t, err)
		requireValid(t, g)
		assert.Equal(t, leaves+1, g.Len())
		assert.Equal(t, leaves, degrees(g)[0])
		lo, hi := bondLengths(g)
		assert.InDelta(t, 1, lo, 1e-12)
		assert.InDelta(t, 1, hi, 1e-12)
		// Star K_{1,n}: eigenvalues ±√n and 0 (n−1 times) (common practice).
		v := eigenvalues(t, g)
		assert.InDelta(t, -math.Sqrt(float64(leaves)), v[0], 1e-12)
		assert.InDelta(t, math.Sqrt(float64(leaves)), v[leaves], 1e-12)
		for _, e := range v[1:leaves] {
			assert.InDelta(t, 0, e, 1e-12)
		}
	}
	_, err := Star(0)
	requireInputError(t, err, fault.Invalid, "leaves")
}

func TestCayleyTree(t *testing.T) {
	for _, z := range []int{2, 3, 4, 5} {
		for shells := 0; shells <= 5; shells++ {
			g, err := CayleyTree(z, shells)
			require.NoError(t, err)
			// 1 + z((z−1)^shells − 1)/(z−2) sites, 1 + 2·shells for z = 2
			// (common practice; the assignment's formula).
			want := 1 + 2*shells
			if z > 2 {
				want = 1 + z*(ipow(z-1, shells)-1)/(z-2)
			}
			require.Equal(t, want, g.Len(), "z=%d shells=%d", z, shells)
			require.Equal(t, want-1, g.NumBonds())
			requireValid(t, g)
			deg := degrees(g)
			inner := 1 // sites inside the last shell
			if shells > 0 {
				inner = g.Len() - z*ipow(z-1, shells-1)
			}
			for i, d := range deg {
				switch {
				case shells == 0:
					assert.Equal(t, 0, d)
				case i < inner:
					assert.Equal(t, z, d)
				default:
					assert.Equal(t, 1, d)
				}
			}
			// Bond k joins site k+1 to its parent; shell r at radius r.
			for k := 0; k < g.NumBonds(); k++ {
				b := g.Bond(k)
				assert.Equal(t, k+1, b.J)
				assert.Less(t, b.I, b.J)
				ri, rj := math.Hypot(g.Pos(nil, b.I)[0], g.Pos(nil, b.I)[1]), math.Hypot(g.Pos(nil, b.J)[0], g.Pos(nil, b.J)[1])
				assert.InDelta(t, ri+1, rj, 1e-9)
			}
			if z > 2 {
				requireDistinctPositions(t, g)
			}
		}
	}
	_, err := CayleyTree(1, 3)
	requireInputError(t, err, fault.Invalid, "coordination")
	_, err = CayleyTree(3, -1)
	requireInputError(t, err, fault.Invalid, "shells")
	_, err = CayleyTree(3, 40) // 3·2⁴⁰ sites
	requireInputError(t, err, fault.Invalid, "shells")
}
