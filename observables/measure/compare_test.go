package measure

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestOverlapAndDistance(t *testing.T) {
	// Closed forms (common practice): identical → F = 1, D = 0; disjoint →
	// F = 0, D = 1; p = (1, 0), q = (½, ½) → F = √½, D = ½.
	for _, c := range []struct {
		p, q []float64
		f, d float64
	}{
		{[]float64{0.2, 0.3, 0.5}, []float64{2, 3, 5}, 1, 0},
		{[]float64{1, 0}, []float64{0, 1}, 0, 1},
		{[]float64{1, 0}, []float64{0.5, 0.5}, math.Sqrt(0.5), 0.5},
	} {
		f, err := Overlap(c.p, c.q)
		require.NoError(t, err)
		d, err := TotalVariation(c.p, c.q)
		require.NoError(t, err)
		assert.InDelta(t, c.f, f, 1e-15)
		assert.InDelta(t, c.d, d, 1e-15)
		// Bounds between the two (Fuchs–van de Graaf for classical
		// distributions, from memory): 1 − F ≤ D ≤ √(1 − F²).
		assert.LessOrEqual(t, 1-f-1e-15, d)
		assert.LessOrEqual(t, d, math.Sqrt(1-f*f)+1e-15)
	}
	var ie *InputError
	_, err := Overlap([]float64{1, 0}, []float64{1})
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "simulated", ie.Field)
	_, err = Overlap([]float64{1, -1}, []float64{1, 1})
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "measured", ie.Field)
	_, err = TotalVariation([]float64{1, 1}, []float64{0, 0})
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "simulated", ie.Field)
}

func TestCompare(t *testing.T) {
	r := &Reduction{Points: []Point{{Length: 1}, {Length: 2}}, P: [][]float64{{0.5, 0.5}, {1, 0}}}
	c, err := r.Compare([][]float64{{1, 1}, {0.5, 0.5}})
	require.NoError(t, err)
	assert.InDelta(t, 1, c[0].Overlap, 1e-15)
	assert.InDelta(t, 0.5, c[1].Distance, 1e-15)
	_, err = r.Compare([][]float64{{1, 1}})
	var ie *InputError
	require.True(t, errors.As(err, &ie))
	_, err = r.Compare([][]float64{{1, 1}, {0, 0}})
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "length[1].simulated", ie.Field)
}
