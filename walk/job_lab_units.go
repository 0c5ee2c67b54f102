package walk

import (
	"context"
	"io"
	"math"
)

// runUnits runs a walk job whose couplings carry a physical unit: the job
// is rewritten in the engine's dimensionless units (weights w = C/C_ref, so
// hopping γ/C_ref; times t = C_ref·z, or E_ref·τ/ħ for energies; the fit
// window and the average window likewise), run, and its times and time-like
// outputs are converted back (lattice.Scale). Regimes keep their exponents;
// a prefactor A of y ≈ A·t^α becomes A·s^α for y ≈ A′·z^α with t = s·z.
func (j *Job) runUnits(ctx context.Context, log io.Writer) (*Response, error) {
	sc, err := j.Units.scale()
	if err != nil {
		return nil, err
	}
	s := sc.Time(1)
	c := *j
	c.Units = nil
	c.Hopping = sc.Weight(j.Hopping)
	c.Times = make([]float64, len(j.Times))
	for k, t := range j.Times {
		c.Times[k] = sc.Time(t)
	}
	c.Fit.From, c.Fit.To = j.Fit.From*s, j.Fit.To*s
	if j.Window != nil {
		w := *j.Window
		w.To *= s
		c.Window = &w
	}
	resp, err := c.runWalk(ctx, log)
	if err != nil {
		return nil, err
	}
	resp.Times = append([]float64(nil), j.Times...)
	resp.DimensionlessTimes = c.Times
	resp.TimeUnit = sc.Unit.TimeUnit()
	toPhysical(resp, s)
	return resp, nil
}

// toPhysical converts the time-like outputs of resp from dimensionless
// times t to physical ones x = t/s.
func toPhysical(resp *Response, s float64) {
	for i := range resp.Regimes {
		r := &resp.Regimes[i]
		r.From /= s
		r.To /= s
		r.Prefactor *= math.Pow(s, r.Exponent)
	}
	for i := range resp.Crossovers {
		c := &resp.Crossovers[i]
		c.Time /= s
		c.Low /= s
		c.High /= s
	}
	for i := range resp.FitTimes {
		resp.FitTimes[i] /= s
	}
	if resp.Average != nil && resp.Average.Window != 0 {
		resp.Average.Window /= s
	}
}
