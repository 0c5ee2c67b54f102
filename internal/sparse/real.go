package sparse

// Real-vector kernels for the classical walk, p(t) = exp(−γLt) p(0) on
// probability vectors: half the memory traffic of the complex kernels. They
// require a real matrix (Imag == nil) and panic otherwise.

// MulVecReal sets dst = m·x for a real m, with the reference loop of
// MulVec. dst and x must not overlap.
func (m *CSR) MulVecReal(dst, x []float64) {
	m.checkReal(len(dst), len(x))
	w := m.blockCount()
	if w == 1 {
		m.mulRowsReal(dst, x, 0, m.N)
		return
	}
	j := newJob(m, opMulReal, w)
	j.rdst, j.rcur = dst, x
	j.run()
}

// ChebFirstReal is ChebFirst on real vectors:
//
//	for i := range dst {
//		dst[i] = scale·((m·cur)[i] − shift·cur[i])
//		acc[i] += coef·dst[i]
//	}
//
// With acc == nil only the recurrence runs (coef is ignored).
func (m *CSR) ChebFirstReal(dst, cur, acc []float64, scale, shift, coef float64) {
	m.checkReal(len(dst), len(cur))
	m.checkAcc(acc)
	m.chebReal(opFirstReal, dst, cur, nil, acc, scale, shift, coef)
}

// ChebNextReal is ChebNext on real vectors:
//
//	for i := range dst {
//		dst[i] = 2·scale·((m·cur)[i] − shift·cur[i]) − prev[i]
//		acc[i] += coef·dst[i]
//	}
//
// dst may alias prev but not cur or acc. With acc == nil only the
// recurrence runs (coef is ignored).
func (m *CSR) ChebNextReal(dst, cur, prev, acc []float64, scale, shift, coef float64) {
	m.checkReal(len(dst), len(cur), len(prev))
	m.checkAcc(acc)
	m.chebReal(opNextReal, dst, cur, prev, acc, scale, shift, coef)
}

func (m *CSR) checkReal(lens ...int) {
	if m.Imag != nil {
		panic("sparse: real kernel on a complex matrix")
	}
	for _, l := range lens {
		if l != m.N {
			panic("sparse: dimension mismatch")
		}
	}
}

// checkAcc checks the length of an accumulator that may be nil.
func (m *CSR) checkAcc(acc []float64) {
	if acc != nil && len(acc) != m.N {
		panic("sparse: dimension mismatch")
	}
}

func (m *CSR) chebReal(o op, dst, cur, prev, acc []float64, scale, shift, coef float64) {
	w := m.blockCount()
	if w == 1 {
		m.chebRealRows(dst, cur, prev, acc, scale, shift, coef, 0, m.N)
		return
	}
	j := newJob(m, o, w)
	j.rdst, j.rcur, j.rprev, j.racc = dst, cur, prev, acc
	j.scale, j.shift, j.rcoef = scale, shift, coef
	j.run()
}

func (m *CSR) chebRealRows(dst, cur, prev, acc []float64, scale, shift, coef float64, lo, hi int) {
	var buf [2 * chunk]float64
	s := scale
	if prev != nil {
		s = 2 * scale
	}
	for c := lo; c < hi; c += len(buf) {
		e := min(c+len(buf), hi)
		y := buf[:e-c]
		m.mulRowsReal(y, cur, c, e)
		cs := cur[c:e]
		ds := dst[c:e]
		cs, ds = cs[:len(y)], ds[:len(y)]
		var ps []float64
		if prev != nil {
			ps = prev[c:e]
			ps = ps[:len(y)]
		}
		switch {
		case prev == nil && acc == nil:
			for i, yi := range y {
				ds[i] = s * (yi - shift*cs[i])
			}
		case prev == nil:
			as := acc[c:e]
			as = as[:len(y)]
			for i, yi := range y {
				v := s * (yi - shift*cs[i])
				ds[i] = v
				as[i] += coef * v
			}
		case acc == nil:
			for i, yi := range y {
				ds[i] = s*(yi-shift*cs[i]) - ps[i]
			}
		default:
			as := acc[c:e]
			as = as[:len(y)]
			for i, yi := range y {
				v := s*(yi-shift*cs[i]) - ps[i]
				ds[i] = v
				as[i] += coef * v
			}
		}
	}
}
