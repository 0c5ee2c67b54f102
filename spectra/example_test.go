package spectra_test

import (
	"fmt"
	"math"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/spectra"
)

// The spectrum of the Sierpinski gasket of generation 2 and its mean
// spacing ratio, with the many degeneracies counted and left out.
func ExampleEigenvalues() {
	g, err := lattice.Gasket(2)
	if err != nil {
		fmt.Println(err)
		return
	}
	v, err := spectra.Eigenvalues(g, 1)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d levels from %.4f to %.4f\n", len(v), v[0], v[len(v)-1])
	r := spectra.SpacingRatio(v, 1e-9)
	fmt.Printf("ratio pairs used %d, degenerate spacings %d\n", r.Used, r.Degenerate)
	// Output:
	// 15 levels from -2.0000 to 3.7785
	// ratio pairs used 7, degenerate spacings 6
}

// The density of states of a large periodic square lattice by the kernel
// polynomial method: per site, integrating to one over the bins.
func ExampleKPM() {
	g, err := lattice.Square(200, 200, true)
	if err != nil {
		fmt.Println(err)
		return
	}
	d, err := spectra.KPM(g.Hamiltonian(1), spectra.KPMSettings{Moments: 256, Vectors: 4, Seed: 1, Bins: 8})
	if err != nil {
		fmt.Println(err)
		return
	}
	var total float64
	for _, x := range d.Density {
		total += x * d.Width
	}
	fmt.Printf("bins %d, integral %.6f, spectrum inside [%.2f, %.2f]\n", len(d.Energy), total, d.Lo, d.Hi)
	// Output:
	// bins 8, integral 1.000000, spectrum inside [-4.02, 4.02]
}

// The box-counting dimension of the gasket's site positions.
func ExampleBoxDimension() {
	g, err := lattice.Gasket(8)
	if err != nil {
		fmt.Println(err)
		return
	}
	b, err := spectra.BoxDimension(g.Coords(), g.Dim(), nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("d = %.2f (ln3/ln2 = %.2f), boxes from %g to %g\n", b.Dimension, math.Log(3)/math.Log(2), b.Smallest, b.Largest)
	// Output:
	// d = 1.59 (ln3/ln2 = 1.58), boxes from 2 to 64
}

// The kagome bands at the centre of the Brillouin zone: the flat band at −2
// touches the lower dispersive band there.
func ExampleBands() {
	c := spectra.KagomeCell()
	p := [][]float64{c.Points["Γ"], c.Points["K"]}
	b, err := spectra.Bands(c, 1, p, 4)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, e := range b.Energy {
		r := func(x float64) float64 { return math.Round(x*1000)/1000 + 0 } // no "-0.000"
		fmt.Printf("%.3f: %6.3f %6.3f %6.3f\n", b.Distance[i], r(e[0]), r(e[1]), r(e[2]))
	}
	// Output:
	// 0.000: -2.000 -2.000  4.000
	// 0.524: -2.000 -1.732  3.732
	// 1.047: -2.000 -1.000  3.000
	// 1.571: -2.000  0.000  2.000
	// 2.094: -2.000  1.000  1.000
}

// Momentum sectors of a ring: one level 2cos(2πq/N) in each.
func ExampleSectors() {
	g, err := lattice.Chain(6, true)
	if err != nil {
		fmt.Println(err)
		return
	}
	secs, err := spectra.Sectors(g, 1, []spectra.Symmetry{spectra.Translation(6)}, false)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range secs {
		fmt.Printf("q=%d: %.3f\n", s.Label[0], s.Values[0])
	}
	// Output:
	// q=0: 2.000
	// q=1: 1.000
	// q=2: -1.000
	// q=3: -2.000
	// q=4: -1.000
	// q=5: 1.000
}

// The spectral dimension of the gasket from the lower edge of its Laplacian
// spectrum, against 2 ln3/ln5 ≈ 1.365.
func ExampleSpectralDimensionLevels() {
	g, err := lattice.Gasket(5)
	if err != nil {
		fmt.Println(err)
		return
	}
	lam, err := spectra.LaplacianEigenvalues(g, 1)
	if err != nil {
		fmt.Println(err)
		return
	}
	e, err := spectra.SpectralDimensionLevels(lam, 0.2)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("d_s = %.2f ± %.2f from %d steps (2 ln3/ln5 = %.3f)\n", e.Value, e.Error, e.Points, 2*math.Log(3)/math.Log(5))
	// Output:
	// d_s = 1.34 ± 0.03 from 31 steps (2 ln3/ln5 = 1.365)
}

// Dihedral sectors of a ring of 8: the mirror splits momentum 0 and 4, and
// the momenta ±q pair up (Copies = 2).
func ExampleDihedralSectors() {
	g, err := lattice.Chain(8, true)
	if err != nil {
		fmt.Println(err)
		return
	}
	secs, err := spectra.DihedralSectors(g, 1, []spectra.Symmetry{spectra.Translation(8)}, spectra.Reflection(8), false)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range secs {
		e := math.Round(s.Values[0]*1000)/1000 + 0 // no "-0.000"
		fmt.Printf("q=%d parity %+d copies %d: %.3f\n", s.Label[0], s.Parity, s.Copies, e)
	}
	// Output:
	// q=0 parity +1 copies 1: 2.000
	// q=1 parity +0 copies 2: 1.414
	// q=2 parity +0 copies 2: 0.000
	// q=3 parity +0 copies 2: -1.414
	// q=4 parity -1 copies 1: -2.000
}
