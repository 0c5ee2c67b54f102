package spectra

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/require"
)

// digitSet returns the points (i, j) of a base^g × base^g grid whose base-b
// digit pairs all belong to keep.
func digitSet(base, g int, keep func(a, b int) bool) []float64 {
	side := 1
	for range g {
		side *= base
	}
	var pts []float64
	for i := 0; i < side; i++ {
		for j := 0; j < side; j++ {
			ok := true
			for a, b, d := i, j, 0; d < g; a, b, d = a/base, b/base, d+1 {
				if !keep(a%base, b%base) {
					ok = false
					break
				}
			}
			if ok {
				pts = append(pts, float64(i), float64(j))
			}
		}
	}
	return pts
}

func TestBoxDimensionExactSets(t *testing.T) {
	cases := []struct {
		name string
		pts  []float64
		base int
		want float64
		cnt  float64 // boxes of the smallest side per level: count ratio
	}{
		// Gasket {(i,j): i AND j = 0} on a 2^g grid: 3^{g−k} boxes of side 2^k,
		// d_f = ln3/ln2; references.md [derived].
		{"gasket", digitSet(2, 7, func(a, b int) bool { return a&b == 0 }), 2, math.Log(3) / math.Log(2), 3},
		// Carpet: no digit pair (1,1): 8^{g−k} boxes, d_f = ln8/ln3; references.md [derived].
		{"carpet", digitSet(3, 4, func(a, b int) bool { return !(a == 1 && b == 1) }), 3, math.Log(8) / math.Log(3), 8},
		// Vicsek (cross): digit pairs (1,1), (0,1), (2,1), (1,0), (1,2): 5^{g−k}
		// boxes, d_f = ln5/ln3; references.md [derived].
		{"vicsek", digitSet(3, 4, func(a, b int) bool { return a == 1 || b == 1 }), 3, math.Log(5) / math.Log(3), 5},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r, err := BoxDimension(c.pts, 2, nil)
			require.NoError(t, err)
			require.Equal(t, c.base, r.Base)
			require.InDelta(t, c.want, r.Dimension, 1e-12)
			require.InDelta(t, 0, r.Error, 1e-12)
			require.Equal(t, float64(c.base), r.Smallest)
			for k := 1; k < len(r.Counts) && r.Counts[k] > 1; k++ {
				require.InDelta(t, c.cnt, r.Counts[k-1]/r.Counts[k], 1e-12)
			}
			// Uniform weights give the same exact counts.
			w := make([]float64, len(c.pts)/2)
			for i := range w {
				w[i] = 2.5
			}
			rw, err := BoxDimension(c.pts, 2, w)
			require.NoError(t, err)
			require.InDelta(t, c.want, rw.Dimension, 1e-9)
		})
	}
}

func TestBoxDimensionLattices(t *testing.T) {
	// A filled square grid has dimension 2 and a line 1 (common practice);
	// finite-size rounding of boxes at the edge biases them slightly low.
	var sq, line []float64
	for i := 0; i < 64; i++ {
		line = append(line, float64(i)*0.5)
		for j := 0; j < 64; j++ {
			sq = append(sq, float64(i), float64(j))
		}
	}
	r, err := BoxDimension(sq, 2, nil)
	require.NoError(t, err)
	// Base-2 boxes tile a 64-point side exactly: the counts are exact powers.
	require.InDelta(t, 2, r.Dimension, 0.02)
	r, err = BoxDimension(line, 1, nil)
	require.NoError(t, err)
	require.InDelta(t, 1, r.Dimension, 0.02)
	require.Equal(t, 1.0, r.Smallest)

	// The gasket graph's own (triangular) positions: ln3/ln2 ≈ 1.585
	// (references.md). The grid is not aligned with the set; with the fit
	// stopped at extent/4 the estimate is 1.576 at g = 7 and 1.580 at g = 9
	// (issue 6: an independent numpy box count with the same rule gives 1.585 and
	// 1.589), hence ±0.03 (common practice for box counts).
	for _, gen := range []int{7, 9} {
		g := gasketGraph(t, gen)
		r, err = BoxDimension(g.Coords(), 2, nil)
		require.NoError(t, err)
		require.InDelta(t, math.Log(3)/math.Log(2), r.Dimension, 0.03, "g=%d", gen)
		require.LessOrEqual(t, r.Largest, extentOf(g.Coords(), 2)/4*(1+1e-9), "g=%d", gen)
	}
}

func TestBoxDimensionWeightedIgnoresTails(t *testing.T) {
	// Tiny weights off the set barely move the information dimension.
	pts := digitSet(2, 6, func(a, b int) bool { return true }) // full 64×64 grid
	w := make([]float64, len(pts)/2)
	for i := range w {
		x, y := int(pts[2*i]), int(pts[2*i+1])
		if x&y == 0 {
			w[i] = 1
		} else {
			w[i] = 1e-12
		}
	}
	r, err := BoxDimension(pts, 2, w)
	require.NoError(t, err)
	require.InDelta(t, math.Log(3)/math.Log(2), r.Dimension, 1e-6)
}

func TestBoxDimensionErrors(t *testing.T) {
	var fe *InputError
	for _, c := range []struct {
		coords  []float64
		dim     int
		weights []float64
		field   string
	}{
		{[]float64{0, 1, 2}, 2, nil, "positions"},
		{[]float64{0, 1}, 0, nil, "positions"},
		{[]float64{1, 1, 1}, 1, nil, "positions"},
		{[]float64{0, 1, 2}, 1, nil, "positions"}, // too few scales
		{[]float64{0, math.NaN()}, 1, nil, "positions"},
		{[]float64{0, 1}, 1, []float64{1}, "weights"},
		{[]float64{0, 1}, 1, []float64{0, 0}, "weights"},
		{[]float64{0, 1}, 1, []float64{-1, 2}, "weights[0]"},
	} {
		_, err := BoxDimension(c.coords, c.dim, c.weights)
		require.True(t, errors.As(err, &fe), "%v", c)
		require.Equal(t, c.field, fe.Field)
	}
}

// extentOf is the largest coordinate range of the points.
func extentOf(coords []float64, dim int) float64 {
	var e float64
	for c := 0; c < dim; c++ {
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := c; i < len(coords); i += dim {
			lo, hi = math.Min(lo, coords[i]), math.Max(hi, coords[i])
		}
		e = math.Max(e, hi-lo)
	}
	return e
}
