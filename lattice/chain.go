package lattice

// Chain returns the path of n sites, site i at (i, 0), with bonds i–(i+1)
// in order of i. When periodic and n ≥ 3 the bond (n−1)–0 closes the ring
// last (for n < 3 it would double an existing bond, so the chain stays
// open). Parameters: "sites" n between 1 and MaxSites.
func Chain(n int, periodic bool) (*Graph, error) {
	if err := checkInt("sites", n, 1, MaxSites); err != nil {
		return nil, err
	}
	m := n - 1
	if periodic && n >= 3 {
		m = n
	}
	if err := checkSize("sites", float64(n), float64(m), 2); err != nil {
		return nil, err
	}
	b := newBuilder(n, 2, m)
	for i := 0; i < n; i++ {
		b.at(i, float64(i), 0)
		if i+1 < n {
			b.bond(i, i+1)
		}
	}
	if m == n {
		b.bond(n-1, 0)
	}
	return b.graph(), nil
}
