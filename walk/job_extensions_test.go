package walk

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func requireOK(t *testing.T, r map[string]any) {
	t.Helper()
	code, _ := errCode(r)
	require.Empty(t, code, "%v", r["error"])
}

func TestServeSeriesJob(t *testing.T) {
	// A synthetic broken power law built here: y = t² up to t = 10, then
	// y = 100·(t/10)^0.86; 61 log-spaced times from 0.1 to 1000.
	var ts, ys []string
	for k := 0; k <= 60; k++ {
		tt := 0.1 * math.Pow(10, float64(k)/15)
		y := tt * tt
		if tt > 10 {
			y = 100 * math.Pow(tt/10, 0.86)
		}
		ts = append(ts, fmt.Sprint(tt))
		ys = append(ys, fmt.Sprint(y))
	}
	line := fmt.Sprintf(`{"id":"m1","series":{"times":[%s],"values":[%s]},"report":["regimes"],"fit":{"segments":3}}`,
		strings.Join(ts, ","), strings.Join(ys, ","))
	res := serveLines(t, line,
		`{"id":"m2","series":{"times":[1,2,3],"values":[1,4,0]}}`,
		`{"id":"m3","series":{"times":[1,2,3,4,5,6,7,8],"values":[1,2,3,4,5,6,7,8],"errors":[0.1,0.1,0.1,0.1,0.1,0.1,0.1,-1]}}`)
	r := res[0]
	requireOK(t, r)
	regs := r["regimes"].([]any)
	require.Len(t, regs, 2, "%v", regs)
	a := regs[0].(map[string]any)
	b := regs[1].(map[string]any)
	// Exact data: the exponents are recovered to round-off.
	assert.InDelta(t, 2, a["exponent"].(float64), 1e-6)
	assert.InDelta(t, 0.86, b["exponent"].(float64), 1e-6)
	assert.Equal(t, "ballistic", a["kind"])
	assert.Equal(t, "sub-diffusive", b["kind"])
	cs := r["crossovers"].([]any)
	require.Len(t, cs, 1)
	c := cs[0].(map[string]any)
	assert.InDelta(t, 10, c["time"].(float64), 1e-3)
	assert.LessOrEqual(t, c["low"].(float64), c["time"].(float64))
	assert.GreaterOrEqual(t, c["high"].(float64), c["time"].(float64))
	assert.Len(t, floats(t, r["local_exponent"]), 61)
	assert.NotContains(t, r, "sites")

	code, field := errCode(res[1])
	assert.Equal(t, "invalid", code)
	assert.Equal(t, "series.values[2]", field)
	code, field = errCode(res[2])
	assert.Equal(t, "invalid", code)
	assert.Equal(t, "series.errors[7]", field)
}

func TestServeWalkRegimes(t *testing.T) {
	// Chain MSD = 2t² (Childs, Farhi, Gutmann 2002, from memory): a single
	// ballistic regime with exponent 2 before the front reaches the ends.
	res := serveLines(t,
		`{"id":"r","lattice":{"kind":"chain","sites":201},"start":{"site":100},"times":{"from":0.5,"to":20,"count":30,"spacing":"log"},"report":["msd","regimes"]}`,
		`{"id":"s","lattice":{"kind":"chain","sites":201},"start":{"site":100},"times":{"from":0.5,"to":20,"count":30,"spacing":"log"},"report":["regimes"],"fit":{"quantity":"spread","segments":1}}`,
		`{"id":"d","lattice":{"kind":"chain","sites":201},"start":{"site":100},"times":{"from":0.5,"to":20,"count":30,"spacing":"log"},"report":["msd","regimes"],"disorder":{"onsite":0.3,"realisations":4,"seed":1}}`,
	)
	for _, r := range res {
		requireOK(t, r)
		regs := r["regimes"].([]any)
		require.NotEmpty(t, regs)
		first := regs[0].(map[string]any)
		// Weak disorder barely slows the early spreading (common practice):
		// the first regime stays ballistic.
		assert.InDelta(t, 2, first["exponent"].(float64), 0.05, "%s", r["id"])
		assert.Len(t, floats(t, r["local_exponent"]), 30)
	}
	assert.NotContains(t, res[1], "msd") // regimes of spread alone do not report msd
	assert.Contains(t, res[2], "local_exponent_err")
	assert.Contains(t, res[2], "msd_err")
}

func TestServeSpectrumJob(t *testing.T) {
	res := serveLines(t,
		`{"id":"s1","lattice":{"kind":"chain","sites":12},"spectrum":{"eigenvalues":true,"dos":{"bins":6,"method":"exact"},"ratio":true}}`,
		`{"id":"s2","lattice":{"kind":"gasket","generation":4},"hopping":0.5,"spectrum":{"dos":{"bins":40,"moments":64,"vectors":4,"seed":3}}}`,
		`{"id":"s3","lattice":{"kind":"gasket","generation":3},"spectrum":{"ratio":true}}`,
		`{"id":"s4","lattice":{"kind":"gasket","generation":6},"spectrum":{"box_dimension":true}}`,
	)
	r := res[0]
	requireOK(t, r)
	ev := floats(t, r["eigenvalues"])
	require.Len(t, ev, 12)
	for k := 1; k <= 12; k++ {
		// Path P_N: eigenvalues 2cos(πk/(N+1)) (references.md [derived]), ascending.
		assert.InDelta(t, 2*math.Cos(math.Pi*float64(13-k)/13), ev[k-1], 1e-12)
	}
	dos := r["dos"].(map[string]any)
	e, d := floats(t, dos["energy"]), floats(t, dos["density"])
	require.Len(t, d, 6)
	var s float64
	for _, v := range d {
		s += v * (e[1] - e[0])
	}
	assert.InDelta(t, 1, s, 1e-12) // the contract: integrates to 1 over the bins
	ratio := r["ratio"].(map[string]any)
	assert.Equal(t, 10.0, ratio["used"])
	assert.Equal(t, 0.0, ratio["degenerate"])

	r = res[1]
	requireOK(t, r)
	dos = r["dos"].(map[string]any)
	e, d = floats(t, dos["energy"]), floats(t, dos["density"])
	s = 0
	for _, v := range d {
		s += v * (e[1] - e[0])
	}
	assert.InDelta(t, 1, s, 1e-6)
	// KPM with its seed is reproducible.
	again := serveLines(t, `{"id":"s2","lattice":{"kind":"gasket","generation":4},"hopping":0.5,"spectrum":{"dos":{"bins":40,"moments":64,"vectors":4,"seed":3}}}`)
	assert.Equal(t, r["dos"], again[0]["dos"])

	r = res[2]
	requireOK(t, r)
	// The gasket adjacency is massively degenerate (references.md): −2 has
	// multiplicity (3^g−3)/2 = 12 at g = 3, so many spacings are zero.
	assert.GreaterOrEqual(t, r["ratio"].(map[string]any)["degenerate"].(float64), 11.0)

	r = res[3]
	requireOK(t, r)
	// Gasket d_f = ln3/ln2 (Gefen, Aharony, Alexander, PRL 50, 77 (1983),
	// from memory). The bridge only forwards spectra.BoxDimension (tested
	// exactly there); on the triangular positions of a generation-6 gasket,
	// with the fit stopped at boxes of extent/4, the estimate is 1.575,
	// hence ±0.03 (common practice for box counts).
	bd := r["box_dimension"].(map[string]any)
	assert.InDelta(t, math.Log(3)/math.Log(2), bd["dimension"].(float64), 0.03)
	assert.Less(t, bd["smallest"].(float64), bd["largest"].(float64))
}

func TestServeCorrelationsAndAverages(t *testing.T) {
	// Dimer H = Cσ_x, one particle per site: Γ^B_12 = cos²(2Ct), zero at
	// Ct = π/4, where the distinguishable value is 1/2 (references.md
	// [derived]; Bromberg et al., PRL 102, 253904 (2009), from memory).
	q := math.Pi / 4
	line := `{"id":"%s","lattice":{"kind":"graph","sites":2,"bonds":[[0,1]]},"start":{"site":0,"second":1,"statistics":"%s"},"times":[0,%v],"report":["correlations"]}`
	res := serveLines(t, fmt.Sprintf(line, "b", "bosons", q), fmt.Sprintf(line, "d", "distinguishable", q),
		fmt.Sprintf(line, "f", "fermions", q))
	for _, r := range res {
		requireOK(t, r)
	}
	gam := func(r map[string]any, k, a, b int) float64 {
		return r["correlations"].([]any)[k].([]any)[a].([]any)[b].(float64)
	}
	assert.InDelta(t, 1, gam(res[0], 0, 0, 1), 1e-12)
	assert.InDelta(t, 0, gam(res[0], 1, 0, 1), 1e-9)
	assert.InDelta(t, 0.5, gam(res[1], 1, 0, 1), 1e-9)
	for k := 0; k < 2; k++ {
		// Summed over ordered pairs each statistics gives 2 (references.md).
		for _, r := range res {
			var s float64
			for a := 0; a < 2; a++ {
				for b := 0; b < 2; b++ {
					s += gam(r, k, a, b)
				}
			}
			assert.InDelta(t, 2, s, 1e-9, "%s", r["id"])
		}
	}

	// Averages on the cycle C_7: exact (2N−1)/N² (references.md [derived]);
	// a long window approaches it like 1/(ΔE·T); the classical walk relaxes
	// to the uniform 1/N.
	res = serveLines(t,
		`{"id":"w","lattice":{"kind":"ring","sites":7},"start":{"site":0},"times":[1],"report":["average"],"window":{"to":3000,"samples":30000}}`,
		`{"id":"c","lattice":{"kind":"ring","sites":7},"start":{"site":0},"times":[1],"report":["average","populations"],"dynamics":"classical"}`,
	)
	requireOK(t, res[0])
	avg := res[0]["average"].(map[string]any)
	assert.InDelta(t, 13.0/49, avg["return"].(float64), 5e-3)
	assert.Equal(t, 3000.0, avg["window"])
	requireOK(t, res[1])
	avg = res[1]["average"].(map[string]any)
	for _, p := range floats(t, avg["populations"]) {
		assert.InDelta(t, 1.0/7, p, 1e-15)
	}
}

func TestServeEveryKindRuns(t *testing.T) {
	// Every kind the format accepts builds and propagates; counts for the
	// extension kinds follow the lattice builders' documented formulas.
	want := map[string]int{"ring": 5, "triangular": 9, "complete": 4, "star": 5,
		"cayley": 1 + 3*(2*2-1)/(3-2), "vicsek": 5, "tfractal": 4, "fibonacci": 8, "harper": 8,
		"cubic": 8, "hypercube": 8}
	lines := kindExamples

	var req []string
	for _, k := range Kinds() {
		req = append(req, fmt.Sprintf(`{"id":%q,"lattice":%s,"start":{"site":0},"times":[0,1],"report":["msd","return","spread"]}`, k, lines[k]))
	}
	for _, r := range serveLines(t, req...) {
		requireOK(t, r)
		if n, ok := want[r["id"].(string)]; ok {
			assert.Equal(t, float64(n), r["sites"], "%s", r["id"])
		}
		ret := floats(t, r["return"])
		assert.InDelta(t, 1, ret[0], 1e-12)
	}
}
