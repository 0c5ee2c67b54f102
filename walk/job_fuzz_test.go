package walk

import (
	"context"
	"encoding/json"
	"math"
	"strings"
	"testing"
	"time"
)

// FuzzDecode checks that no input makes Decode panic, that every failure
// maps to one of the contract's error codes with a message, and that the
// error line encodes as JSON. The seed corpus in testdata/fuzz/FuzzDecode
// runs in every plain `go test`.
func FuzzDecode(f *testing.F) {
	for _, s := range []string{
		`{"id":"a","lattice":{"kind":"gasket","generation":6},"start":{"near":[0,0]},"times":[0.1,0.2,0.5,1.0],"report":["msd","return","populations"]}`,
		`{"id":"m1","series":{"times":[0.1,0.2],"values":[0.02,0.08],"errors":[0.001,0.002]},"report":["regimes"],"fit":{"segments":4}}`,
		`{"id":"s1","lattice":{"kind":"gasket","generation":5},"spectrum":{"eigenvalues":true,"dos":{"bins":200,"method":"kpm","moments":512},"ratio":true,"box_dimension":true}}`,
		`{"lattice":{"kind":"graph","sites":3,"bonds":[[0,1],[1,2,0.5]],"positions":[[0],[1],[2]]},"start":{"site":0},"times":{"from":0.1,"to":10,"count":5,"spacing":"log"}}`,
		`{"lattice":{"kind":"chain","sites":1e400},"start":{"site":0},"times":[1]}`,
		`{"lattice":{"kind":"square","width":3,"height":3},"start":{"site":4,"second":5},"times":[1],"disorder":{"onsite":1,"realisations":3,"seed":7},"report":["correlations"]}`,
		`{"a":`, `[]`, `null`, `"x"`, `{}`, `{"id":null}`, "\xff\xfe",
		// Lab workflow extensions (job_lab*.go).
		`{"lattice":{"kind":"positions","positions":[[0,0],[10,0],[20,0]],"law":{"type":"table","distance":[5,10,20],"coupling":[2,1,0.3],"clamp":true},"cutoff":15,"detuning":[0,0.1,0]},"start":{"site":1},"times":[1,2],"units":{"coupling":"meV","reference":20},"fabrication":{"jitter":0.2,"detuning":0.01,"law":"box","realisations":2,"seed":3}}`,
		`{"lattice":{"kind":"positions","positions":[[0],[1],[2]],"law":{"type":"exponential","c0":1,"kappa":1,"d0":1},"cutoff":1.5},"start":{"site":1},"plan":{"max_length":5,"samples":6,"points":8}}`,
		`{"lattice":{"kind":"chain","sites":3},"measurement":{"csv":"length,site,intensity\n1,0,1\n1,1,2\n1,2,1\n","start":1,"quantity":"spread"},"compare":true,"units":{"coupling":"1/cm","reference":1}}`,
	} {
		f.Add([]byte(s))
	}
	codes := map[string]bool{"invalid": true, "unknown-field": true, "too-large": true,
		"malformed": true, "numerical": true, "cancelled": true}
	f.Fuzz(func(t *testing.T, line []byte) {
		job, err := Decode(line)
		if job == nil {
			t.Fatal("Decode returned a nil job")
		}
		if err == nil {
			return
		}
		b := errorBody(err)
		if !codes[b.Code] {
			t.Fatalf("code %q is not a job-format code (%v)", b.Code, err)
		}
		if b.Message == "" {
			t.Fatalf("empty message for %v", err)
		}
		if _, err := json.Marshal(&Response{ID: job.ID, Error: b}); err != nil {
			t.Fatalf("error line does not encode: %v", err)
		}
	})
}

// FuzzRun runs small decoded jobs end to end and fails on any recovered
// internal failure (a panic turned into a "numerical" error) and on
// non-finite output, which Run must never produce.
func FuzzRun(f *testing.F) {
	for _, s := range []string{
		`{"lattice":{"kind":"gasket","generation":2},"start":{"near":[0,0]},"times":[0,0.5,1,2,3,4],"report":["msd","return","populations","spread","ipr","entropy","participation","polya","regimes","average"]}`,
		`{"lattice":{"kind":"square","width":3,"height":3},"start":{"site":4,"second":5,"statistics":"fermions"},"times":[1,2],"disorder":{"onsite":1,"bond":0.5,"realisations":3,"seed":7},"report":["correlations","msd"]}`,
		`{"lattice":{"kind":"graph","sites":3,"bonds":[[0,1,-2],[1,2]],"onsite":[1,0,-1]},"remove":[2],"start":{"site":0},"dynamics":"classical","times":{"from":0.1,"to":5,"count":8,"spacing":"log"},"report":["regimes","average"],"window":{"to":5,"samples":10}}`,
		`{"lattice":{"kind":"ring","sites":6},"spectrum":{"eigenvalues":true,"dos":{"bins":5,"method":"exact"},"ratio":true,"box_dimension":true}}`,
		`{"series":{"times":[1,2,3,4,5],"values":[1,4,9,16,25]}}`,
		`{"lattice":{"kind":"positions","positions":[[0,0],[10,0],[20,0],[30,0]],"law":{"type":"exponential","c0":1,"kappa":0.2,"d0":10},"cutoff":15,"detuning":[0,0.1,0,0]},"start":{"site":1},"times":[0.5,1,2,3,4],"report":["msd","regimes"],"units":{"coupling":"1/mm","reference":0.5},"fabrication":{"jitter":0.2,"realisations":2,"seed":3}}`,
		`{"lattice":{"kind":"chain","sites":3},"measurement":{"csv":"length,site,intensity,uncertainty\n0,0,0,0\n0,1,1,0.1\n0,2,0,0\n1,0,1,0.1\n1,1,2,0.1\n1,2,1,0.1\n","start":1},"compare":true}`,
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, line []byte) {
		j, err := Decode(line)
		if err != nil {
			return
		}
		// Keep the jobs small and short.
		if len(j.Times) > 20 || (len(j.Times) > 0 && j.Times[len(j.Times)-1] > 50) ||
			(j.Disorder != nil && j.Disorder.Realisations > 3) ||
			(j.Fabrication != nil && j.Fabrication.Realisations > 3) ||
			(j.Window != nil && (j.Window.Samples > 50 || j.Window.To > 50)) ||
			math.Abs(j.Hopping) > 10 {
			return
		}
		if j.Spectrum != nil && j.Spectrum.DOS != nil && (j.Spectrum.DOS.Moments > 256 || j.Spectrum.DOS.Vectors > 4) {
			return
		}
		if j.Series == nil {
			g, _, err := j.graph()
			if err != nil || g.Len() > 200 || g.NumBonds() > 2000 {
				return
			}
		}
		ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
		defer cancel()
		resp, err := j.Run(ctx, nil)
		if err != nil {
			if strings.Contains(err.Error(), "internal failure") {
				t.Fatalf("recovered internal failure: %v", err)
			}
			return
		}
		if name := resp.finite(); name != "" {
			t.Fatalf("non-finite %s", name)
		}
		if _, err := encodeLine(resp); err != nil {
			t.Fatalf("response does not encode: %v", err)
		}
	})
}
