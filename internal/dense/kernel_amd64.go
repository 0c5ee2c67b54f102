package dense

//go:noescape
func kern6x8avx(k int, a, b, c *float64, ldb, ldc int)

func cpuid(eaxArg, ecxArg uint32) (eax, ebx, ecx, edx uint32)
func xgetbv() (eax, edx uint32)

// hasAVX2FMA reports whether the CPU and the operating system support AVX2
// and FMA3 (CPUID leaf 1 ECX bits 12, 27, 28; XCR0 bits 1–2; leaf 7 EBX bit 5).
var hasAVX2FMA = func() bool {
	maxID, _, _, _ := cpuid(0, 0)
	if maxID < 7 {
		return false
	}
	_, _, c1, _ := cpuid(1, 0)
	const fma, osxsave, avx = 1 << 12, 1 << 27, 1 << 28
	if c1&fma == 0 || c1&osxsave == 0 || c1&avx == 0 {
		return false
	}
	if xa, _ := xgetbv(); xa&6 != 6 {
		return false
	}
	_, b7, _, _ := cpuid(7, 0)
	return b7&(1<<5) != 0
}()

//go:noescape
func kern6x16avx512(k int, a, b, c *float64, ldb, ldc int)

// hasAVX512 reports AVX-512F with OS support of the ZMM state (CPUID leaf 7
// EBX bit 16; XCR0 bits 5–7), on top of AVX2/FMA.
var hasAVX512 = func() bool {
	if !hasAVX2FMA {
		return false
	}
	if xa, _ := xgetbv(); xa&0xe6 != 0xe6 {
		return false
	}
	_, b7, _, _ := cpuid(7, 0)
	return b7&(1<<16) != 0
}()

// panelWidth is the number of columns of the micro-tile: 16 with AVX-512,
// otherwise 8.
var panelWidth = func() int {
	if hasAVX512 {
		return 16
	}
	return 8
}()

// kern6xN is C[0:6, 0:nr] += Σ_p a[6p:6p+6] ⊗ b[ldb·p:ldb·p+nr] for the
// micro-tile width nr = panelWidth (ldb = nr for a packed strip).
func kern6xN(nr, k int, a, b []float64, ldb int, c []float64, ldc int) {
	if nr == 16 {
		if k > 0 {
			_ = a[6*k-1]
			_ = b[(k-1)*ldb+15]
			_ = c[5*ldc+15]
			kern6x16avx512(k, &a[0], &b[0], &c[0], ldb, ldc)
		}
		return
	}
	kern6x8(k, a, b, ldb, c, ldc)
}

// kern6x8 is C[0:6, 0:8] += Σ_p a[6p:6p+6] ⊗ b[ldb·p:ldb·p+8] for C
// row-major with stride ldc; len(a) ≥ 6k, len(b) ≥ ldb·(k−1) + 8,
// len(c) ≥ 5·ldc + 8.
func kern6x8(k int, a, b []float64, ldb int, c []float64, ldc int) {
	if hasAVX2FMA && k > 0 {
		_ = a[6*k-1]
		_ = b[(k-1)*ldb+7]
		_ = c[5*ldc+7]
		kern6x8avx(k, &a[0], &b[0], &c[0], ldb, ldc)
		return
	}
	kern6x8go(k, a, b, ldb, c, ldc)
}

//go:noescape
func symvRowAVX(n int, row, xs, ys *float64, xi float64) (dot float64)

// symvRow is the fused kernel: s += Σ row[j]·xs[j]; ys[j] += row[j]·xi.
func symvRow(row, xs, ys []float64, xi float64, s *float64) {
	n := len(row)
	if !hasAVX2FMA || n < 8 {
		symvRowGo(row, xs, ys, xi, s)
		return
	}
	n8 := n &^ 7
	_ = xs[n-1]
	_ = ys[n-1]
	*s += symvRowAVX(n8, &row[0], &xs[0], &ys[0], xi)
	if n8 < n {
		symvRowGo(row[n8:], xs[n8:n], ys[n8:n], xi, s)
	}
}

//go:noescape
func hemvRowAVX(n int, rr, ri, xr, xi, yr, yi *float64, sr, si float64) (dr, di float64)

// hemvRow is the fused Hermitian kernel of hemvRows:
// (dr + i·di) += Σ conj(a_c)·x_c; y_c += a_c·(sr + i·si), a_c = rr[c] + i·ri[c].
func hemvRow(rr, ri, xr, xi, yr, yi []float64, sr, si float64) (dr, di float64) {
	n := len(rr)
	if !hasAVX2FMA || n < 4 {
		return hemvRowGo(rr, ri, xr, xi, yr, yi, sr, si)
	}
	n4 := n &^ 3
	_, _, _, _, _ = ri[n-1], xr[n-1], xi[n-1], yr[n-1], yi[n-1]
	dr, di = hemvRowAVX(n4, &rr[0], &ri[0], &xr[0], &xi[0], &yr[0], &yi[0], sr, si)
	if n4 < n {
		r, i := hemvRowGo(rr[n4:], ri[n4:n], xr[n4:n], xi[n4:n], yr[n4:n], yi[n4:n], sr, si)
		dr += r
		di += i
	}
	return dr, di
}
