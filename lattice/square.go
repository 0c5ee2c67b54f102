package lattice

// Square returns the w×h square lattice: site x + w·y at (x, y) for
// 0 ≤ x < w, 0 ≤ y < h. For each site in index order it lists the bond to
// (x+1, y), then the bond to (x, y+1). When periodic, a direction of length
// at least 3 also wraps (x = w−1 to x = 0, y = h−1 to y = 0; these bonds come
// in the same per-site order); a direction of length 1 or 2 stays open
// because wrapping it would double a bond. Parameters: "width" w and
// "height" h, each at least 1.
func Square(w, h int, periodic bool) (*Graph, error) {
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
	m := squareBonds(w, h, px, py)
	if err := checkSize("width", n, float64(m), 2); err != nil {
		return nil, err
	}
	b := newBuilder(w*h, 2, m)
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			i := x + w*y
			b.at(i, float64(x), float64(y))
			if x+1 < w {
				b.bond(i, i+1)
			} else if px {
				b.bond(i, w*y)
			}
			if y+1 < h {
				b.bond(i, i+w)
			} else if py {
				b.bond(i, x)
			}
		}
	}
	return b.graph(), nil
}

// squareBonds counts the bonds of a w×h square lattice with the given wraps.
func squareBonds(w, h int, px, py bool) int {
	m := (w-1)*h + w*(h-1)
	if px {
		m += h
	}
	if py {
		m += w
	}
	return m
}
