package walk

import (
	"github.com/ampwalk/ampwalk/lattice"
)

// Job is one decoded request of the JSON bridge (../shared/spec/job-format.md
// and the extensions documented in job_doc.go). Decode fills it from a JSON
// line, applying the contract's defaults; Go callers may also fill it
// directly and call Run, which validates what Decode cannot (indices against
// the built lattice, memory estimates).
//
// A Job is one of five kinds: a walk job (Lattice, Start, Times), a series
// job (Series), a spectrum job (Lattice, Spectrum), a plan job (Lattice,
// Start, Plan) or a measurement job (Lattice, Measurement).
type Job struct {
	ID string

	// Lattice describes the graph. Required for walk and spectrum jobs.
	Lattice *LatticeSpec
	// Hopping is γ, multiplying every bond weight. Default 1.
	Hopping float64
	// Start is the initial state. Required for walk jobs.
	Start *StartSpec
	// Dynamics is Quantum (the default) or Classical.
	Dynamics Dynamics
	// Times are the reported times, non-negative and non-decreasing (the
	// {from, to, count, spacing} form is expanded by Decode).
	Times []float64
	// Tolerance is the target 2-norm error of the state. Default 1e-10.
	Tolerance float64
	// Method is Auto (the default), Exact, Krylov or Chebyshev.
	Method Method
	// Report lists the outputs; default ["msd", "return"].
	Report []string

	// Remove lists sites (built numbering) deleted before anything else.
	Remove []int
	// Disorder, when set, averages over disorder realisations.
	Disorder *DisorderSpec
	// Fit selects the curve and window of the regime analysis.
	Fit FitSpec
	// Window, when set, makes the "average" report a finite-time average
	// over (0, Window.To] instead of the exact infinite-time average.
	Window *WindowSpec

	// Series, when set, makes this a series job.
	Series *SeriesSpec
	// Spectrum, when set, makes this a spectrum job.
	Spectrum *SpectrumSpec

	// Lab-workflow extensions (job_lab.go). Units gives the couplings a
	// physical unit, so that times (and measured lengths) are physical;
	// Fabrication averages a positions lattice over fabricated devices.
	Units       *UnitsSpec
	Fabrication *FabricationSpec
	// Plan, when set, makes this a plan job.
	Plan *PlanSpec
	// Measurement, when set, makes this a measurement job; Compare adds the
	// comparison with a simulation of the same lattice.
	Measurement *MeasurementSpec
	Compare     bool
}

// LatticeSpec names a lattice kind and its parameters. Only the fields the
// kind takes are read; the kinds and their parameters are listed in
// job_doc.go.
type LatticeSpec struct {
	Kind string

	Sites, Width, Height, Depth, Side, Generation, Dimension int
	Leaves, Coordination, Shells                             int
	Periodic                                                 bool
	// Variant of the carpet: "cells" (default) or "corners".
	Variant string

	// Graph kind: bonds (W defaults to 1), positions (Dim coordinates per
	// site, flattened; nil places site i at (i, 0)) and on-site energies.
	Bonds     []lattice.Bond
	Positions []float64
	Dim       int
	Onsite    []float64

	// Fibonacci chain couplings and Harper (Aubry–André) parameters.
	Weak, Strong        float64
	Lambda, Beta, Phase float64

	// Positions kind (lattice.FromPositions): the coupling law, the bond
	// cutoff distance and the on-site detuning (nil for none); the points
	// are Positions with Dim coordinates each.
	Law      *LawSpec
	Cutoff   float64
	Detuning []float64
}

// StartSpec is the initial state: the basis state on Site, or, when Near is
// set, on the site nearest that point (ties to the lowest index).
type StartSpec struct {
	Site int
	Near []float64
	// Second, when ≥ 0, injects a second particle on that site for the
	// "correlations" report; Statistics is "bosons" (default), "fermions" or
	// "distinguishable".
	Second     int
	Statistics string
}

// DisorderSpec is the "disorder" extension: on-site energies and bond
// weights perturbed by draws from Law ("box" or "gauss"), averaged over
// Realisations realisations numbered First … First+Realisations−1.
// Realisation k draws from rand.New(rand.NewPCG(Seed, k)).
type DisorderSpec struct {
	Onsite, Bond float64
	Law          string
	Realisations int
	Seed         uint64
	First        int
}

// FitSpec is the "fit" extension: the quantity ("msd" or "spread") analysed
// by the "regimes" report, the window [From, To] (To = 0: no upper limit)
// and the largest number of segments tried.
type FitSpec struct {
	Quantity string
	From, To float64
	Segments int
}

// WindowSpec is the "window" extension: the "average" report becomes the
// finite-time average (1/To) ∫₀^To p(t) dt by the trapezoidal rule on the
// Samples+1 equally spaced times 0, To/Samples, …, To.
type WindowSpec struct {
	To      float64
	Samples int
}

// SeriesSpec is a curve analysed on its own: strictly increasing positive
// Times, positive finite Values and optional one-sigma Errors.
type SeriesSpec struct {
	Times, Values, Errors []float64
}

// SpectrumSpec selects the static outputs of a spectrum job.
type SpectrumSpec struct {
	Eigenvalues  bool
	DOS          *DOSSpec
	Ratio        bool
	BoxDimension bool
	// SpectrumExt holds the extensions (job_spectrum_ext.go).
	SpectrumExt
}

// DOSSpec configures the density of states: Bins histogram bins, Method
// "exact" or "kpm", and for KPM the number of Moments, random Vectors and
// the Seed of their draws.
type DOSSpec struct {
	Bins    int
	Method  string
	Moments int
	Vectors int
	Seed    uint64
}

// Limits of the job format, stated in the errors that enforce them.
const (
	// MaxTimes is the largest number of reported times.
	MaxTimes = 100000
	// MaxPopulationValues bounds len(times)·sites for the "populations"
	// report (and sites² for "correlations", per time): beyond it the
	// response line would be hundreds of megabytes.
	MaxPopulationValues = 4 << 20
	// MaxExactSites is the largest graph propagated with method "exact" or
	// averaged exactly ("average" without a window): dense diagonalisation
	// costs O(n³) time and 16n² bytes.
	MaxExactSites = 4096
	// MaxEigenvalueSites is the largest graph whose full spectrum a
	// spectrum job computes.
	MaxEigenvalueSites = 8192
	// MaxRealisations bounds disorder.realisations.
	MaxRealisations = 100000
)

// Report names accepted for walk jobs.
var walkReports = []string{"msd", "return", "populations", "spread", "ipr", "entropy",
	"participation", "polya", "regimes", "average", "correlations"}

func (j *Job) reports(name string) bool {
	for _, r := range j.Report {
		if r == name {
			return true
		}
	}
	return false
}
