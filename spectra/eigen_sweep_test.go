package spectra

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/ampwalk/ampwalk/internal/dense"
)

// eigCheckLarge returns max|AV − VΛ|/‖A‖ and max|VᵀV − I| using matrix
// products, for sizes where the triple loop of eigSymResiduals is slow.
func eigCheckLarge(a []float64, n int, w, v []float64) (res, orth float64) {
	av := make([]float64, n*n)
	dense.Gemm(false, false, n, n, n, 1, a, n, v, n, 0, av, n)
	anorm := math.Max(math.Abs(w[0]), math.Abs(w[n-1]))
	if anorm == 0 {
		anorm = 1
	}
	for i := 0; i < n; i++ {
		for k := 0; k < n; k++ {
			res = math.Max(res, math.Abs(av[i*n+k]-w[k]*v[i*n+k]))
		}
	}
	dense.Gemm(true, false, n, n, n, 1, v, n, v, n, 0, av, n)
	for i := 0; i < n; i++ {
		av[i*n+i]--
	}
	return res / anorm, eigMaxAbs(av)
}

// TestSymEigenSweep runs seeded random matrices of awkward structure through
// SymEigen: graph adjacencies with huge degeneracies (star K_{1,m}:
// ±√m and 0 with multiplicity m−1; complete K_n: n−1 and −1 with
// multiplicity n−1 — common practice), sparse random graphs with integer
// weights, low-rank-plus-identity matrices and dense random matrices.
func TestSymEigenSweep(t *testing.T) {
	rnd := rand.New(rand.NewPCG(2026, 12))
	sizes := []int{34, 97, 160, 333}
	if !testing.Short() {
		sizes = append(sizes, 1000)
	}
	for _, n := range sizes {
		kinds := []string{"star", "complete", "sparse", "lowrank", "dense"}
		for _, kind := range kinds {
			a := make([]float64, n*n)
			var want []float64
			switch kind {
			case "star":
				for j := 1; j < n; j++ {
					a[j], a[j*n] = 1, 1
				}
				r := math.Sqrt(float64(n - 1))
				want = append(want, -r)
				for j := 0; j < n-2; j++ {
					want = append(want, 0)
				}
				want = append(want, r)
			case "complete":
				for i := 0; i < n; i++ {
					for j := 0; j < n; j++ {
						if i != j {
							a[i*n+j] = 1
						}
					}
				}
				for j := 0; j < n-1; j++ {
					want = append(want, -1)
				}
				want = append(want, float64(n-1))
			case "sparse":
				for b := 0; b < n; b++ {
					i, j := rnd.IntN(n), rnd.IntN(n)
					w := float64(1 + rnd.IntN(2))
					a[i*n+j] += w
					if i != j {
						a[j*n+i] += w
					}
				}
			case "dense": // little deflation: the merges' products span many column blocks
				a = eigRandSym(n, uint64(n))
			case "lowrank":
				for r := 0; r < 3; r++ {
					u := make([]float64, n)
					for i := range u {
						u[i] = rnd.NormFloat64()
					}
					for i := 0; i < n; i++ {
						for j := 0; j < n; j++ {
							a[i*n+j] += u[i] * u[j]
						}
					}
				}
				for i := 0; i < n; i++ {
					a[i*n+i] += 2
				}
			}
			orig := append([]float64(nil), a...)
			w, v, err := SymEigen(a, n, true)
			if err != nil {
				t.Fatalf("%s n=%d: %v", kind, n, err)
			}
			// 50·n·ε relative to ‖A‖ (common practice, after gonum mat/eigen_test.go).
			tol := 50 * float64(n) * 0x1p-52
			res, orth := eigCheckLarge(orig, n, w, v)
			if res > tol || orth > tol {
				t.Errorf("%s n=%d: residual %g orthogonality %g > %g", kind, n, res, orth, tol)
			}
			for k := range want {
				if math.Abs(w[k]-want[k]) > tol*float64(n) {
					t.Fatalf("%s n=%d: λ[%d] = %g, want %g", kind, n, k, w[k], want[k])
				}
			}
		}
	}
}

// TestEigenConcurrentDeterministic runs SymEigen and HermEigen from several
// goroutines at once (as ensembles over disorder do) and checks that every
// call returns the same bits as a sequential call: the solvers share no
// mutable state and their parallel reductions have a fixed order.
func TestEigenConcurrentDeterministic(t *testing.T) {
	n := 150
	a := eigRandSym(n, 77)
	c := eigRandHerm(n, 78)
	w0, v0, err := SymEigen(append([]float64(nil), a...), n, true)
	if err != nil {
		t.Fatal(err)
	}
	h0, u0, err := HermEigen(append([]complex128(nil), c...), n, true)
	if err != nil {
		t.Fatal(err)
	}
	const workers = 4
	errs := make(chan string, 2*workers)
	done := make(chan struct{}, workers)
	for g := 0; g < workers; g++ {
		go func() {
			defer func() { done <- struct{}{} }()
			w, v, err := SymEigen(append([]float64(nil), a...), n, true)
			if err != nil || !slices.Equal(w, w0) || !slices.Equal(v, v0) {
				errs <- "SymEigen differs"
			}
			h, u, err := HermEigen(append([]complex128(nil), c...), n, true)
			if err != nil || !slices.Equal(h, h0) || !slices.Equal(u, u0) {
				errs <- "HermEigen differs"
			}
		}()
	}
	for g := 0; g < workers; g++ {
		<-done
	}
	close(errs)
	for e := range errs {
		t.Error(e)
	}
}
