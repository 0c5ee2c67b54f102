package walk

import (
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"
	"time"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/observables"
)

// Run computes the job's response. Progress goes to log (nil: discarded).
// Errors are *InputError values whose Kind gives the job-format code (or
// context.Canceled); Run never panics: an internal failure is returned as a
// Numerical error.
func (j *Job) Run(ctx context.Context, log io.Writer) (resp *Response, err error) {
	defer func() {
		if r := recover(); r != nil {
			resp = nil
			err = &fault.Error{Kind: fault.Numerical, Msg: fmt.Sprintf("internal failure while running the job: %v", r)}
		}
	}()
	if log == nil {
		log = io.Discard
	}
	if ctx == nil {
		ctx = context.Background()
	}
	start := time.Now()
	switch {
	case j.Series != nil:
		resp, err = j.runSeries()
	case j.Spectrum != nil:
		resp, err = j.runSpectrum(ctx, log)
	case j.Plan != nil:
		resp, err = j.runPlan(ctx, log)
	case j.Measurement != nil:
		resp, err = j.runMeasurement(ctx, log)
	case j.Units != nil:
		resp, err = j.runUnits(ctx, log)
	default:
		resp, err = j.runWalk(ctx, log)
	}
	if err != nil {
		if ctx.Err() != nil && !errors.Is(err, context.Canceled) {
			return nil, &fault.Error{Kind: fault.Cancelled, Msg: "the job was cancelled before it finished"}
		}
		return nil, err
	}
	if name := resp.finite(); name != "" {
		return nil, &fault.Error{Kind: fault.Numerical, Field: name,
			Msg: "came out as a value that is not a finite number (the computation overflowed: check hopping, times and the lattice's energies)"}
	}
	if d := resp.Diagnostics; d != nil && d.ErrorBound > maxErrorBound(j.Tolerance) {
		return nil, &fault.Error{Kind: fault.Numerical, Field: "tolerance",
			Msg: fmt.Sprintf("%.3g cannot be met: the propagation's own error bound is %.3g, too large for meaningful results; use shorter times or another method", j.Tolerance, d.ErrorBound)}
	}
	if resp.Diagnostics != nil {
		resp.Diagnostics.Seconds = time.Since(start).Seconds()
	}
	return resp, nil
}

// maxErrorBound is the largest error bound of a propagation accepted for a
// given tolerance: bounds are loose, so well above the tolerance, but a
// state error beyond 1e-3 would make the reported numbers meaningless.
func maxErrorBound(tol float64) float64 { return max(1e-3, 1e4*tol) }

// graph builds the lattice and applies remove. kept is nil without remove.
func (j *Job) graph() (g *lattice.Graph, kept []int, err error) {
	if j.Lattice == nil {
		return nil, nil, fault.New("lattice", "is required")
	}
	if !(math.Abs(j.Hopping) < math.MaxFloat64) {
		return nil, nil, fault.Range("hopping", "a finite number", j.Hopping)
	}
	if g, err = j.Lattice.Build(); err != nil {
		return nil, nil, err
	}
	if j.Remove != nil {
		if err := checkRemove(j.Remove, g.Len()); err != nil {
			return nil, nil, err
		}
		if g, kept, err = g.Remove(j.Remove); err != nil {
			return nil, nil, within("remove", err)
		}
	}
	return g, kept, nil
}

// realise returns realisation k of the disorder on g (g itself without
// disorder). Realisation k draws from rand.New(rand.NewPCG(seed, k)) alone.
func (j *Job) realise(g *lattice.Graph, k int) (*lattice.Graph, error) {
	if j.Fabrication != nil {
		// Lab extension: device k rebuilt from jittered positions.
		return j.fabricate(k)
	}
	d := j.Disorder
	if d == nil || (d.Onsite == 0 && d.Bond == 0) {
		return g, nil
	}
	law := lattice.Box
	if d.Law == "gauss" {
		law = lattice.Gauss
	}
	rng := rand.New(rand.NewPCG(d.Seed, uint64(k)))
	h, err := g.WithDisorder(lattice.Disorder{Onsite: d.Onsite, Bond: d.Bond, Law: law}, rng)
	return h, within("disorder", err)
}

// realisations returns the first realisation index and the count.
func (j *Job) realisations() (first, n int) {
	if j.Fabrication != nil {
		return 0, max(j.Fabrication.Realisations, 1)
	}
	if j.Disorder == nil {
		return 0, 1
	}
	return j.Disorder.First, max(j.Disorder.Realisations, 1)
}

// site resolves a start specification to a site index of g.
func site(g *lattice.Graph, field string, i int, near []float64) (int, error) {
	if near != nil {
		if err := checkNear(field, near); err != nil {
			return 0, err
		}
		s, err := g.Nearest(near)
		if err != nil {
			return 0, within(field, err)
		}
		return s, nil
	}
	if i < 0 || i >= g.Len() {
		return 0, fault.New(field+".site", "must be a site index between 0 and %d; got %d", g.Len()-1, i)
	}
	return i, nil
}

// trace is what one realisation of a walk job produces.
type trace struct {
	msd, ret, spread, ipr, entropy, part []float64
	pops                                 [][]float64
	corr                                 [][]float64 // per time, n·n row-major
	polya                                float64
	avg                                  *Average
	diag                                 Diagnostics
}

func (j *Job) checkTimes() error {
	if len(j.Times) == 0 {
		return fault.New("times", "must hold at least one time")
	}
	if len(j.Times) > MaxTimes {
		return fault.New("times", "must hold at most %d times; got %d", MaxTimes, len(j.Times))
	}
	for k, t := range j.Times {
		if !(t >= 0) || math.IsInf(t, 0) {
			return fault.Range(index("times", k), "a finite non-negative time", t)
		}
		if k > 0 && t < j.Times[k-1] {
			return fault.New(index("times", k), "must not be smaller than the time before it (%v); got %v", j.Times[k-1], t)
		}
	}
	return nil
}

func (j *Job) runWalk(ctx context.Context, log io.Writer) (*Response, error) {
	if j.Start == nil {
		return nil, fault.New("start", "is required: {\"site\": i} or {\"near\": [x, y, ...]}")
	}
	if err := j.checkTimes(); err != nil {
		return nil, err
	}
	if err := j.checkLab(); err != nil {
		return nil, err
	}
	if len(j.Report) == 0 {
		j.Report = []string{"msd", "return"}
	}
	if j.Tolerance == 0 {
		j.Tolerance = 1e-10
	}
	g, kept, err := j.graph()
	if err != nil {
		return nil, err
	}
	n := g.Len()
	fmt.Fprintf(log, "ampwalk: job %q: %s lattice with %d sites, %d bonds\n", j.ID, j.Lattice.Kind, n, g.NumBonds())
	s0, err := site(g, "start", j.Start.Site, j.Start.Near)
	if err != nil {
		return nil, err
	}
	s1 := -1
	if j.reports("correlations") {
		if j.Start.Second < 0 {
			return nil, fault.New("start.second", "is required by the \"correlations\" report")
		}
		if s1, err = site(g, "start.second", j.Start.Second, nil); err != nil {
			return nil, fault.New("start.second", "must be a site index between 0 and %d; got %d", n-1, j.Start.Second)
		}
		if s1 == s0 {
			return nil, fault.New("start.second", "must differ from the first particle's site %d", s0)
		}
	}
	if err := j.checkSize(g); err != nil {
		return nil, err
	}
	first, nr := j.realisations()
	workers := 0
	if j.Disorder != nil || j.Fabrication != nil {
		// Each realisation single-threaded, realisations in parallel: the
		// bits of realisation k do not depend on how many run alongside it.
		workers = 1
	}
	progress := newProgress(log, j.ID, nr)
	traces, err := Ensemble(ctx, nr, 0, func(ctx context.Context, r int) (*trace, error) {
		gk, err := j.realise(g, first+r)
		if err != nil {
			return nil, err
		}
		tr, err := j.walkOnce(ctx, gk, s0, s1, workers)
		progress.done()
		return tr, err
	})
	if err != nil {
		return nil, err
	}
	resp := &Response{ID: j.ID, Sites: &n, Kept: kept, Times: append([]float64(nil), j.Times...)}
	bonds := g.NumBonds()
	resp.Bonds = &bonds
	if j.Disorder != nil || j.Fabrication != nil {
		resp.Realisations = nr
	}
	if err := j.combine(resp, traces); err != nil {
		return nil, err
	}
	j.roundingFloor(resp, g)
	return resp, nil
}

// walkOnce propagates one realisation and reduces each state as it comes.
func (j *Job) walkOnce(ctx context.Context, g *lattice.Graph, s0, s1, workers int) (*trace, error) {
	T := len(j.Times)
	coords, dim := g.Coords(), g.Dim()
	origin := g.Pos(nil, s0)
	tr := &trace{}
	want := func(name string) []float64 {
		if j.reports(name) || (name == "return" && (j.reports("polya"))) ||
			(name == j.Fit.Quantity && j.reports("regimes")) {
			return make([]float64, T)
		}
		return nil
	}
	tr.msd, tr.ret, tr.spread = want("msd"), want("return"), want("spread")
	tr.ipr, tr.entropy, tr.part = want("ipr"), want("entropy"), want("participation")
	if j.reports("populations") {
		tr.pops = make([][]float64, T)
	}
	visit := func(k int, p []float64) error {
		if tr.msd != nil {
			tr.msd[k] = observables.MSD(p, coords, dim, origin)
		}
		if tr.ret != nil {
			tr.ret[k] = p[s0]
		}
		if tr.spread != nil {
			tr.spread[k] = observables.Spread(p, coords, dim)
		}
		if tr.ipr != nil {
			tr.ipr[k] = observables.IPR(p)
		}
		if tr.entropy != nil {
			tr.entropy[k] = observables.Entropy(p)
		}
		if tr.part != nil {
			tr.part[k] = observables.Participation(p)
		}
		if tr.pops != nil {
			tr.pops[k] = append([]float64(nil), p...)
		}
		return nil
	}
	set := Settings{Method: j.Method, Tolerance: j.Tolerance, Workers: workers}
	if s1 >= 0 {
		if err := j.correlations(ctx, g, s0, s1, set, tr); err != nil {
			return nil, err
		}
	}
	var err error
	if tr.diag, err = j.evolve(ctx, g, s0, j.Times, set, visit); err != nil {
		return nil, err
	}
	if j.reports("polya") {
		var rs []float64
		for k, t := range j.Times {
			if t > 0 {
				rs = append(rs, tr.ret[k])
			}
		}
		if tr.polya, err = observables.Polya(rs); err != nil {
			return nil, &fault.Error{Kind: fault.Numerical, Field: "polya", Msg: err.Error()}
		}
	}
	if j.reports("average") {
		if tr.avg, err = j.average(ctx, g, s0, set); err != nil {
			return nil, err
		}
	}
	return tr, nil
}

// evolve propagates the basis state on s0 under the job's dynamics and
// hands visit the probabilities p_j at each of times: |ψ_j|² for the
// quantum walk, the real parts of the state for the classical one. p is
// reused between calls.
func (j *Job) evolve(ctx context.Context, g *lattice.Graph, s0 int, times []float64, set Settings,
	visit func(k int, p []float64) error) (Diagnostics, error) {
	n := g.Len()
	p := make([]float64, n)
	var d Diagnostics
	var err error
	times = j.negligibleTimes(g, times)
	for attempt := 0; ; attempt++ {
		if j.Dynamics == Classical {
			p0 := make([]float64, n)
			p0[s0] = 1
			d, err = ClassicalWalk(ctx, g, j.Hopping, p0, times, set, func(k int, _ float64, state []complex128) error {
				for i, a := range state {
					p[i] = real(a)
				}
				return visit(k, clampProbabilities(p))
			})
		} else {
			psi0 := make([]complex128, n)
			psi0[s0] = 1
			d, err = QuantumWalk(ctx, g, j.Hopping, psi0, times, set, func(k int, _ float64, state []complex128) error {
				return visit(k, clampProbabilities(observables.Probabilities(p, state)))
			})
		}
		if attempt > 0 || !(autoRetry(ctx, set, err) || j.autoLoose(set, d, err)) {
			break
		}
		// Auto's choice failed its own check, or its error bound is beyond
		// what the job accepts: the whole walk again with Krylov (every
		// reported time is visited again and overwritten).
		set.Method = Krylov
	}
	if err != nil {
		return d, propagationError(err)
	}
	return d, nil
}

// propagationError maps a propagator error to the job format: input errors
// keep their kind, cancellation stays cancellation, anything else is a
// numerical failure.
func propagationError(err error) error {
	var fe *fault.Error
	switch {
	case errors.As(err, &fe), errors.Is(err, context.Canceled), errors.Is(err, context.DeadlineExceeded):
		return err
	}
	return &fault.Error{Kind: fault.Numerical, Field: "method", Msg: "the propagation failed: " + err.Error()}
}

// progress reports finished realisations to the log at most every two
// seconds.
type progressLog struct {
	mu    sync.Mutex
	log   io.Writer
	id    string
	total int
	count int
	last  time.Time
}

func newProgress(log io.Writer, id string, total int) *progressLog {
	return &progressLog{log: log, id: id, total: total, last: time.Now()}
}

func (p *progressLog) done() {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.count++
	if p.total > 1 && (time.Since(p.last) > 2*time.Second || p.count == p.total) {
		fmt.Fprintf(p.log, "ampwalk: job %q: %d of %d realisations done\n", p.id, p.count, p.total)
		p.last = time.Now()
	}
}

// workersFor caps a requested worker count at GOMAXPROCS.
func workersFor(w int) int {
	if w <= 0 || w > runtime.GOMAXPROCS(0) {
		return runtime.GOMAXPROCS(0)
	}
	return w
}
