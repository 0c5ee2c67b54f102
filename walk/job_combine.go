package walk

import (
	"context"
	"errors"

	"github.com/ampwalk/ampwalk/internal/fault"
)

func isCancel(err error) bool {
	var fe *fault.Error
	return errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) ||
		(errors.As(err, &fe) && fe.Kind == fault.Cancelled)
}

// combine fills resp from the realisations' traces: means, and with more
// than one realisation the standard errors (X_err), in realisation order.
func (j *Job) combine(resp *Response, trs []*trace) error {
	multi := len(trs) > 1
	pick := func(f func(*trace) []float64) (mean, se []float64) {
		if f(trs[0]) == nil {
			return nil, nil
		}
		s := make([][]float64, len(trs))
		for r, tr := range trs {
			s[r] = f(tr)
		}
		mean, se = MeanErr(s)
		if !multi {
			se = nil
		}
		return mean, se
	}
	msd, msdErr := pick(func(t *trace) []float64 { return t.msd })
	ret, retErr := pick(func(t *trace) []float64 { return t.ret })
	spread, spreadErr := pick(func(t *trace) []float64 { return t.spread })
	if j.reports("msd") {
		resp.MSD, resp.MSDErr = msd, msdErr
	}
	if j.reports("return") {
		resp.Return, resp.ReturnErr = ret, retErr
	}
	if j.reports("spread") {
		resp.Spread, resp.SpreadErr = spread, spreadErr
	}
	resp.IPR, resp.IPRErr = pick(func(t *trace) []float64 { return t.ipr })
	resp.Entropy, resp.EntropyErr = pick(func(t *trace) []float64 { return t.entropy })
	resp.Participation, resp.ParticipationErr = pick(func(t *trace) []float64 { return t.part })
	if trs[0].pops != nil {
		resp.Populations = make([][]float64, len(j.Times))
		if multi {
			resp.PopulationsErr = make([][]float64, len(j.Times))
		}
		for k := range j.Times {
			m, e := pick(func(t *trace) []float64 { return t.pops[k] })
			resp.Populations[k] = m
			if multi {
				resp.PopulationsErr[k] = e
			}
		}
	}
	if trs[0].corr != nil {
		n := *resp.Sites
		resp.Correlations = make([][][]float64, len(j.Times))
		if multi {
			resp.CorrelationsErr = make([][][]float64, len(j.Times))
		}
		for k := range j.Times {
			m, e := pick(func(t *trace) []float64 { return t.corr[k] })
			resp.Correlations[k] = square(m, n)
			if multi {
				resp.CorrelationsErr[k] = square(e, n)
			}
		}
	}
	if j.reports("polya") {
		m, e := pick(func(t *trace) []float64 { return []float64{t.polya} })
		resp.Polya = &m[0]
		if multi {
			resp.PolyaErr = &e[0]
		}
	}
	if trs[0].avg != nil {
		a0 := trs[0].avg
		m, e := pick(func(t *trace) []float64 { return []float64{t.avg.Return} })
		resp.Average = &Average{Return: m[0], Window: a0.Window, Samples: a0.Samples}
		if multi {
			resp.AverageErr = &Average{Return: e[0]}
		}
		if a0.Populations != nil {
			pm, pe := pick(func(t *trace) []float64 { return t.avg.Populations })
			resp.Average.Populations = pm
			if multi {
				resp.AverageErr.Populations = pe
			}
		}
	}
	if j.reports("regimes") {
		curve := func(t *trace) []float64 { return t.msd }
		if j.Fit.Quantity == "spread" {
			curve = func(t *trace) []float64 { return t.spread }
		}
		if multi {
			curves := make([][]float64, len(trs))
			for r, tr := range trs {
				curves[r] = curve(tr)
			}
			if err := j.ensembleRegimes(resp, curves); err != nil {
				return err
			}
		} else if err := j.regimes(resp, j.Times, curve(trs[0]), nil); err != nil {
			return err
		}
	}
	d := &JobDiagnostics{Method: trs[0].diag.Method, Reason: trs[0].diag.Reason}
	for _, tr := range trs {
		d.Products += tr.diag.Products
		d.NormDrift = max(d.NormDrift, tr.diag.NormDrift)
		d.ErrorBound = max(d.ErrorBound, tr.diag.ErrorBound)
		if tr.diag.Method != d.Method {
			d.Method = "mixed"
		}
	}
	resp.Diagnostics = d
	return nil
}

// square reshapes an n·n row-major slice into rows.
func square(v []float64, n int) [][]float64 {
	out := make([][]float64, n)
	for q := range out {
		out[q] = v[q*n : (q+1)*n]
	}
	return out
}
