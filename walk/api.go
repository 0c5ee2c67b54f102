package walk

import (
	"context"
	"errors"

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
	Auto Method = iota
	Exact
	Krylov
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
	Method    Method
	Tolerance float64
	Workers   int
	// Progress, when set, is called with the reported times done so far.
	Progress func(done, total int)
	// MemoryLimit in bytes; 0 means 80% of the machine's memory.
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

var errTODO = errors.New("walk: not implemented yet")

// Propagate evolves psi0 under op to each of times (non-negative,
// non-decreasing), calling visit at each. Quantum dynamics evolves with
// exp(−iHt); Classical with exp(−Ht) (op is then γL).
func Propagate(ctx context.Context, op Operator, dyn Dynamics, psi0 []complex128, times []float64, s Settings, visit Visit) (Diagnostics, error) {
	return Diagnostics{}, errTODO
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
