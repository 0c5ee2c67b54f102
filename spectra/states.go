package spectra

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// IPR returns the inverse participation ratio Σ_i |ψ_k(i)|⁴ of every
// eigenstate k of e, in dst (allocated when nil or short). It is 1 for a
// state on one site and 1/N for a state spread evenly over N sites. Within a
// degenerate eigenspace the basis is arbitrary, and so is the IPR of its
// members.
func IPR(dst []float64, e *Eigen) []float64 {
	n := e.N
	if cap(dst) < n {
		dst = make([]float64, n)
	}
	dst = dst[:n]
	for k := range dst {
		dst[k] = 0
	}
	for i := 0; i < n; i++ {
		for k := 0; k < n; k++ {
			w := e.Weight(i, k)
			dst[k] += w * w
		}
	}
	return dst
}

// Participation returns the participation number 1/IPR of every eigenstate
// of e: the effective number of sites it occupies.
func Participation(dst []float64, e *Eigen) []float64 {
	dst = IPR(dst, e)
	for k, v := range dst {
		dst[k] = 1 / v
	}
	return dst
}

// WindowMap returns the energy-window map Σ_{E_n ∈ [lo, hi]} |ψ_n(r)|² on
// every site r, in dst (allocated when nil or short). Summed over sites it
// gives the number of eigenstates in the window; it does not depend on the
// basis chosen within degenerate eigenspaces that lie wholly inside the
// window. Errors name "window" when lo > hi or either is not finite.
func WindowMap(dst []float64, e *Eigen, lo, hi float64) ([]float64, error) {
	if math.IsNaN(lo) || math.IsNaN(hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) || lo > hi {
		return nil, fault.New("window", "must be a finite interval [E1, E2] with E1 ≤ E2; got [%v, %v]", lo, hi)
	}
	n := e.N
	if cap(dst) < n {
		dst = make([]float64, n)
	}
	dst = dst[:n]
	k0, k1 := n, 0
	for k, v := range e.Values {
		if v >= lo && v <= hi {
			k0 = min(k0, k)
			k1 = max(k1, k+1)
		}
	}
	for i := 0; i < n; i++ {
		var s float64
		for k := k0; k < k1; k++ {
			s += e.Weight(i, k)
		}
		dst[i] = s
	}
	return dst, nil
}
