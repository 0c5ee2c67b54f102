package sparse

// Row-sum loops, one per storage kind. Each computes rows [lo, hi) of
// y = m·x into y[0 : hi−lo] (y is indexed from the block start, so the fused
// kernels can pass a small chunk buffer) and adds the diagonal last, in the
// order of MulVec's reference loop. Rows of degree 4 (the Sierpinski gasket,
// the square lattice) and 2 (chains, gasket corners) take unrolled paths
// that add in the same left-to-right order as the general loop.

// mulRows computes y[i−lo] = (m·x)[i] for i in [lo, hi).
func (m *CSR) mulRows(y, x []complex128, lo, hi int) {
	switch {
	case m.grid != nil && m.Val == nil && m.Imag == nil:
		m.gridRows(y, x, lo, hi)
	case m.Imag != nil:
		m.rowsComplex(y, x, lo, hi)
	case m.Val != nil:
		m.rowsWeighted(y, x, lo, hi)
	default:
		m.rowsPattern(y, x, lo, hi)
	}
	if m.Diag != nil {
		d := m.Diag[lo:hi]
		xs := x[lo:hi]
		y = y[:len(d)]
		for i, v := range d {
			xi := xs[i]
			yi := y[i]
			y[i] = complex(real(yi)+v*real(xi), imag(yi)+v*imag(xi))
		}
	}
}

func (m *CSR) rowsPattern(y, x []complex128, lo, hi int) {
	rp := m.RowPtr[lo : hi+1]
	col := m.Col
	u := m.Unit
	y = y[:hi-lo]
	k := rp[0] // carried from row to row: one row-start load per row
	for r := range y {
		e := rp[r+1]
		var sr, si float64
		switch e - k {
		case 4:
			c := col[k : k+4 : k+4]
			x0, x1, x2, x3 := x[c[0]], x[c[1]], x[c[2]], x[c[3]]
			sr = real(x0) + real(x1) + real(x2) + real(x3)
			si = imag(x0) + imag(x1) + imag(x2) + imag(x3)
		case 2:
			c := col[k : k+2 : k+2]
			x0, x1 := x[c[0]], x[c[1]]
			sr = real(x0) + real(x1)
			si = imag(x0) + imag(x1)
		default:
			for _, j := range col[k:e] {
				xj := x[j]
				sr += real(xj)
				si += imag(xj)
			}
		}
		k = e
		y[r] = complex(sr*u, si*u)
	}
}

func (m *CSR) rowsWeighted(y, x []complex128, lo, hi int) {
	rp := m.RowPtr[lo : hi+1]
	col := m.Col
	val := m.Val
	y = y[:hi-lo]
	for r := range y {
		a, b := rp[r], rp[r+1]
		cs := col[a:b]
		vs := val[a:b]
		vs = vs[:len(cs)]
		var sr, si float64
		if len(cs) == 4 {
			x0, x1, x2, x3 := x[cs[0]], x[cs[1]], x[cs[2]], x[cs[3]]
			sr = vs[0]*real(x0) + vs[1]*real(x1) + vs[2]*real(x2) + vs[3]*real(x3)
			si = vs[0]*imag(x0) + vs[1]*imag(x1) + vs[2]*imag(x2) + vs[3]*imag(x3)
		} else {
			for k, j := range cs {
				xj := x[j]
				v := vs[k]
				sr += v * real(xj)
				si += v * imag(xj)
			}
		}
		y[r] = complex(sr, si)
	}
}

func (m *CSR) rowsComplex(y, x []complex128, lo, hi int) {
	rp := m.RowPtr[lo : hi+1]
	col := m.Col
	im := m.Imag
	u := m.Unit
	val := m.Val
	y = y[:hi-lo]
	for r := range y {
		a, b := rp[r], rp[r+1]
		cs := col[a:b]
		vi := im[a:b]
		vi = vi[:len(cs)]
		var sr, si float64
		if val == nil {
			for k, j := range cs {
				xj := x[j]
				xr, xi := real(xj), imag(xj)
				sr += u*xr - vi[k]*xi
				si += u*xi + vi[k]*xr
			}
		} else {
			vr := val[a:b]
			vr = vr[:len(cs)]
			for k, j := range cs {
				xj := x[j]
				xr, xi := real(xj), imag(xj)
				sr += vr[k]*xr - vi[k]*xi
				si += vr[k]*xi + vi[k]*xr
			}
		}
		y[r] = complex(sr, si)
	}
}

// mulRowsReal computes y[i−lo] = (m·x)[i] for i in [lo, hi), m real.
func (m *CSR) mulRowsReal(y, x []float64, lo, hi int) {
	rp := m.RowPtr[lo : hi+1]
	col := m.Col
	y = y[:hi-lo]
	if m.grid != nil && m.Val == nil {
		m.gridRowsReal(y, x, lo, hi)
	} else if m.Val == nil {
		u := m.Unit
		for r := range y {
			cs := col[rp[r]:rp[r+1]]
			var s float64
			switch len(cs) {
			case 4:
				s = x[cs[0]] + x[cs[1]] + x[cs[2]] + x[cs[3]]
			case 2:
				s = x[cs[0]] + x[cs[1]]
			default:
				for _, j := range cs {
					s += x[j]
				}
			}
			y[r] = s * u
		}
	} else {
		val := m.Val
		for r := range y {
			a, b := rp[r], rp[r+1]
			cs := col[a:b]
			vs := val[a:b]
			vs = vs[:len(cs)]
			var s float64
			for k, j := range cs {
				s += vs[k] * x[j]
			}
			y[r] = s
		}
	}
	if m.Diag != nil {
		d := m.Diag[lo:hi]
		xs := x[lo:hi]
		y = y[:len(d)]
		for i, v := range d {
			y[i] += v * xs[i]
		}
	}
}
