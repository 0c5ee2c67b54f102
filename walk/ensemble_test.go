package walk

import (
	"context"
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestEnsembleOrderAndErrors(t *testing.T) {
	for _, w := range []int{1, 2, 7} {
		out, err := Ensemble(context.Background(), 50, w, func(_ context.Context, r int) (int, error) { return r * r, nil })
		require.NoError(t, err)
		for r, v := range out {
			assert.Equal(t, r*r, v)
		}
	}
	// The lowest failing index wins, whatever the scheduling.
	_, err := Ensemble(context.Background(), 20, 4, func(_ context.Context, r int) (int, error) {
		if r == 3 || r == 11 {
			return 0, errors.New("fail " + string(rune('0'+r%10)))
		}
		return r, nil
	})
	require.Error(t, err)
	assert.Equal(t, "fail 3", err.Error())
	// A panic becomes a numerical error, not a crash.
	_, err = Ensemble(context.Background(), 3, 2, func(_ context.Context, r int) (int, error) {
		if r == 1 {
			var a []int
			_ = a[r]
		}
		return r, nil
	})
	assert.Equal(t, "numerical", ErrorCode(err))
	// Cancellation.
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err = Ensemble(ctx, 3, 1, func(ctx context.Context, r int) (int, error) { return r, ctx.Err() })
	assert.ErrorIs(t, err, context.Canceled)
}

func TestMeanErr(t *testing.T) {
	// Hand-computed: samples 1, 2, 3, 6 → mean 3, sample variance
	// 14/3, standard error sqrt(14/3/4).
	m, e := MeanErr([][]float64{{1, 0}, {2, 0}, {3, 0}, {6, 0}})
	assert.InDelta(t, 3, m[0], 1e-15)
	assert.Equal(t, 0.0, m[1])
	assert.InDelta(t, math.Sqrt(14.0/3/4), e[0], 1e-15)
	assert.Equal(t, 0.0, e[1])
	m, e = MeanErr([][]float64{{5}})
	assert.Equal(t, []float64{5}, m)
	assert.Equal(t, []float64{0}, e)
	m, e = MeanErr([][]float64{{1}, {math.NaN()}})
	assert.True(t, math.IsNaN(m[0]) && math.IsNaN(e[0]))
}
