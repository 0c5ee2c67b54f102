package spectra

import (
	"math"
	"sort"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Reference values of the mean spacing ratio r̃ (Atas, Bogomolny, Giraud,
// Roux, PRL 110, 084101 (2013)).
const (
	// RatioPoisson is 2 ln 2 − 1, uncorrelated (integrable) levels.
	RatioPoisson = 0.38629436111989061
	// RatioGOE is the large-N value for the Gaussian orthogonal ensemble
	// (time-reversal symmetric chaotic spectra).
	RatioGOE = 0.5307
	// RatioGUE is the large-N value for the Gaussian unitary ensemble.
	RatioGUE = 0.5996
)

// RatioStats summarises the ratios of consecutive level spacings.
type RatioStats struct {
	// Mean is the mean of r̃_n = min(s_n, s_{n−1})/max(s_n, s_{n−1}); 0 when
	// Used is 0.
	Mean float64
	// Error is the standard error of Mean assuming independent ratios
	// (consecutive ratios are weakly correlated, so it is indicative); 0
	// when Used < 2.
	Error float64
	// Used counts the spacing pairs averaged.
	Used int
	// Degenerate counts the spacings ≤ tol left out.
	Degenerate int
	// Invalid counts non-finite values (NaN, ±Inf) ignored.
	Invalid int
}

// SpacingRatio returns the mean ratio of consecutive level spacings of
// values (Oganesyan & Huse, PRB 75, 155111 (2007); Atas et al., PRL 110,
// 084101 (2013)). The levels are sorted; spacings s_n = E_{n+1} − E_n ≤ tol
// are degeneracies: they are counted in Degenerate and dropped (a
// degenerate cluster acts as one level), and r̃ is averaged over the pairs
// of consecutive remaining spacings. The ratio needs no unfolding, but it is
// meaningful only within one symmetry sector: levels of independent sectors
// overlap like Poisson levels. A negative or NaN tol counts as 0; non-finite
// values are ignored and counted in Invalid.
func SpacingRatio(values []float64, tol float64) RatioStats {
	if !(tol >= 0) {
		tol = 0
	}
	var st RatioStats
	v := make([]float64, 0, len(values))
	for _, x := range values {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			st.Invalid++
			continue
		}
		v = append(v, x)
	}
	sort.Float64s(v)
	prev := -1.0
	var sum, sum2 float64
	for i := 1; i < len(v); i++ {
		s := v[i] - v[i-1]
		if !(s > tol) {
			st.Degenerate++
			continue
		}
		if prev > 0 {
			r := math.Min(s, prev) / math.Max(s, prev)
			sum += r
			sum2 += r * r
			st.Used++
		}
		prev = s
	}
	if st.Used > 0 {
		st.Mean = sum / float64(st.Used)
	}
	if st.Used > 1 {
		va := (sum2 - sum*sum/float64(st.Used)) / float64(st.Used-1)
		st.Error = math.Sqrt(math.Max(va, 0) / float64(st.Used))
	}
	return st
}

// Unfold maps the levels values onto a spectrum of unit mean spacing: each
// level E becomes Ñ(E), where Ñ is a least-squares polynomial of the given
// degree (1 to 20) fitted to the staircase N(E_k) = k (k = 0 … n−1, sorted
// levels), in the Chebyshev basis on the levels' range (common practice; see
// Guhr, Müller-Groeling, Weidenmüller, Phys. Rep. 299, 189 (1998)). The
// result is sorted. Spacing distributions need unfolding; SpacingRatio does
// not.
func Unfold(values []float64, degree int) ([]float64, error) {
	if err := checkValues(values); err != nil {
		return nil, err
	}
	if degree < 1 || degree > 20 {
		return nil, fault.Range("unfold.degree", "between 1 and 20", degree)
	}
	n := len(values)
	if n <= degree {
		return nil, fault.New("eigenvalues", "must hold more levels (%d) than the unfolding degree %d", n, degree)
	}
	v := append([]float64(nil), values...)
	sort.Float64s(v)
	lo, hi := v[0], v[n-1]
	if hi == lo {
		return nil, fault.New("eigenvalues", "must not all be equal to unfold; got %d copies of %v", n, lo)
	}
	x := func(e float64) float64 { return (2*e - lo - hi) / (hi - lo) }
	p := degree + 1
	// Normal equations in the Chebyshev basis, well conditioned for the
	// degrees allowed.
	ata := make([]float64, p*p)
	atb := make([]float64, p)
	t := make([]float64, p)
	cheb := func(x float64) {
		t[0] = 1
		if p > 1 {
			t[1] = x
		}
		for k := 2; k < p; k++ {
			t[k] = 2*x*t[k-1] - t[k-2]
		}
	}
	for k, e := range v {
		cheb(x(e))
		for i := 0; i < p; i++ {
			atb[i] += t[i] * float64(k)
			for j := 0; j < p; j++ {
				ata[i*p+j] += t[i] * t[j]
			}
		}
	}
	c, ok := solveSPD(ata, atb, p)
	if !ok {
		return nil, &fault.Error{Kind: fault.Numerical, Field: "eigenvalues",
			Msg: "the unfolding fit is singular: too few distinct levels for the degree"}
	}
	out := make([]float64, n)
	for k, e := range v {
		cheb(x(e))
		var s float64
		for i := 0; i < p; i++ {
			s += c[i] * t[i]
		}
		out[k] = s
	}
	return out, nil
}

// solveSPD solves the symmetric positive definite system a·x = b (p×p,
// row-major) by Cholesky factorisation; ok is false when a is not
// numerically positive definite.
func solveSPD(a, b []float64, p int) ([]float64, bool) {
	l := make([]float64, p*p)
	for j := 0; j < p; j++ {
		s := a[j*p+j]
		for k := 0; k < j; k++ {
			s -= l[j*p+k] * l[j*p+k]
		}
		if !(s > 1e-13*a[j*p+j]) {
			return nil, false
		}
		l[j*p+j] = math.Sqrt(s)
		for i := j + 1; i < p; i++ {
			s := a[i*p+j]
			for k := 0; k < j; k++ {
				s -= l[i*p+k] * l[j*p+k]
			}
			l[i*p+j] = s / l[j*p+j]
		}
	}
	y := make([]float64, p)
	for i := 0; i < p; i++ {
		s := b[i]
		for k := 0; k < i; k++ {
			s -= l[i*p+k] * y[k]
		}
		y[i] = s / l[i*p+i]
	}
	for i := p - 1; i >= 0; i-- {
		s := y[i]
		for k := i + 1; k < p; k++ {
			s -= l[k*p+i] * y[k]
		}
		y[i] = s / l[i*p+i]
	}
	return y, true
}
