package spectra

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

func TestLatticeGasketMatchesLocal(t *testing.T) {
	// lattice.Gasket and this package's test gasket differ only in site
	// order: the same spectrum (references.md: N = (3^{g+1}+3)/2).
	for g := 0; g <= 4; g++ {
		a, err := lattice.Gasket(g)
		require.NoError(t, err)
		va, err := Eigenvalues(a, 1)
		require.NoError(t, err)
		vb, err := Eigenvalues(gasketGraph(t, g), 1)
		require.NoError(t, err)
		requireClose(t, vb, va, 1e-10)
	}
}

func TestKPMMillionSites(t *testing.T) {
	if testing.Short() {
		t.Skip("10⁶-site KPM: a few seconds")
	}
	// The 1000×1000 periodic square lattice: the DOS of the infinite lattice
	// is ρ(E) = K(√(1 − E²/16))/(2π²) (common practice; Economou, Green's
	// Functions in Quantum Physics, 2006, from memory), so ρ(±2) =
	// K(√3/2)/(2π²) ≈ 2.1565/19.739 ≈ 0.10925.
	g, err := lattice.Square(1000, 1000, true)
	require.NoError(t, err)
	d, err := KPM(g.Hamiltonian(1), KPMSettings{Moments: 256, Vectors: 2, Seed: 7, Bins: 64})
	require.NoError(t, err)
	require.InDelta(t, 1, integral(d), 1e-9)
	k := math.Sqrt(3) / 2
	// Complete elliptic integral K(k) by the arithmetic–geometric mean.
	a, b := 1.0, math.Sqrt(1-k*k)
	for range 30 {
		a, b = (a+b)/2, math.Sqrt(a*b)
	}
	want := math.Pi / (2 * a) / (2 * math.Pi * math.Pi)
	for bin, e := range d.Energy {
		if math.Abs(math.Abs(e)-2) < d.Width/2 {
			require.InDelta(t, want, d.Density[bin], 0.01, "E=%v", e)
		}
	}
}
