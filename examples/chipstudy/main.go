// Command chipstudy is ampwalk's main job: an invented design study.
//
// The Halvorsen Lab (an invented photonics group) is choosing the geometry
// of its next laser-written waveguide chip, the invented "HL-7". Two
// candidates of about the same number of waveguides are on the table: a
// Sierpinski gasket (a fractal, generation 8 by default) and a full
// triangular-lattice triangle. Light is injected into a single waveguide,
// either at a corner of the chip or in its bulk, and the group wants to know
// how the light spreads along the chip: which regimes (ballistic,
// sub-diffusive, saturated …) appear, with fitted exponents and error bars,
// when one regime gives way to the next, how much light returns to the input
// waveguide (return probability, Pólya number), and how all this compares
// with a classical random walk on the same graph (incoherent light hopping
// between waveguides).
//
// Run with no arguments for the default scenario:
//
//	go run ./examples/chipstudy
//
// It prints a report and writes curves.csv, regimes.csv and report.json to
// the -out directory (default ./chipstudy-out). Progress goes to stderr.
// Flags: -generation, -side (0 matches the gasket's number of sites), -tmax,
// -points, -tolerance, -coupling (the design coupling in 1/cm, converting
// dimensionless time to propagation length), -out.
//
// The study is built on the job type of package walk (the same jobs the
// JSON bridge runs); this program only chooses the jobs and prints them.
//
// Predicted couplings and propagation lengths are model results: they must
// be calibrated against measurements on the real device, and the lab's own
// laser and fabrication safety rules apply.
package main

import (
	"context"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"os/signal"
	"time"

	"github.com/ampwalk/ampwalk/walk"
)

// scenario is the study's configuration (the flags).
type scenario struct {
	Generation int     `json:"generation"`
	Side       int     `json:"side"`
	TMin       float64 `json:"tmin"`
	TMax       float64 `json:"tmax"`
	TRef       float64 `json:"tref"`
	Points     int     `json:"points"`
	Tolerance  float64 `json:"tolerance"`
	Coupling   float64 `json:"coupling_per_cm"`
	Out        string  `json:"-"`
}

// run is one computed job of the study.
type run struct {
	Geometry  string         `json:"geometry"`
	Injection string         `json:"injection"`
	Dynamics  string         `json:"dynamics"`
	Start     []float64      `json:"start_near"`
	Response  *walk.Response `json:"response"`
	// Polya is the run on the measurement schedule t = 1, 2, …, K.
	Polya *walk.Response `json:"polya_schedule"`
}

func main() {
	var s scenario
	flag.IntVar(&s.Generation, "generation", 8, "generation of the gasket chip (3 to 10)")
	flag.IntVar(&s.Side, "side", 0, "bonds per side of the triangular chip (0: about as many sites as the gasket)")
	flag.Float64Var(&s.TMin, "tmin", 0.1, "first time, in units of 1/γ (γ the design coupling)")
	flag.Float64Var(&s.TMax, "tmax", 200, "last time, in units of 1/γ")
	flag.Float64Var(&s.TRef, "tref", 10, "reference time of the summary (the regime in force then)")
	flag.IntVar(&s.Points, "points", 64, "number of log-spaced times from tmin to tmax")
	flag.Float64Var(&s.Tolerance, "tolerance", 1e-10, "target 2-norm error of each propagated state")
	flag.Float64Var(&s.Coupling, "coupling", 1.5, "design nearest-neighbour coupling in 1/cm (for propagation lengths)")
	flag.StringVar(&s.Out, "out", "chipstudy-out", "output directory (created)")
	flag.Parse()
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	if err := study(ctx, s, os.Stdout, os.Stderr); err != nil {
		fmt.Fprintln(os.Stderr, "chipstudy:", err)
		os.Exit(1)
	}
}

func (s *scenario) check() error {
	switch {
	case s.Generation < 3 || s.Generation > 10:
		return fmt.Errorf("-generation must be between 3 and 10; got %d", s.Generation)
	case s.Side < 0 || s.Side > 2000:
		return fmt.Errorf("-side must be between 0 (match the gasket) and 2000; got %d", s.Side)
	case !(s.TMin > 0) || !(s.TMax > 10*s.TMin) || s.TMax > 1e5:
		return fmt.Errorf("-tmin and -tmax must satisfy 0 < 10·tmin < tmax ≤ 1e5; got %v and %v", s.TMin, s.TMax)
	case !(s.TRef >= s.TMin && s.TRef <= s.TMax):
		return fmt.Errorf("-tref must lie between tmin and tmax; got %v", s.TRef)
	case s.Points < 8 || s.Points > 2000:
		return fmt.Errorf("-points must be between 8 and 2000; got %d", s.Points)
	case !(s.Tolerance > 0) || s.Tolerance > 0.1:
		return fmt.Errorf("-tolerance must be in (0, 0.1]; got %v", s.Tolerance)
	case !(s.Coupling > 0) || math.IsInf(s.Coupling, 0):
		return fmt.Errorf("-coupling must be a positive number of 1/cm; got %v", s.Coupling)
	}
	if s.Side == 0 {
		// (L+1)(L+2)/2 ≈ (3^(g+1)+3)/2.
		n := (math.Pow(3, float64(s.Generation+1)) + 3) / 2
		s.Side = int(math.Round((-3 + math.Sqrt(1+8*n)) / 2))
	}
	return nil
}

// runs returns the study's eight runs: two geometries × two injections ×
// quantum and classical dynamics. The bulk point is the centroid of the
// outer triangle: on the gasket it lies in the central hole, so the nearest
// waveguide is on the hole's rim.
func (s *scenario) runs() []run {
	g := float64(int(1) << s.Generation)
	L := float64(s.Side)
	var out []run
	for _, geo := range []struct {
		name         string
		corner, bulk []float64
	}{
		{"gasket", []float64{0, 0}, []float64{g / 2, g * math.Sqrt(3) / 6}},
		{"triangle", []float64{0, 0}, []float64{L / 2, L * math.Sqrt(3) / 6}},
	} {
		for _, inj := range []string{"corner", "bulk"} {
			near := geo.corner
			if inj == "bulk" {
				near = geo.bulk
			}
			for _, dyn := range []string{"quantum", "classical"} {
				out = append(out, run{Geometry: geo.name, Injection: inj, Dynamics: dyn, Start: near})
			}
		}
	}
	return out
}

// job returns the walk.Job of one run.
func (s *scenario) job(r run) *walk.Job {
	lat := &walk.LatticeSpec{Kind: "gasket", Generation: s.Generation}
	if r.Geometry == "triangle" {
		lat = &walk.LatticeSpec{Kind: "triangle", Side: s.Side}
	}
	j := &walk.Job{
		ID:        r.Geometry + "/" + r.Injection + "/" + r.Dynamics,
		Lattice:   lat,
		Hopping:   1,
		Start:     &walk.StartSpec{Near: r.Start, Second: -1},
		Times:     walk.TimeGrid(s.TMin, s.TMax, s.Points, true),
		Tolerance: s.Tolerance,
		Report:    []string{"msd", "return", "regimes"},
		Fit:       walk.FitSpec{Quantity: "msd", Segments: 4},
	}
	if r.Dynamics == "classical" {
		j.Dynamics = walk.Classical
	}
	return j
}

// polyaJob returns the job that measures the return probability on the
// unit-spaced schedule t_k = k, k = 1 … K (K = min(tmax, 100)), the schedule
// of the published Pólya numbers (Štefaňák, Jex, Kiss, PRL 100, 020501
// (2008); Darázs & Kiss, PRA 81, 062319 (2010)): with the log-spaced times,
// whose first points have p_start ≈ 1, the Pólya number would be 1 trivially.
func (s *scenario) polyaJob(r run) *walk.Job {
	j := s.job(r)
	K := int(math.Min(math.Floor(s.TMax), 100))
	j.Times = make([]float64, K)
	for k := range j.Times {
		j.Times[k] = float64(k + 1)
	}
	j.ID += "/polya"
	j.Report = []string{"return", "polya"}
	return j
}

func study(ctx context.Context, s scenario, stdout, stderr io.Writer) error {
	if err := s.check(); err != nil {
		return err
	}
	if err := os.MkdirAll(s.Out, 0o755); err != nil {
		return fmt.Errorf("creating the output directory: %w", err)
	}
	runs := s.runs()
	begin := time.Now()
	for i := range runs {
		j := s.job(runs[i])
		fmt.Fprintf(stderr, "chipstudy: [%d/%d] %s ...\n", i+1, len(runs), j.ID)
		t0 := time.Now()
		resp, err := j.Run(ctx, io.Discard)
		if err != nil {
			return fmt.Errorf("%s: %w", j.ID, err)
		}
		runs[i].Response = resp
		if runs[i].Polya, err = s.polyaJob(runs[i]).Run(ctx, io.Discard); err != nil {
			return fmt.Errorf("%s (Pólya schedule): %w", j.ID, err)
		}
		fmt.Fprintf(stderr, "chipstudy: [%d/%d] %s done in %.1f s (%s, %d products)\n", i+1, len(runs), j.ID,
			time.Since(t0).Seconds(), resp.Diagnostics.Method, resp.Diagnostics.Products)
	}
	report(stdout, s, runs, time.Since(begin))
	return write(s, runs, stderr)
}
