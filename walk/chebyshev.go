package walk

import (
	"context"
	"math"
	"math/cmplx"

	"github.com/ampwalk/ampwalk/internal/sparse"
)

// chebyshev propagates by the Chebyshev expansion of the exponential
// (Tal-Ezer & Kosloff, J. Chem. Phys. 81, 3967 (1984)). With the spectrum of
// H inside [b−a, b+a] and H̃ = (H − b)/a,
//
//	exp(−iHt) = e^{−ibt} [J_0(at) + 2 Σ_{k≥1} (−i)^k J_k(at) T_k(H̃)]
//	exp(−Ht)  = e^{−bt}  [I_0(at) + 2 Σ_{k≥1} (−1)^k I_k(at) T_k(H̃)]
//
// T_k(H̃)ψ comes from the three-term recurrence T_{k+1} = 2H̃T_k − T_{k−1},
// one product with H per term. Since ‖T_k(H̃)‖ ≤ 1, the 2-norm error of the
// truncated series is at most ‖ψ‖ times the sum of the neglected
// coefficients, which is bounded and reported. A step of length Δt costs
// about aΔt + O((aΔt)^{1/3} log(1/ε)) products; steps with aΔt above
// maxSegment are split into equal segments.
type chebyshev struct {
	op        Operator
	csr       *sparse.CSR // non-nil: use the fused kernels
	classical bool
	b, a      float64 // centre and half-width of the spectral interval

	t1, t2, acc, tmp []complex128
	bes, scratch     []float64
	coef             []complex128

	// Real vectors for the classical walk on a real matrix (half the memory
	// traffic of the complex recurrence); allocated on first use.
	realOK                bool
	r0, r1, r2, racc, rco []float64

	// metzler: the classical generator has real off-diagonal entries ≤ 0
	// (as γL does), so exp(−Ht) maps non-negative vectors to non-negative
	// ones; a clearly negative result then reveals a bad interval.
	metzler bool
}

// maxSegment is the largest a·Δt done as one quantum series. Each segment
// pays the O((aΔt)^{1/3}·log(1/ε)) tail again, so one long series is the
// cheapest (gasket g = 12 to t = 1000 in one step: 3154 products against
// 3488 with segments of 500, benchdata/RESULTS.md); the cap only bounds the
// coefficient arrays and the rounding of one recurrence (about K·ε). The classical
// series needs only O(√(aΔt·log(1/ε))) terms (the scaled Bessel values
// e^{−x}I_k(x) fall like e^{−k²/2x}), so splitting would cost more than it
// saves; maxSegmentClassical only bounds the coefficient arrays.
const (
	maxSegment          = 20000
	maxSegmentClassical = 1e5
)

func newChebyshev(op Operator, classical bool, iv interval) *chebyshev {
	n := op.Len()
	c := &chebyshev{op: op, classical: classical,
		b: (iv.hi + iv.lo) / 2, a: (iv.hi - iv.lo) / 2}
	if c.a <= 0 {
		// A multiple of the identity: any positive half-width works.
		c.a = math.Max(1e-3*math.Abs(c.b), 1e-3)
	}
	if m, ok := op.(*sparse.CSR); ok {
		c.csr = m
		c.realOK = classical && m.IsReal()
		c.metzler = c.realOK && offDiagNonPositive(m)
	} else {
		c.tmp = make([]complex128, n)
	}
	return c
}

func (c *chebyshev) name() string { return "chebyshev" }

// work allocates the work vectors on first use (a plan with groups
// provides its own; see newChebPlan).
func (c *chebyshev) work() {
	if c.acc == nil {
		n := c.op.Len()
		c.t1, c.t2, c.acc = make([]complex128, n), make([]complex128, n), make([]complex128, n)
	}
}

// step advances psi by dt with a 2-norm error at most tol.
func (c *chebyshev) step(ctx context.Context, psi []complex128, dt, tol float64) (int, float64, error) {
	seg := float64(maxSegment)
	if c.classical {
		seg = maxSegmentClassical
	}
	nseg := int(math.Ceil(c.a * dt / seg))
	if c.classical && c.b-c.a < 0 {
		// An interval reaching below 0 scales the classical coefficients
		// by e^{−(b−a)h}; keep that below e² per segment so they need not
		// cancel (an operator with negative eigenvalues grows genuinely).
		nseg = max(nseg, int(math.Ceil(-(c.b-c.a)*dt/2)))
	}
	nseg = max(nseg, 1)
	h := dt / float64(nseg)
	var prods int
	var errSum float64
	for s := 0; s < nseg; s++ {
		if err := ctx.Err(); err != nil {
			return prods, errSum, cancelled(err)
		}
		p, e, err := c.segment(ctx, psi, h, tol/float64(nseg))
		prods += p
		errSum += e
		if err != nil {
			return prods, errSum, err
		}
	}
	return prods, errSum, nil
}

// segment advances psi by h as one series; when the result fails the norm
// check (the spectral interval was too narrow), it widens the interval and
// repeats.
func (c *chebyshev) segment(ctx context.Context, psi []complex128, h, tol float64) (int, float64, error) {
	norm := nrm2(psi)
	if norm == 0 {
		return 0, 0, nil
	}
	c.work()
	var prods int
	for try := 0; ; try++ {
		K, bound := c.coefficients(h, tol/norm)
		var err error
		if c.realOK && isRealVec(psi) {
			err = c.seriesReal(ctx, psi, K)
		} else {
			err = c.series(ctx, psi, K)
		}
		if err != nil {
			return prods, 0, err
		}
		prods += K
		after := nrm2(c.acc)
		if math.IsNaN(after) || math.IsInf(after, 0) {
			return prods, 0, numerical("the Chebyshev series produced a non-finite value")
		}
		// The exact quantum evolution keeps the norm; the classical one, with
		// a positive semi-definite generator, does not increase it. Allow the
		// truncation bound and rounding (≈ K·ε per term).
		slack := 10*bound*norm + 1e-13*float64(K+10)*norm
		bad := false
		if c.classical {
			bad = c.b-c.a >= -1e-12*c.a && after > norm+slack
			if !bad && c.metzler && minReal(psi) >= -1e-14*norm {
				bad = minReal(c.acc) < -slack
			}
		} else {
			bad = math.Abs(after-norm) > slack
		}
		if !bad {
			copy(psi, c.acc)
			return prods, bound * norm, nil
		}
		if try == 8 {
			return prods, bound * norm, numerical("the Chebyshev series does not conserve the norm even with a widened spectral interval")
		}
		c.a *= 1.25
	}
}

// coefficients fills c.coef[0:K+1] for a step of length h and returns K and
// the bound on Σ_{k>K}|coefficient| (relative error of the state).
//
// Truncation: the stated bound |J_k(x)| ≤ (x/2)^k/k! (also for e^{−x}I_k)
// fixes a K that certainly suffices; the computed values then allow an
// earlier stop. For k ≥ x the ratios r_k = J_{k+1}/J_k lie in
// [0, x/(2k+2−x)] (from the recurrence written as a continued fraction),
// and the ratios I_{k+1}/I_k decrease with k (Amos, Math. Comp. 28, 239
// (1974) (from memory)), so the computed ratio at K+1 bounds all later ones;
// a tail is then at most its first term over one minus that ratio.
func (c *chebyshev) coefficients(h, eps float64) (int, float64) {
	x := c.a * h
	var pre float64 // prefactor of the Bessel values
	var phase complex128
	if c.classical {
		// e^{−bh}I_k(ah) = e^{−(b−a)h}·e^{−x}I_k(x)
		pre = math.Exp(-(c.b - c.a) * h)
		phase = 1
	} else {
		pre = 1
		phase = cmplx.Exp(complex(0, -c.b*h))
	}
	epsB := eps / math.Max(pre, 1e-300)
	kb := boundIndex(x, epsB)
	if cap(c.bes) < kb+3 {
		c.bes = make([]float64, kb+3, 2*kb+6)
		c.coef = make([]complex128, kb+3, 2*kb+6)
	}
	bes := c.bes[:kb+3]
	if c.classical {
		c.scratch = besselIScaled(bes, x, c.scratch)
	} else {
		c.scratch = besselJ(bes, x, c.scratch)
	}
	K := kb
	tail := 2 * boundTail(x, kb)
	for k := 1; k < kb; k++ {
		var t float64
		if c.classical {
			if bes[k+1] == 0 {
				K, tail = k, 0
				break
			}
			// The computed ratio, with a little room for its rounding.
			r := bes[k+2] / bes[k+1] * (1 + 1e-12)
			if r >= 1 {
				continue
			}
			t = 2 * bes[k+1] / (1 - r)
		} else {
			if float64(k+1) < x {
				continue
			}
			r := x / (2*float64(k+2) - x)
			if r >= 1 {
				continue
			}
			t = 2 * math.Abs(bes[k+1]) / (1 - r)
		}
		t = math.Min(t, 2*boundTail(x, k))
		if t <= epsB {
			K, tail = k, t
			break
		}
	}
	coef := c.coef[:K+1]
	rot := complex(0, -1) // (−i)^k
	if c.classical {
		rot = -1
	}
	f := phase * complex(pre, 0)
	for k := 0; k <= K; k++ {
		w := 2.0
		if k == 0 {
			w = 1
		}
		coef[k] = f * complex(w*bes[k], 0)
		f *= rot
	}
	return K, tail * pre
}

// series sets c.acc = Σ_{k≤K} coef_k T_k(H̃) psi, leaving psi unchanged.
func (c *chebyshev) series(ctx context.Context, psi []complex128, K int) error {
	coef := c.coef[:K+1]
	c0 := coef[0]
	acc := c.acc
	for i, v := range psi {
		acc[i] = c0 * v
	}
	if K == 0 {
		return nil
	}
	s := 1 / c.a
	c.first(c.t1, psi, s, coef[1])
	if K == 1 {
		return nil
	}
	c.next(c.t2, c.t1, psi, s, coef[2])
	prev, cur := c.t1, c.t2
	for k := 3; k <= K; k++ {
		if k%cancelEvery == 0 {
			if err := ctx.Err(); err != nil {
				return cancelled(err)
			}
		}
		c.next(prev, cur, prev, s, coef[k])
		prev, cur = cur, prev
	}
	return nil
}

// cancelEvery is the number of series terms between context checks.
const cancelEvery = 64

// seriesReal is series for a real state and real coefficients (the
// classical walk), on float64 vectors with the real kernels.
func (c *chebyshev) seriesReal(ctx context.Context, psi []complex128, K int) error {
	n := len(psi)
	if c.r0 == nil {
		c.r0, c.r1, c.r2, c.racc = make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	}
	if cap(c.rco) < K+1 {
		c.rco = make([]float64, K+1, 2*K+2)
	}
	co := c.rco[:K+1]
	for k, v := range c.coef[:K+1] {
		co[k] = real(v)
	}
	r0, acc := c.r0, c.racc
	for i, v := range psi {
		r0[i] = real(v)
		acc[i] = co[0] * real(v)
	}
	s := 1 / c.a
	if K >= 1 {
		c.csr.ChebFirstReal(c.r1, r0, acc, s, c.b, co[1])
	}
	if K >= 2 {
		c.csr.ChebNextReal(c.r2, c.r1, r0, acc, s, c.b, co[2])
		prev, cur := c.r1, c.r2
		for k := 3; k <= K; k++ {
			if k%cancelEvery == 0 {
				if err := ctx.Err(); err != nil {
					return cancelled(err)
				}
			}
			c.csr.ChebNextReal(prev, cur, prev, acc, s, c.b, co[k])
			prev, cur = cur, prev
		}
	}
	for i, v := range acc {
		c.acc[i] = complex(v, 0)
	}
	return nil
}

// minReal returns the smallest real part in x.
func minReal(x []complex128) float64 {
	m := math.Inf(1)
	for _, v := range x {
		m = math.Min(m, real(v))
	}
	return m
}

// offDiagNonPositive reports whether every stored off-diagonal entry of the
// real matrix m is ≤ 0.
func offDiagNonPositive(m *sparse.CSR) bool {
	if m.Val == nil {
		return m.Unit <= 0
	}
	for _, v := range m.Val {
		if v > 0 {
			return false
		}
	}
	return true
}

// isRealVec reports whether every imaginary part of x is zero.
func isRealVec(x []complex128) bool {
	for _, v := range x {
		if imag(v) != 0 {
			return false
		}
	}
	return true
}

func (c *chebyshev) first(dst, cur []complex128, s float64, coef complex128) {
	if c.csr != nil {
		c.csr.ChebFirst(dst, cur, c.acc, s, c.b, coef)
		return
	}
	c.op.MulVec(c.tmp, cur)
	b, acc := complex(c.b, 0), c.acc
	for i := range dst {
		v := complex(s, 0) * (c.tmp[i] - b*cur[i])
		dst[i] = v
		acc[i] += coef * v
	}
}

func (c *chebyshev) next(dst, cur, prev []complex128, s float64, coef complex128) {
	if c.csr != nil {
		c.csr.ChebNext(dst, cur, prev, c.acc, s, c.b, coef)
		return
	}
	c.op.MulVec(c.tmp, cur)
	b, acc, s2 := complex(c.b, 0), c.acc, complex(2*s, 0)
	for i := range dst {
		v := s2*(c.tmp[i]-b*cur[i]) - prev[i]
		dst[i] = v
		acc[i] += coef * v
	}
}

// Bessel coefficients of the Chebyshev propagator.

// boundTail returns an upper bound on Σ_{k>K} (x/2)^k/k!, the tail of the
// bound |J_k(x)| ≤ (x/2)^k/k! (and e^{−x}I_k(x) ≤ (x/2)^k/k!; Abramowitz &
// Stegun 9.1.62 and 9.6.10 (from memory)), or +Inf when K+2 ≤ x/2 where the
// geometric majorant does not apply. Successive terms of the tail shrink by
// at most x/(2(K+2)), hence the factor 1/(1 − x/(2(K+2))).
func boundTail(x float64, K int) float64 {
	r := x / (2 * float64(K+2))
	if r >= 1 {
		return math.Inf(1)
	}
	return math.Exp(logBound(x, K+1)) / (1 - r)
}

// logBound returns ln((x/2)^k/k!).
func logBound(x float64, k int) float64 {
	lg, _ := math.Lgamma(float64(k + 1))
	return float64(k)*math.Log(x/2) - lg
}

// boundIndex returns the smallest K ≥ 1 with 2·boundTail(x, K) ≤ eps.
func boundIndex(x, eps float64) int {
	K := max(1, int(x/2))
	for 2*boundTail(x, K) > eps {
		K++
	}
	return K
}

// millerStart returns the even index at which the backward recurrences
// start: beyond every index needed (need) and far enough out that the
// neglected values are below 1e-40 (relative to the leading ones).
func millerStart(x float64, need int) int {
	n := max(need+10, int(x)+20)
	for logBound(x, n) > -92 {
		n++
	}
	n += 10
	return n + n%2
}

// besselJ sets dst[k] = J_k(x) for x > 0 and k < len(dst), by Miller's
// backward recurrence J_{k−1} = (2k/x)J_k − J_{k+1} from a start index
// chosen by millerStart, normalised with the identity J_0² + 2Σ_{k≥1} J_k² = 1
// (a sum of squares: no cancellation) and the sign of J_0 + 2Σ J_{2k} = 1.
// (J. C. P. Miller, British Association Mathematical Tables X (1952);
// Abramowitz & Stegun 9.1.27, 9.1.46, 9.1.76 (from memory).) The backward
// direction is stable: J_k is the recurrence's minimal solution for k > x.
// scratch is reused when long enough; the possibly grown scratch is returned.
func besselJ(dst []float64, x float64, scratch []float64) []float64 {
	n := millerStart(x, len(dst))
	if cap(scratch) < n+2 {
		scratch = make([]float64, n+2)
	}
	f := scratch[:n+2]
	f[n+1], f[n] = 0, 1e-30
	for k := n; k >= 1; k-- {
		v := 2*float64(k)/x*f[k] - f[k+1]
		f[k-1] = v
		// Rescale well below overflow: the normalisation sums squares, so
		// values must stay below ~1e150 (for tiny x each step grows by 2k/x).
		if math.Abs(v) > 1e100 {
			for q := k - 1; q <= n; q++ {
				f[q] *= 1e-100
			}
		}
	}
	var sq, lin float64
	for k := n; k >= 1; k-- {
		sq += f[k] * f[k]
		if k%2 == 0 {
			lin += f[k]
		}
	}
	sq = 2*sq + f[0]*f[0]
	lin = 2*lin + f[0]
	norm := 1 / math.Sqrt(sq)
	if lin < 0 {
		norm = -norm
	}
	for k := range dst {
		dst[k] = f[k] * norm
	}
	return scratch
}

// besselIScaled sets dst[k] = e^{−x}I_k(x) for x > 0 and k < len(dst), by
// the backward recurrence I_{k−1} = (2k/x)I_k + I_{k+1} normalised with
// e^x = I_0 + 2Σ_{k≥1} I_k (Abramowitz & Stegun 9.6.26, 9.6.37 (from
// memory)). Every term is positive, so the normalisation does not cancel, and
// the scaling keeps the values finite for any x.
func besselIScaled(dst []float64, x float64, scratch []float64) []float64 {
	n := millerStart(x, len(dst))
	if cap(scratch) < n+2 {
		scratch = make([]float64, n+2)
	}
	f := scratch[:n+2]
	f[n+1], f[n] = 0, 1e-30
	for k := n; k >= 1; k-- {
		v := 2*float64(k)/x*f[k] + f[k+1]
		f[k-1] = v
		if v > 1e200 {
			for q := k - 1; q <= n; q++ {
				f[q] *= 1e-200
			}
		}
	}
	var s float64
	for k := n; k >= 1; k-- {
		s += f[k]
	}
	s = 2*s + f[0]
	for k := range dst {
		dst[k] = f[k] / s
	}
	return scratch
}
