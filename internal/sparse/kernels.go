package sparse

// Kernels used by the propagators. Each is documented by its reference loop;
// the implementations fuse the product with the update over chunks of rows
// (the chunk of m·cur lives in a small stack buffer, so the vectors stream
// through memory once), allocate nothing and run over the row blocks of
// m.Workers workers. The Chebyshev expansion they serve is the one of
// Tal-Ezer & Kosloff, J. Chem. Phys. 81, 3967 (1984):
// exp(−iHt) ≈ Σ_k c_k T_k(H̃), H̃ = (H − shift)·scale.

// chunk is the number of rows whose product is buffered before the fused
// update: 256 complex values are 4 KiB, well inside L1.
const chunk = 256

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
	m.cheb(opNext, dst, cur, prev, acc, scale, shift, coef, false)
}

// ChebNextNorm is ChebNext returning Σ_i |dst[i]|², summed row by row within
// each block and block by block in order.
func (m *CSR) ChebNextNorm(dst, cur, prev, acc []complex128, scale, shift float64, coef complex128) float64 {
	return m.cheb(opNext, dst, cur, prev, acc, scale, shift, coef, true)
}

// ChebFirst is the first Chebyshev step, T₁ = H̃·T₀:
//
//	for i := range dst {
//		dst[i] = scale·((m·cur)[i] − shift·cur[i])
//		acc[i] += coef·dst[i]
//	}
//
// dst must not alias cur or acc.
func (m *CSR) ChebFirst(dst, cur, acc []complex128, scale, shift float64, coef complex128) {
	m.cheb(opFirst, dst, cur, nil, acc, scale, shift, coef, false)
}

// ChebFirstNorm is ChebFirst returning Σ_i |dst[i]|² (see ChebNextNorm).
func (m *CSR) ChebFirstNorm(dst, cur, acc []complex128, scale, shift float64, coef complex128) float64 {
	return m.cheb(opFirst, dst, cur, nil, acc, scale, shift, coef, true)
}

func (m *CSR) cheb(o op, dst, cur, prev, acc []complex128, scale, shift float64, coef complex128, norm bool) float64 {
	n := m.N
	if len(dst) != n || len(cur) != n || len(acc) != n || (o == opNext && len(prev) != n) {
		panic("sparse: dimension mismatch")
	}
	w := m.blockCount()
	if w == 1 {
		return m.chebRows(dst, cur, prev, acc, scale, shift, coef, norm, 0, n)
	}
	j := newJob(m, o, w)
	j.dst, j.cur, j.prev, j.acc = dst, cur, prev, acc
	j.scale, j.shift, j.coef, j.norm = scale, shift, coef, norm
	return j.run()
}

// chebRows runs ChebFirst (prev == nil) or ChebNext on rows [lo, hi) and
// returns Σ|dst[i]|² over them when norm is set.
func (m *CSR) chebRows(dst, cur, prev, acc []complex128, scale, shift float64, coef complex128, norm bool, lo, hi int) float64 {
	if m.grid != nil && m.Val == nil && m.Imag == nil {
		return m.gridCheb(dst, cur, prev, acc, scale, shift, coef, norm, lo, hi)
	}
	var buf [chunk]complex128
	cr, ci := real(coef), imag(coef)
	s := scale
	if prev != nil {
		s = 2 * scale
	}
	var sum float64
	for c := lo; c < hi; c += chunk {
		e := min(c+chunk, hi)
		y := buf[:e-c]
		m.mulRows(y, cur, c, e)
		cs := cur[c:e]
		ds := dst[c:e]
		as := acc[c:e]
		cs, ds, as = cs[:len(y)], ds[:len(y)], as[:len(y)]
		if prev == nil {
			for i, yi := range y {
				x := cs[i]
				vr := s * (real(yi) - shift*real(x))
				vi := s * (imag(yi) - shift*imag(x))
				ds[i] = complex(vr, vi)
				a := as[i]
				as[i] = complex(real(a)+(cr*vr-ci*vi), imag(a)+(cr*vi+ci*vr))
			}
		} else {
			ps := prev[c:e]
			ps = ps[:len(y)]
			for i, yi := range y {
				x := cs[i]
				p := ps[i]
				vr := s*(real(yi)-shift*real(x)) - real(p)
				vi := s*(imag(yi)-shift*imag(x)) - imag(p)
				ds[i] = complex(vr, vi)
				a := as[i]
				as[i] = complex(real(a)+(cr*vr-ci*vi), imag(a)+(cr*vi+ci*vr))
			}
		}
		if norm {
			sum += sumSq(ds)
		}
	}
	return sum
}

// SumSq returns Σ_i |x[i]|², summed row by row within each of m's row
// blocks and block by block in order, so it is reproducible for a given
// m.Workers. len(x) must be m.N.
func (m *CSR) SumSq(x []complex128) float64 {
	if len(x) != m.N {
		panic("sparse: dimension mismatch")
	}
	w := m.blockCount()
	if w == 1 {
		return sumSq(x)
	}
	j := newJob(m, opSumSq, w)
	j.cur = x
	return j.run()
}

// sumSq is for _, v := range x { s += real(v)² + imag(v)² }.
func sumSq(x []complex128) float64 {
	var s float64
	for _, v := range x {
		s += real(v)*real(v) + imag(v)*imag(v)
	}
	return s
}
