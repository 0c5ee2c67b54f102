package plan_test

import (
	"context"
	"fmt"
	"os"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/walk/plan"
)

// Plan twelve samples of a 41-waveguide straight array at 15 µm pitch, up to
// 12 cm long, written with 0.3 µm positional tolerance. The coupling law is
// a prediction (demo values); calibrate it on the real device.
func ExampleMake() {
	pos := make([]float64, 41)
	for i := range pos {
		pos[i] = 15 * float64(i)
	}
	pl, err := plan.Make(context.Background(), plan.Request{
		Positions: pos, Dim: 1, Start: 20, Cutoff: 20,
		Law:       lattice.Exponential{C0: 1.5, Kappa: 0.2, D0: 15},
		MaxLength: 12, MinLength: 0.2, Samples: 12,
		Fabrication: lattice.Fabrication{Jitter: 0.3, Law: lattice.Gauss},
		Seed:        1, Precision: 0.05, Noise: 0.03,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range pl.Regimes {
		fmt.Printf("%s from %.3g to %.3g cm: %d samples, exponent ± %.2g\n", r.Kind, r.From, r.To, r.Samples, r.PredictedError)
	}
	pl.WriteCSV(os.Stdout)
	fmt.Println(pl.Rationale)
}
