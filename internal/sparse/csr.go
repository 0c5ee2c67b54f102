// Package sparse holds the compressed-sparse-row matrices and the product
// kernels that every propagator in ampwalk runs on. It is internal: the
// public packages keep their API while these loops get faster.
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
type CSR struct {
	N      int
	RowPtr []int32
	Col    []int32
	Val    []float64
	Unit   float64
	Imag   []float64
	Diag   []float64
}

// NNZ returns the number of stored off-diagonal entries.
func (m *CSR) NNZ() int { return int(m.RowPtr[m.N]) }

// IsReal reports whether every entry of m is real.
func (m *CSR) IsReal() bool { return m.Imag == nil }

// Len returns the dimension of m.
func (m *CSR) Len() int { return m.N }

// MulVec sets dst = m·x. dst and x must not overlap.
//
// Reference loop:
//
//	for i := range dst {
//		s := Diag[i]·x[i]
//		for k := RowPtr[i]; k < RowPtr[i+1]; k++ { s += A[k]·x[Col[k]] }
//		dst[i] = s
//	}
func (m *CSR) MulVec(dst, x []complex128) {
	if len(dst) != m.N || len(x) != m.N {
		panic("sparse: dimension mismatch")
	}
	m.MulVecRows(dst, x, 0, m.N)
}

// MulVecRows computes rows [lo, hi) of dst = m·x.
func (m *CSR) MulVecRows(dst, x []complex128, lo, hi int) {
	rp := m.RowPtr
	col := m.Col
	for i := lo; i < hi; i++ {
		var sr, si float64
		a, b := rp[i], rp[i+1]
		cs := col[a:b]
		switch {
		case m.Imag != nil:
			vr := m.valRow(a, b)
			vi := m.Imag[a:b]
			for k, j := range cs {
				xj := x[j]
				r, im := real(xj), imag(xj)
				sr += vr(k)*r - vi[k]*im
				si += vr(k)*im + vi[k]*r
			}
		case m.Val != nil:
			vs := m.Val[a:b]
			for k, j := range cs {
				xj := x[j]
				sr += vs[k] * real(xj)
				si += vs[k] * imag(xj)
			}
		default:
			for _, j := range cs {
				xj := x[j]
				sr += real(xj)
				si += imag(xj)
			}
			sr *= m.Unit
			si *= m.Unit
		}
		if m.Diag != nil {
			d := m.Diag[i]
			sr += d * real(x[i])
			si += d * imag(x[i])
		}
		dst[i] = complex(sr, si)
	}
}

func (m *CSR) valRow(a, b int32) func(k int) float64 {
	if m.Val == nil {
		u := m.Unit
		return func(int) float64 { return u }
	}
	v := m.Val[a:b]
	return func(k int) float64 { return v[k] }
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
		v := m.Unit
		if m.Val != nil {
			v = m.Val[k]
		}
		var im float64
		if m.Imag != nil {
			im = m.Imag[k]
		}
		z += complex(v, im)
	}
	return z
}
