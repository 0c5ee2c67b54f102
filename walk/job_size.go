package walk

import (
	"fmt"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// jobBytes estimates the memory of a walk job on g: the graph and its
// Hamiltonian (lattice.EstimateBytes, plus stored values when the graph is
// weighted or disordered), the propagator's vectors (EstimateBytesFor) for
// each realisation running at once, the dense eigensystem of an exact
// average, and the stored outputs of every realisation.
func (j *Job) jobBytes(g *lattice.Graph) int64 {
	n, m := int64(g.Len()), int64(g.NumBonds())
	T := int64(len(j.Times))
	b := lattice.EstimateBytes(g.Len(), g.NumBonds(), g.Dim())
	b += 8*m + 16*2*m // weights and stored CSR values (weighted or disordered copies)
	_, nr := j.realisations()
	conc := int64(min(nr, workersFor(0)))
	vec := EstimateBytesFor(g.Len(), 2*g.NumBonds(), j.Method, j.Times, fault.MemoryLimit())
	if j.reports("average") && j.Window == nil {
		vec += 2 * 16 * n * n
	}
	if j.reports("correlations") {
		vec += 16 * T * n // the second particle's stored states
	}
	b += conc * (vec + 8*n) // plus the probability scratch
	out := int64(0)
	for _, r := range []string{"msd", "return", "spread", "ipr", "entropy", "participation"} {
		if j.reports(r) {
			out += 8 * T
		}
	}
	if j.reports("populations") {
		out += 8 * T * n
	}
	if j.reports("correlations") {
		out += 8 * T * n * n
	}
	return b + int64(nr)*out
}

// checkSize refuses jobs beyond the stated limits or the memory limit. With
// method "auto" it counts the Krylov basis that Auto may build, and pins
// the job to "chebyshev" when only that fits.
func (j *Job) checkSize(g *lattice.Graph) error {
	n, T := g.Len(), len(j.Times)
	if j.Method == Exact && n > MaxExactSites {
		return &fault.Error{Kind: fault.TooLarge, Field: "method",
			Msg: fmt.Sprintf("\"exact\" diagonalises a dense %d×%d matrix (about %d bytes); it is limited to %d sites: use \"auto\", \"krylov\" or \"chebyshev\"",
				n, n, int64(32)*int64(n)*int64(n), MaxExactSites)}
	}
	if j.reports("average") && j.Window == nil && n > MaxExactSites {
		return &fault.Error{Kind: fault.TooLarge, Field: "report",
			Msg: fmt.Sprintf("the exact infinite-time \"average\" needs all eigenvectors of a %d-site graph (about %d bytes); it is limited to %d sites: give a \"window\" {\"to\": T} for a finite-time average",
				n, int64(32)*int64(n)*int64(n), MaxExactSites)}
	}
	if j.reports("populations") && int64(n)*int64(T) > MaxPopulationValues {
		return &fault.Error{Kind: fault.TooLarge, Field: "report",
			Msg: fmt.Sprintf("\"populations\" would return %d values (%d times × %d sites, about %d bytes of JSON); the limit is %d values: ask for fewer times or reduce with msd, spread, ipr …",
				int64(n)*int64(T), T, n, int64(n)*int64(T)*24, MaxPopulationValues)}
	}
	if j.reports("correlations") && int64(n)*int64(n)*int64(T) > MaxPopulationValues {
		return &fault.Error{Kind: fault.TooLarge, Field: "report",
			Msg: fmt.Sprintf("\"correlations\" would return %d values (%d times × %d² site pairs); the limit is %d values",
				int64(n)*int64(n)*int64(T), T, n, MaxPopulationValues)}
	}
	if err := j.checkChebyshevTime(g); err != nil {
		return err
	}
	lim := fault.MemoryLimit()
	if j.Method == Auto {
		// Auto may choose Krylov, whose basis of krylovDim+1 vectors
		// dominates on large graphs; the Chebyshev estimate alone would
		// understate the memory. When the Krylov basis does not fit but
		// Chebyshev (a few vectors) does, the job is pinned to Chebyshev.
		j.Method = Krylov
		kb := j.jobBytes(g)
		j.Method = Auto
		if kb <= lim {
			return nil
		}
		j.Method = Chebyshev
		if j.jobBytes(g) <= lim {
			return nil
		}
		j.Method = Auto
	}
	est := j.jobBytes(g)
	if j.Method == Auto {
		j.Method = Chebyshev // the least any propagation needs
		est = j.jobBytes(g)
		j.Method = Auto
	}
	if est > lim {
		return fault.Large("lattice", est, lim)
	}
	return nil
}
