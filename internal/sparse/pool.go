package sparse

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// minBlockWork is the least work (stored entries plus two per row) a block
// gets: below it the goroutine hand-off costs more than it saves. Tests
// lower it to exercise the parallel path on small matrices.
var minBlockWork = 1 << 14

// maxWorkers caps the pool.
const maxWorkers = 256

// blocksPerWorker is how many row blocks a parallel product has per worker.
// The workers claim blocks in order from a shared counter, so a worker whose
// core is busy with another process does fewer of them instead of holding
// everyone up; 1 gives one static block per worker.
var blocksPerWorker = 4

// blockCount returns the number of row blocks a product of m uses: Workers
// (GOMAXPROCS when 0), capped so each block holds at least minBlockWork.
func (m *CSR) blockCount() int {
	w := m.Workers
	if w <= 0 {
		w = runtime.GOMAXPROCS(0)
	}
	work := m.NNZ() + 2*m.N
	if c := work / max(minBlockWork, 1); w > c {
		w = c
	}
	w = min(w, m.N, maxWorkers)
	return max(w, 1)
}

// blockPlan returns the workers w and the row blocks nb of a product.
func (m *CSR) blockPlan() (w, nb int) {
	w = m.blockCount()
	if w == 1 {
		return 1, 1
	}
	return w, min(w*max(blocksPerWorker, 1), m.N)
}

// Blocks returns the row boundaries m's products use: block k is rows
// [b[k], b[k+1]). Block boundaries split the work (stored entries plus two
// per row) evenly and depend only on m and m.Workers.
func (m *CSR) Blocks() []int {
	_, nb := m.blockPlan()
	b := make([]int, nb+1)
	m.bounds(b)
	return b
}

// bounds fills b (length blocks+1) with the row boundaries.
func (m *CSR) bounds(b []int) {
	w := len(b) - 1
	n := m.N
	rp := m.RowPtr
	total := int64(rp[n]) + 2*int64(n)
	b[0], b[w] = 0, n
	for k := 1; k < w; k++ {
		target := total * int64(k) / int64(w)
		// Smallest i with rp[i] + 2i ≥ target.
		lo, hi := b[k-1], n
		for lo < hi {
			mid := int(uint(lo+hi) >> 1)
			if int64(rp[mid])+2*int64(mid) < target {
				lo = mid + 1
			} else {
				hi = mid
			}
		}
		b[k] = lo
	}
}

// op selects the kernel a job runs.
type op uint8

const (
	opMul op = iota
	opFirst
	opNext
	opMulReal
	opFirstReal
	opNextReal
	opSumSq
	opFirstRot
	opNextRot
)

// job holds the arguments of one parallel kernel call. Jobs are recycled
// through jobPool so that a product allocates nothing.
type job struct {
	op                  op
	m                   *CSR
	dst, cur, prev, acc []complex128
	rdst, rcur, rprev   []float64
	racc                []float64
	scale, shift        float64
	coef                complex128
	rcoef               float64
	norm                bool
	bounds              []int
	partial             []float64
	workers             int          // goroutines taking part, the caller included
	next                atomic.Int64 // the next block to claim
	wg                  sync.WaitGroup
}

var jobPool = sync.Pool{New: func() any { return new(job) }}

// newJob returns a job for a product of m on w workers (the caller's
// blockCount); the row blocks are m's blockPlan.
func newJob(m *CSR, o op, w int) *job {
	_, nb := m.blockPlan()
	j := jobPool.Get().(*job)
	j.op, j.m, j.workers = o, m, w
	if cap(j.bounds) < nb+1 {
		j.bounds = make([]int, nb+1)
		j.partial = make([]float64, nb)
	}
	j.bounds = j.bounds[:nb+1]
	j.partial = j.partial[:nb]
	clear(j.partial)
	j.next.Store(0)
	m.bounds(j.bounds)
	return j
}

// run executes every block: the calling goroutine and pool workers 1…w−1
// claim blocks in order until none is left. It waits, returns the partials
// summed in block order (so the result does not depend on which goroutine
// computed which block) and recycles j.
func (j *job) run() float64 {
	w := j.workers
	j.wg.Add(w - 1)
	for k := 1; k < w; k++ {
		workers.get(k) <- item{j, k}
	}
	j.drain()
	j.wg.Wait()
	var s float64
	for _, p := range j.partial {
		s += p
	}
	j.release()
	return s
}

// release drops j's references to the caller's vectors and recycles it. The
// WaitGroup is left alone: it is zero again once Wait has returned.
func (j *job) release() {
	j.m = nil
	j.dst, j.cur, j.prev, j.acc = nil, nil, nil, nil
	j.rdst, j.rcur, j.rprev, j.racc = nil, nil, nil, nil
	j.norm = false
	jobPool.Put(j)
}

// drain claims and runs blocks until none is left.
func (j *job) drain() {
	nb := int64(len(j.bounds) - 1)
	for {
		k := j.next.Add(1) - 1
		if k >= nb {
			return
		}
		j.block(int(k))
	}
}

// block runs the job's kernel on block k.
func (j *job) block(k int) {
	lo, hi := j.bounds[k], j.bounds[k+1]
	m := j.m
	switch j.op {
	case opMul:
		m.mulRows(j.dst[lo:hi], j.cur, lo, hi)
	case opFirst:
		j.partial[k] = m.chebRows(j.dst, j.cur, nil, j.acc, j.scale, j.shift, j.coef, j.norm, lo, hi)
	case opNext:
		j.partial[k] = m.chebRows(j.dst, j.cur, j.prev, j.acc, j.scale, j.shift, j.coef, j.norm, lo, hi)
	case opMulReal:
		m.mulRowsReal(j.rdst[lo:hi], j.rcur, lo, hi)
	case opFirstReal:
		m.chebRealRows(j.rdst, j.rcur, nil, j.racc, j.scale, j.shift, j.rcoef, lo, hi)
	case opNextReal:
		m.chebRealRows(j.rdst, j.rcur, j.rprev, j.racc, j.scale, j.shift, j.rcoef, lo, hi)
	case opFirstRot:
		m.rotRows(j.dst, j.cur, nil, j.scale, j.shift, lo, hi)
	case opNextRot:
		m.rotRows(j.dst, j.cur, j.prev, j.scale, j.shift, lo, hi)
	case opSumSq:
		j.partial[k] = sumSq(j.cur[lo:hi])
	}
}

// item hands a job to pool worker k.
type item struct {
	j *job
	k int
}

// pool is the set of persistent worker goroutines; worker k joins every
// parallel job of at least k+1 workers.
type pool struct {
	mu    sync.Mutex
	chans []chan item
}

var workers pool

// get returns the channel of worker k, starting workers as needed.
func (p *pool) get(k int) chan item {
	p.mu.Lock()
	for len(p.chans) <= k {
		c := make(chan item, 4)
		p.chans = append(p.chans, c)
		go work(c)
	}
	c := p.chans[k]
	p.mu.Unlock()
	return c
}

func work(c chan item) {
	for it := range c {
		it.j.drain()
		it.j.wg.Done()
	}
}
