package walk

import (
	"context"
	"math"
)

// Planning Chebyshev expansions over the reported times (quantum walk on a
// CSR operator only).
//
// Restarting the series at every reported time pays its O(log(1/ε)) tail
// once per interval, which dominates when the early, log-spaced intervals
// are short. A group of consecutive reported times u_{s+1} < … < u_e is
// instead served by one recurrence from the state at u_s: the series runs
// to the K_e of the longest span and each time u_j has its own accumulator
// with the coefficients of its own span Δ_j = u_j − u_s (phase e^{−ibΔ_j},
// J_k(aΔ_j)), updated only while k ≤ K_j (sparse.CSR.ChebNextMulti). The
// groups are chosen by dynamic programming over consecutive times with the
// cost K_e + w·Σ_{j<e} K_j (products plus accumulator updates weighted by
// planAccWeight), at most planMaxAcc times per group and no group spanning
// more than maxSegment in a·Δ.
//
// Each time keeps the error budget tol·(0.5·Δ_j/t_max + 0.5/steps) of the
// restarting driver; since a group's later times do not feed any later
// group, the errors along any chain of groups still sum to at most tol.

// planAccWeight is the cost of one accumulator update relative to one
// product. Measured with BenchmarkChebMultiAccumulators, 2 workers
// (2026-12-01, 18:20 UTC): on the gasket g = 10 a step feeding one
// accumulator takes 0.39 ms, each further accumulator +0.10 ms (≈ 0.25);
// on g = 12 4.4 ms and +1.7 ms (≈ 0.38). In propbench (benchdata/RESULTS.md)
// 0.25 beat 0.4 on both g = 10 and g = 12.
const planAccWeight = 0.25

// planMaxAcc is the largest number of reported times one expansion serves.
// Beyond the driver's one accumulator the others are counted by
// EstimateBytes (planExtraVectors). benchdata/chebyshev_terms.py puts 3
// within 1% of 8 in cost for the benchmark jobs.
const (
	planMaxAcc       = 3
	planExtraVectors = planMaxAcc - 1
)

// chebPlan drives the grouped expansions for propagate.
type chebPlan struct {
	c      *chebyshev
	u      []float64 // distinct positive reported times, increasing
	groupE []int     // groupE[i]: last index of the group starting at u[i] (−1: not a group start)
	tolAbs float64
	tmax   float64
	nsteps int

	next   int // index in u of the next time to reach
	gs     int // u[gs..ready] are held in accs[0..ready−gs]
	ready  int // (ready < next: none held)
	accs   [][]complex128
	coefs  [][]complex128
	bounds []float64
	// the active accumulators and their coefficients at one term
	actA [][]complex128
	actC []complex128
}

// newChebPlan plans the groups for the times of a propagation from a state
// of norm norm0 > 0. memLimit caps the accumulators beyond the first at 10%
// of it.
func newChebPlan(c *chebyshev, times []float64, tolAbs, norm0, tmax float64, nsteps int, memLimit int64) *chebPlan {
	p := &chebPlan{c: c, tolAbs: tolAbs, tmax: tmax, nsteps: nsteps, ready: -1}
	prev := 0.0
	for _, t := range times {
		if t > prev {
			p.u = append(p.u, t)
			prev = t
		}
	}
	n := len(c.acc)
	maxAcc := planMaxAcc
	if extra := memLimit / 10 / (16 * int64(max(n, 1))); extra < int64(maxAcc-1) {
		maxAcc = 1 + int(max(extra, 0))
	}
	p.groupE = planGroups(c, p.u, maxAcc, func(span float64) float64 { return p.tol(span) / norm0 })
	p.accs = make([][]complex128, 0, maxAcc)
	p.accs = append(p.accs, c.acc)
	for len(p.accs) < maxAcc {
		p.accs = append(p.accs, nil)
	}
	p.coefs = make([][]complex128, maxAcc)
	p.bounds = make([]float64, maxAcc)
	p.actA = make([][]complex128, 0, maxAcc)
	p.actC = make([]complex128, 0, maxAcc)
	return p
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
		nseg := max(1, int(math.Ceil(c.a*span/maxSegment)))
		h := span / float64(nseg)
		K, _ := c.coefficients(h, tol(span)/float64(nseg))
		return float64(nseg * K)
	}
	best := make([]float64, m+1)
	from := make([]int, m+1)
	for e := 1; e <= m; e++ {
		best[e] = math.Inf(1)
		for s := e - 1; s >= max(0, e-maxAcc); s-- {
			if e-s >= 2 && c.a*(ts[e]-ts[s]) > maxSegment {
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

// advance sets psi to the state at the next distinct reported time t,
// from psi at the previous one. It returns the products and the error
// bound added (the tails of every accumulator of a new group).
func (p *chebPlan) advance(ctx context.Context, psi []complex128, dt float64) (int, float64, error) {
	i := p.next
	p.next++
	if i <= p.ready {
		copy(psi, p.accs[i-p.gs])
		return 0, 0, nil
	}
	e := p.groupE[i]
	if e <= i {
		// A single time: the restarting step, as without planning.
		return p.c.step(ctx, psi, dt, p.tol(dt))
	}
	start := 0.0
	if i > 0 {
		start = p.u[i-1]
	}
	prods, bound, err := p.group(ctx, psi, start, p.u[i:e+1])
	if err != nil {
		return prods, bound, err
	}
	p.gs, p.ready = i, e
	copy(psi, p.accs[0])
	return prods, bound, nil
}

// group fills p.accs[q] with the state at us[q] from psi at start (psi is
// left unchanged), widening the spectral interval when a result fails the
// norm check as segment does.
func (p *chebPlan) group(ctx context.Context, psi []complex128, start float64, us []float64) (int, float64, error) {
	c := p.c
	n := len(psi)
	m := len(us)
	for q := 1; q < m; q++ {
		if p.accs[q] == nil {
			p.accs[q] = make([]complex128, n)
		}
	}
	accs := p.accs[:m]
	norm := nrm2(psi)
	if norm == 0 {
		for _, a := range accs {
			clear(a)
		}
		return 0, 0, nil
	}
	var prods int
	for try := 0; ; try++ {
		var bound float64
		bounds := p.bounds[:m]
		for q, t := range us {
			h := t - start
			K, b := c.coefficients(h, p.tol(h)/norm)
			p.coefs[q] = append(p.coefs[q][:0], c.coef[:K+1]...)
			bounds[q] = b * norm
			bound += b * norm
		}
		K, err := p.series(ctx, psi, accs, p.coefs[:m])
		prods += K
		if err != nil {
			return prods, 0, err
		}
		bad := false
		for q, a := range accs {
			after := nrm2(a)
			if math.IsNaN(after) || math.IsInf(after, 0) {
				return prods, 0, numerical("the Chebyshev series produced a non-finite value")
			}
			Kq := len(p.coefs[q]) - 1
			slack := 10*bounds[q] + 1e-13*float64(Kq+10)*norm
			if math.Abs(after-norm) > slack {
				bad = true
			}
		}
		if !bad {
			return prods, bound, nil
		}
		if try == 8 {
			return prods, bound, numerical("the Chebyshev series does not conserve the norm even with a widened spectral interval")
		}
		c.a *= 1.25
	}
}

// series sets accs[q] = Σ_{k<len(coef[q])} coef[q][k] T_k(H̃) psi in one
// recurrence running to the longest series, each accumulator updated while
// k < len(coef[q]), with the context checked every cancelEvery terms. It
// returns the products.
func (p *chebPlan) series(ctx context.Context, psi []complex128, accs, coef [][]complex128) (int, error) {
	c := p.c
	for q, a := range accs {
		c0 := coef[q][0]
		for i, v := range psi {
			a[i] = c0 * v
		}
	}
	K := 0
	for _, co := range coef {
		K = max(K, len(co)-1)
	}
	if K == 0 {
		return 0, nil
	}
	active := func(k int) ([][]complex128, []complex128) {
		p.actA, p.actC = p.actA[:0], p.actC[:0]
		for q, co := range coef {
			if k < len(co) {
				p.actA = append(p.actA, accs[q])
				p.actC = append(p.actC, co[k])
			}
		}
		return p.actA, p.actC
	}
	s := 1 / c.a
	a, cs := active(1)
	if len(a) == 1 {
		c.csr.ChebFirst(c.t1, psi, a[0], s, c.b, cs[0])
	} else {
		c.csr.ChebFirstMulti(c.t1, psi, a, s, c.b, cs)
	}
	if K == 1 {
		return 1, nil
	}
	prev, cur := psi, c.t1
	dst := c.t2
	for k := 2; k <= K; k++ {
		if k%cancelEvery == 0 {
			if err := ctx.Err(); err != nil {
				return k - 1, cancelled(err)
			}
		}
		a, cs = active(k)
		// One active series (the longest, once the shorter have ended)
		// takes the single-accumulator kernel, which is faster than the
		// multi kernel with one accumulator (BenchmarkChebMultiAccumulators).
		if len(a) == 1 {
			c.csr.ChebNext(dst, cur, prev, a[0], s, c.b, cs[0])
		} else {
			c.csr.ChebNextMulti(dst, cur, prev, a, s, c.b, cs)
		}
		// The next term overwrites the older vector (psi is prev only at
		// k = 2 and is never overwritten).
		prev, cur = cur, dst
		dst = prev
	}
	return K, nil
}
