package measure

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// chainData returns synthetic intensities of a quantum walk on a long chain
// (sites 0…n−1 at x = j, start in the middle) with coupling c at lengths z:
// p_j = J_{j−start}(2cz)² (infinite chain, Childs, Farhi & Gutmann,
// Quantum Inf. Process. 1, 35 (2002), from memory), times an amplitude and
// multiplicative log-normal noise of relative width rel; the uncertainty
// column is rel·I.
func chainData(n int, c float64, z []float64, rel float64, rng *rand.Rand) (*Measurement, Geometry) {
	start := n / 2
	m := &Measurement{Lengths: z}
	for _, zk := range z {
		in := make([]float64, n)
		un := make([]float64, n)
		for j := range in {
			b := math.Jn(j-start, 2*c*zk)
			in[j] = 1000 * b * b * math.Exp(rel*rng.NormFloat64())
			un[j] = rel * in[j]
		}
		m.Intensity = append(m.Intensity, in)
		m.Uncertainty = append(m.Uncertainty, un)
	}
	coords := make([]float64, n)
	for j := range coords {
		coords[j] = float64(j)
	}
	return m, Geometry{Coords: coords, Dim: 1, Start: start}
}

func TestReduceExact(t *testing.T) {
	// Without noise the MSD is 2(cz)² (Childs et al. 2002, from memory;
	// references.md [derived]) and the spread equals it (centroid at the
	// start by symmetry).
	z := []float64{0.5, 1, 2, 3}
	m, g := chainData(101, 1.3, z, 0, rand.New(rand.NewPCG(1, 1)))
	r, err := Reduce(m, g)
	require.NoError(t, err)
	for k, pt := range r.Points {
		want := 2 * 1.3 * 1.3 * z[k] * z[k]
		assert.InDelta(t, want, pt.MSD, 1e-10*want)
		assert.InDelta(t, want, pt.Spread, 1e-9*want)
		assert.Zero(t, pt.MSDErr)
		var s float64
		for _, p := range r.P[k] {
			s += p
		}
		assert.InDelta(t, 1, s, 1e-14)
	}
	// Return probability at z = 0.5: J0(1.3)² from Go's math.J0.
	j0 := math.J0(1.3)
	assert.InDelta(t, j0*j0, r.P[0][50], 1e-14)
}

// TestReduceErrorsMatchScatter checks the first-order propagated errors of
// MSD, spread and IPR against the scatter over 400 noisy copies (Monte
// Carlo; the sample std of 400 draws is good to ≈ 1/√800 ≈ 3.5%, allow 12%).
func TestReduceErrorsMatchScatter(t *testing.T) {
	z := []float64{1.5}
	const copies = 400
	var ms, ss, is [copies]float64
	var stated Point
	for s := 0; s < copies; s++ {
		m, g := chainData(61, 1, z, 0.05, rand.New(rand.NewPCG(9, uint64(s))))
		r, err := Reduce(m, g)
		require.NoError(t, err)
		ms[s], ss[s], is[s] = r.Points[0].MSD, r.Points[0].Spread, r.Points[0].IPR
		if s == 0 {
			stated = r.Points[0]
		}
	}
	assert.InDelta(t, stated.MSDErr, std(ms[:]), 0.12*stated.MSDErr)
	assert.InDelta(t, stated.SpreadErr, std(ss[:]), 0.12*stated.SpreadErr)
	assert.InDelta(t, stated.IPRErr, std(is[:]), 0.12*stated.IPRErr)
}

// TestRecoverCoupling generates synthetic data with a known coupling and
// recovers it with FitScale against the model MSD(t) = 2t² (the chain at
// unit coupling, Childs et al. 2002, from memory), checking that the stated
// uncertainty covers the truth as a standard deviation should: within 4σ
// always (a 6·10⁻⁵ chance per trial for a normal law), and within 1σ in 68% ± 10% of 200 seeded trials (the normal law,
// common practice; the binomial std of the fraction is ≈ 3.3%).
func TestRecoverCoupling(t *testing.T) {
	const c = 1.3 // cm⁻¹, demo value (Szameit & Nolte 2010, from memory; not a reference)
	z := []float64{0.4, 0.8, 1.2, 1.6, 2.0, 2.4, 2.8}
	model := func(t float64) float64 { return 2 * t * t }
	within1 := 0
	const trials = 200
	for s := 0; s < trials; s++ {
		m, g := chainData(81, c, z, 0.03, rand.New(rand.NewPCG(5, uint64(s))))
		r, err := Reduce(m, g)
		require.NoError(t, err)
		y, e, err := r.Series("msd")
		require.NoError(t, err)
		f, err := FitScale(z, y, e, model, 0.1, 10)
		require.NoError(t, err)
		require.Less(t, math.Abs(f.Scale-c), 4*f.Err, "trial %d: %v ± %v", s, f.Scale, f.Err)
		if math.Abs(f.Scale-c) < f.Err {
			within1++
		}
		if s == 0 {
			assert.Less(t, f.Err, 0.01*c) // 3% intensity noise pins C to better than 1%
			var sb strings.Builder
			require.NoError(t, r.Report(&sb, ReportOptions{LengthUnit: "cm", PositionUnit: "sites", Scale: &f, ScaleUnit: "1/cm", Synthetic: true}))
			assert.Contains(t, sb.String(), "SYNTHETIC")
			assert.Contains(t, sb.String(), "safety rules")
		}
	}
	frac := float64(within1) / trials
	t.Logf("fraction within 1σ: %.3f", frac)
	assert.InDelta(t, 0.68, frac, 0.10)
}

func TestReduceErrors(t *testing.T) {
	m, g := chainData(5, 1, []float64{1}, 0, rand.New(rand.NewPCG(1, 1)))
	var ie *InputError
	for _, c := range []struct {
		g     Geometry
		field string
	}{
		{Geometry{Coords: g.Coords, Dim: 0}, "geometry.dim"},
		{Geometry{Coords: g.Coords[:4], Dim: 1}, "geometry.coords"},
		{Geometry{Coords: []float64{0, 1, math.NaN(), 3, 4}, Dim: 1}, "geometry.coords"},
		{Geometry{Coords: g.Coords, Dim: 1, Start: 5}, "geometry.start"},
	} {
		_, err := Reduce(m, c.g)
		require.True(t, errors.As(err, &ie), c.field)
		assert.Equal(t, c.field, ie.Field)
	}
	_, err := Reduce(nil, g)
	require.True(t, errors.As(err, &ie))
	_, _, err = (&Reduction{}).Series("energy")
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "quantity", ie.Field)
}

func TestFitScaleErrors(t *testing.T) {
	model := func(t float64) float64 { return t * t }
	var ie *InputError
	for _, c := range []struct {
		z, y, e []float64
		lo, hi  float64
		field   string
	}{
		{[]float64{1}, []float64{1}, nil, 0.1, 10, "lengths"},
		{[]float64{1, 2}, []float64{1}, nil, 0.1, 10, "values"},
		{[]float64{1, 2}, []float64{1, 4}, []float64{1, 0}, 0.1, 10, "errors"},
		{[]float64{1, 2}, []float64{1, 4}, nil, 0, 10, "range"},
		{[]float64{1, 2}, []float64{100, 400}, nil, 0.1, 2, "range"}, // best scale 10 outside
	} {
		_, err := FitScale(c.z, c.y, c.e, model, c.lo, c.hi)
		require.True(t, errors.As(err, &ie), c.field)
		assert.Equal(t, c.field, ie.Field)
	}
	f, err := FitScale([]float64{1, 2, 3}, []float64{4, 16, 36}, nil, model, 0.1, 10)
	require.NoError(t, err)
	assert.InDelta(t, 2, f.Scale, 1e-9)
}

func std(x []float64) float64 {
	var s, s2 float64
	for _, v := range x {
		s += v
		s2 += v * v
	}
	n := float64(len(x))
	return math.Sqrt((s2 - s*s/n) / (n - 1))
}
