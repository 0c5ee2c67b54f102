package walk

import (
	"context"
	"math"
	"math/cmplx"
)

// krylovDim is the largest Krylov (Lanczos) space built per step.
const krylovDim = 30

// krylov propagates by projection onto a Krylov space: from the current
// state v with β = ‖v‖, m Lanczos steps (full reorthogonalisation) give an
// orthonormal basis V_m and the tridiagonal T_m = V_mᴴ H V_m, and
//
//	exp(−iHτ) v ≈ β V_m exp(−iτT_m) e_1
//
// (exp(−Hτ) for the classical walk), the small exponential taken through the
// eigen-decomposition T_m = S Θ Sᵀ (Saad, SIAM J. Numer. Anal. 29, 209
// (1992); Hochbruck & Lubich, SIAM J. Numer. Anal. 34, 1911 (1997)).
//
// Error control: the a-posteriori estimate is the leading term of Saad's
// error expansion (1992, Theorem 5.1),
//
//	err(τ) ≈ β h_{m+1,m} τ |e_mᵀ φ₁(−iτT_m) e_1|,  φ₁(z) = (e^z − 1)/z,
//
// and the step τ is the largest (on a geometric grid) whose estimate meets
// the error budget per unit time, tol·τ/Δt, with the two next shorter grid
// steps also meeting it (so an accidental near-zero of the estimate is not
// taken for accuracy). This is the local error control of Sidje's Expokit
// (ACM TOMS 24, 130 (1998)), except that with the eigen-decomposition at
// hand the step is chosen exactly rather than predicted from τ^m scaling.
// A lucky breakdown (an invariant Krylov space) makes the step exact. The
// basis of the last step is kept: the next reported time is reached from it
// without new products when its error estimate still fits the budget.
//
// Cost per basis: m products with H plus O(m²n) for the reorthogonalisation;
// memory (m+1)·n complex values.
type krylov struct {
	classical bool
	l         *lanczos

	theta, s, e, work []float64
	w, tw, tw2        []complex128
	normT             float64 // max |θ| of the current T_m

	// reuse describes the basis of the last step, kept so that a later
	// reported time can be reached from it without new products.
	reuse struct {
		valid   bool
		last    []complex128 // the state returned last
		m       int
		beta, h float64
		elapsed float64 // time since the basis's start state
		budget  float64 // error budget of the steps taken on this basis
	}
}

func newKrylov(op Operator, classical bool) *krylov {
	m := min(krylovDim, op.Len())
	return &krylov{classical: classical, l: newLanczos(op, m),
		theta: make([]float64, m), s: make([]float64, m*m), e: make([]float64, m),
		work: make([]float64, max(2, 2*m)), w: make([]complex128, m),
		tw: make([]complex128, m), tw2: make([]complex128, m)}
}

func (k *krylov) name() string { return "krylov" }

// z returns the exponent factor: −i for the quantum walk, −1 for the
// classical one.
func (k *krylov) z() complex128 {
	if k.classical {
		return -1
	}
	return complex(0, -1)
}

func (k *krylov) step(ctx context.Context, psi []complex128, dt, tol float64) (int, float64, error) {
	// Reuse: when psi is the state the last step returned, the basis it
	// came from may reach further. Its error at elapsed+dt replaces (not
	// adds to) the error at elapsed, so the budgets of the steps taken on
	// this basis add up.
	if k.reuse.valid && equal(psi, k.reuse.last) {
		r := &k.reuse
		tau := r.elapsed + dt
		est, mid := 0.0, 0.0
		if r.h != 0 {
			// The midpoint guards against an accidental near-zero of the
			// estimate at tau, as the grid in chooseStep does.
			est = k.estimate(r.m, r.beta, r.h, tau)
			mid = k.estimate(r.m, r.beta, r.h, r.elapsed+dt/2)
		}
		if est <= r.budget+tol && mid <= r.budget+tol {
			k.apply(psi, r.m, r.beta, tau)
			r.elapsed, r.budget = tau, r.budget+tol
			copy(r.last, psi)
			return 0, est, nil
		}
	}
	k.reuse.valid = false
	var prods int
	var errSum float64
	rem := dt
	for rem > 0 {
		if err := ctx.Err(); err != nil {
			return prods, errSum, cancelled(err)
		}
		beta := nrm2(psi)
		if beta == 0 {
			return prods, errSum, nil
		}
		m, p, err := k.l.run(ctx, psi, beta)
		prods += p
		if err != nil {
			return prods, errSum, err
		}
		if !tridiagEigen(k.l.alpha, k.l.beta, m, k.theta, k.s, k.e, k.work) {
			return prods, errSum, numerical("the tridiagonal eigenvalue iteration of the Krylov step did not converge")
		}
		h := k.l.beta[m-1]
		k.normT = math.Max(math.Abs(k.theta[0]), math.Abs(k.theta[m-1]))
		tau, est := rem, 0.0
		if h != 0 {
			tau, est = k.chooseStep(m, beta, h, rem, tol/dt)
			if tau == 0 {
				return prods, errSum, numerical("the Krylov step size fell below the smallest representable step")
			}
		}
		k.apply(psi, m, beta, tau)
		errSum += est
		if tau >= rem {
			// Keep this basis for the next reported time.
			r := &k.reuse
			if r.last == nil {
				r.last = make([]complex128, len(psi))
			}
			copy(r.last, psi)
			r.valid, r.m, r.beta, r.h = true, m, beta, h
			r.elapsed, r.budget = tau, tol*tau/dt
			break
		}
		rem -= tau
	}
	return prods, errSum, nil
}

// estimate returns Saad's error estimate for a step τ with the current
// basis of size m.
//
// For short steps the quantity e_mᵀφ₁(τA)e_1 (A = −iT_m or −T_m) is tiny,
// of order (τ‖T‖)^{m−1}/m!, and the eigen-decomposition yields it only to
// an absolute error of order ε, which would stall the step control. There
// it is summed from the Taylor series Σ_k e_mᵀ(τA)^k e_1/(k+1)!, whose terms
// have an exactly zero m-th component for k < m−1 (A is tridiagonal), so
// the sum keeps its relative accuracy.
func (k *krylov) estimate(m int, beta, h, tau float64) float64 {
	if tau*k.normT <= taylorLimit {
		return beta * h * tau * cmplx.Abs(k.lastPhi1Taylor(m, tau))
	}
	z := k.z()
	var sum complex128
	for j := 0; j < m; j++ {
		c := k.s[(m-1)*m+j] * k.s[j]
		sum += complex(c, 0) * phi1(z*complex(k.theta[j]*tau, 0))
	}
	return beta * h * tau * cmplx.Abs(sum)
}

// taylorLimit is the largest τ‖T_m‖ for which estimate sums the Taylor
// series (its terms then stay below e^8 ≈ 3000 in size).
const taylorLimit = 8

// lastPhi1Taylor returns e_mᵀφ₁(τA)e_1 from the Taylor series, with
// w_k = (τA)^k e_1/(k+1)! updated as w_{k+1} = τA w_k/(k+2).
func (k *krylov) lastPhi1Taylor(m int, tau float64) complex128 {
	w, nw := k.tw[:m], k.tw2[:m]
	for i := range w {
		w[i] = 0
	}
	w[0] = 1
	z := k.z() * complex(tau, 0)
	al, be := k.l.alpha, k.l.beta
	var sum complex128
	for q := 0; q < m+400; q++ {
		sum += w[m-1]
		var big float64
		for i := 0; i < m; i++ {
			v := complex(al[i], 0) * w[i]
			if i > 0 {
				v += complex(be[i-1], 0) * w[i-1]
			}
			if i+1 < m {
				v += complex(be[i], 0) * w[i+1]
			}
			v *= z / complex(float64(q+2), 0)
			nw[i] = v
			big = math.Max(big, cmplx.Abs(v))
		}
		w, nw = nw, w
		if q >= m-1 && big <= 1e-18*cmplx.Abs(sum) {
			break
		}
		if big == 0 {
			break
		}
	}
	return sum
}

// chooseStep returns the largest τ ≤ rem on the grid rem·0.8^j whose error
// estimate, and that of the two next grid points, is at most rate·τ.
func (k *krylov) chooseStep(m int, beta, h, rem, rate float64) (float64, float64) {
	ok := func(t float64) (bool, float64) {
		e := k.estimate(m, beta, h, t)
		return e <= rate*t, e
	}
	const shrink = 0.8
	for j := 0; j < 4000; j++ {
		t := rem * math.Pow(shrink, float64(j))
		if t < 1e-300 {
			break
		}
		a, e := ok(t)
		if !a {
			continue
		}
		b, _ := ok(t * shrink)
		c, _ := ok(t * shrink * shrink)
		if b && c {
			return t, e
		}
	}
	return 0, 0
}

// apply sets psi = β V_m S exp(zτΘ) Sᵀ e_1.
func (k *krylov) apply(psi []complex128, m int, beta, tau float64) {
	z := k.z()
	w := k.w[:m]
	for j := 0; j < m; j++ {
		w[j] = cmplx.Exp(z*complex(k.theta[j]*tau, 0)) * complex(k.s[j], 0)
	}
	for i := range psi {
		psi[i] = 0
	}
	for q := 0; q < m; q++ {
		var y complex128
		row := k.s[q*m : (q+1)*m]
		for j, c := range row {
			y += complex(c, 0) * w[j]
		}
		axpy(psi, complex(beta, 0)*y, k.l.v[q])
	}
}

// phi1 returns (e^z − 1)/z, accurately near z = 0 for real and for
// imaginary z (the two cases the propagators use).
func phi1(z complex128) complex128 {
	x, y := real(z), imag(z)
	switch {
	case z == 0:
		return 1
	case y == 0:
		return complex(math.Expm1(x)/x, 0)
	case x == 0:
		// e^{iy} − 1 = −2sin²(y/2) + i sin y
		s := math.Sin(y / 2)
		return complex(-2*s*s, math.Sin(y)) / z
	}
	if cmplx.Abs(z) < 1e-5 {
		return 1 + z/2 + z*z/6
	}
	return (cmplx.Exp(z) - 1) / z
}
