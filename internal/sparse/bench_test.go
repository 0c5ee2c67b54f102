package sparse

import (
	"math/rand/v2"
	"strconv"
	"testing"
)

// gasketCSR returns the pattern-only adjacency of the Sierpinski gasket
// graph of generation g ((3^(g+1)+3)/2 sites, 3^(g+1) bonds), sites numbered
// in order of first appearance over the unit triangles taken recursively
// (bottom-left, bottom-right, top). It is a private generator so that this
// package's benchmarks do not depend on lattice.
func gasketCSR(g int) *CSR {
	type pt struct{ i, j int32 } // triangular coordinates
	idx := map[pt]int32{}
	var bi, bj []int32
	site := func(p pt) int32 {
		if k, ok := idx[p]; ok {
			return k
		}
		k := int32(len(idx))
		idx[p] = k
		return k
	}
	var rec func(g int, o pt)
	rec = func(g int, o pt) {
		if g == 0 {
			a, b, c := site(o), site(pt{o.i + 1, o.j}), site(pt{o.i, o.j + 1})
			bi = append(bi, a, a, b)
			bj = append(bj, b, c, c)
			return
		}
		s := int32(1) << (g - 1)
		rec(g-1, o)
		rec(g-1, pt{o.i + s, o.j})
		rec(g-1, pt{o.i, o.j + s})
	}
	rec(g, pt{})
	return fromBonds(len(idx), bi, bj)
}

// fromBonds assembles the symmetric pattern-only CSR of the bonds.
func fromBonds(n int, bi, bj []int32) *CSR {
	rp := make([]int32, n+1)
	for k := range bi {
		rp[bi[k]+1]++
		rp[bj[k]+1]++
	}
	for i := 0; i < n; i++ {
		rp[i+1] += rp[i]
	}
	col := make([]int32, rp[n])
	next := append([]int32(nil), rp[:n]...)
	for k := range bi {
		col[next[bi[k]]] = bj[k]
		next[bi[k]]++
		col[next[bj[k]]] = bi[k]
		next[bj[k]]++
	}
	return &CSR{N: n, RowPtr: rp, Col: col, Unit: 1}
}

// squareCSR returns the pattern-only adjacency of the open w×w square
// lattice, site x + w·y.
func squareCSR(w int) *CSR {
	var bi, bj []int32
	for y := 0; y < w; y++ {
		for x := 0; x < w; x++ {
			i := int32(x + w*y)
			if x+1 < w {
				bi, bj = append(bi, i), append(bj, i+1)
			}
			if y+1 < w {
				bi, bj = append(bi, i), append(bj, i+int32(w))
			}
		}
	}
	return fromBonds(w*w, bi, bj)
}

func TestGasketCSRCounts(t *testing.T) {
	for g := 0; g <= 6; g++ {
		m := gasketCSR(g)
		p := 1
		for range g + 1 {
			p *= 3
		}
		// Sites (3^(g+1)+3)/2 and bonds 3^(g+1): the job format's gasket row.
		if m.N != (p+3)/2 || m.NNZ() != 2*p {
			t.Fatalf("g=%d: %d sites, %d entries; want %d, %d", g, m.N, m.NNZ(), (p+3)/2, 2*p)
		}
	}
}

func benchChebNext(b *testing.B, m *CSR, workers int) {
	m.Workers = workers
	rng := rand.New(rand.NewPCG(1, 2))
	n := m.N
	cur, prev, acc := randVec(rng, n), randVec(rng, n), randVec(rng, n)
	// Bytes streamed per step: columns and row starts, cur gathered and
	// streamed, prev read and written, acc read and written.
	b.SetBytes(int64(4*m.NNZ()+4*n) + 16*int64(n)*6)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		m.ChebNext(prev, cur, prev, acc, 0.3, 1, 1e-3)
		cur, prev = prev, cur
	}
}

func BenchmarkChebNextGasket8(b *testing.B)  { benchChebNext(b, gasketCSR(8), 0) }
func BenchmarkChebNextGasket10(b *testing.B) { benchChebNext(b, gasketCSR(10), 0) }
func BenchmarkChebNextGasket12(b *testing.B) { benchChebNext(b, gasketCSR(12), 0) }
func BenchmarkChebNextSquare1000(b *testing.B) {
	benchChebNext(b, squareCSR(1000), 0)
}

// BenchmarkChebNextGasket10Workers shows the worker count's effect.
func BenchmarkChebNextGasket10Workers(b *testing.B) {
	m := gasketCSR(10)
	for _, w := range []int{1, 2, 4} {
		b.Run("w="+strconv.Itoa(w), func(b *testing.B) { benchChebNext(b, m, w) })
	}
}

// BenchmarkChebNextReference is the reference loop (a temporary per step)
// on the same job, for comparison.
func BenchmarkChebNextReferenceGasket10(b *testing.B) {
	m := gasketCSR(10)
	rng := rand.New(rand.NewPCG(1, 2))
	n := m.N
	cur, prev, acc := randVec(rng, n), randVec(rng, n), randVec(rng, n)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		refChebNext(m, prev, cur, prev, acc, 0.3, 1, 1e-3)
		cur, prev = prev, cur
	}
}

func BenchmarkChebNextRealGasket10(b *testing.B) {
	m := gasketCSR(10)
	rng := rand.New(rand.NewPCG(1, 2))
	n := m.N
	cur, prev, acc := randFloats(rng, n), randFloats(rng, n), randFloats(rng, n)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		m.ChebNextReal(prev, cur, prev, acc, 0.3, 1, 1e-3)
		cur, prev = prev, cur
	}
}

// BenchmarkCopyGasket10 is a streaming copy of the vectors a ChebNext step
// touches, the memory-bandwidth yardstick for the kernels above.
func BenchmarkCopyGasket10(b *testing.B) {
	n := gasketCSR(10).N
	x := make([]complex128, 3*n)
	y := make([]complex128, 3*n)
	b.SetBytes(2 * 16 * 3 * int64(n))
	for range b.N {
		copy(y, x)
	}
}
