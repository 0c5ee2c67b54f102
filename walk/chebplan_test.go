package walk

import (
	"context"
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// logTimes returns count times log-spaced from lo to hi.
func logTimes(lo, hi float64, count int) []float64 {
	ts := make([]float64, count)
	for k := range ts {
		ts[k] = lo * math.Pow(hi/lo, float64(k)/float64(count-1))
	}
	return ts
}

// lineAmp is the amplitude (−i)^k J_k(2t) at distance k from the start on
// the infinite line with unit hopping (references.md, the line).
func lineAmp(k int, t float64) complex128 {
	j := math.Jn(k, 2*t)
	switch ((k % 4) + 4) % 4 {
	case 1:
		return complex(0, -j)
	case 2:
		return complex(-j, 0)
	case 3:
		return complex(0, j)
	}
	return complex(j, 0)
}

// lineErr returns the 2-norm distance of psi (on a chain, started at mid)
// from the infinite-line amplitudes.
func lineErr(psi []complex128, mid int, t float64) float64 {
	var s float64
	for i, v := range psi {
		d := v - lineAmp(i-mid, t)
		s += real(d)*real(d) + imag(d)*imag(d)
	}
	return math.Sqrt(s)
}

// TestChebPlanLine propagates on a long chain with many log-spaced times
// (so that the planner groups the short early intervals) and checks every
// reported state against the Bessel amplitudes of the line, the error
// bound and the agreement with the restarting driver.
func TestChebPlanLine(t *testing.T) {
	const n, mid = 241, 120
	g := graph(t, n, chainBonds(n, false), nil)
	h := g.Hamiltonian(1)
	// Up to t = 25 the walk does not reach the ends: J_120(50) < 1e-20
	// (Abramowitz & Stegun 9.1.62 bound (x/2)^k/k!, from memory).
	times := logTimes(0.01, 25, 50)
	times = append(times[:10:10], append([]float64{times[9]}, times[10:]...)...) // a repeated time

	iv, err := spectralInterval(context.Background(), h)
	require.NoError(t, err)
	c := newChebyshev(h, false, iv)
	p := newChebPlan(c, times, 1e-10, 1, times[len(times)-1], len(times)-1, 1<<30)
	grouped := 0
	for i, e := range p.groupE {
		if e > i {
			grouped++
		}
	}
	assert.Greater(t, grouped, 3, "the short early intervals are grouped")

	var planned, restart [][]complex128
	rec := func(dst *[][]complex128) Visit {
		return func(k int, tk float64, psi []complex128) error {
			assert.Equal(t, times[k], tk)
			*dst = append(*dst, append([]complex128(nil), psi...))
			return nil
		}
	}
	tol := 1e-10 // the default tolerance
	d, err := Propagate(context.Background(), h, Quantum, basis(n, mid), times, Settings{Method: Chebyshev, Tolerance: tol}, rec(&planned))
	require.NoError(t, err)
	dr, err := Propagate(context.Background(), hidden{h}, Quantum, basis(n, mid), times, Settings{Method: Chebyshev, Tolerance: tol}, rec(&restart))
	require.NoError(t, err)
	require.Len(t, planned, len(times))
	assert.Less(t, d.Products, dr.Products, "grouping saves products")
	assert.LessOrEqual(t, d.ErrorBound, tol)
	assert.Greater(t, d.ErrorBound, 0.0)
	for k, tk := range times {
		// Math.Jn to ~1e-15 per entry; the propagator within tol.
		assert.LessOrEqual(t, lineErr(planned[k], mid, tk), tol, "t=%v", tk)
		assert.LessOrEqual(t, diffNorm(planned[k], restart[k]), 2*tol, "t=%v", tk)
	}
}

// TestChebPlanWidens gives a group a spectral interval that misses part of
// the spectrum: the norm check of its accumulators must widen it and every
// time of the group must still meet the tolerance.
func TestChebPlanWidens(t *testing.T) {
	const n, mid = 101, 50
	g := graph(t, n, chainBonds(n, false), nil)
	c := newChebyshev(g.Hamiltonian(1), false, interval{lo: -1.2, hi: 1.2}) // true spectrum ≈ [−2, 2]
	times := []float64{0.5, 2, 3}
	p := newChebPlan(c, times, 1e-10, 1, 3, len(times), 1<<30)
	p.groupE = []int{2, -1, -1} // one group of all three
	psi := basis(n, mid)
	prev := 0.0
	var bound float64
	for _, tk := range times {
		_, e, err := p.advance(context.Background(), psi, tk-prev)
		require.NoError(t, err)
		bound = math.Max(bound, e)
		prev = tk
		assert.LessOrEqual(t, lineErr(psi, mid, tk), 1e-10, "t=%v", tk) // the tolerance
	}
	assert.Greater(t, c.a, 2.0*0.999)
	assert.LessOrEqual(t, bound, 1e-10)
}

// TestChebPlanMemoryCap checks that a memory limit too small for a second
// accumulator leaves every time its own restarting step.
func TestChebPlanMemoryCap(t *testing.T) {
	const n = 500
	g := graph(t, n, chainBonds(n, false), nil)
	c := newChebyshev(g.Hamiltonian(1), false, interval{lo: -2, hi: 2})
	times := logTimes(0.01, 10, 30)
	p := newChebPlan(c, times, 1e-10, 1, 10, len(times), 10*16*n*planExtraVectors-1) // 10%: just under the workspace
	for i, e := range p.groupE {
		assert.Equal(t, i, e)
	}
	assert.Empty(t, p.acc)
	p = newChebPlan(c, times, 1e-10, 1, 10, len(times), 1<<30)
	assert.Len(t, p.acc, planMaxAcc*2*n)
}

// TestChebPlanReproducible checks bit-identical planned results for a given
// worker count and agreement across worker counts.
func TestChebPlanReproducible(t *testing.T) {
	g, err := lattice.Gasket(8) // 9843 sites: more than one row block
	require.NoError(t, err)
	n := g.Len()
	times := logTimes(0.1, 20, 25)
	run := func(w int) [][]complex128 {
		var out [][]complex128
		_, err := QuantumWalk(context.Background(), g, 1, basis(n, 0), times, Settings{Method: Chebyshev, Workers: w}, func(_ int, _ float64, psi []complex128) error {
			out = append(out, append([]complex128(nil), psi...))
			return nil
		})
		require.NoError(t, err)
		return out
	}
	a1, a2 := run(1), run(1)
	assert.Equal(t, a1, a2)
	b1, b2 := run(2), run(2)
	assert.Equal(t, b1, b2)
	for k := range times {
		assert.LessOrEqual(t, diffNorm(a1[k], b1[k]), 1e-10) // the default tolerance
	}
}

// TestChebPlanCancel cancels inside a group's recurrence: no state of the
// group may be reported.
func TestChebPlanCancel(t *testing.T) {
	const n, mid = 3001, 1500
	g := graph(t, n, chainBonds(n, false), nil)
	times := []float64{100, 110, 120} // a·Δ ≤ 360 < maxSegment: one group
	ctx := &countCtx{Context: context.Background(), after: 3}
	d, err := Propagate(ctx, g.Hamiltonian(1), Quantum, basis(n, mid), times, Settings{Method: Chebyshev}, func(int, float64, []complex128) error {
		t.Fatal("no state may be reported after cancellation")
		return nil
	})
	require.ErrorIs(t, err, context.Canceled)
	assert.Less(t, d.Products, 200, "stopped early")
}

// TestChebPlanAllocatesNothing checks that a warmed-up group allocates
// nothing (the per-term loop reuses the plan's slices).
func TestChebPlanAllocatesNothing(t *testing.T) {
	if raceEnabled {
		t.Skip("the race detector makes sync.Pool drop items")
	}
	g, err := lattice.Gasket(5)
	require.NoError(t, err)
	n := g.Len()
	h := g.Hamiltonian(1)
	iv, err := spectralInterval(context.Background(), h)
	require.NoError(t, err)
	c := newChebyshev(h, false, iv)
	us := []float64{0.5, 1, 2}
	p := newChebPlan(c, us, 1e-10, 1, 2, 3, 1<<30)
	psi := basis(n, 0)
	_, err = p.group(context.Background(), psi, 0, us) // warm up
	require.NoError(t, err)
	allocs := testing.AllocsPerRun(5, func() {
		if _, err := p.group(context.Background(), psi, 0, us); err != nil {
			t.Fatal(err)
		}
	})
	assert.Equal(t, 0.0, allocs)
}

// BenchmarkChebGroupTerm times one group on the gasket g = 10 over the span
// a·Δ ≈ 150 (Δ = 50) serving 1…planMaxAcc reported times spread evenly over
// the span. Dividing the growth of ns/op by the extra accumulator terms
// (Σ_{j<e} K_j) and by the ns of one term of the 1-time group gives
// planAccWeight.
func BenchmarkChebGroupTerm(b *testing.B) {
	g, err := lattice.Gasket(10)
	if err != nil {
		b.Fatal(err)
	}
	h := g.Hamiltonian(1)
	iv, err := spectralInterval(context.Background(), h)
	if err != nil {
		b.Fatal(err)
	}
	psi := basis(h.N, 0)
	for _, m := range []int{1, 2, 4, planMaxAcc} {
		us := make([]float64, m)
		for q := range us {
			us[q] = 50 * float64(q+1) / float64(m)
		}
		c := newChebyshev(h, false, iv)
		p := newChebPlan(c, logTimes(0.1, 50, 40), 1e-10, 1, 50, 40, 1<<40)
		b.Run(fmt.Sprintf("times=%d", m), func(b *testing.B) {
			extra := 0
			for range b.N {
				if _, err := p.group(context.Background(), psi, 0, us); err != nil {
					b.Fatal(err)
				}
			}
			for _, co := range p.coefs[:m-1] {
				extra += len(co) - 1
			}
			b.ReportMetric(float64(len(p.coefs[m-1])-1), "terms")
			b.ReportMetric(float64(extra), "extra-acc-terms")
		})
	}
}

// TestChebPlanComplexHermitian runs the grouped expansion on a complex
// Hermitian operator with on-site energies (a square lattice with a
// uniform flux and on-site and bond disorder) and compares every reported
// state with the exact propagator (dense eigensystem), which shares no
// code with the Chebyshev series.
func TestChebPlanComplexHermitian(t *testing.T) {
	sq, err := lattice.Square(12, 11, false)
	require.NoError(t, err)
	g, err := sq.WithFlux(0.13)
	require.NoError(t, err)
	g, err = g.WithDisorder(lattice.Disorder{Onsite: 1.5, Bond: 0.4}, rand.New(rand.NewPCG(5, 9)))
	require.NoError(t, err)
	h := g.Hamiltonian(0.8)
	n := h.N
	psi0 := make([]complex128, n)
	psi0[0], psi0[n/2] = complex(0.6, 0), complex(0, 0.8)
	times := logTimes(0.05, 30, 16)
	var cheb, exact [][]complex128
	rec := func(dst *[][]complex128) Visit {
		return func(_ int, _ float64, psi []complex128) error {
			*dst = append(*dst, append([]complex128(nil), psi...))
			return nil
		}
	}
	d, err := Propagate(context.Background(), h, Quantum, psi0, times, Settings{Method: Chebyshev}, rec(&cheb))
	require.NoError(t, err)
	_, err = Propagate(context.Background(), h, Quantum, psi0, times, Settings{Method: Exact}, rec(&exact))
	require.NoError(t, err)
	c := newChebyshev(h, false, interval{lo: -6, hi: 6})
	p := newChebPlan(c, times, 1e-10, 1, times[len(times)-1], len(times), 1<<30)
	grouped := false
	for i, e := range p.groupE {
		grouped = grouped || e > i
	}
	require.True(t, grouped, "the test must exercise a group")
	assert.LessOrEqual(t, d.ErrorBound, 1e-10)
	for k, tk := range times {
		// The default tolerance 1e-10 plus the exact path's rounding (~1e-13).
		assert.LessOrEqual(t, diffNorm(cheb[k], exact[k]), 1.1e-10, "t=%v", tk)
	}
}

// TestChebPlanClassical runs grouped expansions for a classical walk (real
// vectors) on a weighted graph and compares every reported distribution
// with the exact propagator (dense eigensystem) and with the restarting
// driver, and checks Σp = 1 and positivity.
func TestChebPlanClassical(t *testing.T) {
	sq, err := lattice.Square(13, 12, false)
	require.NoError(t, err)
	g, err := sq.WithDisorder(lattice.Disorder{Bond: 0.6}, rand.New(rand.NewPCG(6, 2)))
	require.NoError(t, err)
	n := g.Len()
	lap := g.Laplacian(0.9)
	psi0 := make([]complex128, n)
	psi0[0], psi0[n/2] = 0.25, 0.75
	times := logTimes(0.01, 40, 24)

	iv, err := spectralInterval(context.Background(), lap)
	require.NoError(t, err)
	c := newChebyshev(lap, true, iv)
	p := newChebPlan(c, times, 1e-10, 1, times[len(times)-1], len(times), 1<<30)
	grouped := false
	for i, e := range p.groupE {
		grouped = grouped || e > i
	}
	require.True(t, grouped, "the test must exercise a group")

	var cheb, restart, exact [][]complex128
	rec := func(dst *[][]complex128) Visit {
		return func(_ int, _ float64, psi []complex128) error {
			*dst = append(*dst, append([]complex128(nil), psi...))
			return nil
		}
	}
	d, err := Propagate(context.Background(), lap, Classical, psi0, times, Settings{Method: Chebyshev}, rec(&cheb))
	require.NoError(t, err)
	dr, err := Propagate(context.Background(), hidden{lap}, Classical, psi0, times, Settings{Method: Chebyshev}, rec(&restart))
	require.NoError(t, err)
	_, err = Propagate(context.Background(), lap, Classical, psi0, times, Settings{Method: Exact}, rec(&exact))
	require.NoError(t, err)
	assert.Less(t, d.Products, dr.Products, "grouping saves products")
	assert.LessOrEqual(t, d.ErrorBound, 1e-10)
	for k, tk := range times {
		// The default tolerance 1e-10 plus the exact path's rounding.
		assert.LessOrEqual(t, diffNorm(cheb[k], exact[k]), 1.1e-10, "t=%v", tk)
		assert.LessOrEqual(t, diffNorm(cheb[k], restart[k]), 2e-10, "t=%v", tk)
		var sum float64
		for _, v := range cheb[k] {
			sum += real(v)
			assert.Zero(t, imag(v))
			assert.GreaterOrEqual(t, real(v), -1e-10)
		}
		assert.InDelta(t, 1, sum, 1e-12, "t=%v", tk) // Σp is conserved (projected)
	}
}

// TestChebyshevSplitsLongSteps reaches a time whose span a·t is beyond
// maxSegment (and maxGroupSpan), so the restarting step splits it, and
// checks the return amplitude on the cycle C_17 against the closed form
// ⟨0|U|0⟩ = (1/N)Σ_k e^{−2it cos(2πk/N)} (references.md [derived]).
func TestChebyshevSplitsLongSteps(t *testing.T) {
	const N = 17
	g := graph(t, N, chainBonds(N, true), nil)
	tm := 1.2 * maxSegment / 2 // a = 2 on the cycle
	var got complex128
	d, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, basis(N, 0), []float64{1, tm},
		Settings{Method: Chebyshev}, func(k int, _ float64, psi []complex128) error {
			got = psi[0]
			return nil
		})
	require.NoError(t, err)
	var z complex128
	for k := 0; k < N; k++ {
		z += cmplx.Exp(complex(0, -2*tm*math.Cos(2*math.Pi*float64(k)/float64(N))))
	}
	z /= N
	// The default tolerance plus the phase rounding ε·‖H‖·t ≈ 5e-12.
	assert.InDelta(t, 0, cmplx.Abs(z-got), 1e-9)
	assert.LessOrEqual(t, d.ErrorBound, 1e-10)
	assert.Greater(t, d.Products, 2*int(tm), "about a·t products")
}
