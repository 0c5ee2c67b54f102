package lattice

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// WithFlux returns a copy of g threaded by a uniform magnetic field of
// flux per unit area (positions in units of the nearest-neighbour spacing)
// in units of the flux quantum, through Peierls phases in the Landau gauge
// A = (−B·y, 0). The hopping H[I][J] = W e^{iφ} of each bond gains
//
//	Δφ = 2π·flux·∫_J^I (−y) dx = −2π·flux·(y_I + y_J)/2·(x_I − x_J),
//
// the integral taken along the straight segment from site J to site I. So
// the product H[i₁][i₀]·H[i₂][i₁]⋯H[i₀][i_k] around any counter-clockwise
// loop of bonds has phase 2π·flux·(enclosed area) (mod 2π): 2π·flux per
// unit square plaquette, 2π·flux·√3/4 per unit triangle (Peierls, Z. Phys.
// 80, 763 (1933); Hofstadter, PRB 14, 2239 (1976); from memory).
//
// Positions are taken as given: the wrap-around bonds of a periodic
// lattice join far-apart positions, so their loops do not enclose the
// lattice's own plaquettes and the field is not uniform across the seam
// (use open lattices, or a flux commensurate with the torus and your own
// gauge). Errors: "flux" must be finite and the positions two-dimensional.
// Existing phases are kept and added to; weights and on-site energies are
// unchanged. The copy shares g's positions and bond ends.
func (g *Graph) WithFlux(flux float64) (*Graph, error) {
	if !isFinite(flux) {
		return nil, fault.Range("flux", "a finite number (flux quanta per unit area)", flux)
	}
	if g.dim != 2 {
		return nil, fault.New("flux", "needs positions in 2 dimensions; the lattice has %d", g.dim)
	}
	h := *g
	if flux == 0 {
		return &h, nil
	}
	h.phase = make([]float64, len(g.bi))
	if g.phase != nil {
		copy(h.phase, g.phase)
	}
	p := g.pos
	for k := range g.bi {
		i, j := g.bi[k], g.bj[k]
		xi, yi, xj, yj := p[2*i], p[2*i+1], p[2*j], p[2*j+1]
		h.phase[k] = math.Remainder(h.phase[k]-2*math.Pi*flux*(yi+yj)/2*(xi-xj), 2*math.Pi)
	}
	return &h, nil
}
