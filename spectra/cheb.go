package spectra

import "github.com/ampwalk/ampwalk/internal/sparse"

// The Chebyshev steps of the kernel polynomial method. They read the CSR
// fields directly (real and complex paths) so that KPM on a real H runs on
// real vectors, at half the memory traffic of the complex product.

// chebStepReal sets dst = c·s·(H·cur − b·cur) − p·prev with (c, p) = (1, 0)
// for the first step and (2, 1) after, and returns ⟨cur|cur⟩ and
// ⟨dst|cur⟩. dst may alias prev, not cur. Reference loop:
//
//	for i := range dst {
//		dst[i] = c·s·((H·cur)[i] − b·cur[i]) − p·prev[i]
//	}
func chebStepReal(m *sparse.CSR, dst, cur, prev []float64, s, b float64, first bool) (cc, dc float64) {
	c, p := 2*s, 1.0
	if first {
		c, p = s, 0
	}
	rp, col := m.RowPtr, m.Col
	for i := 0; i < m.N; i++ {
		lo, hi := rp[i], rp[i+1]
		var h float64
		if m.Val == nil {
			for _, j := range col[lo:hi] {
				h += cur[j]
			}
			h *= m.Unit
		} else {
			vs := m.Val[lo:hi]
			for k, j := range col[lo:hi] {
				h += vs[k] * cur[j]
			}
		}
		x := cur[i]
		if m.Diag != nil {
			h += m.Diag[i] * x
		}
		var pv float64
		if p != 0 {
			pv = prev[i]
		}
		d := c*(h-b*x) - pv
		dst[i] = d
		cc += x * x
		dc += d * x
	}
	return cc, dc
}

// chebStepComplex is chebStepReal for a complex Hermitian H and complex
// vectors; it returns ⟨cur|cur⟩ and Re⟨dst|cur⟩ (for Hermitian H the moments
// of a vector with itself are real).
func chebStepComplex(m *sparse.CSR, dst, cur, prev []complex128, s, b float64, first bool) (cc, dc float64) {
	c, p := 2*s, 1.0
	if first {
		c, p = s, 0
	}
	rp, col := m.RowPtr, m.Col
	for i := 0; i < m.N; i++ {
		lo, hi := rp[i], rp[i+1]
		var hr, hi2 float64
		for k, j := range col[lo:hi] {
			e := m.Entry(int(lo) + k)
			v, w := real(e), imag(e)
			xr, xi := real(cur[j]), imag(cur[j])
			hr += v*xr - w*xi
			hi2 += v*xi + w*xr
		}
		x := cur[i]
		xr, xi := real(x), imag(x)
		if m.Diag != nil {
			hr += m.Diag[i] * xr
			hi2 += m.Diag[i] * xi
		}
		dr, di := c*(hr-b*xr), c*(hi2-b*xi)
		if p != 0 {
			dr -= real(prev[i])
			di -= imag(prev[i])
		}
		dst[i] = complex(dr, di)
		cc += xr*xr + xi*xi
		dc += dr*xr + di*xi
	}
	return cc, dc
}
