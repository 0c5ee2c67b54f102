package measure

import (
	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/observables"
)

// FitRegimes runs the regime analysis of observables.FitRegimes on the
// quantity q ("msd" or "spread") over the lengths z > 0, weighting by the
// propagated errors when every one of them is positive, and stores the
// result in r.Fit. The fit treats the propagation length as time.
func (r *Reduction) FitRegimes(q string, s observables.RegimeSettings) error {
	if q != "msd" && q != "spread" {
		return fault.Range("quantity", `"msd" or "spread"`, q)
	}
	v, e, err := r.Series(q)
	if err != nil {
		return err
	}
	var t, y, ye []float64
	weighted := e != nil
	for k, pt := range r.Points {
		if pt.Length <= 0 {
			continue
		}
		t = append(t, pt.Length)
		y = append(y, v[k])
		if e != nil {
			ye = append(ye, e[k])
			if !(e[k] > 0) {
				weighted = false
			}
		}
	}
	if !weighted {
		ye = nil
	}
	f, err := observables.FitRegimes(t, y, ye, s)
	if err != nil {
		return err
	}
	r.Fit, r.FitQuantity, r.FitWeighted = f, q, weighted
	return nil
}

// reportRegimes writes the regime analysis; nothing before FitRegimes ran.
func (r *Reduction) reportRegimes(p func(string, ...any), lu string) {
	f := r.Fit
	if f == nil {
		return
	}
	p("\nRegime analysis\n")
	w := "unweighted"
	if r.FitWeighted {
		w = "weighted by the propagated uncertainties"
	}
	q := map[string]string{"msd": "MSD", "spread": "spread"}[r.FitQuantity]
	p("The %s was fitted, as a function of propagation length, by continuous broken power laws in log–log coordinates (%s); ", q, w)
	p("the number of segments (%d of up to %d tried) was chosen by the %s, exponent errors are one standard error from the fit covariance and crossover intervals are 95%% intervals (%s", f.Segments, f.Tried, f.Criterion, f.Interval)
	if f.Replicates > 0 {
		p(", %d replicates", f.Replicates)
	}
	p(").\n")
	p("%12s %12s %10s %8s  %s\n", "from", "to", "exponent", "±", "regime")
	for _, g := range f.Regimes {
		p("%12.4g %12.4g %10.3f %8.3f  %s\n", g.From, g.To, g.Exponent, g.Error, g.Kind)
	}
	for _, c := range f.Crossovers {
		p("crossover at %.4g %s (95%% interval %.4g to %.4g %s)\n", c.Time, lu, c.Low, c.High, lu)
	}
	if f.Saturation != nil {
		p("saturation from %.4g %s at level %.4g\n", f.Saturation.Time, lu, f.Saturation.Level)
	}
}
