package dense

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// addProdChunk is the number of columns of C one piece of AddProd covers:
// with k ≤ 16 rows of B, the piece of B, its packed copy and the piece of C
// (m ≤ 12 rows) stay within a few hundred KiB, inside L2.
const addProdChunk = 2048

// AddProd computes C += A·B for row-major A (m×k, leading dimension k),
// B (k×n, leading dimension ldb) and C (m×n, leading dimension ldc), the
// shape of a few long vectors (the rows of C) each receiving a short linear
// combination of a few others (the rows of B). The columns are cut into
// fixed pieces of addProdChunk that up to workers goroutines (GOMAXPROCS when
// workers ≤ 0) claim in order; every element's sum is formed the same way
// whatever the split, so the result does not depend on workers. The helper
// goroutines persist between calls, so a call allocates nothing once the
// packing buffers are pooled.
func AddProd(m, n, k int, a []float64, b []float64, ldb int, c []float64, ldc int, workers int) {
	if m <= 0 || n <= 0 || k <= 0 {
		return
	}
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	pieces := (n + addProdChunk - 1) / addProdChunk
	workers = min(workers, pieces, maxProdWorkers)
	if workers == 1 {
		for p := range pieces {
			addProdPiece(m, n, k, a, b, ldb, c, ldc, p)
		}
		return
	}
	j := prodJobs.Get().(*prodJob)
	j.m, j.n, j.k, j.a, j.b, j.ldb, j.c, j.ldc, j.pieces = m, n, k, a, b, ldb, c, ldc, pieces
	j.next.Store(0)
	j.wg.Add(workers - 1)
	for w := 1; w < workers; w++ {
		prodWorkers.get(w) <- j
	}
	j.drain()
	j.wg.Wait()
	j.a, j.b, j.c = nil, nil, nil
	prodJobs.Put(j)
}

// addProdPiece is AddProd on piece p of the columns. When m is a multiple
// of 6 the micro-kernel reads B in place (row stride ldb) and only A is
// packed, into 6-row panels; otherwise the packed product does the piece.
func addProdPiece(m, n, k int, a, b []float64, ldb int, c []float64, ldc, p int) {
	j0 := p * addProdChunk
	j1 := min(j0+addProdChunk, n)
	if m%6 != 0 {
		gemmSerial(false, false, m, j1-j0, k, 1, a, k, b[j0:], ldb, c[j0:], ldc)
		return
	}
	nr := panelWidth
	bufp := getBuf(6 * k)
	defer packPool.Put(bufp)
	ap := *bufp
	for t := 0; t < m; t += 6 {
		for i := range 6 {
			for q, v := range a[(t+i)*k : (t+i+1)*k] {
				ap[6*q+i] = v
			}
		}
		ct := c[t*ldc:]
		j := j0
		for ; j+nr <= j1; j += nr {
			kern6xN(nr, k, ap, b[j:], ldb, ct[j:], ldc)
		}
		for ; j < j1; j++ {
			for i := range 6 {
				var s float64
				for q := range k {
					s += ap[6*q+i] * b[q*ldb+j]
				}
				ct[i*ldc+j] += s
			}
		}
	}
}

// maxProdWorkers caps the helper goroutines of AddProd.
const maxProdWorkers = 256

// prodJob is one AddProd call shared by its goroutines.
type prodJob struct {
	m, n, k, ldb, ldc, pieces int
	a, b, c                   []float64
	next                      atomic.Int64
	wg                        sync.WaitGroup
}

var prodJobs = sync.Pool{New: func() any { return new(prodJob) }}

// drain claims pieces in order until none is left.
func (j *prodJob) drain() {
	for {
		p := int(j.next.Add(1) - 1)
		if p >= j.pieces {
			return
		}
		addProdPiece(j.m, j.n, j.k, j.a, j.b, j.ldb, j.c, j.ldc, p)
	}
}

// prodPool holds the persistent helpers; helper w joins every call with
// more than w workers.
type prodPool struct {
	mu    sync.Mutex
	chans []chan *prodJob
}

var prodWorkers prodPool

func (p *prodPool) get(w int) chan *prodJob {
	p.mu.Lock()
	defer p.mu.Unlock()
	for len(p.chans) <= w {
		ch := make(chan *prodJob, 4)
		p.chans = append(p.chans, ch)
		go func() {
			for j := range ch {
				j.drain()
				j.wg.Done()
			}
		}()
	}
	return p.chans[w]
}
