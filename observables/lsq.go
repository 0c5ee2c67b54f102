package observables

import "math"

// householderLS solves min ‖A·β − y‖₂ for the n×p column-major matrix a
// (a[i+j*n] = A_ij) by Householder QR, Golub & Van Loan, Matrix
// Computations, 4th ed. (2013), Algorithm 5.3.2. a and y are overwritten: R
// is left in the upper triangle of a and Qᵀy in y. beta (length p) receives
// the solution; the return value is the residual sum of squares. ok is false
// when R has a zero (relative to its largest) diagonal entry: the design is
// rank deficient, and beta then holds zeros in the undetermined directions.
func householderLS(a []float64, n, p int, y, beta []float64) (rss float64, ok bool) {
	ok = true
	var rmax float64
	for j := range p {
		col := a[j*n : (j+1)*n]
		// Plain sum of squares: the columns here are logarithms and weights
		// of moderate size, so neither overflow nor underflow is a concern,
		// and math.Hypot would cost three quarters of the fit.
		var norm float64
		for i := j; i < n; i++ {
			norm += col[i] * col[i]
		}
		norm = math.Sqrt(norm)
		if norm == 0 {
			continue
		}
		alpha := -math.Copysign(norm, col[j])
		// v = x − alpha e_j stored in col[j:], with v_j = col[j] − alpha.
		col[j] -= alpha
		vnorm2 := col[j] * col[j]
		for i := j + 1; i < n; i++ {
			vnorm2 += col[i] * col[i]
		}
		if vnorm2 != 0 {
			for k := j + 1; k < p; k++ {
				ck := a[k*n : (k+1)*n]
				var s float64
				for i := j; i < n; i++ {
					s += col[i] * ck[i]
				}
				f := 2 * s / vnorm2
				for i := j; i < n; i++ {
					ck[i] -= f * col[i]
				}
			}
			var s float64
			for i := j; i < n; i++ {
				s += col[i] * y[i]
			}
			f := 2 * s / vnorm2
			for i := j; i < n; i++ {
				y[i] -= f * col[i]
			}
		}
		col[j] = alpha
		rmax = math.Max(rmax, math.Abs(alpha))
	}
	// Back substitution R β = (Qᵀy)[:p].
	for j := p - 1; j >= 0; j-- {
		d := a[j+j*n]
		if math.Abs(d) <= 1e-12*rmax || d == 0 {
			beta[j] = 0
			ok = false
			continue
		}
		s := y[j]
		for k := j + 1; k < p; k++ {
			s -= a[j+k*n] * beta[k]
		}
		beta[j] = s / d
	}
	for i := p; i < n; i++ {
		rss += y[i] * y[i]
	}
	return rss, ok
}

// rInverseCov sets cov (p×p row-major) to (RᵀR)⁻¹ = R⁻¹R⁻ᵀ from the R left
// in the upper triangle of the column-major n×p matrix a by householderLS.
// It returns false when R is singular.
func rInverseCov(a []float64, n, p int, cov []float64) bool {
	rinv := make([]float64, p*p) // R⁻¹, upper triangular, row-major
	for j := range p {
		if a[j+j*n] == 0 {
			return false
		}
	}
	for j := p - 1; j >= 0; j-- {
		rinv[j*p+j] = 1 / a[j+j*n]
		for k := j + 1; k < p; k++ {
			var s float64
			for m := j + 1; m <= k; m++ {
				s += a[j+m*n] * rinv[m*p+k]
			}
			rinv[j*p+k] = -s / a[j+j*n]
		}
	}
	for r := range p {
		for c := range p {
			var s float64
			for m := max(r, c); m < p; m++ {
				s += rinv[r*p+m] * rinv[c*p+m]
			}
			cov[r*p+c] = s
		}
	}
	return true
}
