package lattice

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// HbarEVfs is the reduced Planck constant in eV·fs (CODATA 2018:
// ħ = 6.582119569×10⁻¹⁶ eV·s).
const HbarEVfs = 0.6582119569

// Unit is a physical unit of coupling (hopping).
type Unit int

const (
	// PerMillimetre is a coupling constant in mm⁻¹ of coupled-mode theory;
	// its conjugate is the propagation length z in mm.
	PerMillimetre Unit = iota + 1
	// PerCentimetre is a coupling constant in cm⁻¹; z in cm.
	PerCentimetre
	// ElectronVolt is a hopping energy in eV; time in fs through ħ.
	ElectronVolt
	// MilliElectronVolt is a hopping energy in meV; time in fs through ħ.
	MilliElectronVolt
)

// String returns the unit's symbol.
func (u Unit) String() string {
	switch u {
	case PerMillimetre:
		return "1/mm"
	case PerCentimetre:
		return "1/cm"
	case ElectronVolt:
		return "eV"
	case MilliElectronVolt:
		return "meV"
	}
	return "unknown unit"
}

// TimeUnit returns the unit of the physical evolution variable conjugate to
// u: "mm" or "cm" of propagation length, or "fs".
func (u Unit) TimeUnit() string {
	switch u {
	case PerMillimetre:
		return "mm"
	case PerCentimetre:
		return "cm"
	case ElectronVolt, MilliElectronVolt:
		return "fs"
	}
	return "unknown unit"
}

// inverse returns the factor f such that dimensionless t = C_ref·f·x for a
// reference coupling C_ref in u and x in u's time unit.
func (u Unit) inverse() float64 {
	switch u {
	case ElectronVolt:
		return 1 / HbarEVfs
	case MilliElectronVolt:
		return 1e-3 / HbarEVfs
	}
	return 1
}

// Scale converts at the boundary between physical units and the engine's
// dimensionless ones, in which the reference coupling C_ref is the hopping
// γ = 1 and time is measured in units of 1/C_ref:
//
//	couplings per length:  t = C_ref·z,           w = C/C_ref
//	hopping energies:      t = E_ref·τ/ħ (τ in fs), w = E/E_ref
//
// The coupled-mode equations i dψ_n/dz = Σ_m C_nm ψ_m are the quantum walk
// with time → z (common practice). Predicted couplings and lengths must be
// calibrated against measurements on the real device.
type Scale struct {
	Ref  float64 // C_ref (or E_ref), in Unit
	Unit Unit
}

// NewScale returns the scale with reference coupling ref in unit u; ref must
// be finite and positive and u one of the Unit constants.
func NewScale(ref float64, u Unit) (Scale, error) {
	if u < PerMillimetre || u > MilliElectronVolt {
		return Scale{}, fault.Range("unit", "one of 1/mm, 1/cm, eV, meV", int(u))
	}
	if !isFiniteCoupling(ref) || ref <= 0 {
		return Scale{}, fault.Range("reference", "a finite coupling > 0 in "+u.String(), ref)
	}
	return Scale{Ref: ref, Unit: u}, nil
}

// Time returns the dimensionless time of a propagation length z (in the
// unit's length) or of a time τ in fs.
func (s Scale) Time(x float64) float64 { return s.Ref * s.Unit.inverse() * x }

// Physical returns the propagation length (or the time in fs) of the
// dimensionless time t: the inverse of Time.
func (s Scale) Physical(t float64) float64 { return t / (s.Ref * s.Unit.inverse()) }

// Weight returns the dimensionless hopping of a physical coupling c in the
// scale's unit.
func (s Scale) Weight(c float64) float64 { return c / s.Ref }

// Coupling returns the physical coupling of a dimensionless hopping w.
func (s Scale) Coupling(w float64) float64 { return w * s.Ref }

// Convert returns the coupling c given in unit from expressed in unit to:
// 1/mm ↔ 1/cm (1 mm⁻¹ = 10 cm⁻¹), eV ↔ meV, and between the two kinds
// through E = ħ·c·v only when the caller gives the group velocity, which
// this function does not: mixing kinds is an *InputError.
func Convert(c float64, from, to Unit) (float64, error) {
	if !isFiniteCoupling(c) {
		return 0, fault.Range("coupling", "a finite number", c)
	}
	factor := func(u Unit) (kind int, f float64, ok bool) {
		switch u {
		case PerMillimetre:
			return 0, 10, true // in cm⁻¹
		case PerCentimetre:
			return 0, 1, true
		case ElectronVolt:
			return 1, 1000, true // in meV
		case MilliElectronVolt:
			return 1, 1, true
		}
		return 0, 0, false
	}
	kf, ff, ok1 := factor(from)
	kt, ft, ok2 := factor(to)
	switch {
	case !ok1:
		return 0, fault.Range("from", "one of 1/mm, 1/cm, eV, meV", int(from))
	case !ok2:
		return 0, fault.Range("to", "one of 1/mm, 1/cm, eV, meV", int(to))
	case kf != kt:
		return 0, fault.New("to", "must be of the same kind as %v (a coupling per length converts only to another per length, an energy only to another energy); got %v", from, to)
	}
	v := c * ff / ft
	if math.IsInf(v, 0) {
		return 0, fault.Range("coupling", "small enough to convert without overflow", c)
	}
	return v, nil
}
