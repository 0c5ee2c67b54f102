package observables

import (
	"math/rand/v2"
	"testing"
)

func benchmarkMSD(b *testing.B, n int) {
	rng := rand.New(rand.NewPCG(1, 1))
	p := make([]float64, n)
	coords := make([]float64, 2*n)
	for i := range p {
		p[i] = rng.Float64() / float64(n)
		coords[2*i], coords[2*i+1] = rng.Float64()*1000, rng.Float64()*1000
	}
	origin := []float64{0, 0}
	b.ReportAllocs()
	b.SetBytes(int64(24 * n))
	for b.Loop() {
		MSD(p, coords, 2, origin)
	}
}

func BenchmarkMSD1e6(b *testing.B) { benchmarkMSD(b, 1_000_000) }

func benchmarkSpread(b *testing.B, n int) {
	rng := rand.New(rand.NewPCG(1, 1))
	p := make([]float64, n)
	coords := make([]float64, 2*n)
	for i := range p {
		p[i] = rng.Float64() / float64(n)
		coords[2*i], coords[2*i+1] = rng.Float64()*1000, rng.Float64()*1000
	}
	b.ReportAllocs()
	for b.Loop() {
		Spread(p, coords, 2)
	}
}

func BenchmarkSpread1e6(b *testing.B) { benchmarkSpread(b, 1_000_000) }

func benchmarkFitRegimes(b *testing.B, n int, breaks []float64, alpha []float64) {
	rng := rand.New(rand.NewPCG(1, 1))
	ts, ys := brokenPowerLaw(rng, n, 0.01, 1e4, 1, alpha, breaks, 0.02)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := FitRegimes(ts, ys, nil, RegimeSettings{Seed: 1}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkFitRegimes60(b *testing.B) {
	benchmarkFitRegimes(b, 60, []float64{1, 100}, []float64{2, 1, 0})
}

func BenchmarkFitRegimes1000(b *testing.B) {
	benchmarkFitRegimes(b, 1000, []float64{1, 100}, []float64{2, 1, 0})
}
