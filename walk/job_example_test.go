package walk_test

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"os"
	"strings"

	"github.com/ampwalk/ampwalk/walk"
)

// Serve answers one JSON line per request line, in order; a bad line gets
// an error line and the loop goes on. (The gasket values were checked
// against an independent Taylor-series propagation in plain Python.)
func ExampleServe() {
	in := strings.NewReader(`{"id":"g","lattice":{"kind":"gasket","generation":3},"start":{"near":[0,0]},"times":[0,1]}
{"id":"typo","lattice":{"kind":"gasket","generaton":3},"start":{"site":0},"times":[1]}
`)
	var out bytes.Buffer
	if err := walk.Serve(context.Background(), in, &out, nil); err != nil {
		fmt.Println(err)
		return
	}
	for _, line := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var r struct {
			ID     string
			Sites  int
			Bonds  int
			MSD    []float64
			Return []float64
			Error  *walk.ErrorBody
		}
		if err := json.Unmarshal([]byte(line), &r); err != nil {
			fmt.Println(err)
			return
		}
		if r.Error != nil {
			fmt.Printf("%s: %s %s\n", r.ID, r.Error.Code, r.Error.Field)
			continue
		}
		fmt.Printf("%s: %d sites, %d bonds, msd(1) = %.6f, return(1) = %.6f\n", r.ID, r.Sites, r.Bonds, r.MSD[1], r.Return[1])
	}
	// Output:
	// g: 42 sites, 81 bonds, msd(1) = 2.474997, return(1) = 0.157523
	// typo: unknown-field lattice.generaton
}

// A Go program can decode a request line and run it without the bridge.
func ExampleDecode() {
	job, err := walk.Decode([]byte(`{"lattice":{"kind":"chain","sites":101},"start":{"site":50},"times":{"from":1,"to":4,"count":4}}`))
	if err != nil {
		fmt.Println(err)
		return
	}
	resp, err := job.Run(context.Background(), os.Stderr)
	if err != nil {
		fmt.Println(err)
		return
	}
	for k, t := range resp.Times {
		// On a long chain MSD = 2t² (Childs, Farhi, Gutmann 2002).
		fmt.Printf("t = %g: msd %.6f\n", t, resp.MSD[k])
	}
	// Output:
	// t = 1: msd 2.000000
	// t = 2: msd 8.000000
	// t = 3: msd 18.000000
	// t = 4: msd 32.000000
}
