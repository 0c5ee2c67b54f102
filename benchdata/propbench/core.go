package main

import (
	"context"
	"encoding/binary"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"runtime"
	"strings"
	"time"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/walk"
)

// config is one benchmark job.
type config struct {
	Lattice    string  // "gasket" or "square"
	Generation int     // gasket generation
	Width      int     // square lattice side
	TMin, TMax float64 // first and last reported time
	Count      int     // number of reported times
	Classical  bool    // the classical walk dp/dt = −Lp instead of the quantum walk
	Spacing    string  // "log" or "linear"
	Tol        float64 // target 2-norm error of the state
	Workers    int     // GOMAXPROCS for the run; 0 leaves it alone
	Graph      string  // when set, write the graph to Graph+".bonds.i32" and ".pos.f64"
	GraphOnly  bool    // write the graph and the job, then stop
}

// result is what a run measures; it is also the JSON written to -out.
type result struct {
	Lattice   string    `json:"lattice"`
	Dynamics  string    `json:"dynamics"`
	Sites     int       `json:"sites"`
	Bonds     int       `json:"bonds"`
	Dim       int       `json:"dim"`
	Start     int       `json:"start"`
	Tolerance float64   `json:"tolerance"`
	Times     []float64 `json:"times"`
	MSD       []float64 `json:"msd"`

	Method       string  `json:"method"`
	Products     int     `json:"products"`
	HalfWidth    float64 `json:"half_width"` // a, from the extreme Ritz values of a Lanczos run
	ATMax        float64 `json:"a_tmax"`
	Ratio        float64 `json:"products_over_a_tmax"`
	NormDrift    float64 `json:"norm_drift"`
	ErrorBound   float64 `json:"error_bound"`
	BuildSeconds float64 `json:"build_seconds"`
	PropSeconds  float64 `json:"propagate_seconds"`
	Workers      int     `json:"workers"`

	EstimateBytes int64 `json:"estimate_bytes"` // lattice + walk estimates + this program's vectors
	PeakRSSBytes  int64 `json:"peak_rss_bytes"` // VmHWM at the end of the run (0 when unreadable)
}

// reportedTimes returns count times from tmin to tmax, log- or
// linearly spaced, the last exactly tmax.
func reportedTimes(tmin, tmax float64, count int, spacing string) ([]float64, error) {
	switch {
	case count < 1:
		return nil, fmt.Errorf("count must be at least 1; got %d", count)
	case !(tmax > 0) || math.IsInf(tmax, 0):
		return nil, fmt.Errorf("tmax must be positive and finite; got %v", tmax)
	case !(tmin > 0) || tmin > tmax:
		return nil, fmt.Errorf("tmin must be in (0, tmax]; got %v", tmin)
	case spacing != "log" && spacing != "linear":
		return nil, fmt.Errorf("spacing must be log or linear; got %q", spacing)
	}
	ts := make([]float64, count)
	for k := range ts {
		if count == 1 {
			ts[k] = tmax
			break
		}
		f := float64(k) / float64(count-1)
		if spacing == "log" {
			ts[k] = tmin * math.Exp(f*math.Log(tmax/tmin))
		} else {
			ts[k] = tmin + f*(tmax-tmin)
		}
	}
	ts[0], ts[count-1] = tmin, tmax
	return ts, nil
}

// build returns the graph and the start site of the job.
func build(c config) (*lattice.Graph, int, error) {
	var g *lattice.Graph
	var err error
	var near []float64
	switch c.Lattice {
	case "gasket":
		g, err = lattice.Gasket(c.Generation)
		near = []float64{0, 0}
	case "square":
		g, err = lattice.Square(c.Width, c.Width, false)
		near = []float64{float64(c.Width / 2), float64(c.Width / 2)}
	default:
		return nil, 0, fmt.Errorf("lattice must be gasket or square; got %q", c.Lattice)
	}
	if err != nil {
		return nil, 0, err
	}
	s, err := g.Nearest(near)
	return g, s, err
}

// run executes the job: build, estimate the spectral half-width, propagate
// with walk.QuantumWalk (Chebyshev) from the start site, and record the MSD
// at every reported time.
func run(c config, log io.Writer) (*result, error) {
	if c.Workers > 0 {
		// Settings.Workers bounds the product kernels; GOMAXPROCS bounds the
		// rest (the graph build, the reductions).
		defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(c.Workers))
	}
	times, err := reportedTimes(c.TMin, c.TMax, c.Count, c.Spacing)
	if err != nil {
		return nil, err
	}
	t0 := time.Now()
	g, start, err := build(c)
	if err != nil {
		return nil, err
	}
	n, dim := g.Len(), g.Dim()
	dyn := "quantum"
	if c.Classical {
		dyn = "classical"
	}
	r := &result{Lattice: c.Lattice, Dynamics: dyn, Sites: n, Bonds: g.NumBonds(), Dim: dim, Start: start,
		Tolerance: c.Tol, Times: times, Workers: runtime.GOMAXPROCS(0)}
	if c.Graph != "" {
		if err := writeGraph(c.Graph, g); err != nil {
			return nil, err
		}
	}
	r.BuildSeconds = time.Since(t0).Seconds()
	r.EstimateBytes = estimate(n, g.NumBonds(), dim, times)
	if c.GraphOnly {
		return r, nil
	}

	// The spectral half-width a from the extreme Ritz values of 80 Lanczos
	// steps (seed 1: common practice, any seed works): the yardstick a·t_max
	// for the products. Afterwards the matrix is garbage; collecting it now
	// keeps the peak resident set deterministic.
	// The classical series needs O(√(a·t)) terms, so the yardstick does not
	// apply there and is left at 0.
	if !c.Classical {
		r.HalfWidth = ritzHalfWidth(g.Hamiltonian(1), 80, 1)
		r.ATMax = r.HalfWidth * c.TMax
	}
	runtime.GC()

	pos := g.Coords()
	r0 := append([]float64(nil), pos[start*dim:(start+1)*dim]...)
	d2 := make([]float64, n) // squared distance of every site from the start
	for i := range d2 {
		var s float64
		for k, x := range pos[i*dim : (i+1)*dim] {
			t := x - r0[k]
			s += t * t
		}
		d2[i] = s
	}
	r.MSD = make([]float64, len(times))
	set := walk.Settings{Method: walk.Chebyshev, Tolerance: c.Tol, Workers: c.Workers}
	// The visit receives amplitudes (quantum) or probabilities as real
	// parts (classical).
	visit := func(k int, t float64, psi []complex128) error {
		var s float64
		for i, v := range psi {
			p := real(v)
			if !c.Classical {
				p = real(v)*real(v) + imag(v)*imag(v)
			}
			s += p * d2[i]
		}
		r.MSD[k] = s
		if log != nil {
			fmt.Fprintf(log, "t=%-10.4g msd=%.12g\n", t, s)
		}
		return nil
	}
	t1 := time.Now()
	var d walk.Diagnostics
	if c.Classical {
		p0 := make([]float64, n)
		p0[start] = 1
		d, err = walk.ClassicalWalk(context.Background(), g, 1, p0, times, set, visit)
	} else {
		psi0 := make([]complex128, n)
		psi0[start] = 1
		d, err = walk.QuantumWalk(context.Background(), g, 1, psi0, times, set, visit)
	}
	r.PropSeconds = time.Since(t1).Seconds()
	if err != nil {
		return nil, err
	}
	r.Method, r.Products = d.Method, d.Products
	r.NormDrift, r.ErrorBound = d.NormDrift, d.ErrorBound
	if r.ATMax > 0 {
		r.Ratio = float64(r.Products) / r.ATMax
	}
	r.PeakRSSBytes = peakRSS()
	return r, nil
}

// estimate is the memory the run should need: the graph and its CSR
// (lattice.EstimateBytes), the propagation workspace
// (walk.EstimateBytesFor, Chebyshev, which counts the caller's start vector),
// and this program's own arrays: the squared distances, plus the Go runtime's fixed part
// (5 MiB: the peak RSS of a generation-4 run, measured with /usr/bin/time -v).
// The half-width estimate's CSR copy and three real vectors are collected
// before the propagation and are not counted.
func estimate(n, bonds, dim int, times []float64) int64 {
	return lattice.EstimateBytes(n, bonds, dim) +
		walk.EstimateBytesFor(n, 2*bonds, walk.Chebyshev, times, fault.MemoryLimit()) +
		8*int64(n) + 16*int64(len(times)) + 5<<20
}

// peakRSS returns VmHWM from /proc/self/status in bytes, 0 when unreadable.
func peakRSS() int64 {
	b, err := os.ReadFile("/proc/self/status")
	if err != nil {
		return 0
	}
	for _, line := range strings.Split(string(b), "\n") {
		if strings.HasPrefix(line, "VmHWM:") {
			var kb int64
			fmt.Sscanf(strings.TrimSpace(strings.TrimPrefix(line, "VmHWM:")), "%d", &kb)
			return kb << 10
		}
	}
	return 0
}

// writeGraph writes the bonds as little-endian int32 pairs (i, j), bond by
// bond, to prefix+".bonds.i32" and the positions as little-endian float64,
// site by site, to prefix+".pos.f64": the site order is the Go builder's.
func writeGraph(prefix string, g *lattice.Graph) error {
	m := g.NumBonds()
	buf := make([]byte, 0, 8*m)
	for k := 0; k < m; k++ {
		b := g.Bond(k)
		buf = binary.LittleEndian.AppendUint32(buf, uint32(b.I))
		buf = binary.LittleEndian.AppendUint32(buf, uint32(b.J))
	}
	if err := os.WriteFile(prefix+".bonds.i32", buf, 0o644); err != nil {
		return err
	}
	pos := g.Coords()
	buf = make([]byte, 0, 8*len(pos))
	for _, x := range pos {
		buf = binary.LittleEndian.AppendUint64(buf, math.Float64bits(x))
	}
	return os.WriteFile(prefix+".pos.f64", buf, 0o644)
}

// writeJSON writes r to path.
func writeJSON(path string, r *result) error {
	b, err := json.MarshalIndent(r, "", " ")
	if err != nil {
		return err
	}
	return os.WriteFile(path, append(b, '\n'), 0o644)
}
