package spectra

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/dense"
)

// symBlock is the panel width of the blocked reductions. 16 measured
// faster than 32 and 64 at n = 3000 on the development machine (CPU time of
// the reduction 3.0–3.2 s against 3.1–3.5 s and 5.5 s): each panel column
// corrects against fewer earlier reflectors, and the rank-2·16 trailing
// update still runs at matrix-product speed.
const symBlock = 16

// applyBlock is the number of reflectors applied together in symApplyQ; a
// wider block makes the updates of z richer in arithmetic per byte moved.
const applyBlock = 128

// symTridiag reduces the real symmetric n×n matrix a (row-major; the upper
// triangle, j ≥ i, is referenced) to symmetric tridiagonal form
// T = Qᵀ A Q with diagonal d[:n] and off-diagonal e[:n−1].
// Q = H(0)·H(1)···H(n−2) with H(i) = I − τ_i v_i v_iᵀ, v_i[0…i] = 0,
// v_i[i+1] = 1 and v_i[i+2:] stored in row i of a from column i+2.
//
// Blocked Householder reduction (Dongarra, Sorensen & Hammarling, J. Comput.
// Appl. Math. 27, 215 (1989); the LAPACK dsytrd/dlatrd scheme): a panel of
// symBlock reflectors is formed with level-2 operations against the not yet
// updated trailing matrix plus corrections, then the trailing matrix gets the
// rank-2·symBlock update A −= V Wᵀ + W Vᵀ as matrix products. Row-major
// upper storage is column-major lower storage, so row i here is LAPACK's
// column i. Half of the 4n³/3 flops are in the symmetric matrix–vector
// products (memory bound, parallel); half in dense.Gemm.
func symTridiag(a []float64, n int, d, e, tau []float64) {
	nb := symBlock
	wt := make([]float64, nb*n)   // W transposed: row p is W(:, p), indexed by global column
	sw := make([]float64, 8*n)    // symv workspace
	xy := make([]float64, 4*nb*n) // [W; V] and [V; W] for the trailing update
	t1 := make([]float64, nb)     // small vectors of the panel corrections
	t2 := make([]float64, nb)
	for k0 := 0; k0 < n; k0 += nb {
		kb := min(nb, n-k0)
		last := k0+kb >= n
		symPanel(a, n, k0, kb, e, tau, wt, sw, t1, t2)
		if !last {
			// Trailing update of rows/columns r ≥ k1 (upper part):
			// A[r][c] −= Σ_p W_t[p][r]·V_t[p][c] + V_t[p][r]·W_t[p][c].
			k1 := k0 + kb
			m := n - k1
			x := xy[:2*kb*m]
			y := xy[2*kb*m : 4*kb*m]
			for p := 0; p < kb; p++ {
				copy(x[p*m:(p+1)*m], wt[p*n+k1:p*n+n])
				copy(x[(kb+p)*m:(kb+p+1)*m], a[(k0+p)*n+k1:(k0+p)*n+n])
				copy(y[p*m:(p+1)*m], a[(k0+p)*n+k1:(k0+p)*n+n])
				copy(y[(kb+p)*m:(kb+p+1)*m], wt[p*n+k1:p*n+n])
			}
			const rb = 192
			for r0 := 0; r0 < m; r0 += rb {
				rows := min(rb, m-r0)
				dense.Gemm(true, false, rows, m-r0, 2*kb, -1, x[r0:], m, y[r0:], m, 1, a[(k1+r0)*n+k1+r0:], n)
			}
		}
		// Restore the off-diagonal entries overwritten by the implicit ones.
		for i := k0; i < k0+kb && i < n-1; i++ {
			a[i*n+i+1] = e[i]
		}
	}
	for i := 0; i < n; i++ {
		d[i] = a[i*n+i]
	}
}

// symPanel reduces rows (LAPACK columns) k0…k0+kb−1, leaving the trailing
// matrix rows ≥ k0+kb not updated and W(:, p) in wt[p·n + c] (c > k0+p).
// The reflector rows keep their implicit 1 at column i+1 on return.
func symPanel(a []float64, n, k0, kb int, e, tau, wt, sw, t1, t2 []float64) {
	for p := 0; p < kb; p++ {
		i := k0 + p
		row := a[i*n : i*n+n]
		// Bring row i (from column i) up to date with the earlier panel reflectors:
		// A(i:n, i) −= V(i:n, 0:p)·W(i, 0:p)ᵀ + W(i:n, 0:p)·V(i, 0:p)ᵀ.
		for q := 0; q < p; q++ {
			vq := a[(k0+q)*n : (k0+q)*n+n]
			wq := wt[q*n : q*n+n]
			cw, cv := wq[i], vq[i]
			r, vv, ww := row[i:], vq[i:], wq[i:]
			for c := range r {
				r[c] -= vv[c]*cw + ww[c]*cv
			}
		}
		if i >= n-1 {
			continue
		}
		x := row[i+1:]
		beta, t := dlarfg(x)
		e[i] = beta
		tau[i] = t
		x[0] = 1
		w := wt[p*n : p*n+n]
		m := n - i - 1
		if t == 0 {
			clear(w[i+1:])
			continue
		}
		y := w[i+1:]
		// y = A22·v on the trailing matrix (rows/cols ≥ i+1), then corrections.
		dense.SymvUpper(m, a[(i+1)*n+i+1:], n, x, y, sw)
		for q := 0; q < p; q++ {
			vq := a[(k0+q)*n+i+1 : (k0+q)*n+n]
			wq := wt[q*n+i+1 : q*n+n]
			var s1, s2 float64
			for c, xc := range x {
				s1 += wq[c] * xc
				s2 += vq[c] * xc
			}
			t1[q], t2[q] = s1, s2
		}
		for q := 0; q < p; q++ {
			vq := a[(k0+q)*n+i+1 : (k0+q)*n+n]
			wq := wt[q*n+i+1 : q*n+n]
			c1, c2 := t1[q], t2[q]
			for c := range y {
				y[c] -= vq[c]*c1 + wq[c]*c2
			}
		}
		var yv float64
		for c := range y {
			y[c] *= t
			yv += y[c] * x[c]
		}
		alpha := -0.5 * t * yv
		for c := range y {
			y[c] += alpha * x[c]
		}
	}
}

// dlarfg generates a real elementary reflector H = I − τ v vᵀ, v[0] = 1,
// with H x = β e₁, overwriting x[1:] with v[1:] (LAPACK dlarfg without the
// rescaling loop for |β| below the safe minimum).
func dlarfg(x []float64) (beta, tau float64) {
	alpha := x[0]
	scale, ssq := 0.0, 1.0
	for _, v := range x[1:] {
		if v != 0 {
			av := math.Abs(v)
			if scale < av {
				ssq = 1 + ssq*(scale/av)*(scale/av)
				scale = av
			} else {
				ssq += (av / scale) * (av / scale)
			}
		}
	}
	xnorm := scale * math.Sqrt(ssq)
	if xnorm == 0 {
		return alpha, 0
	}
	beta = -math.Copysign(math.Hypot(alpha, xnorm), alpha)
	tau = (beta - alpha) / beta
	s := 1 / (alpha - beta)
	for i := 1; i < len(x); i++ {
		x[i] *= s
	}
	return beta, tau
}

// symApplyQ overwrites the n×nc row-major matrix z (leading dimension ldz)
// with Q·z, Q = H(0)···H(n−2) from symTridiag (reflectors in a, τ in tau).
//
// Blocked: symBlock reflectors at a time are combined into the compact WY
// form H(i0)···H(i1−1) = I − V T Vᵀ (Schreiber & Van Loan, SIAM J. Sci. Stat.
// Comput. 10, 53 (1989); LAPACK dlarft/dlarfb) and applied, last block
// first, with two matrix products: z −= V·(T·(Vᵀ z)). 2n²·nc flops.
func symApplyQ(a []float64, n int, tau []float64, z []float64, nc, ldz int) {
	nb := applyBlock
	nref := n - 1
	if nref <= 0 {
		return
	}
	vt := make([]float64, nb*n)
	g := make([]float64, nb*nb)
	tm := make([]float64, nb*nb)
	w := make([]float64, nb*nc)
	w2 := make([]float64, nb*nc)
	start := (nref - 1) / nb * nb
	for i0 := start; i0 >= 0; i0 -= nb {
		kb := min(nb, nref-i0)
		r0 := i0 + 1 // first row of z touched
		m := n - r0
		// Vᵀ: kb×m, row p is v_{i0+p} restricted to rows r0…n−1.
		v := vt[:kb*m]
		for p := 0; p < kb; p++ {
			vp := v[p*m : (p+1)*m]
			clear(vp[:p])
			vp[p] = 1
			copy(vp[p+1:], a[(i0+p)*n+i0+p+2:(i0+p)*n+n])
		}
		// T upper triangular: T[q][q] = τ_q, T[0:q, q] = −τ_q T[0:q,0:q] (Vᵀ v_q)[0:q].
		dense.Gemm(false, true, kb, kb, m, 1, v, m, v, m, 0, g, kb)
		clear(tm[:kb*kb])
		for q := 0; q < kb; q++ {
			tq := tau[i0+q]
			tm[q*kb+q] = tq
			for r := 0; r < q; r++ {
				s := 0.0
				for c := r; c < q; c++ {
					s += tm[r*kb+c] * g[c*kb+q]
				}
				tm[r*kb+q] = -tq * s
			}
		}
		// W = Vᵀ z (kb×nc); W2 = T W; z −= V W2.
		zz := z[r0*ldz:]
		dense.Gemm(false, false, kb, nc, m, 1, v, m, zz, ldz, 0, w[:kb*nc], nc)
		dense.Gemm(false, false, kb, nc, kb, 1, tm, kb, w, nc, 0, w2[:kb*nc], nc)
		dense.Gemm(true, false, m, nc, kb, -1, v, m, w2, nc, 1, zz, ldz)
	}
}
