package spectra

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/require"
)

func integral(d DOS) float64 {
	var s float64
	for _, v := range d.Density {
		s += v * d.Width
	}
	return s
}

func TestHistogram(t *testing.T) {
	// Hypercube Q_4 levels 4, 2, 0, −2, −4 with multiplicities 1, 4, 6, 4, 1
	// (Christandl et al., PRL 92, 187902 (2004)); four bins over [−4, 4].
	v := []float64{4, 2, 2, 2, 2, 0, 0, 0, 0, 0, 0, -2, -2, -2, -2, -4}
	d, err := Histogram(v, 4)
	require.NoError(t, err)
	require.Equal(t, 2.0, d.Width)
	require.InDeltaSlice(t, []float64{-3, -1, 1, 3}, d.Energy, 1e-15)
	// Bins [−4,−2) [−2,0) [0,2) [2,4]: counts 1, 4, 6, 5 over 16 levels, width 2.
	require.InDeltaSlice(t, []float64{1.0 / 32, 4.0 / 32, 6.0 / 32, 5.0 / 32}, d.Density, 1e-15)
	require.InDelta(t, 1, integral(d), 1e-15)
	require.InDeltaSlice(t, []float64{1.0 / 16, 5.0 / 16, 11.0 / 16, 1}, d.Integrated(), 1e-15)

	one, err := Histogram([]float64{3}, 5)
	require.NoError(t, err)
	require.InDelta(t, 1, integral(one), 1e-15)
}

func TestBroadened(t *testing.T) {
	v := []float64{-1, 0, 0, 2}
	for _, sh := range []Shape{Lorentzian, Gaussian} {
		d, err := Broadened(v, 400, 0.1, sh)
		require.NoError(t, err)
		require.InDelta(t, 1, integral(d), 1e-12)
		// The peak sits at the doubly degenerate level 0.
		best := 0
		for b := range d.Density {
			if d.Density[b] > d.Density[best] {
				best = b
			}
		}
		require.InDelta(t, 0, d.Energy[best], d.Width)
	}
}

func TestCounting(t *testing.T) {
	got := Counting([]float64{3, 1, 2, 2}, []float64{0, 1, 2, 2.5, 10})
	require.Equal(t, []float64{0, 0.25, 0.75, 0.75, 1}, got)
}

func TestDOSErrors(t *testing.T) {
	var fe *InputError
	cases := []struct {
		err   error
		field string
	}{
		{func() error { _, e := Histogram([]float64{1}, 0); return e }(), "dos.bins"},
		{func() error { _, e := Histogram(nil, 3); return e }(), "eigenvalues"},
		{func() error { _, e := Histogram([]float64{math.NaN()}, 3); return e }(), "eigenvalues"},
		{func() error { _, e := Broadened([]float64{1}, 3, 0, Gaussian); return e }(), "dos.width"},
		{func() error { _, e := Broadened([]float64{1}, 3, 1, Shape(7)); return e }(), "dos.shape"},
	}
	for i, c := range cases {
		require.True(t, errors.As(c.err, &fe), "case %d", i)
		require.Equal(t, c.field, fe.Field, "case %d", i)
	}
}

func TestLocalHistogram(t *testing.T) {
	// The path P_3 has levels −√2, 0, √2 with end-site weights 1/4, 1/2, 1/4
	// (eigenvectors (1, ∓√2, 1)/2 and (1, 0, −1)/√2, common practice).
	e, err := Eigensystem(pathGraph(t, 3), 1)
	require.NoError(t, err)
	d, err := LocalHistogram(e, 0, 3)
	require.NoError(t, err)
	w := 2 * math.Sqrt2 / 3
	require.InDeltaSlice(t, []float64{0.25 / w, 0.5 / w, 0.25 / w}, d.Density, 1e-12)
	require.InDelta(t, 1, integral(d), 1e-12)
	var fe *InputError
	_, err = LocalHistogram(e, 3, 3)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "dos.site", fe.Field)
	_, err = WeightedHistogram([]float64{1, 2}, []float64{0, 0}, 2)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "weights", fe.Field)
	_, err = WeightedHistogram([]float64{1, 2}, []float64{1}, 2)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, []float64{0, 0}, Counting(nil, []float64{1, 2}))
	require.Nil(t, Jackson(0))
}
