package walk_test

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"sort"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/ampwalk/ampwalk/walk"
)

// extServe runs the request lines through walk.Serve and returns the
// responses by id.
func extServe(t *testing.T, lines ...string) map[string]map[string]any {
	t.Helper()
	var out bytes.Buffer
	require.NoError(t, walk.Serve(context.Background(), strings.NewReader(strings.Join(lines, "\n")+"\n"), &out, nil))
	res := map[string]map[string]any{}
	for _, l := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var m map[string]any
		require.NoError(t, json.Unmarshal([]byte(l), &m), l)
		res[m["id"].(string)] = m
	}
	require.Len(t, res, len(lines))
	return res
}

// extFloats converts a JSON array of numbers.
func extFloats(t *testing.T, v any) []float64 {
	t.Helper()
	a, ok := v.([]any)
	require.True(t, ok, "%v", v)
	out := make([]float64, len(a))
	for i, x := range a {
		out[i] = x.(float64)
	}
	return out
}

func extOK(t *testing.T, r map[string]any) {
	t.Helper()
	require.Nil(t, r["error"], "%v", r["error"])
}

func TestSpectrumExtIPRPath(t *testing.T) {
	// Path of N sites: ψ_k(j) = √(2/(N+1)) sin(πkj/(N+1)), so
	// IPR = 3/(2(N+1)) for every state except, for odd N, the middle one
	// (E = 0), whose IPR is 2/(N+1) (references.md [derived]).
	res := extServe(t, `{"id":"p9","lattice":{"kind":"chain","sites":9},"spectrum":{"ipr":true}}`,
		`{"id":"p8","lattice":{"kind":"chain","sites":8},"spectrum":{"ipr":true,"eigenvalues":true}}`)
	for _, c := range []struct {
		id string
		n  int
	}{{"p9", 9}, {"p8", 8}} {
		r := res[c.id]
		extOK(t, r)
		ipr := extFloats(t, r["ipr"])
		part := extFloats(t, r["participation"])
		require.Len(t, ipr, c.n)
		require.Len(t, part, c.n)
		n1 := float64(c.n + 1)
		for k, v := range ipr {
			want := 3 / (2 * n1)
			if c.n%2 == 1 && k == c.n/2 {
				want = 2 / n1
			}
			assert.InDelta(t, want, v, 1e-12, "%s state %d", c.id, k)
			assert.InDelta(t, 1/v, part[k], 1e-9)
		}
	}
}

func TestSpectrumExtWindow(t *testing.T) {
	// Path of 12 sites, E_k = 2cos(πk/13) (references.md, path spectrum):
	// the window [−1, 1] holds the k with 13/3 ≤ k ≤ 26/3, k = 5 … 8: 4
	// states. The map sums to that count and is non-negative.
	res := extServe(t, `{"id":"w","lattice":{"kind":"chain","sites":12},"spectrum":{"window":{"from":-1,"to":1}}}`,
		`{"id":"all","lattice":{"kind":"gasket","generation":3},"spectrum":{"window":{"from":-10,"to":10}}}`)
	r := res["w"]
	extOK(t, r)
	m := extFloats(t, r["window_map"])
	require.Len(t, m, 12)
	var s float64
	for _, v := range m {
		assert.GreaterOrEqual(t, v, 0.0)
		s += v
	}
	assert.Equal(t, 4.0, r["window_states"])
	assert.InDelta(t, 4, s, 1e-10)
	// A window holding the whole spectrum gives 1 on every site
	// (completeness of the eigenbasis; gasket g=3 has 42 sites, references.md).
	r = res["all"]
	extOK(t, r)
	m = extFloats(t, r["window_map"])
	require.Len(t, m, 42)
	assert.Equal(t, 42.0, r["window_states"])
	for _, v := range m {
		assert.InDelta(t, 1, v, 1e-10)
	}
}

func TestSpectrumExtLDOS(t *testing.T) {
	// The local density of states of one site integrates to 1 (the site is
	// normalised; common practice), exactly and by KPM.
	res := extServe(t,
		`{"id":"exact","lattice":{"kind":"chain","sites":40},"spectrum":{"ldos":{"site":3,"bins":50,"method":"exact"}}}`,
		`{"id":"kpm","lattice":{"kind":"chain","sites":40},"spectrum":{"ldos":{"site":3,"bins":64,"method":"kpm","moments":128}}}`)
	for _, id := range []string{"exact", "kpm"} {
		r := res[id]
		extOK(t, r)
		l := r["ldos"].(map[string]any)
		e, d := extFloats(t, l["energy"]), extFloats(t, l["density"])
		require.Equal(t, len(e), len(d))
		w := e[1] - e[0]
		var s float64
		for _, v := range d {
			s += v * w
		}
		assert.InDelta(t, 1, s, 1e-6, id)
		assert.Equal(t, id, l["method"])
	}
}

func TestSpectrumExtSectorsRing(t *testing.T) {
	// Ring of N sites: translation sector k holds the single level
	// 2cos(2πk/N) (cycle spectrum, references.md); the sizes add up to N.
	const n = 12
	res := extServe(t, `{"id":"ring","lattice":{"kind":"ring","sites":12},"spectrum":{"sectors":true}}`,
		`{"id":"torus","lattice":{"kind":"square","width":6,"height":5,"periodic":true},"spectrum":{"sectors":true,"eigenvalues":true}}`)
	r := res["ring"]
	extOK(t, r)
	secs := r["sectors"].([]any)
	total := 0
	for _, s := range secs {
		sm := s.(map[string]any)
		size := int(sm["size"].(float64))
		total += size
		k := extFloats(t, sm["momentum"])
		require.Len(t, k, 1)
		assert.Equal(t, []float64{n}, extFloats(t, sm["orders"]))
		ev := extFloats(t, sm["eigenvalues"])
		require.Len(t, ev, size)
		require.Equal(t, 1, size)
		assert.InDelta(t, 2*math.Cos(2*math.Pi*k[0]/n), ev[0], 1e-12)
	}
	assert.Equal(t, n, total)

	// Periodic 6×5 square: the union of the 30 sectors is the full spectrum
	// (block diagonalisation is exact; references.md, torus spectrum
	// 2cos(2πa/6) + 2cos(2πb/5)).
	r = res["torus"]
	extOK(t, r)
	var union []float64
	for _, s := range r["sectors"].([]any) {
		sm := s.(map[string]any)
		k := extFloats(t, sm["momentum"])
		ev := extFloats(t, sm["eigenvalues"])
		require.Len(t, ev, 1)
		assert.InDelta(t, 2*math.Cos(2*math.Pi*k[0]/6)+2*math.Cos(2*math.Pi*k[1]/5), ev[0], 1e-12)
		union = append(union, ev...)
	}
	sort.Float64s(union)
	full := extFloats(t, r["eigenvalues"])
	require.Len(t, union, len(full))
	for i := range full {
		assert.InDelta(t, full[i], union[i], 1e-10)
	}
}

func TestSpectrumExtSectorsRatio(t *testing.T) {
	// Sectors of a ring hold one level each, so they carry no ratio, while
	// the full ring spectrum pairs ±k: of the 30 levels 2cos(2πk/30), 14
	// pairs are degenerate (cycle spectrum, references.md), which the full
	// ratio reports.
	res := extServe(t, `{"id":"c","lattice":{"kind":"chain","sites":30,"periodic":true},"spectrum":{"sectors":true,"ratio":true}}`)
	r := res["c"]
	extOK(t, r)
	secs := r["sectors"].([]any)
	require.Len(t, secs, 30)
	for _, s := range secs {
		assert.NotContains(t, s.(map[string]any), "ratio")
	}
	assert.Equal(t, 14.0, r["ratio"].(map[string]any)["degenerate"].(float64))
}

func TestSpectrumExtSectorsFractals(t *testing.T) {
	// Gasket (C3v) and carpet (C4v) sectors: every level of the full
	// spectrum appears Copies times over the sectors (block diagonalisation
	// is exact; common practice), and no sector repeats the ±q pairing.
	res := extServe(t,
		`{"id":"gasket","lattice":{"kind":"gasket","generation":3},"spectrum":{"sectors":true,"eigenvalues":true}}`,
		`{"id":"cells","lattice":{"kind":"carpet","generation":2},"spectrum":{"sectors":true,"eigenvalues":true}}`,
		`{"id":"corners","lattice":{"kind":"carpet","generation":2,"variant":"corners"},"spectrum":{"sectors":true,"eigenvalues":true}}`)
	for id, order := range map[string]float64{"gasket": 3, "cells": 4, "corners": 4} {
		r := res[id]
		extOK(t, r)
		var union []float64
		for _, s := range r["sectors"].([]any) {
			sm := s.(map[string]any)
			assert.Equal(t, []float64{order}, extFloats(t, sm["orders"]), id)
			ev := extFloats(t, sm["eigenvalues"])
			require.Len(t, ev, int(sm["size"].(float64)))
			for range int(sm["copies"].(float64)) {
				union = append(union, ev...)
			}
		}
		sort.Float64s(union)
		full := extFloats(t, r["eigenvalues"])
		require.Len(t, union, len(full), id)
		for i := range full {
			assert.InDelta(t, full[i], union[i], 1e-9, id)
		}
	}
}

func TestSpectrumExtSpectralDimension(t *testing.T) {
	// A 2D torus has d_s = 2 and a ring d_s = 1 (Alexander & Orbach,
	// J. Physique Lett. 43, L625 (1982), from memory); finite size and the
	// level staircase make it loose (2.04 and 1.001 here): ±0.1 (common
	// practice).
	res := extServe(t,
		`{"id":"torus","lattice":{"kind":"square","width":40,"height":40,"periodic":true},"spectrum":{"spectral_dimension":true}}`,
		`{"id":"ring","lattice":{"kind":"ring","sites":400},"spectrum":{"spectral_dimension":true}}`)
	for id, want := range map[string]float64{"torus": 2, "ring": 1} {
		r := res[id]
		extOK(t, r)
		sd := r["spectral_dimension"].(map[string]any)
		assert.InDelta(t, want, sd["value"].(float64), 0.1, id)
		assert.Greater(t, sd["error"].(float64), 0.0)
		assert.Less(t, sd["from"].(float64), sd["to"].(float64))
	}
}

func TestSpectrumExtBands(t *testing.T) {
	// Square cell, H = +γA: E(k) = 2γ(cos k_x + cos k_y), so 4 at Γ, 0 at
	// X = (π, 0) and −4 at M = (π, π); kagome: a flat band at −2 and the
	// lower dispersive band touching it at Γ (references.md, unit-cell
	// spectra [derived]).
	res := extServe(t,
		`{"id":"sq","lattice":{"kind":"square","width":3,"height":3},"spectrum":{"bands":{"path":["G","X","M","G"],"points":8}}}`,
		`{"id":"kag","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"kagome","path":["Γ","K","M","G"],"points":5}}}`)
	r := res["sq"]
	extOK(t, r)
	b := r["bands"].(map[string]any)
	k := extFloats(t, b["k"])
	require.Len(t, k, 3*8+1)
	corners := extFloats(t, b["corners"])
	assert.Equal(t, []float64{0, 8, 16, 24}, corners)
	en := b["energies"].([]any)
	require.Len(t, en, len(k))
	for i, want := range []float64{4, 0, -4, 4} {
		e := extFloats(t, en[int(corners[i])])
		require.Len(t, e, 1)
		assert.InDelta(t, want, e[0], 1e-12)
	}
	for p, wv := range b["wavevectors"].([]any) {
		q := extFloats(t, wv)
		e := extFloats(t, en[p])
		assert.InDelta(t, 2*(math.Cos(q[0])+math.Cos(q[1])), e[0], 1e-12)
	}
	for i := 1; i < len(k); i++ {
		assert.Greater(t, k[i], k[i-1])
	}

	r = res["kag"]
	extOK(t, r)
	b = r["bands"].(map[string]any)
	for _, row := range b["energies"].([]any) {
		e := extFloats(t, row)
		require.Len(t, e, 3)
		assert.InDelta(t, -2, e[0], 1e-12)
	}
	e := extFloats(t, b["energies"].([]any)[0])
	assert.InDelta(t, -2, e[1], 1e-12)
}

func TestSpectrumExtErrors(t *testing.T) {
	cases := []struct {
		line, code, field string
	}{
		{`{"id":"e1","lattice":{"kind":"chain","sites":9},"spectrum":{"window":{"from":0,"to":1,"width":2}}}`, "unknown-field", "spectrum.window.width"},
		{`{"id":"e2","lattice":{"kind":"chain","sites":9},"spectrum":{"ldos":{"site":0,"kernel":"jackson"}}}`, "unknown-field", "spectrum.ldos.kernel"},
		{`{"id":"e3","lattice":{"kind":"chain","sites":9},"spectrum":{"window":{"from":1,"to":0}}}`, "invalid", "spectrum.window.to"},
		{`{"id":"e4","lattice":{"kind":"chain","sites":9},"spectrum":{"window":{"to":0}}}`, "invalid", "spectrum.window.from"},
		{`{"id":"e5","lattice":{"kind":"chain","sites":9},"spectrum":{"ldos":{"site":9}}}`, "invalid", "spectrum.ldos.site"},
		{`{"id":"e6","lattice":{"kind":"chain","sites":9},"spectrum":{"ldos":{"site":-1}}}`, "invalid", "spectrum.ldos.site"},
		{`{"id":"e7","lattice":{"kind":"chain","sites":9},"spectrum":{"ldos":{"site":0,"method":"lanczos"}}}`, "invalid", "spectrum.ldos.method"},
		{`{"id":"e8","lattice":{"kind":"chain","sites":9},"spectrum":{"ldos":{"bins":4}}}`, "invalid", "spectrum.ldos.site"},
		{`{"id":"e9","lattice":{"kind":"triangle","side":4},"spectrum":{"sectors":true}}`, "invalid", "spectrum.sectors"},
		{`{"id":"e10","lattice":{"kind":"chain","sites":9},"spectrum":{"ipr":1}}`, "invalid", "spectrum.ipr"},
		{`{"id":"e11","lattice":{"kind":"chain","sites":5000},"spectrum":{"ipr":true}}`, "too-large", "spectrum"},
		{`{"id":"e12","lattice":{"kind":"ring","sites":12},"remove":[3],"spectrum":{"sectors":true}}`, "invalid", "spectrum.sectors"},
		{`{"id":"e13","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"path":["G","K"]}}}`, "invalid", "spectrum.bands.cell"},
		{`{"id":"e14","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"square","path":["G","K"]}}}`, "invalid", "spectrum.bands.path[1]"},
		{`{"id":"e15","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"cubic","path":["G","X"]}}}`, "invalid", "spectrum.bands.cell"},
		{`{"id":"e16","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"square","path":["G"]}}}`, "invalid", "spectrum.bands.path"},
		{`{"id":"e17","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"square","path":["G","X"],"points":0}}}`, "invalid", "spectrum.bands.points"},
		{`{"id":"e18","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"square","path":["G","X"],"spin":1}}}`, "unknown-field", "spectrum.bands.spin"},
		{`{"id":"e19","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"square"}}}`, "invalid", "spectrum.bands.path"},
		{`{"id":"e20","lattice":{"kind":"chain","sites":3},"spectrum":{"bands":{"cell":"square","path":["G",3]}}}`, "invalid", "spectrum.bands.path[1]"},
	}
	lines := make([]string, len(cases))
	for i, c := range cases {
		lines[i] = c.line
	}
	res := extServe(t, lines...)
	for i, c := range cases {
		var m map[string]any
		require.NoError(t, json.Unmarshal([]byte(c.line), &m))
		r := res[m["id"].(string)]
		e, ok := r["error"].(map[string]any)
		require.True(t, ok, "case %d: %v", i, r)
		assert.Equal(t, c.code, e["code"], "case %d: %v", i, e)
		assert.Equal(t, c.field, e["field"], "case %d: %v", i, e)
		assert.NotEmpty(t, e["message"])
	}
}
