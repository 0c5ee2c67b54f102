package plan

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// exponentError is the standard error of the slope of a straight-line fit
// to n points at the centres of n equal cells of a log-width L, each with
// relative scatter s: s·√(12n / (L²(n² − 1))) (ordinary least squares,
// common practice). It is +Inf for n < 2.
func exponentError(s, L float64, n int) float64 {
	if n < 2 || L <= 0 {
		return math.Inf(1)
	}
	fn := float64(n)
	return s * math.Sqrt(12*fn/(L*L*(fn*fn-1)))
}

// allocate distributes r.Samples over the regimes of pl.Fit.
func (pl *Plan) allocate(r Request) error {
	regs := pl.Fit.Regimes
	if len(regs) == 0 {
		return &fault.Error{Kind: fault.Numerical, Field: "fit", Msg: "the regime analysis found no regime in the predicted MSD"}
	}
	if r.Samples < 3*len(regs) {
		return fault.New("samples", "must be at least 3 per predicted regime (%d regimes: at least %d); got %d", len(regs), 3*len(regs), r.Samples)
	}
	pl.Regimes = make([]RegimePlan, len(regs))
	width := make([]float64, len(regs))
	for i, g := range regs {
		var s2 float64
		var m int
		for k, z := range pl.Grid {
			if z >= g.From && z <= g.To && pl.MSD[k] > 0 {
				q := pl.MSDSpread[k] / pl.MSD[k]
				s2 += q * q
				m++
			}
		}
		if m > 0 {
			s2 /= float64(m)
		}
		s := math.Sqrt(s2 + r.Noise*r.Noise)
		width[i] = math.Log(g.To / g.From)
		pl.Regimes[i] = RegimePlan{From: g.From, To: g.To, Exponent: g.Exponent, Kind: g.Kind, Scatter: s, Samples: 3}
		// Samples needed for the target precision.
		need := 3
		for need < 10000 && exponentError(s, width[i], need) > r.Precision {
			need++
		}
		pl.Needed += need
	}
	// Greedy: one sample at a time to the regime with the largest predicted
	// error; ties (e.g. no scatter at all) to the regime with the fewest
	// samples per unit log-width, then the earliest.
	for left := r.Samples - 3*len(regs); left > 0; left-- {
		best := 0
		for i := range pl.Regimes {
			ei := exponentError(pl.Regimes[i].Scatter, width[i], pl.Regimes[i].Samples)
			eb := exponentError(pl.Regimes[best].Scatter, width[best], pl.Regimes[best].Samples)
			switch {
			case ei > eb:
				best = i
			case ei == eb && float64(pl.Regimes[i].Samples)/width[i] < float64(pl.Regimes[best].Samples)/width[best]:
				best = i
			}
		}
		pl.Regimes[best].Samples++
	}
	for i := range pl.Regimes {
		g := &pl.Regimes[i]
		g.PredictedError = exponentError(g.Scatter, width[i], g.Samples)
		g.Meets = g.PredictedError <= r.Precision
		for c := 0; c < g.Samples; c++ {
			z := g.From * math.Exp(width[i]*(float64(c)+0.5)/float64(g.Samples))
			m, sp := pl.interpolate(z)
			pl.Samples = append(pl.Samples, Sample{Length: z, Regime: i, Kind: g.Kind, MSD: m, MSDSpread: sp})
		}
	}
	sort.SliceStable(pl.Samples, func(a, b int) bool { return pl.Samples[a].Length < pl.Samples[b].Length })
	pl.Rationale = pl.rationale(r)
	return nil
}

// interpolate returns MSD and spread at z, linear in ln z between grid
// points (log-log for positive values).
func (pl *Plan) interpolate(z float64) (float64, float64) {
	g := pl.Grid
	k := sort.SearchFloat64s(g, z)
	if k <= 0 {
		return pl.MSD[0], pl.MSDSpread[0]
	}
	if k >= len(g) {
		return pl.MSD[len(g)-1], pl.MSDSpread[len(g)-1]
	}
	u := math.Log(z/g[k-1]) / math.Log(g[k]/g[k-1])
	lerp := func(a, b float64) float64 {
		if a > 0 && b > 0 {
			return math.Exp(math.Log(a) + u*(math.Log(b)-math.Log(a)))
		}
		return a + u*(b-a)
	}
	return lerp(pl.MSD[k-1], pl.MSD[k]), lerp(pl.MSDSpread[k-1], pl.MSDSpread[k])
}

func (pl *Plan) rationale(r Request) string {
	var b strings.Builder
	fmt.Fprintf(&b, "The predicted MSD (mean of %d fabrication realisation(s), jitter %g, detuning %g) between lengths %.4g and %.4g shows %d regime(s): ",
		pl.Realisations, r.Fabrication.Jitter, r.Fabrication.Detuning, pl.Grid[0], pl.Grid[len(pl.Grid)-1], len(pl.Regimes))
	for i, g := range pl.Regimes {
		if i > 0 {
			b.WriteString("; ")
		}
		fmt.Fprintf(&b, "%s (exponent %.2f) from %.4g to %.4g", g.Kind, g.Exponent, g.From, g.To)
	}
	fmt.Fprintf(&b, ". Each sample is one fabricated device, so its MSD scatters by the fabrication spread")
	if r.Noise > 0 {
		fmt.Fprintf(&b, " combined with the stated %.3g relative measurement error", r.Noise)
	}
	fmt.Fprintf(&b, ". Samples are spaced evenly in ln(length) inside each regime, away from the crossovers, and allotted so that the largest predicted exponent error is as small as possible. ")
	if pl.Needed <= r.Samples {
		fmt.Fprintf(&b, "%d samples would reach the target standard error %.3g in every regime; all %d are used.", pl.Needed, r.Precision, r.Samples)
	} else {
		fmt.Fprintf(&b, "Reaching the target standard error %.3g in every regime would take %d samples; with %d, the regimes marked as not meeting it will be fitted less precisely.", r.Precision, pl.Needed, r.Samples)
	}
	b.WriteString(" The precision is a planning estimate from a straight-line fit per regime; the predicted couplings and lengths must be calibrated against measurements on the real device.")
	return b.String()
}
