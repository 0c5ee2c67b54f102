package lattice

// Cubic returns the w×h×d simple cubic lattice: site x + w·(y + h·z) at
// (x, y, z). For each site in index order it lists the bonds to (x+1, y, z),
// (x, y+1, z) and (x, y, z+1) where they exist. When periodic, a direction
// of length at least 3 wraps (in the same per-site order); shorter ones stay
// open because wrapping them would double bonds. Parameters: "width" w,
// "height" h and "depth" d, each at least 1.
func Cubic(w, h, d int, periodic bool) (*Graph, error) {
	for _, p := range []struct {
		name string
		v    int
	}{{"width", w}, {"height", h}, {"depth", d}} {
		if err := checkInt(p.name, p.v, 1, MaxSites); err != nil {
			return nil, err
		}
	}
	n := float64(w) * float64(h) * float64(d)
	if err := checkSites("width", n); err != nil {
		return nil, err
	}
	px, py, pz := periodic && w >= 3, periodic && h >= 3, periodic && d >= 3
	lines := func(l int, p bool) int { // bonds along one line of length l
		if p {
			return l
		}
		return l - 1
	}
	m := lines(w, px)*h*d + w*lines(h, py)*d + w*h*lines(d, pz)
	if err := checkSize("width", n, float64(m), 3); err != nil {
		return nil, err
	}
	b := newBuilder(w*h*d, 3, m)
	for z := 0; z < d; z++ {
		for y := 0; y < h; y++ {
			for x := 0; x < w; x++ {
				i := x + w*(y+h*z)
				b.at(i, float64(x), float64(y), float64(z))
				if x+1 < w {
					b.bond(i, i+1)
				} else if px {
					b.bond(i, i-x)
				}
				if y+1 < h {
					b.bond(i, i+w)
				} else if py {
					b.bond(i, i-w*y)
				}
				if z+1 < d {
					b.bond(i, i+w*h)
				} else if pz {
					b.bond(i, i-w*h*z)
				}
			}
		}
	}
	return b.graph(), nil
}
