package walk_test

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"strings"

	"github.com/ampwalk/ampwalk/walk"
)

// A row of 41 waveguides 10 µm apart with the exponential coupling law
// C(d) = 1.2·exp(−0.2·(d − 10)) cm⁻¹ (an invented chip), cut off below the
// next-nearest distance, walked over lengths in cm; then a measurement CSV
// with a bad row. The MSD is 2(C z)²·(10 µm)² (Childs, Farhi, Gutmann 2002,
// from memory): 72 and 288 µm² at 0.5 and 1 cm.
func ExampleServe_lab() {
	pos := make([]string, 41)
	for i := range pos {
		pos[i] = fmt.Sprintf("[%d,0]", 10*i)
	}
	row := `{"kind":"positions","positions":[` + strings.Join(pos, ",") +
		`],"law":{"type":"exponential","c0":1.2,"kappa":0.2,"d0":10},"cutoff":15}`
	in := strings.NewReader(`{"id":"z","lattice":` + row + `,"start":{"site":20},"times":[0.5,1],"units":{"coupling":"1/cm","reference":1.2}}
{"id":"m","lattice":` + row + `,"measurement":{"csv":"length,site,intensity\n0.5,0,x\n","start":20}}
`)
	var out bytes.Buffer
	if err := walk.Serve(context.Background(), in, &out, nil); err != nil {
		fmt.Println(err)
		return
	}
	for _, line := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var r struct {
			ID                 string
			Times              []float64
			TimeUnit           string    `json:"time_unit"`
			DimensionlessTimes []float64 `json:"dimensionless_times"`
			MSD                []float64
			Error              *walk.ErrorBody
		}
		if err := json.Unmarshal([]byte(line), &r); err != nil {
			fmt.Println(err)
			return
		}
		if r.Error != nil {
			fmt.Printf("%s: %s\n", r.ID, r.Error.Message)
			continue
		}
		for k, z := range r.Times {
			fmt.Printf("%s: z = %g %s, t = C_ref·z = %.2f, MSD = %.4f µm²\n", r.ID, z, r.TimeUnit, r.DimensionlessTimes[k], r.MSD[k])
		}
	}
	// Output:
	// z: z = 0.5 cm, t = C_ref·z = 0.60, MSD = 72.0000 µm²
	// z: z = 1 cm, t = C_ref·z = 1.20, MSD = 288.0000 µm²
	// m: measurement.csv line 2: intensity must be a finite number ≥ 0; got "x"
}
