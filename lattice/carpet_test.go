package lattice

import (
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// bruteCarpet builds the carpet's cells and corners graphs the slow way:
// cells kept by recursive removal of the middle ninth (Sierpinski's
// construction), sites and bonds collected in maps. It returns sites and
// bonds of each variant.
func bruteCarpet(g int) (cellsN, cellsM, cornN, cornM int) {
	S := ipow(3, g)
	kept := make([][]bool, S)
	for x := range kept {
		kept[x] = make([]bool, S)
		for y := range kept[x] {
			kept[x][y] = true
		}
	}
	var carve func(x0, y0, s int)
	carve = func(x0, y0, s int) {
		if s == 1 {
			return
		}
		t := s / 3
		for i := 0; i < 3; i++ {
			for j := 0; j < 3; j++ {
				if i == 1 && j == 1 {
					for x := x0 + t; x < x0+2*t; x++ {
						for y := y0 + t; y < y0+2*t; y++ {
							kept[x][y] = false
						}
					}
					continue
				}
				carve(x0+i*t, y0+j*t, t)
			}
		}
	}
	carve(0, 0, S)
	pts := map[[2]int]bool{}
	edges := map[[4]int]bool{}
	for x := 0; x < S; x++ {
		for y := 0; y < S; y++ {
			if !kept[x][y] {
				continue
			}
			cellsN++
			if x+1 < S && kept[x+1][y] {
				cellsM++
			}
			if y+1 < S && kept[x][y+1] {
				cellsM++
			}
			for _, c := range [][2]int{{x, y}, {x + 1, y}, {x, y + 1}, {x + 1, y + 1}} {
				pts[c] = true
			}
			for _, e := range [][4]int{{x, y, x + 1, y}, {x, y, x, y + 1}, {x + 1, y, x + 1, y + 1}, {x, y + 1, x + 1, y + 1}} {
				edges[e] = true
			}
		}
	}
	return cellsN, cellsM, len(pts), len(edges)
}

func TestCarpetCounts(t *testing.T) {
	for g := 0; g <= 4; g++ {
		cn, cm, pn, pm := bruteCarpet(g)
		cells, err := Carpet(g, CarpetCells)
		require.NoError(t, err)
		// 8^g sites (job-format contract); bonds 8(8^g − 3^g)/5 (derived on
		// Carpet) and by brute force.
		assert.Equal(t, ipow(8, g), cells.Len())
		assert.Equal(t, cn, cells.Len())
		assert.Equal(t, 8*(ipow(8, g)-ipow(3, g))/5, cells.NumBonds())
		assert.Equal(t, cm, cells.NumBonds())
		requireValid(t, cells)
		lo, hi := bondLengths(cells)
		if g > 0 {
			assert.Equal(t, 1.0, lo)
			assert.Equal(t, 1.0, hi)
		}

		corners, err := Carpet(g, CarpetCorners)
		require.NoError(t, err)
		assert.Equal(t, pn, corners.Len(), "g=%d", g) // brute force
		assert.Equal(t, pm, corners.NumBonds(), "g=%d", g)
		requireValid(t, corners)
		lo, hi = bondLengths(corners)
		assert.Equal(t, 1.0, lo)
		assert.Equal(t, 1.0, hi)
		// Lower-left corner at (0,0), upper-right at (3^g, 3^g): contract.
		S := float64(ipow(3, g))
		assert.Equal(t, []float64{0, 0}, corners.Pos(nil, 0))
		assert.Equal(t, []float64{S, S}, corners.Pos(nil, corners.Len()-1))
		assert.Equal(t, []float64{0.5, 0.5}, cells.Pos(nil, 0))
		assert.Equal(t, []float64{S - 0.5, S - 0.5}, cells.Pos(nil, cells.Len()-1))
	}
	// Hand counts: generation 1 corners is the full 4×4 grid (16 sites, 24
	// bonds); cells is the ring of 8 cells (8 bonds).
	g1, err := Carpet(1, CarpetCorners)
	require.NoError(t, err)
	assert.Equal(t, 16, g1.Len())
	assert.Equal(t, 24, g1.NumBonds())
	c1, err := Carpet(1, CarpetCells)
	require.NoError(t, err)
	assert.Equal(t, 8, c1.NumBonds())
	for _, d := range degrees(c1) {
		assert.Equal(t, 2, d)
	}
}

func TestCarpetOrderRowMajor(t *testing.T) {
	for _, v := range []CarpetVariant{CarpetCells, CarpetCorners} {
		g, err := Carpet(3, v)
		require.NoError(t, err)
		var p, q []float64
		for i := 1; i < g.Len(); i++ {
			p, q = g.Pos(p, i-1), g.Pos(q, i)
			// Row-major: y ascending, then x ascending (documented on Carpet).
			assert.True(t, p[1] < q[1] || (p[1] == q[1] && p[0] < q[0]), "%v: sites %d, %d", v, i-1, i)
		}
		for k := 0; k < g.NumBonds(); k++ {
			b := g.Bond(k)
			assert.Less(t, b.I, b.J)
		}
	}
}

func TestCarpetErrors(t *testing.T) {
	for _, g := range []int{-1, MaxCarpetGeneration + 1} {
		_, err := Carpet(g, CarpetCells)
		requireInputError(t, err, fault.Invalid, "generation")
	}
	_, err := Carpet(1, CarpetVariant(7))
	requireInputError(t, err, fault.Invalid, "variant")
	assert.Equal(t, "cells", CarpetCells.String())
	assert.Equal(t, "corners", CarpetCorners.String())
}
