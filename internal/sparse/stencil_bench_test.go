package sparse

import "testing"

// The matrix-free square-lattice loop against the CSR loop on the same
// 1000×1000 lattice, one worker and all workers.

func squareGrid(w int) *CSR {
	m := rectCSR(w, w)
	if !m.DetectGrid() {
		panic("sparse: rectCSR is not a grid")
	}
	return m
}

func BenchmarkChebNextSquareGrid1000(b *testing.B)       { benchChebNext(b, squareGrid(1000), 0) }
func BenchmarkChebNextSquareGridSerial1000(b *testing.B) { benchChebNext(b, squareGrid(1000), 1) }
func BenchmarkChebNextSquareSerial1000(b *testing.B)     { benchChebNext(b, rectCSR(1000, 1000), 1) }
