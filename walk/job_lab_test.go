package walk_test

// Tests of the lab-workflow extensions of the job format (job_lab*.go):
// positions lattices, units, fabrication, plan jobs and measurement jobs.
// The package is external so that it can import walk/plan, which registers
// the planner of plan jobs (walk/plan imports walk).

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/observables"
	"github.com/ampwalk/ampwalk/walk"
	"github.com/ampwalk/ampwalk/walk/plan"
)

func labServe(t *testing.T, lines ...string) []map[string]any {
	t.Helper()
	var out, log bytes.Buffer
	err := walk.Serve(context.Background(), strings.NewReader(strings.Join(lines, "\n")+"\n"), &out, &log)
	require.NoError(t, err)
	var res []map[string]any
	sc := bufio.NewScanner(&out)
	sc.Buffer(nil, 1<<26)
	for sc.Scan() {
		var m map[string]any
		require.NoError(t, json.Unmarshal(sc.Bytes(), &m), sc.Text())
		res = append(res, m)
	}
	require.Len(t, res, len(lines))
	return res
}

func labOK(t *testing.T, r map[string]any) {
	t.Helper()
	require.NotContains(t, r, "error", "%v", r["error"])
}

func labErr(r map[string]any) (code, field, msg string) {
	e, ok := r["error"].(map[string]any)
	if !ok {
		return "", "", ""
	}
	f, _ := e["field"].(string)
	m, _ := e["message"].(string)
	return e["code"].(string), f, m
}

func labFloats(t *testing.T, v any) []float64 {
	t.Helper()
	l, ok := v.([]any)
	require.True(t, ok, "not a list: %v", v)
	out := make([]float64, len(l))
	for i, x := range l {
		out[i] = x.(float64)
	}
	return out
}

func num(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }

func list(xs []float64) string {
	s := make([]string, len(xs))
	for i, x := range xs {
		s[i] = num(x)
	}
	return "[" + strings.Join(s, ",") + "]"
}

// rowPositions returns n points spaced d apart on the x axis, as JSON.
func rowPositions(n int, d float64) string {
	s := make([]string, n)
	for i := range s {
		s[i] = fmt.Sprintf("[%s,0]", num(float64(i)*d))
	}
	return "[" + strings.Join(s, ",") + "]"
}

// rowLattice is a straight array of n waveguides d = 10 µm apart coupled by
// the exponential law C(d) = c0·exp(−0.2·(d − 10)) (invented numbers), cut
// off at 15 µm: below the next-nearest distance 20 µm, so only nearest
// neighbours are bonded, each with coupling c0.
func rowLattice(n int, c0 float64) string {
	return fmt.Sprintf(`{"kind":"positions","positions":%s,"law":{"type":"exponential","c0":%s,"kappa":0.2,"d0":10},"cutoff":15}`,
		rowPositions(n, 10), num(c0))
}

func TestLabPositionsChain(t *testing.T) {
	const n, c0, d = 201, 1.5, 10.0
	times := []float64{0.5, 1, 2, 4}
	res := labServe(t,
		fmt.Sprintf(`{"id":"p","lattice":%s,"start":{"near":[1000,0]},"times":%s}`, rowLattice(n, c0), list(times)),
		fmt.Sprintf(`{"id":"c","lattice":{"kind":"chain","sites":%d},"hopping":%s,"start":{"site":100},"times":%s}`, n, num(c0), list(times)),
	)
	labOK(t, res[0])
	labOK(t, res[1])
	assert.Equal(t, float64(n), res[0]["sites"])
	assert.Equal(t, float64(n-1), res[0]["bonds"]) // nearest neighbours only
	pm, cm := labFloats(t, res[0]["msd"]), labFloats(t, res[1]["msd"])
	for k, tt := range times {
		// MSD of the infinite chain from one site: 2(γt)² (Childs, Farhi,
		// Gutmann, Quantum Inf. Process. 1, 35 (2002), from memory); the
		// front (|site| ≈ 2γt ≤ 12) stays far from the ends at 100, and
		// positions are in µm, so MSD in µm² is 2(C t)²·d².
		want := 2 * (c0 * tt) * (c0 * tt) * d * d
		assert.InEpsilon(t, want, pm[k], 1e-7, "t=%v", tt)
		assert.InEpsilon(t, cm[k]*d*d, pm[k], 1e-8, "t=%v", tt)
	}
}

func TestLabPositionsTableAndDetuning(t *testing.T) {
	// A table law through the exponential's own values is exact for it
	// (log-linear interpolation, lattice.NewTable), so both laws give the
	// same walk; detuning enters as on-site energies.
	pos := rowPositions(31, 10)
	law := `{"type":"table","distance":[5,10,20],"coupling":[` + num(1.5*math.Exp(1)) + `,1.5,` + num(1.5*math.Exp(-2)) + `]}`
	res := labServe(t,
		fmt.Sprintf(`{"lattice":{"kind":"positions","positions":%s,"law":%s,"cutoff":15,"detuning":%s},"start":{"site":15},"times":[1,2],"report":["msd","return"]}`,
			pos, law, list(make([]float64, 31))),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":15},"times":[1,2],"report":["msd","return"]}`, rowLattice(31, 1.5)),
	)
	labOK(t, res[0])
	labOK(t, res[1])
	a, b := labFloats(t, res[0]["msd"]), labFloats(t, res[1]["msd"])
	for k := range a {
		assert.InEpsilon(t, b[k], a[k], 1e-9)
	}
}

func TestLabUnits(t *testing.T) {
	const c0 = 1.2 // coupling in cm⁻¹ (invented device)
	z := []float64{0.5, 1, 2, 3}
	// A row with a detuned input guide: on-site energies are not scaled by
	// the hopping, so they test that the conversion keeps them consistent.
	det := make([]float64, 101)
	det[50], det[51] = 0.4, -0.3
	lat := fmt.Sprintf(`{"kind":"positions","positions":%s,"law":{"type":"exponential","c0":%s,"kappa":0.2,"d0":10},"cutoff":15,"detuning":%s}`,
		rowPositions(101, 10), num(c0), list(det))
	// ħ = 0.6582119569 eV·fs (CODATA 2018): 10, 20, 40 fs at meV couplings
	// are 10⁻³·τ/ħ in the engine's 1/meV.
	tau := []float64{10, 20, 40}
	inv := make([]float64, len(tau))
	for k, x := range tau {
		inv[k] = 1e-3 * x / 0.6582119569
	}
	res := labServe(t,
		fmt.Sprintf(`{"lattice":%s,"start":{"site":50},"times":%s,"units":{"coupling":"1/cm","reference":%s}}`, lat, list(z), num(c0)),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":50},"times":%s}`, lat, list(z)),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":50},"times":%s,"units":{"coupling":"1/mm","reference":0.5}}`, lat, list(z)),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":50},"times":%s,"units":{"coupling":"meV","reference":25}}`, lat, list(tau)),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":50},"times":%s}`, lat, list(inv)),
	)
	for _, r := range res {
		labOK(t, r)
	}
	u, plain := res[0], res[1]
	// The response echoes the times as requested and adds t = C_ref·z
	// (coupled-mode theory, common practice; lattice.Scale).
	assert.Equal(t, z, labFloats(t, u["times"]))
	assert.Equal(t, "cm", u["time_unit"])
	dt := labFloats(t, u["dimensionless_times"])
	for k := range z {
		assert.InEpsilon(t, c0*z[k], dt[k], 1e-15)
	}
	// Couplings in cm⁻¹ and lengths in cm already solve i dψ/dz = Hψ.
	a, b := labFloats(t, u["msd"]), labFloats(t, plain["msd"])
	for k := range a {
		assert.InEpsilon(t, b[k], a[k], 1e-9)
	}
	assert.Equal(t, "mm", res[2]["time_unit"])
	// Energies: t = E_ref·τ/ħ, and the walk is the one at 10⁻³·τ/ħ.
	assert.Equal(t, "fs", res[3]["time_unit"])
	assert.Equal(t, tau, labFloats(t, res[3]["times"]))
	dt = labFloats(t, res[3]["dimensionless_times"])
	a, b = labFloats(t, res[3]["msd"]), labFloats(t, res[4]["msd"])
	for k := range tau {
		assert.InEpsilon(t, 25e-3*tau[k]/0.6582119569, dt[k], 1e-14)
		assert.InEpsilon(t, b[k], a[k], 1e-9)
	}
}

func TestLabUnitsRegimes(t *testing.T) {
	// Regimes come back in the requested unit: fitted in the engine's time
	// t = f·τ (f = 10⁻³/ħ for meV, ħ = 0.6582119569 eV·fs, CODATA 2018),
	// then divided by f, the prefactor multiplied by f^α.
	const c0, f = 2.0, 1e-3 / 0.6582119569
	line := func(from, to float64, units string) string {
		return fmt.Sprintf(`{"lattice":%s,"start":{"site":100},"times":{"from":%s,"to":%s,"count":24,"spacing":"log"},"report":["msd","regimes"],"fit":{"segments":1}%s}`,
			rowLattice(201, c0), num(from), num(to), units)
	}
	res := labServe(t, line(0.25, 5, ""), line(0.25/f, 5/f, `,"units":{"coupling":"meV","reference":2}`))
	labOK(t, res[0])
	labOK(t, res[1])
	a := res[0]["regimes"].([]any)[0].(map[string]any)
	b := res[1]["regimes"].([]any)[0].(map[string]any)
	assert.InEpsilon(t, a["from"].(float64)/f, b["from"].(float64), 1e-9)
	assert.InEpsilon(t, a["to"].(float64)/f, b["to"].(float64), 1e-9)
	assert.InEpsilon(t, a["exponent"].(float64), b["exponent"].(float64), 1e-6)
	// Ballistic: MSD = 2(Ct)²·d² (Childs, Farhi, Gutmann 2002, from memory),
	// so in fs the prefactor is 2(C f)²·d².
	assert.InDelta(t, 2, b["exponent"].(float64), 1e-6)
	assert.InEpsilon(t, 2*c0*c0*100*f*f, b["prefactor"].(float64), 1e-5)
	fa, fb := labFloats(t, res[0]["fit_times"]), labFloats(t, res[1]["fit_times"])
	require.Len(t, fb, len(fa))
	for k := range fa {
		assert.InEpsilon(t, fa[k]/f, fb[k], 1e-12)
	}
}

const fabLine = `{"id":"f","lattice":%s,"start":{"site":10},"times":[0.5,1,2],"report":["msd","return"],"fabrication":{"jitter":0.3,"detuning":0.05,"law":"%s","realisations":%d,"seed":%d}}`

func TestLabFabricationReproducible(t *testing.T) {
	lat := rowLattice(21, 1)
	res := labServe(t,
		fmt.Sprintf(fabLine, lat, "gauss", 5, 7),
		fmt.Sprintf(fabLine, lat, "gauss", 5, 7),
		fmt.Sprintf(fabLine, lat, "gauss", 5, 8),
		fmt.Sprintf(fabLine, lat, "box", 5, 7),
	)
	for _, r := range res {
		labOK(t, r)
		assert.Equal(t, 5.0, r["realisations"])
		assert.Len(t, labFloats(t, r["msd_err"]), 3)
	}
	// Same seed: the same bits (realisation k depends on (seed, k) alone,
	// and realisations are combined in order).
	assert.Equal(t, res[0]["msd"], res[1]["msd"])
	assert.Equal(t, res[0]["msd_err"], res[1]["msd_err"])
	assert.Equal(t, res[0]["return"], res[1]["return"])
	assert.NotEqual(t, res[0]["msd"], res[2]["msd"])
	assert.NotEqual(t, res[0]["msd"], res[3]["msd"])

	// Realisation k is lattice.Fabrication.Fabricate with the stream
	// lattice.Realisation(seed, k): recompute the mean on its own.
	pos := make([]float64, 0, 42)
	for i := 0; i < 21; i++ {
		pos = append(pos, 10*float64(i), 0)
	}
	fab := lattice.Fabrication{Jitter: 0.3, Detuning: 0.05, Law: lattice.Gauss}
	law := lattice.Exponential{C0: 1, Kappa: 0.2, D0: 10}
	times := []float64{0.5, 1, 2}
	mean := make([]float64, 3)
	for k := 0; k < 5; k++ {
		g, _, err := fab.Fabricate(pos, 2, law, 15, nil, lattice.Realisation(7, k))
		require.NoError(t, err)
		psi0 := make([]complex128, g.Len())
		psi0[10] = 1
		p := make([]float64, g.Len())
		origin := pos[20:22] // MSD about the designed positions
		_, err = walk.QuantumWalk(context.Background(), g, 1, psi0, times, walk.Settings{Tolerance: 1e-10, Workers: 1},
			func(i int, _ float64, psi []complex128) error {
				mean[i] += observables.MSD(observables.Probabilities(p, psi), pos, 2, origin) / 5
				return nil
			})
		require.NoError(t, err)
	}
	got := labFloats(t, res[0]["msd"])
	for i := range mean {
		// Both propagations meet the 1e-10 state tolerance.
		assert.InDelta(t, mean[i], got[i], 1e-7*mean[i])
	}

	// No jitter and no detuning: one realisation, the design itself.
	res = labServe(t,
		fmt.Sprintf(`{"lattice":%s,"start":{"site":10},"times":[1],"fabrication":{"seed":3}}`, lat),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":10},"times":[1]}`, lat))
	labOK(t, res[0])
	assert.Equal(t, 1.0, res[0]["realisations"])
	assert.InEpsilon(t, labFloats(t, res[1]["msd"])[0], labFloats(t, res[0]["msd"])[0], 1e-12)
}

func TestLabPlanJob(t *testing.T) {
	lat := rowLattice(15, 1)
	line := fmt.Sprintf(`{"id":"plan","lattice":%s,"start":{"site":7},"plan":{"max_length":12,"samples":12,"points":24,"precision":0.1,"noise":0.02},"fabrication":{"jitter":0.2,"realisations":4,"seed":2}}`, lat)
	r := labServe(t, line)[0]
	labOK(t, r)
	assert.Equal(t, 15.0, r["sites"])
	raw, err := json.Marshal(r["plan"])
	require.NoError(t, err)
	var got plan.Plan
	require.NoError(t, json.Unmarshal(raw, &got))
	assert.Len(t, got.Grid, 24)
	assert.Len(t, got.MSD, 24)
	assert.Len(t, got.MSDErr, 24)
	require.NotEmpty(t, got.Regimes)
	for _, g := range got.Regimes {
		assert.Greater(t, g.PredictedError, 0.0)
		assert.GreaterOrEqual(t, g.Samples, 3)
	}
	assert.Len(t, got.Samples, 12)
	assert.Greater(t, got.Needed, 0)
	assert.Equal(t, 4, got.Realisations)
	assert.NotEmpty(t, got.Rationale)

	// The bridge answers with exactly what plan.Make computes.
	pos := make([]float64, 0, 30)
	for i := 0; i < 15; i++ {
		pos = append(pos, 10*float64(i), 0)
	}
	want, err := plan.Make(context.Background(), plan.Request{Positions: pos, Dim: 2,
		Law: lattice.Exponential{C0: 1, Kappa: 0.2, D0: 10}, Cutoff: 15, Start: 7,
		MaxLength: 12, Samples: 12, Points: 24, Precision: 0.1, Noise: 0.02,
		Fabrication: lattice.Fabrication{Jitter: 0.2, Law: lattice.Gauss}, Realisations: 4, Seed: 2,
		Walk: walk.Settings{Tolerance: 1e-10}})
	require.NoError(t, err)
	assert.Equal(t, want.Grid, got.Grid)
	assert.Equal(t, want.MSD, got.MSD)
	assert.Equal(t, want.Samples, got.Samples)

	// A walk job with the same fabrication at the plan's grid sees the same
	// devices (stream k for device k) and reports the MSD about the same
	// designed positions.
	w := labServe(t, fmt.Sprintf(`{"lattice":%s,"start":{"site":7},"times":%s,"fabrication":{"jitter":0.2,"realisations":4,"seed":2}}`, lat, list(got.Grid)))[0]
	labOK(t, w)
	for k, m := range labFloats(t, w["msd"]) {
		// Both propagations meet the 1e-10 state tolerance.
		assert.InEpsilon(t, got.MSD[k], m, 1e-7, "z=%v", got.Grid[k])
	}

	res := labServe(t,
		fmt.Sprintf(`{"lattice":%s,"start":{"site":7},"plan":{"max_length":12,"samples":2}}`, lat),
		`{"lattice":{"kind":"chain","sites":5},"start":{"site":2},"plan":{"max_length":12,"samples":6}}`,
		fmt.Sprintf(`{"lattice":%s,"start":{"site":7},"plan":{"max_length":12,"samples":6},"times":[1]}`, lat),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":70},"plan":{"max_length":12,"samples":6}}`, lat),
		fmt.Sprintf(`{"lattice":%s,"start":{"site":7},"plan":{"samples":6}}`, lat),
	)
	for k, want := range []struct{ code, field string }{
		{"invalid", "plan.samples"},
		{"invalid", "lattice.kind"},
		{"invalid", "times"},
		{"invalid", "start.site"},
		{"invalid", "plan.max_length"},
	} {
		code, field, _ := labErr(res[k])
		assert.Equal(t, want.code, code, "case %d: %v", k, res[k])
		assert.Equal(t, want.field, field, "case %d", k)
	}
}

// measuredCSV runs the walk on the lattice through the bridge and writes
// its populations at lengths z as a measurement CSV, scaled by 1000 as an
// invented detector count, with a 1% uncertainty plus a floor.
func measuredCSV(t *testing.T, lat string, start int, z []float64) (csv string, msd []float64) {
	t.Helper()
	r := labServe(t, fmt.Sprintf(`{"lattice":%s,"start":{"site":%d},"times":%s,"report":["populations","msd"],"tolerance":1e-12}`,
		lat, start, list(z)))[0]
	labOK(t, r)
	var b strings.Builder
	b.WriteString("length,site,intensity,uncertainty\n")
	for k, row := range r["populations"].([]any) {
		for j, p := range labFloats(t, row) {
			fmt.Fprintf(&b, "%s,%d,%s,%s\n", num(z[k]), j, num(1000*p), num(0.01*1000*p+1e-3))
		}
	}
	return b.String(), labFloats(t, r["msd"])
}

func TestLabMeasurementJob(t *testing.T) {
	const c0 = 1.3 // cm⁻¹, invented
	lat := rowLattice(61, c0)
	z := walk.TimeGrid(0.2, 6, 16, true)
	csv, msd := measuredCSV(t, lat, 30, z)
	q, err := json.Marshal(csv)
	require.NoError(t, err)
	res := labServe(t,
		fmt.Sprintf(`{"id":"m","lattice":%s,"measurement":{"csv":%s,"start":30},"compare":true}`, lat, q),
		fmt.Sprintf(`{"id":"u","lattice":%s,"measurement":{"csv":%s,"start":30,"quantity":"spread"},"compare":true,"units":{"coupling":"1/cm","reference":%s},"fit":{"segments":1}}`, lat, q, num(c0)),
		fmt.Sprintf(`{"id":"n","lattice":%s,"measurement":{"csv":%s,"start":30}}`, lat, q),
	)
	for _, r := range res {
		labOK(t, r)
	}
	r := res[0]
	pts := r["points"].([]any)
	require.Len(t, pts, len(z))
	for k, p := range pts {
		pt := p.(map[string]any)
		assert.Equal(t, z[k], pt["length"])
		// The reduction of the exported populations gives back the walk's
		// MSD (normalisation divides out the detector scale).
		assert.InEpsilon(t, msd[k], pt["msd"].(float64), 1e-9)
		assert.Greater(t, pt["msd_err"].(float64), 0.0)
		for _, key := range []string{"spread", "spread_err", "ipr", "ipr_err"} {
			assert.Contains(t, pt, key)
		}
	}
	regs := r["regimes"].([]any)
	require.NotEmpty(t, regs)
	// The front has not reached the ends (2Cz ≤ 16 < 30): one ballistic
	// regime (Childs, Farhi, Gutmann 2002, from memory).
	assert.InDelta(t, 2, regs[0].(map[string]any)["exponent"].(float64), 0.02)
	assert.Contains(t, r, "crossovers")
	assert.Len(t, labFloats(t, r["fit_times"]), len(z))
	for _, rr := range res[:2] {
		cmp := rr["comparison"].([]any)
		require.Len(t, cmp, len(z))
		for k, c := range cmp {
			m := c.(map[string]any)
			assert.Equal(t, z[k], m["length"])
			// Same lattice, same walk: the distributions agree to the
			// propagation tolerance and the CSV's 17 digits.
			assert.InDelta(t, 1, m["overlap"].(float64), 1e-9, "%s", rr["id"])
			assert.InDelta(t, 0, m["distance"].(float64), 1e-7, "%s", rr["id"])
		}
	}
	assert.Equal(t, "cm", res[1]["time_unit"])
	assert.InEpsilon(t, c0*z[3], labFloats(t, res[1]["dimensionless_times"])[3], 1e-15)
	assert.InDelta(t, 2, res[1]["regimes"].([]any)[0].(map[string]any)["exponent"].(float64), 0.02)
	assert.NotContains(t, res[2], "comparison")
	assert.NotContains(t, res[2], "diagnostics")
}

func TestLabMeasurementCSVErrors(t *testing.T) {
	lat := `{"kind":"chain","sites":3}`
	job := func(csv string, extra string) string {
		q, _ := json.Marshal(csv)
		return fmt.Sprintf(`{"lattice":%s,"measurement":{"csv":%s,"start":1%s}}`, lat, q, extra)
	}
	good := "length,site,intensity\n1,0,1\n1,1,2\n1,2,1\n"
	cases := []struct {
		line, prefix string
	}{
		{job("length,site,brightness\n1,0,1\n", ""), "measurement.csv line 1: column 3"},
		{job("length,site,intensity\n1,0,1\n1,1,-2\n1,2,1\n", ""), "measurement.csv line 3: intensity must be"},
		{job("# a comment\nlength,site,intensity\n1,0,1\n1,7,2\n1,2,1\n", ""), "measurement.csv line 4: site must be"},
		{job("length,site,intensity\n1,0,1\n1,1,2\n2,0,1\n2,1,1\n2,2,1\n1,2,1\n1,1,1\n", ""), "measurement.csv line 8: (length 1, site 1) must appear once"},
		{job("length,site,intensity\n1,0,1\n1,1\n", ""), "measurement.csv line 3: must have 3 fields"},
		{job("length,site,intensity\nx,0,1\n", ""), "measurement.csv line 2: length must be"},
		{job("length,site,intensity\n2,0,1\n2,2,1\n", ""), "measurement.csv line 2: length 2 (first row on that line) must list every site"},
		{job("", ""), "measurement.csv must start with a header"},
	}
	lines := make([]string, len(cases))
	for k, c := range cases {
		lines[k] = c.line
	}
	res := labServe(t, lines...)
	for k, c := range cases {
		code, field, msg := labErr(res[k])
		assert.Equal(t, "invalid", code, "case %d: %v", k, res[k])
		assert.Equal(t, "measurement.csv", field, "case %d", k)
		assert.True(t, strings.HasPrefix(msg, c.prefix), "case %d: %q does not start with %q", k, msg, c.prefix)
	}
	res = labServe(t, job(good, ""), strings.Replace(job(good, ""), `"start":1`, `"start":5`, 1))
	labOK(t, res[0])
	assert.NotContains(t, res[0], "regimes") // one length: reduced only
	code, field, _ := labErr(res[1])
	assert.Equal(t, "invalid", code)
	assert.Equal(t, "measurement.start", field)
}

func TestLabDecodeErrors(t *testing.T) {
	lat := rowLattice(5, 1)
	q := `"length,site,intensity\n1,0,1\n"`
	cases := []struct {
		line, code, field string
	}{
		// Unknown fields in every new object, named with their path.
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"exponential","c0":1,"kapa":1,"d0":1},"cutoff":1.5},"start":{"site":0},"times":[1]}`, "unknown-field", "lattice.law.kapa"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"table","distance":[1,2],"coupling":[1,0.5],"clmap":true},"cutoff":1.5},"start":{"site":0},"times":[1]}`, "unknown-field", "lattice.law.clmap"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"exponential","c0":1,"kappa":1,"d0":1},"cutof":1.5},"start":{"site":0},"times":[1]}`, "unknown-field", "lattice.cutof"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"units":{"coupling":"1/cm","refrence":1}}`, "unknown-field", "units.refrence"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"fabrication":{"jiter":0.1}}`, "unknown-field", "fabrication.jiter"},
		{`{"lattice":` + lat + `,"start":{"site":0},"plan":{"max_lenght":3,"samples":6}}`, "unknown-field", "plan.max_lenght"},
		{`{"lattice":` + lat + `,"measurement":{"csv":` + q + `,"start":0,"quantitiy":"msd"}}`, "unknown-field", "measurement.quantitiy"},
		// Invalid values, named with their path.
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"exponential","c0":1,"kappa":-1,"d0":1},"cutoff":1.5},"start":{"site":0},"times":[1]}`, "invalid", "lattice.law.kappa"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"table","distance":[2,1],"coupling":[1,0.5]},"cutoff":1.5},"start":{"site":0},"times":[1]}`, "invalid", "lattice.law.distance[1]"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[3,0]],"law":{"type":"table","distance":[1,2],"coupling":[1,0.5]},"cutoff":3.5},"start":{"site":0},"times":[1]}`, "invalid", "lattice.law"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1]],"law":{"type":"exponential","c0":1,"kappa":1,"d0":1},"cutoff":1.5},"start":{"site":0},"times":[1]}`, "invalid", "lattice.positions[1]"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[0,0]],"law":{"type":"exponential","c0":1,"kappa":1,"d0":1},"cutoff":1.5},"start":{"site":0},"times":[1]}`, "invalid", "lattice.positions"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"power","c0":1},"cutoff":1.5},"start":{"site":0},"times":[1]}`, "invalid", "lattice.law.type"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"exponential","c0":1,"kappa":1,"d0":1}},"start":{"site":0},"times":[1]}`, "invalid", "lattice.cutoff"},
		{`{"lattice":{"kind":"positions","positions":[[0,0],[1,0]],"law":{"type":"exponential","c0":1,"kappa":1,"d0":1},"cutoff":1.5,"detuning":[0]},"start":{"site":0},"times":[1]}`, "invalid", "lattice.detuning"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"units":{"coupling":"1/m","reference":1}}`, "invalid", "units.coupling"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"units":{"coupling":"eV","reference":0}}`, "invalid", "units.reference"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"units":{"coupling":"eV","reference":1},"dynamics":"classical"}`, "invalid", "units"},
		{`{"lattice":{"kind":"chain","sites":4},"start":{"site":0},"times":[1],"fabrication":{"jitter":0.1}}`, "invalid", "fabrication"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"fabrication":{"jitter":-0.1}}`, "invalid", "fabrication.jitter"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"fabrication":{"jitter":0.1,"law":"flat"}}`, "invalid", "fabrication.law"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"fabrication":{"jitter":0.1},"disorder":{"onsite":1}}`, "invalid", "fabrication"},
		{`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"compare":true}`, "invalid", "compare"},
		{`{"lattice":` + lat + `,"measurement":{"csv":` + q + `,"start":0},"times":[1]}`, "invalid", "times"},
		{`{"lattice":` + lat + `,"measurement":{"start":0}}`, "invalid", "measurement.csv"},
		{`{"lattice":` + lat + `,"measurement":{"csv":3,"start":0}}`, "invalid", "measurement.csv"},
		{`{"series":{"times":[1,2],"values":[1,2]},"units":{"coupling":"eV","reference":1}}`, "invalid", "units"},
		{`{"lattice":` + lat + `,"spectrum":{"ratio":true},"fabrication":{"jitter":1}}`, "invalid", "fabrication"},
	}
	lines := make([]string, len(cases))
	for k, c := range cases {
		lines[k] = c.line
	}
	res := labServe(t, lines...)
	for k, c := range cases {
		code, field, msg := labErr(res[k])
		assert.Equal(t, c.code, code, "case %d: %v", k, res[k])
		assert.Equal(t, c.field, field, "case %d: %s", k, msg)
	}
}

func TestLabDefaults(t *testing.T) {
	lat := rowLattice(5, 1)
	j, err := walk.Decode([]byte(`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"fabrication":{"jitter":0.1}}`))
	require.NoError(t, err)
	// Documented defaults (job_doc.go): law gauss, 16 devices, seed 0.
	assert.Equal(t, &walk.FabricationSpec{Jitter: 0.1, Law: "gauss", Realisations: 16}, j.Fabrication)
	assert.Equal(t, "positions", j.Lattice.Kind)
	assert.Equal(t, 2, j.Lattice.Dim)
	assert.Equal(t, &walk.LawSpec{Type: "exponential", C0: 1, Kappa: 0.2, D0: 10}, j.Lattice.Law)

	j, err = walk.Decode([]byte(`{"lattice":` + lat + `,"start":{"site":0},"times":[1],"fabrication":{"seed":4}}`))
	require.NoError(t, err)
	assert.Equal(t, 1, j.Fabrication.Realisations) // nothing to average

	j, err = walk.Decode([]byte(`{"lattice":` + lat + `,"start":{"site":0},"plan":{"max_length":2,"samples":3},"fabrication":{"jitter":0.1}}`))
	require.NoError(t, err)
	assert.Equal(t, 0, j.Fabrication.Realisations) // the planner's default
	assert.Equal(t, &walk.PlanSpec{MaxLength: 2, Samples: 3}, j.Plan)

	j, err = walk.Decode([]byte(`{"lattice":` + lat + `,"measurement":{"csv":"x","start":0},"units":{"coupling":"eV","reference":0.1}}`))
	require.NoError(t, err)
	assert.Equal(t, &walk.MeasurementSpec{CSV: "x", Start: 0, Quantity: "msd"}, j.Measurement)
	assert.Equal(t, &walk.UnitsSpec{Coupling: "eV", Reference: 0.1}, j.Units)
	assert.False(t, j.Compare)
	assert.Equal(t, 4, j.Fit.Segments)

	// fit.quantity names the curve like measurement.quantity; both must agree.
	j, err = walk.Decode([]byte(`{"lattice":` + lat + `,"measurement":{"csv":"x","start":0},"fit":{"quantity":"spread"}}`))
	require.NoError(t, err)
	assert.Equal(t, "spread", j.Measurement.Quantity)
	_, err = walk.Decode([]byte(`{"lattice":` + lat + `,"measurement":{"csv":"x","start":0,"quantity":"msd"},"fit":{"quantity":"spread"}}`))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "fit.quantity")
}

func TestLabCombinations(t *testing.T) {
	lat := rowLattice(21, 1)
	res := labServe(t,
		// Fabrication with remove: each device loses the same sites.
		fmt.Sprintf(`{"lattice":%s,"remove":[0,20],"start":{"site":9},"times":[1,2],"fabrication":{"jitter":0.2,"realisations":3,"seed":1}}`, lat),
		// Fabrication with units and the ensemble regime analysis.
		fmt.Sprintf(`{"lattice":%s,"start":{"site":10},"times":{"from":0.2,"to":3,"count":12,"spacing":"log"},"report":["msd","regimes"],"fabrication":{"jitter":0.2,"realisations":3,"seed":1},"units":{"coupling":"1/cm","reference":1}}`, lat),
		// Units with a windowed average: the window comes back in fs.
		fmt.Sprintf(`{"lattice":%s,"start":{"site":10},"times":[5,10],"report":["return","average"],"window":{"to":10,"samples":20},"units":{"coupling":"meV","reference":30}}`, lat),
		// A measurement on a thinned lattice: sites in the new numbering.
		`{"lattice":{"kind":"chain","sites":5},"remove":[0,4],"measurement":{"csv":"length,site,intensity\n1,0,1\n1,1,2\n1,2,1\n","start":1}}`,
	)
	for _, r := range res {
		labOK(t, r)
	}
	assert.Equal(t, 19.0, res[0]["sites"])
	assert.Len(t, res[0]["kept"], 19)
	assert.Equal(t, 3.0, res[0]["realisations"])
	assert.Contains(t, res[1], "msd_err")
	assert.Contains(t, res[1], "local_exponent_err")
	assert.Equal(t, 10.0, res[2]["average"].(map[string]any)["window"])
	assert.Equal(t, []any{1.0, 2.0, 3.0}, res[3]["kept"])
	pt := res[3]["points"].([]any)[0].(map[string]any)
	// Intensities 1, 2, 1 at x = 1, 2, 3 about the start x = 2: MSD 1/2.
	assert.InDelta(t, 0.5, pt["msd"].(float64), 1e-15)
}

func TestLabGoCallerChecks(t *testing.T) {
	// A Job filled in Go (no Decode) still refuses fabrication on a lattice
	// that is not built from positions.
	j := &walk.Job{Lattice: &walk.LatticeSpec{Kind: "chain", Sites: 5}, Start: &walk.StartSpec{Site: 2, Second: -1},
		Times: []float64{1}, Fabrication: &walk.FabricationSpec{Jitter: 0.1, Realisations: 2}}
	_, err := j.Run(context.Background(), nil)
	require.Error(t, err)
	assert.Equal(t, "invalid", walk.ErrorCode(err))
	assert.Contains(t, err.Error(), "fabrication")
}
