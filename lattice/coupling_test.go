package lattice

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestExponentialCoupling(t *testing.T) {
	// C(d) = C0·exp(−κ(d − d0)), common practice; the numbers are arbitrary
	// demo-scale values (C0 = 1.5 cm⁻¹ at 15 µm, κ = 0.2 µm⁻¹), not
	// references.
	law := Exponential{C0: 1.5, Kappa: 0.2, D0: 15}
	for _, c := range []struct{ d, want float64 }{
		{15, 1.5},
		{20, 1.5 * math.Exp(-1)},
		{10, 1.5 * math.Exp(1)},
		{15 * math.Sqrt2, 1.5 * math.Exp(-0.2*15*(math.Sqrt2-1))},
	} {
		assert.InDelta(t, c.want, law.Coupling(c.d), 1e-14*c.want, "d=%v", c.d)
		assert.InDelta(t, -0.2*c.want, law.Slope(c.d), 1e-14*c.want, "slope d=%v", c.d)
	}
}

func TestFromPositionsSquareNNN(t *testing.T) {
	// A 3×3 square array of spacing 15: with cutoff 16 only the 12 nearest
	// bonds; with cutoff 22 (> 15√2) the 8 diagonals appear too (counts:
	// 2·3·2 = 12 edges and 2·2·2 = 8 diagonals of a 3×3 grid, common practice).
	pos := make([]float64, 0, 18)
	for y := 0; y < 3; y++ {
		for x := 0; x < 3; x++ {
			pos = append(pos, 15*float64(x), 15*float64(y))
		}
	}
	law := Exponential{C0: 1.5, Kappa: 0.2, D0: 15}
	g, err := FromPositions(pos, 2, law, 16, nil)
	require.NoError(t, err)
	assert.Equal(t, 9, g.Len())
	assert.Equal(t, 12, g.NumBonds())
	for k := 0; k < g.NumBonds(); k++ {
		assert.InDelta(t, 1.5, g.Bond(k).W, 1e-14)
	}
	g, err = FromPositions(pos, 2, law, 22, nil)
	require.NoError(t, err)
	assert.Equal(t, 20, g.NumBonds())
	nnn := law.Coupling(15 * math.Sqrt2)
	diag := 0
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		require.Less(t, b.I, b.J)
		if math.Abs(b.W-nnn) < 1e-14 {
			diag++
		}
	}
	assert.Equal(t, 8, diag)
}

// TestFromPositionsMatchesAllPairs compares the cell-grid search with the
// O(N²) loop over all pairs on random clouds in 1 to 4 dimensions.
func TestFromPositionsMatchesAllPairs(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 1))
	law := Exponential{C0: 1, Kappa: 0.5, D0: 1}
	for trial := 0; trial < 40; trial++ {
		dim := 1 + trial%4
		n := 1 + rng.IntN(120)
		pos := make([]float64, n*dim)
		for k := range pos {
			pos[k] = 10 * (rng.Float64() - 0.3)
		}
		cutoff := 0.5 + 3*rng.Float64()
		g, err := FromPositions(pos, dim, law, cutoff, nil)
		require.NoError(t, err)
		want := map[[2]int]float64{}
		for i := 0; i < n; i++ {
			for j := i + 1; j < n; j++ {
				var s float64
				for a := 0; a < dim; a++ {
					d := pos[i*dim+a] - pos[j*dim+a]
					s += d * d
				}
				if math.Sqrt(s) <= cutoff {
					want[[2]int{i, j}] = law.Coupling(math.Sqrt(s))
				}
			}
		}
		require.Equal(t, len(want), g.NumBonds(), "trial %d", trial)
		// FromPositions skips New's checks; New must accept its bonds.
		bonds := make([]Bond, g.NumBonds())
		for k := range bonds {
			bonds[k] = g.Bond(k)
		}
		_, err = New(n, dim, g.Coords(), bonds, nil)
		require.NoError(t, err)
		for k := 0; k < g.NumBonds(); k++ {
			b := g.Bond(k)
			if k > 0 {
				p := g.Bond(k - 1)
				require.True(t, p.I < b.I || (p.I == b.I && p.J < b.J), "bonds ordered by (I, J)")
			}
			w, ok := want[[2]int{b.I, b.J}]
			require.True(t, ok)
			assert.InDelta(t, w, b.W, 1e-12*w)
		}
	}
}

func TestTableLaw(t *testing.T) {
	// Log-linear interpolation is exact for an exponential law (common
	// practice): calibrate at three distances and compare between them.
	exp := Exponential{C0: 2, Kappa: 0.18, D0: 13}
	ds := []float64{10, 14, 20}
	cs := []float64{exp.Coupling(10), exp.Coupling(14), exp.Coupling(20)}
	tab, err := NewTable(ds, cs, false)
	require.NoError(t, err)
	for _, d := range []float64{10, 11.5, 14, 17.2, 20} {
		assert.InDelta(t, exp.Coupling(d), tab.Coupling(d), 1e-13, "d=%v", d)
		assert.InDelta(t, exp.Slope(d), tab.Slope(d), 1e-12, "slope d=%v", d)
	}
	assert.True(t, math.IsNaN(tab.Coupling(21)))
	lo, hi := tab.Domain()
	assert.Equal(t, 10.0, lo)
	assert.Equal(t, 20.0, hi)

	// Refusal: a chain of spacing 15 with cutoff 31 pairs sites 30 apart,
	// beyond the table's last distance 20.
	pos := []float64{0, 15, 30}
	_, err = FromPositions(pos, 1, tab, 31, nil)
	var ie *InputError
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "law", ie.Field)
	assert.Contains(t, ie.Msg, "30")
	// Within range it builds; with clamping the far pair takes C(20).
	g, err := FromPositions(pos, 1, tab, 16, nil)
	require.NoError(t, err)
	assert.Equal(t, 2, g.NumBonds())
	ct, err := NewTable(ds, cs, true)
	require.NoError(t, err)
	g, err = FromPositions(pos, 1, ct, 31, nil)
	require.NoError(t, err)
	require.Equal(t, 3, g.NumBonds())
	assert.InDelta(t, cs[2], g.Bond(1).W, 1e-15) // bond (0, 2) at d = 30
	assert.InDelta(t, cs[0], ct.Coupling(5), 1e-15)
}

func TestCouplingErrors(t *testing.T) {
	law := Exponential{C0: 1, Kappa: 0.2, D0: 1}
	cases := []struct {
		name  string
		err   func() error
		field string
	}{
		{"dim", func() error { _, err := FromPositions([]float64{0}, 0, law, 1, nil); return err }, "dim"},
		{"ragged", func() error { _, err := FromPositions([]float64{0, 1, 2}, 2, law, 1, nil); return err }, "positions"},
		{"nan", func() error { _, err := FromPositions([]float64{0, math.NaN()}, 1, law, 1, nil); return err }, "positions"},
		{"cutoff", func() error { _, err := FromPositions([]float64{0, 1}, 1, law, 0, nil); return err }, "cutoff"},
		{"nil law", func() error { _, err := FromPositions([]float64{0, 1}, 1, nil, 2, nil); return err }, "law"},
		{"kappa", func() error {
			_, err := FromPositions([]float64{0, 1}, 1, Exponential{C0: 1, Kappa: -1}, 2, nil)
			return err
		}, "law.kappa"},
		{"coincide", func() error { _, err := FromPositions([]float64{0, 1, 1}, 1, law, 2, nil); return err }, "positions"},
		{"detuning len", func() error { _, err := FromPositions([]float64{0, 1}, 1, law, 2, []float64{0}); return err }, "detuning"},
		{"detuning nan", func() error {
			_, err := FromPositions([]float64{0, 1}, 1, law, 2, []float64{0, math.Inf(1)})
			return err
		}, "detuning[1]"},
		{"table short", func() error { _, err := NewTable([]float64{1}, []float64{1}, false); return err }, "law.distance"},
		{"table order", func() error { _, err := NewTable([]float64{1, 1}, []float64{1, 2}, false); return err }, "law.distance[1]"},
		{"table neg", func() error { _, err := NewTable([]float64{1, 2}, []float64{1, 0}, false); return err }, "law.coupling[1]"},
		{"overflow", func() error {
			_, err := FromPositions([]float64{0, 1}, 1, Exponential{C0: 1, Kappa: 1000, D0: 10}, 2, nil)
			return err
		}, "law"},
	}
	for _, c := range cases {
		err := c.err()
		var ie *InputError
		require.True(t, errors.As(err, &ie), "%s: %v", c.name, err)
		assert.Equal(t, c.field, ie.Field, c.name)
	}
}

func TestFromPositionsDetuning(t *testing.T) {
	g, err := FromPositions([]float64{0, 1, 2}, 1, Exponential{C0: 1, Kappa: 0, D0: 0}, 1.5, []float64{0.1, -0.2, 0.3})
	require.NoError(t, err)
	assert.Equal(t, -0.2, g.Onsite(1))
	assert.Equal(t, 2, g.NumBonds())
}

func BenchmarkFromPositions100k(b *testing.B) {
	// 100 000 sites in a 316×316 square array with NNN inside the cutoff.
	side := 316
	pos := make([]float64, 0, 2*side*side)
	for y := 0; y < side; y++ {
		for x := 0; x < side; x++ {
			pos = append(pos, 15*float64(x), 15*float64(y))
		}
	}
	law := Exponential{C0: 1.5, Kappa: 0.2, D0: 15}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := FromPositions(pos, 2, law, 22, nil); err != nil {
			b.Fatal(err)
		}
	}
}
