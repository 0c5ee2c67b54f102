package spectra

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/require"
)

// traceReturn is the site-averaged classical return probability
// (1/n) Σ_k e^{−λ_k t} from the Laplacian eigenvalues.
func traceReturn(lam, times []float64) []float64 {
	p := make([]float64, len(times))
	for i, t := range times {
		for _, l := range lam {
			p[i] += math.Exp(-l * t)
		}
		p[i] /= float64(len(lam))
	}
	return p
}

func logTimes(a, b float64, n int) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		ts[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	return ts
}

func TestSpectralDimensionLattices(t *testing.T) {
	// The ring and the torus: d_s = 1 and 2 (common practice); closed-form
	// Laplacian spectra 2 − 2cos(2πk/N) and sums of two (references.md [derived]).
	ring := make([]float64, 2000)
	for k := range ring {
		ring[k] = 2 - 2*math.Cos(2*math.Pi*float64(k)/2000)
	}
	const L = 60
	var torus []float64
	for k := 0; k < L; k++ {
		for l := 0; l < L; l++ {
			torus = append(torus, 4-2*math.Cos(2*math.Pi*float64(k)/L)-2*math.Cos(2*math.Pi*float64(l)/L))
		}
	}
	for _, c := range []struct {
		lam  []float64
		want float64
	}{{ring, 1}, {torus, 2}} {
		e, err := SpectralDimensionLevels(c.lam, 0.05)
		require.NoError(t, err)
		// The lowest 5% of a finite lattice's levels form a few dozen shells;
		// the staircase fit measured within 0.03 of d_s here: allow 0.1
		// (common practice for finite-size staircase fits).
		require.InDelta(t, c.want, e.Value, 0.1)
		// Return probability between the spacing time and saturation.
		ts := logTimes(5, 100, 20)
		r, err := SpectralDimensionReturn(ts, traceReturn(c.lam, ts))
		require.NoError(t, err)
		// p0 = e^{−2t}I_0(2t) ~ (4πt)^{−1/2}(1 + 1/(16t) + …) per dimension
		// (asymptotic expansion of I_0, common practice): the correction at
		// t ≥ 5 shifts the slope by under 0.02.
		require.InDelta(t, c.want, r.Value, 0.05)
		require.Equal(t, 20, r.Points)
	}
}

func TestSpectralDimensionGasket(t *testing.T) {
	// Gasket d_s = 2 ln3/ln5 ≈ 1.365: Rammal & Toulouse, J. Physique Lett. 44,
	// L13 (1983) (from memory). The spectrum is hierarchical, so its
	// staircase oscillates log-periodically about the power law: loose tolerance.
	lam, err := LaplacianEigenvalues(gasketGraph(t, 6), 1)
	require.NoError(t, err)
	want := 2 * math.Log(3) / math.Log(5)
	e, err := SpectralDimensionLevels(lam, 0.2)
	require.NoError(t, err)
	require.InDelta(t, want, e.Value, 0.1)
	ts := logTimes(2, 200, 30)
	r, err := SpectralDimensionReturn(ts, traceReturn(lam, ts))
	require.NoError(t, err)
	require.InDelta(t, want, r.Value, 0.1)
}

func TestSpectralDimensionErrors(t *testing.T) {
	var fe *InputError
	_, err := SpectralDimensionLevels([]float64{0, 1, 2}, 2)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "fraction", fe.Field)
	_, err = SpectralDimensionLevels([]float64{0, 0, 1}, 1)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "eigenvalues", fe.Field)
	_, err = SpectralDimensionReturn([]float64{1, 2, 2}, []float64{1, 1, 1})
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "times[2]", fe.Field)
	_, err = SpectralDimensionReturn([]float64{1, 2, 3}, []float64{1, 0, 1})
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "values[1]", fe.Field)
	_, err = SpectralDimensionReturn([]float64{1, 2}, []float64{1, 1})
	require.True(t, errors.As(err, &fe))
}
