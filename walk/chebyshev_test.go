package walk

import (
	"math"
	"testing"
)

// TestBesselJ checks the Miller backward recurrence against Go's math.Jn
// (the reference: math.Jn, Go standard library) over orders and arguments
// that cover small, moderate and the long segments the propagator uses.
func TestBesselJ(t *testing.T) {
	for _, x := range []float64{1e-14, 2e-13, 1e-8, 6e-7, 2e-6, 1e-3, 0.1, 1, 2.5, 10, 37.3, 100, 499.9} {
		K := boundIndex(x, 1e-16) + 1
		got := make([]float64, K)
		besselJ(got, x, nil)
		for k, g := range got {
			want := math.Jn(k, x)
			// Absolute agreement: |J_k| ≤ 1, and cancellations in the
			// reference near zeros limit relative comparisons (common practice).
			if d := math.Abs(g - want); d > 1e-13*math.Max(1, math.Sqrt(x)/4) {
				t.Errorf("J_%d(%v) = %.17g, math.Jn gives %.17g (diff %.3g)", k, x, g, want, d)
			}
		}
	}
}

// TestBesselIScaled checks e^{−x}I_k(x) against its power series
// Σ_m (x/2)^{2m+k}/(m!(m+k)!) (Abramowitz & Stegun 9.6.10 (from memory)),
// summed in log space, for arguments where the series is accurate, and the
// normalisation e^{−x}(I_0 + 2ΣI_k) = 1 (A&S 9.6.37 (from memory)) for large x.
func TestBesselIScaled(t *testing.T) {
	series := func(k int, x float64) float64 {
		var s float64
		for m := 0; m < 400; m++ {
			l1, _ := math.Lgamma(float64(m + 1))
			l2, _ := math.Lgamma(float64(m + k + 1))
			s += math.Exp(float64(2*m+k)*math.Log(x/2) - l1 - l2 - x)
		}
		return s
	}
	for _, x := range []float64{1e-6, 0.1, 1, 2, 7.5, 30} {
		K := boundIndex(x, 1e-17) + 1
		got := make([]float64, K)
		besselIScaled(got, x, nil)
		for k, g := range got {
			want := series(k, x)
			if d := math.Abs(g - want); d > 1e-14*math.Max(want, 1e-300) && d > 1e-300 {
				if d > 1e-15 {
					t.Errorf("e^-x I_%d(%v) = %.17g, series %.17g", k, x, g, want)
				}
			}
		}
	}
	for _, x := range []float64{100, 499.9, 5000} {
		K := boundIndex(x, 1e-17) + 1
		got := make([]float64, K)
		besselIScaled(got, x, nil)
		s := got[0]
		for _, v := range got[1:] {
			s += 2 * v
		}
		if math.Abs(s-1) > 1e-13 {
			t.Errorf("x=%v: e^-x(I_0 + 2ΣI_k) = %.17g, want 1", x, s)
		}
	}
}

// TestBoundTail checks that the stated tail bound majorises the true tail of
// |J_k| (reference: math.Jn).
func TestBoundTail(t *testing.T) {
	for _, x := range []float64{0.5, 3, 20, 80} {
		for K := int(x/2) + 1; K < int(x)+60; K += 3 {
			var tail float64
			for k := K + 1; k < K+200; k++ {
				tail += math.Abs(math.Jn(k, x))
			}
			if b := boundTail(x, K); b < tail {
				t.Errorf("x=%v K=%d: bound %.3g below the tail %.3g", x, K, b, tail)
			}
		}
	}
}
