package measure_test

import (
	"fmt"
	"strings"

	"github.com/ampwalk/ampwalk/observables/measure"
)

// Three waveguides in a row, light injected in the middle, intensities read
// at two lengths (mm) with their uncertainties. At 5 mm the MSD error is
// √(Σ σ_k² (r_k² − MSD)²)/Σ I = √(1·0.64 + 4·0.04 + 1·0.64)/100 = 0.012.
func Example() {
	csv := `length,site,intensity,uncertainty
5,0,10,1
5,1,80,2
5,2,10,1
10,0,30,1
10,1,40,2
10,2,30,1
`
	m, err := measure.ReadCSV(strings.NewReader(csv), 3)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := measure.Reduce(m, measure.Geometry{Coords: []float64{-1, 0, 1}, Dim: 1, Start: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range r.Points {
		fmt.Printf("z = %g mm: MSD = %.3f ± %.3f, IPR = %.3f\n", p.Length, p.MSD, p.MSDErr, p.IPR)
	}
	// Output:
	// z = 5 mm: MSD = 0.200 ± 0.012, IPR = 0.660
	// z = 10 mm: MSD = 0.600 ± 0.013, IPR = 0.340
}
