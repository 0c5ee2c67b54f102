package spectra

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
	"gonum.org/v1/gonum/lapack/gonum"
)

// hermTol is the relative tolerance on |a_ij − conj(a_ji)| (and on the
// imaginary part of diagonal entries) accepted as Hermitian, relative to the
// largest entry magnitude.
const hermTol = 1e-10

// SymEigen returns the eigenvalues of the real symmetric n×n matrix a in
// ascending order and, when vectors is true, the orthonormal eigenvectors.
//
// a is row-major full storage, a[i*n+j] = A_ij; after the symmetry check
// only the upper triangle (j ≥ i) is used. a is overwritten (it holds the
// Householder reflectors on return). vecs is a new row-major n×n slice with
// column k the eigenvector of values[k]: vecs[i*n+k] is component i of
// eigenvector k. vecs is nil when vectors is false.
//
// Method: blocked Householder reduction to tridiagonal form T = QᵀAQ
// (Dongarra, Sorensen & Hammarling, J. Comput. Appl. Math. 27, 215 (1989)),
// then, with vectors, divide and conquer on T (Cuppen, Numer. Math. 36, 177
// (1981); eigenvectors after Gu & Eisenstat, SIAM J. Matrix Anal. Appl. 16,
// 172 (1995)) and the blocked back-transformation Q·Z; without vectors,
// gonum's root-free QL/QR (Dsterf) on T. Cost ≈ 4n³/3 flops for values and
// 2n³ (back-transformation) plus at most 4n³/3 (merges, less with deflation)
// more for vectors, mostly in parallel matrix products; memory
// about 3n² + 512n float64 with vectors (a, the result and the divide-and-conquer
// workspace), n² + O(n) without.
//
// Errors (*fault.Error, field "matrix"): n < 1, len(a) ≠ n², NaN or Inf
// entries, an asymmetric input (|a_ij − a_ji| > 1e-10·max|a|); a Numerical
// error if an iteration fails to converge or produces a non-finite value.
func SymEigen(a []float64, n int, vectors bool) (values, vecs []float64, err error) {
	amax, err := eigCheckSym(a, n)
	if err != nil {
		return nil, nil, err
	}
	scale := eigScale(amax)
	if scale != 1 {
		for i := range a {
			a[i] *= scale
		}
	}
	d := make([]float64, n)
	e := make([]float64, n)
	tau := make([]float64, n)
	symTridiag(a, n, d, e, tau)
	var impl gonum.Implementation
	if !vectors {
		if ok := impl.Dsterf(n, d, e); !ok {
			return nil, nil, eigErrNoConv()
		}
		return eigFinish(d, scale, nil, nil)
	}
	z := make([]float64, n*n)
	if ok := tridiagEigen(n, d, e, z, n); !ok {
		return nil, nil, eigErrNoConv()
	}
	symApplyQ(a, n, tau, z, n, n)
	return eigFinish(d, scale, z, nil)
}

// HermEigen returns the eigenvalues of the complex Hermitian n×n matrix a in
// ascending order and, when vectors is true, the orthonormal eigenvectors:
// vecs[i*n+k] is component i of the eigenvector of values[k].
//
// a is row-major full storage, a[i*n+j] = A_ij (the lower triangle is used
// after the Hermiticity check). With vectors, a is overwritten with the
// eigenvectors and returned as vecs; without, a is left unchanged.
//
// Method: complex Householder reflectors chosen, as in LAPACK's zlarfg, to
// map each column onto a real multiple of e₁, so that the reduced matrix
// T = QᴴAQ is real symmetric tridiagonal (the phases are absorbed into Q) —
// no 2n×2n real embedding, which would double every eigenvalue. T is solved
// as in SymEigen (divide and conquer, or Dsterf for values only) and the
// real eigenvectors Z of T are back-transformed to Q·Z in blocks. Cost about
// four times SymEigen's; memory about 7n² + 512n float64 with vectors.
//
// Errors (*fault.Error, field "matrix"): n < 1, len(a) ≠ n², NaN or Inf
// entries, a non-Hermitian input (|a_ij − conj(a_ji)| > 1e-10·max|a|, or a
// diagonal entry with imaginary part above that); a Numerical error as for
// SymEigen.
func HermEigen(a []complex128, n int, vectors bool) (values []float64, vecs []complex128, err error) {
	amax, err := eigCheckHerm(a, n)
	if err != nil {
		return nil, nil, err
	}
	scale := eigScale(amax)
	ar := make([]float64, n*n)
	ai := make([]float64, n*n)
	for k, v := range a {
		ar[k], ai[k] = scale*real(v), -scale*imag(v)
	}
	d := make([]float64, n)
	e := make([]float64, n)
	taur := make([]float64, n)
	taui := make([]float64, n)
	herTridiag(ar, ai, n, d, e, taur, taui)
	if !vectors {
		var impl gonum.Implementation
		if ok := impl.Dsterf(n, d, e); !ok {
			return nil, nil, eigErrNoConv()
		}
		values, _, err := eigFinish(d, scale, nil, nil)
		return values, nil, err
	}
	xr := make([]float64, n*n)
	if ok := tridiagEigen(n, d, e, xr, n); !ok {
		return nil, nil, eigErrNoConv()
	}
	xi := make([]float64, n*n)
	herApplyQ(ar, ai, n, taur, taui, xr, xi, n)
	for k := range a {
		a[k] = complex(xr[k], xi[k])
	}
	values, _, err = eigFinish(d, scale, xr, xi)
	if err != nil {
		return nil, nil, err
	}
	return values, a, nil
}

// eigScale returns the factor that brings the largest entry magnitude into
// a range where the reduction's norms and products cannot overflow or
// underflow (1 when it already is).
func eigScale(amax float64) float64 {
	if amax == 0 || (amax > 1e-150 && amax < 1e150) {
		return 1
	}
	return 1 / amax
}

// eigFinish undoes the scaling and checks that values and vectors are finite.
func eigFinish(d []float64, scale float64, v1, v2 []float64) ([]float64, []float64, error) {
	for _, s := range [][]float64{d, v1, v2} {
		for _, x := range s {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, nil, &fault.Error{Kind: fault.Numerical, Field: "matrix",
					Msg: "the eigensolver produced a non-finite value"}
			}
		}
	}
	if scale != 1 {
		for i := range d {
			d[i] /= scale
		}
	}
	return d, v1, nil
}

func eigErrNoConv() error {
	return &fault.Error{Kind: fault.Numerical, Field: "matrix",
		Msg: "the tridiagonal eigenvalue iteration did not converge"}
}

func eigCheckDims(la, n int) error {
	if n < 1 {
		return fault.Range("matrix", "of order n ≥ 1", n)
	}
	if la != n*n {
		return fault.New("matrix", "must hold n² = %d entries for n = %d; got %d", n*n, n, la)
	}
	return nil
}

func eigCheckSym(a []float64, n int) (float64, error) {
	if err := eigCheckDims(len(a), n); err != nil {
		return 0, err
	}
	amax := 0.0
	for i, v := range a {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fault.New("matrix", "must have finite entries; got %v at (%d, %d)", v, i/n, i%n)
		}
		amax = math.Max(amax, math.Abs(v))
	}
	tol := hermTol * amax
	for i := 0; i < n; i++ {
		for j := 0; j < i; j++ {
			if math.Abs(a[i*n+j]-a[j*n+i]) > tol {
				return 0, fault.New("matrix", "must be symmetric within %g·max|a| = %g; got a[%d][%d] = %g, a[%d][%d] = %g",
					hermTol, tol, i, j, a[i*n+j], j, i, a[j*n+i])
			}
		}
	}
	return amax, nil
}

func eigCheckHerm(a []complex128, n int) (float64, error) {
	if err := eigCheckDims(len(a), n); err != nil {
		return 0, err
	}
	amax := 0.0
	for i, v := range a {
		if math.IsNaN(real(v)) || math.IsNaN(imag(v)) || math.IsInf(real(v), 0) || math.IsInf(imag(v), 0) {
			return 0, fault.New("matrix", "must have finite entries; got %v at (%d, %d)", v, i/n, i%n)
		}
		amax = math.Max(amax, math.Abs(real(v))+math.Abs(imag(v)))
	}
	tol := hermTol * amax
	for i := 0; i < n; i++ {
		if math.Abs(imag(a[i*n+i])) > tol {
			return 0, fault.New("matrix", "must be Hermitian (real diagonal within %g); got a[%d][%d] = %v", tol, i, i, a[i*n+i])
		}
		for j := 0; j < i; j++ {
			u, v := a[i*n+j], a[j*n+i]
			if math.Abs(real(u)-real(v)) > tol || math.Abs(imag(u)+imag(v)) > tol {
				return 0, fault.New("matrix", "must be Hermitian within %g·max|a| = %g; got a[%d][%d] = %v, a[%d][%d] = %v",
					hermTol, tol, i, j, u, j, i, v)
			}
		}
	}
	return amax, nil
}
