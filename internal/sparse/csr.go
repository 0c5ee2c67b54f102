package sparse

// CSR is a square sparse matrix in compressed-sparse-row form with a
// separate diagonal. Row i holds the off-diagonal entries
// Col[RowPtr[i]:RowPtr[i+1]] with values
//
//	Val[k] + i·Imag[k]   (Val == nil means every real part equals Unit;
//	                      Imag == nil means the matrix is real)
//
// and the diagonal entry Diag[i] (Diag == nil means a zero diagonal).
// Indices are int32, so a matrix holds at most 2³¹−1 stored entries.
//
// Workers bounds the goroutines a product uses: 0 means GOMAXPROCS, 1 means
// the calling goroutine only. Results are bit-for-bit reproducible for a
// given Workers (see the package documentation).
type CSR struct {
	N       int
	RowPtr  []int32
	Col     []int32
	Val     []float64
	Unit    float64
	Imag    []float64
	Diag    []float64
	Workers int

	grid *grid // set by DetectGrid: products skip RowPtr and Col
}

// NNZ returns the number of stored off-diagonal entries.
func (m *CSR) NNZ() int { return int(m.RowPtr[m.N]) }

// IsReal reports whether every entry of m is real.
func (m *CSR) IsReal() bool { return m.Imag == nil }

// Len returns the dimension of m.
func (m *CSR) Len() int { return m.N }

// Bytes returns the memory held by m's arrays in bytes.
func (m *CSR) Bytes() int64 {
	return 4*int64(len(m.RowPtr)+len(m.Col)) + 8*int64(len(m.Val)+len(m.Imag)+len(m.Diag))
}

// MulVec sets dst = m·x, in parallel over m's row blocks. dst and x must
// not overlap.
//
// Reference loop (the diagonal is added after the row sum; a pattern-only
// row sums x and multiplies by Unit once):
//
//	for i := range dst {
//		s := 0
//		for k := RowPtr[i]; k < RowPtr[i+1]; k++ { s += A[k]·x[Col[k]] }
//		dst[i] = s + Diag[i]·x[i]
//	}
func (m *CSR) MulVec(dst, x []complex128) {
	if len(dst) != m.N || len(x) != m.N {
		panic("sparse: dimension mismatch")
	}
	w := m.blockCount()
	if w == 1 {
		m.mulRows(dst, x, 0, m.N)
		return
	}
	j := newJob(m, opMul, w)
	j.dst, j.cur = dst, x
	j.run()
}

// MulVecRows computes rows [lo, hi) of dst = m·x on the calling goroutine,
// with the reference loop of MulVec.
func (m *CSR) MulVecRows(dst, x []complex128, lo, hi int) {
	m.mulRows(dst, x, lo, hi)
}

// At returns the entry (i, j) of m. It costs O(row length) and is meant for
// tests and small matrices.
func (m *CSR) At(i, j int) complex128 {
	var z complex128
	if i == j && m.Diag != nil {
		z += complex(m.Diag[i], 0)
	}
	for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
		if int(m.Col[k]) != j {
			continue
		}
		z += m.Entry(int(k))
	}
	return z
}

// Entry returns stored off-diagonal entry k (0 ≤ k < NNZ): Unit for
// pattern-only storage, otherwise Val[k], plus i·Imag[k] when the matrix is
// complex.
func (m *CSR) Entry(k int) complex128 {
	v := m.Unit
	if m.Val != nil {
		v = m.Val[k]
	}
	var im float64
	if m.Imag != nil {
		im = m.Imag[k]
	}
	return complex(v, im)
}
