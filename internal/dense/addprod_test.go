package dense

import (
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestAddProdMatchesLoops checks AddProd against the plain triple loop for
// the shapes the Chebyshev propagator uses (m accumulators, k stored terms,
// n long), including ragged edges, and that the result does not depend on
// the number of workers.
func TestAddProdMatchesLoops(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 3))
	for _, sz := range [][3]int{{1, 1, 1}, {2, 5000, 8}, {6, 4096, 8}, {6, 4103, 8}, {7, 6001, 3}, {12, 2049, 16}, {12, 2063, 5}, {5, 17, 4}, {6, 5, 8}} {
		m, n, k := sz[0], sz[1], sz[2]
		ldb, ldc := n+3, n+5
		a := randSlice(rng, m*k)
		b := randSlice(rng, k*ldb)
		c0 := randSlice(rng, m*ldc)
		want := append([]float64(nil), c0...)
		for i := 0; i < m; i++ {
			for j := 0; j < n; j++ {
				var s float64
				for p := 0; p < k; p++ {
					s += a[i*k+p] * b[p*ldb+j]
				}
				want[i*ldc+j] += s
			}
		}
		var first []float64
		for _, w := range []int{1, 2, 3, 0} {
			c := append([]float64(nil), c0...)
			AddProd(m, n, k, a, b, ldb, c, ldc, w)
			for i := range c {
				require.InDelta(t, want[i], c[i], 1e-12*float64(k), "m=%d n=%d k=%d i=%d", m, n, k, i)
			}
			if first == nil {
				first = c
			} else {
				require.Equal(t, first, c, "workers=%d changed the bits", w)
			}
		}
	}
}

func randSlice(rng *rand.Rand, n int) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = rng.Float64()*2 - 1
	}
	return s
}

// TestAddProdAllocatesNothing checks that a warmed-up call allocates
// nothing, serial and parallel.
func TestAddProdAllocatesNothing(t *testing.T) {
	if raceEnabled {
		t.Skip("the race detector makes sync.Pool drop items")
	}
	rng := rand.New(rand.NewPCG(12, 3))
	m, n, k := 6, 3*addProdChunk+5, 8
	a, b, c := randSlice(rng, m*k), randSlice(rng, k*n), randSlice(rng, m*n)
	for _, w := range []int{1, 2} {
		AddProd(m, n, k, a, b, n, c, n, w)
		allocs := testing.AllocsPerRun(20, func() { AddProd(m, n, k, a, b, n, c, n, w) })
		require.Zero(t, allocs, "workers=%d", w)
	}
}
