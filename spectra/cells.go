package spectra

import "math"

// Unit cells of common two-dimensional lattices with unit nearest-neighbour
// spacing and unit bonds. With H = +γA their spectra span (references.md,
// derived): square [−4, 4]; triangular [−3, 6]; honeycomb [−3, 3] with Dirac
// points at K; kagome [−2, 4] with a flat band at −2; Lieb [−2√2, 2√2] with
// a flat band at 0. Each carries its high-symmetry points in Points.

var sqrt3 = math.Sqrt(3)

// SquareCell is the square lattice: a_1 = (1, 0), a_2 = (0, 1).
func SquareCell() *UnitCell {
	return &UnitCell{Dim: 2,
		Vectors: []float64{1, 0, 0, 1},
		Basis:   []float64{0, 0},
		Hops:    []Hop{{0, 0, []int{1, 0}, 1}, {0, 0, []int{0, 1}, 1}},
		Points: map[string][]float64{
			"Γ": {0, 0}, "X": {math.Pi, 0}, "M": {math.Pi, math.Pi}},
	}
}

// TriangularCell is the triangular lattice: a_1 = (1, 0), a_2 = (½, √3/2).
func TriangularCell() *UnitCell {
	return &UnitCell{Dim: 2,
		Vectors: []float64{1, 0, 0.5, sqrt3 / 2},
		Basis:   []float64{0, 0},
		Hops:    []Hop{{0, 0, []int{1, 0}, 1}, {0, 0, []int{0, 1}, 1}, {0, 0, []int{1, -1}, 1}},
		Points: map[string][]float64{
			"Γ": {0, 0}, "K": {4 * math.Pi / 3, 0}, "M": {math.Pi, math.Pi / sqrt3}},
	}
}

// HoneycombCell is the honeycomb lattice: A at (0, 0), B at (1, 0),
// a_1 = (3/2, √3/2), a_2 = (3/2, −√3/2).
func HoneycombCell() *UnitCell {
	return &UnitCell{Dim: 2,
		Vectors: []float64{1.5, sqrt3 / 2, 1.5, -sqrt3 / 2},
		Basis:   []float64{0, 0, 1, 0},
		Hops:    []Hop{{0, 1, []int{0, 0}, 1}, {0, 1, []int{-1, 0}, 1}, {0, 1, []int{0, -1}, 1}},
		Points: map[string][]float64{
			"Γ": {0, 0}, "K": {2 * math.Pi / 3, 2 * math.Pi / (3 * sqrt3)}, "M": {2 * math.Pi / 3, 0}},
	}
}

// KagomeCell is the kagome lattice: A (0, 0), B (1, 0), C (½, √3/2),
// a_1 = (2, 0), a_2 = (1, √3).
func KagomeCell() *UnitCell {
	return &UnitCell{Dim: 2,
		Vectors: []float64{2, 0, 1, sqrt3},
		Basis:   []float64{0, 0, 1, 0, 0.5, sqrt3 / 2},
		Hops: []Hop{
			{0, 1, []int{0, 0}, 1}, {0, 2, []int{0, 0}, 1}, {1, 2, []int{0, 0}, 1},
			{1, 0, []int{1, 0}, 1}, {2, 0, []int{0, 1}, 1}, {2, 1, []int{-1, 1}, 1}},
		Points: map[string][]float64{
			"Γ": {0, 0}, "K": {2 * math.Pi / 3, 0}, "M": {math.Pi / 2, math.Pi / (2 * sqrt3)}},
	}
}

// LiebCell is the Lieb lattice: corner A (0, 0), edge sites B (1, 0) and
// C (0, 1), a_1 = (2, 0), a_2 = (0, 2).
func LiebCell() *UnitCell {
	return &UnitCell{Dim: 2,
		Vectors: []float64{2, 0, 0, 2},
		Basis:   []float64{0, 0, 1, 0, 0, 1},
		Hops: []Hop{
			{0, 1, []int{0, 0}, 1}, {0, 2, []int{0, 0}, 1},
			{1, 0, []int{1, 0}, 1}, {2, 0, []int{0, 1}, 1}},
		Points: map[string][]float64{
			"Γ": {0, 0}, "X": {math.Pi / 2, 0}, "M": {math.Pi / 2, math.Pi / 2}},
	}
}
