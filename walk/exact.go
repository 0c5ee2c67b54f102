package walk

import (
	"context"
	"math"
	"math/cmplx"

	"github.com/ampwalk/ampwalk/spectra"
)

// exact propagates through the full eigen-decomposition H = VΛVᴴ:
//
//	ψ(t+Δt) = V e^{−iΛΔt} Vᴴ ψ(t)    (e^{−ΛΔt} for the classical walk)
//
// H is assembled densely from n products with the unit vectors, and
// diagonalised by spectra.SymEigen (real H) or spectra.HermEigen (complex
// Hermitian H). Cost: O(n³) once, then two dense n×n products per step;
// memory 16·n² bytes for the matrix and again for the vectors (half of that
// for real H). The result is exact up to rounding at any time, however long.
type exact struct {
	classical bool
	n         int
	lam       []float64
	vr        []float64    // real eigenvectors, row-major, column k for lam[k]
	vc        []complex128 // complex eigenvectors (nil when vr is used)
	c         []complex128
	hnorm     float64
}

// newExact assembles and diagonalises op; it returns the products used.
func newExact(ctx context.Context, op Operator, classical bool) (*exact, int, error) {
	n := op.Len()
	a := make([]complex128, n*n)
	e := make([]complex128, n)
	col := make([]complex128, n)
	isReal := true
	for j := 0; j < n; j++ {
		if j%256 == 255 {
			if err := ctx.Err(); err != nil {
				return nil, j, cancelled(err)
			}
		}
		e[j] = 1
		op.MulVec(col, e)
		e[j] = 0
		for i, v := range col {
			a[i*n+j] = v
			if imag(v) != 0 {
				isReal = false
			}
		}
	}
	x := &exact{classical: classical, n: n, c: make([]complex128, n)}
	var err error
	if isReal {
		ar := make([]float64, n*n)
		for i, v := range a {
			ar[i] = real(v)
		}
		a = nil
		x.lam, x.vr, err = spectra.SymEigen(ar, n, true)
	} else {
		x.lam, x.vc, err = spectra.HermEigen(a, n, true)
	}
	if err != nil {
		return nil, n, err
	}
	for _, l := range x.lam {
		x.hnorm = math.Max(x.hnorm, math.Abs(l))
	}
	return x, n, nil
}

func (x *exact) name() string { return "exact" }

func (x *exact) step(ctx context.Context, psi []complex128, dt, tol float64) (int, float64, error) {
	n, c := x.n, x.c
	for k := range c {
		c[k] = 0
	}
	// c = Vᴴψ, row by row so that V is read contiguously.
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
	// An estimate, not a bound: backward-stable eigensolvers give
	// eigenpairs with residuals of order n·ε·‖H‖, which become phase errors
	// growing like ‖H‖·Δt (common practice).
	const eps = 0x1p-52
	est := 4 * float64(n) * eps * (1 + x.hnorm*dt) * nrm2(psi)
	return 0, est, nil
}
