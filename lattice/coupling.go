package lattice

import (
	"math"
	"sort"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// CouplingLaw gives the hopping (coupling) between two sites a distance d
// apart. Distances are in the unit of the positions handed to FromPositions
// (µm for a waveguide array, say); the coupling is in whatever unit the law
// was calibrated in (cm⁻¹, mm⁻¹, meV …), and the bond weights of the graph
// carry that unit, so that H = W + diag(ε) with γ = 1 and time t in the
// reciprocal unit (propagation length z in cm for couplings in cm⁻¹). See
// units.go for the conversions.
type CouplingLaw interface {
	Coupling(d float64) float64
}

// Domained is implemented by coupling laws that hold only on a closed range
// of distances. FromPositions refuses to evaluate such a law outside it.
type Domained interface {
	Domain() (lo, hi float64)
}

// Exponential is the evanescent-coupling law C(d) = C0·exp(−Kappa·(d − D0))
// (common practice for evanescently coupled waveguides; see Szameit & Nolte,
// J. Phys. B 43, 163001 (2010), from memory). C0 is the coupling at the
// reference distance D0; Kappa is the decay constant in inverse position
// units. Next-nearest neighbours are coupled automatically when they lie
// within the cutoff handed to FromPositions; measured next-nearest couplings
// often fall below the exponential extrapolation, so calibrate them on the
// device (or use a Table).
type Exponential struct {
	C0, Kappa, D0 float64
}

// Coupling returns C0·exp(−Kappa·(d − D0)).
func (e Exponential) Coupling(d float64) float64 {
	return e.C0 * math.Exp(-e.Kappa*(d-e.D0))
}

// Slope returns dC/dd = −Kappa·C(d).
func (e Exponential) Slope(d float64) float64 { return -e.Kappa * e.Coupling(d) }

// Validate reports an *InputError unless C0 and D0 are finite, Kappa is
// finite and non-negative.
func (e Exponential) Validate() error {
	switch {
	case !isFiniteCoupling(e.C0):
		return fault.Range("law.c0", "a finite number", e.C0)
	case !isFiniteCoupling(e.Kappa) || e.Kappa < 0:
		return fault.Range("law.kappa", "a finite number ≥ 0", e.Kappa)
	case !isFiniteCoupling(e.D0):
		return fault.Range("law.d0", "a finite number", e.D0)
	}
	return nil
}

// Table is a coupling law interpolated from calibration pairs (distance,
// coupling): ln C is interpolated linearly in d between neighbouring pairs
// (log-linear, exact for an exponential law and monotone between the pairs),
// so all couplings must be positive. Outside the calibrated range
// [d_first, d_last] the law either refuses (FromPositions returns an
// *InputError naming the distance) or, when built with clamp, returns the
// coupling of the nearest end. Clamping at the far end keeps coupling every
// pair inside the cutoff at C(d_last): choose the cutoff accordingly.
type Table struct {
	d, lnc []float64
	clamp  bool
}

// NewTable returns the log-linear table law through the pairs
// (distance[k], coupling[k]). Distances must be finite, non-negative and
// strictly increasing, couplings finite and positive, at least two pairs.
func NewTable(distance, coupling []float64, clamp bool) (*Table, error) {
	if len(distance) < 2 {
		return nil, fault.Range("law.distance", "at least 2 calibration distances", len(distance))
	}
	if len(coupling) != len(distance) {
		return nil, fault.New("law.coupling", "must have one value per distance (%d); got %d", len(distance), len(coupling))
	}
	t := &Table{d: append([]float64(nil), distance...), lnc: make([]float64, len(coupling)), clamp: clamp}
	for k, d := range distance {
		f := "law.distance[" + strconv.Itoa(k) + "]"
		if !isFiniteCoupling(d) || d < 0 {
			return nil, fault.Range(f, "a finite number ≥ 0", d)
		}
		if k > 0 && d <= distance[k-1] {
			return nil, fault.Range(f, "greater than the previous distance "+strconv.FormatFloat(distance[k-1], 'g', -1, 64)+" (strictly increasing)", d)
		}
	}
	for k, c := range coupling {
		if !isFiniteCoupling(c) || c <= 0 {
			return nil, fault.Range("law.coupling["+strconv.Itoa(k)+"]", "a finite number > 0 (the table interpolates ln C)", c)
		}
		t.lnc[k] = math.Log(c)
	}
	return t, nil
}

// Domain returns the calibrated range; with clamping it is unbounded.
func (t *Table) Domain() (lo, hi float64) {
	if t.clamp {
		return math.Inf(-1), math.Inf(1)
	}
	return t.d[0], t.d[len(t.d)-1]
}

// Coupling returns the log-linear interpolation at d. Outside the
// calibrated range it returns the nearest end's coupling when clamping and
// NaN otherwise (FromPositions never asks there: it checks Domain first).
func (t *Table) Coupling(d float64) float64 {
	n := len(t.d)
	if d <= t.d[0] || d >= t.d[n-1] {
		switch {
		case d == t.d[0] || (t.clamp && d < t.d[0]):
			return math.Exp(t.lnc[0])
		case d == t.d[n-1] || (t.clamp && d > t.d[n-1]):
			return math.Exp(t.lnc[n-1])
		}
		return math.NaN()
	}
	k := sort.SearchFloat64s(t.d, d) // t.d[k-1] < d ≤ t.d[k]
	u := (d - t.d[k-1]) / (t.d[k] - t.d[k-1])
	return math.Exp(t.lnc[k-1] + u*(t.lnc[k]-t.lnc[k-1]))
}

// Slope returns dC/dd of the interpolation (one-sided at the pairs: the
// segment to the right), zero outside the range when clamping.
func (t *Table) Slope(d float64) float64 {
	n := len(t.d)
	if d < t.d[0] || d >= t.d[n-1] {
		if t.clamp || d == t.d[n-1] {
			if d == t.d[n-1] {
				k := n - 1
				return t.Coupling(d) * (t.lnc[k] - t.lnc[k-1]) / (t.d[k] - t.d[k-1])
			}
			return 0
		}
		return math.NaN()
	}
	k := sort.Search(n, func(i int) bool { return t.d[i] > d })
	return t.Coupling(d) * (t.lnc[k] - t.lnc[k-1]) / (t.d[k] - t.d[k-1])
}

func isFiniteCoupling(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
