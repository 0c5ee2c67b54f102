package main

import (
	"encoding/binary"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/ampwalk/ampwalk/walk"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/mat"
)

// TestSmokeGasket4 runs propbench's core on generation 4 (123 sites) and
// checks the MSD against dense diagonalisation with gonum's EigenSym
// (gonum v0.17.0, the reference library), ψ(t) = V e^{−iΛt} Vᵀ ψ(0).
func TestSmokeGasket4(t *testing.T) {
	dir := t.TempDir()
	prefix := filepath.Join(dir, "g4")
	c := config{Lattice: "gasket", Generation: 4, TMin: 0.1, TMax: 50, Count: 12,
		Spacing: "log", Tol: 1e-10, Workers: 2, Graph: prefix}
	r, err := run(c, nil)
	require.NoError(t, err)
	// (3^5+3)/2 = 123 sites and 3^5 = 243 bonds: the job format's gasket row.
	require.Equal(t, 123, r.Sites)
	require.Equal(t, 243, r.Bonds)
	require.Equal(t, 0, r.Start)
	require.Equal(t, "chebyshev", r.Method)
	require.Positive(t, r.Products)

	// The graph files hold the bonds and positions in the Go site order.
	bb, err := os.ReadFile(prefix + ".bonds.i32")
	require.NoError(t, err)
	require.Len(t, bb, 8*r.Bonds)
	pb, err := os.ReadFile(prefix + ".pos.f64")
	require.NoError(t, err)
	require.Len(t, pb, 8*2*r.Sites)

	n := r.Sites
	h := mat.NewSymDense(n, nil)
	for k := 0; k < r.Bonds; k++ {
		i := int(binary.LittleEndian.Uint32(bb[8*k:]))
		j := int(binary.LittleEndian.Uint32(bb[8*k+4:]))
		h.SetSym(i, j, 1)
	}
	pos := make([]float64, 2*n)
	for i := range pos {
		pos[i] = math.Float64frombits(binary.LittleEndian.Uint64(pb[8*i:]))
	}
	var es mat.EigenSym
	require.True(t, es.Factorize(h, true))
	lam := es.Values(nil)
	// The infinite gasket's adjacency spectrum is [−2, 4] (Domany et al.,
	// Phys. Rev. B 28, 3110 (1983), from memory): −2 is attained at every
	// generation, the top approaches 4 from below (the corners have degree 2).
	// The 80-step Lanczos estimate of the half-width (extreme Ritz values)
	// is within 1e-6 of the dense one, and never above it (Ritz values lie
	// inside the spectrum; Parlett, The Symmetric Eigenvalue Problem, 1998).
	require.InDelta(t, -2, lam[0], 1e-12)
	require.Less(t, lam[n-1], 4.0)
	require.Greater(t, lam[n-1], 3.9)
	require.InDelta(t, (lam[n-1]-lam[0])/2, r.HalfWidth, 1e-6)
	require.LessOrEqual(t, r.HalfWidth, (lam[n-1]-lam[0])/2+1e-12)
	var v mat.Dense
	es.VectorsTo(&v)
	for q, tq := range r.Times {
		var msd float64
		for i := 0; i < n; i++ {
			var re, im float64
			for k := 0; k < n; k++ {
				c := v.At(i, k) * v.At(r.Start, k)
				s, co := math.Sincos(-lam[k] * tq)
				re += c * co
				im += c * s
			}
			dx, dy := pos[2*i]-pos[2*r.Start], pos[2*i+1]-pos[2*r.Start+1]
			msd += (re*re + im*im) * (dx*dx + dy*dy)
		}
		// 1e-8 relative: the side-by-side rule of ../shared/guide/benchmarks.md.
		require.InDelta(t, msd, r.MSD[q], 1e-8*math.Max(msd, 1), "t=%g", tq)
	}
}

// TestSmokeGasket4Classical runs the classical walk dp/dt = −Lp on
// generation 4 and checks the MSD against gonum's EigenSym of L = D − W
// (gonum v0.17.0, the reference library), p(t) = V e^{−Λt} Vᵀ p(0).
func TestSmokeGasket4Classical(t *testing.T) {
	dir := t.TempDir()
	prefix := filepath.Join(dir, "g4")
	c := config{Lattice: "gasket", Generation: 4, TMin: 0.1, TMax: 50, Count: 12,
		Spacing: "log", Tol: 1e-10, Workers: 2, Graph: prefix, Classical: true}
	r, err := run(c, nil)
	require.NoError(t, err)
	require.Equal(t, "classical", r.Dynamics)
	require.Equal(t, "chebyshev", r.Method)
	require.Zero(t, r.HalfWidth) // no a·t_max yardstick for the classical series
	bb, err := os.ReadFile(prefix + ".bonds.i32")
	require.NoError(t, err)
	pb, err := os.ReadFile(prefix + ".pos.f64")
	require.NoError(t, err)
	n := r.Sites
	l := mat.NewSymDense(n, nil)
	for k := 0; k < r.Bonds; k++ {
		i := int(binary.LittleEndian.Uint32(bb[8*k:]))
		j := int(binary.LittleEndian.Uint32(bb[8*k+4:]))
		l.SetSym(i, j, -1)
		l.SetSym(i, i, l.At(i, i)+1)
		l.SetSym(j, j, l.At(j, j)+1)
	}
	var es mat.EigenSym
	require.True(t, es.Factorize(l, true))
	lam := es.Values(nil)
	var v mat.Dense
	es.VectorsTo(&v)
	for q, tq := range r.Times {
		var msd float64
		for i := 0; i < n; i++ {
			var p float64
			for k := 0; k < n; k++ {
				p += v.At(i, k) * v.At(r.Start, k) * math.Exp(-lam[k]*tq)
			}
			x := math.Float64frombits(binary.LittleEndian.Uint64(pb[16*i:]))
			y := math.Float64frombits(binary.LittleEndian.Uint64(pb[16*i+8:]))
			x0 := math.Float64frombits(binary.LittleEndian.Uint64(pb[16*r.Start:]))
			y0 := math.Float64frombits(binary.LittleEndian.Uint64(pb[16*r.Start+8:]))
			msd += p * ((x-x0)*(x-x0) + (y-y0)*(y-y0))
		}
		require.InDelta(t, msd, r.MSD[q], 1e-8*math.Max(msd, 1), "t=%g", tq)
	}
}

func TestReportedTimes(t *testing.T) {
	ts, err := reportedTimes(0.1, 500, 60, "log")
	require.NoError(t, err)
	require.Len(t, ts, 60)
	require.Equal(t, 0.1, ts[0])
	require.Equal(t, 500.0, ts[59])
	for k := 1; k < len(ts); k++ {
		require.Greater(t, ts[k], ts[k-1])
	}
	_, err = reportedTimes(0.1, 500, 0, "log")
	require.Error(t, err)
	_, err = reportedTimes(0, 500, 10, "log")
	require.Error(t, err)
	_, err = reportedTimes(0.1, 500, 10, "cubic")
	require.Error(t, err)
}

func TestSquareBuild(t *testing.T) {
	g, s, err := build(config{Lattice: "square", Width: 5})
	require.NoError(t, err)
	require.Equal(t, 25, g.Len())
	require.Equal(t, 2+5*2, s) // site x + w·y at the centre (2, 2)
	_, _, err = build(config{Lattice: "carpet"})
	require.Error(t, err)
}

// TestJobsFileDecodes checks that benchdata/jobs.jsonl, the benchmark jobs
// in the JSON bridge's format (../shared/spec/job-format.md), decodes
// strictly and matches the job propbench runs for the same benchmark.
func TestJobsFileDecodes(t *testing.T) {
	b, err := os.ReadFile("../jobs.jsonl")
	require.NoError(t, err)
	want := map[string]config{
		"bench-gasket10":   {Lattice: "gasket", Generation: 10, TMin: 0.1, TMax: 500, Count: 60},
		"bench-gasket12":   {Lattice: "gasket", Generation: 12, TMin: 0.1, TMax: 100, Count: 30},
		"bench-square1000": {Lattice: "square", Width: 1000, TMin: 1, TMax: 1000, Count: 20},
		"bench-gasket14":   {Lattice: "gasket", Generation: 14, TMin: 0.1, TMax: 200, Count: 20},
	}
	seen := 0
	for _, line := range strings.Split(strings.TrimSpace(string(b)), "\n") {
		j, err := walk.Decode([]byte(line))
		require.NoError(t, err, line)
		c, ok := want[j.ID]
		require.True(t, ok, j.ID)
		seen++
		require.Equal(t, walk.Chebyshev, j.Method, j.ID)
		require.Equal(t, 1e-10, j.Tolerance, j.ID)
		require.Len(t, j.Times, c.Count, j.ID)
		ts, err := reportedTimes(c.TMin, c.TMax, c.Count, "log")
		require.NoError(t, err)
		for k := range ts {
			require.InDelta(t, ts[k], j.Times[k], 1e-12*ts[k], "%s t[%d]", j.ID, k)
		}
	}
	require.Equal(t, len(want), seen)
}
