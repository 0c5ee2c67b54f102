package spectra

import (
	"math"
	"math/cmplx"
)

// hermTridiag reduces the Hermitian n×n matrix a (row-major, full storage,
// lower triangle referenced) to a real symmetric tridiagonal matrix
// T = Qᴴ A Q with diagonal d and sub-diagonal e[:n−1]. Q = H(0)·H(1)···H(n−2),
// H(k) = I − τ_k v_k v_kᴴ, with v_k stored below the sub-diagonal of column k
// of a (v_k[0] = 1 implicit) and τ_k in tau[k].
//
// Each reflector is chosen, as in LAPACK's zlarfg, so that H(k)ᴴ maps the
// column onto a real multiple of the first unit vector; the phases of the
// off-diagonal entries are thereby absorbed into Q and T is real.
// Unblocked (Householder, J. ACM 5, 339 (1958)); O(10n³/3) real flops.
func hermTridiag(a []complex128, n int, d, e []float64, tau []complex128) {
	w := make([]complex128, n)
	v := make([]complex128, n)
	for k := 0; k < n-1; k++ {
		m := n - k - 1 // length of the column below the diagonal
		// Gather x = A[k+1:, k].
		x := v[:m]
		for i := 0; i < m; i++ {
			x[i] = a[(k+1+i)*n+k]
		}
		beta, t := zlarfg(x)
		e[k] = beta
		tau[k] = t
		for i := 1; i < m; i++ {
			a[(k+1+i)*n+k] = x[i]
		}
		a[(k+1)*n+k] = complex(beta, 0)
		if t == 0 {
			continue
		}
		x[0] = 1
		// y = τ A₂₂ v, using the full trailing block (kept Hermitian).
		y := w[:m]
		for i := 0; i < m; i++ {
			row := a[(k+1+i)*n+k+1 : (k+1+i)*n+n]
			var s complex128
			for j, vj := range x {
				s += row[j] * vj
			}
			y[i] = t * s
		}
		// w = y − ½ τ (yᴴ v) v
		var yv complex128
		for i := range y {
			yv += cmplx.Conj(y[i]) * x[i]
		}
		alpha := -0.5 * t * yv
		for i := range y {
			y[i] += alpha * x[i]
		}
		// A₂₂ −= v wᴴ + w vᴴ on the full block.
		for i := 0; i < m; i++ {
			row := a[(k+1+i)*n+k+1 : (k+1+i)*n+n]
			vi, wi := x[i], y[i]
			for j := range row {
				row[j] -= vi*cmplx.Conj(y[j]) + wi*cmplx.Conj(x[j])
			}
		}
	}
	for i := 0; i < n; i++ {
		d[i] = real(a[i*n+i])
	}
}

// zlarfg generates an elementary reflector H = I − τ v vᴴ with v[0] = 1 such
// that Hᴴ x = β e₁ with β real; on return x[1:] holds v[1:]. It follows
// LAPACK's zlarfg without the rescaling loop for tiny β.
func zlarfg(x []complex128) (beta float64, tau complex128) {
	alpha := x[0]
	xnorm := 0.0
	scale, ssq := 0.0, 1.0
	for _, v := range x[1:] {
		for _, c := range [2]float64{real(v), imag(v)} {
			if c != 0 {
				ac := math.Abs(c)
				if scale < ac {
					ssq = 1 + ssq*(scale/ac)*(scale/ac)
					scale = ac
				} else {
					ssq += (ac / scale) * (ac / scale)
				}
			}
		}
	}
	xnorm = scale * math.Sqrt(ssq)
	ar, ai := real(alpha), imag(alpha)
	if xnorm == 0 && ai == 0 {
		return ar, 0
	}
	beta = -math.Copysign(math.Hypot(math.Hypot(ar, ai), xnorm), ar)
	tau = complex((beta-ar)/beta, -ai/beta)
	s := 1 / (alpha - complex(beta, 0))
	for i := 1; i < len(x); i++ {
		x[i] *= s
	}
	return beta, tau
}

// hermFormQ overwrites a with the unitary Q = H(0)···H(n−2) from hermTridiag
// and returns it (row-major n×n).
func hermFormQ(a []complex128, n int, tau []complex128) []complex128 {
	// Save the reflectors (column k below row k+1) before overwriting.
	vs := make([]complex128, 0, n*(n-1)/2)
	for k := 0; k < n-1; k++ {
		for i := k + 2; i < n; i++ {
			vs = append(vs, a[i*n+k])
		}
	}
	for i := range a {
		a[i] = 0
	}
	for i := 0; i < n; i++ {
		a[i*n+i] = 1
	}
	w := make([]complex128, n)
	v := make([]complex128, n)
	off := len(vs)
	for k := n - 2; k >= 0; k-- {
		m := n - k - 1
		off -= m - 1
		x := v[:m]
		x[0] = 1
		copy(x[1:], vs[off:off+m-1])
		t := tau[k]
		if t == 0 {
			continue
		}
		// Q₂₂ ← (I − τ v vᴴ) Q₂₂: w = Q₂₂ᴴ v (as a row vector vᴴ Q₂₂), then Q₂₂ −= τ v (vᴴ Q₂₂).
		ww := w[:m]
		for j := range ww {
			ww[j] = 0
		}
		for i := 0; i < m; i++ {
			row := a[(k+1+i)*n+k+1 : (k+1+i)*n+n]
			c := cmplx.Conj(x[i])
			for j, q := range row {
				ww[j] += c * q
			}
		}
		for i := 0; i < m; i++ {
			row := a[(k+1+i)*n+k+1 : (k+1+i)*n+n]
			c := t * x[i]
			for j := range row {
				row[j] -= c * ww[j]
			}
		}
	}
	return a
}
