package spectra

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
)

// Small graph builders for the tests, independent of the lattice package's
// builders so that these tests check spectra alone.

func mustGraph(t testing.TB, n, dim int, pos []float64, bonds []lattice.Bond) *lattice.Graph {
	t.Helper()
	g, err := lattice.New(n, dim, pos, bonds, nil)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func pathGraph(t testing.TB, n int) *lattice.Graph {
	var b []lattice.Bond
	for i := 0; i+1 < n; i++ {
		b = append(b, lattice.Bond{I: i, J: i + 1, W: 1})
	}
	return mustGraph(t, n, 1, nil, b)
}

func cycleGraph(t testing.TB, n int) *lattice.Graph {
	var b []lattice.Bond
	for i := 0; i < n; i++ {
		b = append(b, lattice.Bond{I: i, J: (i + 1) % n, W: 1})
	}
	return mustGraph(t, n, 1, nil, b)
}

func hypercubeGraph(t testing.TB, d int) *lattice.Graph {
	n := 1 << d
	var b []lattice.Bond
	pos := make([]float64, n*d)
	for i := 0; i < n; i++ {
		for k := 0; k < d; k++ {
			pos[i*d+k] = float64(i >> k & 1)
			if j := i ^ 1<<k; j > i {
				b = append(b, lattice.Bond{I: i, J: j, W: 1})
			}
		}
	}
	return mustGraph(t, n, d, pos, b)
}

func completeGraph(t testing.TB, n int) *lattice.Graph {
	var b []lattice.Bond
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			b = append(b, lattice.Bond{I: i, J: j, W: 1})
		}
	}
	return mustGraph(t, n, 1, nil, b)
}

// torusGraph is the periodic L×L square lattice, site x + L·y at (x, y).
func torusGraph(t testing.TB, L int) *lattice.Graph {
	var b []lattice.Bond
	pos := make([]float64, 2*L*L)
	for y := 0; y < L; y++ {
		for x := 0; x < L; x++ {
			i := x + L*y
			pos[2*i], pos[2*i+1] = float64(x), float64(y)
			b = append(b, lattice.Bond{I: i, J: (x+1)%L + L*y, W: 1})
			b = append(b, lattice.Bond{I: i, J: x + L*((y+1)%L), W: 1})
		}
	}
	return mustGraph(t, L*L, 2, pos, b)
}

// gasketGraph is the Sierpinski gasket graph of generation g: the up
// triangles of the triangular lattice at lattice coordinates (i, j) with
// i AND j = 0, i + j < 2^g (Pascal's triangle mod 2), corners (i, j),
// (i+1, j), (i, j+1), site (i, j) at (i + j/2, j√3/2).
func gasketGraph(t testing.TB, g int) *lattice.Graph {
	side := 1 << g
	id := map[[2]int]int{}
	var pos []float64
	site := func(i, j int) int {
		k := [2]int{i, j}
		if v, ok := id[k]; ok {
			return v
		}
		id[k] = len(id)
		pos = append(pos, float64(i)+float64(j)/2, float64(j)*math.Sqrt(3)/2)
		return id[k]
	}
	var b []lattice.Bond
	for j := 0; j < side; j++ {
		for i := 0; i+j < side; i++ {
			if i&j != 0 {
				continue
			}
			p, q, r := site(i, j), site(i+1, j), site(i, j+1)
			b = append(b, lattice.Bond{I: p, J: q, W: 1}, lattice.Bond{I: q, J: r, W: 1}, lattice.Bond{I: r, J: p, W: 1})
		}
	}
	return mustGraph(t, len(id), 2, pos, b)
}

func TestGasketGraphCounts(t *testing.T) {
	for g := 0; g <= 5; g++ {
		gr := gasketGraph(t, g)
		p := int(math.Pow(3, float64(g+1)))
		// N = (3^{g+1}+3)/2 sites, 3^{g+1} bonds: references.md [derived].
		if gr.Len() != (p+3)/2 || gr.NumBonds() != p {
			t.Fatalf("g=%d: %d sites %d bonds, want %d, %d", g, gr.Len(), gr.NumBonds(), (p+3)/2, p)
		}
	}
}
