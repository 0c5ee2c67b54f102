package plan

import (
	"context"
	"math"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/observables"
	"github.com/ampwalk/ampwalk/walk"
)

// InputError is the error returned for input outside its accepted range.
type InputError = fault.Error

// Request describes the device and the fabrication budget. Zero values of
// the optional fields mean the defaults stated beside them.
type Request struct {
	// Positions (Dim coordinates per site), the coupling law, the cutoff
	// and the designed detuning (nil for none): see lattice.FromPositions.
	Positions []float64
	Dim       int
	Law       lattice.CouplingLaw
	Cutoff    float64
	Detuning  []float64
	// Start is the input site.
	Start int
	// MaxLength is the longest sample that can be made, MinLength the
	// shortest worth making (0: MaxLength/50), in the reciprocal unit of the
	// couplings.
	MaxLength, MinLength float64
	// Samples is the number of samples that can be fabricated, at least
	// three per predicted regime.
	Samples int
	// Fabrication is the tolerance: positional jitter and detuning.
	Fabrication lattice.Fabrication
	// Realisations of the fabrication disorder simulated (0: 16; 1 when the
	// Fabrication has no disorder), drawn from lattice.Realisation(Seed, k).
	Realisations int
	Seed         uint64
	// Precision is the target standard error of each regime's exponent
	// (0: 0.05).
	Precision float64
	// Noise is the relative measurement error of one sample's MSD, combined
	// in quadrature with the fabrication spread (0: none).
	Noise float64
	// Points is the number of lengths on the simulation grid (0: 48, 8…1000).
	Points int
	// Fit configures the regime analysis. Its zero value is FitRegimes'
	// default except that Replicates 0 means −1 here (Wald crossover
	// intervals: the planner needs the regimes, not bootstrap intervals)
	// and Seed 0 means Request.Seed.
	Fit observables.RegimeSettings
	// Walk configures the propagation (the zero value is its default).
	// Realisations run in parallel on Walk.Workers goroutines (0:
	// GOMAXPROCS), each propagation on one; results do not depend on the
	// number of workers.
	Walk walk.Settings
}

// Sample is one proposed sample to fabricate.
type Sample struct {
	Length float64 `json:"length"`
	// Regime indexes Plan.Regimes; Kind is its label.
	Regime int    `json:"regime"`
	Kind   string `json:"kind"`
	// MSD is the predicted ensemble-mean MSD at Length and MSDSpread its
	// sample-to-sample standard deviation (interpolated on the grid).
	MSD       float64 `json:"msd"`
	MSDSpread float64 `json:"msd_spread"`
}

// RegimePlan is a predicted regime with the samples it gets.
type RegimePlan struct {
	From     float64 `json:"from"`
	To       float64 `json:"to"`
	Exponent float64 `json:"exponent"`
	Kind     string  `json:"kind"`
	// Scatter is the relative scatter s of one sample's MSD in the regime.
	Scatter float64 `json:"scatter"`
	// Samples is the number of samples allotted, PredictedError the
	// standard error of the exponent they should give, Meets whether it is
	// within Request.Precision.
	Samples        int     `json:"samples"`
	PredictedError float64 `json:"predicted_error"`
	Meets          bool    `json:"meets"`
}

// Plan is the result of Make.
type Plan struct {
	// Grid holds the simulated lengths, MSD the ensemble mean there,
	// MSDErr its standard error and MSDSpread the sample-to-sample standard
	// deviation.
	Grid      []float64 `json:"grid"`
	MSD       []float64 `json:"msd"`
	MSDErr    []float64 `json:"msd_err"`
	MSDSpread []float64 `json:"msd_spread"`
	// Fit is the regime analysis of the mean curve.
	Fit *observables.RegimeFit `json:"-"`
	// Regimes and the proposed Samples in increasing length.
	Regimes []RegimePlan `json:"regimes"`
	Samples []Sample     `json:"samples"`
	// Needed is the number of samples that would meet the precision in
	// every regime.
	Needed       int     `json:"needed"`
	Precision    float64 `json:"precision"`
	Realisations int     `json:"realisations"`
	// Rationale explains the proposal in a few sentences.
	Rationale string `json:"rationale"`
	// Diagnostics of the first realisation's propagation.
	Diagnostics walk.Diagnostics `json:"-"`
}

func (r *Request) defaults() error {
	if r.Dim < 1 || r.Dim > 64 {
		return fault.Range("dim", "between 1 and 64", r.Dim)
	}
	// Validate the design first (also for Realisations = 1 and no disorder).
	if _, err := lattice.FromPositions(r.Positions, r.Dim, r.Law, r.Cutoff, r.Detuning); err != nil {
		return err
	}
	n := len(r.Positions) / r.Dim
	switch {
	case r.Start < 0 || r.Start >= n:
		return fault.Range("start", "a site between 0 and "+strconv.Itoa(max(n-1, 0)), r.Start)
	case !(r.MaxLength > 0) || math.IsInf(r.MaxLength, 0):
		return fault.Range("max_length", "a finite length > 0", r.MaxLength)
	case math.IsNaN(r.MinLength) || r.MinLength < 0 || r.MinLength >= r.MaxLength:
		return fault.Range("min_length", "0 (default) or a length between 0 and max_length", r.MinLength)
	case r.Samples < 3 || r.Samples > 10000:
		return fault.Range("samples", "between 3 and 10000", r.Samples)
	case r.Realisations < 0 || r.Realisations > 100000:
		return fault.Range("realisations", "between 1 and 100000 (0 means 16)", r.Realisations)
	case math.IsNaN(r.Precision) || r.Precision < 0 || math.IsInf(r.Precision, 0):
		return fault.Range("precision", "a finite standard error > 0 (0 means 0.05)", r.Precision)
	case math.IsNaN(r.Noise) || r.Noise < 0 || math.IsInf(r.Noise, 0):
		return fault.Range("noise", "a finite relative error ≥ 0", r.Noise)
	case r.Points != 0 && (r.Points < 8 || r.Points > 1000):
		return fault.Range("points", "between 8 and 1000 (0 means 48)", r.Points)
	}
	if err := r.Fabrication.Validate(); err != nil {
		return err
	}
	if r.MinLength == 0 {
		r.MinLength = r.MaxLength / 50
	}
	if r.Realisations == 0 {
		r.Realisations = 16
		if r.Fabrication.Jitter == 0 && r.Fabrication.Detuning == 0 {
			r.Realisations = 1
		}
	}
	if r.Precision == 0 {
		r.Precision = 0.05
	}
	if r.Points == 0 {
		r.Points = 48
	}
	return nil
}

// Make simulates the device and proposes the sample lengths; see the
// package documentation for the method. Errors are *InputError values
// naming the Request field (in snake case, as a bridge would), errors of
// lattice.FromPositions and of the propagation, and a Numerical error when
// the regime analysis fails.
func Make(ctx context.Context, r Request) (*Plan, error) {
	if err := r.defaults(); err != nil {
		return nil, err
	}
	grid := make([]float64, r.Points)
	for k := range grid {
		grid[k] = r.MinLength * math.Pow(r.MaxLength/r.MinLength, float64(k)/float64(r.Points-1))
	}
	grid[len(grid)-1] = r.MaxLength
	n := len(r.Positions) / r.Dim
	origin := r.Positions[r.Start*r.Dim : (r.Start+1)*r.Dim]
	type result struct {
		msd []float64
		d   walk.Diagnostics
	}
	ws := r.Walk
	ws.Workers = 1 // parallel over realisations instead
	res, err := walk.Ensemble(ctx, r.Realisations, r.Walk.Workers, func(ctx context.Context, k int) (result, error) {
		g, _, err := r.Fabrication.Fabricate(r.Positions, r.Dim, r.Law, r.Cutoff, r.Detuning, lattice.Realisation(r.Seed, k))
		if err != nil {
			return result{}, fault.Prefix("realisation["+strconv.Itoa(k)+"]", err)
		}
		psi0 := make([]complex128, n)
		psi0[r.Start] = 1
		p := make([]float64, n)
		out := result{msd: make([]float64, len(grid))}
		out.d, err = walk.QuantumWalk(ctx, g, 1, psi0, grid, ws, func(i int, _ float64, psi []complex128) error {
			observables.Probabilities(p, psi)
			out.msd[i] = observables.MSD(p, r.Positions, r.Dim, origin)
			return nil
		})
		return out, err
	})
	if err != nil {
		return nil, err
	}
	samples := make([][]float64, len(res))
	for k := range res {
		samples[k] = res[k].msd
	}
	mean, se := walk.MeanErr(samples)
	pl := &Plan{Grid: grid, MSD: mean, MSDErr: se, MSDSpread: make([]float64, len(grid)),
		Precision: r.Precision, Realisations: r.Realisations, Diagnostics: res[0].d}
	for k := range se {
		pl.MSDSpread[k] = se[k] * math.Sqrt(float64(r.Realisations))
	}
	fs := r.Fit
	if fs.Seed == 0 {
		fs.Seed = r.Seed
	}
	if fs.Replicates == 0 {
		fs.Replicates = -1
	}
	fit, err := observables.FitRegimes(grid, mean, nil, fs)
	if err != nil {
		return nil, &fault.Error{Kind: fault.Numerical, Field: "fit", Msg: "the regime analysis of the predicted MSD failed: " + err.Error()}
	}
	pl.Fit = fit
	if err := pl.allocate(r); err != nil {
		return nil, err
	}
	return pl, nil
}
