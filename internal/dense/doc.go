// Package dense holds the dense real kernels behind ampwalk's eigensolver
// and its Chebyshev planner: a cache-blocked, packed matrix product (Goto &
// van de Geijn, ACM Trans. Math. Softw. 34, 12 (2008)) whose 6×16 (AVX-512)
// or 6×8 (AVX2/FMA) micro-kernel on amd64 is chosen at run time from CPUID,
// with a portable Go fallback elsewhere; AddProd, the same micro-kernel on
// the shape of a few long vectors each taking a short combination of a few
// others (reading those in place); and parallel symmetric and Hermitian
// matrix–vector products that read each stored element once.
//
// Files: gemm.go (blocking, packing, worker split), addprod.go (the
// planner's accumulation), kernel*.go and *.s (the micro-kernels and CPU
// detection), symv.go and hemv.go (the matrix–vector products used by the
// Householder tridiagonalisation in package spectra).
//
// All matrices are row-major: element (i, j) of a matrix with leading
// dimension ld is at index i·ld + j. Work is split into fixed column (or row)
// ranges per worker; each worker owns its part of the output and the
// summation order inside an element does not depend on scheduling, so
// results are bit-for-bit reproducible for a given worker count.
//
// Nobody outside ampwalk should call this package.
package dense
