package observables

import (
	"math"
	"sort"
)

// hingeSums evaluates the weighted residual sum of squares of a continuous
// broken line with given breakpoints in O(K log n + K³) instead of O(n K²),
// from prefix sums over the sorted abscissae. With hinge columns
// h_a = (x − ψ_a)₊ every entry of the normal equations is a tail sum:
//
//	Σ w h_a h_b = Σ_{x>ψ_b} w (x² − (ψ_a+ψ_b) x + ψ_a ψ_b)   (ψ_a ≤ ψ_b)
//	Σ w h_a y   = Σ_{x>ψ_a} w (x y − ψ_a y)
//
// and RSS = Σ w y² − βᵀ(Xᵀ W y) with β from a Cholesky solve. x and y are
// centred first, which keeps the normal equations well conditioned for the
// search; the reported fit is recomputed by Householder QR at the optimum,
// so the normal equations' lost digits never reach the result.
type hingeSums struct {
	x          []float64 // centred abscissae
	xm         float64
	w          []float64
	s0, s1, s2 []float64 // prefix sums of w, w x, w x², length n+1
	t0, t1     []float64 // prefix sums of w y, w x y
	yy         float64   // Σ w y² (y centred)
	g, r       []float64 // scratch: normal matrix and right-hand side
	tail       []int
}

func newHingeSums(x, sw []float64, maxBreaks int) *hingeSums {
	n := len(x)
	h := &hingeSums{x: make([]float64, n), w: make([]float64, n),
		s0: make([]float64, n+1), s1: make([]float64, n+1), s2: make([]float64, n+1),
		t0: make([]float64, n+1), t1: make([]float64, n+1)}
	p := maxBreaks + 2
	h.g = make([]float64, p*p)
	h.r = make([]float64, p)
	h.tail = make([]int, maxBreaks)
	var sw2, swx float64
	for i := range n {
		w := 1.0
		if sw != nil {
			w = sw[i] * sw[i]
		}
		h.w[i] = w
		sw2 += w
		swx += w * x[i]
	}
	h.xm = swx / sw2
	for i, xi := range x {
		c := xi - h.xm
		h.x[i] = c
		w := h.w[i]
		h.s0[i+1] = h.s0[i] + w
		h.s1[i+1] = h.s1[i] + w*c
		h.s2[i+1] = h.s2[i] + w*c*c
	}
	return h
}

// setY prepares the sums that depend on y.
func (h *hingeSums) setY(y []float64) {
	var sy float64
	for i, v := range y {
		sy += h.w[i] * v
	}
	ym := sy / h.s0[len(y)]
	h.yy = 0
	for i, v := range y {
		c := v - ym
		w := h.w[i]
		h.t0[i+1] = h.t0[i] + w*c
		h.t1[i+1] = h.t1[i] + w*h.x[i]*c
		h.yy += w * c * c
	}
}

// rss returns the weighted residual sum of squares at breakpoints psi
// (uncentred, ascending), or +Inf when the normal equations are singular.
func (h *hingeSums) rss(psi []float64) float64 {
	n := len(h.x)
	k := len(psi)
	p := k + 2
	g, r := h.g[:p*p], h.r[:p]
	tot := func(s []float64) float64 { return s[n] }
	tl := func(s []float64, i int) float64 { return s[n] - s[i] }
	g[0] = tot(h.s0)
	g[1] = tot(h.s1)
	g[p+1] = tot(h.s2)
	r[0] = tot(h.t0)
	r[1] = tot(h.t1)
	for a, ps := range psi {
		c := ps - h.xm
		i := sort.SearchFloat64s(h.x, c)
		h.tail[a] = i
		s0, s1, s2 := tl(h.s0, i), tl(h.s1, i), tl(h.s2, i)
		g[a+2] = s1 - c*s0
		g[p+a+2] = s2 - c*s1
		r[a+2] = tl(h.t1, i) - c*tl(h.t0, i)
		for b := 0; b <= a; b++ {
			// ψ_b ≤ ψ_a: the tail is ψ_a's.
			cb := psi[b] - h.xm
			g[(b+2)*p+a+2] = s2 - (c+cb)*s1 + c*cb*s0
		}
	}
	// Cholesky of the upper triangle (stored row-major, row ≤ column),
	// solve, and RSS = yᵀy − βᵀr.
	for j := range p {
		d := g[j*p+j]
		for m := range j {
			d -= g[m*p+j] * g[m*p+j]
		}
		if d <= 1e-13*math.Abs(g[j*p+j]) || d <= 0 {
			return math.Inf(1)
		}
		d = math.Sqrt(d)
		g[j*p+j] = d
		for c := j + 1; c < p; c++ {
			s := g[j*p+c]
			for m := range j {
				s -= g[m*p+j] * g[m*p+c]
			}
			g[j*p+c] = s / d
		}
	}
	// Forward substitution Rᵀz = r; then RSS = yᵀy − zᵀz.
	var zz float64
	for j := range p {
		s := r[j]
		for m := range j {
			s -= g[m*p+j] * r[m]
		}
		r[j] = s / g[j*p+j]
		zz += r[j] * r[j]
	}
	return math.Max(h.yy-zz, 0)
}
