package measure

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Comparison holds the agreement of a measured and a simulated distribution
// at one propagation length.
type Comparison struct {
	Length float64
	// Overlap is the classical fidelity (Bhattacharyya coefficient)
	// F = Σ_j √(p_j q_j), 1 for identical distributions, 0 for disjoint ones.
	Overlap float64
	// Distance is the total variation distance ½ Σ_j |p_j − q_j|, 0 for
	// identical distributions, 1 for disjoint ones.
	Distance float64
}

// Overlap returns Σ_j √(p_j q_j) of p and q after normalising each to unit
// sum. Both must have the same length, non-negative finite entries and a
// positive sum (an *InputError names "measured" or "simulated" otherwise).
func Overlap(p, q []float64) (float64, error) {
	ps, qs, err := sums(p, q)
	if err != nil {
		return 0, err
	}
	var f float64
	for j := range p {
		f += math.Sqrt(p[j] / ps * q[j] / qs)
	}
	return math.Min(f, 1), nil
}

// TotalVariation returns ½ Σ_j |p_j − q_j| of p and q after normalising each
// to unit sum; the requirements are those of Overlap.
func TotalVariation(p, q []float64) (float64, error) {
	ps, qs, err := sums(p, q)
	if err != nil {
		return 0, err
	}
	var d float64
	for j := range p {
		d += math.Abs(p[j]/ps - q[j]/qs)
	}
	return d / 2, nil
}

func sums(p, q []float64) (float64, float64, error) {
	if len(q) != len(p) {
		return 0, 0, fault.New("simulated", "must have one value per measured site (%d); got %d", len(p), len(q))
	}
	sum := func(name string, x []float64) (float64, error) {
		var s float64
		for j, v := range x {
			if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
				return 0, fault.New(name, "must be finite and ≥ 0; site %d has %v", j, v)
			}
			s += v
		}
		if !(s > 0) || math.IsInf(s, 0) {
			return 0, fault.New(name, "must have a positive finite sum; got %v", s)
		}
		return s, nil
	}
	ps, err := sum("measured", p)
	if err != nil {
		return 0, 0, err
	}
	qs, err := sum("simulated", q)
	return ps, qs, err
}

// Compare compares the reduction, length by length, with simulated
// distributions: simulated[k] holds the probabilities (or intensities, they
// are normalised) at r.Points[k].Length, in the measured site order.
func (r *Reduction) Compare(simulated [][]float64) ([]Comparison, error) {
	if len(simulated) != len(r.Points) {
		return nil, fault.New("simulated", "must hold one distribution per measured length (%d); got %d", len(r.Points), len(simulated))
	}
	out := make([]Comparison, len(r.Points))
	for k, pt := range r.Points {
		f, err := Overlap(r.P[k], simulated[k])
		if err != nil {
			return nil, fault.Prefix("length["+itoa(k)+"]", err)
		}
		d, _ := TotalVariation(r.P[k], simulated[k])
		out[k] = Comparison{Length: pt.Length, Overlap: f, Distance: d}
	}
	return out, nil
}
