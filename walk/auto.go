package walk

import (
	"context"
	"fmt"
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/internal/sparse"
)

// Rough costs on the project's reference machine (2 cores), used only to
// rank the methods against each other (common practice: pick by predicted
// work; the absolute values do not matter, their ratios do).
const (
	// secPerEntry is the time per stored entry of one sparse product,
	// including the vector updates of the Chebyshev recurrence.
	secPerEntry = 2e-9
	// secPerCube is the time per n³ of a dense eigen-decomposition with
	// vectors by spectra.SymEigen (real) and spectra.HermEigen (complex),
	// assembly and the residual check included, measured at n = 1000–2000.
	secPerCubeReal    = 7e-10
	secPerCubeComplex = 2e-9
	// secPerSquare is the time per n² of one reported time (one dense
	// product with the eigenvectors).
	secPerSquare = 4e-9
	// exactMaxSites is the largest n for which Auto considers exact
	// diagonalisation at all.
	exactMaxSites = 2000
	// krylovMaxSpan is the largest ‖H‖·t_max for which Auto takes Krylov:
	// one Lanczos basis of krylovDim vectors then reaches every reported
	// time to about 1e-10 (the error falls like (‖H‖t)^m/m!), and no
	// spectral bounds are needed.
	krylovMaxSpan = 8
)

// choose builds the propagator for s.Method, choosing one when it is Auto
// (and saying why in d.Reason). It returns the products spent on setting up
// (spectral bounds, dense assembly).
func choose(ctx context.Context, op Operator, classical bool, times []float64, s Settings, d *Diagnostics) (propagator, int, error) {
	n := op.Len()
	nnz := estimateNNZ(op)
	tmax := times[len(times)-1]
	steps := 0
	prev := 0.0
	for _, t := range times {
		if t > prev {
			steps++
			prev = t
		}
	}
	m := s.Method
	var iv interval
	haveIV := false
	if m == Auto {
		// A cheap upper bound on the spectral radius first: Gershgorin for a
		// CSR matrix.
		radius := math.Inf(1)
		if c, ok := op.(*sparse.CSR); ok {
			lo, hi := c.Gershgorin()
			radius = math.Max(math.Abs(lo), math.Abs(hi))
		}
		exactOK := n <= exactMaxSites && EstimateBytes(n, nnz, Exact) <= s.MemoryLimit
		switch {
		case radius*tmax <= krylovMaxSpan && n > krylovDim:
			m = Krylov
			d.Reason = fmt.Sprintf("a short span (‖H‖·t_max ≤ %.3g, %d reported times): one Krylov space of %d vectors reaches every reported time, cheaper than setting up a Chebyshev expansion", radius*tmax, steps, krylovDim)
		default:
			var err error
			iv, err = spectralInterval(ctx, op)
			if err != nil {
				return nil, iv.products, err
			}
			haveIV = true
			a := (iv.hi - iv.lo) / 2
			chebProducts := a*tmax + 25*float64(steps) + float64(intervalSteps)
			if classical {
				// e^{−x}I_k(x) falls like e^{−k²/2x}: about √(2x·ln(1/ε)) terms.
				chebProducts = math.Sqrt(2*a*tmax*30) + 25*float64(steps)
			}
			chebCost := chebProducts * float64(nnz+2*n) * secPerEntry
			exactCost := math.Inf(1)
			if exactOK {
				N := float64(n)
				perCube := secPerCubeComplex
				if c, ok := op.(*sparse.CSR); ok && c.IsReal() {
					perCube = secPerCubeReal
				}
				exactCost = perCube*N*N*N + secPerSquare*N*N*float64(steps)
			}
			if exactCost < chebCost {
				m = Exact
				d.Reason = fmt.Sprintf("%d sites and %d reported times over a span of %.3g (spectral half-width times t_max): diagonalising once (≈%.2g s) is predicted cheaper than ≈%.0f Chebyshev products (≈%.2g s)",
					n, steps, a*tmax, exactCost, chebProducts, chebCost)
			} else {
				m = Chebyshev
				why := "predicted cheaper than diagonalising"
				if !exactOK {
					why = fmt.Sprintf("exact diagonalisation is out of reach at %d sites", n)
				}
				d.Reason = fmt.Sprintf("%d sites and a span of %.3g (spectral half-width times t_max): the Chebyshev expansion needs ≈%.0f products, %s", n, a*tmax, chebProducts, why)
			}
		}
	}
	switch m {
	case Exact:
		if b := EstimateBytes(n, nnz, Exact); b > s.MemoryLimit {
			return nil, 0, fault.Large("method", b, s.MemoryLimit)
		}
		p, prods, err := newExact(ctx, op, classical)
		return p, prods, err
	case Krylov:
		if b := EstimateBytes(n, nnz, Krylov); b > s.MemoryLimit {
			return nil, 0, fault.Large("method", b, s.MemoryLimit)
		}
		return newKrylov(op, classical), 0, nil
	default:
		if b := EstimateBytesFor(n, nnz, Chebyshev, times, s.MemoryLimit); b > s.MemoryLimit {
			return nil, 0, fault.Large("lattice", b, s.MemoryLimit)
		}
		if classical {
			// The classical series costs O(√(a·t)) products, so a rigorous
			// interval is worth its slack: Gershgorin for a CSR matrix
			// (for γL exactly [0, 2γ·max degree]); otherwise the Lanczos
			// bounds with 5% more room, the norm check catching the rest.
			if c, ok := op.(*sparse.CSR); ok {
				lo, hi := c.Gershgorin()
				return newChebyshev(op, classical, interval{lo: lo, hi: hi}), iv.products, nil
			}
			if !haveIV {
				var err error
				if iv, err = spectralInterval(ctx, op); err != nil {
					return nil, iv.products, err
				}
			}
			// Room above only: an interval reaching below the spectrum
			// multiplies the classical coefficients by e^{(λ_min − lo)Δt}
			// (they must then cancel), while one ending a little above
			// the lowest eigenvalue costs nothing (exp(−Ht) is tiny and
			// smooth there).
			w := iv.hi - iv.lo
			iv.lo, iv.hi = math.Max(iv.lo, iv.ritzLo), iv.hi+0.05*w
			return newChebyshev(op, classical, iv), iv.products, nil
		}
		if !haveIV {
			var err error
			iv, err = spectralInterval(ctx, op)
			if err != nil {
				return nil, iv.products, err
			}
		}
		return newChebyshev(op, classical, iv), iv.products, nil
	}
}

// estimateNNZ returns the stored entries of op when it says, else 8 per
// row (a typical lattice).
func estimateNNZ(op Operator) int {
	if c, ok := op.(interface{ NNZ() int }); ok {
		return c.NNZ()
	}
	return 8 * op.Len()
}
