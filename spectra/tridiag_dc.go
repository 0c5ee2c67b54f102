package spectra

import (
	"math"
	"slices"

	"github.com/ampwalk/ampwalk/internal/dense"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/gonum"
)

// dcLeaf is the largest tridiagonal block solved by implicit QL/QR (gonum
// Dsteqr) instead of being split further.
const dcLeaf = 32

// dcCols is the number of columns of the merge's eigenvector matrix S formed
// and multiplied at a time.
const dcCols = 512

// tridiagEigen computes all eigenvalues (ascending, into d) and eigenvectors
// of the symmetric tridiagonal matrix with diagonal d[:n] and off-diagonal
// e[:n−1] (e is destroyed). z (row-major, leading dimension ldz ≥ n) receives
// the eigenvectors, z[i·ldz + k] = component i of eigenvector k; its n×n
// block is overwritten entirely (each level clears the blocks it needs zero).
//
// Divide and conquer (Cuppen, Numer. Math. 36, 177 (1981)): T is torn into
// two halves by a rank-one modification, the halves are solved recursively,
// and the rank-one update D + ρ z zᵀ of their spectra is solved through its
// secular equation 1 + ρ Σ z_j²/(d_j − λ) = 0 (rational interpolation after
// Bunch, Nielsen & Sorensen, Numer. Math. 31, 31 (1978), safeguarded by
// bisection), after deflation of negligible z_j and of close pairs d_i ≈ d_j
// (Dongarra & Sorensen, SIAM J. Sci. Stat. Comput. 8, s139 (1987)). The
// eigenvectors use the Löwner vector ẑ recomputed from the computed
// eigenvalues (Gu & Eisenstat, SIAM J. Matrix Anal. Appl. 16, 172 (1995)),
// which keeps them numerically orthogonal without extended precision. The
// eigenvector update at each merge is a matrix product (dense.Gemm) that uses
// the block structure of the two halves. O(n³) flops in the worst case and
// much less when many z_j deflate.
func tridiagEigen(n int, d, e, z []float64, ldz int) bool {
	if n == 0 {
		return true
	}
	if n == 1 {
		z[0] = 1
		return true
	}
	// Scale to max |entry| = 1 (as LAPACK's dstedc does) so the tolerances
	// below are relative to ‖T‖.
	scale := 0.0
	for _, v := range d[:n] {
		scale = math.Max(scale, math.Abs(v))
	}
	for _, v := range e[:n-1] {
		scale = math.Max(scale, math.Abs(v))
	}
	if scale == 0 {
		for i := 0; i < n; i++ {
			clear(z[i*ldz : i*ldz+n])
			z[i*ldz+i] = 1
		}
		return true
	}
	for i := range d[:n] {
		d[i] /= scale
	}
	for i := range e[:n-1] {
		e[i] /= scale
	}
	ws := &dcWork{
		qg: make([]float64, n*n),
		s:  make([]float64, n*min(n, dcCols)),
	}
	ok := ws.solve(n, d, e, z, ldz)
	for i := range d[:n] {
		d[i] *= scale
	}
	return ok
}

type dcWork struct {
	qg []float64 // gathered columns of Q (n²)
	s  []float64 // a k×dcCols slice of the secular eigenvectors S
}

func (ws *dcWork) solve(n int, d, e, q []float64, ldq int) bool {
	if n <= dcLeaf {
		for i := 0; i < n; i++ {
			clear(q[i*ldq : i*ldq+n])
		}
		var impl gonum.Implementation
		work := make([]float64, max(1, 2*n-2))
		return impl.Dsteqr(lapack.EVTridiag, n, d, e, q, ldq, work)
	}
	m := n / 2
	beta := e[m-1]
	rho := math.Abs(beta)
	d[m-1] -= rho
	d[m] -= rho
	// The off-diagonal blocks of q must be zero before the merge.
	for i := 0; i < m; i++ {
		clear(q[i*ldq+m : i*ldq+n])
	}
	for i := m; i < n; i++ {
		clear(q[i*ldq : i*ldq+m])
	}
	if !ws.solve(m, d[:m], e[:m-1], q, ldq) {
		return false
	}
	if !ws.solve(n-m, d[m:n], e[m:n-1], q[m*ldq+m:], ldq) {
		return false
	}
	return ws.merge(n, m, d, q, ldq, rho, math.Copysign(1, beta))
}

// merge solves diag(D1, D2) + ρ u uᵀ, u = (Q1ᵀ e_last; sgn·Q2ᵀ e_first),
// updating d and the n×n block q (block diagonal on entry).
func (ws *dcWork) merge(n, m int, d, q []float64, ldq int, rho, sgn float64) bool {
	// z = (last row of Q1, sgn·first row of Q2)/√2, ρ ← 2ρ so that ‖z‖ = 1.
	z := make([]float64, n)
	for j := 0; j < m; j++ {
		z[j] = q[(m-1)*ldq+j] / math.Sqrt2
	}
	for j := m; j < n; j++ {
		z[j] = sgn * q[m*ldq+j] / math.Sqrt2
	}
	rho *= 2
	// Column types: 1 = nonzero only in rows < m, 3 = only in rows ≥ m, 2 = both.
	ctype := make([]int8, n)
	for j := range ctype {
		if j < m {
			ctype[j] = 1
		} else {
			ctype[j] = 3
		}
	}
	// Indices in ascending order of d (merge of the two sorted halves).
	idx := make([]int, n)
	for i, a, b := 0, 0, m; i < n; i++ {
		if b >= n || (a < m && d[a] <= d[b]) {
			idx[i] = a
			a++
		} else {
			idx[i] = b
			b++
		}
	}
	dmax, zmax := 0.0, 0.0
	for j := 0; j < n; j++ {
		dmax = math.Max(dmax, math.Abs(d[j]))
		zmax = math.Max(zmax, math.Abs(z[j]))
	}
	const eps = 0x1p-53
	tol := 8 * eps * math.Max(dmax, zmax)

	// Deflation (LAPACK dlaed2): keep the non-deflated columns in keep (in
	// ascending d); deflated ones in defl.
	keep := make([]int, 0, n)
	defl := make([]int, 0, n)
	pj := -1
	for _, nj := range idx {
		if rho*math.Abs(z[nj]) <= tol {
			defl = append(defl, nj)
			continue
		}
		if pj < 0 {
			pj = nj
			continue
		}
		s, c := z[pj], z[nj]
		tau := math.Hypot(c, s)
		t := d[nj] - d[pj]
		c /= tau
		s = -s / tau
		if math.Abs(t*c*s) <= tol {
			// Rotate columns pj, nj so that z[pj] = 0; pj deflates.
			z[nj] = tau
			z[pj] = 0
			if ctype[nj] != ctype[pj] {
				ctype[nj] = 2
			}
			for i := 0; i < n; i++ {
				x, y := q[i*ldq+pj], q[i*ldq+nj]
				q[i*ldq+pj] = c*x + s*y
				q[i*ldq+nj] = c*y - s*x
			}
			t = d[pj]*c*c + d[nj]*s*s
			d[nj] = d[pj]*s*s + d[nj]*c*c
			d[pj] = t
			defl = append(defl, pj)
			pj = nj
			continue
		}
		keep = append(keep, pj)
		pj = nj
	}
	if pj >= 0 {
		keep = append(keep, pj)
	}
	k := len(keep)
	dl := make([]float64, k)
	w := make([]float64, k)
	for t, j := range keep {
		dl[t] = d[j]
		w[t] = z[j]
	}
	// The rotations may have broken the ascending order of dl slightly;
	// restore it (the values stay separated by more than tol).
	if !slices.IsSorted(dl) {
		ord := make([]int, k)
		for i := range ord {
			ord[i] = i
		}
		slices.SortStableFunc(ord, func(a, b int) int { return dcCmp(dl[a], dl[b]) })
		k2, d2, w2 := make([]int, k), make([]float64, k), make([]float64, k)
		for t, o := range ord {
			k2[t], d2[t], w2[t] = keep[o], dl[o], w[o]
		}
		keep, dl, w = k2, d2, w2
	}

	// Secular equation: root i is dl[org[i]] + tau[i].
	org := make([]int, k)
	tau := make([]float64, k)
	lam := make([]float64, k)
	for i := 0; i < k; i++ {
		o, t, ok := secularRoot(i, dl, w, rho)
		if !ok {
			return false
		}
		org[i], tau[i] = o, t
		lam[i] = dl[o] + t
	}
	// Löwner vector (Gu & Eisenstat 1995, eq. 3.6, as in LAPACK dlaed3):
	// ẑ_i² = −∏_j δ_i(λ_j) / ∏_{j≠i} (dl_i − dl_j), δ_i(λ_j) = dl_i − λ_j.
	zh := make([]float64, k)
	for i := 0; i < k; i++ {
		p := dcDelta(dl, i, org[i], tau[i])
		for j := 0; j < k; j++ {
			if j == i {
				continue
			}
			p *= dcDelta(dl, i, org[j], tau[j]) / (dl[i] - dl[j])
		}
		zh[i] = math.Copysign(math.Sqrt(math.Max(-p, 0)), w[i])
	}
	// Order the poles by column type (1, 2, 3): rows < m of the new vectors
	// then need only the poles of types 1 and 2, rows ≥ m only types 2 and 3,
	// each a contiguous band of rows of S.
	pos := make([]int, k) // pos[i]: row of pole i in S and column in the gathers
	var n1, n2 int
	for _, j := range keep {
		switch ctype[j] {
		case 1:
			n1++
		case 2:
			n2++
		}
	}
	c1, c2, c3 := 0, n1, n1+n2
	for i, j := range keep {
		switch ctype[j] {
		case 1:
			pos[i], c1 = c1, c1+1
		case 2:
			pos[i], c2 = c2, c2+1
		default:
			pos[i], c3 = c3, c3+1
		}
	}
	// Gather, in ws.qg: Q[0:m, types 1–2] (m×n12), Q[m:n, types 2–3]
	// ((n−m)×n23) and the deflated columns (n×nd); together at most n².
	n12, n23, nd := n1+n2, k-n1, len(defl)
	gt := ws.qg[:m*n12]
	gb := ws.qg[m*n12 : m*n12+(n-m)*n23]
	gd := ws.qg[m*n12+(n-m)*n23 : m*n12+(n-m)*n23+n*nd]
	for i := 0; i < n; i++ {
		row := q[i*ldq : i*ldq+n]
		if i < m {
			g := gt[i*n12 : (i+1)*n12]
			for t, j := range keep {
				if p := pos[t]; p < n12 {
					g[p] = row[j]
				}
			}
		} else {
			g := gb[(i-m)*n23 : (i-m+1)*n23]
			for t, j := range keep {
				if p := pos[t]; p >= n1 {
					g[p-n1] = row[j]
				}
			}
		}
		g := gd[i*nd : (i+1)*nd]
		for t, j := range defl {
			g[t] = row[j]
		}
	}
	// Q_new[:, 0:k] = Q[:, keep]·S, written into the first k columns of q,
	// dcCols columns at a time: S[:, j0:j1] (column j the normalised vector
	// ẑ_i/δ_i(λ_j), row pos[i]) is formed just before its product, so only a
	// k×dcCols slice of S is ever held.
	for j0 := 0; j0 < k; j0 += dcCols {
		jb := min(dcCols, k-j0)
		sb := ws.s[:k*jb]
		for j := j0; j < j0+jb; j++ {
			nrm := 0.0
			for i := 0; i < k; i++ {
				v := zh[i] / dcDelta(dl, i, org[j], tau[j])
				sb[pos[i]*jb+j-j0] = v
				nrm += v * v
			}
			nrm = 1 / math.Sqrt(nrm)
			for i := 0; i < k; i++ {
				sb[i*jb+j-j0] *= nrm
			}
		}
		if n12 > 0 {
			dense.Gemm(false, false, m, jb, n12, 1, gt, n12, sb, jb, 0, q[j0:], ldq)
		} else {
			for i := 0; i < m; i++ {
				clear(q[i*ldq+j0 : i*ldq+j0+jb])
			}
		}
		if n23 > 0 {
			dense.Gemm(false, false, n-m, jb, n23, 1, gb, n23, sb[n1*jb:], jb, 0, q[m*ldq+j0:], ldq)
		} else {
			for i := m; i < n; i++ {
				clear(q[i*ldq+j0 : i*ldq+j0+jb])
			}
		}
	}
	// Assemble: eigenpairs (lam, columns 0…k−1 of q) and the deflated pairs
	// (d[j], saved column), sorted ascending.
	type pair struct {
		v   float64
		src int // < k: column of q; ≥ k: deflated column src−k
	}
	all := make([]pair, 0, n)
	for i := 0; i < k; i++ {
		all = append(all, pair{lam[i], i})
	}
	for t := range defl {
		all = append(all, pair{d[defl[t]], k + t})
	}
	slices.SortStableFunc(all, func(a, b pair) int { return dcCmp(a.v, b.v) })
	for c, p := range all {
		d[c] = p.v
	}
	tmp := make([]float64, k)
	for i := 0; i < n; i++ {
		row := q[i*ldq : i*ldq+n]
		copy(tmp, row[:k])
		g := gd[i*nd : (i+1)*nd]
		for c, p := range all {
			if p.src < k {
				row[c] = tmp[p.src]
			} else {
				row[c] = g[p.src-k]
			}
		}
	}
	return true
}

func dcCmp(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// dcDelta returns dl[i] − (dl[o] + t) computed as (dl[i] − dl[o]) − t.
func dcDelta(dl []float64, i, o int, t float64) float64 {
	return (dl[i] - dl[o]) - t
}
