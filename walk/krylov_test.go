package walk

import (
	"context"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestToleranceSweep is the seeded random sweep: over sizes (including
// those below the Krylov dimension and a single site), tolerances and both
// dynamics, each method's state must lie within the tolerance of the exact
// one (exact diagonalisation through spectra, rounding ≈1e-13 at these
// sizes), and its reported bound or estimate must not exceed the tolerance.
func TestToleranceSweep(t *testing.T) {
	rng := rand.New(rand.NewPCG(2026, 12))
	sizes := []int{1, 2, 3, 5, 17, 31, 64, 120}
	for _, n := range sizes {
		for _, dyn := range []Dynamics{Quantum, Classical} {
			var g *lattice.Graph
			if n == 1 {
				g = graph(t, 1, nil, []float64{0.7})
			} else {
				g = randomGraph(t, rng.Uint64(), n, 2*n, dyn == Quantum, dyn == Quantum)
			}
			op := g.Hamiltonian(1)
			if dyn == Classical {
				op = g.Laplacian(1)
			}
			psi0 := make([]complex128, n)
			for i := range psi0 {
				psi0[i] = complex(rng.Float64(), 0)
			}
			var s float64
			for _, v := range psi0 {
				s += real(v)
			}
			for i := range psi0 {
				psi0[i] /= complex(s, 0)
			}
			norm0 := nrm2(psi0)
			times := []float64{0.01, 0.7, 6, 6.5, 60}
			collect := func(m Method, tol float64) ([][]complex128, Diagnostics) {
				var out [][]complex128
				d, err := Propagate(context.Background(), op, dyn, psi0, times, Settings{Method: m, Tolerance: tol},
					func(_ int, _ float64, psi []complex128) error {
						out = append(out, append([]complex128(nil), psi...))
						return nil
					})
				require.NoError(t, err, "n=%d %v %v", n, dyn, m)
				return out, d
			}
			ref, _ := collect(Exact, 1e-12)
			for _, tol := range []float64{1e-4, 1e-7, 1e-10, 1e-12} {
				for _, m := range []Method{Krylov, Chebyshev} {
					got, d := collect(m, tol)
					assert.LessOrEqual(t, d.ErrorBound, tol*norm0*(1+1e-12), "n=%d %v %v tol=%g: bound", n, dyn, m, tol)
					for k := range times {
						// The tolerance plus the reference's own rounding (common practice).
						e := diffNorm(got[k], ref[k])
						assert.LessOrEqual(t, e, tol*norm0+1e-12, "n=%d %v %v tol=%g t=%v", n, dyn, m, tol, times[k])
					}
				}
			}
		}
	}
}

// TestKrylovSubsteps checks that a long step is split into several Krylov
// spaces and still meets the tolerance: the line's amplitudes (−i)^n J_n(2t)
// (references.md) after t = 25 on a 401-site chain.
func TestKrylovSubsteps(t *testing.T) {
	n, mid := 401, 200
	g := graph(t, n, chainBonds(n, false), nil)
	k := newKrylov(g.Hamiltonian(1), false)
	psi := basis(n, mid)
	prods, est, err := k.step(context.Background(), psi, 25, 1e-10)
	require.NoError(t, err)
	assert.Greater(t, prods, krylovDim, "a·t = 50 needs more than one Krylov space of 30")
	assert.LessOrEqual(t, est, 1e-10)
	var worst float64
	for j := mid - 80; j <= mid+80; j++ {
		p := real(psi[j])*real(psi[j]) + imag(psi[j])*imag(psi[j])
		w := math.Jn(j-mid, 50)
		worst = math.Max(worst, math.Abs(p-w*w))
	}
	assert.Less(t, worst, 1e-10)
}

// TestPhi1 checks φ₁(z) = (e^z − 1)/z near 0 and away from it against the
// series 1 + z/2 + z²/6 + z³/24 (common practice).
func TestPhi1(t *testing.T) {
	for _, z := range []complex128{1e-9, -1e-9, complex(0, 1e-9), complex(0, -3e-7)} {
		want := 1 + z/2 + z*z/6 + z*z*z/24
		assert.InDelta(t, 0, cmplx.Abs(phi1(z)-want), 1e-15, "%v", z)
	}
	for _, z := range []complex128{2, -30, complex(0, 7), complex(1, 1)} {
		want := (cmplx.Exp(z) - 1) / z
		assert.InDelta(t, 0, cmplx.Abs(phi1(z)-want), 1e-14*cmplx.Abs(want), "%v", z)
	}
}

// TestKrylovReuse checks that closely spaced reported times are served from
// one Krylov basis (far fewer products than one basis per time) and still
// meet the tolerance against exact diagonalisation.
func TestKrylovReuse(t *testing.T) {
	n := 301
	g := randomGraph(t, 99, n, 2*n, true, true)
	times := make([]float64, 50)
	for k := range times {
		times[k] = 0.02 * float64(k+1)
	}
	run := func(m Method) ([][]complex128, Diagnostics) {
		var out [][]complex128
		d, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, basis(n, 5), times, Settings{Method: m},
			func(_ int, _ float64, psi []complex128) error {
				out = append(out, append([]complex128(nil), psi...))
				return nil
			})
		require.NoError(t, err)
		return out, d
	}
	ref, _ := run(Exact)
	got, d := run(Krylov)
	t.Logf("Krylov: %d products, error bound %.3g", d.Products, d.ErrorBound)
	assert.Less(t, d.Products, 10*krylovDim, "50 times over t ≤ 1 should need a few bases")
	assert.LessOrEqual(t, d.ErrorBound, 1e-10)
	for k := range times {
		// The default tolerance 1e-10 plus rounding (common practice).
		assert.LessOrEqual(t, diffNorm(got[k], ref[k]), 1e-10+1e-12, "t=%v", times[k])
	}
}
