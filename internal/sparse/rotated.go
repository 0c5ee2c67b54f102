package sparse

// The rotated Chebyshev recurrence. For S_k = (−i)^k T_k(H̃)ψ the
// three-term recurrence T_{k+1} = 2H̃T_k − T_{k−1} becomes
//
//	S_1 = −i·H̃·S_0,   S_{k+1} = S_{k−1} − 2i·H̃·S_k,
//
// and the series of exp(−iHt) = e^{−ibt}[J_0(at) + 2Σ_{k≥1}(−i)^k J_k(at)T_k(H̃)]
// has the real coefficients J_0, 2J_1, 2J_2, … on the S_k. Real
// coefficients let several series be summed as one real matrix product
// over a block of stored terms (the caller's business); these kernels only
// advance the recurrence, one fused pass per term.

// ChebFirstRot sets dst = −i·scale·(m·cur − shift·cur):
//
//	for i := range dst {
//		v := scale·((m·cur)[i] − shift·cur[i])
//		dst[i] = −i·v
//	}
//
// dst must not alias cur.
func (m *CSR) ChebFirstRot(dst, cur []complex128, scale, shift float64) {
	m.rot(opFirstRot, dst, cur, nil, scale, shift)
}

// ChebNextRot is one step of the rotated recurrence:
//
//	for i := range dst {
//		v := 2·scale·((m·cur)[i] − shift·cur[i])
//		dst[i] = prev[i] − i·v
//	}
//
// dst may alias prev (the usual in-place use) but not cur.
func (m *CSR) ChebNextRot(dst, cur, prev []complex128, scale, shift float64) {
	m.rot(opNextRot, dst, cur, prev, scale, shift)
}

func (m *CSR) rot(o op, dst, cur, prev []complex128, scale, shift float64) {
	n := m.N
	if len(dst) != n || len(cur) != n || (o == opNextRot && len(prev) != n) {
		panic("sparse: dimension mismatch")
	}
	w := m.blockCount()
	if w == 1 {
		m.rotRows(dst, cur, prev, scale, shift, 0, n)
		return
	}
	j := newJob(m, o, w)
	j.dst, j.cur, j.prev = dst, cur, prev
	j.scale, j.shift = scale, shift
	j.run()
}

// rotRows runs ChebFirstRot (prev == nil) or ChebNextRot on rows [lo, hi).
func (m *CSR) rotRows(dst, cur, prev []complex128, scale, shift float64, lo, hi int) {
	var buf [chunk]complex128
	s := scale
	if prev != nil {
		s = 2 * scale
	}
	for c := lo; c < hi; c += chunk {
		e := min(c+chunk, hi)
		y := buf[:e-c]
		m.mulRows(y, cur, c, e)
		cs := cur[c:e]
		ds := dst[c:e]
		cs, ds = cs[:len(y)], ds[:len(y)]
		if prev == nil {
			for i, yi := range y {
				x := cs[i]
				vr := s * (real(yi) - shift*real(x))
				vi := s * (imag(yi) - shift*imag(x))
				ds[i] = complex(vi, -vr)
			}
			continue
		}
		ps := prev[c:e]
		ps = ps[:len(y)]
		for i, yi := range y {
			x := cs[i]
			p := ps[i]
			vr := s * (real(yi) - shift*real(x))
			vi := s * (imag(yi) - shift*imag(x))
			ds[i] = complex(real(p)+vi, imag(p)-vr)
		}
	}
}
