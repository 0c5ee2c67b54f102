package dense

import (
	"math"
	"runtime"
	"sync"
)

// SymvUpper sets y = A·x for the symmetric m×m matrix A whose upper triangle
// (j ≥ i) is stored row-major in a with leading dimension lda; the strict
// lower triangle is not referenced. Each stored element is read once and
// used twice (a dot product for row i and an update for column j), which
// halves the memory traffic of the product; the rows are split into
// ranges of equal work, one per worker, each with its own partial vector,
// and the partial vectors are added in worker order. work must hold at
// least (workers−1)·m elements, where workers = min(GOMAXPROCS, 8).
func SymvUpper(m int, a []float64, lda int, x, y, work []float64) {
	w := min(runtime.GOMAXPROCS(0), 8)
	if m < 256 {
		w = 1
	}
	if w == 1 {
		clear(y[:m])
		symvRows(0, m, m, a, lda, x, y)
		return
	}
	// Row r costs m−r; split the triangle into w parts of equal area.
	var bounds [9]int // w ≤ 8: no allocation per call
	total := float64(m) * float64(m+1) / 2
	for p := 1; p < w; p++ {
		// Rows [0, r) hold area m·r − r²/2 ≈ total·p/w.
		f := total * float64(p) / float64(w)
		r := float64(m) - math.Sqrt(float64(m)*float64(m)-2*f)
		bounds[p] = min(m, max(bounds[p-1], int(r)))
	}
	bounds[w] = m
	var wg sync.WaitGroup
	for p := 0; p < w; p++ {
		yp := y[:m]
		if p > 0 {
			yp = work[(p-1)*m : p*m]
		}
		wg.Go(func() {
			clear(yp)
			symvRows(bounds[p], bounds[p+1], m, a, lda, x, yp)
		})
	}
	wg.Wait()
	for p := 1; p < w; p++ {
		yp := work[(p-1)*m : p*m]
		for i, v := range yp {
			y[i] += v
		}
	}
}

// symvRows accumulates rows r0…r1−1 of the upper-stored product into y:
//
//	for i in [r0, r1): y[i] += a[i,i]x[i] + Σ_{j>i} a[i,j]x[j]; y[j] += a[i,j]x[i].
func symvRows(r0, r1, m int, a []float64, lda int, x, y []float64) {
	for i := r0; i < r1; i++ {
		row := a[i*lda+i+1 : i*lda+m]
		xs := x[i+1 : m]
		ys := y[i+1 : m]
		xi := x[i]
		s := a[i*lda+i] * xi
		symvRow(row, xs, ys, xi, &s)
		y[i] += s
	}
}

// symvRowGo is the portable fused kernel, the reference loop
//
//	for j, r := range row { *s += r*xs[j]; ys[j] += r*xi }
func symvRowGo(row, xs, ys []float64, xi float64, s *float64) {
	var s0, s1, s2, s3 float64
	n := len(row)
	xs = xs[:n]
	ys = ys[:n]
	j := 0
	for ; j+4 <= n; j += 4 {
		r := row[j : j+4 : j+4]
		xx := xs[j : j+4 : j+4]
		yy := ys[j : j+4 : j+4]
		s0 += r[0] * xx[0]
		s1 += r[1] * xx[1]
		s2 += r[2] * xx[2]
		s3 += r[3] * xx[3]
		yy[0] += r[0] * xi
		yy[1] += r[1] * xi
		yy[2] += r[2] * xi
		yy[3] += r[3] * xi
	}
	for ; j < n; j++ {
		s0 += row[j] * xs[j]
		ys[j] += row[j] * xi
	}
	*s += (s0 + s1) + (s2 + s3)
}
