package spectra

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestHermEigenKnownSpectra checks complex Hermitian matrices with known
// spectra: the cycle threaded by a flux φ, whose eigenvalues are
// 2cos((2πk + φ)/N) (Peierls phase e^{iφ/N} on every bond; common practice),
// and the hypercube Q_6 after a random diagonal unitary gauge U A Uᴴ, whose
// spectrum d − 2k with multiplicity C(d, k) (Christandl et al., PRL 92,
// 187902 (2004)) the gauge leaves unchanged.
func TestHermEigenKnownSpectra(t *testing.T) {
	type tc struct {
		name string
		a    []complex128
		n    int
		want []float64
	}
	var cases []tc
	for _, n := range []int{3, 40, 257} {
		phi := 0.7
		a := make([]complex128, n*n)
		h := cmplx.Exp(complex(0, phi/float64(n)))
		for i := 0; i < n; i++ {
			j := (i + 1) % n
			a[j*n+i] += h // hop i → j with phase e^{iφ/N}
			a[i*n+j] += cmplx.Conj(h)
		}
		var want []float64
		for k := 0; k < n; k++ {
			want = append(want, 2*math.Cos((2*math.Pi*float64(k)+phi)/float64(n)))
		}
		slices.Sort(want)
		cases = append(cases, tc{"flux cycle", a, n, want})
	}
	{
		d := 6
		n := 1 << d
		rnd := rand.New(rand.NewPCG(5, 5))
		u := make([]complex128, n)
		for i := range u {
			u[i] = cmplx.Exp(complex(0, 2*math.Pi*rnd.Float64()))
		}
		a := make([]complex128, n*n)
		for i := 0; i < n; i++ {
			for b := 0; b < d; b++ {
				j := i ^ (1 << b)
				a[i*n+j] = u[i] * cmplx.Conj(u[j])
			}
		}
		var want []float64
		for k := d; k >= 0; k-- {
			for range eigBinom(d, k) {
				want = append(want, float64(d-2*k))
			}
		}
		cases = append(cases, tc{"gauged hypercube", a, n, want})
	}
	for _, c := range cases {
		orig := append([]complex128(nil), c.a...)
		w, v, err := HermEigen(c.a, c.n, true)
		if err != nil {
			t.Fatal(err)
		}
		// 100·n·ε·‖A‖ with ‖A‖ ≤ 6 (common practice).
		tol := 100 * float64(c.n) * 0x1p-52 * 6
		for k := range w {
			if math.Abs(w[k]-c.want[k]) > tol {
				t.Fatalf("%s n=%d: λ[%d] = %.17g, want %.17g", c.name, c.n, k, w[k], c.want[k])
			}
		}
		res, orth := eigHermResiduals(orig, c.n, w, v)
		if res > tol || orth > tol {
			t.Errorf("%s n=%d: residual %g orthogonality %g > %g", c.name, c.n, res, orth, tol)
		}
		w2, _, err := HermEigen(append([]complex128(nil), orig...), c.n, false)
		if err != nil {
			t.Fatal(err)
		}
		for k := range w2 {
			if math.Abs(w2[k]-c.want[k]) > tol {
				t.Fatalf("%s values only: λ[%d] = %g, want %g", c.name, k, w2[k], c.want[k])
			}
		}
	}
}

// TestHermEigenRealInput checks that a real symmetric matrix given as
// complex has the same eigenvalues through HermEigen and SymEigen, and that
// a seeded random Hermitian matrix of order 500 passes the residual checks.
func TestHermEigenRealInput(t *testing.T) {
	for _, n := range []int{7, 100, 300} {
		a := eigRandSym(n, 3)
		c := make([]complex128, n*n)
		for i, v := range a {
			c[i] = complex(v, 0)
		}
		ws, _, err := SymEigen(a, n, false)
		if err != nil {
			t.Fatal(err)
		}
		wh, _, err := HermEigen(c, n, true)
		if err != nil {
			t.Fatal(err)
		}
		// 50·n·ε·‖A‖, ‖A‖ ≤ n (common practice).
		tol := 50 * float64(n) * 0x1p-52 * float64(n)
		for k := range ws {
			if math.Abs(ws[k]-wh[k]) > tol {
				t.Fatalf("n=%d: λ[%d] sym %g herm %g", n, k, ws[k], wh[k])
			}
		}
	}
	if testing.Short() {
		return
	}
	n := 500
	a := eigRandHerm(n, 9)
	orig := append([]complex128(nil), a...)
	w, v, err := HermEigen(a, n, true)
	if err != nil {
		t.Fatal(err)
	}
	tol := 50 * float64(n) * 0x1p-52 * 2 * float64(n)
	res, orth := eigHermResiduals(orig, n, w, v)
	if res > tol || orth > tol {
		t.Errorf("n=%d: residual %g orthogonality %g > %g", n, res, orth, tol)
	}
}
