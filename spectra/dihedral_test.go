package spectra

import (
	"errors"
	"math"
	"math/cmplx"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

func unionCopies(secs []Sector) []float64 {
	var v []float64
	for _, s := range secs {
		for range s.Copies {
			v = append(v, s.Values...)
		}
	}
	return v
}

func TestDihedralRing(t *testing.T) {
	// D_10 on the ring: 2cos(2πq/10) (references.md [derived]); q = 0 is even
	// under the mirror i → 9−i, q = 5 odd, q = 1…4 come in pairs with −q.
	const n = 10
	secs, err := DihedralSectors(cycleGraph(t, n), 1, []Symmetry{Translation(n)}, Reflection(n), false)
	require.NoError(t, err)
	require.Len(t, secs, 6)
	for _, s := range secs {
		q := s.Label[0]
		require.Len(t, s.Values, 1)
		require.InDelta(t, 2*math.Cos(2*math.Pi*float64(q)/n), s.Values[0], 1e-12)
		switch q {
		case 0:
			require.Equal(t, 1, s.Parity)
			require.Equal(t, 1, s.Copies)
		case 5:
			require.Equal(t, -1, s.Parity)
		default:
			require.Equal(t, 0, s.Parity)
			require.Equal(t, 2, s.Copies)
		}
	}
}

func TestDihedralUnionEqualsFull(t *testing.T) {
	gas := gasketGraph(t, 3)
	cx, cy := 4.0, 4.0/math.Sqrt(3)
	rot, err := PositionSymmetry(gas, "C3", func(dst, p []float64) {
		s, c := math.Sincos(2 * math.Pi / 3)
		x, y := p[0]-cx, p[1]-cy
		dst[0], dst[1] = cx+c*x-s*y, cy+s*x+c*y
	})
	require.NoError(t, err)
	mir, err := PositionSymmetry(gas, "mirror", func(dst, p []float64) { dst[0], dst[1] = 8-p[0], p[1] })
	require.NoError(t, err)

	car, err := lattice.Carpet(2, lattice.CarpetCells)
	require.NoError(t, err)
	c4, err := PositionSymmetry(car, "C4", func(dst, p []float64) { dst[0], dst[1] = 9-p[1], p[0] })
	require.NoError(t, err)
	cm, err := PositionSymmetry(car, "mirror", func(dst, p []float64) { dst[0], dst[1] = 9-p[0], p[1] })
	require.NoError(t, err)

	const L = 6
	tor := torusGraph(t, L)
	inv := make([]int, L*L)
	for y := 0; y < L; y++ {
		for x := 0; x < L; x++ {
			inv[x+L*y] = (L-x)%L + L*((L-y)%L)
		}
	}
	cases := []struct {
		name string
		g    *lattice.Graph
		syms []Symmetry
		sig  Symmetry
	}{
		// D_3 of the gasket and D_4 of the carpet (common practice).
		{"gasket D3", gas, []Symmetry{rot}, mir},
		{"carpet D4", car, []Symmetry{c4}, cm},
		{"torus inversion", tor, SquareTranslations(L, L), Symmetry{Name: "inversion", Perm: inv}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			full, err := Eigenvalues(c.g, 1)
			require.NoError(t, err)
			secs, err := DihedralSectors(c.g, 1, c.syms, c.sig, true)
			require.NoError(t, err)
			requireClose(t, full, unionCopies(secs), 1e-10)
			h := DenseReal(c.g, 1)
			n := c.g.Len()
			for _, s := range secs {
				d := len(s.Values)
				for k := 0; k < d; k++ {
					var norm float64
					for i := 0; i < n; i++ {
						var z complex128
						for j := 0; j < n; j++ {
							z += complex(h[i*n+j], 0) * s.Vectors[j*d+k]
						}
						require.InDelta(t, 0, cmplx.Abs(z-complex(s.Values[k], 0)*s.Vectors[i*d+k]), 1e-10)
						if s.Parity != 0 {
							// ψ(σ(i)) = Parity·ψ(i), as documented.
							require.InDelta(t, 0, cmplx.Abs(s.Vectors[c.sig.Perm[i]*d+k]-complex(float64(s.Parity), 0)*s.Vectors[i*d+k]), 1e-10)
						}
						norm += real(s.Vectors[i*d+k] * cmplx.Conj(s.Vectors[i*d+k]))
					}
					require.InDelta(t, 1, norm, 1e-10)
				}
			}
		})
	}
}

func TestDihedralErrors(t *testing.T) {
	var fe *InputError
	g := cycleGraph(t, 6)
	id := Symmetry{Name: "identity", Perm: []int{0, 1, 2, 3, 4, 5}}
	_, err := DihedralSectors(g, 1, []Symmetry{Translation(6)}, id, false)
	require.True(t, errors.As(err, &fe)) // the identity does not invert the translation
	require.Equal(t, "reflection", fe.Field)
	_, err = DihedralSectors(g, 1, []Symmetry{Translation(6)}, Translation(6), false)
	require.True(t, errors.As(err, &fe)) // not an involution
	require.Equal(t, "reflection", fe.Field)
	_, err = DihedralSectors(g, 1, nil, Reflection(6), false)
	require.True(t, errors.As(err, &fe))
}
