package lattice

import (
	"math/rand/v2"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Fabrication describes fabrication tolerances of a device built from
// measured or designed positions: every coordinate of every site is
// displaced by an independent draw of width Jitter (in the position unit),
// and every on-site energy gets an added draw of width Detuning (in the
// coupling unit), both from Law (Box: uniform in [−w/2, w/2]; Gauss:
// standard deviation w). Positional jitter becomes coupling disorder through
// the coupling law: the graph is regenerated from the jittered positions, so
// correlated changes of neighbouring bonds and of next-nearest couplings are
// kept. To first order a bond of length d changes by C′(d)·δd, with δd the
// jitter projected on the bond direction, of standard deviation √2·σ for
// independent ends. Choose the cutoff away from any neighbour shell
// (between the next-nearest and the next shell, say): a jittered pair near
// the cutoff is bonded in some realisations and not in others.
type Fabrication struct {
	Jitter   float64
	Detuning float64
	Law      Law
}

// Validate reports an *InputError unless both widths are finite and
// non-negative and Law is Box or Gauss.
func (f Fabrication) Validate() error {
	switch {
	case !isFiniteCoupling(f.Jitter) || f.Jitter < 0:
		return fault.Range("fabrication.jitter", "a finite width ≥ 0 in the position unit", f.Jitter)
	case !isFiniteCoupling(f.Detuning) || f.Detuning < 0:
		return fault.Range("fabrication.detuning", "a finite width ≥ 0 in the coupling unit", f.Detuning)
	case f.Law != Box && f.Law != Gauss:
		return fault.Range("fabrication.law", "Box or Gauss", int(f.Law))
	}
	return nil
}

// draw returns one draw of width w from law.
func draw(rng *rand.Rand, law Law, w float64) float64 {
	if w == 0 {
		return 0
	}
	if law == Gauss {
		return w * rng.NormFloat64()
	}
	return w * (rng.Float64() - 0.5)
}

// Realisation returns the source of fabrication realisation k of seed:
// rand.New(rand.NewPCG(seed, k)). Realisation k depends on (seed, k) alone,
// so any one can be recomputed on its own.
func Realisation(seed uint64, k int) *rand.Rand {
	return rand.New(rand.NewPCG(seed, uint64(k)))
}

// Fabricate returns one fabricated device: the positions pos jittered, the
// detuning (nil for zero) disordered, both with draws from rng (positions
// first, site by site and coordinate by coordinate, then detunings site by
// site), and the graph FromPositions builds from them. It also returns the
// jittered positions. Errors are those of Validate and FromPositions.
func (f Fabrication) Fabricate(pos []float64, dim int, law CouplingLaw, cutoff float64, detuning []float64, rng *rand.Rand) (*Graph, []float64, error) {
	if err := f.Validate(); err != nil {
		return nil, nil, err
	}
	if rng == nil {
		return nil, nil, fault.New("rng", "must be a seeded source (use Realisation(seed, k)); got nil")
	}
	if dim >= 1 && len(pos)%dim == 0 && detuning != nil && len(detuning) != len(pos)/dim {
		return nil, nil, fault.New("detuning", "must have one value per site (%d); got %d", len(pos)/dim, len(detuning))
	}
	jp := make([]float64, len(pos))
	for k, x := range pos {
		jp[k] = x + draw(rng, f.Law, f.Jitter)
	}
	var det []float64
	if detuning != nil || f.Detuning > 0 {
		n := len(pos)
		if dim >= 1 {
			n = len(pos) / dim
		}
		det = make([]float64, n)
		for i := range det {
			if detuning != nil {
				det[i] = detuning[i]
			}
			det[i] += draw(rng, f.Law, f.Detuning)
		}
	}
	g, err := FromPositions(jp, dim, law, cutoff, det)
	if err != nil {
		return nil, nil, err
	}
	return g, jp, nil
}

// Ensemble returns realisations fabricated devices, realisation k drawn from
// Realisation(seed, k). realisations must be between 1 and 10⁶.
func (f Fabrication) Ensemble(pos []float64, dim int, law CouplingLaw, cutoff float64, detuning []float64, seed uint64, realisations int) ([]*Graph, error) {
	if realisations < 1 || realisations > 1e6 {
		return nil, fault.Range("realisations", "between 1 and 1000000", realisations)
	}
	gs := make([]*Graph, realisations)
	for k := range gs {
		g, _, err := f.Fabricate(pos, dim, law, cutoff, detuning, Realisation(seed, k))
		if err != nil {
			return nil, fault.Prefix("realisation["+strconv.Itoa(k)+"]", err)
		}
		gs[k] = g
	}
	return gs, nil
}
