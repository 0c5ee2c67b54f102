package sparse

// ChebSeriesMulti evaluates several truncated Chebyshev series of the same
// start vector in one recurrence, so that one sweep serves several reported
// times (see ChebNextMulti):
//
//	for q := range acc {
//		acc[q] = Σ_{k < len(coef[q])} coef[q][k] · T_k(H̃) psi,   H̃ = scale·(m − shift)
//	}
//
// T_k(H̃)psi comes from the three-term recurrence, one product per term up
// to the longest series; the series of acc[q] stops being updated after its
// own last coefficient. coef must be sorted by length, shortest first (the
// usual order of increasing times), each of length at least 1. work1 and
// work2 are two vectors of length m.N that are overwritten; psi is left
// unchanged and must not alias them or any acc[q]. It returns the number of
// products with m. It allocates the one small slice of active coefficients.
func (m *CSR) ChebSeriesMulti(acc [][]complex128, psi []complex128, coef [][]complex128, scale, shift float64, work1, work2 []complex128) int {
	n := m.N
	if len(acc) != len(coef) || len(psi) != n || len(work1) != n || len(work2) != n {
		panic("sparse: dimension mismatch")
	}
	K := 0
	for q, c := range coef {
		if len(c) < 1 || (q > 0 && len(c) < len(coef[q-1])) || len(acc[q]) != n {
			panic("sparse: ChebSeriesMulti needs non-empty series sorted by length")
		}
		K = len(c) - 1
	}
	if len(coef) == 0 {
		return 0
	}
	for q, a := range acc {
		c0 := coef[q][0]
		cr, ci := real(c0), imag(c0)
		for i, v := range psi {
			a[i] = complex(cr*real(v)-ci*imag(v), cr*imag(v)+ci*real(v))
		}
	}
	if K == 0 {
		return 0
	}
	ck := make([]complex128, len(coef))
	first := 0 // the active series are acc[first:]
	active := func(k int) ([][]complex128, []complex128) {
		for first < len(coef) && len(coef[first]) <= k {
			first++
		}
		c := ck[first:]
		for q := range c {
			c[q] = coef[first+q][k]
		}
		return acc[first:], c
	}
	a, c := active(1)
	m.ChebFirstMulti(work1, psi, a, scale, shift, c)
	if K == 1 {
		return 1
	}
	a, c = active(2)
	m.ChebNextMulti(work2, work1, psi, a, scale, shift, c)
	prev, cur := work1, work2
	for k := 3; k <= K; k++ {
		a, c = active(k)
		m.ChebNextMulti(prev, cur, prev, a, scale, shift, c)
		prev, cur = cur, prev
	}
	return K
}
