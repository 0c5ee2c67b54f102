package spectra

import (
	"errors"
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"github.com/stretchr/testify/require"
)

// goe returns the eigenvalues of an n×n GOE matrix drawn from rng.
func goe(t *testing.T, n int, rng *rand.Rand) []float64 {
	a := make([]float64, n*n)
	for i := 0; i < n; i++ {
		a[i*n+i] = rng.NormFloat64() * math.Sqrt2
		for j := i + 1; j < n; j++ {
			x := rng.NormFloat64()
			a[i*n+j], a[j*n+i] = x, x
		}
	}
	v, _, err := SymEigen(a, n, false)
	require.NoError(t, err)
	return v
}

func TestSpacingRatioGOE(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	var all RatioStats
	var sum float64
	for k := 0; k < 20; k++ {
		v := goe(t, 200, rng)
		// The middle half of the spectrum, away from the semicircle edges
		// (common practice).
		st := SpacingRatio(v[50:150], 0)
		sum += st.Mean * float64(st.Used)
		all.Used += st.Used
	}
	mean := sum / float64(all.Used)
	// GOE r̃ = 0.5307, Atas, Bogomolny, Giraud, Roux, PRL 110, 084101 (2013);
	// the standard deviation of one ratio is ≈ 0.25 (same source, from
	// memory), so 1960 ratios give a standard error ≈ 0.006: allow 3σ.
	require.InDelta(t, RatioGOE, mean, 0.018)
}

func TestSpacingRatioPoisson(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	v := make([]float64, 20001)
	for i := range v {
		v[i] = rng.Float64() * 1000
	}
	st := SpacingRatio(v, 0)
	require.Equal(t, 19999, st.Used)
	// 2 ln 2 − 1, Atas et al., PRL 110, 084101 (2013); σ(r) ≈ 0.29 (uniform
	// r density 2/(1+r)², derived) gives a standard error ≈ 0.002: 3σ.
	require.InDelta(t, RatioPoisson, st.Mean, 0.006)
	require.InDelta(t, 0.002, st.Error, 0.0005)
}

func TestSpacingRatioDegenerate(t *testing.T) {
	// Levels 0, 1, 1, 3, 3, 3, 4: zero spacings are counted and dropped,
	// leaving spacings 1, 2, 1 and ratios 1/2, 1/2.
	st := SpacingRatio([]float64{3, 0, 1, 3, 1, 4, 3}, 1e-12)
	require.Equal(t, RatioStats{Mean: 0.5, Error: 0, Used: 2, Degenerate: 3}, st)
	require.Equal(t, RatioStats{Degenerate: 2}, SpacingRatio([]float64{1, 1, 1}, 0))
	require.Equal(t, 2, SpacingRatio([]float64{1, 1, 1}, math.NaN()).Degenerate)
	require.Equal(t, RatioStats{Mean: 0.5, Used: 1, Invalid: 2}, SpacingRatio([]float64{0, math.NaN(), 1, 3, math.Inf(1)}, 0))
}

func TestSpacingRatioGasketDegeneracies(t *testing.T) {
	// The gasket adjacency spectrum is massively degenerate: −2 has
	// multiplicity (3^g − 3)/2 besides the extra corner-related copies
	// (references.md [derived]); the ratio must count those and stay finite.
	v, err := Eigenvalues(gasketGraph(t, 4), 1)
	require.NoError(t, err)
	st := SpacingRatio(v, 1e-8)
	require.GreaterOrEqual(t, st.Degenerate, (81-3)/2-1)
	require.Greater(t, st.Used, 0)
	require.False(t, math.IsNaN(st.Mean))
}

func TestUnfold(t *testing.T) {
	// Wigner semicircle levels unfold to unit mean spacing (common practice).
	rng := rand.New(rand.NewPCG(5, 6))
	v := goe(t, 300, rng)
	u, err := Unfold(v, 9)
	require.NoError(t, err)
	require.True(t, sort.Float64sAreSorted(u))
	mid := u[60:240]
	mean := (mid[len(mid)-1] - mid[0]) / float64(len(mid)-1)
	// A degree-9 fit follows the semicircle staircase to within a fraction
	// of a level over the bulk: 5% over 180 levels (common practice).
	require.InDelta(t, 1, mean, 0.05)
	// A linear staircase unfolds exactly at degree 1.
	lin := []float64{0, 0.5, 1, 1.5, 2}
	u, err = Unfold(lin, 1)
	require.NoError(t, err)
	require.InDeltaSlice(t, []float64{0, 1, 2, 3, 4}, u, 1e-12)

	var fe *InputError
	_, err = Unfold(lin, 0)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "unfold.degree", fe.Field)
	_, err = Unfold([]float64{1, 1, 1}, 1)
	require.True(t, errors.As(err, &fe))
	_, err = Unfold(lin, 5)
	require.True(t, errors.As(err, &fe))
}
