package sparse

import (
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestChebSeriesMultiMatchesSingle checks that one multi-series sweep gives
// exactly what separate series with ChebFirst/ChebNext give (the same
// operations per entry, so bit for bit), for series of different lengths.
func TestChebSeriesMultiMatchesSingle(t *testing.T) {
	withSmallBlocks(t)
	rng := rand.New(rand.NewPCG(8, 1))
	n := 700
	for _, kd := range kinds {
		m := randomCSR(rng, n, kd.val, kd.imag, kd.diag)
		psi := randVec(rng, n)
		lens := []int{1, 2, 3, 9, 9, 17}
		coef := make([][]complex128, len(lens))
		for q, l := range lens {
			coef[q] = randVec(rng, l)
		}
		for _, w := range workerCounts {
			m.Workers = w
			acc := make([][]complex128, len(lens))
			for q := range acc {
				acc[q] = make([]complex128, n)
			}
			w1, w2 := make([]complex128, n), make([]complex128, n)
			prods := m.ChebSeriesMulti(acc, psi, coef, 0.3, 0.2, w1, w2)
			require.Equal(t, 16, prods)
			for q, c := range coef {
				want := singleSeries(m, psi, c, 0.3, 0.2)
				require.Equal(t, want, acc[q], "%s workers=%d series %d", kd.name, w, q)
			}
		}
	}
}

// singleSeries is Σ_k c[k] T_k(H̃) psi by the single-accumulator kernels.
func singleSeries(m *CSR, psi, c []complex128, scale, shift float64) []complex128 {
	n := m.N
	acc := make([]complex128, n)
	c0 := c[0]
	for i, v := range psi {
		acc[i] = complex(real(c0)*real(v)-imag(c0)*imag(v), real(c0)*imag(v)+imag(c0)*real(v))
	}
	if len(c) == 1 {
		return acc
	}
	t1, t2 := make([]complex128, n), make([]complex128, n)
	m.ChebFirst(t1, psi, acc, scale, shift, c[1])
	if len(c) == 2 {
		return acc
	}
	m.ChebNext(t2, t1, psi, acc, scale, shift, c[2])
	prev, cur := t1, t2
	for k := 3; k < len(c); k++ {
		m.ChebNext(prev, cur, prev, acc, scale, shift, c[k])
		prev, cur = cur, prev
	}
	return acc
}

func TestChebSeriesMultiRejectsUnsorted(t *testing.T) {
	m := randomCSR(rand.New(rand.NewPCG(9, 1)), 5, false, false, false)
	v := func() []complex128 { return make([]complex128, 5) }
	require.Panics(t, func() {
		m.ChebSeriesMulti([][]complex128{v(), v()}, v(), [][]complex128{{1, 2}, {1}}, 1, 0, v(), v())
	})
}
