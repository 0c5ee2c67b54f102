package observables

import (
	"math"
	"sort"
)

// brokenLine fits continuous broken lines
//
//	η(x) = b₀ + b₁ x + Σ_k c_k (x − ψ_k)₊
//
// to (x, y) with optional weights w = 1/σ² (sw holds √w, nil for unit
// weights). Segment s runs from ψ_{s−1} to ψ_s (ψ_{−1} = x₀,
// ψ_K = x_{n−1}) and must hold at least minPts points (a point on a
// breakpoint counts for both sides). Breakpoints are located by an
// exhaustive search over a grid of candidate positions followed by
// coordinate-wise refinement (a scan and a golden-section search per
// breakpoint, repeated until nothing moves). Trial breakpoints are scored by
// the O(K³) normal-equation evaluator of hingeSums; the fit reported at the
// optimum comes from a Householder least-squares solve (fit).
type brokenLine struct {
	x, sw  []float64
	n      int
	minPts int
	h      *hingeSums
	// scratch
	a, r, beta []float64
}

func newBrokenLine(x, sw []float64, minPts, maxBreaks int) *brokenLine {
	n := len(x)
	p := maxBreaks + 2
	return &brokenLine{x: x, sw: sw, n: n, minPts: minPts, h: newHingeSums(x, sw, maxBreaks),
		a: make([]float64, n*p), r: make([]float64, n), beta: make([]float64, p)}
}

// setY fixes the ordinates that search and refine fit.
func (b *brokenLine) setY(y []float64) { b.h.setY(y) }

// maxBreaks returns the largest number of breakpoints the data can carry.
func (b *brokenLine) maxBreaks() int {
	// K breakpoints need K+1 segments of minPts points, sharing at most one
	// point at each breakpoint.
	k := (b.n - 1) / (b.minPts - 1)
	return max(k-1, 0)
}

// design fills the weighted design matrix for breakpoints psi.
func (b *brokenLine) design(psi []float64) int {
	n, p := b.n, len(psi)+2
	a := b.a[:n*p]
	for i, x := range b.x {
		w := 1.0
		if b.sw != nil {
			w = b.sw[i]
		}
		a[i] = w
		a[i+n] = w * x
		for k, s := range psi {
			v := 0.0
			if x > s {
				v = x - s
			}
			a[i+(k+2)*n] = w * v
		}
	}
	return p
}

// fit returns the weighted residual sum of squares at breakpoints psi and
// leaves the coefficients (b₀, b₁, c₁…c_K) in b.beta[:K+2].
func (b *brokenLine) fit(psi, y []float64) float64 {
	p := b.design(psi)
	for i, v := range y {
		if b.sw != nil {
			v *= b.sw[i]
		}
		b.r[i] = v
	}
	rss, _ := householderLS(b.a[:b.n*p], b.n, p, b.r, b.beta[:p])
	return rss
}

// feasible reports whether every segment holds at least minPts points.
func (b *brokenLine) feasible(psi []float64) bool {
	lo := b.x[0]
	for k := 0; k <= len(psi); k++ {
		hi := b.x[b.n-1]
		if k < len(psi) {
			hi = psi[k]
		}
		if hi < lo {
			return false
		}
		i := sort.SearchFloat64s(b.x, lo)
		j := sort.Search(b.n, func(m int) bool { return b.x[m] > hi })
		if j-i < b.minPts {
			return false
		}
		lo = hi
	}
	return true
}

// bracket returns the range in which breakpoint k may move with the others
// fixed.
func (b *brokenLine) bracket(psi []float64, k int) (lo, hi float64) {
	m := b.minPts
	a := 0
	if k > 0 {
		a = sort.SearchFloat64s(b.x, psi[k-1])
	}
	lo = b.x[min(a+m-1, b.n-1)]
	e := b.n - 1
	if k < len(psi)-1 {
		e = sort.Search(b.n, func(i int) bool { return b.x[i] > psi[k+1] }) - 1
	}
	hi = b.x[max(e-m+1, 0)]
	return lo, hi
}

// grid returns at most g candidate breakpoint positions: data abscissae and
// midpoints inside the range allowed for any breakpoint.
func (b *brokenLine) grid(g int) []float64 {
	lo, hi := b.minPts-1, b.n-b.minPts
	var c []float64
	for i := lo; i <= hi; i++ {
		c = append(c, b.x[i])
		if i < hi {
			c = append(c, (b.x[i]+b.x[i+1])/2)
		}
	}
	if len(c) <= g {
		return c
	}
	out := make([]float64, g)
	for i := range out {
		out[i] = c[int(math.Round(float64(i)*float64(len(c)-1)/float64(g-1)))]
	}
	return out
}

// gridSize keeps the exhaustive search at most about 15000 evaluations of
// hingeSums.rss (C(120,2), C(44,3), C(26,4), C(18,5), C(14,6), C(14,7)).
func gridSize(k int) int {
	switch k {
	case 1:
		return 400
	case 2:
		return 120
	case 3:
		return 44
	case 4:
		return 26
	case 5:
		return 18
	default:
		return 14
	}
}

// search finds the best k breakpoints for the ordinates given to setY from
// scratch. It returns false when no feasible placement exists.
func (b *brokenLine) search(k int) ([]float64, bool) {
	if k == 0 {
		return nil, true
	}
	cand := b.grid(gridSize(k))
	best := math.Inf(1)
	var bestPsi []float64
	psi := make([]float64, k)
	var rec func(d, from int)
	rec = func(d, from int) {
		if d == k {
			if !b.feasible(psi) {
				return
			}
			if r := b.h.rss(psi); r < best {
				best = r
				bestPsi = append(bestPsi[:0], psi...)
			}
			return
		}
		for i := from; i < len(cand); i++ {
			psi[d] = cand[i]
			if !b.feasible(psi[:d+1]) && d+1 < k {
				// Later breakpoints only shrink the last segment further.
				continue
			}
			rec(d+1, i+1)
		}
	}
	rec(0, 0)
	if bestPsi == nil {
		return nil, false
	}
	b.refine(bestPsi)
	return bestPsi, true
}

// refine improves psi in place by coordinate-wise scans and golden-section
// searches on the ordinates given to setY.
func (b *brokenLine) refine(psi []float64) {
	cur := b.h.rss(psi)
	span := b.x[b.n-1] - b.x[0]
	for sweep := 0; sweep < 20; sweep++ {
		moved := 0.0
		for k := range psi {
			lo, hi := b.bracket(psi, k)
			if hi <= lo {
				continue
			}
			old := psi[k]
			f := func(s float64) float64 {
				psi[k] = s
				return b.h.rss(psi)
			}
			// Scan, then golden section around the best scan point.
			const m = 12
			bs, bf := old, cur
			step := (hi - lo) / m
			for i := 0; i <= m; i++ {
				s := lo + float64(i)*step
				if v := f(s); v < bf {
					bs, bf = s, v
				}
			}
			s, v := golden(f, math.Max(lo, bs-step), math.Min(hi, bs+step), 1e-6*span)
			if v < bf {
				bs, bf = s, v
			}
			psi[k] = bs
			if bf < cur {
				cur = bf
			} else {
				psi[k] = old
			}
			moved = math.Max(moved, math.Abs(psi[k]-old))
		}
		if moved <= 1e-5*span {
			break
		}
	}
}

// golden minimises f on [a, c] by golden-section search and returns the best
// point seen and its value.
func golden(f func(float64) float64, a, c, tol float64) (float64, float64) {
	const r = 0.6180339887498949 // (√5 − 1)/2
	x1 := c - r*(c-a)
	x2 := a + r*(c-a)
	f1, f2 := f(x1), f(x2)
	for c-a > tol {
		if f1 <= f2 {
			c, x2, f2 = x2, x1, f1
			x1 = c - r*(c-a)
			f1 = f(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + r*(c-a)
			f2 = f(x2)
		}
	}
	if f1 <= f2 {
		return x1, f1
	}
	return x2, f2
}
