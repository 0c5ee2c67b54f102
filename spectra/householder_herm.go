package spectra

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/dense"
)

// The complex Hermitian reduction works on split storage: ar and ai hold the
// real and imaginary parts of the n×n matrix, row-major. After the input is
// conjugated, row j from column j holds column j of A from the diagonal
// down, which is exactly LAPACK's column-major lower storage; the routines
// below follow zhetrd/zlatrd (lower) with "column j" read as row j.

// herTridiag reduces the Hermitian matrix in (ar, ai) (split, conjugated,
// see above) to a real symmetric tridiagonal T = Qᴴ A Q with diagonal d and
// off-diagonal e[:n−1]. Q = H(0)···H(n−2), H(i) = I − τ_i v_i v_iᴴ,
// v_i[i+1] = 1 and v_i[i+2:] in row i of (ar, ai) from column i+2,
// τ_i = taur[i] + i·taui[i].
//
// Each reflector is chosen as in LAPACK's zlarfg so that it maps its column
// onto a real multiple of e₁: the phases of the off-diagonal entries are
// absorbed into Q and T comes out real, so no 2n×2n real embedding (which
// would double every eigenvalue) is needed. Blocked as the real case
// (Dongarra, Sorensen & Hammarling, J. Comput. Appl. Math. 27, 215 (1989)):
// panels of symBlock reflectors with level-2 work against the not yet
// updated trailing matrix (parallel Hermitian products, dense.HemvSplit),
// then the rank-2·symBlock update A −= V Wᴴ + W Vᴴ as two real matrix
// products on the split parts.
func herTridiag(ar, ai []float64, n int, d, e, taur, taui []float64) {
	nb := symBlock
	wr := make([]float64, nb*n)
	wi := make([]float64, nb*n)
	sw := make([]float64, 16*n)
	buf := make([]float64, 16*nb*n)
	t := make([]float64, 4*nb)
	for k0 := 0; k0 < n; k0 += nb {
		kb := min(nb, n-k0)
		herPanel(ar, ai, n, k0, kb, e, taur, taui, wr, wi, sw, t)
		if k0+kb < n {
			k1 := k0 + kb
			m := n - k1
			q := 4 * kb * m
			x, xp, y1, y2 := buf[:q], buf[q:2*q], buf[2*q:3*q], buf[3*q:4*q]
			for p := 0; p < kb; p++ {
				vr := ar[(k0+p)*n+k1 : (k0+p)*n+n]
				vi := ai[(k0+p)*n+k1 : (k0+p)*n+n]
				ur := wr[p*n+k1 : p*n+n]
				ui := wi[p*n+k1 : p*n+n]
				row := func(s []float64, blk int) []float64 { return s[(blk*kb+p)*m : (blk*kb+p+1)*m] }
				// Real part: [Wr; Wi; Vr; Vi]ᵀ·[Vr; Vi; Wr; Wi].
				copy(row(x, 0), ur)
				copy(row(x, 1), ui)
				copy(row(x, 2), vr)
				copy(row(x, 3), vi)
				copy(row(y1, 0), vr)
				copy(row(y1, 1), vi)
				copy(row(y1, 2), ur)
				copy(row(y1, 3), ui)
				// Imaginary part: [Wr; −Wi; Vr; −Vi]ᵀ·[Vi; Vr; Wi; Wr].
				copy(row(xp, 0), ur)
				herNeg(row(xp, 1), ui)
				copy(row(xp, 2), vr)
				herNeg(row(xp, 3), vi)
				copy(row(y2, 0), vi)
				copy(row(y2, 1), vr)
				copy(row(y2, 2), ui)
				copy(row(y2, 3), ur)
			}
			const rb = 192
			for r0 := 0; r0 < m; r0 += rb {
				rows := min(rb, m-r0)
				off := (k1+r0)*n + k1 + r0
				dense.Gemm(true, false, rows, m-r0, 4*kb, -1, x[r0:], m, y1[r0:], m, 1, ar[off:], n)
				dense.Gemm(true, false, rows, m-r0, 4*kb, -1, xp[r0:], m, y2[r0:], m, 1, ai[off:], n)
			}
		}
		for i := k0; i < k0+kb && i < n-1; i++ {
			ar[i*n+i+1] = e[i]
			ai[i*n+i+1] = 0
		}
	}
	for i := 0; i < n; i++ {
		d[i] = ar[i*n+i]
	}
}

func herNeg(dst, src []float64) {
	for i, v := range src {
		dst[i] = -v
	}
}

// herPanel is the complex analogue of symPanel (LAPACK zlatrd, lower).
func herPanel(ar, ai []float64, n, k0, kb int, e, taur, taui, wr, wi, sw, t []float64) {
	t1r, t1i, t2r, t2i := t[:kb], t[kb:2*kb], t[2*kb:3*kb], t[3*kb:4*kb]
	for p := 0; p < kb; p++ {
		i := k0 + p
		rr := ar[i*n+i : i*n+n]
		ri := ai[i*n+i : i*n+n]
		// A(i:n, i) −= V(i:n, q)·conj(W(i, q)) + W(i:n, q)·conj(V(i, q)).
		for q := 0; q < p; q++ {
			vr := ar[(k0+q)*n+i : (k0+q)*n+n]
			vi := ai[(k0+q)*n+i : (k0+q)*n+n]
			ur := wr[q*n+i : q*n+n]
			ui := wi[q*n+i : q*n+n]
			cwr, cwi := ur[0], -ui[0]
			cvr, cvi := vr[0], -vi[0]
			for c := range rr {
				rr[c] -= vr[c]*cwr - vi[c]*cwi + ur[c]*cvr - ui[c]*cvi
				ri[c] -= vr[c]*cwi + vi[c]*cwr + ur[c]*cvi + ui[c]*cvr
			}
		}
		ri[0] = 0
		if i >= n-1 {
			continue
		}
		xr, xi := rr[1:], ri[1:]
		beta, tr, ti := zlarfgSplit(xr, xi)
		e[i] = beta
		taur[i], taui[i] = tr, ti
		xr[0], xi[0] = 1, 0
		yr := wr[p*n+i+1 : p*n+n]
		yi := wi[p*n+i+1 : p*n+n]
		if tr == 0 && ti == 0 {
			clear(yr)
			clear(yi)
			continue
		}
		dense.HemvSplit(n-i-1, ar[(i+1)*n+i+1:], ai[(i+1)*n+i+1:], n, xr, xi, yr, yi, sw)
		for q := 0; q < p; q++ {
			vr := ar[(k0+q)*n+i+1 : (k0+q)*n+n]
			vi := ai[(k0+q)*n+i+1 : (k0+q)*n+n]
			ur := wr[q*n+i+1 : q*n+n]
			ui := wi[q*n+i+1 : q*n+n]
			var a, b, c2, d2 float64
			for c := range xr {
				// conj(W_q)·v and conj(V_q)·v
				a += ur[c]*xr[c] + ui[c]*xi[c]
				b += ur[c]*xi[c] - ui[c]*xr[c]
				c2 += vr[c]*xr[c] + vi[c]*xi[c]
				d2 += vr[c]*xi[c] - vi[c]*xr[c]
			}
			t1r[q], t1i[q], t2r[q], t2i[q] = a, b, c2, d2
		}
		for q := 0; q < p; q++ {
			vr := ar[(k0+q)*n+i+1 : (k0+q)*n+n]
			vi := ai[(k0+q)*n+i+1 : (k0+q)*n+n]
			ur := wr[q*n+i+1 : q*n+n]
			ui := wi[q*n+i+1 : q*n+n]
			ar1, ai1, ar2, ai2 := t1r[q], t1i[q], t2r[q], t2i[q]
			for c := range yr {
				yr[c] -= vr[c]*ar1 - vi[c]*ai1 + ur[c]*ar2 - ui[c]*ai2
				yi[c] -= vr[c]*ai1 + vi[c]*ar1 + ur[c]*ai2 + ui[c]*ar2
			}
		}
		// y ← τ y; α = −½ τ (yᴴ v); y += α v.
		var sr, si float64
		for c := range yr {
			a, b := yr[c], yi[c]
			yr[c] = tr*a - ti*b
			yi[c] = tr*b + ti*a
			sr += yr[c]*xr[c] + yi[c]*xi[c]
			si += yr[c]*xi[c] - yi[c]*xr[c]
		}
		alr := -0.5 * (tr*sr - ti*si)
		ali := -0.5 * (tr*si + ti*sr)
		for c := range yr {
			yr[c] += alr*xr[c] - ali*xi[c]
			yi[c] += alr*xi[c] + ali*xr[c]
		}
	}
}

// zlarfgSplit generates H = I − τ v vᴴ, v[0] = 1, with Hᴴ x = β e₁ and β
// real, for x split into (xr, xi); x[1:] is overwritten with v[1:]. It
// follows LAPACK's zlarfg without the rescaling loop for tiny β.
func zlarfgSplit(xr, xi []float64) (beta, tr, ti float64) {
	scale, ssq := 0.0, 1.0
	acc := func(v float64) {
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
	for j := 1; j < len(xr); j++ {
		acc(xr[j])
		acc(xi[j])
	}
	xnorm := scale * math.Sqrt(ssq)
	alr, ali := xr[0], xi[0]
	if xnorm == 0 && ali == 0 {
		return alr, 0, 0
	}
	beta = -math.Copysign(math.Hypot(math.Hypot(alr, ali), xnorm), alr)
	tr, ti = (beta-alr)/beta, -ali/beta
	// s = 1/(α − β)
	dr, di := alr-beta, ali
	den := dr*dr + di*di
	sr, si := dr/den, -di/den
	for j := 1; j < len(xr); j++ {
		a, b := xr[j], xi[j]
		xr[j] = a*sr - b*si
		xi[j] = a*si + b*sr
	}
	return beta, tr, ti
}

// herApplyQ overwrites the n×nc complex matrix (xr, xi) (split, row-major,
// leading dimension nc) with Q·X for Q from herTridiag, applying applyBlock
// reflectors at a time in the compact WY form I − Y T Yᴴ (Schreiber & Van
// Loan, SIAM J. Sci. Stat. Comput. 10, 53 (1989); LAPACK zlarft/zlarfb),
// last block first, each complex product as real products of the parts.
func herApplyQ(ar, ai []float64, n int, taur, taui []float64, xr, xi []float64, nc int) {
	nb := applyBlock
	nref := n - 1
	if nref <= 0 {
		return
	}
	yr := make([]float64, nb*n)
	yi := make([]float64, nb*n)
	gr := make([]float64, nb*nb)
	gi := make([]float64, nb*nb)
	tmr := make([]float64, nb*nb)
	tmi := make([]float64, nb*nb)
	w1r := make([]float64, nb*nc)
	w1i := make([]float64, nb*nc)
	w2r := make([]float64, nb*nc)
	w2i := make([]float64, nb*nc)
	start := (nref - 1) / nb * nb
	for i0 := start; i0 >= 0; i0 -= nb {
		kb := min(nb, nref-i0)
		r0 := i0 + 1
		m := n - r0
		vr, vi := yr[:kb*m], yi[:kb*m]
		for p := 0; p < kb; p++ {
			pr, pi := vr[p*m:(p+1)*m], vi[p*m:(p+1)*m]
			clear(pr[:p+1])
			clear(pi[:p+1])
			pr[p] = 1
			copy(pr[p+1:], ar[(i0+p)*n+i0+p+2:(i0+p)*n+n])
			copy(pi[p+1:], ai[(i0+p)*n+i0+p+2:(i0+p)*n+n])
		}
		// G[r][q] = Σ_c conj(Y_r[c]) Y_q[c].
		dense.Gemm(false, true, kb, kb, m, 1, vr, m, vr, m, 0, gr, kb)
		dense.Gemm(false, true, kb, kb, m, 1, vi, m, vi, m, 1, gr, kb)
		dense.Gemm(false, true, kb, kb, m, 1, vr, m, vi, m, 0, gi, kb)
		dense.Gemm(false, true, kb, kb, m, -1, vi, m, vr, m, 1, gi, kb)
		clear(tmr[:kb*kb])
		clear(tmi[:kb*kb])
		for q := 0; q < kb; q++ {
			tr, ti := taur[i0+q], taui[i0+q]
			tmr[q*kb+q], tmi[q*kb+q] = tr, ti
			for r := 0; r < q; r++ {
				var sr, si float64
				for c := r; c < q; c++ {
					ar1, ai1 := tmr[r*kb+c], tmi[r*kb+c]
					br, bi := gr[c*kb+q], gi[c*kb+q]
					sr += ar1*br - ai1*bi
					si += ar1*bi + ai1*br
				}
				tmr[r*kb+q] = -(tr*sr - ti*si)
				tmi[r*kb+q] = -(tr*si + ti*sr)
			}
		}
		zr, zi := xr[r0*nc:], xi[r0*nc:]
		ar1, ai1 := w1r[:kb*nc], w1i[:kb*nc]
		br, bi := w2r[:kb*nc], w2i[:kb*nc]
		// W = Yᴴ X.
		dense.Gemm(false, false, kb, nc, m, 1, vr, m, zr, nc, 0, ar1, nc)
		dense.Gemm(false, false, kb, nc, m, 1, vi, m, zi, nc, 1, ar1, nc)
		dense.Gemm(false, false, kb, nc, m, 1, vr, m, zi, nc, 0, ai1, nc)
		dense.Gemm(false, false, kb, nc, m, -1, vi, m, zr, nc, 1, ai1, nc)
		// W2 = T W.
		dense.Gemm(false, false, kb, nc, kb, 1, tmr, kb, ar1, nc, 0, br, nc)
		dense.Gemm(false, false, kb, nc, kb, -1, tmi, kb, ai1, nc, 1, br, nc)
		dense.Gemm(false, false, kb, nc, kb, 1, tmr, kb, ai1, nc, 0, bi, nc)
		dense.Gemm(false, false, kb, nc, kb, 1, tmi, kb, ar1, nc, 1, bi, nc)
		// X −= Y W2.
		dense.Gemm(true, false, m, nc, kb, -1, vr, m, br, nc, 1, zr, nc)
		dense.Gemm(true, false, m, nc, kb, 1, vi, m, bi, nc, 1, zr, nc)
		dense.Gemm(true, false, m, nc, kb, -1, vr, m, bi, nc, 1, zi, nc)
		dense.Gemm(true, false, m, nc, kb, -1, vi, m, br, nc, 1, zi, nc)
	}
}
