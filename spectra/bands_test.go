package spectra

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/require"
)

// kGrid returns k = (m_1/L) b_1 + (m_2/L) b_2 for m_1, m_2 in [0, L).
func kGrid(t *testing.T, c *UnitCell, L int) [][]float64 {
	b, err := c.Reciprocal()
	require.NoError(t, err)
	var ks [][]float64
	for m1 := 0; m1 < L; m1++ {
		for m2 := 0; m2 < L; m2++ {
			f1, f2 := float64(m1)/float64(L), float64(m2)/float64(L)
			ks = append(ks, []float64{f1*b[0] + f2*b[2], f1*b[1] + f2*b[3]})
		}
	}
	return ks
}

func blochValues(t *testing.T, c *UnitCell, k []float64) []float64 {
	h, err := c.Bloch(1, k)
	require.NoError(t, err)
	v, _, err := HermEigen(h, c.Sites(), false)
	require.NoError(t, err)
	return v
}

func TestCellRanges(t *testing.T) {
	s8 := 2 * math.Sqrt2
	// Spectral ranges with H = +A: references.md [derived]; the square
	// lattice [−4, 4] is common practice.
	cases := []struct {
		name   string
		cell   *UnitCell
		lo, hi float64
	}{
		{"square", SquareCell(), -4, 4},
		{"triangular", TriangularCell(), -3, 6},
		{"honeycomb", HoneycombCell(), -3, 3},
		{"kagome", KagomeCell(), -2, 4},
		{"lieb", LiebCell(), -s8, s8},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			lo, hi := math.Inf(1), math.Inf(-1)
			for _, k := range kGrid(t, c.cell, 12) {
				v := blochValues(t, c.cell, k)
				lo, hi = math.Min(lo, v[0]), math.Max(hi, v[len(v)-1])
				switch c.name {
				case "kagome": // flat band at −2: references.md [derived]
					require.InDelta(t, -2, v[0], 1e-12)
				case "lieb": // flat band at 0: references.md [derived]
					require.InDelta(t, 0, v[1], 1e-12)
				}
			}
			// The 12×12 grid contains Γ, K (for the hexagonal cells), X and M,
			// where the extremes sit.
			require.InDelta(t, c.lo, lo, 1e-12)
			require.InDelta(t, c.hi, hi, 1e-12)
		})
	}
}

func TestHighSymmetryPoints(t *testing.T) {
	// Honeycomb Dirac point: the gap closes at K (references.md [derived]).
	v := blochValues(t, HoneycombCell(), HoneycombCell().Points["K"])
	require.InDelta(t, 0, v[0], 1e-12)
	require.InDelta(t, 0, v[1], 1e-12)
	// Triangular minimum −3 at K, maximum 6 at Γ (references.md [derived]).
	require.InDelta(t, -3, blochValues(t, TriangularCell(), TriangularCell().Points["K"])[0], 1e-12)
	require.InDelta(t, 6, blochValues(t, TriangularCell(), []float64{0, 0})[0], 1e-12)
	// Kagome: the dispersive bands touch the flat band at Γ (value −2, twice)
	// and meet each other at K (Dirac point at 1): derived from
	// H(k) = A(k) with eigenvalues −2 and 1 ± √(3 + 2Σcos).
	vk := blochValues(t, KagomeCell(), KagomeCell().Points["K"])
	require.InDelta(t, 1, vk[1], 1e-12)
	require.InDelta(t, 1, vk[2], 1e-12)
	vg := blochValues(t, KagomeCell(), []float64{0, 0})
	require.InDeltaSlice(t, []float64{-2, -2, 4}, vg, 1e-12)
	// Lieb: all three bands meet at M (zero), the edges ±2√2 at Γ.
	require.InDeltaSlice(t, []float64{0, 0, 0}, blochValues(t, LiebCell(), LiebCell().Points["M"]), 1e-12)
}

func TestPeriodicMatchesBloch(t *testing.T) {
	// The L×L periodic lattice has the union of the H(k) spectra over the
	// k grid as its spectrum (Bloch's theorem, common practice).
	const L = 6
	for _, c := range []*UnitCell{SquareCell(), TriangularCell(), HoneycombCell(), KagomeCell(), LiebCell()} {
		g, err := c.Periodic(L, L)
		require.NoError(t, err)
		require.Equal(t, L*L*c.Sites(), g.Len())
		require.Equal(t, L*L*len(c.Hops), g.NumBonds())
		full, err := Eigenvalues(g, 1)
		require.NoError(t, err)
		var union []float64
		for _, k := range kGrid(t, c, L) {
			union = append(union, blochValues(t, c, k)...)
		}
		requireClose(t, union, full, 1e-10)
	}
	// Kagome flat band at −2 with multiplicity L² + 1 on the periodic L×L
	// lattice (references.md [derived]).
	g, err := KagomeCell().Periodic(L, L)
	require.NoError(t, err)
	v, err := Eigenvalues(g, 1)
	require.NoError(t, err)
	var m int
	for _, x := range v {
		if math.Abs(x+2) < 1e-9 {
			m++
		}
	}
	require.Equal(t, L*L+1, m)
}

func TestBandsPath(t *testing.T) {
	c := KagomeCell()
	p := [][]float64{c.Points["Γ"], c.Points["K"], c.Points["M"], c.Points["Γ"]}
	bp, err := Bands(c, 1, p, 20)
	require.NoError(t, err)
	require.Len(t, bp.K, 61)
	require.Equal(t, []int{0, 20, 40, 60}, bp.Corners)
	for i := 1; i < len(bp.Distance); i++ {
		require.Greater(t, bp.Distance[i], bp.Distance[i-1])
	}
	for _, e := range bp.Energy {
		require.Len(t, e, 3)
		require.InDelta(t, -2, e[0], 1e-12)
	}
	// γ scales the bands.
	bp2, err := Bands(c, 0.5, p, 20)
	require.NoError(t, err)
	require.InDelta(t, 0.5*bp.Energy[7][2], bp2.Energy[7][2], 1e-12)
}

func TestCellErrors(t *testing.T) {
	var fe *InputError
	bad := SquareCell()
	bad.Hops = append(bad.Hops, Hop{0, 0, []int{0, 0}, 1})
	_, err := Bands(bad, 1, [][]float64{{0, 0}, {1, 0}}, 3)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "cell.hops[2]", fe.Field)
	sing := SquareCell()
	sing.Vectors = []float64{1, 0, 2, 0}
	_, err = sing.Reciprocal()
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "cell.vectors", fe.Field)
	_, err = Bands(SquareCell(), 1, [][]float64{{0, 0}}, 3)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "path", fe.Field)
	_, err = Bands(SquareCell(), 1, [][]float64{{0, 0}, {1, 1}}, 0)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "points", fe.Field)
	_, err = SquareCell().Periodic(2, 2) // bonds wrap onto each other
	require.True(t, errors.As(err, &fe))
	_, err = SquareCell().Bloch(1, []float64{0})
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "k", fe.Field)
}
