package lattice

// CarpetVariant selects how a Sierpinski carpet becomes a graph.
type CarpetVariant int

const (
	// CarpetCells puts a site at the centre of every kept cell and bonds
	// edge-sharing kept cells: 8^g sites, 8(8^g − 3^g)/5 bonds.
	CarpetCells CarpetVariant = iota
	// CarpetCorners puts a site at every corner of a kept cell and bonds
	// along kept cell edges, each edge once.
	CarpetCorners
)

// String returns "cells" or "corners", the job format's names.
func (v CarpetVariant) String() string {
	switch v {
	case CarpetCells:
		return "cells"
	case CarpetCorners:
		return "corners"
	}
	return "CarpetVariant(?)"
}

// MaxCarpetGeneration is the largest generation Carpet accepts
// (8⁹ ≈ 1.3·10⁸ cells); the memory estimate may refuse less.
const MaxCarpetGeneration = 9

// Carpet returns the Sierpinski carpet graph of generation g on the
// 3^g × 3^g square with its lower-left corner at (0, 0). The unit cell
// [x, x+1]×[y, y+1] (0 ≤ x, y < 3^g) is kept unless, for some k, the k-th
// base-3 digits of x and y are both 1; generation 0 is one cell.
//
// CarpetCells: a site at the centre (x+0.5, y+0.5) of every kept cell, 8^g
// sites in row-major order (y outer, x inner, both ascending), and a bond
// between kept cells sharing an edge: 8(8^g − 3^g)/5 bonds (the recursion
// B_g = 8B_{g−1} + 8·3^(g−1), eight touching pairs of sub-carpets each
// joined along a fully kept edge of 3^(g−1) cells).
//
// CarpetCorners: a site at every lattice point (x, y), 0 ≤ x, y ≤ 3^g, that
// is a corner of a kept cell, in row-major order, and a bond along every
// edge of a kept cell, each edge once. Counts: V_0 = 4, E_0 = 4,
// V_g = 8V_{g−1} − 8(3^(g−1)+1), E_g = 8E_{g−1} − 8·3^(g−1).
//
// In both variants bonds are listed site by site in index order, each site
// listing its bond to the site below it and then to the site left of it
// (where these exist), so every bond (i, j) has i < j.
// Parameters: "generation" g between 0 and MaxCarpetGeneration, "variant".
func Carpet(g int, v CarpetVariant) (*Graph, error) {
	if err := checkInt("generation", g, 0, MaxCarpetGeneration); err != nil {
		return nil, err
	}
	if v != CarpetCells && v != CarpetCorners {
		return nil, faultVariant(v)
	}
	n, m := carpetSize(g, v)
	if err := checkSize("generation", float64(n), float64(m), 2); err != nil {
		return nil, err
	}
	S := 1
	for range g {
		S *= 3
	}
	keep := func(x, y int) bool {
		if x < 0 || y < 0 || x >= S || y >= S {
			return false
		}
		for ; x > 0 && y > 0; x, y = x/3, y/3 {
			if x%3 == 1 && y%3 == 1 {
				return false
			}
		}
		return true
	}
	b := newBuilder(n, 2, m)
	next := 0
	if v == CarpetCells {
		prev, cur := make([]int32, S), make([]int32, S)
		for x := range prev {
			prev[x] = -1
		}
		for y := 0; y < S; y++ {
			for x := 0; x < S; x++ {
				cur[x] = -1
				if !keep(x, y) {
					continue
				}
				cur[x] = int32(next)
				b.at(next, float64(x)+0.5, float64(y)+0.5)
				if prev[x] >= 0 {
					b.bond(int(prev[x]), next)
				}
				if x > 0 && cur[x-1] >= 0 {
					b.bond(int(cur[x-1]), next)
				}
				next++
			}
			prev, cur = cur, prev
		}
		return b.graph(), nil
	}
	// Corners: lattice points (x, y), 0 ≤ x, y ≤ S. Cell (x, y) has corners
	// (x, y), (x+1, y), (x, y+1), (x+1, y+1).
	prev, cur := make([]int32, S+1), make([]int32, S+1)
	for x := range prev {
		prev[x] = -1
	}
	for y := 0; y <= S; y++ {
		for x := 0; x <= S; x++ {
			cur[x] = -1
			below := keep(x-1, y-1) || keep(x, y-1) // cells under the point
			above := keep(x-1, y) || keep(x, y)
			if !below && !above {
				continue
			}
			cur[x] = int32(next)
			b.at(next, float64(x), float64(y))
			if below { // the vertical edge to (x, y−1) borders a kept cell
				b.bond(int(prev[x]), next)
			}
			if keep(x-1, y-1) || keep(x-1, y) { // horizontal edge to (x−1, y)
				b.bond(int(cur[x-1]), next)
			}
			next++
		}
		prev, cur = cur, prev
	}
	return b.graph(), nil
}

// carpetSize returns the sites and bonds of Carpet(g, v) by the recursions
// documented on Carpet.
func carpetSize(g int, v CarpetVariant) (n, m int) {
	p3 := 1
	if v == CarpetCells {
		n = 1
		for range g {
			m = 8*m + 8*p3
			n *= 8
			p3 *= 3
		}
		return n, m
	}
	n, m = 4, 4
	for range g {
		n = 8*n - 8*(p3+1)
		m = 8*m - 8*p3
		p3 *= 3
	}
	return n, m
}
