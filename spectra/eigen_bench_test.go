package spectra

import (
	"math/rand/v2"
	"testing"
)

// eigBondMatrix is the benchmark matrix of benchdata/eighbench: n sites,
// about four random bonds per site with weights in [0.5, 1.5), on-site
// energies in [−1, 1).
func eigBondMatrix(n int, seed uint64) []float64 {
	rnd := rand.New(rand.NewPCG(seed, 1))
	a := make([]float64, n*n)
	for i := 0; i < n; i++ {
		a[i*n+i] = 2*rnd.Float64() - 1
	}
	for b := 0; b < 2*n; b++ {
		i, j := rnd.IntN(n), rnd.IntN(n)
		if i == j {
			continue
		}
		w := 0.5 + rnd.Float64()
		a[i*n+j] += w
		a[j*n+i] += w
	}
	return a
}

func BenchmarkSymEigen500(b *testing.B)  { benchSymEigen(b, 500, true) }
func BenchmarkSymEigen1000(b *testing.B) { benchSymEigen(b, 1000, true) }
func BenchmarkSymEigen3000(b *testing.B) { benchSymEigen(b, 3000, true) }

func BenchmarkSymEigenValues1000(b *testing.B) { benchSymEigen(b, 1000, false) }

func BenchmarkHermEigen500(b *testing.B) { benchHermEigen(b, 500) }

func benchSymEigen(b *testing.B, n int, vectors bool) {
	a0 := eigBondMatrix(n, 1)
	a := make([]float64, n*n)
	b.ReportAllocs()
	for b.Loop() {
		copy(a, a0)
		if _, _, err := SymEigen(a, n, vectors); err != nil {
			b.Fatal(err)
		}
	}
}

func benchHermEigen(b *testing.B, n int) {
	a0 := eigRandHerm(n, 1)
	a := make([]complex128, n*n)
	b.ReportAllocs()
	for b.Loop() {
		copy(a, a0)
		if _, _, err := HermEigen(a, n, true); err != nil {
			b.Fatal(err)
		}
	}
}
