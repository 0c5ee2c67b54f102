package observables

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestPolyaZd(t *testing.T) {
	// Partial products on Z^d with p0 = J0(2t)^{2d}, γ = 1, t_k = k, k = 1…K.
	// Štefaňák, Jex, Kiss, PRL 100, 020501 (2008); Darázs & Kiss, PRA 81,
	// 062319 (2010) (from memory); values from references.md [derived].
	for _, c := range []struct {
		d, k int
		want float64
	}{
		{1, 10, 0.349394413800},
		{1, 100, 0.544658235178},
		{2, 10, 0.034717253224},
		{2, 100, 0.037687393812},
		{3, 10, 0.004382006878},
	} {
		r := make([]float64, c.k)
		for k := range r {
			r[k] = math.Pow(math.J0(2*float64(k+1)), float64(2*c.d))
		}
		got, err := Polya(r)
		require.NoError(t, err)
		assert.InDelta(t, c.want, got, 1e-11, "d=%d K=%d", c.d, c.k)
	}
}

func TestPolyaEdges(t *testing.T) {
	p, err := Polya(nil)
	require.NoError(t, err)
	assert.Equal(t, 0.0, p)
	p, err = Polya([]float64{0.3, 1})
	require.NoError(t, err)
	assert.Equal(t, 1.0, p)
	// Tiny p: P ≈ Σ p to full relative precision (expm1/log1p, common practice).
	p, err = Polya([]float64{1e-20, 2e-20})
	require.NoError(t, err)
	assert.InDelta(t, 3e-20, p, 1e-34)
	// Round-off overshoot is clamped.
	p, err = Polya([]float64{1 + 1e-15})
	require.NoError(t, err)
	assert.Equal(t, 1.0, p)

	for _, c := range []struct {
		in  []float64
		msg string
	}{
		{[]float64{0.1, math.NaN()}, "returns[1]"},
		{[]float64{0.1, 0.2, 1.5}, "returns[2]"},
		{[]float64{-0.2}, "returns[0]"},
	} {
		_, err := Polya(c.in)
		var ie *InputError
		require.True(t, errors.As(err, &ie), "%v", c.in)
		assert.Equal(t, "returns", ie.Field)
		assert.Contains(t, ie.Msg, c.msg)
	}
}
