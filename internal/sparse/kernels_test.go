package sparse

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// The reference loops below are the kernels' documented semantics, written
// the plain way (they are the loops of the package's first version). The
// fast kernels must reproduce them exactly: same operations in the same
// order per row.

func refMulVec(m *CSR, dst, x []complex128) {
	for i := 0; i < m.N; i++ {
		var sr, si float64
		for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
			xj := x[m.Col[k]]
			r, im := real(xj), imag(xj)
			switch {
			case m.Imag != nil:
				v := m.Unit
				if m.Val != nil {
					v = m.Val[k]
				}
				sr += v*r - m.Imag[k]*im
				si += v*im + m.Imag[k]*r
			case m.Val != nil:
				sr += m.Val[k] * r
				si += m.Val[k] * im
			default:
				sr += r
				si += im
			}
		}
		if m.Imag == nil && m.Val == nil {
			sr *= m.Unit
			si *= m.Unit
		}
		if m.Diag != nil {
			d := m.Diag[i]
			sr += d * real(x[i])
			si += d * imag(x[i])
		}
		dst[i] = complex(sr, si)
	}
}

func refChebNext(m *CSR, dst, cur, prev, acc []complex128, scale, shift float64, coef complex128) {
	tmp := make([]complex128, m.N)
	refMulVec(m, tmp, cur)
	s2 := 2 * scale
	for i := range dst {
		v := complex(s2, 0)*(tmp[i]-complex(shift, 0)*cur[i]) - prev[i]
		dst[i] = v
		acc[i] += coef * v
	}
}

func refChebFirst(m *CSR, dst, cur, acc []complex128, scale, shift float64, coef complex128) {
	refMulVec(m, dst, cur)
	for i := range dst {
		v := complex(scale, 0) * (dst[i] - complex(shift, 0)*cur[i])
		dst[i] = v
		acc[i] += coef * v
	}
}

func refMulVecReal(m *CSR, dst, x []float64) {
	for i := 0; i < m.N; i++ {
		var s float64
		for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
			if m.Val != nil {
				s += m.Val[k] * x[m.Col[k]]
			} else {
				s += x[m.Col[k]]
			}
		}
		if m.Val == nil {
			s *= m.Unit
		}
		if m.Diag != nil {
			s += m.Diag[i] * x[i]
		}
		dst[i] = s
	}
}

// kinds are the storage variants every kernel specialises on.
var kinds = []struct {
	name            string
	val, imag, diag bool
}{
	{"pattern", false, false, false},
	{"pattern+diag", false, false, true},
	{"weighted", true, false, false},
	{"weighted+diag", true, false, true},
	{"complex-unit", false, true, false},
	{"complex+diag", true, true, true},
}

// randomCSR returns an n×n matrix with row degrees drawn from 0…7, with
// extra weight on 2 and 4 so the unrolled paths run.
func randomCSR(rng *rand.Rand, n int, val, imag, diag bool) *CSR {
	m := &CSR{N: n, RowPtr: make([]int32, n+1), Unit: 0.5 + rng.Float64()}
	for i := 0; i < n; i++ {
		var d int
		switch rng.IntN(3) {
		case 0:
			d = 4
		case 1:
			d = 2
		default:
			d = rng.IntN(8)
		}
		for range d {
			m.Col = append(m.Col, int32(rng.IntN(n)))
		}
		m.RowPtr[i+1] = int32(len(m.Col))
	}
	nnz := len(m.Col)
	if val {
		m.Val = randFloats(rng, nnz)
	}
	if imag {
		m.Imag = randFloats(rng, nnz)
	}
	if diag {
		m.Diag = randFloats(rng, n)
	}
	return m
}

func randFloats(rng *rand.Rand, n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = 2*rng.Float64() - 1
	}
	return v
}

func randVec(rng *rand.Rand, n int) []complex128 {
	v := make([]complex128, n)
	for i := range v {
		v[i] = complex(2*rng.Float64()-1, 2*rng.Float64()-1)
	}
	return v
}

// withSmallBlocks lets tiny matrices run on several blocks.
func withSmallBlocks(t *testing.T) {
	old := minBlockWork
	minBlockWork = 1
	t.Cleanup(func() { minBlockWork = old })
}

var workerCounts = []int{1, 2, 3, 7}

func TestMulVecMatchesReference(t *testing.T) {
	withSmallBlocks(t)
	rng := rand.New(rand.NewPCG(1, 1))
	for _, n := range []int{1, 5, 300, 1500} {
		for _, kd := range kinds {
			m := randomCSR(rng, n, kd.val, kd.imag, kd.diag)
			x := randVec(rng, n)
			want := make([]complex128, n)
			refMulVec(m, want, x)
			for _, w := range workerCounts {
				m.Workers = w
				got := make([]complex128, n)
				m.MulVec(got, x)
				require.Equal(t, want, got, "n=%d %s workers=%d", n, kd.name, w)
			}
			got := make([]complex128, n)
			m.MulVecRows(got, x, 0, n)
			require.Equal(t, want, got, "MulVecRows n=%d %s", n, kd.name)
		}
	}
}

func TestChebMatchesReference(t *testing.T) {
	withSmallBlocks(t)
	rng := rand.New(rand.NewPCG(2, 1))
	for _, n := range []int{1, 7, 600, 2000} {
		for _, kd := range kinds {
			m := randomCSR(rng, n, kd.val, kd.imag, kd.diag)
			cur, prev, acc := randVec(rng, n), randVec(rng, n), randVec(rng, n)
			scale, shift := 0.3+rng.Float64(), rng.Float64()-0.5
			coef := complex(rng.Float64()-0.5, rng.Float64()-0.5)

			wantFirst, wantFirstAcc := make([]complex128, n), append([]complex128(nil), acc...)
			refChebFirst(m, wantFirst, cur, wantFirstAcc, scale, shift, coef)
			wantNext, wantNextAcc := make([]complex128, n), append([]complex128(nil), acc...)
			refChebNext(m, wantNext, cur, prev, wantNextAcc, scale, shift, coef)
			var normFirst float64 // the norm for one worker count, to check reproducibility
			for _, w := range workerCounts {
				m.Workers = w
				name := fmt.Sprintf("n=%d %s workers=%d", n, kd.name, w)

				dst, a := make([]complex128, n), append([]complex128(nil), acc...)
				m.ChebFirst(dst, cur, a, scale, shift, coef)
				require.Equal(t, wantFirst, dst, name)
				require.Equal(t, wantFirstAcc, a, name)

				dst, a = make([]complex128, n), append([]complex128(nil), acc...)
				nrm := m.ChebFirstNorm(dst, cur, a, scale, shift, coef)
				require.Equal(t, wantFirst, dst, name)
				require.InDelta(t, refSumSq(dst), nrm, sumTol(dst), name)
				normFirst = nrm
				for range 3 { // same bits every run for a given worker count
					dst, a = make([]complex128, n), append([]complex128(nil), acc...)
					require.Equal(t, math.Float64bits(normFirst), math.Float64bits(m.ChebFirstNorm(dst, cur, a, scale, shift, coef)), name)
				}

				// In place: dst aliases prev.
				p, a := append([]complex128(nil), prev...), append([]complex128(nil), acc...)
				m.ChebNext(p, cur, p, a, scale, shift, coef)
				require.Equal(t, wantNext, p, name)
				require.Equal(t, wantNextAcc, a, name)

				p, a = append([]complex128(nil), prev...), append([]complex128(nil), acc...)
				nrm = m.ChebNextNorm(p, cur, p, a, scale, shift, coef)
				require.Equal(t, wantNext, p, name)
				require.InDelta(t, refSumSq(p), nrm, sumTol(p), name)

				require.InDelta(t, refSumSq(cur), m.SumSq(cur), sumTol(cur), name)
			}
		}
	}
}

// sumTol bounds the difference between two summation orders of n
// non-negative terms: 2·n·u·Σ, u = 2⁻⁵³ the unit roundoff (recursive
// summation bound, Higham, Accuracy and Stability of Numerical Algorithms,
// SIAM 2002, §4.2, from memory).
func sumTol(x []complex128) float64 {
	return 2 * float64(len(x)+1) * 0x1p-53 * refSumSq(x)
}

func refSumSq(x []complex128) float64 {
	var s float64
	for _, v := range x {
		s += real(v)*real(v) + imag(v)*imag(v)
	}
	return s
}

func TestRealKernelsMatchReference(t *testing.T) {
	withSmallBlocks(t)
	rng := rand.New(rand.NewPCG(4, 1))
	for _, n := range []int{1, 9, 1100} {
		for _, kd := range kinds {
			if kd.imag {
				continue
			}
			m := randomCSR(rng, n, kd.val, false, kd.diag)
			x, prev, acc := randFloats(rng, n), randFloats(rng, n), randFloats(rng, n)
			y := make([]float64, n)
			refMulVecReal(m, y, x)
			wantFirst, wantFirstAcc := make([]float64, n), append([]float64(nil), acc...)
			wantNext, wantNextAcc := make([]float64, n), append([]float64(nil), acc...)
			for i := range y {
				v := 0.7 * (y[i] - 0.2*x[i])
				wantFirst[i] = v
				wantFirstAcc[i] += 0.3 * v
				v = 2*0.7*(y[i]-0.2*x[i]) - prev[i]
				wantNext[i] = v
				wantNextAcc[i] += 0.3 * v
			}
			for _, w := range workerCounts {
				m.Workers = w
				name := fmt.Sprintf("n=%d %s workers=%d", n, kd.name, w)
				got := make([]float64, n)
				m.MulVecReal(got, x)
				require.Equal(t, y, got, name)

				dst, a := make([]float64, n), append([]float64(nil), acc...)
				m.ChebFirstReal(dst, x, a, 0.7, 0.2, 0.3)
				require.Equal(t, wantFirst, dst, name)
				require.Equal(t, wantFirstAcc, a, name)

				p, a := append([]float64(nil), prev...), append([]float64(nil), acc...)
				m.ChebNextReal(p, x, p, a, 0.7, 0.2, 0.3)
				require.Equal(t, wantNext, p, name)
				require.Equal(t, wantNextAcc, a, name)

				// Without an accumulator: the recurrence alone.
				dst = make([]float64, n)
				m.ChebFirstReal(dst, x, nil, 0.7, 0.2, 0.3)
				require.Equal(t, wantFirst, dst, name)
				p = append([]float64(nil), prev...)
				m.ChebNextReal(p, x, p, nil, 0.7, 0.2, 0.3)
				require.Equal(t, wantNext, p, name)
			}
		}
	}
}

func TestRealKernelOnComplexMatrixPanics(t *testing.T) {
	m := randomCSR(rand.New(rand.NewPCG(5, 1)), 10, true, true, false)
	require.Panics(t, func() { m.MulVecReal(make([]float64, 10), make([]float64, 10)) })
	require.Panics(t, func() { m.MulVec(make([]complex128, 9), make([]complex128, 10)) })
}

func TestBlocksCoverRowsInOrder(t *testing.T) {
	withSmallBlocks(t)
	rng := rand.New(rand.NewPCG(6, 1))
	for _, n := range []int{1, 2, 3, 50, 1000} {
		m := randomCSR(rng, n, false, false, false)
		for _, w := range []int{1, 2, 3, 4, 7, 64} {
			m.Workers = w
			b := m.Blocks()
			require.Equal(t, 0, b[0])
			require.Equal(t, n, b[len(b)-1])
			require.LessOrEqual(t, len(b)-1, w*blocksPerWorker)
			for k := 1; k < len(b); k++ {
				require.LessOrEqual(t, b[k-1], b[k], "n=%d w=%d", n, w)
			}
		}
	}
}

func TestKernelsAllocateNothing(t *testing.T) {
	if raceEnabled {
		t.Skip("sync.Pool drops items under the race detector")
	}
	rng := rand.New(rand.NewPCG(7, 1))
	n := 40000 // large enough for two blocks at the default minBlockWork
	m := randomCSR(rng, n, false, false, true)
	cur, prev, acc := randVec(rng, n), randVec(rng, n), randVec(rng, n)
	for _, w := range []int{1, 2} {
		m.Workers = w
		allocs := testing.AllocsPerRun(20, func() {
			m.ChebNext(prev, cur, prev, acc, 0.1, 0, 0.01)
			m.MulVec(prev, cur)
			_ = m.SumSq(cur)
		})
		require.Zero(t, allocs, "workers=%d", w)
	}
	g := rectCSR(200, 200) // the matrix-free grid path
	require.True(t, g.DetectGrid())
	n = g.N
	cur, prev, acc = randVec(rng, n), randVec(rng, n), randVec(rng, n)
	for _, w := range []int{1, 2} {
		g.Workers = w
		allocs := testing.AllocsPerRun(20, func() {
			g.ChebNext(prev, cur, prev, acc, 0.1, 0, 0.01)
			_ = g.ChebNextNorm(prev, cur, prev, acc, 0.1, 0, 0.01)
		})
		require.Zero(t, allocs, "grid workers=%d", w)
	}
}
