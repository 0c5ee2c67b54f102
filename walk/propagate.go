package walk

import (
	"context"
	"math"
	"strconv"
	"time"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/internal/sparse"
)

// propagator is what every method implements: advance a state by a time
// step. step overwrites psi with exp(−iH·dt)psi (quantum) or exp(−H·dt)psi
// (classical) for dt > 0, aiming at a 2-norm error of at most tol, and
// returns the products with H it used and a bound or estimate of the error
// it made.
type propagator interface {
	name() string
	step(ctx context.Context, psi []complex128, dt, tol float64) (products int, errEst float64, err error)
}

// DefaultTolerance is the target 2-norm error at every reported time when
// Settings.Tolerance is zero.
const DefaultTolerance = 1e-10

// propagate is Propagate: validation, method choice, the loop over the
// reported times and the diagnostics.
func propagate(ctx context.Context, op Operator, dyn Dynamics, psi0 []complex128, times []float64, s Settings, visit Visit) (Diagnostics, error) {
	start := time.Now()
	var d Diagnostics
	if op == nil {
		return d, fault.New("operator", "must be non-nil")
	}
	n := op.Len()
	if n < 1 {
		return d, fault.Range("operator", "an operator on at least one site", n)
	}
	if err := validate(n, dyn, psi0, times, &s); err != nil {
		return d, err
	}
	if c, ok := op.(*sparse.CSR); ok && c.Workers != s.Workers {
		// The caller's matrix is shared: set the worker count on a copy of
		// its header (the arrays are not copied).
		cp := *c
		cp.Workers = s.Workers
		op = &cp
	}
	if err := ctx.Err(); err != nil {
		return d, cancelled(err)
	}
	tmax := 0.0
	if len(times) > 0 {
		tmax = times[len(times)-1]
	}
	classical := dyn == Classical

	psi := append([]complex128(nil), psi0...)
	norm0 := nrm2(psi)
	sum0 := sumReal(psi)
	tolAbs := s.Tolerance * norm0

	// Conservation of Σp: when op·1 = 0 (a generator with zero row sums, such
	// as γL) the exact classical evolution keeps Σ_j p_j, and projecting the
	// computed state back onto that hyperplane only shortens its error vector
	// (the correction is the orthogonal projection of the error onto 1^⊥).
	conserve := false
	if classical && tmax > 0 {
		var err error
		conserve, err = conservesSum(op)
		d.Products += 2
		if err != nil {
			return d, err
		}
	}

	var p propagator
	if tmax > 0 {
		var prods int
		var err error
		p, prods, err = choose(ctx, op, classical, times, s, &d)
		d.Products += prods
		if err != nil {
			d.Seconds = time.Since(start).Seconds()
			return d, err
		}
		d.Method = p.name()
	} else {
		d.Method = methodName(s.Method)
		if s.Method == Auto {
			d.Method = "exact"
			d.Reason = "every reported time is 0, so the initial state is returned unchanged"
		}
	}

	nsteps := 0
	for k := range times {
		if k > 0 && times[k] > times[k-1] || k == 0 && times[0] > 0 {
			nsteps++
		}
	}
	// Walks on a CSR operator group reported times into shared Chebyshev
	// expansions (chebplan.go): quantum walks always, classical walks on a
	// real matrix from a real state (the series then runs on real vectors).
	var plan *chebPlan
	if c, ok := p.(*chebyshev); ok && c.csr != nil && norm0 > 0 && (!classical || c.realOK && isRealVec(psi)) {
		plan = newChebPlan(c, times, tolAbs, norm0, tmax, nsteps, s.MemoryLimit)
	}
	prev := 0.0
	errNow := 0.0 // error bound of the current state
	for k, t := range times {
		if dt := t - prev; dt > 0 {
			if err := ctx.Err(); err != nil {
				d.Seconds = time.Since(start).Seconds()
				return d, cancelled(err)
			}
			var prods int
			var err error
			if plan != nil {
				// The plan reports the bound of the new state itself.
				prods, errNow, err = plan.advance(ctx, psi, dt)
			} else {
				// The error budget: half shared by time, half by step, so the
				// sum over all steps stays below the tolerance.
				tol := tolAbs * (0.5*dt/tmax + 0.5/float64(nsteps))
				var e float64
				prods, e, err = p.step(ctx, psi, dt, tol)
				errNow += e
			}
			d.Products += prods
			d.ErrorBound = math.Max(d.ErrorBound, errNow)
			if err != nil {
				d.Seconds = time.Since(start).Seconds()
				return d, err
			}
			if conserve {
				project(psi, sum0)
			}
			prev = t
		}
		var drift float64
		if classical {
			drift = math.Abs(sumReal(psi) - sum0)
			if nm := nrm2(psi); math.IsNaN(nm) || math.IsInf(nm, 0) {
				drift = nm
			}
		} else {
			drift = math.Abs(nrm2(psi) - norm0)
		}
		if math.IsNaN(drift) || math.IsInf(drift, 0) {
			d.Seconds = time.Since(start).Seconds()
			return d, numerical("the propagated state is not finite")
		}
		d.NormDrift = math.Max(d.NormDrift, drift)
		if visit != nil {
			if err := visit(k, t, psi); err != nil {
				d.Seconds = time.Since(start).Seconds()
				return d, err
			}
		}
		if s.Progress != nil {
			s.Progress(k+1, len(times))
		}
	}
	d.Seconds = time.Since(start).Seconds()
	return d, nil
}

// validate checks the user-supplied parts of a propagation and fills in
// the defaults of s.
func validate(n int, dyn Dynamics, psi0 []complex128, times []float64, s *Settings) error {
	if dyn != Quantum && dyn != Classical {
		return fault.Range("dynamics", "Quantum (0) or Classical (1)", int(dyn))
	}
	if len(psi0) != n {
		return fault.New("start", "the initial state must have one entry per site (%d); got %d", n, len(psi0))
	}
	for i, v := range psi0 {
		if math.IsNaN(real(v)) || math.IsNaN(imag(v)) || math.IsInf(real(v), 0) || math.IsInf(imag(v), 0) {
			return fault.Range("start["+strconv.Itoa(i)+"]", "a finite number", v)
		}
	}
	if len(times) == 0 {
		return fault.New("times", "must list at least one time; got none")
	}
	for k, t := range times {
		switch {
		case math.IsNaN(t) || math.IsInf(t, 0) || t < 0:
			return fault.New("times", "must be finite and non-negative; times[%d] = %v", k, t)
		case k > 0 && t < times[k-1]:
			return fault.New("times", "must be non-decreasing; times[%d] = %v is less than times[%d] = %v", k, t, k-1, times[k-1])
		}
	}
	switch {
	case s.Tolerance == 0:
		s.Tolerance = DefaultTolerance
	case !(s.Tolerance > 0 && s.Tolerance < 1):
		return fault.Range("tolerance", "greater than 0 and less than 1", s.Tolerance)
	}
	if s.Method < Auto || s.Method > Chebyshev {
		return fault.Range("method", "Auto, Exact, Krylov or Chebyshev (0 to 3)", int(s.Method))
	}
	if s.Workers < 0 {
		return fault.Range("workers", "0 (all cores) or a positive count", s.Workers)
	}
	if s.MemoryLimit < 0 {
		return fault.Range("memory_limit", "0 (80% of the machine) or a positive number of bytes", s.MemoryLimit)
	}
	if s.MemoryLimit == 0 {
		s.MemoryLimit = fault.MemoryLimit()
	}
	return nil
}

func methodName(m Method) string {
	switch m {
	case Exact:
		return "exact"
	case Krylov:
		return "krylov"
	case Chebyshev:
		return "chebyshev"
	}
	return "auto"
}

// String returns "auto", "exact", "krylov" or "chebyshev".
func (m Method) String() string { return methodName(m) }

// EstimateBytes returns the memory a propagation of n sites with nnz stored
// off-diagonal entries needs under method m, beyond the operator itself:
// the state vectors and the method's workspace. Exact counts the dense n×n
// complex matrix and its eigenvectors (16·n² bytes each); Krylov the
// Lanczos basis; Chebyshev its recurrence vectors (the Lanczos run for the
// spectral bounds needs fewer). Auto returns the smallest of the three (the
// method Auto can always fall back to). nnz is accepted so that callers can
// add the operator's own storage consistently; it is not counted here.
func EstimateBytes(n, nnz int, m Method) int64 {
	N := int64(max(n, 0))
	vec := 16 * N
	base := 3 * vec // the caller's state, the driver's copy, one work vector
	switch m {
	case Exact:
		return base + 2*16*N*N + 8*N
	case Krylov:
		return base + int64(krylovDim+1)*vec + 2*vec
	case Chebyshev:
		// Beyond the base: the three vectors of the Lanczos run for the
		// spectral interval (released before the series, but the heap keeps
		// their pages), the planRing stored terms and planMaxAcc accumulators
		// of a grouped expansion (chebplan.go; the restarting driver's two
		// recurrence vectors and accumulator are among them). Measured peak
		// resident sets of gasket g = 8…13 runs sit within 10% of this
		// (benchdata/RESULTS.md, memcheck.sh). The classical walk runs on
		// real vectors and stays below it, as does a quantum walk whose
		// times form no group.
		return base + int64(3+planRing+planMaxAcc)*vec
	}
	return EstimateBytes(n, nnz, Chebyshev)
}

// EstimateBytesFor is EstimateBytes for a propagation to the given
// reported times under the memory limit memLimit (bytes). A Chebyshev
// propagation (or Auto's Chebyshev fallback) holds the group workspace of
// its expansion planner (planExtraVectors state vectors) only when at least
// two distinct positive times can share an expansion and the workspace
// takes at most a tenth of memLimit (groupsFit, the planner's own rule);
// otherwise the estimate leaves it out. Other methods: EstimateBytes.
func EstimateBytesFor(n, nnz int, m Method, times []float64, memLimit int64) int64 {
	b := EstimateBytes(n, nnz, m)
	if m != Chebyshev && m != Auto {
		return b
	}
	distinct, prev := 0, 0.0
	for _, t := range times {
		if t > prev {
			distinct++
			prev = t
		}
	}
	if distinct < 2 || !groupsFit(n, memLimit) {
		b -= int64(planExtraVectors) * 16 * int64(max(n, 0))
	}
	return b
}

// sumReal returns Σ Re ψ_i.
func sumReal(psi []complex128) float64 {
	var s float64
	for _, v := range psi {
		s += real(v)
	}
	return s
}

// project adds a constant to every real part so that Σ Re ψ_i = target.
func project(psi []complex128, target float64) {
	c := (target - sumReal(psi)) / float64(len(psi))
	for i := range psi {
		psi[i] += complex(c, 0)
	}
}

// conservesSum reports whether op·1 = 0 to rounding, i.e. whether the
// classical evolution exp(−op·t) keeps Σ_j p_j.
func conservesSum(op Operator) (bool, error) {
	n := op.Len()
	one := make([]complex128, n)
	for i := range one {
		one[i] = 1
	}
	y := make([]complex128, n)
	op.MulVec(y, one)
	var worst float64
	for _, v := range y {
		worst = math.Max(worst, math.Abs(real(v))+math.Abs(imag(v)))
	}
	if math.IsNaN(worst) || math.IsInf(worst, 0) {
		return false, numerical("the operator produced a non-finite value")
	}
	// Scale: the operator's largest entry is not known to a generic
	// Operator; the row sums of a Laplacian cancel to within rounding of
	// its degrees, which |op·e_0| gauges well enough for unweighted and
	// weighted graphs alike.
	e := make([]complex128, n)
	e[0] = 1
	op.MulVec(y, e)
	scale := nrm2(y)
	return worst <= 1e-12*math.Max(scale, 1e-300)*math.Sqrt(float64(n)), nil
}
