// Package observables reduces states, probability vectors and time series to
// numbers: per-time quantities (mean squared displacement, spread, inverse
// participation ratio, entropy, region and radial probabilities), long-time
// averages, the Pólya number, ensemble statistics, two-particle correlations
// and the regime analysis of a growth curve (local exponents, segmented
// power-law fits, crossover times with bootstrap intervals).
//
// # Independence
//
// The package imports neither walk nor lattice: positions arrive as plain
// coordinate slices, coords of length n·dim with site i at
// coords[i*dim:(i+1)*dim], and time series as plain (times, values) pairs. It
// works equally well on a simulated walk, on measured intensities from an
// instrument or on a curve from another model.
//
// # Conventions
//
// The conventions of the project hold where they matter: ħ = 1,
// H = γW + diag(ε) with W the weighted adjacency, the classical generator is
// −L with L = D − W, time is in units of 1/γ and positions are in units of the
// nearest-neighbour spacing. A probability vector p has p_j ≥ 0 and, for a
// normalised state, Σ_j p_j = 1; the per-time reductions do not renormalise,
// so they can be applied to unnormalised intensities as well (MSD and Spread
// then scale with the total weight).
//
// Per-time reductions take caller-owned destinations (nil allocates) and
// allocate nothing otherwise; each is one pass over the sites, cheap enough to
// call at every reported time on 10⁶ sites.
//
// # Regime analysis
//
// FitRegimes analyses any positive series y(t): the smoothed local exponent
// d ln y / d ln t (Savitzky–Golay on the log–log curve, five points,
// quadratic, with the window shifted away from a sharp change when that
// fits clearly better, and the three-point parabola where no window fits), a continuous broken-line fit of ln y against ln t
// with 1…MaxSegments segments whose breakpoints are optimised, exponent
// errors from the fit covariance and 95% crossover intervals from a seeded
// bootstrap (residual resampling, or parametric when per-point errors are
// given).
//
// The number of regimes is stated by a two-part criterion. First BIC, where
// a curve given without errors is never taken as more precise than a
// relative noise floor of 10⁻³ (the residual variance in ln y is at least
// 10⁻⁶), so that an exact simulated curve is not split on round-off. Then
// adjacent segments whose exponents differ by less than
// max(0.05, 2·√(σ₁² + σ₂²)) are merged and the fit is redone with one
// segment fewer, until no such pair remains. A pure power law is therefore
// one regime without a crossover. A crossover interval never collapses onto
// its estimate: a side the bootstrap leaves at zero width is widened to the
// neighbouring sample time (the resolution of the time grid). Each regime carries a label that is a statement about the MSD
// exponent α (see the Kind constants): super-ballistic, ballistic,
// super-diffusive, diffusive, sub-diffusive, saturated, decreasing.
//
// A typical use, with p the probabilities at one reported time, coords the
// site positions in two dimensions and start the initial site:
//
//	p = observables.Probabilities(p, psi)           // |ψ_j|², reusing p
//	msd[k] = observables.MSD(p, coords, 2, coords[2*start:2*start+2])
//	returns[k] = p[start]
//	…
//	fit, err := observables.FitRegimes(times, msd, nil, observables.RegimeSettings{Seed: 1})
//	// fit.Regimes[i].Kind, .Exponent, .Error; fit.Crossovers[i].Time, .Low, .High
//	polya, err := observables.Polya(returns)
//
// # Files
//
// probability.go, region.go, radial.go: per-time reductions. average.go,
// window.go: infinite- and finite-time averages. polya.go: the Pólya number.
// correlations.go: two-particle correlations. localexp.go: the smoothed local
// exponent. regimes.go, with segmented.go, hinge.go, lsq.go and
// intervals.go: the regime analysis. ensemble.go: means and standard errors
// over realisations.
//
// # Errors
//
// Input a user can get wrong (empty, NaN or negative values, unsorted times,
// mismatched lengths, too few points for a fit) returns an *InputError naming
// the field, the first offending index, the accepted range and the value
// received. Mismatched slice lengths handed to the allocation-free per-time
// reductions are programmer errors and panic with an "observables:" prefix.
// No function returns NaN silently.
//
// # Use in the laboratory
//
// Where these numbers are used to plan devices (coupling strengths, sample
// lengths, crossover times), predicted values must be calibrated against
// measurements on the real device, and the laboratory's own safety rules
// apply.
package observables
