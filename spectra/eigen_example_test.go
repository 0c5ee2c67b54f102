package spectra_test

import (
	"fmt"
	"math"

	"github.com/ampwalk/ampwalk/spectra"
)

// The path of four sites: eigenvalues 2cos(πk/5), k = 1…4.
func ExampleSymEigen() {
	n := 4
	a := make([]float64, n*n)
	for i := 0; i+1 < n; i++ {
		a[i*n+i+1], a[(i+1)*n+i] = 1, 1
	}
	values, vecs, err := spectra.SymEigen(a, n, true)
	if err != nil {
		fmt.Println(err)
		return
	}
	for k, v := range values {
		// Column k of vecs is the eigenvector; fix its sign by component 0.
		s := math.Copysign(1, vecs[0*n+k])
		fmt.Printf("λ = %+.4f  v = [%+.3f %+.3f %+.3f %+.3f]\n", v,
			s*vecs[0*n+k], s*vecs[1*n+k], s*vecs[2*n+k], s*vecs[3*n+k])
	}
	// Output:
	// λ = -1.6180  v = [+0.372 -0.602 +0.602 -0.372]
	// λ = -0.6180  v = [+0.602 -0.372 -0.372 +0.602]
	// λ = +0.6180  v = [+0.602 +0.372 -0.372 -0.602]
	// λ = +1.6180  v = [+0.372 +0.602 +0.602 +0.372]
}

// A ring of three sites threaded by a flux φ = π/3: the hopping phase
// e^{iφ/3} on each bond shifts the eigenvalues to 2cos((2πk + φ)/3).
func ExampleHermEigen() {
	n := 3
	h := complex(math.Cos(math.Pi/9), math.Sin(math.Pi/9))
	a := make([]complex128, n*n)
	for i := 0; i < n; i++ {
		j := (i + 1) % n
		a[j*n+i] = h
		a[i*n+j] = complex(real(h), -imag(h))
	}
	values, _, err := spectra.HermEigen(a, n, false)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f\n", values)
	// Output:
	// [-1.5321 -0.3473 1.8794]
}

// Input errors name the field and say what was received.
func ExampleSymEigen_error() {
	_, _, err := spectra.SymEigen([]float64{1, 2, 3, 4}, 2, false)
	fmt.Println(err)
	// Output:
	// matrix: must be symmetric within 1e-10·max|a| = 4e-10; got a[1][0] = 3, a[0][1] = 2
}
