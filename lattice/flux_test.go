package lattice

import (
	"encoding/json"
	"math"
	"math/cmplx"
	"os"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// hop returns H[i][j] of g (γ = 1) from its bond list.
func hop(g *Graph, i, j int) complex128 {
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		switch {
		case b.I == i && b.J == j:
			return cmplx.Rect(b.W, b.Phase)
		case b.I == j && b.J == i:
			return cmplx.Rect(b.W, -b.Phase)
		}
	}
	return 0
}

// loopPhase returns the phase of H[l1][l0]·H[l2][l1]⋯H[l0][lk].
func loopPhase(g *Graph, loop ...int) float64 {
	p := complex(1, 0)
	for k := range loop {
		p *= hop(g, loop[(k+1)%len(loop)], loop[k])
	}
	return cmplx.Phase(p)
}

// samePhase asserts a ≡ b (mod 2π).
func samePhase(t *testing.T, a, b float64) {
	t.Helper()
	assert.InDelta(t, 0, math.Remainder(a-b, 2*math.Pi), 1e-12, "%v vs %v", a, b)
}

func TestFluxPlaquettes(t *testing.T) {
	sq, err := Square(4, 3, false)
	require.NoError(t, err)
	tri, err := Triangle(3)
	require.NoError(t, err)
	for _, f := range []float64{0.1, 0.25, 1.0 / 3, -0.37, 1.7} {
		g, err := sq.WithFlux(f)
		require.NoError(t, err)
		// Every unit square, counter-clockwise (x,y) → (x+1,y) → (x+1,y+1)
		// → (x,y+1): phase 2π·flux (Peierls substitution; Hofstadter 1976,
		// from memory).
		for y := 0; y+1 < 3; y++ {
			for x := 0; x+1 < 4; x++ {
				i := x + 4*y
				samePhase(t, loopPhase(g, i, i+1, i+5, i+4), 2*math.Pi*f)
			}
		}
		// The whole 3×2 boundary encloses area 6.
		samePhase(t, loopPhase(g, 0, 1, 2, 3, 7, 11, 10, 9, 8, 4), 2*math.Pi*f*6)
		// Unit triangles of area √3/4 (up, counter-clockwise): sites 0, 1
		// and the first site of row 1 (index 4 for side 3).
		h, err := tri.WithFlux(f)
		require.NoError(t, err)
		samePhase(t, loopPhase(h, 0, 1, 4), 2*math.Pi*f*math.Sqrt(3)/4)
		// A down triangle: 1 → 5 → 4 counter-clockwise is (1,0) → (1.5, √3/2)
		// → (0.5, √3/2).
		samePhase(t, loopPhase(h, 1, 5, 4), 2*math.Pi*f*math.Sqrt(3)/4)
		// Hermitian: |H[i][j]| is unchanged, and IsReal is false.
		assert.False(t, g.IsReal())
		assert.InDelta(t, 1, cmplx.Abs(hop(g, 0, 1)), 1e-15)
	}
	zero, err := sq.WithFlux(0)
	require.NoError(t, err)
	assert.True(t, zero.IsReal())
}

func TestFluxHamiltonianHermitian(t *testing.T) {
	g, err := Kagome(3, 3, false)
	require.NoError(t, err)
	g, err = g.WithFlux(0.13)
	require.NoError(t, err)
	m := g.Hamiltonian(1)
	require.NotNil(t, m.Imag)
	at := func(i, j int32) complex128 {
		for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
			if m.Col[k] == j {
				return complex(m.Val[k], m.Imag[k])
			}
		}
		return 0
	}
	for i := int32(0); i < int32(m.N); i++ {
		for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
			j := m.Col[k]
			if k > m.RowPtr[i] {
				assert.Less(t, m.Col[k-1], j, "row %d sorted", i) // Hamiltonian's doc
			}
			assert.InDelta(t, 0, cmplx.Abs(at(i, j)-cmplx.Conj(at(j, i))), 1e-15)
			assert.InDelta(t, 0, cmplx.Abs(at(i, j)-hop(g, int(i), int(j))), 1e-15)
		}
	}
}

func TestFluxErrors(t *testing.T) {
	g, err := Square(3, 3, false)
	require.NoError(t, err)
	for _, f := range []float64{math.NaN(), math.Inf(-1)} {
		_, err := g.WithFlux(f)
		requireInputError(t, err, fault.Invalid, "flux")
	}
	c, err := Cubic(2, 2, 2, false)
	require.NoError(t, err)
	_, err = c.WithFlux(0.1)
	requireInputError(t, err, fault.Invalid, "flux")
}

// hermitianEigenvalues returns the ascending eigenvalues of g's complex
// Hamiltonian (γ = 1) through the real symmetric embedding
// [[Re H, −Im H], [Im H, Re H]], whose spectrum is H's, each value twice.
func hermitianEigenvalues(t *testing.T, g *Graph) []float64 {
	t.Helper()
	n := g.Len()
	bonds := make([]Bond, 0, 4*g.NumBonds())
	onsite := make([]float64, 2*n)
	for i := 0; i < n; i++ {
		onsite[i], onsite[n+i] = g.Onsite(i), g.Onsite(i)
	}
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		re, im := b.W*math.Cos(b.Phase), b.W*math.Sin(b.Phase) // H[I][J]
		bonds = append(bonds,
			Bond{I: b.I, J: b.J, W: re}, Bond{I: n + b.I, J: n + b.J, W: re},
			// block (1,2) is −Im H: entry (I, n+J) = −Im H[I][J], and
			// (J, n+I) = −Im H[J][I] = +Im H[I][J].
			Bond{I: b.I, J: n + b.J, W: -im}, Bond{I: b.J, J: n + b.I, W: im})
	}
	e, err := New(2*n, 1, nil, bonds, onsite)
	require.NoError(t, err)
	v := eigenvalues(t, e)
	out := make([]float64, n)
	for i := range out {
		assert.InDelta(t, v[2*i], v[2*i+1], 1e-9)
		out[i] = v[2*i]
	}
	return out
}

func TestFluxSpectraReference(t *testing.T) {
	// Spectra from numpy 1.24.2 numpy.linalg.eigvalsh in the symmetric gauge
	// (testdata/make_flux_spectra.py): gauge invariance means they must match
	// the Landau-gauge spectra of WithFlux. (Spectra cannot see the sign of
	// the flux, H and its conjugate being isospectral; TestFluxPlaquettes
	// fixes the sign.)
	raw, err := os.ReadFile("testdata/flux_spectra.json")
	require.NoError(t, err)
	var ref struct {
		Cases []struct {
			Name        string
			Flux        float64
			Eigenvalues []float64
		}
	}
	require.NoError(t, json.Unmarshal(raw, &ref))
	require.Len(t, ref.Cases, 4)
	builds := map[string]func() (*Graph, error){
		"square 5x4": func() (*Graph, error) { return Square(5, 4, false) },
		"square 6x6": func() (*Graph, error) { return Square(6, 6, false) },
		"triangle 4": func() (*Graph, error) { return Triangle(4) },
		"triangle 5": func() (*Graph, error) { return Triangle(5) },
	}
	for _, c := range ref.Cases {
		g, err := builds[c.Name]()
		require.NoError(t, err, c.Name)
		h, err := g.WithFlux(c.Flux)
		require.NoError(t, err)
		got := hermitianEigenvalues(t, h)
		assert.InDeltaSlice(t, c.Eigenvalues, got, 1e-10, c.Name)
		// The field changes the spectrum (the check is not vacuous).
		assert.Greater(t, math.Abs(eigenvalues(t, g)[0]-got[0]), 1e-3, c.Name)
	}
}
