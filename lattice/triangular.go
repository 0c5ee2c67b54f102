package lattice

import "math"

// sqrt3h is √3/2, the height of a unit equilateral triangle.
var sqrt3h = math.Sqrt(3) / 2

// Triangle returns the full triangular-lattice triangle with L bonds per side:
// (L+1)(L+2)/2 sites and 3L(L+1)/2 bonds, corners at (0, 0), (L, 0) and
// (L/2, L√3/2). Sites go row by row from the bottom: row r (0 ≤ r ≤ L)
// holds L+1−r sites, site a of row r at (a + r/2, r√3/2), and row r starts
// at index r(L+1) − r(r−1)/2. For each site in index order the bonds to its
// right neighbour, its upper-right neighbour and its upper-left neighbour
// (where they exist) are listed in that order; every site bonds to its (up
// to) six lattice neighbours. Parameters: "side" L ≥ 1.
func Triangle(side int) (*Graph, error) {
	if err := checkInt("side", side, 1, 1<<15); err != nil {
		return nil, err
	}
	L := side
	n := (L + 1) * (L + 2) / 2
	m := 3 * L * (L + 1) / 2
	if err := checkSize("side", float64(n), float64(m), 2); err != nil {
		return nil, err
	}
	b := newBuilder(n, 2, m)
	start := 0
	for r := 0; r <= L; r++ {
		row := L + 1 - r // sites in row r; row r+1 starts at start+row
		for a := 0; a < row; a++ {
			i := start + a
			b.at(i, float64(a)+0.5*float64(r), float64(r)*sqrt3h)
			if a+1 < row {
				b.bond(i, i+1)
				b.bond(i, start+row+a) // (a, r+1)
			}
			if a > 0 {
				b.bond(i, start+row+a-1) // (a−1, r+1)
			}
		}
		start += row
	}
	return b.graph(), nil
}

// TriangularPatch returns the w×h parallelogram patch of the triangular
// lattice: site x + w·y at (x + y/2, y√3/2) for 0 ≤ x < w, 0 ≤ y < h. For
// each site in index order it lists the bonds to (x+1, y), (x, y+1) and
// (x−1, y+1), where they exist. When periodic, a direction of length at
// least 3 wraps (indices taken modulo w and h, positions unchanged); a
// shorter one stays open because wrapping it would double bonds.
// Parameters: "width" w and "height" h, each at least 1.
func TriangularPatch(w, h int, periodic bool) (*Graph, error) {
	if err := checkInt("width", w, 1, MaxSites); err != nil {
		return nil, err
	}
	if err := checkInt("height", h, 1, MaxSites); err != nil {
		return nil, err
	}
	n := float64(w) * float64(h)
	if err := checkSites("width", n); err != nil {
		return nil, err
	}
	px, py := periodic && w >= 3, periodic && h >= 3
	cx, cy := w-1, h-1 // bonds per row in x, rows with an upper neighbour
	if px {
		cx = w
	}
	if py {
		cy = h
	}
	m := cx*h + w*cy + cx*cy
	if err := checkSize("width", n, float64(m), 2); err != nil {
		return nil, err
	}
	b := newBuilder(w*h, 2, m)
	for y := 0; y < h; y++ {
		up := y + 1
		if up == h && py {
			up = 0
		}
		for x := 0; x < w; x++ {
			i := x + w*y
			b.at(i, float64(x)+0.5*float64(y), float64(y)*sqrt3h)
			if x+1 < w {
				b.bond(i, i+1)
			} else if px {
				b.bond(i, w*y)
			}
			if up < h {
				b.bond(i, x+w*up)
				if x > 0 {
					b.bond(i, x-1+w*up)
				} else if px {
					b.bond(i, w-1+w*up)
				}
			}
		}
	}
	return b.graph(), nil
}
