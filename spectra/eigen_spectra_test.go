package spectra

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// eigHypercube returns the adjacency matrix of the d-dimensional hypercube.
func eigHypercube(d int) []float64 {
	n := 1 << d
	a := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for b := 0; b < d; b++ {
			a[i*n+(i^(1<<b))] = 1
		}
	}
	return a
}

func eigCycle(n int, closed bool) []float64 {
	a := make([]float64, n*n)
	for i := 0; i+1 < n; i++ {
		a[i*n+i+1], a[(i+1)*n+i] = 1, 1
	}
	if closed && n > 2 {
		a[n-1], a[(n-1)*n] = 1, 1
	}
	return a
}

func eigBinom(n, k int) int {
	r := 1
	for i := 1; i <= k; i++ {
		r = r * (n - k + i) / i
	}
	return r
}

func TestSymEigenKnownSpectra(t *testing.T) {
	type tc struct {
		name string
		a    []float64
		n    int
		want []float64
	}
	var cases []tc
	// Hypercube Q_d: eigenvalues d − 2k with multiplicity C(d, k)
	// (Christandl et al., PRL 92, 187902 (2004)).
	for _, d := range []int{3, 6, 8} {
		var want []float64
		for k := d; k >= 0; k-- {
			for range eigBinom(d, k) {
				want = append(want, float64(d-2*k))
			}
		}
		cases = append(cases, tc{"hypercube", eigHypercube(d), 1 << d, want})
	}
	// Cycle C_N: 2cos(2πk/N); path P_N: 2cos(πk/(N+1)), k = 1…N (common practice).
	for _, n := range []int{5, 64, 101, 300} {
		var wc, wp []float64
		for k := 0; k < n; k++ {
			wc = append(wc, 2*math.Cos(2*math.Pi*float64(k)/float64(n)))
			wp = append(wp, 2*math.Cos(math.Pi*float64(k+1)/float64(n+1)))
		}
		slices.Sort(wc)
		slices.Sort(wp)
		cases = append(cases, tc{"cycle", eigCycle(n, true), n, wc}, tc{"path", eigCycle(n, false), n, wp})
	}
	for _, c := range cases {
		orig := append([]float64(nil), c.a...)
		w, v, err := SymEigen(c.a, c.n, true)
		if err != nil {
			t.Fatal(err)
		}
		// 100·n·ε·‖A‖ with ‖A‖ ≤ 8 here (common practice).
		tol := 100 * float64(c.n) * 0x1p-52 * 8
		for k := range w {
			if math.Abs(w[k]-c.want[k]) > tol {
				t.Fatalf("%s n=%d: λ[%d] = %.17g, want %.17g", c.name, c.n, k, w[k], c.want[k])
			}
		}
		res, orth := eigSymResiduals(orig, c.n, w, v)
		if res > tol || orth > tol {
			t.Errorf("%s n=%d: residual %g orthogonality %g > %g", c.name, c.n, res, orth, tol)
		}
		// Values only must agree.
		w2, v2, err := SymEigen(append([]float64(nil), orig...), c.n, false)
		if err != nil || v2 != nil {
			t.Fatalf("%s values only: %v", c.name, err)
		}
		for k := range w2 {
			if math.Abs(w2[k]-c.want[k]) > tol {
				t.Fatalf("%s n=%d values only: λ[%d] = %g, want %g", c.name, c.n, k, w2[k], c.want[k])
			}
		}
	}
}

// TestSymEigenAgainstGonum compares the values with gonum v0.17.0 mat.EigenSym
// (implicit QL/QR) on seeded random matrices, including n = 500.
func TestSymEigenAgainstGonum(t *testing.T) {
	sizes := []int{2, 33, 65, 130, 500}
	if testing.Short() {
		sizes = sizes[:4]
	}
	for _, n := range sizes {
		a := eigRandSym(n, uint64(n))
		var es mat.EigenSym
		if !es.Factorize(mat.NewSymDense(n, append([]float64(nil), a...)), false) {
			t.Fatal("gonum failed")
		}
		want := es.Values(nil)
		orig := append([]float64(nil), a...)
		w, v, err := SymEigen(a, n, true)
		if err != nil {
			t.Fatal(err)
		}
		// 50·n·ε·‖A‖ with ‖A‖ ≤ n for entries in [−1, 1] (common practice).
		tol := 50 * float64(n) * 0x1p-52 * float64(n)
		for k := range w {
			if math.Abs(w[k]-want[k]) > tol {
				t.Fatalf("n=%d: λ[%d] = %g, gonum %g", n, k, w[k], want[k])
			}
		}
		if n == 500 {
			res, orth := eigSymResiduals(orig, n, w, v)
			if res > tol || orth > tol {
				t.Errorf("n=%d: residual %g orthogonality %g > %g", n, res, orth, tol)
			}
		}
	}
}

// TestTridiagEigenHard runs the divide-and-conquer solver on tridiagonal
// matrices that stress deflation and the secular equation.
func TestTridiagEigenHard(t *testing.T) {
	rnd := rand.New(rand.NewPCG(11, 3))
	type tc struct {
		name string
		d, e []float64
	}
	var cases []tc
	for _, n := range []int{33, 64, 200, 301} {
		d := make([]float64, n)
		e := make([]float64, n-1)
		// Wilkinson W⁺: d_i = |i − (n−1)/2|, e = 1; nearly degenerate pairs
		// (Wilkinson, The Algebraic Eigenvalue Problem (1965), from memory).
		for i := range d {
			d[i] = math.Abs(float64(i) - float64(n-1)/2)
		}
		for i := range e {
			e[i] = 1
		}
		cases = append(cases, tc{"wilkinson", d, e})
		// Glued: blocks coupled by tiny e (common practice for D&C tests).
		d2 := make([]float64, n)
		e2 := make([]float64, n-1)
		for i := range e2 {
			e2[i] = 1
			if i%10 == 9 {
				e2[i] = 1e-14
			}
		}
		cases = append(cases, tc{"glued", d2, e2})
		// Zero off-diagonals in places, repeated diagonal values.
		d3 := make([]float64, n)
		e3 := make([]float64, n-1)
		for i := range d3 {
			d3[i] = float64(i % 3)
		}
		for i := range e3 {
			if rnd.IntN(4) > 0 {
				e3[i] = rnd.Float64()
			}
		}
		cases = append(cases, tc{"sparse e", d3, e3})
		// Graded: entries spanning many orders of magnitude.
		d4 := make([]float64, n)
		e4 := make([]float64, n-1)
		for i := range d4 {
			d4[i] = math.Pow(10, -float64(i%12))
		}
		for i := range e4 {
			e4[i] = 0.5 * math.Pow(10, -float64(i%12))
		}
		cases = append(cases, tc{"graded", d4, e4})
	}
	for _, c := range cases {
		n := len(c.d)
		a := make([]float64, n*n)
		for i := 0; i < n; i++ {
			a[i*n+i] = c.d[i]
			if i+1 < n {
				a[i*n+i+1], a[(i+1)*n+i] = c.e[i], c.e[i]
			}
		}
		d := append([]float64(nil), c.d...)
		e := append([]float64(nil), c.e...)
		z := make([]float64, n*n)
		for i := range z {
			z[i] = math.NaN() // the solver must overwrite every entry
		}
		if !tridiagEigen(n, d, e, z, n) {
			t.Fatalf("%s n=%d: no convergence", c.name, n)
		}
		nrm := 0.0
		for i := range c.d {
			nrm = math.Max(nrm, math.Abs(c.d[i])+2*math.Abs(c.e[min(i, n-2)]))
		}
		// 50·n·ε·‖T‖ (common practice, after gonum mat/eigen_test.go).
		tol := 50 * float64(n) * 0x1p-52 * nrm
		res, orth := eigSymResiduals(a, n, d, z)
		if res > tol || orth > 50*float64(n)*0x1p-52 {
			t.Errorf("%s n=%d: residual %g orthogonality %g (tol %g)", c.name, n, res, orth, tol)
		}
		if !slices.IsSorted(d) {
			t.Errorf("%s: not ascending", c.name)
		}
	}
}

// TestSecularRootTinyWeights solves secular equations whose roots lie
// extremely close to the poles, where bisection alone would need hundreds of
// steps; the residual f(λ) must vanish to working precision.
func TestSecularRootTinyWeights(t *testing.T) {
	dl := []float64{-1, -0.5, 0, 0.25, 1}
	for _, wt := range []float64{1e-1, 1e-8, 1e-15, 1e-30, 1e-100} {
		w := []float64{wt, 1, wt, 1, wt}
		nrm := 0.0
		for _, v := range w {
			nrm += v * v
		}
		for i := range w {
			w[i] /= math.Sqrt(nrm)
		}
		rho := 0.7
		prev := math.Inf(-1)
		for i := range dl {
			o, tt, ok := secularRoot(i, dl, w, rho)
			if !ok {
				t.Fatalf("w=%g root %d: no convergence", wt, i)
			}
			lam := dl[o] + tt
			if lam < dl[i] || (i+1 < len(dl) && lam > dl[i+1]) || lam < prev {
				t.Fatalf("w=%g root %d = %g outside its interval", wt, i, lam)
			}
			prev = lam
			// f(λ) = 1 + ρΣ w_j²/(dl_j − λ) evaluated in shifted form; the
			// bound 1e-12·(1 + ρΣ|w_j²/δ_j|) is common practice.
			f, sa := 1.0, 1.0
			for j := range dl {
				v := rho * w[j] * w[j] / dcDelta(dl, j, o, tt)
				f += v
				sa += math.Abs(v)
			}
			if math.Abs(f) > 1e-12*sa {
				t.Errorf("w=%g root %d: f = %g (scale %g)", wt, i, f, sa)
			}
		}
	}
}
