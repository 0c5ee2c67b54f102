package walk

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"sync"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// PlanSpec is the "plan" object of a plan job (walk/plan.Request): the
// longest and shortest sample lengths (MinLength 0: MaxLength/50), the
// number of samples that can be made, the target standard error of each
// regime's exponent (0: 0.05), the relative measurement noise of one MSD
// and the number of simulated lengths (0: 48).
type PlanSpec struct {
	MaxLength, MinLength float64
	Samples              int
	Precision, Noise     float64
	Points               int
}

// PlanInput is what a plan job hands to the registered Planner: the design
// (positions, coupling law, cutoff, detuning), the input site, the plan
// settings, the fabrication tolerance with its number of realisations (0:
// the planner's default) and seed, and the propagation settings.
type PlanInput struct {
	Positions    []float64
	Dim          int
	Law          lattice.CouplingLaw
	Cutoff       float64
	Detuning     []float64
	Start        int
	Plan         PlanSpec
	Fabrication  lattice.Fabrication
	Realisations int
	Seed         uint64
	Settings     Settings
}

// Planner answers a plan job: it returns the plan (encoded as the
// response's "plan" with encoding/json) and the diagnostics of its
// propagation. Errors are *InputError values naming the fields of
// walk/plan.Request in snake case.
type Planner func(ctx context.Context, in PlanInput) (plan any, d Diagnostics, err error)

var (
	plannerMu sync.Mutex
	planner   Planner
)

// RegisterPlanner makes p answer plan jobs. Package walk/plan registers its
// planner when it is imported (package walk cannot import it: walk/plan
// builds on walk), in the way image decoders register with package image;
// a program serving plan jobs imports it, for its side effect if need be:
//
//	import _ "github.com/ampwalk/ampwalk/walk/plan"
func RegisterPlanner(p Planner) {
	plannerMu.Lock()
	defer plannerMu.Unlock()
	planner = p
}

func registeredPlanner() Planner {
	plannerMu.Lock()
	defer plannerMu.Unlock()
	return planner
}

// decodePlanJob reads a plan job: a positions lattice, start, plan and
// optionally fabrication, tolerance and method.
func (job *Job) decodePlanJob(o *object) error {
	job.Hopping, job.Tolerance = 1, 1e-10
	if err := forbid(o, "a plan job", "hopping", "dynamics", "times", "report", "remove", "disorder",
		"fit", "window", "units", "measurement", "compare", "series", "spectrum"); err != nil {
		return err
	}
	raw, ok := o.take("lattice")
	if !ok {
		return fault.New("lattice", "is required by a plan job: {\"kind\": \"positions\", …}")
	}
	var err error
	if job.Lattice, err = decodeLattice(raw); err != nil {
		return err
	}
	if job.Lattice.Kind != "positions" {
		return fault.New("lattice.kind", "must be \"positions\" in a plan job (it fabricates devices from positions); got %q", job.Lattice.Kind)
	}
	raw, ok = o.take("start")
	if !ok {
		return fault.New("start", "is required: the input site, {\"site\": i} or {\"near\": [x, y, ...]}")
	}
	if job.Start, err = decodeStart(raw); err != nil {
		return err
	}
	if job.Start.Second >= 0 {
		return fault.New("start.second", "is not used by a plan job")
	}
	po, err := o.sub("plan")
	if err != nil {
		return err
	}
	if err := po.only("max_length", "min_length", "samples", "precision", "noise", "points"); err != nil {
		return err
	}
	p := &PlanSpec{}
	if !po.has("max_length") {
		return po.required("max_length", "the longest sample that can be made, in the reciprocal unit of the couplings")
	}
	if !po.has("samples") {
		return po.required("samples", "the number of samples that can be made (3 to 10000)")
	}
	for _, f := range []struct {
		name string
		dst  *float64
		what string
	}{{"max_length", &p.MaxLength, "a length > 0"}, {"min_length", &p.MinLength, "a length ≥ 0 below max_length (0: max_length/50)"},
		{"precision", &p.Precision, "a standard error ≥ 0 (0: 0.05)"}, {"noise", &p.Noise, "a relative error ≥ 0"}} {
		if err := po.num(f.name, f.dst); err != nil {
			return err
		}
		if *f.dst < 0 || (f.name == "max_length" && *f.dst == 0) {
			return fault.Range("plan."+f.name, f.what, *f.dst)
		}
	}
	if p.MinLength >= p.MaxLength {
		return fault.Range("plan.min_length", "a length ≥ 0 below max_length (0: max_length/50)", p.MinLength)
	}
	if err := po.int("samples", &p.Samples, 3, 10000); err != nil {
		return err
	}
	if err := po.int("points", &p.Points, 0, 1000); err != nil {
		return err
	}
	if p.Points != 0 && p.Points < 8 {
		return fault.Range("plan.points", "between 8 and 1000 (0: 48)", p.Points)
	}
	job.Plan = p
	if fo, err := o.sub("fabrication"); err != nil {
		return err
	} else if fo != nil {
		if job.Fabrication, err = decodeFabrication(fo, 0); err != nil {
			return err
		}
	}
	return job.decodeTolMethod(o)
}

// runPlan answers a plan job through the registered Planner.
func (j *Job) runPlan(ctx context.Context, log io.Writer) (*Response, error) {
	p := registeredPlanner()
	if p == nil {
		return nil, fault.New("plan", "jobs need the planner of package walk/plan in the program (import _ \"github.com/ampwalk/ampwalk/walk/plan\"); the bridge binary has it")
	}
	if j.Lattice == nil || j.Lattice.Kind != "positions" || j.Start == nil {
		return nil, fault.New("lattice", "a plan job needs a \"positions\" lattice and a start")
	}
	g, _, err := j.graph()
	if err != nil {
		return nil, err
	}
	s0, err := site(g, "start", j.Start.Site, j.Start.Near)
	if err != nil {
		return nil, err
	}
	law, err := j.Lattice.Law.law()
	if err != nil {
		return nil, fault.Prefix("lattice", err)
	}
	if j.Tolerance == 0 {
		j.Tolerance = 1e-10
	}
	// The memory check of a walk job with the plan's grid (48 lengths by
	// default) and its devices.
	c := *j
	c.Times, c.Report = make([]float64, max(j.Plan.Points, 48)), []string{"msd"}
	if f := j.Fabrication; f != nil && f.Realisations == 0 {
		cf := *f
		cf.Realisations = 16 // the planner's default
		c.Fabrication = &cf
	}
	if err := c.checkSize(g); err != nil {
		return nil, err
	}
	in := PlanInput{Positions: j.Lattice.Positions, Dim: j.Lattice.Dim, Law: law, Cutoff: j.Lattice.Cutoff,
		Detuning: j.Lattice.Detuning, Start: s0, Plan: *j.Plan,
		Settings: Settings{Method: j.Method, Tolerance: j.Tolerance}}
	if f := j.Fabrication; f != nil {
		in.Fabrication, in.Realisations, in.Seed = f.fabrication(), f.Realisations, f.Seed
	}
	n, m := g.Len(), g.NumBonds()
	fmt.Fprintf(log, "ampwalk: job %q: plan on a positions lattice with %d sites, %d bonds\n", j.ID, n, m)
	pl, d, err := p(ctx, in)
	if err != nil {
		return nil, planError(err)
	}
	raw, err := json.Marshal(pl)
	if err != nil {
		return nil, &fault.Error{Kind: fault.Numerical, Field: "plan", Msg: "the plan could not be encoded (a value is not a finite number): " + err.Error()}
	}
	return &Response{ID: j.ID, Sites: &n, Bonds: &m, Plan: raw,
		Diagnostics: &JobDiagnostics{Method: d.Method, Reason: d.Reason, Products: d.Products, NormDrift: d.NormDrift, ErrorBound: d.ErrorBound}}, nil
}

// planError names the planner's fields as the job format does.
func planError(err error) error {
	var fe *fault.Error
	if !errors.As(err, &fe) {
		return propagationError(err)
	}
	c := *fe
	f := c.Field
	first := f
	if i := strings.IndexAny(f, ".["); i >= 0 {
		first = f[:i]
	}
	switch first {
	case "max_length", "min_length", "samples", "precision", "noise", "points":
		c.Field = "plan." + f
	case "realisations":
		c.Field = "fabrication.realisations"
	case "positions", "law", "cutoff", "detuning", "dim":
		c.Field = "lattice." + f
	case "realisation":
		c.Field, c.Msg = "fabrication", "a fabricated device cannot be built: "+f+" "+c.Msg
	}
	return &c
}
