// Package dense holds the dense real kernels behind ampwalk's eigensolver:
// a cache-blocked, packed matrix product (Goto & van de Geijn, ACM Trans.
// Math. Softw. 34, 12 (2008)) with an AVX2/FMA micro-kernel on amd64 and a
// portable Go fallback, and a parallel symmetric matrix–vector product.
//
// All matrices are row-major: element (i, j) of a matrix with leading
// dimension ld is at index i·ld + j. Work is split into fixed column (or row)
// ranges per worker; each worker owns its part of the output and the
// summation order inside an element does not depend on scheduling, so
// results are bit-for-bit reproducible for a given worker count.
//
// Nobody outside ampwalk should call this package.
package dense
