// Package plan proposes the propagation lengths at which to fabricate
// samples of a waveguide array (or any device whose evolution variable can
// only be set by making a new sample), so that each dynamical regime the
// engine predicts gets enough samples to fit its exponent to a stated
// precision.
//
// # Method
//
// Make simulates the quantum walk of the designed array (sites from
// positions, couplings from a coupling law, see lattice.FromPositions) from
// the input site, over an ensemble of fabricated devices with positional
// jitter and detuning (lattice.Fabrication, realisation k from its own
// seeded stream). It records the mean squared displacement on a
// logarithmic grid of lengths, its ensemble mean and its sample-to-sample
// spread, and finds the regimes of the mean curve with
// observables.FitRegimes. Each fabricated sample is one realisation of the
// fabrication disorder, so the relative scatter of a measured MSD is the
// ensemble's relative spread combined with the stated measurement noise.
//
// For n samples evenly spaced in ln z over a regime of log-width
// L = ln(z_b/z_a), placed at the centres of n equal cells, the standard
// error of a straight-line fit of ln MSD against ln z with relative scatter
// s per point is σ_α = s / √(Σ(x_i − x̄)²) = s·√(12n / (L²(n² − 1)))
// (ordinary least squares, common practice). Make gives every regime at
// least three samples and then adds samples one at a time to the regime
// whose predicted σ_α is largest, until all meet the target or the samples
// run out. The estimate ignores the coupling between neighbouring segments
// of the broken-line fit and the uncertainty of the crossovers, so treat the
// precision as a planning figure, not a promise.
//
// # Units
//
// Couplings carry the unit of the law (cm⁻¹, say) and lengths the
// reciprocal one (cm): the walk runs with hopping 1 and time = length.
// Positions keep their unit (µm); MSDs are in that unit squared.
//
// # Use in the laboratory
//
// The plan rests on a predicted coupling law. Predicted couplings and
// lengths must be calibrated against measurements on the real device (for
// example by fabricating the shortest planned samples first and fitting the
// coupling with measure.FitScale), and the laboratory's own laser and
// fabrication safety rules apply.
package plan
