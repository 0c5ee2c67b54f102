package observables

import (
	"math"
	"sort"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// LongTimeAverage returns the infinite-time average distribution of a quantum
// walk started on site start,
//
//	p̄_j = lim_{T→∞} (1/T) ∫₀^T |⟨j|e^{−iHt}|start⟩|² dt = Σ_λ |Σ_{k∈λ} V_jk V*_{start,k}|²,
//
// where the outer sum runs over the distinct eigenvalues λ of H and the inner
// one over the eigenvectors of each degenerate group: cross terms within a
// group do not oscillate and survive the average. values are the n
// eigenvalues (any order), vectors the eigenvectors row-major n×n with
// column k the eigenvector of values[k] (the convention of
// spectra.HermEigen), orthonormal. Eigenvalues are grouped as degenerate when
// they form a chain with consecutive (sorted) gaps ≤ tol; tol ≥ 0, typically
// 1e-8 times the spectral width. The result is exact for any degeneracy
// pattern, including the massive degeneracies of fractal graphs: groups are
// summed as projections. Cost O(n²), one scratch vector of n.
//
// Bad input (n < 1, length mismatches, start outside [0, n), negative or
// non-finite tol, non-finite eigenvalues) returns an *InputError.
func LongTimeAverage(values []float64, vectors []complex128, n int, start int, tol float64) ([]float64, error) {
	if err := checkEigen(len(values), len(vectors), n, start, tol); err != nil {
		return nil, err
	}
	groups, err := degenerateGroups(values, tol)
	if err != nil {
		return nil, err
	}
	p := make([]float64, n)
	amp := make([]complex128, n)
	for _, g := range groups {
		for j := range amp {
			amp[j] = 0
		}
		for _, k := range g {
			c := complex(real(vectors[start*n+k]), -imag(vectors[start*n+k]))
			if c == 0 {
				continue
			}
			for j := range amp {
				amp[j] += vectors[j*n+k] * c
			}
		}
		for j, a := range amp {
			p[j] += abs2(a)
		}
	}
	return p, nil
}

// LongTimeAverageReal is LongTimeAverage for a real symmetric H with real
// eigenvectors (row-major n×n, column k the eigenvector of values[k], the
// layout of gonum's mat.EigenSym vectors).
func LongTimeAverageReal(values, vectors []float64, n int, start int, tol float64) ([]float64, error) {
	if err := checkEigen(len(values), len(vectors), n, start, tol); err != nil {
		return nil, err
	}
	groups, err := degenerateGroups(values, tol)
	if err != nil {
		return nil, err
	}
	p := make([]float64, n)
	amp := make([]float64, n)
	for _, g := range groups {
		for j := range amp {
			amp[j] = 0
		}
		for _, k := range g {
			c := vectors[start*n+k]
			if c == 0 {
				continue
			}
			for j := range amp {
				amp[j] += vectors[j*n+k] * c
			}
		}
		for j, a := range amp {
			p[j] += a * a
		}
	}
	return p, nil
}

func checkEigen(nv, nvec, n, start int, tol float64) error {
	if n < 1 {
		return fault.Range("n", "at least 1", n)
	}
	if nv != n {
		return fault.New("values", "must hold n = %d eigenvalues; got %d", n, nv)
	}
	if nvec != n*n {
		return fault.New("vectors", "must hold n·n = %d entries; got %d", n*n, nvec)
	}
	if start < 0 || start >= n {
		return fault.Range("start", "a site index in [0, n) with n = "+strconv.Itoa(n), start)
	}
	if !(tol >= 0) || math.IsInf(tol, 0) {
		return fault.Range("tol", "non-negative and finite", tol)
	}
	return nil
}

// degenerateGroups sorts the eigenvalue indices by value and splits them
// where consecutive gaps exceed tol.
func degenerateGroups(values []float64, tol float64) ([][]int, error) {
	for i, v := range values {
		if !finite(v) {
			return nil, fault.New("values", "values[%d] must be finite; got %v", i, v)
		}
	}
	idx := make([]int, len(values))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return values[idx[a]] < values[idx[b]] })
	var groups [][]int
	lo := 0
	for i := 1; i <= len(idx); i++ {
		if i == len(idx) || values[idx[i]]-values[idx[i-1]] > tol {
			groups = append(groups, idx[lo:i])
			lo = i
		}
	}
	return groups, nil
}
