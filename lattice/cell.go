package lattice

// unitCell is a two-dimensional Bravais lattice with a basis.
type unitCell struct {
	a1, a2 [2]float64
	sites  [][2]float64 // basis positions relative to the cell origin
	bonds  []cellBond
}

// cellBond joins basis site s of cell (x, y) to basis site t of cell
// (x+dx, y+dy).
type cellBond struct{ s, t, dx, dy int }

// cellLattice builds w×h cells of u; site s of cell (x, y) has index
// len(u.sites)·(x + w·y) + s.
func cellLattice(w, h int, periodic bool, u unitCell) (*Graph, error) {
	if err := checkInt("width", w, 1, MaxSites); err != nil {
		return nil, err
	}
	if err := checkInt("height", h, 1, MaxSites); err != nil {
		return nil, err
	}
	nb := len(u.sites)
	cells := float64(w) * float64(h)
	if err := checkSites("width", cells*float64(nb)); err != nil {
		return nil, err
	}
	px, py := periodic && w >= 3, periodic && h >= 3
	// target returns the cell index reached from (x, y) by (dx, dy), or −1.
	target := func(x, y, dx, dy int) int {
		x, y = x+dx, y+dy
		if x < 0 || x >= w {
			if !px {
				return -1
			}
			x = (x + w) % w
		}
		if y < 0 || y >= h {
			if !py {
				return -1
			}
			y = (y + h) % h
		}
		return x + w*y
	}
	m := 0
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			for _, cb := range u.bonds {
				if target(x, y, cb.dx, cb.dy) >= 0 {
					m++
				}
			}
		}
	}
	if err := checkSize("width", cells*float64(nb), float64(m), 2); err != nil {
		return nil, err
	}
	b := newBuilder(w*h*nb, 2, m)
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			c := x + w*y
			rx := float64(x)*u.a1[0] + float64(y)*u.a2[0]
			ry := float64(x)*u.a1[1] + float64(y)*u.a2[1]
			for s, p := range u.sites {
				b.at(nb*c+s, rx+p[0], ry+p[1])
			}
			for _, cb := range u.bonds {
				if t := target(x, y, cb.dx, cb.dy); t >= 0 {
					b.bond(nb*c+cb.s, nb*t+cb.t)
				}
			}
		}
	}
	return b.graph(), nil
}
