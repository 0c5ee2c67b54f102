package lattice

// MaxTFractalGeneration is the largest generation TFractal accepts
// (3¹⁷ + 1 sites); the memory estimate may refuse less.
const MaxTFractalGeneration = 17

// TFractal returns the T-fractal (T-graph) of generation g: 3^g + 1 sites
// and 3^g bonds (a tree), fractal dimension ln3/ln2. Generation 0 is one
// bond from (0, 0) to (2^g, 0); each generation replaces every bond p–q by
// a T: a new site c at the midpoint of p and q, a new site w at c plus the
// half-bond q−p rotated by +90° or −90°, and the bonds p–c, c–q and c–w.
//
// The layout keeps unit bond lengths and distinct integer positions: the
// first bond's T points up (+90°); a bond p→q whose T points to side σ
// passes σ to p→c and −σ to c→q and c→w. Sites 0 and 1 are (0, 0) and
// (2^g, 0); the others follow depth first: replacing p→q appends c then
// w, then replaces p→c, c→q and c→w in that order, down to generation g,
// where each bond is listed as it is reached. Parameters: "generation" g
// between 0 and MaxTFractalGeneration.
func TFractal(g int) (*Graph, error) {
	if err := checkInt("generation", g, 0, MaxTFractalGeneration); err != nil {
		return nil, err
	}
	m := ipow(3, g)
	if err := checkSize("generation", float64(m+1), float64(m), 2); err != nil {
		return nil, err
	}
	b := newBuilder(m+1, 2, m)
	b.at(1, float64(ipow(2, g)), 0)
	next := 2
	var split func(p, q, px, py, qx, qy, side, level int)
	split = func(p, q, px, py, qx, qy, side, level int) {
		if level == 0 {
			b.bond(p, q)
			return
		}
		dx, dy := (qx-px)/2, (qy-py)/2
		cx, cy := px+dx, py+dy
		wx, wy := cx-side*dy, cy+side*dx
		c, w := next, next+1
		next += 2
		b.at(c, float64(cx), float64(cy))
		b.at(w, float64(wx), float64(wy))
		split(p, c, px, py, cx, cy, side, level-1)
		split(c, q, cx, cy, qx, qy, -side, level-1)
		split(c, w, cx, cy, wx, wy, -side, level-1)
	}
	split(0, 1, 0, 0, ipow(2, g), 0, 1, g)
	return b.graph(), nil
}

// ipow returns b^e for small non-negative e (no overflow check: callers
// bound e).
func ipow(b, e int) int {
	r := 1
	for range e {
		r *= b
	}
	return r
}
