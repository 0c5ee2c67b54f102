// Package walk evolves states on graphs: continuous-time quantum walks
// ψ(t) = exp(−iHt) ψ(0) and classical continuous-time random walks
// p(t) = exp(−γLt) p(0), reported at a list of times without storing them all.
//
// # Conventions
//
//   - ħ = 1. H = γW + diag(ε), with W the weighted (possibly complex,
//     Hermitian) adjacency of a lattice.Graph and ε its on-site energies; the
//     sign is +, so on a chain ⟨n|exp(−iHt)|0⟩ = (−i)^n J_n(2γt).
//   - The classical walk is dp/dt = −γLp with L = D − W the weighted graph
//     Laplacian; the propagators take the operator γL and evolve with
//     exp(−γLt). The probabilities travel in the real parts of the state.
//   - Time is in units of 1/γ when the bond weights are 1; positions (used by
//     the observables, not here) in units of the nearest-neighbour spacing.
//   - Site order is the lattice's: each builder in package lattice documents it.
//
// # Propagate
//
// Propagate(ctx, op, dyn, ψ0, times, settings, visit) calls visit with the
// state at each reported time (non-negative, non-decreasing; time 0 reports
// ψ0 unchanged). Settings.Tolerance is the target 2-norm error of the state
// at every reported time, relative to ‖ψ0‖ (default 1e-10); the budget is
// shared between the steps so that the errors of all steps add up to less.
// Every run returns Diagnostics: the method, why Auto chose it, the
// matrix–vector products, the worst norm drift over the reported times
// (classical: the drift of Σp), the accumulated error bound or estimate and
// the wall time. Cancelling the context stops the run at the next check
// (between reported times and series segments, every 64 Chebyshev terms,
// every 8 Lanczos steps) with an error wrapping context.Canceled.
//
// # Methods and their costs
//
// Chebyshev (Tal-Ezer & Kosloff, J. Chem. Phys. 81, 3967 (1984)) expands the
// exponential in Chebyshev polynomials of (H − b)/a, where [b − a, b + a]
// holds the spectrum. The interval comes from 30 Lanczos steps (the extreme
// Ritz values padded by their residuals), not from Gershgorin discs: on the
// Sierpinski gasket the adjacency spectrum is [−2, 4], so a = 3 rather than
// 4. A step Δt costs about aΔt + O((aΔt)^{1/3} log(1/ε)) products and a few
// vectors of memory; the reported error bound is the sum of the neglected
// Bessel coefficients, rigorous up to rounding. It is the method for large
// graphs and long times. The classical series needs only about
// √(2aΔt·ln(1/ε)) terms (e^{−x}I_k(x) falls like e^{−k²/2x}), so for γL
// stored as a CSR matrix the rigorous Gershgorin interval [0, 2γ·max degree]
// is used instead of the Lanczos estimate. A series whose result breaks
// norm conservation (quantum), contraction or positivity (classical) reveals
// an interval that misses part of the spectrum; the interval is then widened
// and the step repeated.
//
// Restarting the quantum series at every reported time pays its
// O(log(1/ε)) tail once per interval, which dominates for many short,
// log-spaced early intervals. For a quantum walk on a CSR operator the
// driver therefore plans expansion groups: up to six consecutive reported
// times (a·span ≤ 20000) share one recurrence from the state at the group's
// start, each with its own accumulator and coefficients for its own span
// Δ_j, updated only up to its own truncation index. A group runs the rotated
// recurrence S_k = (−i)^k T_k(H̃)ψ, whose coefficients J_0, 2J_1, … are real
// (the phase e^{−ibΔ_j} is applied at the end), keeps the last eight terms
// and adds them to all accumulators at once as one real matrix product, so
// an accumulator costs about 1/50 of a product per term. The groups are
// chosen by dynamic programming over the times, minimising products plus
// 0.02 × accumulator updates. Each time keeps the error budget of the
// restarting driver; the reported error bound is that of the worst reported
// state (its group start's bound plus its own tail). The norm check and
// widening apply to every accumulator. On the gasket g = 10 benchmark
// (60 times to t = 500) this cuts the products from 1.77 (restart per
// interval) to 1.24·a·t_max (benchdata/RESULTS.md). EstimateBytes counts the
// eight stored terms and six accumulators; when they would take more than a
// tenth of the memory limit, every time restarts.
// Classical walks on a real CSR matrix from a real distribution are planned
// the same way on real vectors (plain recurrence, real coefficients
// e^{−bΔ}(−1)^k I_k(aΔ)): on the gasket g = 10 with 60 times to t = 500
// the products fall from 1722 to 645. Operators given only as an Operator
// restart per interval.
//
// Krylov (Saad, SIAM J. Numer. Anal. 29, 209 (1992); step control after
// Sidje, ACM TOMS 24, 130 (1998)) projects onto a Lanczos space of up to 30
// vectors per step, with an a-posteriori error estimate choosing the step;
// later reported times are served from the same space while its estimate
// allows. It needs no spectral bounds and wins for short spans; memory is
// 31 vectors.
//
// Exact diagonalises H once (O(n³) time, 32·n² bytes for a complex matrix
// and its eigenvectors) and then costs one dense product per reported time
// for any time, however long; its error bound comes from the measured
// eigenpair residual. It is refused with a TooLarge error when
// EstimateBytes exceeds the memory limit.
//
// Auto takes Krylov for a short span, ‖H‖·t_max ≤ 8 (‖H‖ from the
// Gershgorin bound of a CSR matrix; one Krylov space then serves every
// reported time). Otherwise it compares the predicted time of Chebyshev
// (a·t_max plus about 25 products per reported time) with that of
// diagonalising (graphs up to 2000 sites within the memory limit) and takes
// the cheaper; Diagnostics.Reason gives the numbers.
//
// Every propagator runs through the same conformance suite
// (conformance_test.go): norm and Σp conservation, closed forms on lines,
// square lattices, hypercubes, engineered chains, cycles, paths and complete
// graphs, states computed offline with scipy.linalg.expm, and mutual
// agreement on random graphs with on-site energies and Peierls phases.
//
// # Classical walks
//
// For an operator with zero row sums (γL), exp(−γLt) keeps Σp. After each
// step the propagators' state is projected back onto Σp = Σp(0) by adding a
// constant; this orthogonal projection can only shorten the error vector.
//
// Predicted couplings and times are model results: before they guide
// fabrication or a measurement, calibrate them against measurements on the
// real device, and follow the lab's own safety rules.
package walk
