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
// Every kernel is documented by its reference loop. The implementations
// specialise on the storage (pattern-only when Val == nil, real weighted,
// complex), add the diagonal in a separate pass, fuse the Chebyshev
// recurrence with the accumulation of the expansion, and allocate nothing.
//
// # Parallelism
//
// A product splits the rows into CSR.Workers fixed blocks of about equal
// work (stored entries plus two per row); worker k always computes block k.
// Reductions (norms) sum one partial per block in block order. The blocks
// depend only on the matrix and the worker count, so a given worker count
// gives the same bits on every run. The workers are a persistent pool of
// goroutines fed through channels: a product costs one channel send per
// extra worker (a few microseconds), not a goroutine spawn. Matrices with
// less than about 16k entries per worker stay on the calling goroutine.
//
// Each product streams the index array (4 bytes per entry), the values when
// stored (8 or 16 bytes per entry), and the vectors; it is bound by memory
// bandwidth, not by arithmetic.
package sparse
