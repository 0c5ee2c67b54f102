package observables

import (
	"math"
	"sort"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Regime labels: each is a statement about the exponent α of a mean squared
// displacement growing as t^α. The thresholds are chosen here (common
// practice leaves them open) and apply to the fitted exponent, not to its
// interval:
//
//	α ≤ −0.1          decreasing
//	|α| < 0.1         saturated
//	0.1 ≤ α < 0.9     sub-diffusive
//	0.9 ≤ α ≤ 1.1     diffusive
//	1.1 < α < 1.8     super-diffusive
//	1.8 ≤ α ≤ 2.2     ballistic
//	α > 2.2           super-ballistic (a transient, e.g. injection at a corner)
//
// For other quantities (the spread, a measured intensity width) the labels
// keep the same thresholds; they then describe the exponent only.
const (
	KindDecreasing     = "decreasing"
	KindSaturated      = "saturated"
	KindSubDiffusive   = "sub-diffusive"
	KindDiffusive      = "diffusive"
	KindSuperDiffusive = "super-diffusive"
	KindBallistic      = "ballistic"
	KindSuperBallistic = "super-ballistic"
)

// Classify returns the label of an MSD exponent α (see the Kind constants).
func Classify(alpha float64) string {
	switch {
	case alpha <= -0.1:
		return KindDecreasing
	case alpha < 0.1:
		return KindSaturated
	case alpha < 0.9:
		return KindSubDiffusive
	case alpha <= 1.1:
		return KindDiffusive
	case alpha < 1.8:
		return KindSuperDiffusive
	case alpha <= 2.2:
		return KindBallistic
	default:
		return KindSuperBallistic
	}
}

// RegimeSettings configures FitRegimes. The zero value asks for the
// defaults given field by field.
type RegimeSettings struct {
	// MaxSegments is the largest number of power-law segments tried, 1…8;
	// 0 means 4. Fewer are tried when the window holds too few points for
	// MinPoints per segment (RegimeFit.Tried says how many).
	MaxSegments int
	// From and To bound the fit window in time, inclusive; 0 means the first
	// (last) time of the series.
	From, To float64
	// MinPoints is the least number of points per segment, ≥ 3; 0 means 4.
	MinPoints int
	// Replicates is the number of bootstrap replicates for the crossover
	// intervals; 0 means 200. A negative value skips the bootstrap and gives
	// Wald intervals from the fit covariance instead.
	Replicates int
	// Seed fixes the bootstrap's random stream (PCG(Seed, 0x5e9)).
	Seed uint64
	// Smooth is the half-width in points of the Savitzky–Golay window of the
	// local exponent (0 means 2: five points, placed adaptively as
	// LocalExponent describes) and Order its polynomial degree (0 means 2).
	Smooth, Order int
}

// Regime is one power-law segment y ≈ Prefactor · t^Exponent on [From, To].
type Regime struct {
	From, To float64
	Exponent float64
	Error    float64 // one standard error of Exponent
	// Prefactor is A of y ≈ A·t^Exponent. For extreme exponents far from
	// t = 1 it can leave the float64 range: it is then clamped to
	// math.MaxFloat64 (or underflows to 0), never Inf.
	Prefactor float64
	Kind      string
}

// Crossover is a breakpoint between consecutive regimes with its 95%
// interval [Low, High].
type Crossover struct {
	Time, Low, High float64
}

// Saturation describes a plateau at the end of the series: from Time on the
// smoothed local exponent stays below 0.1 in magnitude, and Level is the
// mean of the values there.
type Saturation struct {
	Time, Level float64
}

// RegimeFit is the result of FitRegimes.
type RegimeFit struct {
	// Times are the times inside the window, LocalExponent the smoothed
	// d ln y / d ln t at each of them.
	Times         []float64
	LocalExponent []float64
	// Regimes in time order and the Crossovers between them.
	Regimes    []Regime
	Crossovers []Crossover
	// Segments is the number of segments chosen, Tried the largest number
	// tried, Scores the criterion for 1…Tried segments, Criterion its name.
	Segments  int
	Tried     int
	Scores    []float64
	Criterion string
	// Interval says how the crossover intervals were obtained:
	// "bootstrap-residual", "bootstrap-parametric" or "wald" (empty when a
	// single segment leaves no crossover); Replicates is the number of
	// bootstrap fits used (0 without a bootstrap).
	Interval   string
	Replicates int
	// Residual is the (weighted) residual sum of squares of ln y of the
	// chosen fit and DoF its degrees of freedom (points − 2·Segments).
	Residual float64
	DoF      int
	// Saturation is non-nil when the series ends on a plateau.
	Saturation *Saturation
}

// noiseFloor is the relative noise floor f of a series given without
// errors: its residual variance in ln y is taken as at least f², so that
// exact or nearly exact curves (simulations, noiseless models) do not
// over-segment on round-off or on numerically tiny improvements of the fit.
// 10⁻³ is a relative accuracy far below any measured curve and above the
// accumulated rounding of a simulated one (chosen here, common practice
// for a tolerance floor).
const noiseFloor = 1e-3

// minRelErr is the smallest relative error σ_y/y taken from given errors
// (smaller ones are raised to it): it keeps the weights 1/σ² of the fit and
// their sums finite for any positive finite errors and values, and lies far
// below any measured precision (chosen here).
const minRelErr = 1e-12

// mergeMin is the least exponent difference that keeps two adjacent
// segments apart, whatever their errors (chosen here: half the smallest
// distance between the Kind thresholds).
const mergeMin = 0.05

// FitRegimes analyses a positive series y(t) as a sequence of power laws.
//
// Within the window [From, To] it computes the smoothed local exponent
// (LocalExponent) and fits ln y against ln t with continuous broken lines of
// 1…MaxSegments segments. The breakpoints of each are optimised by an
// exhaustive grid search followed by coordinate-wise golden-section
// refinement (in the spirit of segmented regression with unknown
// breakpoints, Muggeo, Stat. Med. 22, 3055 (2003), but with a grid instead of
// his linearisation, which is less sensitive to the start), and the number of
// segments is chosen by the Bayesian information criterion (Schwarz, Ann.
// Stat. 6, 461 (1978)) with 2·m parameters for m segments (m + 1 line
// coefficients and m − 1 breakpoints):
//
//	with errors:    BIC = χ² + 2m ln n,  χ² = Σ ((ln y − η)/σ)², σ = max(σ_y/y, 10⁻¹²)
//	without errors: BIC = n ln(RSS/n + f²) + 2m ln n,  f = 10⁻³
//
// where f is a relative noise floor (10⁻³ in y, i.e. on the ln y residual
// scale): a curve given without errors is never taken to be more precise
// than that, so an exact or nearly exact curve (a simulation) is not split
// for improvements of the fit that lie below the floor.
//
// Exponent errors come from the covariance of the full (line and
// breakpoint) least-squares problem at the optimum, s²(JᵀJ)⁻¹ with J the
// Jacobian; s² = 1 when errors are given (they are taken as absolute) and
// the residual variance max(RSS/(n − 2m), f²) otherwise.
//
// Adjacent segments of the same law are merged: after the BIC choice, while
// two neighbouring segments have exponents α₁, α₂ with
// |α₁ − α₂| < max(0.05, 2·√(σ₁² + σ₂²)) (σ the exponent errors), the pair
// with the smallest difference is merged and the fit with one segment fewer
// is taken (the better of the BIC search's fit and the current breakpoints
// without the merged one, refined). A pure power law therefore gives one
// regime and no crossover. Together, BIC with the floor and this merge rule
// are the criterion for the number of regimes (RegimeFit.Criterion reads
// "BIC+merge").
//
// Crossover intervals are 95% percentile bootstrap intervals (Efron &
// Tibshirani, An Introduction to the Bootstrap (1993), ch. 13) with the
// number of segments held fixed: a parametric bootstrap (Gaussian noise with
// the given σ added to the fitted curve in ln y) when errors are given, a
// residual bootstrap (fitted curve plus residuals resampled with
// replacement, inflated by √(n/(n − 2m))) otherwise. Each replicate refines
// the breakpoints from the original fit. The random stream is
// PCG(Seed, 0x5e9), so a given seed gives the same result every time. With
// Replicates < 0 the intervals are Wald intervals ψ ± 1.96 σ_ψ in ln t.
// An interval never collapses onto its estimate: when the bootstrap (or
// Wald) interval ends at the crossover time on one side, as it does for a
// curve with almost no residual, that end is widened to the neighbouring
// sample time, so the interval then states the resolution of the time grid
// (Low < Time < High always).
//
// Validation: times positive, finite and strictly increasing; values
// positive and finite; errors (nil, empty, or one per value) positive and finite;
// MaxSegments in [0, 8]; at least MinPoints points in the window. Failures
// return an *InputError naming "times", "values", "errors", "fit.segments",
// "fit.from", "fit.to", "fit.min_points" or "fit.replicates" and the first
// offending index. The result never holds NaN.
func FitRegimes(times, values, errors []float64, s RegimeSettings) (*RegimeFit, error) {
	if err := checkSeries(times, values, errors); err != nil {
		return nil, err
	}
	if len(errors) == 0 {
		errors = nil // an empty slice means no errors, like nil
	}
	if s.MaxSegments < 0 || s.MaxSegments > 8 {
		return nil, fault.Range("fit.segments", "between 1 and 8 (0 means 4)", s.MaxSegments)
	}
	if s.MaxSegments == 0 {
		s.MaxSegments = 4
	}
	if s.MinPoints != 0 && s.MinPoints < 3 {
		return nil, fault.Range("fit.min_points", "at least 3 (0 means 4)", s.MinPoints)
	}
	if s.MinPoints == 0 {
		s.MinPoints = 4
	}
	if !finite(s.From) || s.From < 0 {
		return nil, fault.Range("fit.from", "a non-negative finite time (0 means the first time)", s.From)
	}
	if !finite(s.To) || s.To < 0 {
		return nil, fault.Range("fit.to", "a non-negative finite time (0 means the last time)", s.To)
	}
	if s.To != 0 && s.To < s.From {
		return nil, fault.New("fit.to", "must be at least fit.from = %v; got %v", s.From, s.To)
	}
	if s.Replicates > 100000 {
		return nil, fault.Range("fit.replicates", "at most 100000", s.Replicates)
	}
	if s.Replicates == 0 {
		s.Replicates = 200
	}
	if s.Smooth < 0 {
		return nil, fault.Range("fit.smooth", "a non-negative number of points", s.Smooth)
	}
	if s.Order < 0 || s.Order > 6 {
		return nil, fault.Range("fit.order", "between 0 (default 2) and 6", s.Order)
	}

	// The window.
	lo := sort.Search(len(times), func(i int) bool { return times[i] >= s.From })
	hi := len(times)
	if s.To != 0 {
		hi = sort.Search(len(times), func(i int) bool { return times[i] > s.To })
	}
	n := hi - lo
	if n < s.MinPoints {
		from, to := s.From, s.To
		if from == 0 {
			from = times[0]
		}
		if to == 0 {
			to = times[len(times)-1]
		}
		return nil, fault.New("times", "in the window [%v, %v] must number at least %d (fit.min_points); got %d",
			from, to, s.MinPoints, n)
	}
	t := times[lo:hi]
	v := values[lo:hi]
	x := make([]float64, n)
	y := make([]float64, n)
	for i := range n {
		x[i] = math.Log(t[i])
		y[i] = math.Log(v[i])
	}
	var sw []float64
	if errors != nil {
		sw = make([]float64, n)
		for i := range n {
			// 1/σ of ln y, σ = σ_y/y at least minRelErr so that the
			// weights and their squares stay finite.
			sw[i] = 1 / math.Max(errors[lo+i]/v[i], minRelErr)
		}
	}

	res := &RegimeFit{Times: append([]float64(nil), t...), Criterion: "BIC+merge"}
	res.LocalExponent = make([]float64, n)
	localExponent(res.LocalExponent, t, v, s.Smooth, s.Order)

	bl := newBrokenLine(x, sw, s.MinPoints, s.MaxSegments-1)
	maxK := min(s.MaxSegments-1, bl.maxBreaks())
	res.Tried = maxK + 1
	var bestPsi []float64
	bestScore := math.Inf(1)
	ln := math.Log(float64(n))
	bl.setY(y)
	var searched [][]float64 // the BIC search's breakpoints for k = 0…
	for k := 0; k <= maxK; k++ {
		psi, ok := bl.search(k)
		if !ok {
			res.Tried = k
			break
		}
		searched = append(searched, psi)
		rss := bl.fit(psi, y)
		m := k + 1
		var score float64
		if sw != nil {
			score = rss + float64(2*m)*ln
		} else {
			score = float64(n)*math.Log(rss/float64(n)+noiseFloor*noiseFloor) + float64(2*m)*ln
		}
		res.Scores = append(res.Scores, score)
		if score < bestScore {
			bestScore, bestPsi = score, psi
		}
	}
	bestPsi = append([]float64(nil), bestPsi...)

	// Merge adjacent segments of the same law (see the doc comment).
	var beta, cov, psiSE, slopes, slopeSE []float64
	var bestRSS float64
	for {
		k := len(bestPsi)
		bestRSS = bl.fit(bestPsi, y)
		beta = append(beta[:0], bl.beta[:k+2]...)
		s2 := 1.0
		if sw == nil {
			s2 = 0
			if dof := n - 2*(k+1); dof > 0 {
				s2 = math.Max(bestRSS/float64(dof), noiseFloor*noiseFloor)
			}
		}
		cov, psiSE = segmentCovariance(x, sw, bestPsi, beta, s2)
		slopes, slopeSE = segmentSlopes(beta, cov, k)
		j := mergeCandidate(slopes, slopeSE)
		if j < 0 {
			break
		}
		// Drop breakpoint j and refine the rest; keep the better of that
		// and the search's fit with one segment fewer.
		drop := append(append([]float64(nil), bestPsi[:j]...), bestPsi[j+1:]...)
		bl.setY(y)
		bl.refine(drop)
		if alt := searched[k-1]; bl.fit(alt, y) < bl.fit(drop, y) {
			drop = append(drop[:0], alt...)
		}
		bestPsi = drop
	}
	k := len(bestPsi)
	m := k + 1
	res.Segments = m
	res.Residual = bestRSS
	res.DoF = n - 2*m

	// Regimes.
	bounds := make([]float64, 0, k+2)
	bounds = append(bounds, x[0])
	bounds = append(bounds, bestPsi...)
	bounds = append(bounds, x[n-1])
	for seg := range m {
		slope := slopes[seg]
		// Intercept: η at the segment start minus slope·x.
		x0 := bounds[seg]
		eta := beta[0] + beta[1]*x0
		for j := range k {
			if x0 > bestPsi[j] {
				eta += beta[j+2] * (x0 - bestPsi[j])
			}
		}
		res.Regimes = append(res.Regimes, Regime{
			From:      math.Exp(bounds[seg]),
			To:        math.Exp(bounds[seg+1]),
			Exponent:  slope,
			Error:     slopeSE[seg],
			Prefactor: math.Min(math.Exp(eta-slope*x0), math.MaxFloat64),
			Kind:      Classify(slope),
		})
	}
	// Exact endpoints of the window, not exp(log(t)).
	res.Regimes[0].From = t[0]
	res.Regimes[m-1].To = t[n-1]

	// Crossover intervals.
	res.Crossovers = make([]Crossover, k)
	for j, p := range bestPsi {
		res.Crossovers[j].Time = math.Exp(p)
	}
	if k > 0 {
		if s.Replicates > 0 {
			res.Replicates = s.Replicates
			res.Interval = bootstrapIntervals(bl, y, sw, bestPsi, res.Crossovers, s, res.DoF)
		} else {
			res.Interval = "wald"
			for j, p := range bestPsi {
				lo, hi := bl.bracket(bestPsi, j)
				se := psiSE[j]
				l, h := lo, hi
				if se > 0 && finite(se) {
					l, h = math.Max(p-1.96*se, lo), math.Min(p+1.96*se, hi)
				}
				res.Crossovers[j].Low, res.Crossovers[j].High = math.Exp(l), math.Exp(h)
			}
		}
	}
	widenCollapsed(res.Crossovers, t)
	res.Saturation = saturation(t, v, res.LocalExponent)
	return res, nil
}

// segmentSlopes returns the exponent b₁ + c₁ + … + c_s of each of the k+1
// segments and its standard error from the line covariance cov.
func segmentSlopes(beta, cov []float64, k int) (slopes, se []float64) {
	p := len(beta)
	slope := beta[1]
	for seg := range k + 1 {
		if seg > 0 {
			slope += beta[seg+1]
		}
		// Variance of b₁ + c₁ + … + c_seg.
		var vs float64
		for i := 1; i <= seg+1; i++ {
			for j := 1; j <= seg+1; j++ {
				vs += cov[i*p+j]
			}
		}
		slopes = append(slopes, slope)
		se = append(se, math.Sqrt(math.Max(vs, 0)))
	}
	return slopes, se
}

// mergeCandidate returns the breakpoint between the adjacent segments with
// the smallest exponent difference below max(mergeMin, 2·√(σ₁² + σ₂²)), or
// −1 when every pair is distinct.
func mergeCandidate(slopes, se []float64) int {
	best, bestD := -1, math.Inf(1)
	for j := 0; j+1 < len(slopes); j++ {
		d := math.Abs(slopes[j+1] - slopes[j])
		thr := math.Max(mergeMin, 2*math.Hypot(se[j], se[j+1]))
		if d < thr && d < bestD {
			best, bestD = j, d
		}
	}
	return best
}

// widenCollapsed widens an interval end that coincides with its crossover
// time to the neighbouring sample time on that side (the grid resolution).
func widenCollapsed(cr []Crossover, t []float64) {
	for j := range cr {
		c := &cr[j]
		if c.Low >= c.Time {
			i := sort.SearchFloat64s(t, c.Time) // first t[i] ≥ Time
			c.Low = t[max(i-1, 0)]
		}
		if c.High <= c.Time {
			i := sort.Search(len(t), func(i int) bool { return t[i] > c.Time })
			c.High = t[min(i, len(t)-1)]
		}
	}
}

// saturation finds the trailing run of points whose local exponent stays
// below 0.1 in magnitude; it needs at least three such points.
func saturation(t, v, le []float64) *Saturation {
	n := len(t)
	i := n
	for i > 0 && math.Abs(le[i-1]) < 0.1 {
		i--
	}
	if n-i < 3 {
		return nil
	}
	var s float64
	for _, x := range v[i:] {
		s += x
	}
	return &Saturation{Time: t[i], Level: s / float64(n-i)}
}
