package walk

import (
	"context"
	"errors"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

func TestFixAutoRetry(t *testing.T) {
	ctx := context.Background()
	failed := errors.New("the Chebyshev series does not conserve the norm")
	assert.True(t, autoRetry(ctx, Settings{Method: Auto}, failed))
	assert.False(t, autoRetry(ctx, Settings{Method: Auto}, nil))
	assert.False(t, autoRetry(ctx, Settings{Method: Chebyshev}, failed), "an explicit method is honoured")
	assert.False(t, autoRetry(ctx, Settings{Method: Auto}, fault.New("times", "bad")), "input errors are not retried")
	assert.False(t, autoRetry(ctx, Settings{Method: Auto}, context.Canceled))
	cctx, cancel := context.WithCancel(ctx)
	cancel()
	assert.False(t, autoRetry(cctx, Settings{Method: Auto}, failed))
}

func TestFixNegligibleTimes(t *testing.T) {
	// Chain of 5 sites, γ = 1: Gershgorin bound ‖H‖ ≤ 2 (common practice).
	g, err := lattice.Chain(5, false)
	require.NoError(t, err)
	j := &Job{Hopping: 1}
	assert.Equal(t, 2.0, j.hamiltonianNorm(g))
	in := []float64{0, 1e-300, 1e-17, 1e-15, 1}
	out := j.negligibleTimes(g, in)
	assert.Equal(t, []float64{0, 0, 0, 1e-15, 1}, out)
	assert.Equal(t, 1e-300, in[1], "the request's times are not modified")
	same := []float64{0.5, 1}
	assert.Same(t, &same[0], &j.negligibleTimes(g, same)[0])
	// Classical: ‖L‖ ≤ 2·max degree·γ = 4.
	j.Dynamics = Classical
	assert.Equal(t, 4.0, j.hamiltonianNorm(g))
}

func TestFixLogGridPoint(t *testing.T) {
	// Integral decimal exponents give exact powers of ten; other points are
	// a·(b/a)^f as before.
	assert.Equal(t, 0.01, logGridPoint(0.001, 1000, 1.0/6))
	assert.Equal(t, 100.0, logGridPoint(0.001, 1000, 5.0/6))
	assert.InEpsilon(t, 0.003*1.5, logGridPoint(0.003, 0.003*2.25, 0.5), 1e-15)
}
