package spectra

import "math"

// secularRoot finds the i-th root (ascending) of the secular equation
//
//	f(λ) = 1 + ρ Σ_j w_j²/(dl_j − λ) = 0,   ρ > 0, dl strictly ascending,
//
// which lies in (dl_i, dl_{i+1}) for i < k−1 and in (dl_{k−1}, dl_{k−1} + ρ‖w‖²]
// for the last. The root is returned as λ = dl[o] + t with the origin o the
// nearer pole, so that every difference dl_j − λ = (dl_j − dl_o) − t is
// computed to high relative accuracy (as in LAPACK dlaed4).
//
// Each step fits ψ (poles j ≤ i) and φ (poles j > i) by one-pole rational
// functions matching value and slope at the iterate and solves the model
// exactly (Bunch, Nielsen & Sorensen, Numer. Math. 31, 31 (1978)); a step
// leaving the bracket, which f's monotonicity maintains, is replaced by
// bisection. ok is false only if 1200 steps (enough to bisect the whole
// float64 range) did not converge.
func secularRoot(i int, dl, w []float64, rho float64) (o int, t float64, ok bool) {
	k := len(dl)
	if k == 1 {
		return 0, rho * w[0] * w[0], true
	}
	var lo, hi float64
	if i < k-1 {
		gap := dl[i+1] - dl[i]
		fmid := 1.0
		for j := 0; j < k; j++ {
			fmid += rho * w[j] * w[j] / ((dl[j] - dl[i]) - gap/2)
		}
		if fmid >= 0 {
			o, lo, hi = i, 0, gap/2
		} else {
			o, lo, hi = i+1, -gap/2, 0
		}
	} else {
		ww := 0.0
		for _, v := range w {
			ww += v * v
		}
		o, lo, hi = k-1, 0, rho*ww
	}
	const eps = 0x1p-53
	t = (lo + hi) / 2
	for iter := 0; iter < 1200; iter++ {
		var psi, phi, dpsi, dphi float64
		for j := 0; j <= i; j++ {
			r := w[j] / ((dl[j] - dl[o]) - t)
			psi += rho * w[j] * r
			dpsi += rho * r * r
		}
		for j := i + 1; j < k; j++ {
			r := w[j] / ((dl[j] - dl[o]) - t)
			phi += rho * w[j] * r
			dphi += rho * r * r
		}
		fv := 1 + psi + phi
		if fv == 0 {
			return o, t, true
		}
		if fv < 0 {
			lo = t
		} else {
			hi = t
		}
		erretm := 8*(math.Abs(psi)+math.Abs(phi)+1) + math.Abs(t)*(dpsi+dphi)
		if math.Abs(fv) <= eps*erretm {
			return o, t, true
		}
		if hi-lo <= 4*eps*math.Max(math.Abs(lo), math.Abs(hi)) || hi-lo <= math.SmallestNonzeroFloat64 {
			return o, t, true
		}
		di := (dl[i] - dl[o]) - t
		var eta float64
		if i < k-1 {
			di1 := (dl[i+1] - dl[o]) - t
			q1, p1 := di*di*dpsi, psi-di*dpsi
			q2, p2 := di1*di1*dphi, phi-di1*dphi
			c := 1 + p1 + p2
			a := c*(di+di1) + q1 + q2
			b := c*di*di1 + q1*di1 + q2*di
			switch {
			case c == 0:
				eta = b / a
			default:
				disc := math.Sqrt(math.Abs(a*a - 4*b*c))
				if a <= 0 {
					eta = (a - disc) / (2 * c)
				} else {
					eta = 2 * b / (a + disc)
				}
				// The wanted root lies between the poles di and di1.
				if !(eta > di && eta < di1) && eta != 0 {
					eta = b / (c * eta)
				}
			}
		} else {
			q1, p1 := di*di*dpsi, psi-di*dpsi
			c := 1 + p1
			if c != 0 {
				eta = di + q1/c
			}
		}
		tn := t + eta
		if !(tn > lo && tn < hi) || math.IsNaN(tn) {
			tn = (lo + hi) / 2
		}
		if tn == t {
			return o, t, true
		}
		t = tn
	}
	return o, t, false
}
