package walk

import (
	"context"
	"io"
	"math"

	"github.com/ampwalk/ampwalk/lattice"
)

// runUnits runs a walk job whose couplings carry a physical unit. The
// engine works with H in the coupling unit and the evolution variable
// f·x, x the physical time (f = 1 for couplings per length, x a length;
// f = 1/ħ or 10⁻³/ħ for eV or meV, x in fs): H·f·x is the same phase as
// the dimensionless (H/C_ref)·(C_ref·f·x) of lattice.Scale, and on-site
// energies, which hopping does not scale, stay consistent. Times, the fit
// window and the average window are converted, the job is run, and the
// time-like outputs are converted back. Regimes keep their exponents; a
// prefactor A of y ≈ A·t^α becomes A·f^α for y ≈ A′·x^α with t = f·x.
func (j *Job) runUnits(ctx context.Context, log io.Writer) (*Response, error) {
	sc, err := j.Units.scale()
	if err != nil {
		return nil, err
	}
	f := engineFactor(sc.Unit)
	c := *j
	c.Units = nil
	c.Times = make([]float64, len(j.Times))
	for k, t := range j.Times {
		c.Times[k] = f * t
	}
	c.Fit.From, c.Fit.To = j.Fit.From*f, j.Fit.To*f
	if j.Window != nil {
		w := *j.Window
		w.To *= f
		c.Window = &w
	}
	resp, err := c.runWalk(ctx, log)
	if err != nil {
		return nil, err
	}
	resp.Times = append([]float64(nil), j.Times...)
	resp.DimensionlessTimes = make([]float64, len(j.Times))
	for k, t := range j.Times {
		resp.DimensionlessTimes[k] = sc.Time(t)
	}
	resp.TimeUnit = sc.Unit.TimeUnit()
	toPhysical(resp, f)
	return resp, nil
}

// engineFactor is f of runUnits: the engine's time per physical time unit
// for couplings in u.
func engineFactor(u lattice.Unit) float64 {
	switch u {
	case lattice.ElectronVolt:
		return 1 / lattice.HbarEVfs
	case lattice.MilliElectronVolt:
		return 1e-3 / lattice.HbarEVfs
	}
	return 1
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
