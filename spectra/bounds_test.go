package spectra

import (
	"math/rand/v2"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

// randomGraph returns a seeded random graph with about deg bonds per site,
// normal weights and, when onsite, normal on-site energies.
func randomGraph(t testing.TB, n int, deg float64, onsite bool, rng *rand.Rand) *lattice.Graph {
	seen := map[[2]int]bool{}
	var b []lattice.Bond
	for k := 0; k < int(deg*float64(n)/2); k++ {
		i, j := rng.IntN(n), rng.IntN(n)
		if i == j || seen[[2]int{min(i, j), max(i, j)}] {
			continue
		}
		seen[[2]int{min(i, j), max(i, j)}] = true
		b = append(b, lattice.Bond{I: i, J: j, W: rng.NormFloat64()})
	}
	var on []float64
	if onsite {
		on = make([]float64, n)
		for i := range on {
			on[i] = rng.NormFloat64()
		}
	}
	g, err := lattice.New(n, 1, nil, b, on)
	require.NoError(t, err)
	return g
}

func TestBoundsRandomSweep(t *testing.T) {
	// Bounds must enclose the exact spectrum (invariant, common practice); with
	// 3 Lanczos steps KPM must notice tight bounds and fall back to Gershgorin.
	rng := rand.New(rand.NewPCG(21, 22))
	for trial := 0; trial < 30; trial++ {
		n := 2 + rng.IntN(300)
		g := randomGraph(t, n, 1+5*rng.Float64(), trial%2 == 0, rng)
		v, err := Eigenvalues(g, 1)
		require.NoError(t, err)
		for _, steps := range []int{20, 0} { // fewer steps may miss: see Bounds
			lo, hi, err := Bounds(g.Hamiltonian(1), steps, uint64(trial))
			require.NoError(t, err)
			require.LessOrEqual(t, lo, v[0]+1e-9, "trial %d n=%d steps=%d", trial, n, steps)
			require.GreaterOrEqual(t, hi, v[n-1]-1e-9, "trial %d n=%d steps=%d", trial, n, steps)
		}
		// KPM on the same graph always integrates to one.
		d, err := KPM(g.Hamiltonian(1), KPMSettings{Moments: 64, Vectors: 3, Seed: uint64(trial), Bins: 32, LanczosSteps: 3})
		require.NoError(t, err)
		require.InDelta(t, 1, integral(d), 1e-9)
	}
}
