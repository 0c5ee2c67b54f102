package lattice_test

import (
	"fmt"

	"github.com/ampwalk/ampwalk/lattice"
)

// A waveguide triangle (sides 15, 15.44, 15.44 µm) measured under a microscope (positions in µm) with
// the exponential coupling law: C(d) = 1.5 cm⁻¹ · exp(−0.2 µm⁻¹ (d − 15 µm)).
// Weights are in cm⁻¹, so a walk with hopping 1 runs in propagation length
// (cm); Scale gives the dimensionless time C_ref·z.
func ExampleFromPositions() {
	pos := []float64{0, 0, 15, 0, 7.5, 13.5}
	law := lattice.Exponential{C0: 1.5, Kappa: 0.2, D0: 15}
	g, err := lattice.FromPositions(pos, 2, law, 20, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		fmt.Printf("%d–%d: %.4f /cm\n", b.I, b.J, b.W)
	}
	s, _ := lattice.NewScale(1.5, lattice.PerCentimetre)
	fmt.Printf("z = 4 cm is t = %g\n", s.Time(4))
	// Output:
	// 0–1: 1.5000 /cm
	// 0–2: 1.3727 /cm
	// 1–2: 1.3727 /cm
	// z = 4 cm is t = 6
}
