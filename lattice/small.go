package lattice

import "math"

// Complete returns the complete graph K_n: n sites, all n(n−1)/2 pairs
// bonded, listed as (i, j) for i < j in lexicographic order. Positions carry
// no geometry here: site i sits at (i, 0). Parameters: "sites" n ≥ 1.
func Complete(n int) (*Graph, error) {
	if err := checkInt("sites", n, 1, MaxSites); err != nil {
		return nil, err
	}
	m := float64(n) * float64(n-1) / 2
	if err := checkSize("sites", float64(n), m, 2); err != nil {
		return nil, err
	}
	b := newBuilder(n, 2, int(m))
	for i := 0; i < n; i++ {
		b.at(i, float64(i), 0)
		for j := i + 1; j < n; j++ {
			b.bond(i, j)
		}
	}
	return b.graph(), nil
}

// Star returns the star graph with the given number of leaves: leaves+1
// sites, the centre (site 0) at (0, 0) and leaf k (site k, 1 ≤ k ≤ leaves)
// at (cos θ, sin θ) with θ = 2π(k−1)/leaves, bonds 0–k in order of k.
// Parameters: "leaves" ≥ 1.
func Star(leaves int) (*Graph, error) {
	if err := checkInt("leaves", leaves, 1, MaxSites-1); err != nil {
		return nil, err
	}
	n := leaves + 1
	if err := checkSize("leaves", float64(n), float64(leaves), 2); err != nil {
		return nil, err
	}
	b := newBuilder(n, 2, leaves)
	for k := 1; k < n; k++ {
		s, c := math.Sincos(2 * math.Pi * float64(k-1) / float64(leaves))
		b.at(k, c, s)
		b.bond(0, k)
	}
	return b.graph(), nil
}

// CayleyTree returns the Cayley tree (Bethe lattice patch) of coordination
// z with the given number of shells around a centre: the centre (site 0)
// has z neighbours, every other site not in the last shell has z−1
// children. It has 1 + z((z−1)^shells − 1)/(z−2) sites for z > 2 and
// 1 + 2·shells for z = 2 (a chain), one bond fewer than sites.
//
// Sites are in breadth-first order: the centre, then shell 1, then shell 2
// …, the children of a site consecutive and in the order of their parents.
// Bond k joins site k+1 to its parent. Positions are a drawing, not unit
// spacings: a site of shell r sits at distance r from the centre, at the
// middle of an angular sector; the centre's sector is the full circle,
// split equally among its children, and every site's sector is split
// equally among its children. Parameters: "coordination" z between 2 and
// 10⁶, "shells" ≥ 0.
func CayleyTree(z, shells int) (*Graph, error) {
	if err := checkInt("coordination", z, 2, 1_000_000); err != nil {
		return nil, err
	}
	if err := checkInt("shells", shells, 0, MaxSites); err != nil {
		return nil, err
	}
	nf, shell := 1.0, float64(z)
	for r := 1; r <= shells && nf <= MaxSites; r++ {
		nf += shell
		shell *= float64(z - 1)
	}
	if err := checkSize("shells", nf, nf-1, 2); err != nil {
		return nil, err
	}
	n := int(nf)
	b := newBuilder(n, 2, n-1)
	// lo[i], width[i]: the angular sector of site i.
	lo, width := make([]float64, n), make([]float64, n)
	depth := make([]int32, n)
	width[0] = 2 * math.Pi
	next := 1
	for i := 0; next < n; i++ {
		kids := z - 1
		if i == 0 {
			kids = z
		}
		r := float64(depth[i] + 1)
		for c := 0; c < kids; c++ {
			lo[next] = lo[i] + width[i]*float64(c)/float64(kids)
			width[next] = width[i] / float64(kids)
			depth[next] = depth[i] + 1
			s, co := math.Sincos(lo[next] + width[next]/2)
			b.at(next, r*co, r*s)
			b.bond(i, next)
			next++
		}
	}
	return b.graph(), nil
}
