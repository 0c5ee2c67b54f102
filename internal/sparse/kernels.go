package sparse

// Kernels used by the propagators. Each is documented by its reference loop;
// the implementations may be fused, unrolled and run over row blocks in
// parallel, but must give bit-identical results for a given worker count
// (each worker owns a fixed block of rows; reductions sum per-block partials
// in block order).

// ChebNext is one step of the Chebyshev three-term recurrence with the
// accumulation of the expansion fused in:
//
//	for i := range dst {
//		dst[i] = 2·scale·((m·cur)[i] − shift·cur[i]) − prev[i]
//		acc[i] += coef·dst[i]
//	}
//
// dst may alias prev (the usual in-place use) but not cur or acc.
func (m *CSR) ChebNext(dst, cur, prev, acc []complex128, scale, shift float64, coef complex128) {
	n := m.N
	tmp := make([]complex128, n)
	m.MulVecRows(tmp, cur, 0, n)
	s2 := 2 * scale
	for i := 0; i < n; i++ {
		v := complex(s2, 0)*(tmp[i]-complex(shift, 0)*cur[i]) - prev[i]
		dst[i] = v
		acc[i] += coef * v
	}
}

// ChebFirst is the first Chebyshev step, T₁ = H̃·T₀:
//
//	for i := range dst {
//		dst[i] = scale·((m·cur)[i] − shift·cur[i])
//		acc[i] += coef·dst[i]
//	}
func (m *CSR) ChebFirst(dst, cur, acc []complex128, scale, shift float64, coef complex128) {
	m.MulVecRows(dst, cur, 0, m.N)
	for i := range dst {
		v := complex(scale, 0) * (dst[i] - complex(shift, 0)*cur[i])
		dst[i] = v
		acc[i] += coef * v
	}
}
