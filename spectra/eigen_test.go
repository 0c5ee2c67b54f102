package spectra

import (
	"errors"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// eigRandSym returns a seeded random symmetric n×n matrix with entries in [−1, 1).
func eigRandSym(n int, seed uint64) []float64 {
	rnd := rand.New(rand.NewPCG(seed, 1))
	a := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			v := 2*rnd.Float64() - 1
			a[i*n+j], a[j*n+i] = v, v
		}
	}
	return a
}

// eigRandHerm returns a seeded random Hermitian n×n matrix.
func eigRandHerm(n int, seed uint64) []complex128 {
	rnd := rand.New(rand.NewPCG(seed, 2))
	a := make([]complex128, n*n)
	for i := 0; i < n; i++ {
		a[i*n+i] = complex(2*rnd.Float64()-1, 0)
		for j := 0; j < i; j++ {
			v := complex(2*rnd.Float64()-1, 2*rnd.Float64()-1)
			a[i*n+j], a[j*n+i] = v, cmplx.Conj(v)
		}
	}
	return a
}

func eigMaxAbs(a []float64) float64 {
	m := 0.0
	for _, v := range a {
		m = math.Max(m, math.Abs(v))
	}
	return m
}

// eigSymResiduals returns max|AV − VΛ| and max|VᵀV − I|.
func eigSymResiduals(a []float64, n int, w, v []float64) (res, orth float64) {
	for k := 0; k < n; k++ {
		for i := 0; i < n; i++ {
			s := -w[k] * v[i*n+k]
			for j := 0; j < n; j++ {
				s += a[i*n+j] * v[j*n+k]
			}
			res = math.Max(res, math.Abs(s))
		}
		for l := 0; l <= k; l++ {
			s := 0.0
			for i := 0; i < n; i++ {
				s += v[i*n+k] * v[i*n+l]
			}
			if l == k {
				s--
			}
			orth = math.Max(orth, math.Abs(s))
		}
	}
	return res, orth
}

func eigHermResiduals(a []complex128, n int, w []float64, v []complex128) (res, orth float64) {
	for k := 0; k < n; k++ {
		for i := 0; i < n; i++ {
			s := -complex(w[k], 0) * v[i*n+k]
			for j := 0; j < n; j++ {
				s += a[i*n+j] * v[j*n+k]
			}
			res = math.Max(res, cmplx.Abs(s))
		}
		for l := 0; l <= k; l++ {
			var s complex128
			for i := 0; i < n; i++ {
				s += cmplx.Conj(v[i*n+l]) * v[i*n+k]
			}
			if l == k {
				s--
			}
			orth = math.Max(orth, cmplx.Abs(s))
		}
	}
	return res, orth
}

func TestSymEigenRandom(t *testing.T) {
	// Sizes from the assignment; tolerance 50·n·ε·‖A‖ (common practice, after gonum mat/eigen_test.go).
	for _, n := range []int{1, 2, 3, 10, 65, 200} {
		for seed := uint64(1); seed <= 3; seed++ {
			a := eigRandSym(n, seed)
			orig := append([]float64(nil), a...)
			w, v, err := SymEigen(a, n, true)
			if err != nil {
				t.Fatalf("n=%d: %v", n, err)
			}
			tol := 50 * float64(n) * 0x1p-52 * float64(n)
			res, orth := eigSymResiduals(orig, n, w, v)
			if res > tol || orth > tol {
				t.Errorf("n=%d seed=%d: residual %g orthogonality %g > %g", n, seed, res, orth, tol)
			}
			for k := 1; k < n; k++ {
				if w[k] < w[k-1] {
					t.Fatalf("n=%d: values not ascending at %d", n, k)
				}
			}
		}
	}
}

func TestHermEigenRandom(t *testing.T) {
	for _, n := range []int{1, 2, 3, 10, 65, 200} {
		for seed := uint64(1); seed <= 3; seed++ {
			a := eigRandHerm(n, seed)
			orig := append([]complex128(nil), a...)
			w, v, err := HermEigen(a, n, true)
			if err != nil {
				t.Fatalf("n=%d: %v", n, err)
			}
			// 50·n·ε·‖A‖ with ‖A‖ ≤ 2n for entries of modulus ≤ √2 (common practice).
			tol := 50 * float64(n) * 0x1p-52 * 2 * float64(n)
			res, orth := eigHermResiduals(orig, n, w, v)
			if res > tol || orth > tol {
				t.Errorf("n=%d seed=%d: residual %g orthogonality %g > %g", n, seed, res, orth, tol)
			}
			for k := 1; k < n; k++ {
				if w[k] < w[k-1] {
					t.Fatalf("n=%d: values not ascending at %d", n, k)
				}
			}
		}
	}
}

func TestEigenInputErrors(t *testing.T) {
	nan := math.NaN()
	cases := []struct {
		name string
		a    []float64
		n    int
	}{
		{"zero order", nil, 0},
		{"wrong length", make([]float64, 3), 2},
		{"NaN", []float64{1, 0, 0, nan}, 2},
		{"Inf", []float64{math.Inf(1), 0, 0, 1}, 2},
		{"asymmetric", []float64{1, 2, 3, 4}, 2},
	}
	for _, c := range cases {
		_, _, err := SymEigen(c.a, c.n, true)
		var fe *fault.Error
		if !errors.As(err, &fe) || fe.Field != "matrix" {
			t.Errorf("SymEigen %s: got %v, want *fault.Error on matrix", c.name, err)
		}
		ca := make([]complex128, len(c.a))
		for i, v := range c.a {
			ca[i] = complex(v, 0)
		}
		_, _, err = HermEigen(ca, c.n, true)
		if !errors.As(err, &fe) || fe.Field != "matrix" {
			t.Errorf("HermEigen %s: got %v, want *fault.Error on matrix", c.name, err)
		}
	}
	_, _, err := HermEigen([]complex128{1i, 0, 0, 1}, 2, false)
	var fe *fault.Error
	if !errors.As(err, &fe) {
		t.Errorf("HermEigen complex diagonal: got %v", err)
	}
}

// TestEigenScaling checks matrices with entries near the ends of the
// float64 range: the solver scales them and the eigenvalues of
// s·(path P_4) are s·2cos(πk/5) (common practice).
func TestEigenScaling(t *testing.T) {
	for _, s := range []float64{1e-300, 1e300, 1} {
		n := 4
		a := make([]float64, n*n)
		c := make([]complex128, n*n)
		for i := 0; i+1 < n; i++ {
			a[i*n+i+1], a[(i+1)*n+i] = s, s
			c[i*n+i+1], c[(i+1)*n+i] = complex(0, s), complex(0, -s)
		}
		w, _, err := SymEigen(a, n, true)
		if err != nil {
			t.Fatal(err)
		}
		wc, _, err := HermEigen(c, n, true)
		if err != nil {
			t.Fatal(err)
		}
		for k := 0; k < n; k++ {
			want := s * 2 * math.Cos(math.Pi*float64(n-k)/float64(n+1))
			// 1e-14 relative: a 4×4 problem (common practice).
			if math.Abs(w[k]-want) > 1e-14*s || math.Abs(wc[k]-want) > 1e-14*s {
				t.Errorf("s=%g: λ[%d] = %g (sym), %g (herm), want %g", s, k, w[k], wc[k], want)
			}
		}
	}
}
