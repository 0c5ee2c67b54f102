package walk_test

// Regression tests for the findings of the acceptance audit of the bridge
// (each case names the finding it pins down). Physics references: the
// exact chain MSDs 2γt (classical) and 2γ²t² (quantum, Childs, Farhi &
// Gutmann, Quantum Inf. Process. 1, 35 (2002), from memory).

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/ampwalk/ampwalk/walk"
)

// fixServe runs walk.Serve on the lines and returns the decoded responses.
func fixServe(t *testing.T, lines ...string) []map[string]any {
	t.Helper()
	var out bytes.Buffer
	require.NoError(t, walk.Serve(context.Background(), strings.NewReader(strings.Join(lines, "\n")+"\n"), &out, nil))
	var res []map[string]any
	for _, l := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var m map[string]any
		require.NoError(t, json.Unmarshal([]byte(l), &m), l)
		res = append(res, m)
	}
	require.Len(t, res, len(lines))
	return res
}

// fixErr returns the code, field and message of an error line ("" when the
// line is not an error).
func fixErr(r map[string]any) (code, field, msg string) {
	e, ok := r["error"].(map[string]any)
	if !ok {
		return "", "", ""
	}
	code, _ = e["code"].(string)
	field, _ = e["field"].(string)
	msg, _ = e["message"].(string)
	return code, field, msg
}

func TestFixErrorCodesAndFields(t *testing.T) {
	for _, c := range []struct {
		finding, line   string
		id, code, field string
		msgHas          []string
		msgLacks        []string
	}{
		{"classical negative bond weight",
			`{"id":"cn","lattice":{"kind":"graph","sites":3,"bonds":[[0,1,-1],[1,2]]},"dynamics":"classical","start":{"site":0},"times":[1],"report":["populations"]}`,
			"cn", "invalid", "lattice.bonds[0]", []string{"a positive weight for classical dynamics", "got -1"}, nil},
		{"classical negative weight, later bond",
			`{"id":"cn2","lattice":{"kind":"graph","sites":3,"bonds":[[0,1],[1,2,-0.5]]},"dynamics":"classical","start":{"site":0},"times":[1]}`,
			"cn2", "invalid", "lattice.bonds[1]", []string{"positive weight"}, nil},
		{"too few times for regimes",
			`{"id":"few","lattice":{"kind":"chain","sites":11},"start":{"site":5},"times":[1],"report":["regimes"]}`,
			"few", "invalid", "times", []string{"at least 4"}, []string{"fit the fit"}},
		{"empty fit window",
			`{"id":"win","lattice":{"kind":"chain","sites":11},"start":{"site":5},"times":[1,2,3,4,5,6],"report":["regimes"],"fit":{"from":100,"to":200}}`,
			"win", "invalid", "fit", []string{"at least 4", "holds 0"}, []string{"fit the fit", "fit fit"}},
		{"remove duplicate entry",
			`{"id":"rd","lattice":{"kind":"chain","sites":11},"start":{"site":0},"times":[1],"remove":[3,3]}`,
			"rd", "invalid", "remove[1]", []string{"site 3"}, nil},
		{"remove every site",
			`{"id":"ra","lattice":{"kind":"chain","sites":2},"start":{"site":0},"times":[1],"remove":[0,1]}`,
			"ra", "invalid", "remove", []string{"at least one site"}, nil},
		{"gasket generation beyond the cap",
			`{"id":"g20","lattice":{"kind":"gasket","generation":20},"start":{"site":0},"times":[1]}`,
			"g20", "too-large", "lattice.generation", []string{"bytes", "generation 16"}, nil},
		{"chain of 1e12 sites",
			`{"id":"c12","lattice":{"kind":"chain","sites":1e12},"start":{"site":0},"times":[1]}`,
			"c12", "too-large", "lattice.sites", []string{"bytes"}, []string{"-2147483648"}},
		{"square 100000×100000",
			`{"id":"sq","lattice":{"kind":"square","width":100000,"height":100000},"start":{"site":0},"times":[1]}`,
			"sq", "too-large", "lattice.width", []string{"bytes"}, nil},
		{"sites far beyond int range",
			`{"id":"huge","lattice":{"kind":"chain","sites":1e300},"start":{"site":0},"times":[1]}`,
			"huge", "too-large", "lattice.sites", []string{"bytes"}, []string{"-"}},
		{"generation 2^31: counts beyond float64 are not printed as +Inf",
			`{"id":"g31","lattice":{"kind":"gasket","generation":2147483648},"start":{"site":0},"times":[1]}`,
			"g31", "too-large", "lattice.generation", []string{"bytes", "more than"}, []string{"Inf"}},
		{"graph sites beyond the largest graph",
			`{"id":"gs","lattice":{"kind":"graph","sites":1e12},"start":{"site":0},"times":[1]}`,
			"gs", "too-large", "lattice.sites", []string{"bytes"}, nil},
		{"negative generation stays invalid (contract example)",
			`{"id":"neg","lattice":{"kind":"gasket","generation":-2},"start":{"site":0},"times":[1]}`,
			"neg", "invalid", "lattice.generation", []string{"between 0 and 16; got -2"}, nil},
		{"zero sites stays invalid",
			`{"id":"z","lattice":{"kind":"chain","sites":0},"start":{"site":0},"times":[1]}`,
			"z", "invalid", "lattice.sites", nil, nil},
		{"non-integral size stays invalid",
			`{"id":"h","lattice":{"kind":"chain","sites":2.5},"start":{"site":0},"times":[1]}`,
			"h", "invalid", "lattice.sites", []string{"whole number"}, []string{"-2147483648"}},
		{"very negative size: no negative range advertised",
			`{"id":"vn","lattice":{"kind":"chain","sites":-1e300},"start":{"site":0},"times":[1]}`,
			"vn", "invalid", "lattice.sites", []string{"non-negative"}, []string{"-2147483648", "-9"}},
		{"duplicate key other than id: invalid naming the key, id echoed",
			`{"id":"dup","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1],"times":[2]}`,
			"dup", "invalid", "times", []string{"more than once"}, []string{"must be a JSON object"}},
		{"duplicate id: invalid naming id",
			`{"id":"q","id":"r","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1]}`,
			"", "invalid", "id", []string{"more than once"}, []string{"must be a JSON object"}},
		{"not an object is still malformed",
			`[1,2]`, "", "malformed", "", []string{"JSON object"}, nil},
	} {
		t.Run(c.finding, func(t *testing.T) {
			r := fixServe(t, c.line)[0]
			code, field, msg := fixErr(r)
			assert.Equal(t, c.code, code, "%v", r)
			assert.Equal(t, c.field, field, "%v", r)
			assert.Equal(t, c.id, r["id"])
			for _, s := range c.msgHas {
				assert.Contains(t, msg, s)
			}
			for _, s := range c.msgLacks {
				assert.NotContains(t, msg, s)
			}
		})
	}
}

func TestFixClassicalZeroWeightAccepted(t *testing.T) {
	// Documented decision: a zero weight under classical dynamics is a bond
	// of rate 0 and behaves as if it were not listed (site 2 stays empty).
	res := fixServe(t,
		`{"id":"z","lattice":{"kind":"graph","sites":3,"bonds":[[0,1],[1,2,0]]},"dynamics":"classical","start":{"site":0},"times":[1],"report":["populations"]}`,
		`{"id":"q","lattice":{"kind":"graph","sites":3,"bonds":[[0,1,-1],[1,2]]},"start":{"site":0},"times":[1],"report":["populations"]}`)
	require.Nil(t, res[0]["error"], "%v", res[0])
	p := res[0]["populations"].([]any)[0].([]any)
	assert.InDelta(t, 0, p[2], 1e-12)
	// (1 + e^{−2t})/2 on the two-site rate-1 pair (common practice).
	assert.InDelta(t, 0.5676676416183064, p[0], 1e-9)
	// Quantum dynamics keeps accepting negative weights (a real hopping).
	require.Nil(t, res[1]["error"], "%v", res[1])
}

func TestFixByteOrderMark(t *testing.T) {
	// A UTF-8 byte order mark at the start of the input is stripped.
	res := fixServe(t, "\ufeff"+`{"id":"bom","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1]}`)
	assert.Nil(t, res[0]["error"], "%v", res[0])
	assert.Equal(t, "bom", res[0]["id"])
}

func TestFixAutoCountsKrylovBasis(t *testing.T) {
	// With a memory limit that holds Chebyshev's vectors (12 of 16·n bytes,
	// n = 10⁵: 19 MB; its grouped-expansion workspace of 11 more would take
	// over a tenth of the limit, so it is not used) but not the Krylov basis
	// (36: 58 MB; the limit of 40 MB is chosen here), "auto" runs Chebyshev
	// instead of building a basis that does not fit; below Chebyshev's own
	// need it is too-large.
	line := `{"id":"k","lattice":{"kind":"chain","sites":100000},"start":{"site":50000},"times":[1,2]}`
	t.Setenv("AMPWALK_MEMORY_LIMIT", "40000000")
	r := fixServe(t, line)[0]
	require.Nil(t, r["error"], "%v", r)
	assert.Equal(t, "chebyshev", r["diagnostics"].(map[string]any)["method"])
	// 2t² at t = 2 (chain MSD, Childs, Farhi & Gutmann 2002, from memory).
	assert.InDelta(t, 8, r["msd"].([]any)[1], 1e-8)
	t.Setenv("AMPWALK_MEMORY_LIMIT", "10000000")
	r = fixServe(t, line)[0]
	code, _, msg := fixErr(r)
	assert.Equal(t, "too-large", code)
	assert.Contains(t, msg, "bytes")
}

func TestFixRegimesPowerLaw(t *testing.T) {
	// The audit's requests: classical chain MSD = 2t is one diffusive regime
	// without crossover; the quantum chain MSD = 2t² (exact to t ≈ 180 on 801
	// sites, scipy 1.10.1 expm_multiply per the audit) has no crossover
	// before the front reaches the ends, and its local exponent is
	// 2.000 ± 0.02 at t = 149.
	res := fixServe(t,
		`{"id":"rg","lattice":{"kind":"chain","sites":801},"dynamics":"classical","start":{"site":400},"times":{"from":0.01,"to":300,"count":60,"spacing":"log"},"report":["regimes"]}`,
		`{"id":"rq","lattice":{"kind":"chain","sites":801},"start":{"site":400},"times":{"from":0.01,"to":300,"count":60,"spacing":"log"},"report":["regimes"]}`)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
	}
	regs := res[0]["regimes"].([]any)
	require.Len(t, regs, 1, "%v", regs)
	assert.Equal(t, "diffusive", regs[0].(map[string]any)["kind"])
	assert.Empty(t, res[0]["crossovers"])

	q := res[1]
	first := q["regimes"].([]any)[0].(map[string]any)
	assert.Equal(t, "ballistic", first["kind"])
	assert.GreaterOrEqual(t, first["to"].(float64), 170.0, "no crossover before the bend: %v", q["regimes"])
	for _, c := range q["crossovers"].([]any) {
		m := c.(map[string]any)
		assert.Less(t, m["low"], m["time"], "non-degenerate interval %v", m)
		assert.Greater(t, m["high"], m["time"], "non-degenerate interval %v", m)
	}
	ft, le := q["fit_times"].([]any), q["local_exponent"].([]any)
	checked := 0
	for i, tt := range ft {
		if x := tt.(float64); x > 140 && x < 150 { // t = 149.1
			assert.InDelta(t, 2, le[i], 0.02, "t = %v", x)
			checked++
		}
	}
	assert.Equal(t, 1, checked)
}

func TestFixLongTimes(t *testing.T) {
	// Chain of 6 sites from site 1 at t = 10⁹: p_start = 0.2722169155236
	// (the audit's analytic eigenpairs 2cos(kπ/7) in 60-digit arithmetic).
	// The reported error bound covers the rounding of the phases
	// (≈ ε‖H‖t), so it is at least the true error of the return
	// probability; "chebyshev" would need about 2·10⁹ products: too-large.
	const truth = 0.2722169155236
	res := fixServe(t,
		`{"id":"k","lattice":{"kind":"chain","sites":6},"start":{"site":1},"times":[1e9],"method":"krylov","report":["return"]}`,
		`{"id":"c","lattice":{"kind":"chain","sites":6},"start":{"site":1},"times":[1e9],"method":"chebyshev","report":["return"]}`)
	require.Nil(t, res[0]["error"], "%v", res[0])
	got := res[0]["return"].([]any)[0].(float64)
	bound := res[0]["diagnostics"].(map[string]any)["error_bound"].(float64)
	// |p − p̃| ≤ 2‖ψ − ψ̃‖ for a probability (common practice).
	assert.LessOrEqual(t, abs(got-truth), 2*bound)
	code, field, msg := fixErr(res[1])
	assert.Equal(t, "too-large", code, "%v", res[1])
	assert.Equal(t, "method", field)
	assert.Contains(t, msg, "products")
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

func TestFixSeriesFitQuantityAndLogGrid(t *testing.T) {
	res := fixServe(t,
		// A fit object reused from a walk job: quantity is checked and ignored.
		`{"id":"s","series":{"times":[1,2,3,4,5],"values":[1,2,3,4,5]},"fit":{"quantity":"msd"}}`,
		`{"id":"s2","series":{"times":[1,2,3,4,5],"values":[1,2,3,4,5]},"fit":{"quantity":"x"}}`,
		// Exact decades on a log grid.
		`{"id":"g","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":{"from":0.001,"to":1000,"count":7,"spacing":"log"}}`)
	require.Nil(t, res[0]["error"], "%v", res[0])
	code, field, _ := fixErr(res[1])
	assert.Equal(t, "invalid", code)
	assert.Equal(t, "fit.quantity", field)
	assert.Equal(t, []any{0.001, 0.01, 0.1, 1.0, 10.0, 100.0, 1000.0}, res[2]["times"])
}

func TestFixClassicalOnsiteDisorderRefused(t *testing.T) {
	// −L = −(D − W) has no on-site term: on-site disorder under classical
	// dynamics would be a silent no-op (audit 17:48), so it is refused.
	res := fixServe(t,
		`{"id":"b","lattice":{"kind":"chain","sites":30},"dynamics":"classical","start":{"site":15},"times":[1,3],"disorder":{"onsite":5,"realisations":3,"seed":1}}`,
		`{"id":"q","lattice":{"kind":"chain","sites":30},"start":{"site":15},"times":[1,3],"disorder":{"onsite":5,"realisations":3,"seed":1}}`)
	code, field, _ := fixErr(res[0])
	assert.Equal(t, "invalid", code, "%v", res[0])
	assert.Equal(t, "disorder.onsite", field)
	assert.Nil(t, res[1]["error"], "quantum on-site disorder stays accepted: %v", res[1])
}

func TestFixTinyTimes(t *testing.T) {
	// Times far below the spectral scale (audit 17:52): the state is the
	// initial one to rounding, p_start = 1 (common practice), for an
	// explicit Chebyshev expansion and under auto, quantum and classical.
	res := fixServe(t,
		`{"id":"a","lattice":{"kind":"gasket","generation":2},"start":{"site":0},"times":[1e-20],"method":"chebyshev","report":["return"]}`,
		`{"id":"b","lattice":{"kind":"gasket","generation":2},"start":{"site":0},"times":[5e-324],"method":"chebyshev","report":["return"]}`,
		`{"id":"c","lattice":{"kind":"square","width":60,"height":60},"start":{"site":1830},"times":[1e-300,2.0],"dynamics":"classical","report":["return"]}`)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
		assert.InDelta(t, 1, r["return"].([]any)[0], 1e-15, "%v", r["id"])
	}
	assert.Equal(t, 1e-300, res[2]["times"].([]any)[0], "times echoed as given")
}

func TestFixProbabilitiesClampedAndSeriesIndex(t *testing.T) {
	res := fixServe(t,
		// An isolated start site (exact p = 1, common practice): the
		// Chebyshev state within tolerance must not make polya fail on a
		// return probability 1 + 10⁻⁹ (audit 17:55).
		`{"id":"p","lattice":{"kind":"graph","sites":3,"bonds":[[1,2,2.9]],"onsite":[-1.7,0.5,0.1]},"start":{"site":0},"times":[1.2,1.9,4.3],"method":"chebyshev","tolerance":1e-8,"report":["return","polya"]}`,
		// One rule for series errors, with the index (audit 17:53).
		`{"id":"s6","series":{"times":[1,2,3,4],"values":[1,2,3,4],"errors":[0,0,0,0]}}`,
		// The lowest offending index over all lists.
		`{"id":"s7","series":{"times":[1,2,1.5,4],"values":[1,-1,3,4]}}`)
	require.Nil(t, res[0]["error"], "%v", res[0])
	for _, v := range res[0]["return"].([]any) {
		assert.LessOrEqual(t, v.(float64), 1.0)
		assert.InDelta(t, 1, v, 1e-8)
	}
	assert.InDelta(t, 1, res[0]["polya"], 1e-12)
	code, field, _ := fixErr(res[1])
	assert.Equal(t, "invalid", code)
	assert.Equal(t, "series.errors[0]", field)
	_, field, _ = fixErr(res[2])
	assert.Equal(t, "series.values[1]", field)
}

func TestFixNearFarOutside(t *testing.T) {
	// A start.near coordinate so large that squared distances overflow
	// (audit 17:50) is refused instead of tying every site at +Inf.
	r := fixServe(t, `{"id":"n","lattice":{"kind":"chain","sites":5},"start":{"near":[1e200,0]},"times":[0]}`)[0]
	code, field, _ := fixErr(r)
	assert.Equal(t, "invalid", code)
	assert.Equal(t, "start.near[0]", field)
	// 1e6 is still fine: the nearest chain site is the last one (index 4).
	r = fixServe(t, `{"id":"m","lattice":{"kind":"chain","sites":5},"start":{"near":[1e6,0]},"times":[0],"report":["populations"]}`)[0]
	require.Nil(t, r["error"], "%v", r)
	assert.Equal(t, 1.0, r["populations"].([]any)[0].([]any)[4])
}

func TestFixInvalidUTF8String(t *testing.T) {
	// A string with invalid UTF-8 bytes is refused rather than altered
	// (encoding/json would turn the bytes into U+FFFD and the echoed id would
	// differ from the request).
	r := fixServe(t, "{\"id\":\"a\xffb\",\"lattice\":{\"kind\":\"chain\",\"sites\":3},\"start\":{\"site\":0},\"times\":[1]}")[0]
	code, field, _ := fixErr(r)
	assert.Equal(t, "invalid", code, "%v", r)
	assert.Equal(t, "id", field)
	assert.Equal(t, "", r["id"])
}

func TestFixGraphBondsRequired(t *testing.T) {
	// A graph without "bonds" is refused (the contract lists bonds as a
	// graph parameter; only positions and onsite are optional); an explicit
	// empty list of bonds stays valid (isolated sites).
	res := fixServe(t,
		`{"id":"f","lattice":{"kind":"graph","sites":3},"start":{"site":0},"times":[1]}`,
		`{"id":"e","lattice":{"kind":"graph","sites":3,"bonds":[]},"start":{"site":0},"times":[1]}`)
	code, field, _ := fixErr(res[0])
	assert.Equal(t, "invalid", code, "%v", res[0])
	assert.Equal(t, "lattice.bonds", field)
	require.Nil(t, res[1]["error"], "%v", res[1])
	assert.Equal(t, 1.0, res[1]["return"].([]any)[0])
}

func TestFixClassicalVeryLongTimeAuto(t *testing.T) {
	// Classical walk on the 3-cube at t = 10¹²: the stationary distribution
	// is uniform, 1/8 per site (common practice). The dense eigensystem's
	// bound grows like t (audit O8); under auto the walk is rerun with Krylov
	// instead of being refused.
	r := fixServe(t, `{"id":"x","lattice":{"kind":"hypercube","dimension":3},"dynamics":"classical","start":{"site":0},"times":[1e12],"report":["populations"]}`)[0]
	require.Nil(t, r["error"], "%v", r)
	for _, p := range r["populations"].([]any)[0].([]any) {
		assert.InDelta(t, 0.125, p, 1e-12)
	}
}

func TestFixClassicalRoundingFloor(t *testing.T) {
	// A stiff classical chain (rates 10⁻³ and 10³ alternating, γ = 0.8) to
	// t = 1000 at tolerance 1e-12: the series' rounding (≈2.5e-11) exceeds
	// its truncation bound (≈1e-12), so error_bound must include the
	// rounding floor. Reference populations at t = 1000 from a
	// uniformisation series in numpy 1.24.2 long double (80-bit), whose sum
	// is 1 within 2.3e-14: testdata/audit/stiff_classical_ref.py (job line
	// in testdata/audit/stiff_classical.jsonl).
	line, err := os.ReadFile("testdata/audit/stiff_classical.jsonl")
	require.NoError(t, err)
	r := fixServe(t, strings.TrimSpace(string(line)))[0]
	require.Nil(t, r["error"], "%v", r)
	pops := r["populations"].([]any)
	last := pops[len(pops)-1].([]any)
	bound := r["diagnostics"].(map[string]any)["error_bound"].(float64)
	want := map[int]float64{12: 0.09724947771939019, 13: 0.2620745195848495}
	var dev float64
	for site, w := range want {
		dev = math.Hypot(dev, last[site].(float64)-w)
	}
	assert.LessOrEqual(t, dev, bound, "the reported bound covers the deviation at two sites")
	assert.Less(t, bound, 1e-9, "and stays a useful number")
}
