package walk

import (
	"context"
	"math"
	"math/cmplx"

	"github.com/ampwalk/ampwalk/internal/sparse"
	"github.com/ampwalk/ampwalk/spectra"
)

// exact propagates through the full eigen-decomposition H = VΛVᴴ:
//
//	ψ(t+Δt) = V e^{−iΛΔt} Vᴴ ψ(t)    (e^{−ΛΔt} for the classical walk)
//
// H is assembled densely (read from a *sparse.CSR, otherwise from n products
// with the unit vectors) and diagonalised by spectra.SymEigen (real H) or
// spectra.HermEigen (complex Hermitian H); n more products measure the
// eigenpair residual that bounds the error. Cost: O(n³) once, then one
// dense n×n product per step (the eigen-coefficients are kept between
// steps; two products when the state was changed in between); memory 16·n²
// bytes for the matrix and again for the vectors (half of that for real H).
// The result is exact up to rounding at any time, however long.
type exact struct {
	classical bool
	n         int
	lam       []float64
	vr        []float64    // real eigenvectors, row-major, column k for lam[k]
	vc        []complex128 // complex eigenvectors (nil when vr is used)
	c         []complex128
	hnorm     float64
	resF      float64 // ‖HV − VΛ‖_F

	last  []complex128 // the state returned by the last step
	valid bool         // c holds the eigen-coefficients of last
}

// newExact assembles and diagonalises op; it returns the products used.
func newExact(ctx context.Context, op Operator, classical bool) (*exact, int, error) {
	n := op.Len()
	x := &exact{classical: classical, n: n, c: make([]complex128, n)}
	ar, ac, prods, err := dense(ctx, op)
	if err != nil {
		return nil, prods, err
	}
	if ar != nil {
		x.lam, x.vr, err = spectra.SymEigen(ar, n, true)
	} else {
		x.lam, x.vc, err = spectra.HermEigen(ac, n, true)
	}
	if err != nil {
		return nil, prods, err
	}
	for _, l := range x.lam {
		x.hnorm = math.Max(x.hnorm, math.Abs(l))
	}
	p, err := x.residual(ctx, op)
	return x, prods + p, err
}

// dense returns op as a dense row-major matrix: real (ar) when every entry
// is real, complex (ac) otherwise. A *sparse.CSR is read directly; any other
// operator is applied to the n unit vectors (n products, counted).
func dense(ctx context.Context, op Operator) (ar []float64, ac []complex128, prods int, err error) {
	n := op.Len()
	if m, ok := op.(*sparse.CSR); ok {
		if m.IsReal() {
			ar = make([]float64, n*n)
		} else {
			ac = make([]complex128, n*n)
		}
		for i := 0; i < n; i++ {
			for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
				v := m.Unit
				if m.Val != nil {
					v = m.Val[k]
				}
				j := int(m.Col[k])
				if ar != nil {
					ar[i*n+j] += v
				} else {
					ac[i*n+j] += complex(v, m.Imag[k])
				}
			}
			if m.Diag != nil {
				if ar != nil {
					ar[i*n+i] += m.Diag[i]
				} else {
					ac[i*n+i] += complex(m.Diag[i], 0)
				}
			}
		}
		return ar, ac, 0, nil
	}
	ac = make([]complex128, n*n)
	e := make([]complex128, n)
	col := make([]complex128, n)
	isReal := true
	for j := 0; j < n; j++ {
		if j%256 == 255 {
			if err := ctx.Err(); err != nil {
				return nil, nil, j, cancelled(err)
			}
		}
		e[j] = 1
		op.MulVec(col, e)
		e[j] = 0
		for i, v := range col {
			ac[i*n+j] = v
			if imag(v) != 0 {
				isReal = false
			}
		}
	}
	if isReal {
		ar = make([]float64, n*n)
		for i, v := range ac {
			ar[i] = real(v)
		}
		ac = nil
	}
	return ar, ac, n, nil
}

// residual sets x.resF = ‖HV − VΛ‖_F from n products with the eigenvectors.
// By Duhamel's formula, with V orthonormal, ‖exp(−iHt) − V e^{−iΛt} Vᴴ‖ ≤
// t‖HV − VΛ‖₂ ≤ t·resF, which makes the error bound of step a computed
// one rather than a guess.
func (x *exact) residual(ctx context.Context, op Operator) (int, error) {
	n := x.n
	v := make([]complex128, n)
	hv := make([]complex128, n)
	var ss float64
	for k := 0; k < n; k++ {
		if k%256 == 255 {
			if err := ctx.Err(); err != nil {
				return k, cancelled(err)
			}
		}
		for i := 0; i < n; i++ {
			if x.vr != nil {
				v[i] = complex(x.vr[i*n+k], 0)
			} else {
				v[i] = x.vc[i*n+k]
			}
		}
		op.MulVec(hv, v)
		l := complex(x.lam[k], 0)
		for i, h := range hv {
			d := h - l*v[i]
			ss += real(d)*real(d) + imag(d)*imag(d)
		}
	}
	x.resF = math.Sqrt(ss)
	return n, nil
}

func (x *exact) name() string { return "exact" }

func (x *exact) step(ctx context.Context, psi []complex128, dt, tol float64) (int, float64, error) {
	n, c := x.n, x.c
	// When psi is the state this propagator returned last (nobody changed
	// it), its eigen-coefficients are still in c: one dense product per
	// step instead of two.
	if !x.valid || !equal(psi, x.last) {
		x.coefficients(psi)
	}
	for k, l := range x.lam {
		if x.classical {
			c[k] *= complex(math.Exp(-l*dt), 0)
		} else {
			s, co := math.Sincos(l * dt)
			c[k] *= complex(co, -s)
		}
	}
	for i := range psi {
		var sum complex128
		if x.vr != nil {
			var sr, si float64
			for k, v := range x.vr[i*n : (i+1)*n] {
				sr += v * real(c[k])
				si += v * imag(c[k])
			}
			sum = complex(sr, si)
		} else {
			for k, v := range x.vc[i*n : (i+1)*n] {
				sum += v * c[k]
			}
		}
		psi[i] = sum
	}
	if x.last == nil {
		x.last = make([]complex128, n)
	}
	copy(x.last, psi)
	x.valid = true
	// The eigenpair residual bounds the error growth (see residual); the
	// loss of orthogonality of V, of order n·ε for a backward-stable
	// eigensolver (common practice), is estimated, not measured (that would
	// cost O(n³)). For the classical walk, exp(−Λt) damps rather than
	// rotates, and the same Duhamel bound holds with ‖exp(−Ht)‖ ≤ 1.
	const eps = 0x1p-52
	est := (dt*x.resF + 2*float64(n)*eps) * nrm2(psi)
	return 0, est, nil
}

func equal(a, b []complex128) bool {
	for i, v := range a {
		if b[i] != v {
			return false
		}
	}
	return true
}

// coefficients sets x.c = Vᴴψ, row by row so that V is read contiguously.
func (x *exact) coefficients(psi []complex128) {
	n, c := x.n, x.c
	for k := range c {
		c[k] = 0
	}
	for i, p := range psi {
		if x.vr != nil {
			row := x.vr[i*n : (i+1)*n]
			pr, pi := real(p), imag(p)
			for k, v := range row {
				c[k] += complex(v*pr, v*pi)
			}
		} else {
			row := x.vc[i*n : (i+1)*n]
			for k, v := range row {
				c[k] += cmplx.Conj(v) * p
			}
		}
	}
}
