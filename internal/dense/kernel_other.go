//go:build !amd64

package dense

func kern6x8(k int, a, b []float64, ldb int, c []float64, ldc int) {
	kern6x8go(k, a, b, ldb, c, ldc)
}

func symvRow(row, xs, ys []float64, xi float64, s *float64) { symvRowGo(row, xs, ys, xi, s) }

// panelWidth is the number of columns of the micro-tile.
var panelWidth = 8

func kern6xN(nr, k int, a, b []float64, ldb int, c []float64, ldc int) {
	kern6x8(k, a, b, ldb, c, ldc)
}

func hemvRow(rr, ri, xr, xi, yr, yi []float64, sr, si float64) (dr, di float64) {
	return hemvRowGo(rr, ri, xr, xi, yr, yi, sr, si)
}
