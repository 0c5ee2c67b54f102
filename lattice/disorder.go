package lattice

import (
	"math/rand/v2"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Law is the distribution of a random perturbation.
type Law int

const (
	// Box is uniform in [−w/2, w/2].
	Box Law = iota
	// Gauss is normal with standard deviation w.
	Gauss
)

// String returns "box" or "gauss", the job format's names.
func (l Law) String() string {
	switch l {
	case Box:
		return "box"
	case Gauss:
		return "gauss"
	}
	return "Law(?)"
}

// Disorder describes on-site and bond disorder: on-site energies get an
// added draw of width Onsite; each bond weight is multiplied by (1 + δ) with
// δ of width Bond, both from Law (Box: uniform in [−w/2, w/2]; Gauss:
// standard deviation w).
type Disorder struct {
	Onsite, Bond float64
	Law          Law
}

// WithDisorder returns a copy of g with one realisation of d drawn from rng.
// The draw order is fixed, so a realisation is reproducible from its
// source: first, when d.Onsite ≠ 0, one draw per site in site order (added
// to the existing on-site energy); then, when d.Bond ≠ 0, one draw δ per
// bond in bond order (weight w becomes w·(1+δ), the phase is kept). A zero
// width draws nothing. Box draws are w·(U − 1/2) with U = rng.Float64();
// Gauss draws are w·rng.NormFloat64(). With the Gauss law or Bond > 2 a
// weight may change sign or vanish; classical walks need non-negative
// rates, which the caller must ensure.
//
// Errors (fields "onsite", "bond", "law", "rng"): widths must be finite
// and ≥ 0, Law Box or Gauss, rng non-nil (use rand.New(rand.NewPCG(seed,
// stream))). The copy shares g's positions and bond ends.
func (g *Graph) WithDisorder(d Disorder, rng *rand.Rand) (*Graph, error) {
	switch {
	case !isFinite(d.Onsite) || d.Onsite < 0:
		return nil, fault.Range("onsite", "a finite width ≥ 0", d.Onsite)
	case !isFinite(d.Bond) || d.Bond < 0:
		return nil, fault.Range("bond", "a finite width ≥ 0", d.Bond)
	case d.Law != Box && d.Law != Gauss:
		return nil, fault.Range("law", `Box ("box") or Gauss ("gauss")`, int(d.Law))
	case rng == nil:
		return nil, fault.New("rng", "must be a seeded source such as rand.New(rand.NewPCG(seed, stream)); got nil")
	}
	h := *g
	sample := func(w float64) float64 { return draw(rng, d.Law, w) } // coupling_disorder.go
	if d.Onsite != 0 {
		h.onsite = make([]float64, g.n)
		if g.onsite != nil {
			copy(h.onsite, g.onsite)
		}
		for i := range h.onsite {
			h.onsite[i] += sample(d.Onsite)
		}
	}
	if d.Bond != 0 {
		h.w = make([]float64, len(g.bi))
		for k := range h.w {
			w := 1.0
			if g.w != nil {
				w = g.w[k]
			}
			h.w[k] = w * (1 + sample(d.Bond))
		}
	}
	return &h, nil
}
