package walk

import (
	"context"
	"math"
	"math/rand/v2"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/internal/sparse"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/gonum"
)

// lanczos is the Hermitian Lanczos process with full reorthogonalisation
// (classical Gram–Schmidt against every stored basis vector, repeated once
// when it cancels much of the norm).
// After run, alpha[0:k] and beta[0:k] hold the tridiagonal matrix T_k
// (beta[j] couples v_j and v_{j+1}, so beta[k-1] is the residual norm
// ‖H V_k − V_k T_k‖) and v[0:k] the orthonormal basis.
//
// Cost per step: one product with H and O(j·n) for the reorthogonalisation;
// memory (m+1)·n complex values.
type lanczos struct {
	op    Operator
	v     [][]complex128
	w     []complex128
	alpha []float64
	beta  []float64
}

func newLanczos(op Operator, m int) *lanczos {
	n := op.Len()
	l := &lanczos{op: op, w: make([]complex128, n),
		alpha: make([]float64, m), beta: make([]float64, m), v: make([][]complex128, m)}
	for j := range l.v {
		l.v[j] = make([]complex128, n)
	}
	return l
}

// breakdown is the relative size of β below which the Krylov space is taken
// to be invariant (a "lucky breakdown").
const breakdown = 1e-13

// run builds the basis from v0 (normalised internally; norm is ‖v0‖ and must be
// positive) for up to len(l.v) steps and returns the number of steps k done
// and the products used. k < len(l.v) only after a lucky breakdown, in which
// case beta[k-1] is zero.
func (l *lanczos) run(ctx context.Context, v0 []complex128, norm float64) (k, products int, err error) {
	inv := complex(1/norm, 0)
	for i, x := range v0 {
		l.v[0][i] = x * inv
	}
	m := len(l.v)
	var scale float64
	for j := 0; j < m; j++ {
		if j%8 == 7 {
			if err := ctx.Err(); err != nil {
				return j, products, cancelled(err)
			}
		}
		w := l.w
		l.op.MulVec(w, l.v[j])
		products++
		a := real(dot(l.v[j], w))
		l.alpha[j] = a
		if math.IsNaN(a) || math.IsInf(a, 0) {
			return j, products, numerical("the operator produced a non-finite value")
		}
		scale = math.Max(scale, math.Abs(a))
		// The three-term recurrence, then classical Gram–Schmidt against
		// the whole basis, repeated when that pass cancelled more than 30%
		// of the norm (the criterion of
		// Daniel, Gragg, Kaufman & Stewart, Math. Comp. 30, 772 (1976)
		// (from memory): "twice is enough").
		axpy(w, complex(-a, 0), l.v[j])
		if j > 0 {
			axpy(w, complex(-l.beta[j-1], 0), l.v[j-1])
		}
		before := nrm2(w)
		var b float64
		for pass := 0; pass < 2; pass++ {
			for q := 0; q <= j; q++ {
				c := dot(l.v[q], w)
				axpy(w, -c, l.v[q])
			}
			b = nrm2(w)
			if b > 0.7*before {
				break
			}
			before = b
		}
		l.beta[j] = b
		scale = math.Max(scale, b)
		if b <= breakdown*scale {
			l.beta[j] = 0
			return j + 1, products, nil
		}
		if j+1 < m {
			inv := complex(1/b, 0)
			next := l.v[j+1]
			for i, x := range w {
				next[i] = x * inv
			}
		}
	}
	return m, products, nil
}

// tridiagEigen diagonalises the k×k symmetric tridiagonal matrix with
// diagonal alpha and off-diagonal beta[0:k-1]: on return theta holds the
// eigenvalues ascending and s (k×k row-major, column j the j-th eigenvector)
// the vectors. work must hold at least 2k values. Implicit QL/QR
// iteration (LAPACK Dsteqr as implemented in gonum).
func tridiagEigen(alpha, beta []float64, k int, theta, s, e, work []float64) bool {
	copy(theta[:k], alpha[:k])
	copy(e[:k], beta[:k])
	if k == 1 {
		s[0] = 1
		return true
	}
	var impl gonum.Implementation
	return impl.Dsteqr(lapack.EVTridiag, k, theta[:k], e[:k-1], s[:k*k], k, work[:max(1, 2*k-2)])
}

// interval bounds the spectrum of a Hermitian operator.
type interval struct {
	lo, hi   float64
	products int
	// ritzLo is the lowest Ritz value less its residual, before the margin
	// and the clipping (the classical walk uses it; see choose).
	ritzLo float64
}

// intervalSteps is the number of Lanczos steps used for the spectral bounds.
const intervalSteps = 30

// spectralInterval returns [lo, hi] containing the spectrum of op, from a
// Lanczos run of up to intervalSteps steps started on a seeded random vector:
// the extreme Ritz values θ are padded outward by their residual norms
// β_k|s_kj| (a Ritz value lies within its residual of an eigenvalue; Parlett,
// The Symmetric Eigenvalue Problem, 1980/1998, §11) plus 0.2% of the width
// as a margin for extreme eigenvalues that are not yet resolved. For a
// *sparse.CSR the result is also clipped to the Gershgorin discs, which
// always contain the spectrum. The padding errs outward: an interval that
// misses part of the spectrum makes the Chebyshev series diverge (the
// propagator detects that by the norm and widens), one that is slightly too
// wide costs a few products.
//
// The run keeps three vectors only (no stored basis, so memory stays 3n
// complex values at any size), with each new vector reorthogonalised against
// the previous two. Lost orthogonality in finite precision shows up as
// repeated copies of converged Ritz values, which leaves the extreme values
// and their residuals valid (Paige, J. Inst. Math. Appl. 18, 341 (1976)
// (from memory)).
func spectralInterval(ctx context.Context, op Operator) (interval, error) {
	n := op.Len()
	m := min(intervalSteps, n)
	// The start vector: fixed seed, so the same operator gives the same
	// interval bit for bit. Any vector with weight on every eigenvector
	// serves; a random one has it with probability one.
	rng := rand.New(rand.NewPCG(0x616d7077, 0x616c6b))
	v := make([]complex128, n)
	for i := range v {
		v[i] = complex(rng.Float64()-0.5, rng.Float64()-0.5)
	}
	scl := complex(1/nrm2(v), 0)
	for i := range v {
		v[i] *= scl
	}
	vPrev := make([]complex128, n)
	w := make([]complex128, n)
	alpha := make([]float64, m)
	beta := make([]float64, m)
	k, prods := 0, 0
	var scale float64
	for j := 0; j < m; j++ {
		if err := ctx.Err(); err != nil {
			return interval{products: prods}, cancelled(err)
		}
		op.MulVec(w, v)
		prods++
		a := real(dot(v, w))
		if math.IsNaN(a) || math.IsInf(a, 0) {
			return interval{products: prods}, numerical("the operator produced a non-finite value")
		}
		alpha[j] = a
		axpy(w, complex(-a, 0), v)
		if j > 0 {
			axpy(w, complex(-beta[j-1], 0), vPrev)
		}
		// Local reorthogonalisation against the last two vectors.
		axpy(w, -dot(v, w), v)
		if j > 0 {
			axpy(w, -dot(vPrev, w), vPrev)
		}
		b := nrm2(w)
		beta[j] = b
		k = j + 1
		scale = math.Max(scale, math.Max(math.Abs(a), b))
		if b <= breakdown*scale {
			beta[j] = 0
			break
		}
		inv := complex(1/b, 0)
		for i := range w {
			vPrev[i], v[i] = v[i], w[i]*inv
		}
	}
	theta := make([]float64, k)
	s := make([]float64, k*k)
	e := make([]float64, k)
	work := make([]float64, max(2, 2*k))
	if !tridiagEigen(alpha, beta, k, theta, s, e, work) {
		return interval{products: prods}, numerical("the tridiagonal eigenvalue iteration for the spectral bounds did not converge")
	}
	bk := beta[k-1]
	rlo := bk * math.Abs(s[(k-1)*k+0])
	rhi := bk * math.Abs(s[(k-1)*k+k-1])
	lo, hi := theta[0]-rlo, theta[k-1]+rhi
	ritzLo := lo
	margin := 2e-3 * (hi - lo)
	if margin == 0 {
		margin = 1e-3 * math.Max(1, math.Abs(hi))
	}
	lo -= margin
	hi += margin
	if c, ok := op.(*sparse.CSR); ok {
		glo, ghi := c.Gershgorin()
		lo = math.Max(lo, glo)
		hi = math.Min(hi, ghi)
	}
	if !(lo <= hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return interval{products: prods}, numerical("the spectral bounds are not finite")
	}
	return interval{lo: lo, hi: hi, products: prods, ritzLo: ritzLo}, nil
}

// dot returns xᴴy.
func dot(x, y []complex128) complex128 {
	var sr, si float64
	y = y[:len(x)]
	for i, a := range x {
		b := y[i]
		ar, ai, br, bi := real(a), imag(a), real(b), imag(b)
		sr += ar*br + ai*bi
		si += ar*bi - ai*br
	}
	return complex(sr, si)
}

// axpy sets y += a·x.
func axpy(y []complex128, a complex128, x []complex128) {
	x = x[:len(y)]
	for i := range y {
		y[i] += a * x[i]
	}
}

// nrm2 returns the 2-norm of x; the plain sum of squares is redone with
// scaling only when it under- or overflows.
func nrm2(x []complex128) float64 {
	var ss float64
	for _, z := range x {
		ss += real(z)*real(z) + imag(z)*imag(z)
	}
	if ss > 1e-290 && ss < 1e290 {
		return math.Sqrt(ss)
	}
	var scale float64
	ssq := 1.0
	for _, z := range x {
		for _, v := range [2]float64{real(z), imag(z)} {
			if v == 0 {
				continue
			}
			a := math.Abs(v)
			if scale < a {
				r := scale / a
				ssq = 1 + ssq*r*r
				scale = a
			} else {
				r := a / scale
				ssq += r * r
			}
		}
	}
	return scale * math.Sqrt(ssq)
}

func cancelled(err error) error {
	return &cancelError{err}
}

// cancelError wraps the context's error so that errors.Is(err,
// context.Canceled) holds and errors.As finds a *fault.Error of kind
// Cancelled for the bridge.
type cancelError struct{ err error }

func (c *cancelError) Error() string { return "walk: propagation cancelled: " + c.err.Error() }
func (c *cancelError) Unwrap() []error {
	return []error{c.err, &fault.Error{Kind: fault.Cancelled, Msg: "propagation cancelled: " + c.err.Error()}}
}

func numerical(msg string) error {
	return &fault.Error{Kind: fault.Numerical, Msg: msg}
}
