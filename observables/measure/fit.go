package measure

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// ScaleFit is the result of FitScale.
type ScaleFit struct {
	// Scale is the fitted factor s of y(z) ≈ model(s·z), Err its standard
	// deviation from the curvature of χ² at the minimum.
	Scale, Err float64
	// Chi2 is the minimum χ², Dof = len(z) − 1 its degrees of freedom.
	Chi2 float64
	Dof  int
	// Weighted reports whether errors were given; without them Err is
	// scaled by √(χ²/Dof), the usual estimate from the residual scatter.
	Weighted bool
}

// FitScale fits the time scale of a measured curve: it finds s in [lo, hi]
// minimising χ²(s) = Σ_k ((y_k − model(s·z_k)) / σ_k)², where model is the
// curve the engine predicts in dimensionless time (hopping 1). For a
// waveguide array whose couplings are all proportional to one constant C, a
// walk simulated with unit reference coupling and fitted this way gives
// s = C_ref in the reciprocal length unit: the calibration of the coupling
// law against the device. errs may be nil (unweighted); otherwise every
// error must be positive.
//
// The minimum is bracketed on a 400-point logarithmic grid over [lo, hi]
// and refined by golden-section search (Kiefer, Proc. AMS 4, 502 (1953),
// from memory); Err = √(2 / χ²″(s)) (common practice). A minimum on the edge
// of [lo, hi] is an error: widen the range.
func FitScale(z, y, errs []float64, model func(t float64) float64, lo, hi float64) (ScaleFit, error) {
	switch {
	case len(z) < 2:
		return ScaleFit{}, fault.Range("lengths", "at least 2 lengths", len(z))
	case len(y) != len(z):
		return ScaleFit{}, fault.New("values", "must have one value per length (%d); got %d", len(z), len(y))
	case errs != nil && len(errs) != len(z):
		return ScaleFit{}, fault.New("errors", "must be nil or have one value per length (%d); got %d", len(z), len(errs))
	case model == nil:
		return ScaleFit{}, fault.New("model", "must be a function; got nil")
	case !(lo > 0) || math.IsInf(hi, 0) || !(hi > lo):
		return ScaleFit{}, fault.New("range", "must satisfy 0 < lo < hi < ∞; got [%v, %v]", lo, hi)
	}
	for k := range z {
		if math.IsNaN(z[k]) || math.IsInf(z[k], 0) || z[k] < 0 {
			return ScaleFit{}, fault.New("lengths", "must be finite and ≥ 0; lengths[%d] = %v", k, z[k])
		}
		if math.IsNaN(y[k]) || math.IsInf(y[k], 0) {
			return ScaleFit{}, fault.New("values", "must be finite; values[%d] = %v", k, y[k])
		}
		if errs != nil && (!(errs[k] > 0) || math.IsInf(errs[k], 0)) {
			return ScaleFit{}, fault.New("errors", "must be positive and finite; errors[%d] = %v", k, errs[k])
		}
	}
	var bad error
	chi2 := func(s float64) float64 {
		var c float64
		for k := range z {
			m := model(s * z[k])
			if math.IsNaN(m) || math.IsInf(m, 0) {
				bad = fault.New("model", "must return finite values; model(%v) = %v", s*z[k], m)
				return math.Inf(1)
			}
			r := y[k] - m
			if errs != nil {
				r /= errs[k]
			}
			c += r * r
		}
		return c
	}
	const grid = 400
	ratio := math.Pow(hi/lo, 1.0/(grid-1))
	best, bc := 0, math.Inf(1)
	for i := 0; i < grid; i++ {
		if c := chi2(lo * math.Pow(ratio, float64(i))); c < bc {
			best, bc = i, c
		}
		if bad != nil {
			return ScaleFit{}, bad
		}
	}
	if best == 0 || best == grid-1 {
		return ScaleFit{}, fault.New("range", "must contain the best scale; χ² is smallest at the edge %v of [%v, %v]", lo*math.Pow(ratio, float64(best)), lo, hi)
	}
	a, b := lo*math.Pow(ratio, float64(best-1)), lo*math.Pow(ratio, float64(best+1))
	g := (math.Sqrt(5) - 1) / 2
	x1, x2 := b-g*(b-a), a+g*(b-a)
	f1, f2 := chi2(x1), chi2(x2)
	for i := 0; i < 200 && b-a > 1e-13*b; i++ {
		if f1 < f2 {
			b, x2, f2 = x2, x1, f1
			x1 = b - g*(b-a)
			f1 = chi2(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + g*(b-a)
			f2 = chi2(x2)
		}
	}
	s := (a + b) / 2
	c0 := chi2(s)
	h := 1e-4 * s
	curv := (chi2(s+h) - 2*c0 + chi2(s-h)) / (h * h)
	if bad != nil {
		return ScaleFit{}, bad
	}
	if !(curv > 0) {
		return ScaleFit{}, &fault.Error{Kind: fault.Numerical, Field: "model", Msg: "χ² must curve upwards at its minimum to give an error; the model does not depend on the scale there"}
	}
	f := ScaleFit{Scale: s, Err: math.Sqrt(2 / curv), Chi2: c0, Dof: len(z) - 1, Weighted: errs != nil}
	if errs == nil && f.Dof > 0 {
		f.Err *= math.Sqrt(c0 / float64(f.Dof))
	}
	return f, nil
}
