package measure

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/ampwalk/ampwalk/observables"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestFitRegimesBallistic recovers the ballistic exponent 2 of the chain
// (MSD = 2(Cz)², Childs et al. 2002, from memory) from synthetic noisy data
// within its stated error.
func TestFitRegimesBallistic(t *testing.T) {
	z := make([]float64, 14)
	for k := range z {
		z[k] = 0.2 * math.Pow(15, float64(k)/13) // 0.2 … 3 log-spaced
	}
	m, g := chainData(101, 1.3, z, 0.03, rand.New(rand.NewPCG(3, 3)))
	r, err := Reduce(m, g)
	require.NoError(t, err)
	require.NoError(t, r.FitRegimes("msd", observables.RegimeSettings{Seed: 1}))
	require.True(t, r.FitWeighted)
	require.Equal(t, 1, len(r.Fit.Regimes), "%+v", r.Fit.Regimes)
	reg := r.Fit.Regimes[0]
	assert.Less(t, math.Abs(reg.Exponent-2), 4*reg.Error, "%v ± %v", reg.Exponent, reg.Error)
	assert.Equal(t, observables.KindBallistic, reg.Kind)
	var sb strings.Builder
	require.NoError(t, r.Report(&sb, ReportOptions{LengthUnit: "cm", PositionUnit: "sites"}))
	assert.Contains(t, sb.String(), "Regime analysis")
	assert.Contains(t, sb.String(), "ballistic")

	var ie *InputError
	require.True(t, errors.As(r.FitRegimes("ipr", observables.RegimeSettings{}), &ie))
	assert.Equal(t, "quantity", ie.Field)
}
