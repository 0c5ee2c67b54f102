package lattice

// Honeycomb returns w×h unit cells of the honeycomb lattice with unit
// nearest-neighbour spacing: lattice vectors a₁ = (√3, 0) and
// a₂ = (√3/2, 3/2); cell (x, y) at R = x·a₁ + y·a₂ holds site A, index
// 2(x + w·y), at R and site B, index 2(x + w·y) + 1, at R + (√3/2, 1/2).
// Each B bonds to the A of its own cell, of cell (x+1, y) and of cell
// (x, y+1); bonds are listed cell by cell in index order, in that order.
// The patch is a parallelogram with zigzag and armchair-like edges. When
// periodic, a direction of at least 3 cells wraps (cell indices modulo w
// and h, positions unchanged); shorter ones stay open. Parameters: "width"
// w and "height" h, each at least 1.
func Honeycomb(w, h int, periodic bool) (*Graph, error) {
	return cellLattice(w, h, periodic, honeycombCell)
}

var honeycombCell = unitCell{
	a1:    [2]float64{2 * sqrt3h, 0},
	a2:    [2]float64{sqrt3h, 1.5},
	sites: [][2]float64{{0, 0}, {sqrt3h, 0.5}},
	bonds: []cellBond{{1, 0, 0, 0}, {1, 0, 1, 0}, {1, 0, 0, 1}},
}
