package walk_test

import (
	"context"
	"fmt"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/walk"
)

// A quantum walk on a chain started in the middle: the return and
// nearest-neighbour probabilities at t = 1 are J_0(2)² and J_1(2)².
func ExampleQuantumWalk() {
	g, err := lattice.Chain(101, false)
	if err != nil {
		fmt.Println(err)
		return
	}
	psi0 := make([]complex128, g.Len())
	psi0[50] = 1
	prob := func(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }
	d, err := walk.QuantumWalk(context.Background(), g, 1, psi0, []float64{1}, walk.Settings{Method: walk.Chebyshev},
		func(k int, t float64, psi []complex128) error {
			fmt.Printf("t=%g  p0=%.10f  p1=%.10f\n", t, prob(psi[50]), prob(psi[51]))
			return nil
		})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("method:", d.Method, " error below 1e-10:", d.ErrorBound < 1e-10)
	// Output:
	// t=1  p0=0.0501270810  p1=0.3326115039
	// method: chebyshev  error below 1e-10: true
}

// The classical random walk on the same chain: p_n(t) = e^{−2t} I_n(2t), and
// Σp stays 1.
func ExampleClassicalWalk() {
	g, err := lattice.Chain(101, false)
	if err != nil {
		fmt.Println(err)
		return
	}
	p0 := make([]float64, g.Len())
	p0[50] = 1
	_, err = walk.ClassicalWalk(context.Background(), g, 1, p0, []float64{0.5, 2}, walk.Settings{},
		func(k int, t float64, p []complex128) error {
			var sum float64
			for _, v := range p {
				sum += real(v)
			}
			fmt.Printf("t=%g  p0=%.8f  sum=%.8f\n", t, real(p[50]), sum)
			return nil
		})
	if err != nil {
		fmt.Println(err)
	}
	// Output:
	// t=0.5  p0=0.46575961  sum=1.00000000
	// t=2  p0=0.20700192  sum=1.00000000
}
