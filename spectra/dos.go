package spectra

import (
	"math"
	"sort"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// DOS is a density of states per site on a grid of bins: Energy holds the
// bin centres, Density the density per site and per unit energy, so that
// Σ_b Density[b]·Width = 1 over the bins (the job format's "dos" object).
type DOS struct {
	Energy  []float64
	Density []float64
	// Width is the common bin width.
	Width float64
	// Error is the standard error of Density in each bin over the random
	// vectors of a stochastic trace (KPM with two or more vectors); nil for
	// exact densities.
	Error []float64
	// Nominal is the expected relative error 1/√(R·N) of a stochastic trace
	// with R vectors on N sites (Weiße et al. 2006); 0 when exact.
	Nominal float64
	// Moments and Vectors used by KPM; 0 for exact densities.
	Moments, Vectors int
	// Lo and Hi are the spectral bounds used by KPM; for histograms, the
	// grid's outer edges.
	Lo, Hi float64
}

// Shape is the line shape of a broadened density of states.
type Shape int

const (
	// Lorentzian is (w/π)/((E−E_n)² + w²), w the half width at half maximum.
	Lorentzian Shape = iota
	// Gaussian is exp(−(E−E_n)²/(2w²))/(w√(2π)), w the standard deviation.
	Gaussian
)

// checkBins validates a bin count for the field "dos.bins".
func checkBins(bins int) error {
	if bins < 1 || bins > 1<<20 {
		return fault.Range("dos.bins", "between 1 and 1048576", bins)
	}
	return nil
}

func checkValues(values []float64) error {
	if len(values) == 0 {
		return fault.New("eigenvalues", "must hold at least one value; got none")
	}
	for i, v := range values {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fault.New("eigenvalues", "must be finite; value %d is %v", i, v)
		}
	}
	return nil
}

// minMax returns the smallest and largest of values.
func minMax(values []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range values {
		lo = math.Min(lo, v)
		hi = math.Max(hi, v)
	}
	return lo, hi
}

// grid returns bins centres spanning [lo, hi]. A zero-width range is widened
// to [lo − ½, hi + ½] so that a single level still has a bin of finite width.
func grid(bins int, lo, hi float64) (centres []float64, width, a float64) {
	if hi <= lo {
		lo, hi = lo-0.5, hi+0.5
	}
	width = (hi - lo) / float64(bins)
	centres = make([]float64, bins)
	for b := range centres {
		centres[b] = lo + (float64(b)+0.5)*width
	}
	return centres, width, lo
}

// Histogram returns the exact density of states of the levels values on
// bins equal bins spanning [min, max] of the values. Each level adds
// 1/(n·Width) to its bin (the last bin is closed on the right), so the
// density integrates to exactly 1.
func Histogram(values []float64, bins int) (DOS, error) {
	if err := checkBins(bins); err != nil {
		return DOS{}, err
	}
	if err := checkValues(values); err != nil {
		return DOS{}, err
	}
	lo, hi := minMax(values)
	e, w, a := grid(bins, lo, hi)
	d := make([]float64, bins)
	inc := 1 / (float64(len(values)) * w)
	for _, v := range values {
		b := int((v - a) / w)
		b = min(max(b, 0), bins-1)
		d[b] += inc
	}
	return DOS{Energy: e, Density: d, Width: w, Lo: a, Hi: a + w*float64(bins)}, nil
}

// WeightedHistogram is Histogram with level k carrying weight weights[k]
// (non-negative, not all zero) instead of 1: the density integrates to 1
// over the bins. With the eigenvector weights |ψ_k(i)|² of one site it is
// the exact local density of states at that site (see LocalHistogram).
// Errors name "dos.bins", "eigenvalues" and "weights".
func WeightedHistogram(values, weights []float64, bins int) (DOS, error) {
	if err := checkBins(bins); err != nil {
		return DOS{}, err
	}
	if err := checkValues(values); err != nil {
		return DOS{}, err
	}
	if len(weights) != len(values) {
		return DOS{}, fault.New("weights", "must have one value per level (%d); got %d", len(values), len(weights))
	}
	var total float64
	for k, w := range weights {
		if !(w >= 0) || math.IsInf(w, 0) {
			return DOS{}, fault.New("weights", "must be non-negative and finite; weight %d is %v", k, w)
		}
		total += w
	}
	if !(total > 0) {
		return DOS{}, fault.New("weights", "must not all be zero")
	}
	lo, hi := minMax(values)
	e, w, a := grid(bins, lo, hi)
	d := make([]float64, bins)
	for k, v := range values {
		b := min(max(int((v-a)/w), 0), bins-1)
		d[b] += weights[k] / (total * w)
	}
	return DOS{Energy: e, Density: d, Width: w, Lo: a, Hi: a + w*float64(bins)}, nil
}

// LocalHistogram returns the exact local density of states
// ρ_i(E) = Σ_n |ψ_n(i)|² δ(E − E_n) at site i of the eigensystem e, binned
// like Histogram (over the whole spectrum's range). Errors name "dos.site"
// and "dos.bins".
func LocalHistogram(e *Eigen, site, bins int) (DOS, error) {
	if site < 0 || site >= e.N {
		return DOS{}, fault.Range("dos.site", "between 0 and "+itoa(e.N-1), site)
	}
	w := make([]float64, e.N)
	for k := range w {
		w[k] = e.Weight(site, k)
	}
	return WeightedHistogram(e.Values, w, bins)
}

// Broadened returns the density of states of the levels values, each
// replaced by a line of the given shape and width, sampled at bins centres
// spanning [min − 5w, max + 5w]. The samples are rescaled so that the
// density integrates to 1 over the bins (the tails beyond the grid, and the
// sampling error, are redistributed; the correction is small when width
// spans several bins). Cost O(bins·n).
func Broadened(values []float64, bins int, width float64, shape Shape) (DOS, error) {
	if err := checkBins(bins); err != nil {
		return DOS{}, err
	}
	if err := checkValues(values); err != nil {
		return DOS{}, err
	}
	if !(width > 0) || math.IsInf(width, 0) {
		return DOS{}, fault.Range("dos.width", "a positive finite number", width)
	}
	if shape != Lorentzian && shape != Gaussian {
		return DOS{}, fault.Range("dos.shape", "Lorentzian or Gaussian", int(shape))
	}
	lo, hi := minMax(values)
	e, w, a := grid(bins, lo-5*width, hi+5*width)
	d := make([]float64, bins)
	for b, x := range e {
		var s float64
		for _, v := range values {
			t := x - v
			if shape == Lorentzian {
				s += width / math.Pi / (t*t + width*width)
			} else {
				s += math.Exp(-t*t/(2*width*width)) / (width * math.Sqrt(2*math.Pi))
			}
		}
		d[b] = s
	}
	normalise(d, w)
	return DOS{Energy: e, Density: d, Width: w, Lo: a, Hi: a + w*float64(bins)}, nil
}

// normalise scales d so that Σ d·w = 1 (when the sum is positive).
func normalise(d []float64, w float64) {
	var s float64
	for _, v := range d {
		s += v
	}
	if s > 0 {
		f := 1 / (s * w)
		for i := range d {
			d[i] *= f
		}
	}
}

// Integrated returns the integrated density of states of d at the right
// edge of each bin: N[b] = Σ_{b' ≤ b} Density[b']·Width, rising to 1.
func (d DOS) Integrated() []float64 {
	n := make([]float64, len(d.Density))
	var s float64
	for b, v := range d.Density {
		s += v * d.Width
		n[b] = s
	}
	return n
}

// Counting returns the exact integrated density of states of the levels
// values at each energy of at: the fraction of levels ≤ at[k]. values need
// not be sorted; with no values every fraction is 0.
func Counting(values, at []float64) []float64 {
	v := append([]float64(nil), values...)
	sort.Float64s(v)
	out := make([]float64, len(at))
	if len(v) == 0 {
		return out
	}
	for k, e := range at {
		out[k] = float64(sort.Search(len(v), func(i int) bool { return v[i] > e })) / float64(len(v))
	}
	return out
}
