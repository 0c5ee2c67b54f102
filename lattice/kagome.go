package lattice

// Kagome returns w×h unit cells of the kagome lattice with unit
// nearest-neighbour spacing: lattice vectors a₁ = (2, 0) and a₂ = (1, √3);
// cell (x, y) at R = x·a₁ + y·a₂ holds sites A, B, C, indices
// 3(x + w·y) + 0, 1, 2, at R, R + (1, 0) and R + (1/2, √3/2) (an up
// triangle). Bonds, cell by cell in index order: A–B, A–C, B–C (the up
// triangle), then B to the A of cell (x+1, y), C to the A of cell (x, y+1)
// and C to the B of cell (x−1, y+1) (the down triangles). Periodic as for
// Honeycomb. Parameters: "width" w and "height" h, each at least 1.
func Kagome(w, h int, periodic bool) (*Graph, error) {
	return cellLattice(w, h, periodic, kagomeCell)
}

var kagomeCell = unitCell{
	a1:    [2]float64{2, 0},
	a2:    [2]float64{1, 2 * sqrt3h},
	sites: [][2]float64{{0, 0}, {1, 0}, {0.5, sqrt3h}},
	bonds: []cellBond{{0, 1, 0, 0}, {0, 2, 0, 0}, {1, 2, 0, 0}, {1, 0, 1, 0}, {2, 0, 0, 1}, {2, 1, -1, 1}},
}
