package spectra

import (
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
)

func benchKPM(b *testing.B, g int, vectors int) {
	gr, err := lattice.Gasket(g)
	if err != nil {
		b.Fatal(err)
	}
	h := gr.Hamiltonian(1)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		if _, err := KPM(h, KPMSettings{Moments: 512, Vectors: vectors, Seed: 1, Bins: 200}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkKPMGasket10 is 88,575 sites, 512 moments, 10 vectors.
func BenchmarkKPMGasket10(b *testing.B) { benchKPM(b, 10, 10) }

// BenchmarkKPMGasket12 is 797,163 sites, 512 moments, 2 vectors.
func BenchmarkKPMGasket12(b *testing.B) { benchKPM(b, 12, 2) }

func BenchmarkEigenvaluesGasket6(b *testing.B) {
	g, err := lattice.Gasket(6)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for range b.N {
		if _, err := Eigenvalues(g, 1); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkBoxDimensionGasket10(b *testing.B) {
	g, err := lattice.Gasket(10)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for range b.N {
		if _, err := BoxDimension(g.Coords(), g.Dim(), nil); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSectorsTorus40(b *testing.B) {
	g, err := lattice.Square(40, 40, true)
	if err != nil {
		b.Fatal(err)
	}
	syms := SquareTranslations(40, 40)
	b.ReportAllocs()
	for range b.N {
		if _, err := Sectors(g, 1, syms, false); err != nil {
			b.Fatal(err)
		}
	}
}
