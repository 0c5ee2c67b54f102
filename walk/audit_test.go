package walk_test

// Acceptance audit of the JSON bridge against the binding contract
// ../shared/spec/job-format.md, driven only through walk.Serve (the loop the
// bridge binary runs). Physics references are made offline by
// testdata/audit/make_refs.py (numpy 1.24.2, scipy 1.10.1; every case names
// its source in refs.json), the contract items (transport, defaults, error
// codes and fields) are checked literally below.

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/ampwalk/ampwalk/walk"
)

// auditServe runs walk.Serve on raw input and returns the decoded output
// lines, the raw output and the log.
func auditServe(t *testing.T, input string) ([]map[string]any, string, string) {
	t.Helper()
	var out, log bytes.Buffer
	err := walk.Serve(context.Background(), strings.NewReader(input), &out, &log)
	require.NoError(t, err)
	var res []map[string]any
	sc := bufio.NewScanner(bytes.NewReader(out.Bytes()))
	sc.Buffer(nil, 1<<28)
	for sc.Scan() {
		var m map[string]any
		require.NoError(t, json.Unmarshal(sc.Bytes(), &m), "every stdout line is one JSON object: %q", sc.Text())
		res = append(res, m)
	}
	return res, out.String(), log.String()
}

func auditLines(t *testing.T, reqs ...any) []map[string]any {
	t.Helper()
	var b strings.Builder
	for _, r := range reqs {
		switch r := r.(type) {
		case string:
			b.WriteString(r)
		default:
			p, err := json.Marshal(r)
			require.NoError(t, err)
			b.Write(p)
		}
		b.WriteByte('\n')
	}
	res, _, _ := auditServe(t, b.String())
	require.Len(t, res, len(reqs))
	return res
}

type auditCase struct {
	Name    string         `json:"name"`
	Request map[string]any `json:"request"`
	Expect  map[string]any `json:"expect"`
	Atol    float64        `json:"atol"`
	Source  string         `json:"source"`
}

// auditCompare compares an expected JSON value with the bridge's, numbers
// within atol·(1+|expected|). "populations_at" selects single populations:
// {"offsets": [j…], "values": [[p_j(t_k)…]…]}.
func auditCompare(path string, want, got any, atol float64, diffs *[]string) {
	switch w := want.(type) {
	case map[string]any:
		g, ok := got.(map[string]any)
		if !ok {
			*diffs = append(*diffs, fmt.Sprintf("%s: want an object, got %v", path, got))
			return
		}
		keys := make([]string, 0, len(w))
		for k := range w {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		for _, k := range keys {
			if k == "populations_at" {
				sel := w[k].(map[string]any)
				pops, ok := g["populations"].([]any)
				if !ok {
					*diffs = append(*diffs, path+".populations: missing")
					continue
				}
				offs := sel["offsets"].([]any)
				for ti, row := range sel["values"].([]any) {
					if ti >= len(pops) {
						*diffs = append(*diffs, fmt.Sprintf("%s.populations: %d rows", path, len(pops)))
						break
					}
					pr := pops[ti].([]any)
					for j, o := range offs {
						idx := int(o.(float64))
						p := fmt.Sprintf("%s.populations[%d][%d]", path, ti, idx)
						if idx >= len(pr) {
							*diffs = append(*diffs, p+": out of range")
							continue
						}
						auditCompare(p, row.([]any)[j], pr[idx], atol, diffs)
					}
				}
				continue
			}
			gv, ok := g[k]
			if !ok {
				*diffs = append(*diffs, path+"."+k+": missing")
				continue
			}
			auditCompare(path+"."+k, w[k], gv, atol, diffs)
		}
	case []any:
		g, ok := got.([]any)
		if !ok || len(g) != len(w) {
			*diffs = append(*diffs, fmt.Sprintf("%s: want %d entries, got %v", path, len(w), got))
			return
		}
		for i := range w {
			auditCompare(fmt.Sprintf("%s[%d]", path, i), w[i], g[i], atol, diffs)
		}
	case float64:
		g, ok := got.(float64)
		if !ok || !(math.Abs(g-w) <= atol*(1+math.Abs(w))) {
			*diffs = append(*diffs, fmt.Sprintf("%s: want %v, got %v", path, w, got))
		}
	default:
		if fmt.Sprint(want) != fmt.Sprint(got) {
			*diffs = append(*diffs, fmt.Sprintf("%s: want %v, got %v", path, want, got))
		}
	}
}

// TestAuditReferenceCases runs every case of testdata/audit/refs.json (made
// offline by make_refs.py; each case carries its source) through one Serve
// loop and compares the wire output.
func TestAuditReferenceCases(t *testing.T) {
	raw, err := os.ReadFile(filepath.Join("testdata", "audit", "refs.json"))
	require.NoError(t, err)
	var ref struct {
		Cases []auditCase `json:"cases"`
	}
	require.NoError(t, json.Unmarshal(raw, &ref))
	require.NotEmpty(t, ref.Cases)
	reqs := make([]any, len(ref.Cases))
	for i, c := range ref.Cases {
		reqs[i] = c.Request
	}
	res := auditLines(t, reqs...)
	for i, c := range ref.Cases {
		t.Run(c.Name, func(t *testing.T) {
			r := res[i]
			require.Equal(t, c.Name, r["id"], "responses in request order with the id echoed")
			require.Nil(t, r["error"], "source: %s", c.Source)
			var diffs []string
			auditCompare("", c.Expect, r, c.Atol, &diffs)
			assert.Empty(t, diffs, "source: %s", c.Source)
			// Populations of a walk sum to 1 (unitarity / probability
			// conservation) and are never negative beyond round-off.
			tol := 1e-10 // contract default tolerance
			if v, ok := c.Request["tolerance"].(float64); ok {
				tol = v
			}
			if pops, ok := r["populations"].([]any); ok {
				for k, row := range pops {
					sum := 0.0
					for _, p := range row.([]any) {
						sum += p.(float64)
						assert.GreaterOrEqual(t, p.(float64), -1e-9, "populations[%d]", k) // round-off, common practice
					}
					// A 2-norm state error ε moves Σp by at most 2ε+ε² (triangle
					// inequality); 1e-9 covers round-off (common practice).
					assert.InDelta(t, 1, sum, 3*tol+1e-9, "populations[%d] sum", k)
				}
			}
		})
	}
}

func auditErr(t *testing.T, r map[string]any) (code, field string) {
	t.Helper()
	e, ok := r["error"].(map[string]any)
	require.True(t, ok, "want an error object, got %v", r)
	code, _ = e["code"].(string)
	field, _ = e["field"].(string)
	msg, _ := e["message"].(string)
	assert.NotEmpty(t, msg, "error message")
	for k := range r {
		assert.Contains(t, []string{"id", "error"}, k, "an error line holds no partial result")
	}
	return code, field
}

// TestAuditErrors checks error codes, field names and id echo from the
// contract's Errors section.
func TestAuditErrors(t *testing.T) {
	ch := `"lattice":{"kind":"chain","sites":5}`
	ok := `"start":{"site":2},"times":[1]`
	cases := []struct {
		line, id, code, field string
	}{
		{`not json`, "", "malformed", ""},
		{`{"id":"t1","lattice":{"kind":"chain"`, "", "malformed", ""},
		{`[1,2]`, "", "malformed", ""},
		{`null`, "", "malformed", ""},
		{`"str"`, "", "malformed", ""},
		{`123`, "", "malformed", ""},
		{`{"id":"tr",` + ch + `,` + ok + `} x`, "", "malformed", ""},
		{`{}`, "", "invalid", "lattice"},
		// The id is echoed even when it comes after the offending field.
		{`{"lattice":{"kind":"foo"},"id":"late1"}`, "late1", "invalid", "lattice.kind"},
		{`{"bogus":1,"id":"late2"}`, "late2", "unknown-field", "bogus"},
		{`{"times":"x",` + ch + `,"start":{"site":0},"id":"late3"}`, "late3", "invalid", "times"},
		{`{` + ch + `,` + ch + `,"id":"late4"}`, "late4", "invalid", "lattice"},
		{`{"id":"nan",` + ch + `,` + `"start":{"site":2},"times":[NaN]}`, "", "malformed", ""},
		{`{"id":"inf",` + ch + `,` + ok + `,"hopping":Infinity}`, "", "malformed", ""},
		{`{"id":"e1",` + ch + `,` + ok + `,"hoping":1}`, "e1", "unknown-field", "hoping"},
		{`{"id":"e2","lattice":{"kind":"chain","sites":5,"site":3},` + ok + `}`, "e2", "unknown-field", "lattice.site"},
		{`{"id":"e3",` + ch + `,"start":{"sight":1},"times":[1]}`, "e3", "unknown-field", "start.sight"},
		{`{"id":"e4",` + ch + `,"start":{"site":2},"times":{"from":0,"to":1,"count":3,"step":1}}`, "e4", "unknown-field", "times.step"},
		{`{"id":"e5",` + ch + `,` + ok + `,"disorder":{"onsit":1}}`, "e5", "unknown-field", "disorder.onsit"},
		{`{"id":"e6",` + ch + `,` + ok + `,"fit":{"quantiti":"msd"}}`, "e6", "unknown-field", "fit.quantiti"},
		{`{"id":"e7","lattice":{"kind":"graph","sites":2,"bonds":[[0,1]],"weights":[1]},` + ok + `}`, "e7", "unknown-field", "lattice.weights"},
		{`{"id":"i1","lattice":{"kind":"gasket","generation":-2},` + ok + `}`, "i1", "invalid", "lattice.generation"},
		{`{"id":"i2",` + ch + `,"start":{"site":9},"times":[1]}`, "i2", "invalid", "start.site"},
		{`{"id":"i3",` + ch + `,"start":{"site":1.5},"times":[1]}`, "i3", "invalid", "start.site"},
		{`{"id":"i4",` + ch + `,"start":{"near":[0]},"times":[1]}`, "i4", "invalid", "start.near"},
		{`{"id":"i5",` + ch + `,"start":{"near":[0,0,0]},"times":[1]}`, "i5", "invalid", "start.near"},
		{`{"id":"i6",` + ch + `,"start":{"site":2},"times":[1,0.5]}`, "i6", "invalid", "times[1]"},
		{`{"id":"i7",` + ch + `,"start":{"site":2},"times":[-1]}`, "i7", "invalid", "times[0]"},
		{`{"id":"i8",` + ch + `,"start":{"site":2},"times":["1"]}`, "i8", "invalid", "times[0]"},
		{`{"id":"i9",` + ch + `,` + ok + `,"hopping":"1"}`, "i9", "invalid", "hopping"},
		{`{"id":"i10",` + ch + `,` + ok + `,"tolerance":0}`, "i10", "invalid", "tolerance"},
		{`{"id":"i11",` + ch + `,` + ok + `,"method":"lanczos"}`, "i11", "invalid", "method"},
		{`{"id":"i12",` + ch + `,` + ok + `,"dynamics":"Quantum"}`, "i12", "invalid", "dynamics"},
		{`{"id":"i13",` + ch + `,` + ok + `,"report":["msd","foo"]}`, "i13", "invalid", "report[1]"},
		{`{"id":"i14",` + ok + `}`, "i14", "invalid", "lattice"},
		{`{"id":"i15",` + ch + `,"times":[1]}`, "i15", "invalid", "start"},
		{`{"id":"i16",` + ch + `,"start":{"site":1}}`, "i16", "invalid", "times"},
		{`{"id":"i17","lattice":{"kind":"hexagon"},` + ok + `}`, "i17", "invalid", "lattice.kind"},
		{`{"id":"i18","lattice":{"kind":"carpet","generation":1,"variant":"edges"},"start":{"site":0},"times":[1]}`, "i18", "invalid", "lattice.variant"},
		{`{"id":"i19","lattice":{"kind":"graph","sites":3,"bonds":[[0,3]]},"start":{"site":0},"times":[1]}`, "i19", "invalid", "lattice.bonds[0]"},
		{`{"id":"i20","lattice":{"kind":"graph","sites":3,"bonds":[[0,1]],"positions":[[0,0],[1],[2,0]]},"start":{"site":0},"times":[1]}`, "i20", "invalid", "lattice.positions[1]"},
		{`{"id":"i21","lattice":{"kind":"graph","sites":3,"bonds":[[0,1]],"onsite":[1]},"start":{"site":0},"times":[1]}`, "i21", "invalid", "lattice.onsite"},
		{`{"id":"i22",` + ch + `,"start":{"site":2},"times":{"from":0,"to":1,"count":3,"spacing":"cubic"}}`, "i22", "invalid", "times.spacing"},
		{`{"id":"i23",` + ch + `,"start":{"site":2},"times":[1e400]}`, "i23", "invalid", "times[0]"},
		{`{"id":5,` + ch + `,` + ok + `}`, "", "invalid", "id"},
		{"{\"id\":\"bad\xffutf8\"," + ch + `,` + ok + `}`, "", "invalid", "id"},
		{`{"id":"s1","series":{"times":[1,2,2,4,5],"values":[1,2,3,4,5]},"report":["regimes"]}`, "s1", "invalid", "series.times[2]"},
		{`{"id":"s2","series":{"times":[1,2,3,4,5],"values":[1,2,-3,4,5]},"report":["regimes"]}`, "s2", "invalid", "series.values[2]"},
		{`{"id":"s3","series":{"times":[0,2,3,4,5],"values":[1,2,3,4,5]},"report":["regimes"]}`, "s3", "invalid", "series.times[0]"},
		{`{"id":"g1","lattice":{"kind":"graph","sites":3},"start":{"site":0},"times":[1]}`, "g1", "invalid", "lattice.bonds"},
		{`{"id":"s4","series":{"times":[1,2,3,4],"values":[1,2,3,4],"errors":[0,0,0,0]}}`, "s4", "invalid", "series.errors[0]"},
		{`{"id":"s5","series":{"times":[1,2,1.5,4],"values":[1,-1,3,4]}}`, "s5", "invalid", "series.values[1]"},
		{`{"id":"n1",` + ch + `,"start":{"near":[1e200,0]},"times":[0]}`, "n1", "invalid", "start.near[0]"},
		{`{"id":"z1","lattice":{"kind":"chain","sites":1},"start":{"site":0},"times":[1,2,3,4,5],"report":["regimes"]}`, "z1", "invalid", ""},
		{`{"id":"x1","lattice":{"kind":"hypercube","dimension":26},"start":{"site":0},"times":[1]}`, "x1", "too-large", ""},
		// Sizes beyond any machine are too-large with the estimate, not
		// invalid (contract: too-large names the estimate).
		{`{"id":"x2","lattice":{"kind":"gasket","generation":20},"start":{"site":0},"times":[1]}`, "x2", "too-large", "lattice.generation"},
		{`{"id":"x3","lattice":{"kind":"chain","sites":1000000000000},"start":{"site":0},"times":[1]}`, "x3", "too-large", "lattice.sites"},
		{`{"id":"x4","lattice":{"kind":"square","width":100000,"height":100000},"start":{"site":0},"times":[1]}`, "x4", "too-large", ""},
		{`{"id":"x5","lattice":{"kind":"square","width":1000,"height":1000},"start":{"site":2},"times":[1,2,3,4,5],"report":["populations"]}`, "x5", "too-large", ""},
		// A negative rate makes −L non-stochastic (populations outside [0,1]).
		{`{"id":"c1","lattice":{"kind":"graph","sites":3,"bonds":[[0,1,-1],[1,2]]},"dynamics":"classical","start":{"site":0},"times":[1]}`, "c1", "invalid", "lattice.bonds[0]"},
		{`{"id":"c2",` + ch + `,` + ok + `,"dynamics":"classical","hopping":-1}`, "c2", "invalid", "hopping"},
		// Classical −L has no on-site term: on-site disorder would be a silent no-op.
		{`{"id":"c3",` + ch + `,` + ok + `,"dynamics":"classical","disorder":{"onsite":5,"realisations":3,"seed":1}}`, "c3", "invalid", "disorder.onsite"},
		{`{"id":"r1",` + ch + `,` + ok + `,"remove":[2,2]}`, "r1", "invalid", "remove[1]"},
		{`{"id":"r2",` + ch + `,` + ok + `,"remove":[0,1,2,3,4]}`, "r2", "invalid", "remove"},
		{`{"id":"r3",` + ch + `,` + ok + `,"remove":[7]}`, "r3", "invalid", "remove[0]"},
		{`{"id":"f1",` + ch + `,"start":{"site":2},"times":[1],"report":["regimes"]}`, "f1", "invalid", "times"},
		{`{"id":"f2",` + ch + `,"start":{"site":2},"times":[1,2,3,4,5],"report":["regimes"],"fit":{"from":10,"to":20}}`, "f2", "invalid", "fit"},
		{`{"id":"d1",` + ch + `,"start":{"site":2},"times":[1],"times":[2]}`, "d1", "invalid", "times"},
		{`{"id":"a1","lattice":{"kind":"square","width":100,"height":100},"start":{"site":0},"times":[1],"report":["average"]}`, "a1", "too-large", ""},
		{`{"id":"a2","lattice":{"kind":"square","width":100,"height":100},"start":{"site":0},"times":[1],"method":"exact"}`, "a2", "too-large", ""},
	}
	lines := make([]any, len(cases))
	for i, c := range cases {
		lines[i] = c.line
	}
	res := auditLines(t, lines...)
	for i, c := range cases {
		r := res[i]
		assert.Equal(t, c.id, r["id"], "line %d %s", i, c.line)
		code, field := auditErr(t, r)
		assert.Equal(t, c.code, code, "line %d %s: %v", i, c.line, r["error"])
		if c.field != "" {
			assert.Equal(t, c.field, field, "line %d %s: %v", i, c.line, r["error"])
		}
		if c.code == "too-large" {
			msg := r["error"].(map[string]any)["message"].(string)
			assert.Contains(t, msg, "bytes", "contract: the message gives the estimate")
		}
	}
}

// TestAuditTransport checks the Transport section: one line per request, in
// order, blank lines skipped, CRLF accepted, nothing but JSON on the output,
// logs only on the log writer.
func TestAuditTransport(t *testing.T) {
	good := `{"id":"%s","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":[1]}`
	in := fmt.Sprintf(good, "a") + "\n\n   \n" + "garbage\n" + fmt.Sprintf(good, "b") + "\r\n" +
		fmt.Sprintf(good, "c") // no final newline
	res, out, log := auditServe(t, in)
	require.Len(t, res, 4)
	assert.Equal(t, []any{"a", "", "b", "c"}, []any{res[0]["id"], res[1]["id"], res[2]["id"], res[3]["id"]})
	assert.Nil(t, res[0]["error"])
	assert.Nil(t, res[2]["error"], "CRLF line ending accepted")
	assert.Nil(t, res[3]["error"], "last line without newline")
	assert.Equal(t, 4, strings.Count(out, "\n"), "one output line per request")
	assert.NotEmpty(t, log, "the failure is logged on the log writer")
	for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
		assert.True(t, strings.HasPrefix(l, "{") && strings.HasSuffix(l, "}"), "stdout holds JSON objects only: %q", l)
	}

	// A UTF-8 byte-order mark before the first request is skipped.
	res = auditLines(t, "\ufeff"+fmt.Sprintf(good, "bom"))
	assert.Equal(t, "bom", res[0]["id"])
	assert.Nil(t, res[0]["error"])

	// Leading/trailing blanks and a non-ASCII id are fine; the id comes back
	// unchanged.
	res = auditLines(t, " \t"+`{"id":"\u00e9\ud83d\ude00 x","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1]}`+" \t")
	assert.Equal(t, "é😀 x", res[0]["id"])
	assert.Nil(t, res[0]["error"])

	// A long line (a 20000-bond graph) is read whole.
	var b strings.Builder
	b.WriteString(`{"id":"long","lattice":{"kind":"graph","sites":20001,"bonds":[`)
	for i := 0; i < 20000; i++ {
		if i > 0 {
			b.WriteByte(',')
		}
		fmt.Fprintf(&b, "[%d,%d,1.0]", i, i+1)
	}
	b.WriteString(`]},"start":{"site":10000},"times":[1.5]}`)
	res = auditLines(t, b.String())
	require.Nil(t, res[0]["error"])
	assert.InDelta(t, 2*1.5*1.5, res[0]["msd"].([]any)[0], 1e-8) // MSD = 2t² (Childs, Farhi, Gutmann 2002, from memory)
}

// TestAuditDefaults checks the Request table's defaults: hopping 1,
// dynamics quantum, tolerance 1e-10, method auto, report ["msd","return"],
// id "", and that the response echoes the times and has the contract's
// diagnostics names.
func TestAuditDefaults(t *testing.T) {
	res := auditLines(t,
		`{"lattice":{"kind":"chain","sites":7},"start":{"site":3},"times":[0.5,1]}`,
		`{"id":"full","lattice":{"kind":"chain","sites":7},"hopping":1,"start":{"site":3},"dynamics":"quantum","times":[0.5,1],"tolerance":1e-10,"method":"auto","report":["msd","return"]}`,
	)
	for _, r := range res {
		require.Nil(t, r["error"])
		for _, k := range []string{"id", "sites", "bonds", "times", "msd", "return", "diagnostics"} {
			assert.Contains(t, r, k)
		}
		for _, k := range []string{"populations", "spread", "ipr", "entropy", "polya", "average", "regimes"} {
			assert.NotContains(t, r, k, "not asked for")
		}
		d := r["diagnostics"].(map[string]any)
		for _, k := range []string{"method", "products", "norm_drift", "error_bound", "seconds"} {
			assert.Contains(t, d, k, "diagnostics")
		}
	}
	assert.Equal(t, "", res[0]["id"])
	a, _ := json.Marshal([]any{res[0]["msd"], res[0]["return"]})
	b, _ := json.Marshal([]any{res[1]["msd"], res[1]["return"]})
	assert.JSONEq(t, string(b), string(a), "the defaults are hopping 1, quantum, 1e-10, auto, [msd, return]")
}

// TestAuditDisorder checks the disorder extension: no disorder equals the
// clean walk, results are reproducible, realisations are fixed by (seed, k)
// alone, n > 1 gives X_err and realisations.
func TestAuditDisorder(t *testing.T) {
	base := `{"id":"%s","lattice":{"kind":"square","width":6,"height":6},"start":{"site":14},"times":[0.5,2],"report":["msd","return","ipr"]%s}`
	res := auditLines(t,
		fmt.Sprintf(base, "clean", ""),
		fmt.Sprintf(base, "zero", `,"disorder":{"onsite":0,"bond":0,"law":"box","realisations":1,"seed":3}`),
		fmt.Sprintf(base, "n4", `,"disorder":{"onsite":2,"bond":0.4,"law":"box","realisations":4,"seed":11}`),
		fmt.Sprintf(base, "n4again", `,"disorder":{"onsite":2,"bond":0.4,"law":"box","realisations":4,"seed":11}`),
		fmt.Sprintf(base, "g3", `,"disorder":{"onsite":1,"bond":0.1,"law":"gauss","realisations":3,"seed":5}`),
		fmt.Sprintf(base, "seed12", `,"disorder":{"onsite":2,"bond":0.4,"law":"box","realisations":4,"seed":12}`),
	)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
	}
	for _, k := range []string{"msd", "return", "ipr"} {
		assert.InDeltaSlice(t, res[0][k], res[1][k], 1e-12, "zero disorder is the clean walk: %s", k) // round-off, common practice
		assert.Equal(t, res[2][k], res[3][k], "same seed, same result: %s", k)
		assert.NotEqual(t, res[2][k], res[5][k], "another seed, another result: %s", k)
		for _, i := range []int{2, 4} {
			assert.Contains(t, res[i], k+"_err")
			assert.Len(t, res[i][k+"_err"], 2)
		}
	}
	assert.EqualValues(t, 4, res[2]["realisations"])
	assert.EqualValues(t, 3, res[4]["realisations"])
}

// TestAuditSeries checks a series job on a power law: the local exponent is
// the power and the regime kind is the documented label.
func TestAuditSeries(t *testing.T) {
	var ts, ys, y2 []float64
	for k := 0; k < 40; k++ {
		tt := math.Pow(10, -1+3*float64(k)/39)
		ts = append(ts, tt)
		ys = append(ys, 0.3*tt)
		y2 = append(y2, 2*tt*tt)
	}
	mk := func(id string, y []float64) map[string]any {
		return map[string]any{"id": id, "series": map[string]any{"times": ts, "values": y}, "report": []string{"regimes"}, "fit": map[string]any{"segments": 2}}
	}
	res := auditLines(t, mk("lin", ys), mk("quad", y2))
	for i, want := range []float64{1, 2} {
		r := res[i]
		require.Nil(t, r["error"], "%v", r)
		regs := r["regimes"].([]any)
		require.NotEmpty(t, regs)
		for _, g := range regs {
			m := g.(map[string]any)
			assert.InDelta(t, want, m["exponent"], 1e-6, "exact power law") // least squares on exact data, common practice
			for _, k := range []string{"from", "to", "exponent", "error", "kind"} {
				assert.Contains(t, m, k)
			}
		}
		for _, le := range r["local_exponent"].([]any) {
			assert.InDelta(t, want, le, 1e-6, "d ln y / d ln t of an exact power law") // common practice
		}
		assert.Contains(t, r, "crossovers")
	}
	assert.Equal(t, "diffusive", res[0]["regimes"].([]any)[0].(map[string]any)["kind"])
	assert.Equal(t, "ballistic", res[1]["regimes"].([]any)[0].(map[string]any)["kind"])
}

// TestAuditSpectrumDOS checks that both DOS methods integrate to 1 over the
// bins (contract: density of states per site, integrating to 1).
func TestAuditSpectrumDOS(t *testing.T) {
	res := auditLines(t,
		`{"id":"kpm","lattice":{"kind":"gasket","generation":4},"spectrum":{"dos":{"bins":100,"method":"kpm","moments":256}}}`,
		`{"id":"ex","lattice":{"kind":"gasket","generation":4},"spectrum":{"dos":{"bins":100,"method":"exact"}}}`,
		`{"id":"sq","lattice":{"kind":"square","width":30,"height":30},"spectrum":{"dos":{"bins":64,"method":"kpm","moments":128,"vectors":4,"seed":2}}}`,
		// the contract's spectrum example, literally
		`{"id": "s1", "lattice": {"kind": "gasket", "generation": 5}, "spectrum": {"eigenvalues": true, "dos": {"bins": 200, "method": "kpm", "moments": 512}, "ratio": true, "box_dimension": true}}`,
	)
	assert.Len(t, res[3]["dos"].(map[string]any)["energy"], 200, "bins")
	assert.Contains(t, res[3], "box_dimension")
	assert.Contains(t, res[3], "ratio")
	assert.Len(t, res[3]["eigenvalues"], 366, "(3^6+3)/2 sites")
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
		d := r["dos"].(map[string]any)
		e := d["energy"].([]any)
		rho := d["density"].([]any)
		require.Equal(t, len(e), len(rho))
		require.Greater(t, len(e), 1)
		de := e[1].(float64) - e[0].(float64)
		sum := 0.0
		for _, x := range rho {
			sum += x.(float64) * de
		}
		assert.InDelta(t, 1, sum, 1e-6, "%s: ∫ρ dE = 1 (contract)", r["id"]) // normalisation, contract
	}
}

// TestAuditDisorderLaws checks the disorder laws through spectrum jobs on
// graphs whose eigenvalues are the drawn numbers: isolated sites (on-site
// energies) and isolated pairs (eigenvalues ±γ(1+δ)). Box: uniform in
// [−W/2, W/2], standard deviation W/√12; gauss: standard deviation W
// (contract, Extensions). 1000 draws give the sample standard deviation to
// about 2.2%; 10% is ≈ 4.5σ (common practice).
func TestAuditDisorderLaws(t *testing.T) {
	const n = 1000
	pairs := make([][2]int, n/2)
	for i := range pairs {
		pairs[i] = [2]int{2 * i, 2*i + 1}
	}
	mk := func(id string, bonds any, hop float64, dis map[string]any) map[string]any {
		return map[string]any{"id": id, "lattice": map[string]any{"kind": "graph", "sites": n, "bonds": bonds},
			"hopping": hop, "spectrum": map[string]any{"eigenvalues": true}, "disorder": dis}
	}
	res := auditLines(t,
		mk("box", [][2]int{}, 1, map[string]any{"onsite": 2.0, "law": "box", "seed": 7}),
		mk("gauss", [][2]int{}, 1, map[string]any{"onsite": 0.5, "law": "gauss", "seed": 7}),
		mk("bondbox", pairs, 1.5, map[string]any{"bond": 0.6, "law": "box", "seed": 7}),
		mk("bondgauss", pairs, 1, map[string]any{"bond": 0.2, "law": "gauss", "seed": 7}),
		mk("default", [][2]int{}, 1, map[string]any{"onsite": 2.0, "seed": 7}),
	)
	stats := func(r map[string]any, positive bool) (lo, hi, mean, sd float64) {
		require.Nil(t, r["error"], "%v", r)
		var xs []float64
		for _, v := range r["eigenvalues"].([]any) {
			if x := v.(float64); !positive || x > 0 {
				xs = append(xs, x)
			}
		}
		lo, hi = math.Inf(1), math.Inf(-1)
		for _, x := range xs {
			lo, hi, mean = math.Min(lo, x), math.Max(hi, x), mean+x
		}
		mean /= float64(len(xs))
		for _, x := range xs {
			sd += (x - mean) * (x - mean)
		}
		return lo, hi, mean, math.Sqrt(sd / float64(len(xs)-1))
	}
	lo, hi, mean, sd := stats(res[0], false)
	assert.True(t, lo >= -1 && hi <= 1, "box W=2 in [−1, 1]: %v %v", lo, hi)
	assert.InDelta(t, 0, mean, 0.1)               // ≈ 4.5σ for 1000 draws (see above)
	assert.InEpsilon(t, 2/math.Sqrt(12), sd, 0.1) // ≈ 4.5σ for 1000 draws (see above)
	_, _, mean, sd = stats(res[1], false)
	assert.InDelta(t, 0, mean, 0.1)   // ≈ 4.5σ for 1000 draws (see above)
	assert.InEpsilon(t, 0.5, sd, 0.1) // ≈ 4.5σ for 1000 draws (see above)
	lo, hi, mean, sd = stats(res[2], true)
	assert.True(t, lo >= 1.5*0.7-1e-12 && hi <= 1.5*1.3+1e-12, "γ(1+δ), δ in [−0.3, 0.3]: %v %v", lo, hi)
	assert.InDelta(t, 1.5, mean, 0.04)                  // σ_mean ≈ 0.008, common practice
	assert.InEpsilon(t, 1.5*0.6/math.Sqrt(12), sd, 0.1) // ≈ 4.5σ for 1000 draws (see above)
	_, _, mean, sd = stats(res[3], true)
	assert.InDelta(t, 1, mean, 0.04)  // σ_mean ≈ 0.006, common practice
	assert.InEpsilon(t, 0.2, sd, 0.1) // ≈ 4.5σ for 1000 draws (see above)
	assert.Equal(t, res[0]["eigenvalues"], res[4]["eigenvalues"], "law defaults to box")
}

// TestAuditDisorderRealisations checks that realisation k depends on
// (seed, k) alone: the mean over n realisations equals the mean of the n
// single realisations recomputed on their own (extension "first"), and
// X_err is the standard error of that mean.
func TestAuditDisorderRealisations(t *testing.T) {
	const n = 5
	mk := func(id string, first, count int) map[string]any {
		return map[string]any{"id": id, "lattice": map[string]any{"kind": "square", "width": 5, "height": 5},
			"start": map[string]any{"site": 12}, "times": []float64{0.5, 2},
			"report":   []string{"msd", "return", "ipr", "entropy", "spread", "polya"},
			"disorder": map[string]any{"onsite": 1.5, "bond": 0.3, "law": "box", "seed": 42, "first": first, "realisations": count}}
	}
	reqs := []any{mk("all", 0, n)}
	for k := 0; k < n; k++ {
		reqs = append(reqs, mk(fmt.Sprint(k), k, 1))
	}
	res := auditLines(t, reqs...)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
	}
	all := res[0]
	assert.EqualValues(t, n, all["realisations"])
	for _, key := range []string{"msd", "return", "ipr", "entropy", "spread"} {
		for ti := 0; ti < 2; ti++ {
			var xs []float64
			for k := 1; k <= n; k++ {
				xs = append(xs, res[k][key].([]any)[ti].(float64))
			}
			mean, se := auditMeanSE(xs)
			assert.InDelta(t, mean, all[key].([]any)[ti], 1e-12*(1+math.Abs(mean)), key) // round-off, common practice
			assert.InDelta(t, se, all[key+"_err"].([]any)[ti], 1e-12*(1+se), key+"_err") // round-off, common practice
		}
	}
	var ps []float64
	for k := 1; k <= n; k++ {
		ps = append(ps, res[k]["polya"].(float64))
	}
	mean, se := auditMeanSE(ps)
	assert.InDelta(t, mean, all["polya"], 1e-12)   // round-off, common practice
	assert.InDelta(t, se, all["polya_err"], 1e-12) // round-off, common practice
}

func auditMeanSE(xs []float64) (mean, se float64) {
	for _, x := range xs {
		mean += x
	}
	mean /= float64(len(xs))
	for _, x := range xs {
		se += (x - mean) * (x - mean)
	}
	return mean, math.Sqrt(se / float64(len(xs)-1) / float64(len(xs)))
}

// TestAuditTimesAndRegimes checks that list times are echoed exactly, that
// null means the default, that the grid forms include both ends, and the
// regime analysis of walks with known MSD: classical line MSD = 2t (every
// regime diffusive, exponent 1), quantum line MSD = 2t² (ballistic,
// exponent 2), and that the fit window is respected.
func TestAuditTimesAndRegimes(t *testing.T) {
	res := auditLines(t,
		`{"id":"echo","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":[0,0.1,0.30000000000000004,0.30000000000000004,7.25]}`,
		`{"id":"null","lattice":{"kind":"chain","sites":5},"start":{"site":2,"near":null},"hopping":null,"times":[0.30000000000000004,2.5e3]}`,
		`{"id":"lin","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":{"from":0.1,"to":0.7,"count":7,"spacing":"linear"}}`,
		`{"id":"log","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":{"from":0.001,"to":1000,"count":7,"spacing":"log"}}`,
		`{"id":"cl","lattice":{"kind":"chain","sites":801},"dynamics":"classical","start":{"site":400},"times":{"from":0.01,"to":300,"count":60,"spacing":"log"},"report":["regimes"]}`,
		`{"id":"qu","lattice":{"kind":"chain","sites":801},"start":{"site":400},"times":{"from":0.01,"to":100,"count":40,"spacing":"log"},"report":["regimes"]}`,
		`{"id":"win","lattice":{"kind":"chain","sites":401},"start":{"site":200},"times":{"from":0.1,"to":50,"count":40,"spacing":"log"},"report":["regimes"],"fit":{"quantity":"spread","from":1,"to":30,"segments":1}}`,
	)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
	}
	assert.Equal(t, []any{0.0, 0.1, 0.30000000000000004, 0.30000000000000004, 7.25}, res[0]["times"], "times exactly as requested")
	assert.Equal(t, []any{0.30000000000000004, 2.5e3}, res[1]["times"])
	lin := res[2]["times"].([]any)
	require.Len(t, lin, 7)
	assert.Equal(t, 0.1, lin[0])
	assert.Equal(t, 0.7, lin[6], "the grid ends exactly at to")
	lg := res[3]["times"].([]any)
	require.Len(t, lg, 7)
	assert.Equal(t, 0.001, lg[0])
	assert.Equal(t, 1000.0, lg[6])
	assert.Equal(t, []any{0.001, 0.01, 0.1, 1.0, 10.0, 100.0, 1000.0}, lg, "log grid on exact decades")
	require.Len(t, res[4]["regimes"], 1, "a pure power law is one regime")
	assert.Empty(t, res[4]["crossovers"])
	for _, g := range res[4]["regimes"].([]any) {
		m := g.(map[string]any)
		assert.Equal(t, "diffusive", m["kind"], "MSD = 2t (classical line)")
		assert.InDelta(t, 1, m["exponent"], 1e-4, "MSD = 2t") // state error ≤ 1e-10 moves MSD by ≲ 1e-7 relative (audit), common practice margin
	}
	for _, le := range res[4]["local_exponent"].([]any) {
		assert.InDelta(t, 1, le, 1e-4, "d ln(2t)/d ln t") // same margin
	}
	first := res[5]["regimes"].([]any)[0].(map[string]any)
	assert.Equal(t, "ballistic", first["kind"], "MSD = 2t² (Childs, Farhi, Gutmann 2002, from memory)")
	assert.InDelta(t, 2, first["exponent"], 1e-3) // common practice
	w := res[6]
	regs := w["regimes"].([]any)
	require.Len(t, regs, 1, "segments: 1")
	m := regs[0].(map[string]any)
	assert.GreaterOrEqual(t, m["from"], 1.0)
	assert.LessOrEqual(t, m["to"], 30.0)
	assert.InDelta(t, 2, m["exponent"], 1e-9, "spread = 2t² on the line (mean stays at the start)") // exact data, common practice
	assert.Empty(t, w["crossovers"])
}

// cancelAfterFirst is an io.Writer that cancels the Serve context once the
// first response line has been written.
type cancelAfterFirst struct {
	buf    bytes.Buffer
	cancel context.CancelFunc
}

func (c *cancelAfterFirst) Write(p []byte) (int, error) {
	n, err := c.buf.Write(p)
	c.cancel()
	return n, err
}

// TestAuditCancelled checks the "cancelled" code: a job running when the
// context is cancelled is answered with its id and code "cancelled", and
// Serve stops.
func TestAuditCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	w := &cancelAfterFirst{cancel: cancel}
	in := `{"id":"first","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1]}` + "\n" +
		`{"id":"long","lattice":{"kind":"square","width":300,"height":300},"start":{"site":45150},"times":{"from":1,"to":2000,"count":2000},"method":"chebyshev"}` + "\n" +
		`{"id":"never","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1]}` + "\n"
	err := walk.Serve(ctx, strings.NewReader(in), w, nil)
	require.ErrorIs(t, err, context.Canceled)
	lines := strings.Split(strings.TrimSpace(w.buf.String()), "\n")
	require.NotEmpty(t, lines)
	var first map[string]any
	require.NoError(t, json.Unmarshal([]byte(lines[0]), &first))
	assert.Equal(t, "first", first["id"])
	assert.Nil(t, first["error"])
	if len(lines) > 1 {
		var r map[string]any
		require.NoError(t, json.Unmarshal([]byte(lines[1]), &r))
		assert.Equal(t, "long", r["id"])
		code, _ := auditErr(t, r)
		assert.Equal(t, "cancelled", code)
	}
	assert.LessOrEqual(t, len(lines), 2, "nothing after the cancelled job")
}

// TestAuditSeriesCrossover checks the regime analysis on a broken power
// law y = t² (t ≤ 1), y = t (t ≥ 1), exact and with 2% noise and errors:
// two regimes, ballistic then diffusive, crossover at t = 1 inside its 95%
// interval; and the local exponent of y = t²/(1+t), whose exact value is
// 2 − t/(1+t).
func TestAuditSeriesCrossover(t *testing.T) {
	var ts, y, noisy, errs, smooth []float64
	// Deterministic ±2% perturbation pattern (common practice: fixed, no RNG).
	pert := []float64{0.013, -0.017, 0.004, 0.019, -0.008, -0.02, 0.011, 0.002, -0.013, 0.016}
	for k := 0; k <= 40; k++ {
		tt := math.Pow(10, -2+4*float64(k)/40)
		v := tt
		if tt < 1 {
			v = tt * tt
		}
		ts = append(ts, tt)
		y = append(y, v)
		noisy = append(noisy, v*(1+pert[k%len(pert)]))
		errs = append(errs, 0.02*v)
		smooth = append(smooth, tt*tt/(1+tt))
	}
	mk := func(id string, v, e []float64) map[string]any {
		s := map[string]any{"times": ts, "values": v}
		if e != nil {
			s["errors"] = e
		}
		return map[string]any{"id": id, "series": s, "report": []string{"regimes"}, "fit": map[string]any{"segments": 4}}
	}
	res := auditLines(t, mk("exact", y, nil), mk("noisy", noisy, errs), mk("smooth", smooth, nil))
	for _, r := range res[:2] {
		require.Nil(t, r["error"], "%v", r)
		regs := r["regimes"].([]any)
		require.Len(t, regs, 2, "%s", r["id"])
		a, b := regs[0].(map[string]any), regs[1].(map[string]any)
		assert.Equal(t, "ballistic", a["kind"])
		assert.Equal(t, "diffusive", b["kind"])
		assert.InDelta(t, 2, a["exponent"], 0.02) // 2% noise over a decade, common practice
		assert.InDelta(t, 1, b["exponent"], 0.02) // same
		cr := r["crossovers"].([]any)
		require.Len(t, cr, 1)
		c := cr[0].(map[string]any)
		assert.InDelta(t, 1, c["time"], 0.1)          // one grid step is ×1.26, common practice
		assert.LessOrEqual(t, c["low"], 1.0+1e-9)     // round-off
		assert.GreaterOrEqual(t, c["high"], 1.0-1e-9) // round-off
	}
	r := res[2]
	require.Nil(t, r["error"], "%v", r)
	ft := r["fit_times"].([]any)
	le := r["local_exponent"].([]any)
	require.Equal(t, len(ft), len(le))
	for i := range ft {
		x := ft[i].(float64)
		// 0.01: twice the error seen with 41 points per 4 decades (audit).
		assert.InDelta(t, 2-x/(1+x), le[i], 0.01, "t = %v", x)
	}
}

// TestAuditBoxDimension checks box_dimension on sets with a known
// dimension: a chain (1), a square patch (2), the Sierpinski carpet
// (ln 8/ln 3, Mandelbrot 1982, from memory) and the gasket (ln 3/ln 2, same
// source); 0.03 for the gasket's finite-size bias (audit: 1.523 at g=7 while
// the fit ran up to the extent; 1.576–1.588 with boxes up to extent/4).
func TestAuditBoxDimension(t *testing.T) {
	res := auditLines(t,
		`{"id":"chain","lattice":{"kind":"chain","sites":1000},"spectrum":{"box_dimension":true}}`,
		`{"id":"square","lattice":{"kind":"square","width":64,"height":64},"spectrum":{"box_dimension":true}}`,
		`{"id":"carpet","lattice":{"kind":"carpet","generation":4,"variant":"cells"},"spectrum":{"box_dimension":true}}`,
		`{"id":"gasket","lattice":{"kind":"gasket","generation":8},"spectrum":{"box_dimension":true}}`,
	)
	want := []struct{ d, tol float64 }{{1, 0.02}, {2, 0.02}, {math.Log(8) / math.Log(3), 0.02}, {math.Log(3) / math.Log(2), 0.03}} // tolerances: common practice for box counts
	for i, r := range res {
		require.Nil(t, r["error"], "%v", r)
		b := r["box_dimension"].(map[string]any)
		for _, k := range []string{"dimension", "error", "smallest", "largest"} {
			assert.Contains(t, b, k)
		}
		assert.InDelta(t, want[i].d, b["dimension"], want[i].tol, "%s", r["id"])
		assert.Less(t, b["smallest"], b["largest"])
	}
}

// TestAuditNumerical checks that an overflowing propagation is answered
// with code "numerical" and no partial result (contract: never NaN).
func TestAuditNumerical(t *testing.T) {
	res := auditLines(t,
		`{"id":"o1","lattice":{"kind":"chain","sites":5},"hopping":1e300,"start":{"site":2},"times":[1e10]}`,
		`{"id":"o2","lattice":{"kind":"graph","sites":2,"bonds":[[0,1,1e200]],"positions":[[0],[1e200]]},"start":{"site":0},"times":[1],"report":["msd","spread"]}`,
	)
	for _, r := range res {
		code, _ := auditErr(t, r)
		assert.Equal(t, "numerical", code, "%v", r)
	}
	assert.Equal(t, "o1", res[0]["id"])
	assert.Equal(t, "o2", res[1]["id"])
}

// TestAuditConcurrentServe runs several Serve loops at once (a service
// serving many connections) and checks each answers exactly like a lone
// loop, seconds aside.
func TestAuditConcurrentServe(t *testing.T) {
	in := strings.Join([]string{
		`{"id":"a","lattice":{"kind":"gasket","generation":4},"start":{"near":[0,0]},"times":[0.5,1,2],"report":["msd","return","spread","ipr","entropy","polya"]}`,
		`{"id":"b","lattice":{"kind":"square","width":8,"height":8},"start":{"site":27},"times":[1,2],"disorder":{"onsite":1,"bond":0.2,"realisations":6,"seed":9},"report":["msd","return","populations"]}`,
		`{"id":"c","lattice":{"kind":"chain","sites":50},"dynamics":"classical","start":{"site":25},"times":{"from":0.1,"to":10,"count":12,"spacing":"log"},"report":["regimes"]}`,
		`{"id":"d","lattice":{"kind":"gasket","generation":3},"spectrum":{"eigenvalues":true,"ratio":true,"dos":{"bins":20,"method":"kpm","moments":64}}}`,
		`bad line`,
	}, "\n") + "\n"
	strip := func(out string) []string {
		var res []string
		for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
			var m map[string]any
			require.NoError(t, json.Unmarshal([]byte(l), &m))
			if d, ok := m["diagnostics"].(map[string]any); ok {
				delete(d, "seconds")
			}
			p, _ := json.Marshal(m)
			res = append(res, string(p))
		}
		return res
	}
	_, lone, _ := auditServe(t, in)
	want := strip(lone)
	const loops = 4
	outs := make([]bytes.Buffer, loops)
	errs := make(chan error, loops)
	for i := 0; i < loops; i++ {
		go func(i int) {
			errs <- walk.Serve(context.Background(), strings.NewReader(in), &outs[i], io.Discard)
		}(i)
	}
	for i := 0; i < loops; i++ {
		require.NoError(t, <-errs)
	}
	for i := range outs {
		assert.Equal(t, want, strip(outs[i].String()), "loop %d", i)
	}
}

// TestAuditBridgeBinary drives the built bridge (examples/bridge) as a
// notebook would: exit status 0 at end of input even with failed lines,
// only JSON lines on stdout, logs on stderr, and a non-zero status when
// stdin cannot be read at all (contract, Transport).
func TestAuditBridgeBinary(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the bridge binary")
	}
	goBin, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go command on PATH")
	}
	bin := filepath.Join(t.TempDir(), "ampwalk-bridge")
	out, err := exec.Command(goBin, "build", "-o", bin, "../examples/bridge").CombinedOutput()
	require.NoError(t, err, string(out))

	in := "\ufeff" + `{"id":"a","lattice":{"kind":"gasket","generation":3},"start":{"near":[0,0]},"times":[0.5,1]}` + "\r\n" +
		"\n" + `not json` + "\n" +
		`{"id":"b","lattice":{"kind":"gasket","generation":-2},"start":{"site":0},"times":[1]}` + "\n" +
		`{"id":"c","lattice":{"kind":"chain","sites":4},"start":{"site":0},"times":[1],"report":["populations"]}`
	cmd := exec.Command(bin)
	cmd.Stdin = strings.NewReader(in)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	require.NoError(t, cmd.Run(), "exit status 0 at end of input even with failed lines")
	lines := strings.Split(strings.TrimRight(stdout.String(), "\n"), "\n")
	require.Len(t, lines, 4)
	ids := []string{"a", "", "b", "c"}
	for i, l := range lines {
		var m map[string]any
		require.NoError(t, json.Unmarshal([]byte(l), &m), "stdout line %d is JSON: %q", i, l)
		assert.Equal(t, ids[i], m["id"])
	}
	assert.NotEmpty(t, stderr.String(), "logs go to stderr")
	assert.NotContains(t, stdout.String(), "ampwalk:", "no log text on stdout")

	dir, err := os.Open(t.TempDir())
	require.NoError(t, err)
	defer dir.Close()
	cmd = exec.Command(bin)
	cmd.Stdin = dir // reading a directory fails: the input cannot be read at all
	err = cmd.Run()
	var ee *exec.ExitError
	require.ErrorAs(t, err, &ee)
	assert.NotEqual(t, 0, ee.ExitCode())
}

// TestAuditRegimeCounts checks that the regime analysis does not split
// smooth curves: a power law with a tiny log correction is one regime, and
// the quantum line up to t = 300 (801 sites, start in the middle) is
// ballistic until the front reaches the ends (2γt ≈ 400, so t ≈ 200;
// scipy expm_multiply gives d ln MSD/d ln t = 2.000000 up to t = 178).
func TestAuditRegimeCounts(t *testing.T) {
	var ts, y []float64
	for k := 0; k < 60; k++ {
		tt := math.Pow(10, -2+math.Log10(3e4)*float64(k)/59)
		ts = append(ts, tt)
		y = append(y, 2*tt*(1+1e-3*math.Log(tt)))
	}
	res := auditLines(t,
		map[string]any{"id": "log", "series": map[string]any{"times": ts, "values": y}, "fit": map[string]any{"segments": 4}},
		`{"id":"qu","lattice":{"kind":"chain","sites":801},"start":{"site":400},"times":{"from":0.01,"to":300,"count":60,"spacing":"log"},"report":["regimes"]}`,
	)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
	}
	assert.Len(t, res[0]["regimes"], 1, "2t(1+1e-3 ln t) is one diffusive regime")
	regs := res[1]["regimes"].([]any)
	require.GreaterOrEqual(t, len(regs), 2)
	first := regs[0].(map[string]any)
	assert.InDelta(t, 2, first["exponent"], 0.01, "MSD = 2t² (Childs, Farhi, Gutmann 2002, from memory)")
	assert.Equal(t, "ballistic", first["kind"])
	assert.GreaterOrEqual(t, first["to"], 150.0, "ballistic until the front reaches the ends")
	// Past the kink the local exponent follows the exact curve (scipy
	// expm_multiply: d ln MSD/d ln t = −0.696 at t = 251.9, −1.408 at 300);
	// 0.25 allows the ×1.19 grid (common practice).
	le := res[1]["local_exponent"].([]any)
	require.GreaterOrEqual(t, len(le), 2)
	assert.InDelta(t, -0.696, le[len(le)-2], 0.25, "t = 251.9")
	assert.InDelta(t, -1.408, le[len(le)-1], 0.25, "t = 300")
	cr := res[1]["crossovers"].([]any)
	require.NotEmpty(t, cr)
	assert.InDelta(t, 200, cr[0].(map[string]any)["time"], 50, "front reaches the ends at 2γt ≈ 400") // grid step ×1.19, common practice margin
}

// TestAuditProbabilityClamp checks that outputs stay probabilities when the
// propagated state is within tolerance but its norm exceeds 1 by round-off
// (an isolated start site with an on-site energy: p_start = 1 exactly), and
// that times below rounding propagate as t = 0.
func TestAuditProbabilityClamp(t *testing.T) {
	res := auditLines(t,
		`{"id":"iso","lattice":{"kind":"graph","sites":3,"bonds":[[1,2,2.9]],"onsite":[-1.7,0.5,0.1]},"start":{"site":0},"times":[1.2,1.9,4.3],"method":"chebyshev","tolerance":1e-8,"report":["return","polya","populations"]}`,
		`{"id":"tiny","lattice":{"kind":"gasket","generation":2},"start":{"site":0},"times":[1e-300,1e-20],"method":"chebyshev"}`,
		`{"id":"tinyc","lattice":{"kind":"square","width":200,"height":200},"start":{"site":20100},"times":[1e-300,2.0],"dynamics":"classical"}`,
	)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
		for _, p := range r["return"].([]any) {
			assert.LessOrEqual(t, p.(float64), 1.0, "%s", r["id"])
			assert.GreaterOrEqual(t, p.(float64), 0.0, "%s", r["id"])
		}
	}
	assert.InDelta(t, 1, res[0]["polya"], 1e-12, "p_start = 1 at every time")             // round-off, common practice
	assert.InDelta(t, 1, res[1]["return"].([]any)[0], 1e-12, "t below rounding is t = 0") // round-off, common practice
	assert.InDelta(t, 1, res[2]["return"].([]any)[0], 1e-12, "t below rounding is t = 0") // round-off, common practice
}

// TestAuditSeriesExtremes checks that legal but extreme series (values up
// to 1e300, errors down to 1e-300) are analysed, not refused as numerical.
func TestAuditSeriesExtremes(t *testing.T) {
	res := auditLines(t,
		`{"id":"big","series":{"times":[1,2,3,4,5,6],"values":[1,2,4,8,1e300,10],"errors":[0.1,0.1,0.1,0.1,0.1,0.1]},"report":["regimes"],"fit":{"segments":2}}`,
		`{"id":"tiny","series":{"times":[1,2,3,4,5,6],"values":[1,2,4,8,9,10],"errors":[0.1,0.1,0.1,1e-300,0.1,0.1]},"report":["regimes"],"fit":{"segments":2}}`,
	)
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
		assert.NotEmpty(t, r["regimes"], "%s", r["id"])
	}
}

// TestAuditSmallTimes checks every method at small positive times (each
// alone and as one list): Chebyshev and Krylov agree with the exact
// eigenbasis within the default tolerance, for both dynamics.
func TestAuditSmallTimes(t *testing.T) {
	ts := []float64{1e-15, 1e-13, 3e-13, 1e-11, 3e-9, 1e-7, 3e-7, 1e-6, 3e-6, 1e-4, 1e-2}
	var reqs []any
	for _, dyn := range []string{"quantum", "classical"} {
		for _, m := range []string{"exact", "chebyshev", "krylov"} {
			reqs = append(reqs, map[string]any{"id": dyn + "-" + m + "-all", "lattice": map[string]any{"kind": "gasket", "generation": 3},
				"start": map[string]any{"site": 0}, "times": ts, "method": m, "dynamics": dyn, "report": []string{"populations"}})
			for _, tt := range ts {
				reqs = append(reqs, map[string]any{"id": fmt.Sprintf("%s-%s-%g", dyn, m, tt), "lattice": map[string]any{"kind": "gasket", "generation": 3},
					"start": map[string]any{"site": 0}, "times": []float64{tt}, "method": m, "dynamics": dyn, "report": []string{"populations"}})
			}
		}
	}
	res := auditLines(t, reqs...)
	byID := map[string][]any{}
	for _, r := range res {
		require.Nil(t, r["error"], "%v", r)
		byID[r["id"].(string)] = r["populations"].([]any)
	}
	for _, dyn := range []string{"quantum", "classical"} {
		ref := byID[dyn+"-exact-all"]
		for _, m := range []string{"exact", "chebyshev", "krylov"} {
			for k, tt := range ts {
				for _, got := range [][]any{byID[dyn+"-"+m+"-all"][k].([]any), byID[fmt.Sprintf("%s-%s-%g", dyn, m, tt)][0].([]any)} {
					for j := range got {
						assert.InDelta(t, ref[k].([]any)[j], got[j], 1e-10, "%s %s t=%g site %d", dyn, m, tt, j) // default tolerance 1e-10 (contract)
					}
				}
			}
		}
	}
}

// TestAuditClassicalEquilibrium checks very long classical times: every
// mode of −γL but the constant one decays, so p(t) is the uniform
// distribution on the start's component (1/8 on the 3-cube) to round-off.
func TestAuditClassicalEquilibrium(t *testing.T) {
	var reqs []any
	for _, tt := range []float64{1e6, 1e12, 1e300} {
		for _, m := range []string{"auto", "krylov"} {
			reqs = append(reqs, map[string]any{"id": fmt.Sprintf("%s-%g", m, tt), "lattice": map[string]any{"kind": "hypercube", "dimension": 3},
				"dynamics": "classical", "start": map[string]any{"site": 0}, "times": []float64{tt}, "method": m, "report": []string{"populations"}})
		}
	}
	for _, r := range auditLines(t, reqs...) {
		require.Nil(t, r["error"], "%v", r)
		for _, p := range r["populations"].([]any)[0].([]any) {
			assert.InDelta(t, 0.125, p, 1e-10, "%s", r["id"]) // default tolerance (contract)
		}
	}
}
