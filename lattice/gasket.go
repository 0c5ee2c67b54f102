package lattice

// MaxGasketGeneration is the largest generation Gasket accepts
// ((3¹⁷+3)/2 ≈ 6.5·10⁷ sites); the memory estimate may refuse less.
const MaxGasketGeneration = 16

// Gasket returns the Sierpinski gasket graph of generation g: (3^(g+1)+3)/2
// sites and 3^(g+1) bonds (the edges of 3^g unit up-triangles), every site
// of degree 4 except the three corners (degree 2), which sit at (0, 0),
// (2^g, 0) and (2^(g−1), 2^(g−1)√3). Generation 0 is one triangle.
//
// Site order is recursive. Generation 0 is (0, 0), (1, 0), (1/2, √3/2).
// Generation g+1 is three copies of generation g (side s = 2^g): the
// bottom-left copy, in its own order; then the bottom-right copy shifted by
// (s, 0), in its own order without its left corner (shared with the first
// copy); then the top copy shifted by (s/2, s√3/2), in its own order without
// its two bottom corners (shared with the other copies). Bonds are the
// three copies' bonds, copy by copy, each in its own order. So site 0 is
// always the corner (0, 0), and generation g's sites and bonds are a prefix
// of generation g+1's. GasketCorners gives the indices of the three corners.
//
// Construction is in place and takes O(N) time and no memory beyond the
// graph itself. Parameters: "generation" g between 0 and
// MaxGasketGeneration.
func Gasket(g int) (*Graph, error) {
	if err := checkInt("generation", g, 0, MaxGasketGeneration); err != nil {
		return nil, err
	}
	n, m := gasketSize(g)
	if err := checkSize("generation", float64(n), float64(m), 2); err != nil {
		return nil, err
	}
	b := newBuilder(n, 2, m)
	b.bi, b.bj = b.bi[:m], b.bj[:m]
	pos := b.pos
	// Level 0; y is kept in units of √3/2 (integers, exact) until the end.
	copy(pos, []float64{0, 0, 1, 0, 0.5, 1})
	copy(b.bi, []int32{0, 0, 1})
	copy(b.bj, []int32{1, 2, 2})
	c := [3]int32{0, 1, 2}
	nk, mk := int32(3), 3
	for k := 0; k < g; k++ {
		s := float64(int(1) << k)
		mapB := func(i int32) int32 {
			if i == 0 {
				return c[1]
			}
			return nk + i - 1
		}
		cB2 := mapB(c[2])
		mapC := func(i int32) int32 {
			switch {
			case i == 0:
				return c[2]
			case i == c[1]:
				return cB2
			case i > c[1]:
				return 2*nk - 3 + i
			}
			return 2*nk - 2 + i
		}
		for i := int32(1); i < nk; i++ {
			x, y := pos[2*i], pos[2*i+1]
			j := mapB(i)
			pos[2*j], pos[2*j+1] = x+s, y
			if i != c[1] {
				j = mapC(i)
				pos[2*j], pos[2*j+1] = x+s/2, y+s
			}
		}
		for q := 0; q < mk; q++ {
			u, v := b.bi[q], b.bj[q]
			b.bi[mk+q], b.bj[mk+q] = mapB(u), mapB(v)
			b.bi[2*mk+q], b.bj[2*mk+q] = mapC(u), mapC(v)
		}
		c = [3]int32{0, mapB(c[1]), mapC(c[2])}
		nk, mk = 3*nk-3, 3*mk
	}
	for i := 1; i < len(pos); i += 2 {
		pos[i] *= sqrt3h
	}
	return b.graph(), nil
}

// GasketCorners returns the indices of the corners of Gasket(g) at (0, 0),
// (2^g, 0) and (2^(g−1), 2^(g−1)√3), in that order. It costs O(g).
func GasketCorners(g int) ([3]int, error) {
	if err := checkInt("generation", g, 0, MaxGasketGeneration); err != nil {
		return [3]int{}, err
	}
	c := [3]int{0, 1, 2}
	nk := 3
	for k := 0; k < g; k++ {
		// The recursion of Gasket, restricted to the corners: the new right
		// corner is the bottom-right copy's, the new top the top copy's.
		c1 := nk + c[1] - 1
		c2 := 2*nk - 2 + c[2]
		if c[2] > c[1] {
			c2--
		}
		c = [3]int{0, c1, c2}
		nk = 3*nk - 3
	}
	return c, nil
}

// gasketSize returns the sites (3^(g+1)+3)/2 and bonds 3^(g+1) of Gasket(g).
func gasketSize(g int) (n, m int) {
	m = 3
	for range g {
		m *= 3
	}
	return (m + 3) / 2, m
}
