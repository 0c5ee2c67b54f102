package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestTriangleCounts(t *testing.T) {
	for L := 1; L <= 8; L++ {
		g, err := Triangle(L)
		require.NoError(t, err)
		// (L+1)(L+2)/2 sites (job-format contract), 3L(L+1)/2 bonds: L(L+1)/2
		// unit up-triangles, three bonds each, no bond shared (common practice).
		assert.Equal(t, (L+1)*(L+2)/2, g.Len())
		assert.Equal(t, 3*L*(L+1)/2, g.NumBonds())
		requireValid(t, g)
		lo, hi := bondLengths(g)
		assert.InDelta(t, 1, lo, 1e-12)
		assert.InDelta(t, 1, hi, 1e-12)
		// Corners (job-format contract): indices 0, L and the last site.
		assert.InDeltaSlice(t, []float64{0, 0}, g.Pos(nil, 0), 1e-12)
		assert.InDeltaSlice(t, []float64{float64(L), 0}, g.Pos(nil, L), 1e-12)
		assert.InDeltaSlice(t, []float64{float64(L) / 2, float64(L) * math.Sqrt(3) / 2}, g.Pos(nil, g.Len()-1), 1e-12)
		// Interior sites have six neighbours, corners two, other edge sites four.
		deg := degrees(g)
		for i, d := range deg {
			switch i {
			case 0, L, g.Len() - 1:
				assert.Equal(t, 2, d)
			default:
				assert.Contains(t, []int{4, 6}, d)
			}
		}
		// Every pair of sites at distance 1 is bonded: brute force.
		pairs := 0
		var p, q []float64
		for i := 0; i < g.Len(); i++ {
			for j := i + 1; j < g.Len(); j++ {
				p, q = g.Pos(p, i), g.Pos(q, j)
				if math.Abs(math.Hypot(p[0]-q[0], p[1]-q[1])-1) < 1e-9 {
					pairs++
				}
			}
		}
		assert.Equal(t, g.NumBonds(), pairs)
	}
}

func TestTriangularPatch(t *testing.T) {
	for _, w := range []int{1, 2, 3, 4} {
		for _, h := range []int{1, 2, 3, 5} {
			for _, periodic := range []bool{false, true} {
				g, err := TriangularPatch(w, h, periodic)
				require.NoError(t, err)
				requireValid(t, g)
				assert.Equal(t, w*h, g.Len())
				if !periodic {
					// (w−1)h + w(h−1) + (w−1)(h−1) bonds (common practice).
					assert.Equal(t, (w-1)*h+w*(h-1)+(w-1)*(h-1), g.NumBonds())
				}
				if periodic && w >= 3 && h >= 3 {
					assert.Equal(t, 3*w*h, g.NumBonds()) // coordination 6
					for _, d := range degrees(g) {
						assert.Equal(t, 6, d)
					}
				}
				assert.InDeltaSlice(t, []float64{float64(w-1) + float64(h-1)/2, float64(h-1) * math.Sqrt(3) / 2}, g.Pos(nil, w*h-1), 1e-12)
			}
		}
	}
	// Periodic triangular lattice band [−3, 6] (references.md, [derived]);
	// −3 is reached at the K points, which a 6×6 torus contains.
	g, err := TriangularPatch(6, 6, true)
	require.NoError(t, err)
	v := eigenvalues(t, g)
	assert.InDelta(t, -3, v[0], 1e-12)
	assert.InDelta(t, 6, v[len(v)-1], 1e-12)
}

func TestTriangularErrors(t *testing.T) {
	for _, L := range []int{0, -1, 1 << 16} {
		_, err := Triangle(L)
		requireInputError(t, err, fault.Invalid, "side")
	}
	_, err := TriangularPatch(0, 2, true)
	requireInputError(t, err, fault.Invalid, "width")
	_, err = TriangularPatch(2, 0, true)
	requireInputError(t, err, fault.Invalid, "height")
}

func TestTriangleOrder(t *testing.T) {
	// The order documented on Triangle: row r starts at r(L+1) − r(r−1)/2
	// and site a of row r sits at (a + r/2, r√3/2).
	L := 5
	g, err := Triangle(L)
	require.NoError(t, err)
	for r := 0; r <= L; r++ {
		for a := 0; a <= L-r; a++ {
			i := r*(L+1) - r*(r-1)/2 + a
			assert.InDeltaSlice(t, []float64{float64(a) + float64(r)/2, float64(r) * math.Sqrt(3) / 2}, g.Pos(nil, i), 1e-12)
		}
	}
}
