// Package sparse holds the compressed-sparse-row matrices and the product
// kernels that every propagator in ampwalk runs on. It is internal: the
// public packages keep their API while these loops get faster.
//
// # Conventions
//
// A CSR is square and stores its off-diagonal entries by row and its
// diagonal separately; H = W + diag(ε) for a Hamiltonian, γL = γ(D − W) for
// the classical generator (lattice.Graph.Hamiltonian and Laplacian build
// both). Vectors are []complex128 (quantum amplitudes) or []float64 (classical
// probabilities, real matrices only).
//
// # Kernels
//
//	MulVec, MulVecRows        dst = m·x (complex vectors)
//	MulVecReal                dst = m·x (real vectors, real m)
//	ChebFirst, ChebNext       one Chebyshev step fused with acc += c·T_k
//	ChebFirstNorm, ChebNextNorm   the same, returning ‖T_k‖² (block-ordered sum)
//	ChebFirstRot, ChebNextRot     one step of the rotated recurrence S_k = (−i)^k T_k,
//	                          whose series coefficients are real (no accumulator)
//	ChebFirstReal, ChebNextReal   Chebyshev steps on real vectors (classical walk)
//	SumSq                     Σ|x_i|² (block-ordered sum)
//	DetectGrid                switch an open square lattice or chain to
//	                          matrix-free rows (same bits, ≈1.5× faster)
//
// Every kernel is documented by its reference loop, and its test compares
// the fast path with that loop exactly, for 1, 2, 3 and 7 workers and every
// storage kind. The implementations specialise on the storage (pattern-only
// when Val == nil, real weighted, complex), unroll rows of degree 2 and 4,
// add the diagonal in a separate pass, fuse the Chebyshev recurrence with
// the accumulation of the expansion over chunks of 256 rows, and allocate
// nothing. A step costs O(nnz + n).
//
// A propagator's inner loop (Tal-Ezer & Kosloff, J. Chem. Phys. 81, 3967
// (1984)), with H̃ = (H − b)/a and c_k the expansion coefficients:
//
//	acc = c_0·ψ
//	m.ChebFirst(t1, psi, acc, 1/a, b, c[1])
//	m.ChebNext(t2, t1, psi, acc, 1/a, b, c[2])
//	prev, cur := t1, t2
//	for k := 3; k <= K; k++ {
//		m.ChebNext(prev, cur, prev, acc, 1/a, b, c[k]) // in place: dst aliases prev
//		prev, cur = cur, prev
//	}
//
// # Parallelism
//
// A product uses CSR.Workers goroutines (GOMAXPROCS when 0): the caller and
// workers of a persistent pool, fed through channels, so a product costs a
// channel send per extra worker (a few microseconds), not a goroutine spawn.
// The rows are split into 4 blocks per worker of about equal work (stored
// entries plus two per row); the goroutines claim blocks in order from a
// shared counter, so one slowed by another process on its core does less of
// the work (on an idle 2-core machine this was also 1.16× faster per step
// than one fixed block per worker: paired runs, gasket g = 10). Each block
// writes only its own rows and reductions (norms) keep one partial per block,
// summed in block order, and the blocks depend only on the matrix and the
// worker count: a given worker count gives the same bits on every run,
// whichever goroutine computed which block. Matrices with less than about
// 16k entries per worker stay on the calling goroutine.
//
// Each product streams the index array (4 bytes per entry), the values when
// stored (8 or 16 bytes per entry), and the vectors; it is bound by memory
// bandwidth, not by arithmetic.
package sparse
