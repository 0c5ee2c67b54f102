package lattice

// Lieb returns w×h unit cells of the Lieb lattice (the line-centred square
// lattice) with unit nearest-neighbour spacing: cell (x, y) holds the
// corner site A, index 3(x + w·y), at (2x, 2y), and the edge sites B at
// (2x+1, 2y) and C at (2x, 2y+1), indices 3(x + w·y) + 1 and + 2. Bonds,
// cell by cell in index order: A–B, A–C, then B to the A of cell (x+1, y)
// and C to the A of cell (x, y+1). Periodic as for Honeycomb. Parameters:
// "width" w and "height" h, each at least 1.
func Lieb(w, h int, periodic bool) (*Graph, error) {
	return cellLattice(w, h, periodic, liebCell)
}

var liebCell = unitCell{
	a1:    [2]float64{2, 0},
	a2:    [2]float64{0, 2},
	sites: [][2]float64{{0, 0}, {1, 0}, {0, 1}},
	bonds: []cellBond{{0, 1, 0, 0}, {0, 2, 0, 0}, {1, 0, 1, 0}, {2, 0, 0, 1}},
}
