package dense

import (
	"math"
	"runtime"
	"sync"
)

// HemvSplit sets y = H·x for the m×m Hermitian matrix H held in split real
// and imaginary parts (ar, ai), row-major with leading dimension lda, where
// row r from column r holds column r of H from the diagonal down:
// H[c][r] = ar[r·lda+c] + i·ai[r·lda+c] for c ≥ r (so H[r][c] is its
// conjugate); the diagonal's imaginary part is ignored. x and y are split
// the same way. Each stored element is read once; the rows are split into
// equal-work ranges, one per worker, with partial vectors in work (at least
// 2·(workers−1)·m elements, workers = min(GOMAXPROCS, 8)) added in worker order.
func HemvSplit(m int, ar, ai []float64, lda int, xr, xi, yr, yi, work []float64) {
	w := min(runtime.GOMAXPROCS(0), 8)
	if m < 192 {
		w = 1
	}
	if w == 1 {
		clear(yr[:m])
		clear(yi[:m])
		hemvRows(0, m, m, ar, ai, lda, xr, xi, yr, yi)
		return
	}
	var bounds [9]int // w ≤ 8: no allocation per call
	total := float64(m) * float64(m+1) / 2
	for p := 1; p < w; p++ {
		f := total * float64(p) / float64(w)
		r := float64(m) - math.Sqrt(float64(m)*float64(m)-2*f)
		bounds[p] = min(m, max(bounds[p-1], int(r)))
	}
	bounds[w] = m
	var wg sync.WaitGroup
	for p := 0; p < w; p++ {
		pr, pi := yr[:m], yi[:m]
		if p > 0 {
			pr = work[2*(p-1)*m : (2*p-1)*m]
			pi = work[(2*p-1)*m : 2*p*m]
		}
		wg.Go(func() {
			clear(pr)
			clear(pi)
			hemvRows(bounds[p], bounds[p+1], m, ar, ai, lda, xr, xi, pr, pi)
		})
	}
	wg.Wait()
	for p := 1; p < w; p++ {
		pr := work[2*(p-1)*m : (2*p-1)*m]
		pi := work[(2*p-1)*m : 2*p*m]
		for i := range pr {
			yr[i] += pr[i]
			yi[i] += pi[i]
		}
	}
}

// hemvRows accumulates rows r0…r1−1:
//
//	y[r] += H[r][r]·x[r] + Σ_{c>r} conj(a[r][c])·x[c];  y[c] += a[r][c]·x[r].
func hemvRows(r0, r1, m int, ar, ai []float64, lda int, xr, xi, yr, yi []float64) {
	for r := r0; r < r1; r++ {
		sr, si := xr[r], xi[r]
		dr, di := hemvRow(ar[r*lda+r+1:r*lda+m], ai[r*lda+r+1:r*lda+m], xr[r+1:m], xi[r+1:m], yr[r+1:m], yi[r+1:m], sr, si)
		d := ar[r*lda+r]
		yr[r] += d*sr + dr
		yi[r] += d*si + di
	}
}

// hemvRowGo is the portable kernel, the reference loop
//
//	for c, a := range rr { b := ri[c]
//		dr += a*xr[c] + b*xi[c]; di += a*xi[c] − b*xr[c]
//		yr[c] += a*sr − b*si;    yi[c] += a*si + b*sr }
func hemvRowGo(rr, ri, xr, xi, yr, yi []float64, sr, si float64) (dr, di float64) {
	n := len(rr)
	ri, xr, xi, yr, yi = ri[:n], xr[:n], xi[:n], yr[:n], yi[:n]
	for c, a := range rr {
		b := ri[c]
		u, v := xr[c], xi[c]
		dr += a*u + b*v
		di += a*v - b*u
		yr[c] += a*sr - b*si
		yi[c] += a*si + b*sr
	}
	return dr, di
}
