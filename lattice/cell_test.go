package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// unitPairs counts the pairs of sites at distance 1 (brute force).
func unitPairs(g *Graph) int {
	c := 0
	var p, q []float64
	for i := 0; i < g.Len(); i++ {
		for j := i + 1; j < g.Len(); j++ {
			p, q = g.Pos(p, i), g.Pos(q, j)
			var s float64
			for k := range p {
				s += (p[k] - q[k]) * (p[k] - q[k])
			}
			if math.Abs(s-1) < 1e-9 {
				c++
			}
		}
	}
	return c
}

func TestCellLatticesOpen(t *testing.T) {
	builders := []struct {
		name  string
		build func(w, h int, p bool) (*Graph, error)
		basis int
	}{
		{"honeycomb", Honeycomb, 2}, {"kagome", Kagome, 3}, {"lieb", Lieb, 3},
	}
	for _, bl := range builders {
		for _, w := range []int{1, 2, 4} {
			for _, h := range []int{1, 3} {
				g, err := bl.build(w, h, false)
				require.NoError(t, err)
				require.Equal(t, bl.basis*w*h, g.Len())
				requireValid(t, g)
				requireDistinctPositions(t, g)
				// Open patches bond exactly the pairs at unit distance.
				assert.Equal(t, unitPairs(g), g.NumBonds(), "%s %d×%d", bl.name, w, h)
				lo, hi := bondLengths(g)
				assert.InDelta(t, 1, lo, 1e-12)
				assert.InDelta(t, 1, hi, 1e-12)
			}
		}
	}
}

func TestCellLatticesPeriodic(t *testing.T) {
	for _, L := range []int{3, 4} {
		// Honeycomb: coordination 3, band [−3, 3] (references.md, [derived]).
		g, err := Honeycomb(L, L, true)
		require.NoError(t, err)
		requireValid(t, g)
		assert.Equal(t, 3*L*L, g.NumBonds())
		for _, d := range degrees(g) {
			assert.Equal(t, 3, d)
		}
		v := eigenvalues(t, g)
		assert.InDelta(t, -3, v[0], 1e-10)
		assert.InDelta(t, 3, v[len(v)-1], 1e-10)

		// Kagome: coordination 4, band [−2, 4], flat band at −2 of
		// multiplicity L²+1 (references.md, [derived]).
		g, err = Kagome(L, L, true)
		require.NoError(t, err)
		requireValid(t, g)
		assert.Equal(t, 6*L*L, g.NumBonds())
		for _, d := range degrees(g) {
			assert.Equal(t, 4, d)
		}
		v = eigenvalues(t, g)
		assert.InDelta(t, 4, v[len(v)-1], 1e-10)
		flat := 0
		for _, e := range v {
			assert.GreaterOrEqual(t, e, -2-1e-10)
			if math.Abs(e+2) < 1e-9 {
				flat++
			}
		}
		assert.Equal(t, L*L+1, flat)

		// Lieb: corners of degree 4, edge sites of degree 2; flat band at 0
		// and band edges ±2√2 (references.md, [derived]).
		g, err = Lieb(L, L, true)
		require.NoError(t, err)
		requireValid(t, g)
		assert.Equal(t, 4*L*L, g.NumBonds())
		for i, d := range degrees(g) {
			if i%3 == 0 {
				assert.Equal(t, 4, d)
			} else {
				assert.Equal(t, 2, d)
			}
		}
		v = eigenvalues(t, g)
		assert.InDelta(t, -2*math.Sqrt2, v[0], 1e-10)
		assert.InDelta(t, 2*math.Sqrt2, v[len(v)-1], 1e-10)
		zero := 0
		for _, e := range v {
			if math.Abs(e) < 1e-9 {
				zero++
			}
		}
		assert.GreaterOrEqual(t, zero, L*L)
	}
}

func TestCellLatticeOrder(t *testing.T) {
	// Documented positions of the basis sites of cell (1, 1).
	g, err := Honeycomb(3, 3, false)
	require.NoError(t, err)
	s3 := math.Sqrt(3)
	assert.InDeltaSlice(t, []float64{s3 + s3/2, 1.5}, g.Pos(nil, 2*4), 1e-12)
	assert.InDeltaSlice(t, []float64{s3 + s3, 2}, g.Pos(nil, 2*4+1), 1e-12)
	g, err = Kagome(3, 3, false)
	require.NoError(t, err)
	assert.InDeltaSlice(t, []float64{3, s3}, g.Pos(nil, 3*4), 1e-12)
	assert.InDeltaSlice(t, []float64{4, s3}, g.Pos(nil, 3*4+1), 1e-12)
	assert.InDeltaSlice(t, []float64{3.5, 1.5 * s3}, g.Pos(nil, 3*4+2), 1e-12)
	g, err = Lieb(3, 3, false)
	require.NoError(t, err)
	assert.Equal(t, []float64{2, 2}, g.Pos(nil, 3*4))
	assert.Equal(t, []float64{3, 2}, g.Pos(nil, 3*4+1))
	assert.Equal(t, []float64{2, 3}, g.Pos(nil, 3*4+2))
}

func TestCubic(t *testing.T) {
	for _, s := range [][3]int{{1, 1, 1}, {2, 3, 1}, {3, 3, 3}, {4, 2, 3}} {
		for _, periodic := range []bool{false, true} {
			g, err := Cubic(s[0], s[1], s[2], periodic)
			require.NoError(t, err)
			requireValid(t, g)
			require.Equal(t, s[0]*s[1]*s[2], g.Len())
			if !periodic {
				assert.Equal(t, unitPairs(g), g.NumBonds())
			}
			x, y, z := s[0]-1, s[1]-1, s[2]-1
			assert.Equal(t, []float64{float64(x), float64(y), float64(z)}, g.Pos(nil, x+s[0]*(y+s[1]*z)))
		}
	}
	// Periodic 4×4×4: coordination 6, band [−6, 6] (Bloch, common practice).
	g, err := Cubic(4, 4, 4, true)
	require.NoError(t, err)
	for _, d := range degrees(g) {
		assert.Equal(t, 6, d)
	}
	v := eigenvalues(t, g)
	assert.InDelta(t, -6, v[0], 1e-10)
	assert.InDelta(t, 6, v[len(v)-1], 1e-10)
}

func TestCellLatticeErrors(t *testing.T) {
	for _, f := range []func(w, h int, p bool) (*Graph, error){Honeycomb, Kagome, Lieb} {
		_, err := f(0, 3, false)
		requireInputError(t, err, fault.Invalid, "width")
		_, err = f(3, -2, true)
		requireInputError(t, err, fault.Invalid, "height")
		_, err = f(1<<15, 1<<15, true)
		requireInputError(t, err, fault.Invalid, "width")
	}
	_, err := Cubic(2, 2, 0, false)
	requireInputError(t, err, fault.Invalid, "depth")
	_, err = Cubic(1<<10, 1<<10, 1<<10, false)
	requireInputError(t, err, fault.Invalid, "width")
}
