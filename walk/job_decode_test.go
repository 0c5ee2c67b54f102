package walk

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The expected codes and fields below are fixed by the job-format contract
// (../shared/spec/job-format.md) and the extensions in job_doc.go.

func TestDecodeErrors(t *testing.T) {
	cases := []struct {
		name, line, code, field string
	}{
		{"not json", `{"id": "a", `, "malformed", ""},
		{"garbage", `hello`, "malformed", ""},
		{"not an object", `[1, 2]`, "malformed", ""},
		{"top-level typo", `{"id":"a","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"tolrance":1}`, "unknown-field", "tolrance"},
		{"nested typo", `{"id":"a","lattice":{"kind":"gasket","generaton":3},"start":{"site":0},"times":[1]}`, "unknown-field", "lattice.generaton"},
		{"kind does not take", `{"lattice":{"kind":"gasket","generation":3,"sites":4},"start":{"site":0},"times":[1]}`, "unknown-field", "lattice.sites"},
		{"start typo", `{"lattice":{"kind":"chain","sites":3},"start":{"sight":0},"times":[1]}`, "unknown-field", "start.sight"},
		{"disorder typo", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"disorder":{"onsit":1}}`, "unknown-field", "disorder.onsit"},
		{"times range typo", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":{"from":0,"to":1,"cnt":3}}`, "unknown-field", "times.cnt"},
		{"unknown kind", `{"lattice":{"kind":"hexagon"},"start":{"site":0},"times":[1]}`, "invalid", "lattice.kind"},
		{"missing lattice", `{"start":{"site":0},"times":[1]}`, "invalid", "lattice"},
		{"missing start", `{"lattice":{"kind":"chain","sites":3},"times":[1]}`, "invalid", "start"},
		{"missing times", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0}}`, "invalid", "times"},
		{"fractional integer", `{"lattice":{"kind":"gasket","generation":2.5},"start":{"site":0},"times":[1]}`, "invalid", "lattice.generation"},
		{"string integer", `{"lattice":{"kind":"gasket","generation":"3"},"start":{"site":0},"times":[1]}`, "invalid", "lattice.generation"},
		{"negative time", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[0,1,2,-3]}`, "invalid", "times[3]"},
		{"decreasing time", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[0,1,2,1.5]}`, "invalid", "times[3]"},
		{"string time", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[0,"x"]}`, "invalid", "times[1]"},
		{"near not numbers", `{"lattice":{"kind":"chain","sites":3},"start":{"near":[0,"y"]},"times":[1]}`, "invalid", "start.near[1]"},
		{"site and near", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0,"near":[0,0]},"times":[1]}`, "invalid", "start"},
		{"log from zero", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":{"from":0,"to":1,"count":3,"spacing":"log"}}`, "invalid", "times.from"},
		{"bad dynamics", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"dynamics":"quantom"}`, "invalid", "dynamics"},
		{"bad method", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"method":"rk4"}`, "invalid", "method"},
		{"bad report", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"report":["msd","velocity"]}`, "invalid", "report[1]"},
		{"tolerance zero", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"tolerance":0}`, "invalid", "tolerance"},
		{"id number", `{"id": 7, "lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1]}`, "invalid", "id"},
		{"hopping string", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"hopping":"1"}`, "invalid", "hopping"},
		{"periodic number", `{"lattice":{"kind":"chain","sites":3,"periodic":1},"start":{"site":0},"times":[1]}`, "invalid", "lattice.periodic"},
		{"carpet variant", `{"lattice":{"kind":"carpet","generation":1,"variant":"edges"},"start":{"site":0},"times":[1]}`, "invalid", "lattice.variant"},
		{"graph bond", `{"lattice":{"kind":"graph","sites":3,"bonds":[[0,1],[1,3]]},"start":{"site":0},"times":[1]}`, "invalid", "lattice.bonds[1]"},
		{"graph self bond", `{"lattice":{"kind":"graph","sites":3,"bonds":[[0,1],[2,2]]},"start":{"site":0},"times":[1]}`, "invalid", "lattice.bonds[1]"},
		{"graph positions dims", `{"lattice":{"kind":"graph","sites":2,"bonds":[[0,1]],"positions":[[0,0],[1]]},"start":{"site":0},"times":[1]}`, "invalid", "lattice.positions[1]"},
		{"graph onsite length", `{"lattice":{"kind":"graph","sites":2,"onsite":[1]},"start":{"site":0},"times":[1]}`, "invalid", "lattice.onsite"},
		{"graph unknown", `{"lattice":{"kind":"graph","sites":2,"weights":[1]},"start":{"site":0},"times":[1]}`, "unknown-field", "lattice.weights"},
		{"disorder law", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"disorder":{"onsite":1,"law":"cauchy"}}`, "invalid", "disorder.law"},
		{"disorder negative", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"disorder":{"onsite":-1}}`, "invalid", "disorder.onsite"},
		{"disorder realisations", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"disorder":{"realisations":0}}`, "invalid", "disorder.realisations"},
		{"fit quantity", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"fit":{"quantity":"ipr"}}`, "invalid", "fit.quantity"},
		{"fit typo", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"fit":{"segs":2}}`, "unknown-field", "fit.segs"},
		{"series negative value", `{"series":{"times":[1,2,3],"values":[1,-2,3]}}`, "invalid", "series.values[1]"},
		{"series not increasing", `{"series":{"times":[1,2,2],"values":[1,2,3]}}`, "invalid", "series.times[2]"},
		{"series zero time", `{"series":{"times":[0,2,3],"values":[1,2,3]}}`, "invalid", "series.times[0]"},
		{"series with lattice", `{"series":{"times":[1,2],"values":[1,2]},"lattice":{"kind":"chain","sites":3}}`, "invalid", "lattice"},
		{"series typo", `{"series":{"times":[1,2],"valus":[1,2]}}`, "unknown-field", "series.valus"},
		{"spectrum typo", `{"lattice":{"kind":"chain","sites":3},"spectrum":{"eigenvalue":true}}`, "unknown-field", "spectrum.eigenvalue"},
		{"spectrum with start", `{"lattice":{"kind":"chain","sites":3},"spectrum":{"eigenvalues":true},"start":{"site":0}}`, "invalid", "start"},
		{"spectrum dos method", `{"lattice":{"kind":"chain","sites":3},"spectrum":{"dos":{"method":"lanczos"}}}`, "invalid", "spectrum.dos.method"},
		{"duplicate key", `{"lattice":{"kind":"chain","sites":3,"sites":4},"start":{"site":0},"times":[1]}`, "invalid", "lattice.sites"},
		{"correlations without second", `{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"report":["correlations"]}`, "invalid", "start.second"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Decode([]byte(c.line))
			require.Error(t, err)
			b := errorBody(err)
			assert.Equal(t, c.code, b.Code, b.Message)
			assert.Equal(t, c.field, b.Field, b.Message)
			assert.NotEmpty(t, b.Message)
		})
	}
}

func TestDecodeDefaults(t *testing.T) {
	// Defaults fixed by the contract: hopping 1, dynamics quantum,
	// tolerance 1e-10, method auto, report ["msd", "return"], id "".
	j, err := Decode([]byte(`{"lattice":{"kind":"gasket","generation":2},"start":{"near":[0,0]},"times":[0.5,1]}`))
	require.NoError(t, err)
	assert.Equal(t, "", j.ID)
	assert.Equal(t, 1.0, j.Hopping)
	assert.Equal(t, Quantum, j.Dynamics)
	assert.Equal(t, 1e-10, j.Tolerance)
	assert.Equal(t, Auto, j.Method)
	assert.Equal(t, []string{"msd", "return"}, j.Report)
	assert.Equal(t, []float64{0.5, 1}, j.Times)
	assert.Equal(t, "gasket", j.Lattice.Kind)
	assert.Equal(t, 2, j.Lattice.Generation)
	assert.Equal(t, []float64{0, 0}, j.Start.Near)
	// Extension defaults (job_doc.go): fit msd, up to 4 segments.
	assert.Equal(t, FitSpec{Quantity: "msd", Segments: 4}, j.Fit)
	assert.Nil(t, j.Disorder)

	// Integral JSON numbers are accepted for integer fields.
	j, err = Decode([]byte(`{"id":"x","lattice":{"kind":"chain","sites":1e1,"periodic":true},"start":{"site":2.0},"times":[1]}`))
	require.NoError(t, err)
	assert.Equal(t, 10, j.Lattice.Sites)
	assert.True(t, j.Lattice.Periodic)
	assert.Equal(t, 2, j.Start.Site)

	// null means "use the default".
	j, err = Decode([]byte(`{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"hopping":null}`))
	require.NoError(t, err)
	assert.Equal(t, 1.0, j.Hopping)
}

func TestDecodeTimesRange(t *testing.T) {
	cases := []struct {
		line string
		want []float64
	}{
		{`{"from":0,"to":1,"count":5,"spacing":"linear"}`, []float64{0, 0.25, 0.5, 0.75, 1}},
		{`{"from":0,"to":1,"count":5}`, []float64{0, 0.25, 0.5, 0.75, 1}},
		{`{"from":0.01,"to":100,"count":5,"spacing":"log"}`, []float64{0.01, 0.1, 1, 10, 100}},
		{`{"from":2,"to":2,"count":1}`, []float64{2}},
		{`{"from":1,"to":8,"count":4,"spacing":"log"}`, []float64{1, 2, 4, 8}},
	}
	for _, c := range cases {
		j, err := Decode([]byte(`{"lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":` + c.line + `}`))
		require.NoError(t, err, c.line)
		require.Len(t, j.Times, len(c.want))
		for k := range c.want {
			// Geometric points a·(b/a)^(k/(n−1)) agree with the decimal
			// values to a few ulps (common practice).
			assert.InDelta(t, c.want[k], j.Times[k], 1e-12*math.Max(1, c.want[k]), c.line)
		}
		// The end points are exact.
		assert.Equal(t, c.want[0], j.Times[0])
		assert.Equal(t, c.want[len(c.want)-1], j.Times[len(j.Times)-1])
	}
}

func TestDecodeIDEchoedOnError(t *testing.T) {
	j, err := Decode([]byte(`{"id":"keep-me","lattice":{"kind":"gasket","generaton":3}}`))
	require.Error(t, err)
	assert.Equal(t, "keep-me", j.ID)
}

func TestDecodeExtensions(t *testing.T) {
	j, err := Decode([]byte(`{"id":"d","lattice":{"kind":"square","width":4,"height":3},"start":{"site":5,"second":6,"statistics":"fermions"},
		"times":[1],"remove":[0,11],"disorder":{"onsite":0.5,"bond":0.1,"law":"gauss","realisations":8,"seed":18446744073709551615,"first":3},
		"fit":{"quantity":"spread","from":0.5,"to":2,"segments":2},"window":{"to":50},"report":["spread","regimes","average","correlations"]}`))
	require.NoError(t, err)
	assert.Equal(t, []int{0, 11}, j.Remove)
	assert.Equal(t, &DisorderSpec{Onsite: 0.5, Bond: 0.1, Law: "gauss", Realisations: 8, Seed: math.MaxUint64, First: 3}, j.Disorder)
	assert.Equal(t, FitSpec{Quantity: "spread", From: 0.5, To: 2, Segments: 2}, j.Fit)
	assert.Equal(t, &WindowSpec{To: 50, Samples: 200}, j.Window)
	assert.Equal(t, 6, j.Start.Second)
	assert.Equal(t, "fermions", j.Start.Statistics)

	j, err = Decode([]byte(`{"lattice":{"kind":"graph","sites":3,"bonds":[[0,1],[1,2,0.5]],"positions":[[0,0,0],[1,0,0],[1,1,0]],"onsite":[0,1,2]},"start":{"site":0},"times":[1]}`))
	require.NoError(t, err)
	assert.Equal(t, 3, j.Lattice.Dim)
	assert.Len(t, j.Lattice.Bonds, 2)
	assert.Equal(t, 0.5, j.Lattice.Bonds[1].W)
	assert.Equal(t, 1.0, j.Lattice.Bonds[0].W)
	assert.Equal(t, []float64{0, 1, 2}, j.Lattice.Onsite)

	j, err = Decode([]byte(`{"id":"m1","series":{"times":[0.1,0.2,0.4],"values":[0.02,0.08,0.3],"errors":[0.001,0.001,0.002]},"report":["regimes"],"fit":{"segments":2}}`))
	require.NoError(t, err)
	require.NotNil(t, j.Series)
	assert.Equal(t, 2, j.Fit.Segments)

	j, err = Decode([]byte(`{"id":"s1","lattice":{"kind":"gasket","generation":3},"spectrum":{"eigenvalues":true,"dos":{"bins":20,"method":"exact"},"ratio":true,"box_dimension":true}}`))
	require.NoError(t, err)
	require.NotNil(t, j.Spectrum)
	assert.Equal(t, &DOSSpec{Bins: 20, Method: "exact", Moments: 512, Vectors: 10}, j.Spectrum.DOS)
}

// kindExamples holds a small valid lattice object of every kind.
var kindExamples = map[string]string{
	"chain":      `{"kind":"chain","sites":5,"periodic":true}`,
	"square":     `{"kind":"square","width":3,"height":2,"periodic":false}`,
	"triangle":   `{"kind":"triangle","side":3}`,
	"gasket":     `{"kind":"gasket","generation":2}`,
	"carpet":     `{"kind":"carpet","generation":1,"variant":"corners"}`,
	"hypercube":  `{"kind":"hypercube","dimension":3}`,
	"graph":      `{"kind":"graph","sites":2,"bonds":[[0,1]]}`,
	"ring":       `{"kind":"ring","sites":5}`,
	"triangular": `{"kind":"triangular","width":3,"height":3,"periodic":true}`,
	"honeycomb":  `{"kind":"honeycomb","width":3,"height":3}`,
	"kagome":     `{"kind":"kagome","width":3,"height":3}`,
	"lieb":       `{"kind":"lieb","width":3,"height":3}`,
	"cubic":      `{"kind":"cubic","width":2,"height":2,"depth":2}`,
	"complete":   `{"kind":"complete","sites":4}`,
	"star":       `{"kind":"star","leaves":4}`,
	"cayley":     `{"kind":"cayley","coordination":3,"shells":2}`,
	"vicsek":     `{"kind":"vicsek","generation":1}`,
	"tfractal":   `{"kind":"tfractal","generation":1}`,
	"fibonacci":  `{"kind":"fibonacci","sites":8,"weak":0.5,"strong":1}`,
	"harper":     `{"kind":"harper","sites":8,"lambda":2,"beta":0.618,"phase":0}`,
	"positions":  `{"kind":"positions","positions":[[0,0],[10,0],[20,0]],"law":{"type":"exponential","c0":1,"kappa":0.2,"d0":10},"cutoff":15}`,
}

func TestEveryKindDecodes(t *testing.T) {
	lines := kindExamples
	for _, k := range Kinds() {
		l, ok := lines[k]
		require.True(t, ok, "kind %s has no decode case", k)
		j, err := Decode([]byte(`{"lattice":` + l + `,"start":{"site":0},"times":[1]}`))
		require.NoError(t, err, k)
		assert.Equal(t, k, j.Lattice.Kind)
	}
	assert.Len(t, lines, len(Kinds()))
}
