package walk

import (
	"context"
	"math"
	"math/cmplx"
	"unsafe"

	dk "github.com/ampwalk/ampwalk/internal/dense"
)

// Planning Chebyshev expansions over the reported times (walks on a CSR
// operator: quantum, and classical on a real matrix from a real state).
//
// Restarting the series at every reported time pays its O(log(1/ε)) tail
// once per interval, which dominates when the early, log-spaced intervals
// are short. A group of consecutive reported times u_{s+1} < … < u_e is
// instead served by one recurrence from the state at u_s: the series runs
// to the K_e of the longest span and each time u_j has its own accumulator
// with the coefficients of its own span Δ_j = u_j − u_s, updated while
// k ≤ K_j. The groups are chosen by dynamic programming over consecutive
// times with the cost K_e + w·Σ_{j<e} K_j (products plus accumulator updates
// weighted by planAccWeight), at most planMaxAcc times per group and no
// group spanning more than maxGroupSpan in a·Δ.
//
// A group runs the rotated recurrence S_k = (−i)^k T_k(H̃)ψ
// (sparse.CSR.ChebNextRot), whose series coefficients J_0, 2J_1, 2J_2, …
// are real (the phase e^{−ibΔ_j} is applied once at the end). The last
// planRing terms are kept in a ring, and every planRing terms all
// accumulators take them at once: acc_j += Σ_k r_{jk} S_k is a real matrix
// product (dense.AddProd, complex vectors read as pairs of reals) that
// streams each accumulator through memory once per planRing terms instead
// of once per term. The classical series exp(−Ht) = e^{−bt}[I_0(at) +
// 2Σ_{k≥1}(−1)^k I_k(at)T_k(H̃)] has real coefficients on the plain
// recurrence, which then runs on real vectors (sparse.CSR.ChebNextReal).
//
// Each time keeps the error budget tol·(0.5·Δ_j/t_max + 0.5/steps) of the
// restarting driver. The error of a reported state is that of its group's
// starting state plus its own tail, so along any chain of groups the
// budgets sum to at most tol; advance reports that chain bound.

// planAccWeight is the cost of one accumulator update relative to one
// product (see BenchmarkChebGroupTerm).
const planAccWeight = 0.02

// planMaxAcc is the largest number of reported times one expansion serves
// (one row tile of dense's 6-row micro-kernel), planRing the number of
// terms stored between two accumulations. EstimateBytes counts both;
// planExtraVectors is what a plan adds to the restarting driver's three
// work vectors (two recurrence vectors and an accumulator).
const (
	planMaxAcc       = 6
	planRing         = 8
	planExtraVectors = planMaxAcc + planRing - 3
)

// maxGroupSpan is the largest a·Δ one group's series covers; it bounds
// the coefficient arrays (planMaxAcc·maxGroupSpan values).
const maxGroupSpan = 20000

// chebPlan drives the grouped expansions for propagate.
type chebPlan struct {
	c      *chebyshev
	u      []float64 // distinct positive reported times, increasing
	groupE []int     // groupE[i]: last index of the group starting at u[i] (−1: not a group start)
	tolAbs float64
	tmax   float64
	nsteps int

	next   int       // index in u of the next time to reach
	gs     int       // u[gs..ready] are held in accumulators 0…ready−gs
	ready  int       // (ready < next: none held)
	errNow float64   // error bound of the last state delivered
	errs   []float64 // error bounds of the held states

	// The workspace is real: a quantum state of n sites is 2n reals
	// (complex128 is stored as its real part then its imaginary part), a
	// classical one n. width is that length.
	classical bool
	width     int
	ring      []float64 // planRing·width, the stored terms (term k in slot k mod planRing)
	acc       []float64 // planMaxAcc·width, one accumulator after another
	workers   int

	coefs  [][]float64 // real series coefficients per time
	phases []complex128
	bounds []float64
	mat    []float64 // the coefficient block of one accumulation
}

// newChebPlan plans the groups for the times of a propagation from a state
// of norm norm0 > 0 (for a classical walk, a real state and c.realOK). The
// group workspace (planExtraVectors vectors) may take at most 10% of
// memLimit; when it does not fit, or when a classical interval reaches
// below 0 (its coefficients would grow with the span), every time gets its
// own restarting step. A quantum plan with groups takes over the driver's
// work vectors (c.t1, c.t2 become ring slots, c.acc the first accumulator).
func newChebPlan(c *chebyshev, times []float64, tolAbs, norm0, tmax float64, nsteps int, memLimit int64) *chebPlan {
	p := &chebPlan{c: c, tolAbs: tolAbs, tmax: tmax, nsteps: nsteps, ready: -1, workers: c.csr.Workers, classical: c.classical}
	prev := 0.0
	for _, t := range times {
		if t > prev {
			p.u = append(p.u, t)
			prev = t
		}
	}
	n := c.op.Len()
	maxAcc := planMaxAcc
	if !groupsFit(n, memLimit) || c.classical && c.b-c.a < -1e-12*c.a {
		maxAcc = 1
	}
	p.groupE = planGroups(c, p.u, maxAcc, func(span float64) float64 { return p.tol(span) / norm0 })
	used := 1
	for i, e := range p.groupE {
		used = max(used, e-i+1)
	}
	if used == 1 {
		return p
	}
	p.width = 2 * n
	if p.classical {
		p.width = n
	}
	p.acc = make([]float64, planMaxAcc*p.width) // accumulate runs on whole 6-row tiles
	p.ring = make([]float64, planRing*p.width)
	if !p.classical {
		c.t1, c.t2, c.acc = p.slotC(0), p.slotC(1), p.accC(0)
	}
	p.errs = make([]float64, planMaxAcc)
	p.coefs = make([][]float64, planMaxAcc)
	p.phases = make([]complex128, planMaxAcc)
	p.bounds = make([]float64, planMaxAcc)
	p.mat = make([]float64, planMaxAcc*planRing)
	return p
}

// groupsFit reports whether the group workspace of n-site states
// (planExtraVectors vectors of 16·n bytes) takes at most a tenth of
// memLimit; EstimateBytesFor follows the same rule.
func groupsFit(n int, memLimit int64) bool {
	return int64(planExtraVectors)*16*int64(max(n, 1)) <= memLimit/10
}

// slotR and accR are ring slot j and accumulator q as reals; slotC and accC
// view them as complex vectors (quantum plans).
func (p *chebPlan) slotR(j int) []float64    { return p.ring[j*p.width : (j+1)*p.width] }
func (p *chebPlan) accR(q int) []float64     { return p.acc[q*p.width : (q+1)*p.width] }
func (p *chebPlan) slotC(j int) []complex128 { return complexes(p.slotR(j)) }
func (p *chebPlan) accC(q int) []complex128  { return complexes(p.accR(q)) }

// deliver copies the state held in accumulator q to psi.
func (p *chebPlan) deliver(psi []complex128, q int) {
	if !p.classical {
		copy(psi, p.accC(q))
		return
	}
	for i, v := range p.accR(q) {
		psi[i] = complex(v, 0)
	}
}

// tol is the error budget of a time reached over span from its group's start.
func (p *chebPlan) tol(span float64) float64 {
	return p.tolAbs * (0.5*span/p.tmax + 0.5/float64(p.nsteps))
}

// planGroups chooses the groups by dynamic programming over the times
// u (with u_{−1} = 0): it returns groupE with groupE[i] = e when u[i..e] form
// a group and −1 for the other indices. tol(span) is the budget relative to
// the state's norm.
func planGroups(c *chebyshev, u []float64, maxAcc int, tol func(float64) float64) []int {
	m := len(u)
	ts := make([]float64, m+1) // ts[0] = 0, ts[i+1] = u[i]
	copy(ts[1:], u)
	terms := func(span float64) float64 {
		nseg := max(1, int(math.Ceil(c.a*span/maxGroupSpan)))
		h := span / float64(nseg)
		K, _ := c.coefficients(h, tol(span)/float64(nseg))
		return float64(nseg * K)
	}
	best := make([]float64, m+1)
	from := make([]int, m+1)
	for e := 1; e <= m; e++ {
		best[e] = math.Inf(1)
		for s := e - 1; s >= max(0, e-maxAcc); s-- {
			if e-s >= 2 && c.a*(ts[e]-ts[s]) > maxGroupSpan {
				break
			}
			cost := terms(ts[e] - ts[s])
			for j := s + 1; j < e; j++ {
				cost += planAccWeight * terms(ts[j]-ts[s])
			}
			if v := best[s] + cost; v < best[e] {
				best[e], from[e] = v, s
			}
		}
	}
	groupE := make([]int, m)
	for i := range groupE {
		groupE[i] = -1
	}
	for e := m; e > 0; e = from[e] {
		groupE[from[e]] = e - 1
	}
	return groupE
}

// advance sets psi to the state at the next distinct reported time from
// psi at the previous one (dt apart). It returns the products and the error
// bound of the new state (its group start's bound plus its own tail).
func (p *chebPlan) advance(ctx context.Context, psi []complex128, dt float64) (int, float64, error) {
	i := p.next
	p.next++
	if i <= p.ready {
		p.deliver(psi, i-p.gs)
		p.errNow = p.errs[i-p.gs]
		return 0, p.errNow, nil
	}
	e := p.groupE[i]
	if e <= i {
		// A single time: the restarting step, as without planning.
		prods, b, err := p.c.step(ctx, psi, dt, p.tol(dt))
		p.errNow += b
		return prods, p.errNow, err
	}
	start := 0.0
	if i > 0 {
		start = p.u[i-1]
	}
	prods, err := p.group(ctx, psi, start, p.u[i:e+1])
	if err != nil {
		return prods, p.errNow, err
	}
	for q := range e - i + 1 {
		p.errs[q] = p.errNow + p.bounds[q]
	}
	p.gs, p.ready = i, e
	p.deliver(psi, 0)
	p.errNow = p.errs[0]
	return prods, p.errNow, nil
}

// group fills accumulator q with the state at us[q] from psi at start
// (psi is left unchanged) and p.bounds[q] with its truncation bound,
// widening the spectral interval when a result fails the checks of segment
// (norm conservation; for the classical walk contraction and positivity).
func (p *chebPlan) group(ctx context.Context, psi []complex128, start float64, us []float64) (int, error) {
	c := p.c
	m := len(us)
	norm := nrm2(psi)
	if norm == 0 {
		for q := range m {
			clear(p.accR(q))
			p.bounds[q] = 0
		}
		return 0, nil
	}
	nonneg := p.classical && c.metzler && minReal(psi) >= -1e-14*norm
	var prods int
	for try := 0; ; try++ {
		for q, t := range us {
			h := t - start
			K, b := c.coefficients(h, p.tol(h)/norm)
			co := p.coefs[q][:0]
			if p.classical {
				// e^{−bh}(−1)^k I_k(ah)·(1 or 2), real.
				for _, v := range c.coef[:K+1] {
					co = append(co, real(v))
				}
				p.phases[q] = 1
			} else {
				// J_0, 2J_1, 2J_2, … on the rotated terms.
				for k, v := range c.bes[:K+1] {
					if k > 0 {
						v *= 2
					}
					co = append(co, v)
				}
				p.phases[q] = cmplx.Exp(complex(0, -c.b*h))
			}
			p.coefs[q] = co
			p.bounds[q] = b * norm
		}
		K, err := p.series(ctx, psi, m, try > 0)
		prods += K
		if err != nil {
			return prods, err
		}
		bad := false
		for q := range m {
			Kq := len(p.coefs[q]) - 1
			slack := 10*p.bounds[q] + 1e-13*float64(Kq+10)*norm
			var after float64
			if p.classical {
				a := p.accR(q)
				after = nrm2Real(a)
				bad = bad || c.b-c.a >= -1e-12*c.a && after > norm+slack
				bad = bad || nonneg && minFloat(a) < -slack
			} else {
				a := p.accC(q)
				ph := p.phases[q]
				for i, v := range a {
					a[i] = v * ph
				}
				after = nrm2(a)
				bad = bad || math.Abs(after-norm) > slack
			}
			if math.IsNaN(after) || math.IsInf(after, 0) {
				return prods, numerical("the Chebyshev series produced a non-finite value")
			}
		}
		if !bad {
			return prods, nil
		}
		if try == 8 {
			return prods, numerical("the Chebyshev series does not conserve the norm even with a widened spectral interval")
		}
		c.a *= 1.25
	}
}

// series sets accumulator q (q < m) to Σ_{k<len(p.coefs[q])} p.coefs[q][k]·X_k,
// with X_k = S_k = (−i)^k T_k(H̃)psi from the rotated recurrence (quantum) or
// X_k = T_k(H̃)psi on real vectors (classical), run to the longest series in
// the ring, the terms accumulated every planRing terms and at the end. The
// context is checked every cancelEvery terms. It returns the products.
// clearRing zeroes the ring first (after a failed try, whose terms need not
// be finite).
func (p *chebPlan) series(ctx context.Context, psi []complex128, m int, clearRing bool) (int, error) {
	c := p.c
	if clearRing {
		clear(p.ring)
	}
	clear(p.acc)
	K := 0
	for _, co := range p.coefs[:m] {
		K = max(K, len(co)-1)
	}
	if p.classical {
		s0 := p.slotR(0)
		for i, v := range psi {
			s0[i] = real(v)
		}
	} else {
		copy(p.slotC(0), psi)
	}
	s := 1 / c.a
	kf := 0 // the first term not yet accumulated
	for k := 0; k <= K; k++ {
		if k >= 2 && k%cancelEvery == 0 {
			if err := ctx.Err(); err != nil {
				return k - 1, cancelled(err)
			}
		}
		j, j1, j2 := k%planRing, (k+planRing-1)%planRing, (k+planRing-2)%planRing
		switch {
		case k == 1 && p.classical:
			c.csr.ChebFirstReal(p.slotR(1), p.slotR(0), nil, s, c.b, 0)
		case k == 1:
			c.csr.ChebFirstRot(p.slotC(1), p.slotC(0), s, c.b)
		case k >= 2 && p.classical:
			c.csr.ChebNextReal(p.slotR(j), p.slotR(j1), p.slotR(j2), nil, s, c.b, 0)
		case k >= 2:
			c.csr.ChebNextRot(p.slotC(j), p.slotC(j1), p.slotC(j2), s, c.b)
		}
		if k-kf+1 == planRing || k == K {
			p.accumulate(kf, k, m)
			kf = k + 1
		}
	}
	return K, nil
}

// accumulate adds terms kf…kl (at most planRing, held in the ring) to
// every accumulator whose series reaches kf: with the ring read as a
// planRing×width real matrix R and the accumulators as a planMaxAcc×width
// one A, A += C·R for the planMaxAcc×planRing block C of real coefficients
// (zero for terms outside kf…kl, beyond a series' end, or rows ≥ m). All
// planMaxAcc rows take part (one tile of dense's 6-row micro-kernel, which
// then reads the ring in place). Slots not holding one of those terms are
// cleared first, so stale values never meet a zero coefficient.
func (p *chebPlan) accumulate(kf, kl, m int) {
	if kl-kf+1 < planRing {
		for j := range planRing {
			// slot j holds term kf + ((j − kf) mod planRing) when that is ≤ kl
			if kf+((j-kf%planRing)+planRing)%planRing > kl {
				clear(p.slotR(j))
			}
		}
	}
	mat := p.mat
	clear(mat)
	for q, co := range p.coefs[:m] {
		for k := kf; k <= kl && k < len(co); k++ {
			mat[q*planRing+k%planRing] = co[k]
		}
	}
	w := p.width
	dk.AddProd(planMaxAcc, w, planRing, mat, p.ring, w, p.acc, w, p.workers)
}

// complexes views x (even length) as complex values, each a real part
// followed by an imaginary part, the layout of complex128.
func complexes(x []float64) []complex128 {
	if len(x) == 0 {
		return nil
	}
	return unsafe.Slice((*complex128)(unsafe.Pointer(&x[0])), len(x)/2)
}

// nrm2Real returns the 2-norm of x.
func nrm2Real(x []float64) float64 {
	var s float64
	for _, v := range x {
		s += v * v
	}
	return math.Sqrt(s)
}

// minFloat returns the smallest value in x (+Inf when empty).
func minFloat(x []float64) float64 {
	m := math.Inf(1)
	for _, v := range x {
		m = math.Min(m, v)
	}
	return m
}
