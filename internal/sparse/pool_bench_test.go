package sparse

import (
	"sync"
	"testing"
)

// The cost of handing a product to the workers: the persistent pool (one
// channel send per extra block) against spawning a goroutine per block, on
// a job small enough that the hand-off dominates (SumSq of 2·256 values in
// two blocks).

func BenchmarkDispatchPool(b *testing.B) {
	old := minBlockWork
	minBlockWork = 1
	defer func() { minBlockWork = old }()
	m := gasketCSR(3) // 123 sites
	m.Workers = 2
	x := make([]complex128, m.N)
	b.ReportAllocs()
	for range b.N {
		_ = m.SumSq(x)
	}
}

func BenchmarkDispatchSpawn(b *testing.B) {
	m := gasketCSR(3)
	m.Workers = 2
	x := make([]complex128, m.N)
	bounds := []int{0, m.N / 2, m.N}
	var partial [2]float64
	b.ReportAllocs()
	for range b.N {
		var wg sync.WaitGroup
		wg.Add(1)
		go func() {
			partial[1] = sumSq(x[bounds[1]:bounds[2]])
			wg.Done()
		}()
		partial[0] = sumSq(x[bounds[0]:bounds[1]])
		wg.Wait()
		_ = partial[0] + partial[1]
	}
}

func BenchmarkDispatchSerial(b *testing.B) {
	m := gasketCSR(3)
	m.Workers = 1
	x := make([]complex128, m.N)
	b.ReportAllocs()
	for range b.N {
		_ = m.SumSq(x)
	}
}
