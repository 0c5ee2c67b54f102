package walk

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/internal/sparse"
	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func basis(n, i int) []complex128 {
	v := make([]complex128, n)
	v[i] = 1
	return v
}

func TestPropagateInputErrors(t *testing.T) {
	g := graph(t, 10, chainBonds(10, false), nil)
	h := g.Hamiltonian(1)
	ok := []float64{0, 1}
	nan := math.NaN()
	cases := []struct {
		name  string
		dyn   Dynamics
		psi   []complex128
		times []float64
		s     Settings
		field string
		has   string
	}{
		{"short state", Quantum, make([]complex128, 9), ok, Settings{}, "start", "got 9"},
		{"nan state", Quantum, []complex128{0, 0, complex(nan, 0), 0, 0, 0, 0, 0, 0, 0}, ok, Settings{}, "start[2]", "finite"},
		{"no times", Quantum, basis(10, 0), nil, Settings{}, "times", "at least one"},
		{"negative time", Quantum, basis(10, 0), []float64{0, 1, -2}, Settings{}, "times", "times[2]"},
		{"nan time", Quantum, basis(10, 0), []float64{nan}, Settings{}, "times", "times[0]"},
		{"inf time", Quantum, basis(10, 0), []float64{math.Inf(1)}, Settings{}, "times", "times[0]"},
		{"decreasing", Quantum, basis(10, 0), []float64{0, 2, 1}, Settings{}, "times", "times[2] = 1"},
		{"tolerance high", Quantum, basis(10, 0), ok, Settings{Tolerance: 1}, "tolerance", "less than 1"},
		{"tolerance negative", Quantum, basis(10, 0), ok, Settings{Tolerance: -1e-3}, "tolerance", "got -0.001"},
		{"tolerance nan", Quantum, basis(10, 0), ok, Settings{Tolerance: nan}, "tolerance", "NaN"},
		{"method", Quantum, basis(10, 0), ok, Settings{Method: 7}, "method", "got 7"},
		{"workers", Quantum, basis(10, 0), ok, Settings{Workers: -1}, "workers", "got -1"},
		{"memory", Quantum, basis(10, 0), ok, Settings{MemoryLimit: -5}, "memory_limit", "got -5"},
		{"dynamics", Dynamics(4), basis(10, 0), ok, Settings{}, "dynamics", "got 4"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			called := false
			_, err := Propagate(context.Background(), h, c.dyn, c.psi, c.times, c.s, func(int, float64, []complex128) error {
				called = true
				return nil
			})
			var ie *InputError
			require.ErrorAs(t, err, &ie)
			assert.Equal(t, fault.Invalid, ie.Kind)
			assert.Equal(t, c.field, ie.Field)
			assert.Contains(t, ie.Error(), c.has)
			assert.False(t, called, "no state may be reported after an input error")
		})
	}
}

func TestPropagateTooLarge(t *testing.T) {
	g := graph(t, 300, chainBonds(300, false), nil)
	for _, m := range []Method{Exact, Krylov, Chebyshev} {
		_, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, basis(300, 0), []float64{1}, Settings{Method: m, MemoryLimit: 1000}, nil)
		var ie *InputError
		require.ErrorAs(t, err, &ie, "%v", m)
		assert.Equal(t, fault.TooLarge, ie.Kind)
		assert.Contains(t, ie.Msg, "estimated memory")
	}
	// Exact is refused at a limit Chebyshev fits in; Auto then avoids it.
	lim := EstimateBytes(300, 598, Exact) - 1
	_, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, basis(300, 0), []float64{1}, Settings{Method: Exact, MemoryLimit: lim}, nil)
	var ie *InputError
	require.ErrorAs(t, err, &ie)
	assert.Equal(t, "method", ie.Field)
	d, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, basis(300, 0), []float64{1, 2, 3, 4, 5, 6, 7, 8}, Settings{MemoryLimit: lim}, nil)
	require.NoError(t, err)
	assert.NotEqual(t, "exact", d.Method)
}

func TestEstimateBytes(t *testing.T) {
	// Exact holds two dense n×n complex matrices (16 bytes per entry).
	assert.GreaterOrEqual(t, EstimateBytes(1000, 4000, Exact), int64(2*16*1000*1000))
	// Krylov holds krylovDim+1 basis vectors; Chebyshev a handful.
	assert.Greater(t, EstimateBytes(1e6, 4e6, Krylov), int64(krylovDim*16*1e6))
	assert.LessOrEqual(t, EstimateBytes(1e6, 4e6, Chebyshev), int64(20*16*1e6))
	assert.Equal(t, EstimateBytes(1e6, 4e6, Chebyshev), EstimateBytes(1e6, 4e6, Auto))
	assert.Equal(t, int64(0), EstimateBytes(0, 0, Exact))
	// Times that cannot share an expansion need no group workspace.
	full := EstimateBytes(1e6, 4e6, Chebyshev)
	const big = 1 << 40
	assert.Equal(t, full, EstimateBytesFor(1e6, 4e6, Chebyshev, []float64{0, 1, 2}, big))
	assert.Equal(t, full-int64(planExtraVectors)*16e6, EstimateBytesFor(1e6, 4e6, Chebyshev, []float64{0, 5, 5}, big))
	assert.Equal(t, EstimateBytes(1e6, 4e6, Krylov), EstimateBytesFor(1e6, 4e6, Krylov, []float64{5}, big))
	// Nor when the workspace would take more than a tenth of the limit.
	lim := int64(planExtraVectors) * 16e6 * 10
	assert.Equal(t, full, EstimateBytesFor(1e6, 4e6, Chebyshev, []float64{1, 2}, lim))
	assert.Equal(t, full-int64(planExtraVectors)*16e6, EstimateBytesFor(1e6, 4e6, Chebyshev, []float64{1, 2}, lim-1))
}

func TestPropagateTimeZeroAndRepeats(t *testing.T) {
	g := graph(t, 30, chainBonds(30, false), nil)
	psi0 := make([]complex128, 30)
	psi0[3], psi0[4] = complex(0.6, 0), complex(0, 0.8)
	orig := append([]complex128(nil), psi0...)
	for _, m := range allMethods {
		var got [][]complex128
		var done []int
		d, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, psi0, []float64{0, 0, 1.5, 1.5}, Settings{Method: m, Progress: func(k, total int) {
			assert.Equal(t, 4, total)
			done = append(done, k)
		}}, func(k int, tm float64, psi []complex128) error {
			got = append(got, append([]complex128(nil), psi...))
			return nil
		})
		require.NoError(t, err)
		assert.Equal(t, orig, psi0, "psi0 must not be modified")
		assert.Equal(t, orig, got[0])
		assert.Equal(t, orig, got[1])
		assert.Equal(t, got[2], got[3], "a repeated time repeats the state")
		assert.Equal(t, []int{1, 2, 3, 4}, done)
		assert.GreaterOrEqual(t, d.Seconds, 0.0)
	}
	// Only time 0: no propagation at all.
	d, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, psi0, []float64{0}, Settings{}, nil)
	require.NoError(t, err)
	assert.Equal(t, 0, d.Products)
	assert.NotEmpty(t, d.Reason)
}

func TestPropagateCancel(t *testing.T) {
	g := graph(t, 200, chainBonds(200, false), nil)
	for _, m := range allMethods {
		ctx, cancel := context.WithCancel(context.Background())
		cancel()
		_, err := Propagate(ctx, g.Hamiltonian(1), Quantum, basis(200, 5), []float64{1, 2}, Settings{Method: m}, nil)
		require.ErrorIs(t, err, context.Canceled)
		var ie *InputError
		require.ErrorAs(t, err, &ie)
		assert.Equal(t, fault.Cancelled, ie.Kind)

		// Cancelled between reported times: the states before are reported,
		// none after.
		ctx, cancel = context.WithCancel(context.Background())
		var seen []int
		_, err = Propagate(ctx, g.Hamiltonian(1), Quantum, basis(200, 5), []float64{1, 2, 3}, Settings{Method: m}, func(k int, _ float64, _ []complex128) error {
			seen = append(seen, k)
			if k == 1 {
				cancel()
			}
			return nil
		})
		require.ErrorIs(t, err, context.Canceled, "%v", m)
		assert.Equal(t, []int{0, 1}, seen)
		cancel()
	}
}

func TestPropagateVisitError(t *testing.T) {
	g := graph(t, 20, chainBonds(20, false), nil)
	stop := errors.New("enough")
	n := 0
	_, err := Propagate(context.Background(), g.Hamiltonian(1), Quantum, basis(20, 0), []float64{1, 2, 3}, Settings{}, func(k int, _ float64, _ []complex128) error {
		n++
		if k == 1 {
			return stop
		}
		return nil
	})
	require.ErrorIs(t, err, stop)
	assert.Equal(t, 2, n)
}

// hidden hides the concrete type of an operator, so the propagators take
// their generic MulVec paths.
type hidden struct{ op Operator }

func (h hidden) Len() int                   { return h.op.Len() }
func (h hidden) MulVec(dst, x []complex128) { h.op.MulVec(dst, x) }

// TestGenericOperator runs every method on an Operator that is not a
// *sparse.CSR and compares with the CSR run.
func TestGenericOperator(t *testing.T) {
	g := randomGraph(t, 7, 80, 150, true, true)
	times := []float64{0.3, 2, 9}
	for _, dyn := range []Dynamics{Quantum, Classical} {
		op := g.Hamiltonian(0.9)
		if dyn == Classical {
			op = g.Laplacian(0.9)
		}
		for _, m := range allMethods {
			var a, b [][]complex128
			rec := func(dst *[][]complex128) Visit {
				return func(_ int, _ float64, psi []complex128) error {
					*dst = append(*dst, append([]complex128(nil), psi...))
					return nil
				}
			}
			_, err := Propagate(context.Background(), op, dyn, basis(80, 3), times, Settings{Method: m}, rec(&a))
			require.NoError(t, err)
			_, err = Propagate(context.Background(), hidden{op}, dyn, basis(80, 3), times, Settings{Method: m}, rec(&b))
			require.NoError(t, err)
			for k := range times {
				// Both within the default tolerance 1e-10 of the truth.
				assert.LessOrEqual(t, diffNorm(a[k], b[k]), 2e-10, "%v %v t=%v", dyn, m, times[k])
			}
		}
	}
}

// TestWorkersReproducible checks that a propagation gives the same bits for
// the same worker count, and agrees across worker counts to the tolerance.
func TestWorkersReproducible(t *testing.T) {
	// Generation 8 (9843 sites) is large enough for the kernels to split
	// the rows into more than one block.
	g, err := lattice.Gasket(8)
	require.NoError(t, err)
	n := g.Len()
	run := func(w int) []complex128 {
		var out []complex128
		_, err := QuantumWalk(context.Background(), g, 1, basis(n, 0), []float64{5, 40}, Settings{Method: Chebyshev, Workers: w}, func(k int, _ float64, psi []complex128) error {
			if k == 1 {
				out = append([]complex128(nil), psi...)
			}
			return nil
		})
		require.NoError(t, err)
		return out
	}
	a1, a2 := run(1), run(1)
	assert.Equal(t, a1, a2)
	b1, b2 := run(2), run(2)
	assert.Equal(t, b1, b2)
	assert.LessOrEqual(t, diffNorm(a1, b1), 1e-10) // the default tolerance
}

// TestSpectralInterval checks the Lanczos bounds against known spectra.
func TestSpectralInterval(t *testing.T) {
	hyper := func(d int) *lattice.Graph {
		g, err := lattice.Hypercube(d)
		require.NoError(t, err)
		return g
	}
	gasket := func(gen int) *lattice.Graph {
		g, err := lattice.Gasket(gen)
		require.NoError(t, err)
		return g
	}
	cases := []struct {
		name   string
		op     Operator
		lo, hi float64
		slack  float64
	}{
		// Hypercube Q_d: eigenvalues d − 2k (Christandl et al., PRL 92, 187902 (2004)).
		{"hypercube-8", hyper(8).Hamiltonian(1), -8, 8, 0.1},
		// Gasket adjacency spectrum [−2, 4] (references.md; Domany et al.,
		// PRB 28, 3110 (1983) (from memory)); Gershgorin would give [−4, 4].
		{"gasket-7", gasket(7).Hamiltonian(1), -2, 4, 0.1},
		// Laplacian of the gasket: [0, 6] for the degree-4 graph (the top
		// of the normalised spectrum 6 times 4/4; references.md spectral
		// decimation, Fukushima & Shima (1992) (from memory)).
		{"gasket-laplacian", hidden{gasket(6).Laplacian(1)}, 0, 6, 0.15},
		// Path P_N: 2cos(πk/(N+1)) (references.md [derived]).
		{"path-5000", graph(t, 5000, chainBonds(5000, false), nil).Hamiltonian(1), -2 * math.Cos(math.Pi/5001), 2 * math.Cos(math.Pi/5001), 0.1},
	}
	for _, c := range cases {
		iv, err := spectralInterval(context.Background(), c.op)
		require.NoError(t, err)
		assert.LessOrEqual(t, iv.lo, c.lo, "%s: lower bound inside the spectrum", c.name)
		assert.GreaterOrEqual(t, iv.hi, c.hi, "%s: upper bound inside the spectrum", c.name)
		assert.GreaterOrEqual(t, iv.lo, c.lo-c.slack*(c.hi-c.lo), "%s: lower bound too loose", c.name)
		assert.LessOrEqual(t, iv.hi, c.hi+c.slack*(c.hi-c.lo), "%s: upper bound too loose", c.name)
		assert.LessOrEqual(t, iv.products, intervalSteps)
	}
}

// TestChebyshevWidens gives the Chebyshev propagator a spectral interval
// that misses part of the spectrum: the norm check must catch it and the
// widened series must still meet the tolerance.
func TestChebyshevWidens(t *testing.T) {
	g := graph(t, 101, chainBonds(101, false), nil)
	h := g.Hamiltonian(1)
	c := newChebyshev(h, false, interval{lo: -1.2, hi: 1.2}) // true spectrum ≈ [−2, 2]
	psi := basis(101, 50)
	_, e, err := c.step(context.Background(), psi, 3, 1e-10)
	require.NoError(t, err)
	assert.Greater(t, c.a, 2.0*0.999)
	// Amplitudes (−i)^n J_n(2t) (references.md, the line).
	for j := 30; j <= 70; j++ {
		k := j - 50
		want := math.Jn(k, 6)
		var got float64
		switch ((k % 4) + 4) % 4 {
		case 0:
			got = real(psi[j])
		case 1:
			got = -imag(psi[j])
		case 2:
			got = -real(psi[j])
		case 3:
			got = imag(psi[j])
		}
		assert.InDelta(t, want, got, 1e-9, "site %d", j)
	}
	assert.LessOrEqual(t, e, 1e-10)
}

// TestAutoChoices checks that Auto picks by size, span and number of times,
// and says why.
func TestAutoChoices(t *testing.T) {
	small := graph(t, 60, chainBonds(60, false), nil)
	big := graph(t, 5000, chainBonds(5000, false), nil)
	many := make([]float64, 400)
	for k := range many {
		many[k] = 1e4 * float64(k+1) / 400
	}
	cases := []struct {
		name  string
		op    Operator
		times []float64
		want  string
		says  string
	}{
		{"short span few times", big.Hamiltonian(1), []float64{0.5, 1}, "krylov", "Krylov"},
		{"large and long", big.Hamiltonian(1), []float64{1, 10, 100}, "chebyshev", "Chebyshev"},
		{"small and very long", small.Hamiltonian(1), many, "exact", "diagonalising"},
	}
	for _, c := range cases {
		d, err := Propagate(context.Background(), c.op, Quantum, basis(c.op.Len(), 0), c.times, Settings{}, nil)
		require.NoError(t, err, c.name)
		assert.Equal(t, c.want, d.Method, c.name)
		assert.True(t, strings.Contains(d.Reason, c.says), "%s: reason %q", c.name, d.Reason)
	}
}

var _ Operator = (*sparse.CSR)(nil)

// TestChebyshevWidensClassical is TestChebyshevWidens for the classical
// walk: a too-narrow interval for γL makes the series grow, which the
// contraction check catches.
func TestChebyshevWidensClassical(t *testing.T) {
	g := graph(t, 101, chainBonds(101, false), nil)
	c := newChebyshev(g.Laplacian(1), true, interval{lo: 0, hi: 2.5}) // true spectrum ≈ [0, 4]
	psi := basis(101, 50)
	_, _, err := c.step(context.Background(), psi, 6, 1e-10)
	require.NoError(t, err)
	assert.Greater(t, 2*c.a, 4*0.999)
	// p_n = e^{−2t} I_n(2t) (references.md, classical line).
	for j := 20; j <= 80; j++ {
		assert.InDelta(t, scaledISeries(abs(j-50), 12), real(psi[j]), 1e-10, "site %d", j)
	}
}

// countCtx reports cancellation from its (after+1)-th Err call on, so a test
// can cancel deep inside a long step without timing.
type countCtx struct {
	context.Context
	calls, after int
}

func (c *countCtx) Err() error {
	c.calls++
	if c.calls > c.after {
		return context.Canceled
	}
	return nil
}

// TestCancelInsideLongStep checks that one long step (a·t ≈ 4000, many
// series segments or Krylov spaces) stops at a context check inside it.
func TestCancelInsideLongStep(t *testing.T) {
	g := graph(t, 3000, chainBonds(3000, false), nil)
	for _, m := range []Method{Krylov, Chebyshev} {
		ctx := &countCtx{Context: context.Background(), after: 6}
		d, err := Propagate(ctx, g.Hamiltonian(1), Quantum, basis(3000, 1500), []float64{1000}, Settings{Method: m}, func(int, float64, []complex128) error {
			t.Fatal("no state may be reported after cancellation")
			return nil
		})
		require.ErrorIs(t, err, context.Canceled, "%v", m)
		assert.Less(t, d.Products, 1000, "%v: stopped early", m)
	}
}

type emptyOp struct{}

func (emptyOp) Len() int                   { return 0 }
func (emptyOp) MulVec(dst, x []complex128) {}

// TestPropagateDegenerate covers an empty operator (an input error) and a
// zero initial state (a valid, trivial input that stays zero).
func TestPropagateDegenerate(t *testing.T) {
	_, err := Propagate(context.Background(), emptyOp{}, Quantum, nil, []float64{1}, Settings{}, nil)
	var ie *InputError
	require.ErrorAs(t, err, &ie)
	assert.Equal(t, "operator", ie.Field)
	_, err = Propagate(context.Background(), nil, Quantum, nil, []float64{1}, Settings{}, nil)
	require.ErrorAs(t, err, &ie)

	g := graph(t, 40, chainBonds(40, false), nil)
	for _, dyn := range []Dynamics{Quantum, Classical} {
		for _, m := range allMethods {
			op := g.Hamiltonian(1)
			if dyn == Classical {
				op = g.Laplacian(1)
			}
			d, err := Propagate(context.Background(), op, dyn, make([]complex128, 40), []float64{0.5, 3}, Settings{Method: m},
				func(_ int, _ float64, psi []complex128) error {
					for _, v := range psi {
						require.Equal(t, complex128(0), v)
					}
					return nil
				})
			require.NoError(t, err, "%v %v", dyn, m)
			assert.Equal(t, 0.0, d.NormDrift)
		}
	}
}

// nanOp is an operator whose products turn non-finite after a while.
type nanOp struct {
	op    Operator
	calls *int
	after int
}

func (o nanOp) Len() int { return o.op.Len() }
func (o nanOp) MulVec(dst, x []complex128) {
	o.op.MulVec(dst, x)
	*o.calls++
	if *o.calls > o.after {
		dst[len(dst)/2] = complex(math.NaN(), 0)
	}
}

// TestNonFiniteIsAnError checks that a non-finite product never reaches
// the caller as a silent NaN: every method returns an error instead.
func TestNonFiniteIsAnError(t *testing.T) {
	g := graph(t, 60, chainBonds(60, false), nil)
	for _, dyn := range []Dynamics{Quantum, Classical} {
		for _, m := range allMethods {
			for _, after := range []int{0, 40, 200} {
				calls := 0
				op := nanOp{g.Hamiltonian(1), &calls, after}
				if dyn == Classical {
					op.op = g.Laplacian(1)
				}
				_, err := Propagate(context.Background(), op, dyn, basis(60, 30), []float64{0.5, 4, 30}, Settings{Method: m},
					func(_ int, _ float64, psi []complex128) error {
						for _, v := range psi {
							require.False(t, math.IsNaN(real(v)) || math.IsNaN(imag(v)), "%v %v: NaN reported", dyn, m)
						}
						return nil
					})
				if calls <= after {
					// This method finished before the operator turned bad.
					require.NoError(t, err)
					continue
				}
				require.Error(t, err, "%v %v after %d", dyn, m, after)
				var ie *InputError
				require.ErrorAs(t, err, &ie)
			}
		}
	}
}

// TestClassicalLongTimes runs the classical walk to long times through the
// CSR path (Gershgorin interval) and the generic path (Lanczos interval),
// against exact diagonalisation; at late times p approaches the uniform
// 1/n of a connected graph (common practice).
func TestClassicalLongTimes(t *testing.T) {
	g, err := lattice.Gasket(4)
	require.NoError(t, err)
	n := g.Len()
	l := g.Laplacian(1)
	times := []float64{10, 1000, 20000}
	run := func(op Operator, m Method) [][]complex128 {
		var out [][]complex128
		_, err := Propagate(context.Background(), op, Classical, basis(n, 0), times, Settings{Method: m},
			func(_ int, _ float64, psi []complex128) error {
				out = append(out, append([]complex128(nil), psi...))
				return nil
			})
		require.NoError(t, err)
		return out
	}
	ref := run(l, Exact)
	for _, op := range []Operator{l, hidden{l}} {
		for _, m := range []Method{Chebyshev, Krylov, Auto} {
			got := run(op, m)
			for k := range times {
				// The default tolerance plus rounding (common practice).
				assert.LessOrEqual(t, diffNorm(got[k], ref[k]), 1e-10+1e-12, "%T %v t=%v", op, m, times[k])
			}
			for _, v := range got[2] {
				assert.InDelta(t, 1/float64(n), real(v), 1e-10)
			}
		}
	}
}

// TestStepsAllocateNothing checks that, once warmed up, a step of each
// propagator allocates nothing (the hot loops reuse their workspace).
func TestStepsAllocateNothing(t *testing.T) {
	g, err := lattice.Gasket(5)
	require.NoError(t, err)
	n := g.Len()
	h := g.Hamiltonian(1)
	ctx := context.Background()
	iv, err := spectralInterval(ctx, h)
	require.NoError(t, err)
	ex, _, err := newExact(ctx, h, false)
	require.NoError(t, err)
	props := map[string]propagator{
		"chebyshev": newChebyshev(h, false, iv),
		"classical": newChebyshev(g.Laplacian(1), true, interval{lo: 0, hi: 8}),
		"krylov":    newKrylov(h, false),
		"exact":     ex,
	}
	for name, p := range props {
		psi := basis(n, 0)
		_, _, err := p.step(ctx, psi, 2.5, 1e-10) // warm up
		require.NoError(t, err)
		allocs := testing.AllocsPerRun(5, func() {
			psi[0] += 1e-3 // defeat the reuse paths
			if _, _, err := p.step(ctx, psi, 2.5, 1e-10); err != nil {
				t.Fatal(err)
			}
		})
		assert.Equal(t, 0.0, allocs, name)
	}
}
