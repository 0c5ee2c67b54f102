package dense

import (
	"math"
	"math/rand/v2"
	"testing"
)

func TestSymvRowMatchesGo(t *testing.T) {
	rnd := rand.New(rand.NewPCG(12, 1))
	for _, n := range []int{0, 1, 7, 8, 9, 64, 101} {
		row := make([]float64, n)
		xs := make([]float64, n)
		y1 := make([]float64, n)
		for i := range row {
			row[i], xs[i], y1[i] = rnd.Float64(), rnd.Float64(), rnd.Float64()
		}
		y2 := append([]float64(nil), y1...)
		var s1, s2 float64
		symvRow(row, xs, y1, 0.75, &s1)
		symvRowGo(row, xs, y2, 0.75, &s2)
		// Sums of ≤ 101 products in [0,1) in different orders (common practice).
		if math.Abs(s1-s2) > 1e-13 {
			t.Fatalf("n=%d: dot %g vs %g", n, s1, s2)
		}
		for i := range y1 {
			if math.Abs(y1[i]-y2[i]) > 1e-15 {
				t.Fatalf("n=%d: y[%d] %g vs %g", n, i, y1[i], y2[i])
			}
		}
	}
}
