package spectra

import (
	"math"
	"sort"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Estimate is a fitted exponent with its standard error and the range used.
type Estimate struct {
	Value, Error float64
	// Points is the number of data points fitted; From and To delimit the
	// abscissa range (energies above the band edge, or times).
	Points   int
	From, To float64
}

// SpectralDimensionLevels estimates the spectral dimension d_s from the
// integrated density of states near the lower band edge,
// N(E) ∝ (E − E_min)^{d_s/2} (Alexander & Orbach, J. Physique Lett. 43,
// L625 (1982), from memory). Give the Laplacian eigenvalues (the decay rates
// of the classical walk; LaplacianEigenvalues), or any spectrum whose lower
// edge is of that form. Each distinct level λ above E_min contributes the
// point (λ − E_min, N(λ)), N the fraction of levels ≤ λ, for N up to
// fraction (0 means 0.1), N taken at the middle of each step of the
// staircase (degenerate levels form one step); the fit is least squares in
// log–log and d_s is twice the slope.
// Hierarchical spectra (fractals) give log-periodic steps around the power
// law: use a wide window. Errors name "eigenvalues" and "fraction".
func SpectralDimensionLevels(values []float64, fraction float64) (Estimate, error) {
	if err := checkValues(values); err != nil {
		return Estimate{}, err
	}
	if fraction == 0 {
		fraction = 0.1
	}
	if !(fraction > 0 && fraction <= 1) {
		return Estimate{}, fault.Range("fraction", "in (0, 1]", fraction)
	}
	v := append([]float64(nil), values...)
	sort.Float64s(v)
	n := len(v)
	e0 := v[0]
	tol := 1e-9 * math.Max(1, v[n-1]-v[0])
	var xs, ys []float64
	first := 0 // the first level of the current degenerate step
	for i := 0; i < n; i++ {
		if i > 0 && v[i]-v[i-1] > tol {
			first = i
		}
		if v[i]-e0 <= tol {
			continue
		}
		if i+1 < n && v[i+1]-v[i] <= tol {
			continue // not yet the top of this degenerate step
		}
		// The staircase at the middle of its step: the continuum law passes
		// there, not at the top (common practice).
		c := (float64(first) + float64(i+1)) / 2 / float64(n)
		if c > fraction {
			break
		}
		xs = append(xs, v[i]-e0)
		ys = append(ys, c)
	}
	if len(xs) < 3 {
		return Estimate{}, fault.New("eigenvalues", "must have at least three distinct levels above the lowest within the lowest %v of the spectrum; got %d", fraction, len(xs))
	}
	s, e := logSlope(xs, ys)
	return Estimate{Value: 2 * s, Error: 2 * e, Points: len(xs), From: xs[0], To: xs[len(xs)-1]}, nil
}

// SpectralDimensionReturn estimates the spectral dimension from a classical
// return probability p0(t) ∝ t^{−d_s/2}, by least squares of ln p0 on ln t
// over every point given (choose the window between the lattice-spacing
// time and the finite-size saturation). times must be positive and strictly
// increasing, p0 positive and finite; errors name "times[i]" and "values[i]".
func SpectralDimensionReturn(times, p0 []float64) (Estimate, error) {
	if len(times) != len(p0) {
		return Estimate{}, fault.New("values", "must have one value per time (%d); got %d", len(times), len(p0))
	}
	if len(times) < 3 {
		return Estimate{}, fault.New("times", "must hold at least three points; got %d", len(times))
	}
	for i, t := range times {
		if !(t > 0) || math.IsInf(t, 0) || i > 0 && !(t > times[i-1]) {
			return Estimate{}, fault.Range("times["+strconv.Itoa(i)+"]", "positive, finite and strictly increasing", t)
		}
		if p := p0[i]; !(p > 0) || math.IsInf(p, 0) {
			return Estimate{}, fault.Range("values["+strconv.Itoa(i)+"]", "positive and finite", p)
		}
	}
	s, e := logSlope(times, p0)
	return Estimate{Value: -2 * s, Error: 2 * e, Points: len(times), From: times[0], To: times[len(times)-1]}, nil
}

// logSlope fits ln y = c + s·ln x by least squares and returns s and its
// standard error (0 for two points or an exact line).
func logSlope(xs, ys []float64) (slope, se float64) {
	m := float64(len(xs))
	var sx, sy, sxx, sxy float64
	for i := range xs {
		x, y := math.Log(xs[i]), math.Log(ys[i])
		sx += x
		sy += y
		sxx += x * x
		sxy += x * y
	}
	den := m*sxx - sx*sx
	slope = (m*sxy - sx*sy) / den
	c := (sy - slope*sx) / m
	var rss float64
	for i := range xs {
		d := math.Log(ys[i]) - c - slope*math.Log(xs[i])
		rss += d * d
	}
	if len(xs) > 2 {
		se = math.Sqrt(rss / (m - 2) * m / den)
	}
	return slope, se
}
