package dense

import (
	"runtime"
	"sync"
)

// Blocking of the packed product: micro-tiles of mr×nr (nr = panelWidth,
// 8 or 16), A blocks of mc×kc (kept in L2), B slabs of kc×n in strips of nr
// (one strip in L1).
const (
	mr    = 6
	maxNR = 16
	kc    = 256
	mc    = 120
)

// Gemm computes C = α·op(A)·op(B) + β·C for row-major matrices, with
// op(A) m×k and op(B) k×n; op(X) = Xᵀ when the corresponding flag is set.
// a has leading dimension lda, b ldb, c ldc. When β = 0, C is not read.
//
// The product is cache-blocked and packed (Goto & van de Geijn, ACM Trans.
// Math. Softw. 34, 12 (2008)) and split over up to GOMAXPROCS workers by
// fixed column (or row) ranges of C; the result is the same for every
// schedule. Cost 2mnk flops; it allocates only its packing buffers, which
// are pooled.
func Gemm(tA, tB bool, m, n, k int, alpha float64, a []float64, lda int, b []float64, ldb int, beta float64, c []float64, ldc int) {
	if m <= 0 || n <= 0 {
		return
	}
	if beta != 1 {
		for i := 0; i < m; i++ {
			row := c[i*ldc : i*ldc+n]
			if beta == 0 {
				clear(row)
			} else {
				for j := range row {
					row[j] *= beta
				}
			}
		}
	}
	if k <= 0 || alpha == 0 {
		return
	}
	nr := panelWidth
	w := runtime.GOMAXPROCS(0)
	if flops := 2 * float64(m) * float64(n) * float64(k); flops < 4e6 {
		w = 1
	}
	switch {
	case w > 1 && n >= m && n >= 2*nr*w:
		// Split the columns of C.
		per := (n/w + nr - 1) / nr * nr
		var wg sync.WaitGroup
		for j0 := 0; j0 < n; j0 += per {
			nw := min(per, n-j0)
			bj := b[j0:]
			if tB {
				bj = b[j0*ldb:]
			}
			wg.Go(func() { gemmSerial(tA, tB, m, nw, k, alpha, a, lda, bj, ldb, c[j0:], ldc) })
		}
		wg.Wait()
	case w > 1 && m >= 2*mr*w:
		per := (m/w + mr - 1) / mr * mr
		var wg sync.WaitGroup
		for i0 := 0; i0 < m; i0 += per {
			mw := min(per, m-i0)
			ai := a[i0:]
			if !tA {
				ai = a[i0*lda:]
			}
			wg.Go(func() { gemmSerial(tA, tB, mw, n, k, alpha, ai, lda, b, ldb, c[i0*ldc:], ldc) })
		}
		wg.Wait()
	default:
		gemmSerial(tA, tB, m, n, k, alpha, a, lda, b, ldb, c, ldc)
	}
}

var packPool = sync.Pool{New: func() any { s := make([]float64, 0); return &s }}

func getBuf(n int) *[]float64 {
	p := packPool.Get().(*[]float64)
	if cap(*p) < n {
		*p = make([]float64, n)
	}
	*p = (*p)[:n]
	return p
}

// gemmSerial is C += α·op(A)·op(B) on one goroutine.
func gemmSerial(tA, tB bool, m, n, k int, alpha float64, a []float64, lda int, b []float64, ldb int, c []float64, ldc int) {
	nr := panelWidth
	nStrips := (n + nr - 1) / nr
	kb0 := min(kc, k)
	bpp := getBuf(nStrips * nr * kb0)
	app := getBuf(((min(mc, m) + mr - 1) / mr) * mr * kb0)
	defer packPool.Put(bpp)
	defer packPool.Put(app)
	bp, ap := *bpp, *app
	var tmp [mr * maxNR]float64
	for pc := 0; pc < k; pc += kc {
		kb := min(kc, k-pc)
		packB(bp, nr, tB, b, ldb, pc, kb, n)
		for ic := 0; ic < m; ic += mc {
			mb := min(mc, m-ic)
			packA(ap, tA, a, lda, ic, pc, mb, kb, alpha)
			for s := 0; s < nStrips; s++ {
				j0 := s * nr
				nw := min(nr, n-j0)
				bs := bp[s*kb*nr : (s+1)*kb*nr]
				for t := 0; t*mr < mb; t++ {
					i0 := ic + t*mr
					mh := min(mr, mb-t*mr)
					as := ap[t*kb*mr : (t+1)*kb*mr]
					if mh == mr && nw == nr {
						kern6xN(nr, kb, as, bs, nr, c[i0*ldc+j0:], ldc)
						continue
					}
					clear(tmp[:])
					kern6xN(nr, kb, as, bs, nr, tmp[:], nr)
					for i := 0; i < mh; i++ {
						row := c[(i0+i)*ldc+j0 : (i0+i)*ldc+j0+nw]
						for j := range row {
							row[j] += tmp[i*nr+j]
						}
					}
				}
			}
		}
	}
}

// packB copies rows pc…pc+kb−1 of op(B) (k×n) into strips of nr columns:
// bp[s·kb·nr + p·nr + j] = op(B)[pc+p, s·nr+j], zero-padded.
func packB(bp []float64, nr int, tB bool, b []float64, ldb, pc, kb, n int) {
	for j0, s := 0, 0; j0 < n; j0, s = j0+nr, s+1 {
		nw := min(nr, n-j0)
		dst := bp[s*kb*nr : (s+1)*kb*nr]
		if !tB {
			for p := 0; p < kb; p++ {
				d := dst[p*nr : p*nr+nr]
				copy(d, b[(pc+p)*ldb+j0:(pc+p)*ldb+j0+nw])
				clear(d[nw:])
			}
			continue
		}
		if nw < nr {
			clear(dst)
		}
		for j := 0; j < nw; j++ {
			src := b[(j0+j)*ldb+pc : (j0+j)*ldb+pc+kb]
			for p, v := range src {
				dst[p*nr+j] = v
			}
		}
	}
}

// packA copies α·op(A)[ic:ic+mb, pc:pc+kb] into panels of mr rows:
// ap[t·kb·mr + p·mr + i] = α·op(A)[ic+t·mr+i, pc+p], zero-padded.
func packA(ap []float64, tA bool, a []float64, lda, ic, pc, mb, kb int, alpha float64) {
	for i0, t := 0, 0; i0 < mb; i0, t = i0+mr, t+1 {
		mh := min(mr, mb-i0)
		dst := ap[t*kb*mr : (t+1)*kb*mr]
		if mh < mr {
			clear(dst)
		}
		if !tA {
			for i := 0; i < mh; i++ {
				src := a[(ic+i0+i)*lda+pc : (ic+i0+i)*lda+pc+kb]
				for p, v := range src {
					dst[p*mr+i] = alpha * v
				}
			}
			continue
		}
		for p := 0; p < kb; p++ {
			src := a[(pc+p)*lda+ic+i0 : (pc+p)*lda+ic+i0+mh]
			d := dst[p*mr : p*mr+mh]
			for i, v := range src {
				d[i] = alpha * v
			}
		}
	}
}
