package sparse

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// rectCSR returns the pattern-only adjacency of the open w×h square lattice,
// site x + w·y, with ascending columns (the order lattice.Square's CSR has).
func rectCSR(w, h int) *CSR {
	var bi, bj []int32
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			i := int32(x + w*y)
			if x+1 < w {
				bi, bj = append(bi, i), append(bj, i+1)
			}
			if y+1 < h {
				bi, bj = append(bi, i), append(bj, i+int32(w))
			}
		}
	}
	m := fromBonds(w*h, bi, bj)
	for i := 0; i < m.N; i++ { // fromBonds lists columns by bond; sort each row
		c := m.Col[m.RowPtr[i]:m.RowPtr[i+1]]
		for a := 1; a < len(c); a++ {
			for b := a; b > 0 && c[b] < c[b-1]; b-- {
				c[b], c[b-1] = c[b-1], c[b]
			}
		}
	}
	return m
}

func TestGridMatchesCSR(t *testing.T) {
	withSmallBlocks(t)
	rng := rand.New(rand.NewPCG(11, 1))
	for _, sz := range [][2]int{{2, 1}, {7, 1}, {1, 5}, {2, 2}, {3, 5}, {13, 11}, {40, 30}} {
		for _, diag := range []bool{false, true} {
			ref := rectCSR(sz[0], sz[1])
			ref.Unit = 0.5 + rng.Float64()
			if diag {
				ref.Diag = randFloats(rng, ref.N)
			}
			fast := *ref
			require.True(t, fast.DetectGrid(), "%v", sz)
			require.True(t, fast.IsGrid())
			n := ref.N
			cur, prev, acc := randVec(rng, n), randVec(rng, n), randVec(rng, n)
			rc, rp, ra := randFloats(rng, n), randFloats(rng, n), randFloats(rng, n)
			for _, w := range workerCounts {
				ref.Workers, fast.Workers = w, w
				name := fmt.Sprintf("%dx%d diag=%v workers=%d", sz[0], sz[1], diag, w)

				want, got := make([]complex128, n), make([]complex128, n)
				ref.MulVec(want, cur)
				fast.MulVec(got, cur)
				require.Equal(t, want, got, name)

				p1, a1 := append([]complex128(nil), prev...), append([]complex128(nil), acc...)
				p2, a2 := append([]complex128(nil), prev...), append([]complex128(nil), acc...)
				ref.ChebNext(p1, cur, p1, a1, 0.3, 0.1, 0.2-0.4i)
				fast.ChebNext(p2, cur, p2, a2, 0.3, 0.1, 0.2-0.4i)
				require.Equal(t, p1, p2, name)
				require.Equal(t, a1, a2, name)

				d1, a1 := make([]complex128, n), append([]complex128(nil), acc...)
				d2, a2 := make([]complex128, n), append([]complex128(nil), acc...)
				ref.ChebFirst(d1, cur, a1, 0.3, 0.1, 0.5i)
				fast.ChebFirst(d2, cur, a2, 0.3, 0.1, 0.5i)
				require.Equal(t, d1, d2, name)
				require.Equal(t, a1, a2, name)

				p1, a1 = append([]complex128(nil), prev...), append([]complex128(nil), acc...)
				p2, a2 = append([]complex128(nil), prev...), append([]complex128(nil), acc...)
				n1 := ref.ChebNextNorm(p1, cur, p1, a1, 0.3, 0.1, 0.2-0.4i)
				n2 := fast.ChebNextNorm(p2, cur, p2, a2, 0.3, 0.1, 0.2-0.4i)
				require.Equal(t, p1, p2, name)
				require.InDelta(t, n1, n2, sumTol(p1), name) // summation order only

				d1, d2 = make([]complex128, n), make([]complex128, n)
				ref.ChebNextRot(d1, cur, prev, 0.3, 0.1)
				fast.ChebNextRot(d2, cur, prev, 0.3, 0.1)
				require.Equal(t, d1, d2, name)

				wr, gr := make([]float64, n), make([]float64, n)
				ref.MulVecReal(wr, rc)
				fast.MulVecReal(gr, rc)
				require.Equal(t, wr, gr, name)

				q1, b1 := append([]float64(nil), rp...), append([]float64(nil), ra...)
				q2, b2 := append([]float64(nil), rp...), append([]float64(nil), ra...)
				ref.ChebNextReal(q1, rc, q1, b1, 0.3, 0.1, 0.7)
				fast.ChebNextReal(q2, rc, q2, b2, 0.3, 0.1, 0.7)
				require.Equal(t, q1, q2, name)
				require.Equal(t, b1, b2, name)
			}
		}
	}
}

func TestDetectGridRejects(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 1))
	cases := map[string]*CSR{
		"gasket":   gasketCSR(3),
		"random":   randomCSR(rng, 50, false, false, false),
		"weighted": func() *CSR { m := rectCSR(4, 4); m.Val = randFloats(rng, m.NNZ()); return m }(),
		"complex":  func() *CSR { m := rectCSR(4, 4); m.Imag = randFloats(rng, m.NNZ()); return m }(),
		"missing bond": func() *CSR {
			m := rectCSR(4, 4)
			m.Col[len(m.Col)-1] = 0 // last row's last neighbour replaced
			return m
		}(),
		"swapped columns": func() *CSR {
			m := rectCSR(4, 4)
			a := m.RowPtr[5]
			m.Col[a], m.Col[a+1] = m.Col[a+1], m.Col[a]
			return m
		}(),
		"one site": {N: 1, RowPtr: []int32{0, 0}, Unit: 1},
	}
	for name, m := range cases {
		require.False(t, m.DetectGrid(), name)
		require.False(t, m.IsGrid(), name)
	}
	// Setting values after detection falls back to the CSR loop.
	m := rectCSR(5, 4)
	require.True(t, m.DetectGrid())
	m.Val = randFloats(rng, m.NNZ())
	ref := *m
	ref.grid = nil
	x := randVec(rng, m.N)
	want, got := make([]complex128, m.N), make([]complex128, m.N)
	ref.MulVec(want, x)
	m.MulVec(got, x)
	require.Equal(t, want, got)
}
