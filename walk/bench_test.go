package walk_test

import (
	"context"
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/walk"
)

// The propagation benchmarks of benchdata/RESULTS.md: a quantum walk on the
// Sierpinski gasket from the corner (0, 0), Chebyshev method, tolerance
// 1e-10, log-spaced reported times, the MSD reduced at every time. Each
// reports the matrix–vector products per run beside a·t_max (a = 3: the
// gasket's adjacency spectrum is [−2, 4]; Domany, Alexander, Bensimon &
// Kadanoff, Phys. Rev. B 28, 3110 (1983), from memory).

func benchPropagate(b *testing.B, gen int, tmax float64, count int, workers int) {
	g, err := lattice.Gasket(gen)
	if err != nil {
		b.Fatal(err)
	}
	n := g.Len()
	times := make([]float64, count)
	for k := range times {
		times[k] = 0.1 * math.Pow(tmax/0.1, float64(k)/float64(count-1))
	}
	pos := g.Coords()
	psi0 := make([]complex128, n)
	psi0[0] = 1 // site 0 is the corner (0, 0) (lattice.Gasket's site order)
	msd := make([]float64, count)
	s := walk.Settings{Method: walk.Chebyshev, Tolerance: 1e-10, Workers: workers}
	visit := func(k int, t float64, psi []complex128) error {
		var m float64
		for i, v := range psi {
			x, y := pos[2*i], pos[2*i+1]
			m += (real(v)*real(v) + imag(v)*imag(v)) * (x*x + y*y)
		}
		msd[k] = m
		return nil
	}
	b.ReportAllocs()
	b.ResetTimer()
	var products int
	for range b.N {
		d, err := walk.QuantumWalk(context.Background(), g, 1, psi0, times, s, visit)
		if err != nil {
			b.Fatal(err)
		}
		products = d.Products
	}
	b.ReportMetric(float64(products), "products/op")
	b.ReportMetric(float64(products)/(3*tmax), "products/(a·tmax)")
}

// Generation 8 and 10: 60 log-spaced times 0.1…500 (benchdata/jobs.jsonl).
func BenchmarkPropagateGasket8(b *testing.B)  { benchPropagate(b, 8, 500, 60, 0) }
func BenchmarkPropagateGasket10(b *testing.B) { benchPropagate(b, 10, 500, 60, 0) }

// Generation 12: 30 log-spaced times 0.1…100.
func BenchmarkPropagateGasket12(b *testing.B) { benchPropagate(b, 12, 100, 30, 0) }

// BenchmarkPropagateGasket10Serial is generation 10 on one worker.
func BenchmarkPropagateGasket10Serial(b *testing.B) { benchPropagate(b, 10, 500, 60, 1) }

// BenchmarkClassicalGasket10 is the classical walk dp/dt = −Lp on
// generation 10 from the same corner, 60 log-spaced times 0.1…500,
// Chebyshev, tolerance 1e-10 (grouped expansions on real vectors).
func BenchmarkClassicalGasket10(b *testing.B) {
	g, err := lattice.Gasket(10)
	if err != nil {
		b.Fatal(err)
	}
	times := make([]float64, 60)
	for k := range times {
		times[k] = 0.1 * math.Pow(5000, float64(k)/59)
	}
	p0 := make([]float64, g.Len())
	p0[0] = 1
	s := walk.Settings{Method: walk.Chebyshev, Tolerance: 1e-10}
	b.ReportAllocs()
	b.ResetTimer()
	var products int
	for range b.N {
		d, err := walk.ClassicalWalk(context.Background(), g, 1, p0, times, s, nil)
		if err != nil {
			b.Fatal(err)
		}
		products = d.Products
	}
	b.ReportMetric(float64(products), "products/op")
}
