package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestSquareCounts(t *testing.T) {
	for _, w := range []int{1, 2, 3, 5} {
		for _, h := range []int{1, 2, 3, 4} {
			for _, periodic := range []bool{false, true} {
				g, err := Square(w, h, periodic)
				require.NoError(t, err)
				// (w−1)h + w(h−1) bonds open (common practice); each direction of
				// length ≥ 3 adds one bond per line when periodic (job-format contract).
				want := (w-1)*h + w*(h-1)
				if periodic && w >= 3 {
					want += h
				}
				if periodic && h >= 3 {
					want += w
				}
				assert.Equal(t, w*h, g.Len())
				assert.Equal(t, want, g.NumBonds(), "%d×%d periodic=%v", w, h, periodic)
				requireValid(t, g)
				for y := 0; y < h; y++ {
					for x := 0; x < w; x++ {
						// site x + w·y at (x, y): job-format contract.
						assert.Equal(t, []float64{float64(x), float64(y)}, g.Pos(nil, x+w*y))
					}
				}
				if !periodic {
					lo, hi := bondLengths(g)
					if g.NumBonds() > 0 {
						assert.Equal(t, 1.0, lo)
						assert.Equal(t, 1.0, hi)
					}
				}
			}
		}
	}
}

func TestSquareSpectrum(t *testing.T) {
	// Periodic L×L square lattice: eigenvalues 2cos(2πa/L) + 2cos(2πb/L)
	// (Bloch's theorem, common practice): band [−4, 4] for even L.
	g, err := Square(6, 6, true)
	require.NoError(t, err)
	v := eigenvalues(t, g)
	assert.InDelta(t, -4, v[0], 1e-12)
	assert.InDelta(t, 4, v[len(v)-1], 1e-12)
	var want []float64
	for a := 0; a < 6; a++ {
		for b := 0; b < 6; b++ {
			want = append(want, 2*math.Cos(2*math.Pi*float64(a)/6)+2*math.Cos(2*math.Pi*float64(b)/6))
		}
	}
	sortFloats(want)
	assert.InDeltaSlice(t, want, v, 1e-12)
}

func TestSquareErrors(t *testing.T) {
	_, err := Square(0, 3, false)
	requireInputError(t, err, fault.Invalid, "width")
	_, err = Square(3, -1, false)
	requireInputError(t, err, fault.Invalid, "height")
	_, err = Square(1<<20, 1<<20, false) // 2⁴⁰ sites > MaxSites
	requireInputError(t, err, fault.Invalid, "width")
}

func TestMemoryRefusal(t *testing.T) {
	t.Setenv("AMPWALK_MEMORY_LIMIT", "100000")
	_, err := Square(100, 100, false) // EstimateBytes(10⁴, 19800, 2) = 16·10⁴ + 16·19800 + 4·10001 = 516804 > 10⁵
	requireInputError(t, err, fault.TooLarge, "width")
	assert.Contains(t, err.Error(), "516804")
	_, err = Gasket(8)
	requireInputError(t, err, fault.TooLarge, "generation")
	_, err = Carpet(5, CarpetCorners)
	requireInputError(t, err, fault.TooLarge, "generation")
	_, err = Hypercube(12)
	requireInputError(t, err, fault.TooLarge, "dimension")
	_, err = Chain(10000, false)
	requireInputError(t, err, fault.TooLarge, "sites")
	g, err := Square(10, 10, false)
	require.NoError(t, err)
	assert.Equal(t, 100, g.Len())
}

func TestEstimateBytes(t *testing.T) {
	// The counts documented on EstimateBytes, by hand.
	assert.Equal(t, int64(8*10*2+8*9+4*11+8*9), EstimateBytes(10, 9, 2))
	assert.Equal(t, int64(4), EstimateBytes(0, 0, 0))
	assert.Equal(t, int64(4), EstimateBytes(-5, -1, 3))
	// A gasket of generation 14 (7,174,455 sites, 14,348,907 bonds) takes
	// about 0.4 GiB; it must not overflow.
	n, m := gasketSize(14)
	assert.Equal(t, int64(16*n+16*m+4*(n+1)), EstimateBytes(n, m, 2))
}
