package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestGasketCounts(t *testing.T) {
	top := 9
	if testing.Short() {
		top = 6
	}
	for g := 0; g <= top; g++ {
		gr, err := Gasket(g)
		require.NoError(t, err)
		// (3^(g+1)+3)/2 sites, 3^(g+1) bonds, degree 4 except three corners of
		// degree 2 (job-format contract; references.md [derived]).
		p := ipow(3, g+1)
		require.Equal(t, (p+3)/2, gr.Len())
		require.Equal(t, p, gr.NumBonds())
		c, err := GasketCorners(g)
		require.NoError(t, err)
		deg := degrees(gr)
		for i, d := range deg {
			if i == c[0] || i == c[1] || i == c[2] {
				require.Equal(t, 2, d, "corner %d", i)
			} else {
				require.Equal(t, 4, d, "site %d", i)
			}
		}
		// Corners at (0,0), (2^g,0), (2^(g−1), 2^(g−1)√3): job-format contract.
		s := float64(ipow(2, g))
		assert.InDeltaSlice(t, []float64{0, 0}, gr.Pos(nil, c[0]), 1e-9)
		assert.InDeltaSlice(t, []float64{s, 0}, gr.Pos(nil, c[1]), 1e-9)
		assert.InDeltaSlice(t, []float64{s / 2, s / 2 * math.Sqrt(3)}, gr.Pos(nil, c[2]), 1e-9)
		lo, hi := bondLengths(gr)
		assert.InDelta(t, 1, lo, 1e-9)
		assert.InDelta(t, 1, hi, 1e-9)
		if g <= 6 {
			requireValid(t, gr)
			requireDistinctPositions(t, gr)
		}
	}
}

// requireDistinctPositions checks that no two sites share a position.
func requireDistinctPositions(t *testing.T, g *Graph) {
	t.Helper()
	seen := make(map[[2]int64]int, g.Len())
	var p []float64
	for i := 0; i < g.Len(); i++ {
		p = g.Pos(p, i)
		k := [2]int64{int64(math.Round(p[0] * 1e6)), int64(math.Round(p[1] * 1e6))}
		j, dup := seen[k]
		require.False(t, dup, "sites %d and %d both at %v", j, i, p)
		seen[k] = i
	}
}

func TestGasketOrder(t *testing.T) {
	// The recursive order documented on Gasket: generation 1 by hand.
	g, err := Gasket(1)
	require.NoError(t, err)
	h := math.Sqrt(3) / 2
	want := []float64{0, 0, 1, 0, 0.5, h, 2, 0, 1.5, h, 1, 2 * h}
	assert.InDeltaSlice(t, want, g.Coords(), 1e-12)
	c, err := GasketCorners(1)
	require.NoError(t, err)
	assert.Equal(t, [3]int{0, 3, 5}, c)
	// Generation g is a prefix of generation g+1 (sites and bonds).
	small, err := Gasket(3)
	require.NoError(t, err)
	big, err := Gasket(4)
	require.NoError(t, err)
	assert.Equal(t, small.Coords(), big.Coords()[:len(small.Coords())])
	for k := 0; k < small.NumBonds(); k++ {
		assert.Equal(t, small.Bond(k), big.Bond(k))
	}
}

func TestGasketSpectrum(t *testing.T) {
	// Spectral decimation, normalised Laplacian 4(I − D⁻¹A) (references.md;
	// Fukushima & Shima, Potential Anal. 1, 1 (1992), from memory; [derived]):
	// g=1 {0:1, 3:2, 6:3}; g=2 {0:1, (5−√13)/2:2, 3:3, (5+√13)/2:2, 5:1, 6:6}.
	// D⁻¹A is similar to the symmetric D^(−1/2) A D^(−1/2), whose
	// eigenvalues are 1 − μ/4.
	r13 := math.Sqrt(13)
	for g, want := range map[int][]float64{
		1: {0, 3, 3, 6, 6, 6},
		2: {0, (5 - r13) / 2, (5 - r13) / 2, 3, 3, 3, (5 + r13) / 2, (5 + r13) / 2, 5, 6, 6, 6, 6, 6, 6},
	} {
		gr, err := Gasket(g)
		require.NoError(t, err)
		deg := degrees(gr)
		bonds := make([]Bond, gr.NumBonds())
		for k := range bonds {
			b := gr.Bond(k)
			b.W = 1 / math.Sqrt(float64(deg[b.I]*deg[b.J]))
			bonds[k] = b
		}
		sym, err := New(gr.Len(), 2, gr.Coords(), bonds, nil)
		require.NoError(t, err)
		v := eigenvalues(t, sym)
		for i := range v {
			v[i] = 4 * (1 - v[i])
		}
		sortFloats(v)
		assert.InDeltaSlice(t, want, v, 1e-12, "g=%d", g)
	}
	// The adjacency spectrum has −2 with multiplicity (3^g − 3)/2
	// (references.md) and lies in [−2, 4] (benchmarks.md).
	for g := 2; g <= 4; g++ {
		gr, err := Gasket(g)
		require.NoError(t, err)
		v := eigenvalues(t, gr)
		count := 0
		for _, e := range v {
			if math.Abs(e+2) < 1e-9 {
				count++
			}
		}
		assert.Equal(t, (ipow(3, g)-3)/2, count, "g=%d", g)
		assert.GreaterOrEqual(t, v[0], -2-1e-9)
		assert.LessOrEqual(t, v[len(v)-1], 4.0) // the maximum degree bounds it
	}
}

func TestGasketErrors(t *testing.T) {
	for _, g := range []int{-2, -1, MaxGasketGeneration + 1, 40} {
		_, err := Gasket(g)
		requireInputError(t, err, fault.Invalid, "generation")
		assert.Contains(t, err.Error(), "between 0 and 16")
		_, err = GasketCorners(g)
		requireInputError(t, err, fault.Invalid, "generation")
	}
}

func BenchmarkGasket12(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Gasket(12); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkHamiltonianGasket12(b *testing.B) {
	g, err := Gasket(12)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		g.Hamiltonian(1)
	}
}
