package observables

import (
	"math"
	"sort"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// LocalExponent sets dst[i] to the smoothed local exponent d ln y / d ln t at
// times[i] and returns dst (nil allocates). The derivative is that of a
// least-squares polynomial of degree order (0 means 2) fitted to
// (ln t, ln y) over a window of 2·half+1 consecutive points (half 0 means 2:
// five points), shifted inwards at the ends so that every window holds the
// same number of points: a Savitzky–Golay derivative filter, Savitzky &
// Golay, Anal. Chem. 36, 1627 (1964), written for arbitrary spacing (on
// log-uniform times it is exactly their filter). With fewer points than the
// window the window shrinks to all points and the degree to at most one
// less than their number; two points give the secant slope and one point 0.
//
// The window is adaptive, so that a sharp change of the exponent (a front
// reaching the boundary, a saturation) does not bleed into the points
// before and after it: of the windows of the same size that contain
// times[i], the centred one is used unless a shifted one fits at least
// localShiftGain = 10 times better (residual sum of squares in ln y, each
// counted with a floor of 10⁻⁶ per point, the squared relative noise floor
// of FitRegimes), in which case the best-fitting one is used. This is the
// stencil choice of essentially non-oscillatory schemes (Harten, Engquist,
// Osher & Chakravarthy, J. Comput. Phys. 71, 231 (1987)) applied to a
// least-squares window. Where even the best window fits more than
// localKinkGain = 10 times worse than the median over the series (or the
// floor), a kink lies inside every window and the derivative of the
// parabola through the point and its two neighbours is used instead (the
// smallest stencil; noise alone triggers it at about 0.1% of the points). Computing
// the median allocates two slices of len(times).
//
// times must be positive, finite and strictly increasing and values positive
// and finite; otherwise an *InputError names the first offending index.
func LocalExponent(dst, times, values []float64, half, order int) ([]float64, error) {
	if err := checkSeries(times, values, nil); err != nil {
		return nil, err
	}
	if half < 0 {
		return nil, fault.Range("smooth", "a non-negative number of points", half)
	}
	if order < 0 || order > 6 {
		return nil, fault.Range("order", "between 0 (default 2) and 6", order)
	}
	n := len(times)
	if dst == nil {
		dst = make([]float64, n)
	}
	if len(dst) != n {
		panicf("LocalExponent: len(dst) = %d, want %d", len(dst), n)
	}
	localExponent(dst, times, values, half, order)
	return dst, nil
}

// localShiftGain is how much better (in residual sum of squares) a shifted
// window must fit than the centred one to replace it (chosen here: noise
// alone makes a five-point quadratic's residual ratio exceed 10 in about 9%
// of windows, a shape change makes it exceed 10⁶).
const localShiftGain = 10

// localExponent is LocalExponent without validation.
func localExponent(dst, times, values []float64, half, order int) {
	if half == 0 {
		half = 2
	}
	if order == 0 {
		order = 2
	}
	n := len(times)
	if n == 1 {
		dst[0] = 0
		return
	}
	w := 2*half + 1
	if w > n {
		w = n
	}
	if order > w-1 {
		order = w - 1
	}
	if order < 1 {
		order = 1
	}
	p := order + 1
	floor := float64(w) * noiseFloor * noiseFloor
	var fit []float64 // residual of the window used at each point
	if w > p && w > 3 {
		fit = make([]float64, n)
	}
	for i := range n {
		lo := i - w/2
		if lo < 0 {
			lo = 0
		}
		if lo+w > n {
			lo = n - w
		}
		d, rss := windowSlope(times, values, lo, w, i, p)
		best := rss
		if w > p { // a window with residual: try the shifted ones
			for l := max(i-w+1, 0); l <= min(i, n-w); l++ {
				if l == lo {
					continue
				}
				ds, r := windowSlope(times, values, l, w, i, p)
				if (r+floor)*localShiftGain < rss+floor && r < best {
					d, best = ds, r
				}
			}
		}
		if fit != nil {
			fit[i] = best
		}
		dst[i] = d
	}
	if fit == nil {
		return
	}
	// Where even the best window fits far worse than is typical for the
	// series (a kink inside every window), the three-point parabola through
	// the point and its neighbours gives the derivative instead.
	typical := append([]float64(nil), fit...)
	sort.Float64s(typical)
	thr := localKinkGain * math.Max(typical[n/2], floor)
	for i, r := range fit {
		if r > thr {
			lo := min(max(i-1, 0), n-3)
			dst[i], _ = windowSlope(times, values, lo, 3, i, 3)
		}
	}
}

// localKinkGain is how much worse than the series' median residual (or the
// noise floor, if larger) the best window at a point must fit before the
// three-point parabola replaces it (chosen here: for a quadratic on five
// points with Gaussian noise the residual, χ² with two degrees of freedom,
// exceeds 10 times its median 2 ln 2 with probability e^(−10 ln 2) ≈ 0.001).
const localKinkGain = 10

// windowSlope fits a polynomial with p coefficients to (ln t, ln y) over
// times[lo:lo+w] and returns its derivative at times[i] and the residual sum
// of squares.
func windowSlope(times, values []float64, lo, w, i, p int) (float64, float64) {
	var a [7 * 7]float64
	var b, sol [7]float64
	x0 := math.Log(times[i])
	// Scale u so that the normal equations stay well conditioned.
	scale := math.Max(math.Abs(math.Log(times[lo+w-1])-x0), math.Abs(math.Log(times[lo])-x0))
	for j := lo; j < lo+w; j++ {
		u := (math.Log(times[j]) - x0) / scale
		y := math.Log(values[j])
		var pw [13]float64
		pw[0] = 1
		for k := 1; k < 2*p-1; k++ {
			pw[k] = pw[k-1] * u
		}
		for r := range p {
			b[r] += pw[r] * y
			for c := range p {
				a[r*p+c] += pw[r+c]
			}
		}
	}
	copy(sol[:p], solveSmall(a[:p*p], b[:p], p))
	var rss float64
	for j := lo; j < lo+w; j++ {
		u := (math.Log(times[j]) - x0) / scale
		eta, pw := 0.0, 1.0
		for k := range p {
			eta += sol[k] * pw
			pw *= u
		}
		r := math.Log(values[j]) - eta
		rss += r * r
	}
	return sol[1] / scale, rss
}

// solveSmall solves the p×p system a·x = b in place by Gaussian elimination
// with partial pivoting and returns x (stored in b). A singular system
// (impossible for distinct abscissae) leaves zeros in the affected unknowns.
func solveSmall(a, b []float64, p int) []float64 {
	for col := range p {
		piv := col
		for r := col + 1; r < p; r++ {
			if math.Abs(a[r*p+col]) > math.Abs(a[piv*p+col]) {
				piv = r
			}
		}
		if a[piv*p+col] == 0 {
			continue
		}
		if piv != col {
			for c := range p {
				a[col*p+c], a[piv*p+c] = a[piv*p+c], a[col*p+c]
			}
			b[col], b[piv] = b[piv], b[col]
		}
		for r := col + 1; r < p; r++ {
			f := a[r*p+col] / a[col*p+col]
			for c := col; c < p; c++ {
				a[r*p+c] -= f * a[col*p+c]
			}
			b[r] -= f * b[col]
		}
	}
	for r := p - 1; r >= 0; r-- {
		if a[r*p+r] == 0 {
			b[r] = 0
			continue
		}
		s := b[r]
		for c := r + 1; c < p; c++ {
			s -= a[r*p+c] * b[c]
		}
		b[r] = s / a[r*p+r]
	}
	return b
}
