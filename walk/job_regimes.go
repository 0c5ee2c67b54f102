package walk

import (
	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/observables"
)

// fitPoints returns the points of a curve usable by the regime analysis:
// t > 0 and y > 0 (the t = 0 point of an MSD is 0 and carries no exponent).
func fitPoints(times, y, yerr []float64) (t, v, e []float64) {
	for k := range times {
		if times[k] > 0 && y[k] > 0 {
			t = append(t, times[k])
			v = append(v, y[k])
			if yerr != nil {
				e = append(e, yerr[k])
			}
		}
	}
	return t, v, e
}

// enoughPoints refuses a fit with fewer than 4 usable points (the least
// FitRegimes takes for one segment): field "times" when fewer than 4 times
// t > 0 were asked for, "report" when the fitted quantity vanishes at some
// of them (nothing moves), and "fit" (or "times") when the fit window holds
// fewer than 4 of the usable points.
func (j *Job) enoughPoints(t []float64) error {
	if len(t) < 4 {
		pos := 0
		for _, x := range j.Times {
			if x > 0 {
				pos++
			}
		}
		if pos < 4 {
			return fault.New("times", "must hold at least 4 times t > 0 for the \"regimes\" report; got %d", pos)
		}
		return fault.New("report", "\"regimes\" needs the fitted quantity positive at 4 or more reported times t > 0; got %d such times", len(t))
	}
	return j.checkFitWindow(t)
}

func (j *Job) regimeSettings(replicates int) observables.RegimeSettings {
	return observables.RegimeSettings{MaxSegments: j.Fit.Segments, From: j.Fit.From, To: j.Fit.To,
		Replicates: replicates}
}

// fitError renames the fields of observables' errors for the job format.
func fitError(err error, series bool) error {
	fe, ok := err.(*fault.Error)
	if !ok {
		return &fault.Error{Kind: fault.Numerical, Field: "fit", Msg: err.Error()}
	}
	c := *fe
	switch {
	case series && (c.Field == "times" || c.Field == "values" || c.Field == "errors"):
		c.Field = "series." + c.Field
	case !series && c.Field == "times":
		// The fit window (checked first by enoughPoints): a user input.
		c.Kind, c.Field = fault.Invalid, "fit"
		c.Msg = "(its usable times t > 0) " + c.Msg
	case !series && (c.Field == "values" || c.Field == "errors"):
		c.Kind, c.Field = fault.Numerical, "fit"
	case c.Field == "fit.min_points":
		c.Field = "fit"
		c.Msg = "the fit window needs at least 4 points per segment; " + c.Msg
	}
	return &c
}

// setRegimes copies a fit into the response.
func setRegimes(resp *Response, regs []observables.Regime, cross []observables.Crossover) {
	resp.Regimes = make([]Regime, len(regs))
	for i, r := range regs {
		resp.Regimes[i] = Regime{From: r.From, To: r.To, Exponent: r.Exponent, Error: r.Error, Kind: r.Kind, Prefactor: r.Prefactor}
	}
	resp.Crossovers = make([]Crossover, len(cross))
	for i, c := range cross {
		resp.Crossovers[i] = Crossover{Time: c.Time, Low: c.Low, High: c.High}
	}
}

// regimes runs the regime analysis of one curve (a series job, or a walk
// job with a single realisation): observables.FitRegimes with the job's fit
// window and segments, bootstrap crossover intervals (fixed seed).
func (j *Job) regimes(resp *Response, times, y, yerr []float64) error {
	series := j.Series != nil
	t, v, e := fitPoints(times, y, yerr)
	if series {
		t, v, e = times, y, yerr
	} else if err := j.enoughPoints(t); err != nil {
		return err
	}
	fit, err := observables.FitRegimes(t, v, e, j.regimeSettings(0))
	if err != nil {
		return fitError(err, series)
	}
	setRegimes(resp, fit.Regimes, fit.Crossovers)
	resp.LocalExponent, resp.FitTimes = fit.LocalExponent, fit.Times
	return nil
}

// ensembleRegimes fits each realisation's curve and averages the fits
// (observables.AverageRegimes: exponents' errors and crossover intervals
// from the spread over realisations); the local exponent is the mean of the
// realisations' local exponents with its standard error.
func (j *Job) ensembleRegimes(resp *Response, curves [][]float64) error {
	fits := make([]*observables.RegimeFit, len(curves))
	var les [][]float64
	for r, c := range curves {
		t, v, _ := fitPoints(j.Times, c, nil)
		if err := j.enoughPoints(t); err != nil {
			return err
		}
		fit, err := observables.FitRegimes(t, v, nil, j.regimeSettings(-1))
		if err != nil {
			return fitError(err, false)
		}
		fits[r] = fit
		if les != nil && len(fit.LocalExponent) != len(les[0]) {
			return &fault.Error{Kind: fault.Numerical, Field: "fit",
				Msg: "the realisations' curves are positive at different times; fit from a later time (fit.from)"}
		}
		les = append(les, fit.LocalExponent)
		resp.FitTimes = fit.Times
	}
	avg, err := observables.AverageRegimes(fits)
	if err != nil {
		return fitError(err, false)
	}
	setRegimes(resp, avg.Regimes, avg.Crossovers)
	resp.LocalExponent, resp.LocalExponentErr = MeanErr(les)
	return nil
}
