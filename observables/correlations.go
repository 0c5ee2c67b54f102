package observables

// Statistics selects the exchange symmetry of two particles.
type Statistics int

const (
	// Bosons: Γ_qr = |U_qk U_rl + U_ql U_rk|².
	Bosons Statistics = iota
	// Fermions: Γ_qr = |U_qk U_rl − U_ql U_rk|².
	Fermions
	// Distinguishable: Γ_qr = |U_qk U_rl|² + |U_ql U_rk|².
	Distinguishable
)

// String returns "bosons", "fermions" or "distinguishable".
func (s Statistics) String() string {
	switch s {
	case Bosons:
		return "bosons"
	case Fermions:
		return "fermions"
	case Distinguishable:
		return "distinguishable"
	}
	return "Statistics(?)"
}

// Correlations sets dst to the two-particle correlation matrix Γ for two
// non-interacting particles injected at sites k ≠ l, and returns it. uk and
// ul are the single-particle propagator columns U_·k and U_·l (the states
// evolved from sites k and l); dst is n×n row-major, Γ_qr at dst[q*n+r],
// allocated when nil:
//
//	Bosons:          Γ_qr = |U_qk U_rl + U_ql U_rk|²
//	Fermions:        Γ_qr = |U_qk U_rl − U_ql U_rk|²
//	Distinguishable: Γ_qr = |U_qk U_rl|² + |U_ql U_rk|²
//
// Bromberg et al., PRL 102, 253904 (2009); Peruzzo et al., Science 329, 1500
// (2010). For unitary U and k ≠ l each sums to 2 over ordered pairs (q, r):
// for q ≠ r, Γ_qr is the probability of finding one particle on q and the
// other on r, and Γ_qq is twice the probability of finding both on q (zero
// for fermions). Cost O(n²); no allocation with a caller dst.
func Correlations(dst []float64, uk, ul []complex128, kind Statistics) []float64 {
	n := len(uk)
	if len(ul) != n {
		panicf("Correlations: len(uk) = %d, len(ul) = %d", n, len(ul))
	}
	if dst == nil {
		dst = make([]float64, n*n)
	}
	if len(dst) != n*n {
		panicf("Correlations: len(dst) = %d, want %d", len(dst), n*n)
	}
	for q, aqk := range uk {
		aql := ul[q]
		row := dst[q*n : (q+1)*n]
		switch kind {
		case Bosons:
			for r := range row {
				row[r] = abs2(aqk*ul[r] + aql*uk[r])
			}
		case Fermions:
			for r := range row {
				row[r] = abs2(aqk*ul[r] - aql*uk[r])
			}
		case Distinguishable:
			for r := range row {
				row[r] = abs2(aqk*ul[r]) + abs2(aql*uk[r])
			}
		default:
			panicf("Correlations: unknown Statistics %d", int(kind))
		}
	}
	return dst
}

func abs2(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }
