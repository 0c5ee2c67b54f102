package walk

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// serveLines runs Serve on the given request lines and decodes each output
// line into a generic map (so that the test sees exactly the wire format).
func serveLines(t *testing.T, lines ...string) []map[string]any {
	t.Helper()
	var out, log bytes.Buffer
	err := Serve(context.Background(), strings.NewReader(strings.Join(lines, "\n")+"\n"), &out, &log)
	require.NoError(t, err)
	var res []map[string]any
	sc := bufio.NewScanner(&out)
	sc.Buffer(nil, 1<<26)
	for sc.Scan() {
		var m map[string]any
		require.NoError(t, json.Unmarshal(sc.Bytes(), &m), sc.Text())
		res = append(res, m)
	}
	return res
}

func floats(t *testing.T, v any) []float64 {
	t.Helper()
	l, ok := v.([]any)
	require.True(t, ok, "not a list: %v", v)
	out := make([]float64, len(l))
	for i, x := range l {
		out[i] = x.(float64)
	}
	return out
}

func errCode(m map[string]any) (code, field string) {
	e, ok := m["error"].(map[string]any)
	if !ok {
		return "", ""
	}
	f, _ := e["field"].(string)
	return e["code"].(string), f
}

func TestServeLatticeCounts(t *testing.T) {
	// Site and bond counts fixed by the job-format contract
	// (../shared/spec/job-format.md), gasket counts also in references.md.
	pow := func(b, e int) int { return int(math.Pow(float64(b), float64(e))) }
	cases := []struct {
		lattice      string
		sites, bonds int
	}{
		{`{"kind":"chain","sites":7}`, 7, 6},
		{`{"kind":"chain","sites":7,"periodic":true}`, 7, 7},
		{`{"kind":"square","width":4,"height":3}`, 12, 3*3 + 4*2},
		{`{"kind":"triangle","side":4}`, (4 + 1) * (4 + 2) / 2, 3 * 4 * (4 + 1) / 2},
		{`{"kind":"gasket","generation":0}`, 3, 3},
		{`{"kind":"gasket","generation":3}`, (pow(3, 4) + 3) / 2, pow(3, 4)},
		{`{"kind":"gasket","generation":5}`, (pow(3, 6) + 3) / 2, pow(3, 6)},
		{`{"kind":"carpet","generation":2}`, pow(8, 2), -1},
		{`{"kind":"hypercube","dimension":4}`, 16, 4 * 16 / 2},
		{`{"kind":"graph","sites":4,"bonds":[[0,1],[1,2,0.5],[2,3]]}`, 4, 3},
	}
	var lines []string
	for k, c := range cases {
		lines = append(lines, fmt.Sprintf(`{"id":"c%d","lattice":%s,"start":{"site":0},"times":[0,0.5]}`, k, c.lattice))
	}
	res := serveLines(t, lines...)
	require.Len(t, res, len(cases))
	for k, c := range cases {
		r := res[k]
		code, _ := errCode(r)
		require.Empty(t, code, "%s: %v", c.lattice, r["error"])
		assert.Equal(t, fmt.Sprintf("c%d", k), r["id"])
		assert.Equal(t, float64(c.sites), r["sites"], c.lattice)
		if c.bonds >= 0 {
			assert.Equal(t, float64(c.bonds), r["bonds"], c.lattice)
		}
		assert.Equal(t, []float64{0, 0.5}, floats(t, r["times"]))
		// At t = 0 the walker sits on its start: MSD 0, return 1.
		assert.Equal(t, 0.0, floats(t, r["msd"])[0])
		assert.InDelta(t, 1, floats(t, r["return"])[0], 1e-12)
		assert.Contains(t, r, "diagnostics")
	}
}

func TestServeOrderAndBadLines(t *testing.T) {
	good := `{"id":"%s","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":[1]}`
	res := serveLines(t,
		fmt.Sprintf(good, "a"),
		`this is not json`,
		`{"id":"b","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":[1],"colour":"red"}`,
		``,
		fmt.Sprintf(good, "c"),
		`{"id":"d","lattice":{"kind":"gasket","generation":-2},"start":{"site":0},"times":[1]}`,
		`{"id":"e","lattice":{"kind":"chain","sites":5},"start":{"site":9},"times":[1]}`,
		`{"id":"f","lattice":{"kind":"gasket","generaton":3},"start":{"site":0},"times":[1]}`,
		fmt.Sprintf(good, "g"),
	)
	// Blank lines are skipped; every other line gets exactly one answer.
	require.Len(t, res, 8)
	want := []struct{ id, code, field string }{
		{"a", "", ""}, {"", "malformed", ""}, {"b", "unknown-field", "colour"}, {"c", "", ""},
		{"d", "invalid", "lattice.generation"}, {"e", "invalid", "start.site"},
		{"f", "unknown-field", "lattice.generaton"}, {"g", "", ""},
	}
	for k, w := range want {
		assert.Equal(t, w.id, res[k]["id"], "line %d", k)
		code, field := errCode(res[k])
		assert.Equal(t, w.code, code, "line %d: %v", k, res[k])
		assert.Equal(t, w.field, field, "line %d", k)
		if w.code != "" {
			// An error line carries nothing but the id and the error.
			assert.Len(t, res[k], 2, "line %d: %v", k, res[k])
			assert.NotContains(t, res[k]["error"].(map[string]any)["message"], "goroutine")
		}
	}
	// The contract's example: "generation must be between 0 and 16; got -2".
	msg := res[4]["error"].(map[string]any)["message"].(string)
	assert.Contains(t, msg, "between 0 and 16")
	assert.Contains(t, msg, "-2")
}

func TestServeTooLarge(t *testing.T) {
	// The populations limit of job.go, the dense-size limit of "exact" and
	// the memory limit (AMPWALK_MEMORY_LIMIT, internal/fault) each refuse
	// with too-large and an estimate in the message.
	t.Setenv("AMPWALK_MEMORY_LIMIT", "100000000")
	res := serveLines(t,
		`{"id":"p","lattice":{"kind":"chain","sites":100000},"start":{"site":0},"times":{"from":0,"to":1,"count":100},"report":["populations"]}`,
		`{"id":"x","lattice":{"kind":"chain","sites":5000},"start":{"site":0},"times":[1],"method":"exact"}`,
		`{"id":"a","lattice":{"kind":"chain","sites":5000},"start":{"site":0},"times":[1],"report":["average"]}`,
		`{"id":"m","lattice":{"kind":"chain","sites":10000000},"start":{"site":0},"times":[1]}`,
	)
	for _, r := range res {
		code, _ := errCode(r)
		assert.Equal(t, "too-large", code, "%v", r)
		assert.Contains(t, r["error"].(map[string]any)["message"], "bytes", "%v", r)
	}
}

func TestServeCancelled(t *testing.T) {
	// A log writer that cancels the context on the first progress line: the
	// job in flight answers "cancelled" and Serve stops.
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	var out bytes.Buffer
	log := writerFunc(func(p []byte) (int, error) { cancel(); return len(p), nil })
	in := `{"id":"c","lattice":{"kind":"chain","sites":2001},"start":{"site":1000},"times":{"from":0,"to":400,"count":400}}` + "\n" +
		`{"id":"never","lattice":{"kind":"chain","sites":5},"start":{"site":0},"times":[1]}` + "\n"
	err := Serve(ctx, strings.NewReader(in), &out, log)
	assert.ErrorIs(t, err, context.Canceled)
	var m map[string]any
	require.NoError(t, json.Unmarshal(bytes.TrimSpace(out.Bytes()), &m), out.String())
	code, _ := errCode(m)
	assert.Equal(t, "cancelled", code)
	assert.Equal(t, "c", m["id"])

	j, err := Decode([]byte(`{"lattice":{"kind":"chain","sites":50},"start":{"site":0},"times":[1,2]}`))
	require.NoError(t, err)
	_, err = j.Run(ctx, nil)
	assert.Equal(t, "cancelled", ErrorCode(err))
}

type writerFunc func(p []byte) (int, error)

func (f writerFunc) Write(p []byte) (int, error) { return f(p) }

func TestServeChainExact(t *testing.T) {
	// Infinite line, H = γA: MSD = 2γ²t², return J_0(2γt)². Childs, Farhi,
	// Gutmann, Quantum Inf. Process. 1, 35 (2002) (from memory);
	// references.md. The chain of 401 sites started in the middle matches
	// the line until the front (speed 2γ) reaches an end: t ≤ 10 here.
	res := serveLines(t,
		`{"id":"q","lattice":{"kind":"chain","sites":401},"start":{"near":[200,0]},"times":{"from":0,"to":10,"count":21},"tolerance":1e-12}`,
		`{"id":"h","lattice":{"kind":"chain","sites":401},"hopping":0.5,"start":{"site":200},"times":[0,1,2,4,8]}`,
	)
	for _, r := range res {
		code, _ := errCode(r)
		require.Empty(t, code, "%v", r["error"])
	}
	ts, msd, ret := floats(t, res[0]["times"]), floats(t, res[0]["msd"]), floats(t, res[0]["return"])
	require.Len(t, ts, 21)
	for k, tt := range ts {
		// 1e-8: the requested tolerance 1e-12 bounds the state error; the
		// finite chain adds an exponentially small edge effect.
		assert.InDelta(t, 2*tt*tt, msd[k], 1e-8*math.Max(1, tt*tt), "t=%v", tt)
		j0 := math.J0(2 * tt)
		assert.InDelta(t, j0*j0, ret[k], 1e-9, "t=%v", tt)
	}
	// Check value at γt = 1: p0 = 0.0501270809844695 (references.md [derived]).
	assert.InDelta(t, 0.0501270809844695, ret[2], 1e-10)
	ts, msd = floats(t, res[1]["times"]), floats(t, res[1]["msd"])
	for k, tt := range ts {
		// γ = 0.5: MSD = 2γ²t².
		assert.InDelta(t, 2*0.25*tt*tt, msd[k], 1e-8*math.Max(1, tt*tt))
	}
}

func TestServeClassicalLine(t *testing.T) {
	// Classical walk on the line, dp/dt = −γLp: MSD = 2γt and
	// p_0 = e^{−2γt} I_0(2γt) (references.md). The 201-site chain is wide
	// enough that the boundaries are far in the tails at γt ≤ 20. The
	// tolerance bounds the 2-norm of the state error, which the MSD weighs
	// with r² up to 10⁴: hence 1e-12 for a 1e-8 check.
	res := serveLines(t,
		`{"id":"cl","lattice":{"kind":"chain","sites":201},"start":{"site":100},"dynamics":"classical","times":[0,0.5,1,5,20],"report":["msd","return"],"tolerance":1e-12}`,
		`{"id":"cl2","lattice":{"kind":"chain","sites":201},"hopping":2,"start":{"site":100},"dynamics":"classical","times":[1,3],"tolerance":1e-12}`,
	)
	for _, r := range res {
		code, _ := errCode(r)
		require.Empty(t, code, "%v", r["error"])
	}
	ts, msd := floats(t, res[0]["times"]), floats(t, res[0]["msd"])
	for k, tt := range ts {
		assert.InDelta(t, 2*tt, msd[k], 1e-8*math.Max(1, tt), "t=%v", tt)
	}
	ret := floats(t, res[0]["return"])
	// e^{−2}·I_0(2) = 0.3085083225 at γt = 1 (Abramowitz & Stegun 9.8,
	// I_0(2) = 2.2795853023, from memory).
	assert.InDelta(t, math.Exp(-2)*2.2795853023, ret[2], 1e-9)
	ts, msd = floats(t, res[1]["times"]), floats(t, res[1]["msd"])
	for k, tt := range ts {
		assert.InDelta(t, 2*2*tt, msd[k], 1e-8*math.Max(1, tt))
	}
}

func TestServeReportsAndExtensions(t *testing.T) {
	res := serveLines(t,
		`{"id":"all","lattice":{"kind":"ring","sites":7},"start":{"site":0},"times":[0,0.5,1],"report":["msd","return","populations","spread","ipr","entropy","participation","polya","average"]}`,
		`{"id":"rm","lattice":{"kind":"chain","sites":6},"remove":[0,3],"start":{"site":1},"times":[0,1],"report":["populations"]}`,
	)
	r := res[0]
	code, _ := errCode(r)
	require.Empty(t, code, "%v", r["error"])
	for _, f := range []string{"msd", "return", "populations", "spread", "ipr", "entropy", "participation", "polya", "average", "diagnostics"} {
		assert.Contains(t, r, f)
	}
	pops := r["populations"].([]any)
	require.Len(t, pops, 3)
	for _, row := range pops {
		var s float64
		for _, p := range floats(t, row) {
			s += p
		}
		assert.InDelta(t, 1, s, 1e-9) // unitarity (common practice)
	}
	ipr, part := floats(t, r["ipr"]), floats(t, r["participation"])
	for k := range ipr {
		assert.InDelta(t, 1/ipr[k], part[k], 1e-9)
	}
	assert.Equal(t, 0.0, floats(t, r["entropy"])[0])
	// Long-time average return on the odd cycle C_N: (2N−1)/N² (references.md [derived]).
	avg := r["average"].(map[string]any)
	assert.InDelta(t, float64(2*7-1)/49, avg["return"].(float64), 1e-9)
	// Pólya number over t = 0.5, 1 (t = 0 excluded by the contract).
	ret := floats(t, r["return"])
	assert.InDelta(t, 1-(1-ret[1])*(1-ret[2]), r["polya"].(float64), 1e-12)

	r = res[1]
	code, _ = errCode(r)
	require.Empty(t, code, "%v", r["error"])
	assert.Equal(t, []float64{1, 2, 4, 5}, floats(t, r["kept"]))
	assert.Equal(t, 4.0, r["sites"])
	assert.Equal(t, 2.0, r["bonds"])
	// Site 1 of the survivors is old site 2; its only neighbour is old 1.
	p := floats(t, r["populations"].([]any)[1])
	assert.InDelta(t, 0, p[2]+p[3], 1e-12)
}

func TestServeDisorderReproducible(t *testing.T) {
	base := `{"id":"d","lattice":{"kind":"square","width":6,"height":5},"start":{"site":14},"times":[0.5,1,2],"report":["msd","return","ipr"],"disorder":{"onsite":1.5,"bond":0.2,"law":"%s","realisations":%d,"seed":42,"first":%d}}`
	for _, law := range []string{"box", "gauss"} {
		a := serveLines(t, fmt.Sprintf(base, law, 4, 0), fmt.Sprintf(base, law, 4, 0))
		code, _ := errCode(a[0])
		require.Empty(t, code, "%v", a[0]["error"])
		// Same seed, same bits.
		assert.Equal(t, a[0]["msd"], a[1]["msd"])
		assert.Equal(t, a[0]["msd_err"], a[1]["msd_err"])
		assert.Equal(t, 4.0, a[0]["realisations"])
		for _, f := range []string{"msd_err", "return_err", "ipr_err"} {
			assert.Contains(t, a[0], f)
		}
		// Each realisation alone, then the mean in realisation order: the
		// same bits as the ensemble.
		var one []map[string]any
		for k := 0; k < 4; k++ {
			one = append(one, serveLines(t, fmt.Sprintf(base, law, 1, k))[0])
		}
		samples := make([][]float64, 4)
		for k, r := range one {
			samples[k] = floats(t, r["msd"])
			assert.NotContains(t, r, "msd_err")
		}
		mean, se := MeanErr(samples)
		assert.Equal(t, mean, floats(t, a[0]["msd"]))
		assert.Equal(t, se, floats(t, a[0]["msd_err"]))
		// Different realisations differ.
		assert.NotEqual(t, samples[0], samples[1])
	}
}

func TestRunGoCaller(t *testing.T) {
	// A Go caller may fill Job directly; zero values take the defaults.
	j := &Job{ID: "go", Lattice: &LatticeSpec{Kind: "gasket", Generation: 2}, Hopping: 1,
		Start: &StartSpec{Site: 0, Second: -1}, Times: []float64{0, 1}}
	r, err := j.Run(context.Background(), nil)
	require.NoError(t, err)
	assert.Equal(t, 15, *r.Sites) // (3³+3)/2, references.md
	assert.Len(t, r.MSD, 2)
	assert.Len(t, r.Return, 2)
}

func TestServeNumericalAndEdgeCases(t *testing.T) {
	res := serveLines(t,
		// Overflow: γ = 1e300 makes the spectrum non-finite.
		`{"id":"big","lattice":{"kind":"chain","sites":5},"hopping":1e300,"start":{"site":2},"times":[0,1,2]}`,
		// A time so large that no propagation can meet any tolerance.
		`{"id":"far","lattice":{"kind":"chain","sites":5},"start":{"site":2},"times":[0,1e300]}`,
		// Nothing moves with γ = 0: no exponent to fit.
		`{"id":"still","lattice":{"kind":"chain","sites":5},"hopping":0,"start":{"site":2},"times":[0,1,2,3,4],"report":["regimes"]}`,
		`{"id":"rm","lattice":{"kind":"chain","sites":3},"remove":[0,1,2],"start":{"site":0},"times":[1]}`,
		`{"id":"rm2","lattice":{"kind":"chain","sites":3},"remove":[0,7],"start":{"site":0},"times":[1]}`,
		`{"id":"dim","lattice":{"kind":"hypercube","dimension":3},"start":{"near":[1,1]},"times":[1]}`,
		`{"id":"sec","lattice":{"kind":"chain","sites":3},"start":{"site":0,"second":0},"times":[1],"report":["correlations"]}`,
	)
	want := []struct{ code, field string }{
		{"numerical", ""}, {"numerical", "tolerance"}, {"invalid", "report"}, {"invalid", "remove"},
		{"invalid", "remove[1]"}, {"invalid", "start.near"}, {"invalid", "start.second"},
	}
	for k, w := range want {
		code, field := errCode(res[k])
		assert.Equal(t, w.code, code, "%v", res[k])
		if w.field != "" {
			assert.Equal(t, w.field, field, "%v", res[k])
		}
	}
	// Hypercube Q_3: perfect transfer to the antipode at t = π/2 (Christandl,
	// Datta, Ekert, Landahl, PRL 92, 187902 (2004)).
	res = serveLines(t, fmt.Sprintf(`{"lattice":{"kind":"hypercube","dimension":3},"start":{"site":0},"times":[%v],"report":["populations"]}`, math.Pi/2))
	requireOKServe(t, res[0])
	assert.InDelta(t, 1, floats(t, res[0]["populations"].([]any)[0])[7], 1e-9)
}

func requireOKServe(t *testing.T, r map[string]any) {
	t.Helper()
	code, _ := errCode(r)
	require.Empty(t, code, "%v", r["error"])
}

func TestServeIdleCancel(t *testing.T) {
	// A Serve waiting for input returns as soon as its context is cancelled.
	pr, pw := io.Pipe()
	defer pw.Close()
	ctx, cancel := context.WithCancel(context.Background())
	errc := make(chan error, 1)
	go func() { errc <- Serve(ctx, pr, io.Discard, nil) }()
	cancel()
	assert.ErrorIs(t, <-errc, context.Canceled)
}
