// Package measure reduces measured per-site intensities — the light leaving
// each waveguide of a fabricated array after propagation length z, or any
// per-site population read from an instrument — to the same numbers the
// engine computes for a simulated walk, and compares the two.
//
// # Workflow
//
//	m, err := measure.ReadCSV(file, sites)     // strict import, nothing half-read
//	r, err := measure.Reduce(m, measure.Geometry{Coords: coords, Dim: 2, Start: 12})
//	err = r.FitRegimes(observables.RegimeSettings{})  // exponents with per-point errors
//	cmp, err := r.Compare(simulated)            // overlap and total variation per length
//	r.Report(os.Stdout, cmp)                    // plain text for a methods section
//
// # Conventions
//
// The CSV has a header naming the columns length, site, intensity and,
// optionally, uncertainty (one standard deviation of the intensity), in any
// order. Sites are numbered from 0 in the order of the geometry's
// coordinates; every measured length must list every site exactly once.
// Intensities are normalised per length, p_j = I_j / Σ_k I_k, so only
// relative intensities matter. Lengths are in the lab's unit (mm or cm);
// with couplings in the reciprocal unit the propagation length is the time
// of the walk (ħ = 1, H = W + diag(ε); see lattice.Scale). Positions keep
// the geometry's unit, and MSD and spread are in that unit squared.
//
// Uncertainties are propagated to first order, treating the intensities of
// different sites as independent: for a ratio Q = Σ_j I_j f_j / Σ_j I_j,
// σ_Q² = Σ_k σ_k² (f_k − Q)² / (Σ_j I_j)²; the inverse participation ratio
// uses ∂IPR/∂I_k = 2(p_k − IPR)/Σ_j I_j. Without an uncertainty column every
// propagated error is zero and the regime fit weighs all lengths alike.
//
// # Errors
//
// Input errors are *InputError values naming the field (for the CSV,
// "csv.<column>" with the 1-based line number at the start of the message).
//
// # Use in the laboratory
//
// Couplings and lengths predicted by the engine must be calibrated against
// measurements on the real device, and the laboratory's own laser and
// fabrication safety rules apply.
package measure
