package lattice

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestJitterStatistics checks that positional jitter of width σ on both ends
// of a bond of length d gives couplings of mean C(d) and standard deviation
// |C′(d)|·√2·σ_eff to first order (σ_eff = σ for Gauss, σ/√12 for Box: the
// standard deviation of the uniform law, common practice). Only the
// displacement along the bond matters to first order; the transverse
// coordinate enters at second order.
func TestJitterStatistics(t *testing.T) {
	const (
		spacing = 15.0 // µm, demo scale (Szameit & Nolte 2010, from memory; not a reference)
		reals   = 4000 // realisations: the sample std has relative error 1/√(2·4000) ≈ 1.1%
	)
	law := Exponential{C0: 1.5, Kappa: 0.2, D0: spacing}
	pos := []float64{0, 0, spacing, 0, 2 * spacing, 0} // a row of three in 2D
	for _, c := range []struct {
		name  string
		f     Fabrication
		sigma float64 // std of one coordinate
	}{
		{"gauss", Fabrication{Jitter: 0.1, Law: Gauss}, 0.1},
		{"box", Fabrication{Jitter: 0.3, Law: Box}, 0.3 / math.Sqrt(12)},
	} {
		gs, err := c.f.Ensemble(pos, 2, law, 1.5*spacing, nil, 11, reals)
		require.NoError(t, err)
		var sum, sum2 float64
		var m int
		for _, g := range gs {
			require.Equal(t, 2, g.NumBonds(), c.name)
			for k := 0; k < 2; k++ {
				w := g.Bond(k).W
				sum += w
				sum2 += w * w
				m++
			}
		}
		mean := sum / float64(m)
		std := math.Sqrt((sum2 - sum*sum/float64(m)) / float64(m-1))
		wantStd := math.Abs(law.Slope(spacing)) * math.Sqrt2 * c.sigma
		// The two bonds share a site, so the 2·reals couplings are not all
		// independent; per-bond std still holds. Allow 5% (≈4.5 sampling
		// errors for reals draws).
		assert.InDelta(t, wantStd, std, 0.05*wantStd, "%s std", c.name)
		// Mean: C(d)(1 + κ²σ_d²/2) to second order; allow 4 standard errors.
		sd := math.Sqrt2 * c.sigma
		wantMean := law.Coupling(spacing) * (1 + law.Kappa*law.Kappa*sd*sd/2)
		assert.InDelta(t, wantMean, mean, 4*wantStd/math.Sqrt(reals), "%s mean", c.name)
	}
}

func TestDetuningDisorder(t *testing.T) {
	// Box detuning of width 0.6: std 0.6/√12 (uniform law, common practice).
	law := Exponential{C0: 1, Kappa: 0.2, D0: 1}
	pos := make([]float64, 400)
	for i := range pos {
		pos[i] = float64(i)
	}
	f := Fabrication{Detuning: 0.6, Law: Box}
	base := make([]float64, 400)
	for i := range base {
		base[i] = 1
	}
	g, jp, err := f.Fabricate(pos, 1, law, 1.5, base, Realisation(3, 0))
	require.NoError(t, err)
	assert.Equal(t, pos, jp) // no positional jitter asked
	var s, s2 float64
	for i := 0; i < g.Len(); i++ {
		e := g.Onsite(i) - 1
		assert.LessOrEqual(t, math.Abs(e), 0.3)
		s += e
		s2 += e * e
	}
	n := float64(g.Len())
	std := math.Sqrt(s2/n - (s/n)*(s/n))
	assert.InDelta(t, 0.6/math.Sqrt(12), std, 0.1*0.6/math.Sqrt(12))
	assert.InDelta(t, 0, s/n, 4*0.6/math.Sqrt(12)/math.Sqrt(n))
}

func TestRealisationReproducible(t *testing.T) {
	law := Exponential{C0: 1, Kappa: 0.3, D0: 2}
	pos := []float64{0, 2, 4, 6, 8}
	f := Fabrication{Jitter: 0.05, Detuning: 0.01, Law: Gauss}
	gs, err := f.Ensemble(pos, 1, law, 3, nil, 42, 5)
	require.NoError(t, err)
	g3, _, err := f.Fabricate(pos, 1, law, 3, nil, Realisation(42, 3))
	require.NoError(t, err)
	require.Equal(t, gs[3].NumBonds(), g3.NumBonds())
	for k := 0; k < g3.NumBonds(); k++ {
		assert.Equal(t, gs[3].Bond(k), g3.Bond(k))
	}
	assert.Equal(t, gs[3].Onsite(2), g3.Onsite(2))
	assert.NotEqual(t, gs[2].Bond(0).W, gs[3].Bond(0).W)
}

func TestFabricationErrors(t *testing.T) {
	law := Exponential{C0: 1, Kappa: 0.3, D0: 2}
	var ie *InputError
	for _, c := range []struct {
		f     Fabrication
		field string
	}{
		{Fabrication{Jitter: -1}, "fabrication.jitter"},
		{Fabrication{Detuning: math.NaN()}, "fabrication.detuning"},
		{Fabrication{Law: Law(7)}, "fabrication.law"},
	} {
		_, _, err := c.f.Fabricate([]float64{0, 1}, 1, law, 2, nil, Realisation(1, 0))
		require.True(t, errors.As(err, &ie))
		assert.Equal(t, c.field, ie.Field)
	}
	_, err := Fabrication{}.Ensemble([]float64{0, 1}, 1, law, 2, nil, 1, 0)
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "realisations", ie.Field)
	_, _, err = Fabrication{}.Fabricate([]float64{0, 1}, 1, law, 2, nil, nil)
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "rng", ie.Field)
}
