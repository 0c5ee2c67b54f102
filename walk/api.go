package walk

import (
	"context"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// InputError is the error returned for input outside its accepted range.
type InputError = fault.Error

// Operator is a Hermitian linear operator on ℂⁿ: all a propagator needs.
// *sparse.CSR from lattice.Graph.Hamiltonian and Laplacian implements it;
// propagators detect it and use fused kernels.
type Operator interface {
	Len() int
	// MulVec sets dst = H·x; dst and x do not overlap.
	MulVec(dst, x []complex128)
}

// Method selects a propagator.
type Method int

const (
	// Auto chooses by size, time span and number of reported times (see
	// the package documentation) and says why in Diagnostics.Reason.
	Auto Method = iota
	// Exact diagonalises H once: O(n³) time, O(n²) memory, any time.
	Exact
	// Krylov projects onto Lanczos spaces with a-posteriori step control.
	Krylov
	// Chebyshev expands the exponential in Chebyshev polynomials.
	Chebyshev
)

// Dynamics selects the equation of motion.
type Dynamics int

const (
	// Quantum is ψ(t) = exp(−iHt) ψ(0), ħ = 1.
	Quantum Dynamics = iota
	// Classical is p(t) = exp(−Lt) p(0), the continuous-time random walk
	// dp/dt = −Lp with L = D − W.
	Classical
)

// Settings configures a propagation. The zero value means: automatic method,
// tolerance 1e-10, GOMAXPROCS workers, no progress reports, the machine's
// memory limit.
type Settings struct {
	// Method selects the propagator; Auto chooses by size, time span and
	// the number of reported times and says why in Diagnostics.Reason.
	Method Method
	// Tolerance is the target 2-norm error of the state at every reported
	// time, relative to ‖ψ(0)‖; 0 means DefaultTolerance (1e-10). Accepted:
	// 0 < Tolerance < 1.
	Tolerance float64
	// Workers bounds the goroutines of the sparse products when the
	// operator is a *sparse.CSR (0 means GOMAXPROCS). Results are
	// bit-for-bit reproducible for a given Workers.
	Workers int
	// Progress, when set, is called with the reported times done so far
	// after each reported time.
	Progress func(done, total int)
	// MemoryLimit in bytes; 0 means 80% of the machine's memory (or
	// AMPWALK_MEMORY_LIMIT). A method whose EstimateBytes exceeds it is
	// refused with a TooLarge error.
	MemoryLimit int64
}

// Diagnostics says how a propagation was computed.
type Diagnostics struct {
	Method     string  // "exact", "krylov" or "chebyshev"
	Reason     string  // why Auto chose it (empty when the caller chose)
	Products   int     // matrix–vector products
	NormDrift  float64 // worst |‖ψ(t)‖ − ‖ψ(0)‖| (classical: |Σp(t) − Σp(0)|) over reported times
	ErrorBound float64 // bound or estimate of the 2-norm error at the worst reported time
	Seconds    float64 // wall time
}

// Visit receives the state at reported time index k. The state is owned by
// the propagator and valid only during the call. A non-nil error stops the
// propagation and is returned.
type Visit func(k int, t float64, state []complex128) error

// Propagate evolves psi0 under op to each of times (non-negative,
// non-decreasing), calling visit at each. Quantum dynamics evolves with
// exp(−iHt); Classical with exp(−Ht) (op is then γL). psi0 is not modified;
// a time 0 reports psi0 itself.
//
// The tolerance is the target 2-norm error of the state at every reported
// time, relative to ‖psi0‖; the error budget is shared between the steps so
// that their sum stays below it. The context is checked between steps and
// segments; a cancelled propagation returns an error wrapping the
// context's error (errors.Is(err, context.Canceled)) and a *fault.Error of
// kind Cancelled (errors.As). visit errors are returned unchanged.
//
// Input errors are *InputError naming the field: "start" (length or a
// non-finite entry), "times" (empty, negative, non-finite or decreasing, with
// the index of the first offending time), "tolerance", "method", "workers",
// "memory_limit"; a method whose memory estimate (EstimateBytes) exceeds the
// limit is refused with kind TooLarge.
func Propagate(ctx context.Context, op Operator, dyn Dynamics, psi0 []complex128, times []float64, s Settings, visit Visit) (Diagnostics, error) {
	return propagate(ctx, op, dyn, psi0, times, s, visit)
}

// QuantumWalk evolves psi0 under H = γW + diag(ε) of g.
func QuantumWalk(ctx context.Context, g *lattice.Graph, gamma float64, psi0 []complex128, times []float64, s Settings, visit Visit) (Diagnostics, error) {
	return Propagate(ctx, g.Hamiltonian(gamma), Quantum, psi0, times, s, visit)
}

// ClassicalWalk evolves the probability vector p0 by dp/dt = −γLp on g. The
// state handed to visit holds p_j in its real parts.
func ClassicalWalk(ctx context.Context, g *lattice.Graph, gamma float64, p0 []float64, times []float64, s Settings, visit Visit) (Diagnostics, error) {
	psi := make([]complex128, len(p0))
	for i, v := range p0 {
		psi[i] = complex(v, 0)
	}
	return Propagate(ctx, g.Laplacian(gamma), Classical, psi, times, s, visit)
}
