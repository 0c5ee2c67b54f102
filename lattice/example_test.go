package lattice_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/ampwalk/ampwalk/lattice"
)

func ExampleGasket() {
	g, err := lattice.Gasket(2)
	if err != nil {
		fmt.Println(err)
		return
	}
	c, _ := lattice.GasketCorners(2)
	fmt.Println(g.Len(), "sites,", g.NumBonds(), "bonds, corners", c)
	for _, i := range c {
		fmt.Printf("site %d at %.3f\n", i, g.Pos(nil, i))
	}
	// Output:
	// 15 sites, 27 bonds, corners [0 8 14]
	// site 0 at [0.000 0.000]
	// site 8 at [4.000 0.000]
	// site 14 at [2.000 3.464]
}

func ExampleGraph_Remove() {
	g, _ := lattice.Square(3, 3, false)
	h, kept, err := g.Remove([]int{4}) // a vacancy at the centre
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(h.Len(), h.NumBonds(), kept)
	_, _, err = g.Remove([]int{9})
	fmt.Println(err)
	// Output:
	// 8 8 [0 1 2 3 5 6 7 8]
	// remove: site indices must be between 0 and 8; entry 0 is 9
}

func ExampleGraph_WithDisorder() {
	g, _ := lattice.Chain(4, false)
	rng := rand.New(rand.NewPCG(1, 0)) // realisation 0 of seed 1
	h, err := g.WithDisorder(lattice.Disorder{Onsite: 1, Law: lattice.Box}, rng)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i := 0; i < h.Len(); i++ {
		e := h.Onsite(i)
		fmt.Println(e >= -0.5 && e <= 0.5)
	}
	// Output:
	// true
	// true
	// true
	// true
}

func ExampleGraph_WithFlux() {
	g, _ := lattice.Square(2, 2, false)
	h, err := g.WithFlux(0.25) // a quarter flux quantum per plaquette
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(g.IsReal(), h.IsReal())
	c, _ := lattice.Cubic(2, 2, 2, false)
	_, err = c.WithFlux(0.25)
	fmt.Println(err)
	// Output:
	// true false
	// flux: needs positions in 2 dimensions; the lattice has 3
}
