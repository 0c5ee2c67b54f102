package observables

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"os"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// chainMSD reads testdata/chain_msd.json (made by make_chain_msd.py with
// numpy 1.24.2 / scipy 1.10.1, dense eigh): the MSD of a quantum walk on an
// 801-site chain from the middle site at 60 log-spaced times in [0.01, 300].
func chainMSD(t *testing.T) (times, quantum []float64) {
	t.Helper()
	raw, err := os.ReadFile("testdata/chain_msd.json")
	require.NoError(t, err)
	var d struct {
		Times   []float64 `json:"times"`
		Quantum []float64 `json:"quantum_msd"`
	}
	require.NoError(t, json.Unmarshal(raw, &d))
	return d.Times, d.Quantum
}

// logTimes returns n log-spaced times in [a, b].
func logTimes(a, b float64, n int) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	ts[n-1] = b
	return ts
}

func TestFitRegimesPurePowerLawOneRegime(t *testing.T) {
	// A noiseless power law is one regime with no crossover, whatever the
	// exponent and the sampling (regression: the classical chain MSD = 2t,
	// exact for the line, Weiss, Aspects and Applications of the Random
	// Walk (1994) (from memory), was split into four "diffusive" segments).
	for _, c := range []struct {
		alpha, a float64
		n        int
	}{
		{1, 2, 60},        // classical line, MSD = 2γt (common practice)
		{2, 2, 60},        // quantum line, MSD = 2γ²t² (common practice)
		{0.8614, 1.7, 80}, // any exponent (chosen here)
		{1.5, 1e-3, 25},   // few points, small prefactor (chosen here)
	} {
		ts := logTimes(0.01, 300, c.n)
		ys := make([]float64, c.n)
		for i, tt := range ts {
			ys[i] = c.a * math.Pow(tt, c.alpha)
		}
		for _, rep := range []int{0, -1} {
			f, err := FitRegimes(ts, ys, nil, RegimeSettings{Seed: 1, Replicates: rep})
			require.NoError(t, err)
			require.Equal(t, 1, f.Segments, "alpha %v: scores %v, regimes %+v", c.alpha, f.Scores, f.Regimes)
			assert.Empty(t, f.Crossovers)
			assert.InDelta(t, c.alpha, f.Regimes[0].Exponent, 1e-9)
			assert.Equal(t, Classify(c.alpha), f.Regimes[0].Kind)
			assert.Equal(t, "BIC+merge", f.Criterion)
		}
	}
	// The same with rounding-level noise (relative 1e-12, common practice
	// for the accuracy of a simulated curve) still gives one regime.
	rng := rand.New(rand.NewPCG(3, 3))
	ts := logTimes(0.01, 300, 60)
	ys := make([]float64, len(ts))
	for i, tt := range ts {
		ys[i] = 2 * tt * (1 + 1e-12*rng.NormFloat64())
	}
	f, err := FitRegimes(ts, ys, nil, RegimeSettings{Seed: 1})
	require.NoError(t, err)
	assert.Equal(t, 1, f.Segments, "scores %v", f.Scores)
}

func TestFitRegimesQuantumChain(t *testing.T) {
	// Quantum walk on an 801-site chain: MSD = 2t² up to t ≈ 180, then the
	// front reaches the ends and the MSD bends down (reference data: scipy
	// 1.10.1 dense eigh, testdata/make_chain_msd.py). Expected: one
	// ballistic regime up to the bend, no spurious crossover inside it
	// (regression: a crossover at t = 105 was reported), crossovers with
	// non-degenerate intervals.
	ts, ys := chainMSD(t)
	f, err := FitRegimes(ts, ys, nil, RegimeSettings{Seed: 1})
	require.NoError(t, err)
	require.NotEmpty(t, f.Crossovers)
	first := f.Regimes[0]
	assert.Equal(t, KindBallistic, first.Kind)
	assert.InDelta(t, 2, first.Exponent, 0.01) // exact 2 (common practice)
	assert.Greater(t, f.Crossovers[0].Time, 160.0, "regimes %+v", f.Regimes)
	for j, c := range f.Crossovers {
		assert.Less(t, c.Low, c.Time, "crossover %d", j)
		assert.Greater(t, c.High, c.Time, "crossover %d", j)
	}
	for j := 1; j < len(f.Regimes); j++ {
		d := math.Abs(f.Regimes[j].Exponent - f.Regimes[j-1].Exponent)
		assert.GreaterOrEqual(t, d, 0.05, "adjacent regimes %d, %d are not merged", j-1, j)
	}

	// The local exponent follows the exact one (d ln MSD/d ln t = 2.000000
	// at t = 105, 125, 149, 178 by the same scipy computation) instead of
	// bleeding the bend back by two points (regression: 1.707 at t = 149).
	for i, tt := range f.Times {
		if tt > 1 && tt < 180 {
			assert.InDelta(t, 2, f.LocalExponent[i], 0.02, "t = %v", tt)
		}
	}
	// Across the bend the three-point stencil takes over (grid ratio 1.19):
	// exact 0.435, −0.70, −1.41 at t = 211.5, 251.9, 300 (scipy
	// expm_multiply, as quoted by the audit); tolerances cover the stencil's
	// truncation on that grid.
	n := len(f.Times)
	for k, c := range []struct{ want, tol float64 }{{0.435, 0.35}, {-0.70, 0.1}, {-1.41, 0.15}} {
		assert.InDelta(t, c.want, f.LocalExponent[n-3+k], c.tol, "t = %v", f.Times[n-3+k])
	}
}

func TestFitRegimesIntervalsNotDegenerate(t *testing.T) {
	// A noiseless broken power law (ballistic → diffusive at t = 3, common
	// practice test curve): the bootstrap replicates all equal the fit, and
	// the interval must still not collapse onto the estimate; it spans at
	// least the neighbouring sample times.
	ts := logTimes(0.05, 2000, 60)
	_, ys := brokenPowerLaw(nil, 60, 0.05, 2000, 1.7, []float64{2, 1}, []float64{3}, 0)
	for _, rep := range []int{0, -1} {
		f, err := FitRegimes(ts, ys, nil, RegimeSettings{Seed: 1, Replicates: rep})
		require.NoError(t, err)
		require.Len(t, f.Crossovers, 1)
		c := f.Crossovers[0]
		assert.InEpsilon(t, 3, c.Time, 1e-3)
		assert.Less(t, c.Low, c.Time)
		assert.Greater(t, c.High, c.Time)
		assert.LessOrEqual(t, c.Low, 3.0)
		assert.GreaterOrEqual(t, c.High, 3.0)
	}
}

func TestFitRegimesMergesSameLaw(t *testing.T) {
	// Two segments whose exponents differ by 0.02 (below the documented
	// threshold 0.05, chosen here) are one regime even with little noise.
	rng := rand.New(rand.NewPCG(5, 5))
	ts, ys := brokenPowerLaw(rng, 80, 0.1, 1000, 1, []float64{1, 1.02}, []float64{10}, 1e-4)
	f, err := FitRegimes(ts, ys, nil, RegimeSettings{Seed: 1})
	require.NoError(t, err)
	assert.Equal(t, 1, f.Segments, "regimes %+v", f.Regimes)
	// A difference of 0.5 (chosen here) stays two regimes.
	ts, ys = brokenPowerLaw(rng, 80, 0.1, 1000, 1, []float64{1, 1.5}, []float64{10}, 1e-4)
	f, err = FitRegimes(ts, ys, nil, RegimeSettings{Seed: 1})
	require.NoError(t, err)
	assert.Equal(t, 2, f.Segments)
}

func TestLocalExponentSharpChange(t *testing.T) {
	// A broken power law with a sharp kink at t = 10 (exponent 2 → 0,
	// chosen here): away from the two points next to the kink the local
	// exponent is exact (Savitzky & Golay, Anal. Chem. 36, 1627 (1964):
	// polynomials pass unchanged) because the adaptive window avoids it.
	ts := logTimes(0.1, 1000, 41)
	_, ys := brokenPowerLaw(nil, 41, 0.1, 1000, 1, []float64{2, 0}, []float64{10}, 0)
	le, err := LocalExponent(nil, ts, ys, 0, 0)
	require.NoError(t, err)
	for i, tt := range ts {
		if math.Abs(math.Log(tt/10)) < 1e-9 {
			continue // the kink itself
		}
		want := 2.0
		if tt > 10 {
			want = 0
		}
		assert.InDelta(t, want, le[i], 1e-9, "t = %v", tt)
	}
	// On noisy data the centred window is kept at most points: the result
	// stays close to the true exponent on average (tolerance: a few standard
	// errors of the five-point filter at σ = 0.01, common practice).
	rng := rand.New(rand.NewPCG(9, 9))
	_, ys = brokenPowerLaw(rng, 41, 0.1, 1000, 1, []float64{1.3}, nil, 0.01)
	le, err = LocalExponent(le, ts, ys, 0, 0)
	require.NoError(t, err)
	var mean float64
	for _, v := range le {
		mean += v / float64(len(le))
	}
	assert.InDelta(t, 1.3, mean, 0.03)
}

func TestFitRegimesExtremeErrors(t *testing.T) {
	// Legal but extreme inputs (audit: values up to 1e300 with errors 0.1,
	// or one error of 1e-300) must not make the weights overflow: the result
	// is finite everywhere (relative errors are floored at 1e-12, chosen
	// here).
	for _, c := range []struct{ ys, es []float64 }{
		{[]float64{1, 2, 4, 8, 1e300, 10}, []float64{0.1, 0.1, 0.1, 0.1, 0.1, 0.1}},
		{[]float64{1, 2, 4, 8, 9, 10}, []float64{0.1, 0.1, 1e-300, 0.1, 0.1, 0.1}},
	} {
		ts := []float64{1, 2, 3, 4, 5, 6}
		f, err := FitRegimes(ts, c.ys, c.es, RegimeSettings{MaxSegments: 2, Seed: 1, Replicates: 20})
		require.NoError(t, err)
		all := append([]float64{f.Residual}, f.Scores...)
		for _, r := range f.Regimes {
			all = append(all, r.From, r.To, r.Exponent, r.Error, r.Prefactor)
		}
		for _, cr := range f.Crossovers {
			all = append(all, cr.Time, cr.Low, cr.High)
		}
		for i, v := range all {
			assert.True(t, finite(v), "value %d = %v", i, v)
		}
	}
}
