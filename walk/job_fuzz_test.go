package walk

import (
	"encoding/json"
	"testing"
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
