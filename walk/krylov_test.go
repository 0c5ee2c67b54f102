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

// TestToleranceStress is a longer seeded sweep (skipped with -short): larger
// random graphs, with and without phases, long times, tolerances from 1e-3
// to 1e-12; every Krylov and Chebyshev state must lie within the tolerance
// of the exact one.
func TestToleranceStress(t *testing.T) {
	if testing.Short() {
		t.Skip("long sweep")
	}
	rng := rand.New(rand.NewPCG(7, 7))
	for trial := 0; trial < 4; trial++ {
		n := 200 + rng.IntN(300)
		phases := trial%2 == 0
		g := randomGraph(t, rng.Uint64(), n, (1+rng.IntN(4))*n, true, phases)
		for _, dyn := range []Dynamics{Quantum, Classical} {
			op := g.Hamiltonian(0.5 + rng.Float64())
			if dyn == Classical {
				op = g.Laplacian(0.5 + rng.Float64())
			}
			start := rng.IntN(n)
			times := []float64{1e-3, 0.4, 3, 3.5, 30, 31, 250}
			run := func(m Method, tol float64) [][]complex128 {
				var out [][]complex128
				_, err := Propagate(context.Background(), op, dyn, basis(n, start), times, Settings{Method: m, Tolerance: tol},
					func(_ int, _ float64, psi []complex128) error {
						out = append(out, append([]complex128(nil), psi...))
						return nil
					})
				require.NoError(t, err)
				return out
			}
			ref := run(Exact, 1e-13)
			for _, tol := range []float64{1e-3, 1e-6, 1e-9, 1e-12} {
				for _, m := range []Method{Krylov, Chebyshev} {
					got := run(m, tol)
					for k := range times {
						// The tolerance plus the reference's rounding (common practice).
						assert.LessOrEqual(t, diffNorm(got[k], ref[k]), tol+1e-11, "trial %d n=%d %v %v tol=%g t=%v", trial, n, dyn, m, tol, times[k])
					}
				}
			}
		}
	}
}

// TestKrylovEstimateForms checks that the Taylor and eigen-decomposition
// forms of Saad's estimate agree where both are accurate (τ‖T‖ between 1
// and taylorLimit), and that the Taylor form keeps falling like τ^m for
// short steps, where the eigen form stalls at rounding.
func TestKrylovEstimateForms(t *testing.T) {
	g := randomGraph(t, 5, 200, 400, true, true)
	for _, classical := range []bool{false, true} {
		op := g.Hamiltonian(1)
		if classical {
			op = g.Laplacian(1)
		}
		k := newKrylov(op, classical)
		psi := basis(200, 9)
		m, _, err := k.l.run(context.Background(), psi, 1)
		require.NoError(t, err)
		require.True(t, tridiagEigen(k.l.alpha, k.l.beta, m, k.theta, k.s, k.e, k.work))
		k.normT = math.Max(math.Abs(k.theta[0]), math.Abs(k.theta[m-1]))
		h := k.l.beta[m-1]
		for _, x := range []float64{1, 3, 7} {
			tau := x / k.normT
			taylor := k.estimate(m, 1, h, tau)
			saved := k.normT
			k.normT = math.Inf(1) // force the eigen form
			eig := k.estimate(m, 1, h, tau)
			k.normT = saved
			// Agreement to rounding relative to the O(1) terms the eigen form sums
			// (common practice).
			assert.InDelta(t, eig, taylor, 1e-12+1e-9*eig, "classical=%v τ‖T‖=%v", classical, x)
		}
		// Halving a short step divides the estimate by about 2^m.
		a := k.estimate(m, 1, h, 0.02/k.normT)
		b := k.estimate(m, 1, h, 0.01/k.normT)
		require.Greater(t, b, 0.0)
		assert.InDelta(t, float64(m), math.Log2(a/b), 0.5, "classical=%v", classical)
	}
}
