package lattice

import (
	"math"
	"math/cmplx"
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
