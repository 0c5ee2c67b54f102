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
// a is row-major full storage, a[i*n+j] = A_ij; it is used as workspace and
// overwritten. vecs is row-major n×n with column k the eigenvector of
// values[k]: vecs[i*n+k] is component i of eigenvector k. vecs is nil when
// vectors is false.
//
// Errors (*fault.Error, field "matrix"): n < 1, len(a) ≠ n², NaN or Inf
// entries, an asymmetric input (|a_ij − a_ji| > 1e-10·max|a|).
func SymEigen(a []float64, n int, vectors bool) (values, vecs []float64, err error) {
	if err := eigCheckSym(a, n); err != nil {
		return nil, nil, err
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
		return d, nil, nil
	}
	z := make([]float64, n*n)
	if ok := tridiagEigen(n, d, e, z, n); !ok {
		return nil, nil, eigErrNoConv()
	}
	symApplyQ(a, n, tau, z, n, n)
	return d, z, nil
}

// HermEigen returns the eigenvalues of the complex Hermitian n×n matrix a in
// ascending order and, when vectors is true, the orthonormal eigenvectors:
// vecs[i*n+k] is component i of the eigenvector of values[k].
//
// a is row-major full storage and is overwritten. The matrix is reduced by
// complex Householder reflectors chosen so that the tridiagonal form is real
// (the phases are absorbed into the reflectors), so no 2n×2n real embedding
// is formed.
//
// Errors (*fault.Error, field "matrix"): n < 1, len(a) ≠ n², NaN or Inf
// entries, a non-Hermitian input (|a_ij − conj(a_ji)| > 1e-10·max|a|).
func HermEigen(a []complex128, n int, vectors bool) (values []float64, vecs []complex128, err error) {
	if err := eigCheckHerm(a, n); err != nil {
		return nil, nil, err
	}
	ar := make([]float64, n*n)
	ai := make([]float64, n*n)
	for k, v := range a {
		ar[k], ai[k] = real(v), -imag(v)
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
		return d, nil, nil
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
	return d, a, nil
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

func eigCheckSym(a []float64, n int) error {
	if err := eigCheckDims(len(a), n); err != nil {
		return err
	}
	amax := 0.0
	for i, v := range a {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fault.New("matrix", "must have finite entries; got %v at (%d, %d)", v, i/n, i%n)
		}
		amax = math.Max(amax, math.Abs(v))
	}
	tol := hermTol * amax
	for i := 0; i < n; i++ {
		for j := 0; j < i; j++ {
			if math.Abs(a[i*n+j]-a[j*n+i]) > tol {
				return fault.New("matrix", "must be symmetric within %g·max|a| = %g; got a[%d][%d] = %g, a[%d][%d] = %g",
					hermTol, tol, i, j, a[i*n+j], j, i, a[j*n+i])
			}
		}
	}
	return nil
}

func eigCheckHerm(a []complex128, n int) error {
	if err := eigCheckDims(len(a), n); err != nil {
		return err
	}
	amax := 0.0
	for i, v := range a {
		if math.IsNaN(real(v)) || math.IsNaN(imag(v)) || math.IsInf(real(v), 0) || math.IsInf(imag(v), 0) {
			return fault.New("matrix", "must have finite entries; got %v at (%d, %d)", v, i/n, i%n)
		}
		amax = math.Max(amax, math.Abs(real(v))+math.Abs(imag(v)))
	}
	tol := hermTol * amax
	for i := 0; i < n; i++ {
		if math.Abs(imag(a[i*n+i])) > tol {
			return fault.New("matrix", "must be Hermitian (real diagonal within %g); got a[%d][%d] = %v", tol, i, i, a[i*n+i])
		}
		for j := 0; j < i; j++ {
			u, v := a[i*n+j], a[j*n+i]
			if math.Abs(real(u)-real(v)) > tol || math.Abs(imag(u)+imag(v)) > tol {
				return fault.New("matrix", "must be Hermitian within %g·max|a| = %g; got a[%d][%d] = %v, a[%d][%d] = %v",
					hermTol, tol, i, j, u, j, i, v)
			}
		}
	}
	return nil
}
