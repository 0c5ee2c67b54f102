package spectra

import (
	"math"
	"slices"
	"sort"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// BoxDim is a box-counting (Minkowski–Bouligand) dimension estimate: the
// job format's "box_dimension" object.
type BoxDim struct {
	// Dimension is the fitted slope of ln N(ε) against ln(1/ε), Error its
	// standard error from the fit.
	Dimension, Error float64
	// Smallest and Largest are the box sides of the fitted range.
	Smallest, Largest float64
	// Base is the ratio of consecutive box sides (2 or 3) of the fit chosen.
	Base int
	// Sizes and Counts list every box side tried for that base and its
	// count N(ε) (for weighted sets, the effective count e^{S(ε)}).
	Sizes, Counts []float64
}

// BoxDimension estimates the box-counting dimension of the point set coords
// (n points of dim coordinates, point i at [i·dim, (i+1)·dim)).
//
// Boxes form a grid anchored at the lower corner of the bounding box, with
// sides ε = δ·b^k, δ the spacing scale (the smallest nonzero gap between
// distinct coordinate values) and b = 2 or 3. The fit runs from the largest
// ε at which the occupied boxes hold two points on average (the spacing
// scale, below which N(ε) saturates at the number of points) to the largest
// ε ≤ extent/4 at which at least two boxes are occupied, by least squares of
// ln N(ε) on ln(1/ε). Boxes comparable to the extent count the outline of
// the set and bias the slope (the gasket came out 1.52–1.55 instead of
// ln3/ln2 = 1.585 with them); only if fewer than three sizes remain is the
// range extended one size at a time up to the largest ε ≤ extent with two
// occupied boxes (the system scale). Smallest and Largest report the range. Both bases are fitted and the one with the smaller standard error
// is reported (self-similar sets built on a base-2 or base-3 grid are
// counted exactly by their own base). At least three box sizes must fit.
//
// With weights == nil N(ε) counts occupied boxes. With weights (one
// non-negative value per point, not all zero) N(ε) = exp(−Σ_B p_B ln p_B),
// p_B the weight fraction in box B: the information dimension, equal to the
// box dimension when the box masses are even and insensitive to boxes with
// negligible weight (use it for eigenstate or energy-window maps).
//
// Errors name "positions" and "weights".
func BoxDimension(coords []float64, dim int, weights []float64) (BoxDim, error) {
	if dim < 1 || dim > 64 {
		return BoxDim{}, fault.Range("positions", "points with 1 to 64 coordinates", dim)
	}
	if len(coords) == 0 || len(coords)%dim != 0 {
		return BoxDim{}, fault.New("positions", "must hold whole points of %d coordinates; got %d values", dim, len(coords))
	}
	n := len(coords) / dim
	for k, v := range coords {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return BoxDim{}, fault.New("positions", "must be finite; point %d has %v", k/dim, v)
		}
	}
	if weights != nil {
		if len(weights) != n {
			return BoxDim{}, fault.New("weights", "must have one value per point (%d); got %d", n, len(weights))
		}
		var s float64
		for i, w := range weights {
			if !(w >= 0) || math.IsInf(w, 0) {
				return BoxDim{}, fault.Range("weights["+strconv.Itoa(i)+"]", "a non-negative finite number", w)
			}
			s += w
		}
		if !(s > 0) {
			return BoxDim{}, fault.New("weights", "must not all be zero")
		}
	}
	lo := make([]float64, dim)
	var extent float64
	delta := math.Inf(1)
	col := make([]float64, n)
	for c := 0; c < dim; c++ {
		for i := 0; i < n; i++ {
			col[i] = coords[i*dim+c]
		}
		sort.Float64s(col)
		lo[c] = col[0]
		ext := col[n-1] - col[0]
		extent = math.Max(extent, ext)
		for i := 1; i < n; i++ {
			if g := col[i] - col[i-1]; g > 1e-9*ext {
				delta = math.Min(delta, g)
			}
		}
	}
	if extent == 0 || math.IsInf(delta, 1) {
		return BoxDim{}, fault.New("positions", "must hold at least two distinct points; got %d copies of one point", n)
	}
	var best BoxDim
	found := false
	for _, base := range []int{2, 3} {
		r, ok := boxFit(coords, dim, weights, lo, delta, extent, base)
		if !ok {
			continue
		}
		if !found || r.Error < best.Error-1e-12 {
			best, found = r, true
		}
	}
	if !found {
		return BoxDim{}, fault.New("positions", "span too few scales for a box count: extent %v is only %v spacings (need at least three box sizes between the spacing and the extent)", extent, extent/delta)
	}
	return best, nil
}

// boxFit counts boxes of sides δ·base^k and fits the valid range.
func boxFit(coords []float64, dim int, weights []float64, lo []float64, delta, extent float64, base int) (BoxDim, bool) {
	r := BoxDim{Base: base}
	n := len(coords) / dim
	keys := make([]boxKey, n)
	for eps := delta; ; eps *= float64(base) {
		c := boxCount(coords, dim, weights, lo, eps, keys)
		r.Sizes = append(r.Sizes, eps)
		r.Counts = append(r.Counts, c)
		if c <= 1+1e-9 || eps > extent {
			break
		}
	}
	// Spacing scale: the first size whose boxes hold two points on average
	// (half as many boxes as points), below which N(ε) saturates at the
	// number of points; system scale: the last size ≤ extent with at least
	// two boxes.
	k0 := len(r.Counts)
	for k := range r.Counts {
		if r.Counts[k] <= r.Counts[0]/2*(1+1e-9) {
			k0 = k
			break
		}
	}
	// Boxes comparable to the extent see the outline of the set rather than
	// its structure and bias the slope (low for the gasket), so the fit
	// stops at the largest side ≤ extent/4; only when that leaves fewer than
	// three sizes does it extend, one size at a time, up to the system scale.
	k1, kmax := -1, -1
	for k := range r.Counts {
		if r.Sizes[k] <= extent*(1+1e-9) && r.Counts[k] >= 2-1e-9 {
			kmax = k
			if r.Sizes[k] <= extent/4*(1+1e-9) {
				k1 = k
			}
		}
	}
	for k1 < kmax && k1-k0+1 < 3 {
		k1++
	}
	if k1-k0+1 < 3 {
		return r, false
	}
	var sx, sy, sxx, sxy float64
	m := float64(k1 - k0 + 1)
	for k := k0; k <= k1; k++ {
		x, y := -math.Log(r.Sizes[k]), math.Log(r.Counts[k])
		sx += x
		sy += y
		sxx += x * x
		sxy += x * y
	}
	den := m*sxx - sx*sx
	slope := (m*sxy - sx*sy) / den
	icpt := (sy - slope*sx) / m
	var rss float64
	for k := k0; k <= k1; k++ {
		x, y := -math.Log(r.Sizes[k]), math.Log(r.Counts[k])
		d := y - icpt - slope*x
		rss += d * d
	}
	r.Dimension = slope
	r.Error = math.Sqrt(rss / (m - 2) * m / den)
	r.Smallest, r.Largest = r.Sizes[k0], r.Sizes[k1]
	return r, true
}

// boxKey identifies a box by its integer cell indices, packed into one
// uint64 when they fit, otherwise into a string.
type boxKey struct {
	p uint64
	s string
	w float64
}

// boxCount returns the number of occupied boxes of side eps (or the
// effective number e^S for weighted points).
func boxCount(coords []float64, dim int, weights []float64, lo []float64, eps float64, keys []boxKey) float64 {
	n := len(coords) / dim
	bits := 64 / dim
	pack := bits >= 1
	idx := make([]int64, dim)
	buf := make([]byte, 0, 8*dim)
	for i := 0; i < n; i++ {
		fits := pack
		for c := 0; c < dim; c++ {
			// A small relative allowance puts points on a grid line into the
			// box above it despite rounding.
			q := int64(math.Floor((coords[i*dim+c]-lo[c])/eps + 1e-9))
			idx[c] = q
			if bits < 64 && q >= int64(1)<<uint(bits) {
				fits = false
			}
		}
		k := boxKey{w: 1}
		if weights != nil {
			k.w = weights[i]
		}
		if fits && dim > 1 || dim == 1 {
			for c := 0; c < dim; c++ {
				k.p = k.p<<uint(bits) | uint64(idx[c])
			}
		} else {
			buf = buf[:0]
			for c := 0; c < dim; c++ {
				buf = strconv.AppendInt(buf, idx[c], 36)
				buf = append(buf, ',')
			}
			k.s = string(buf)
		}
		keys[i] = k
	}
	slices.SortFunc(keys, func(a, b boxKey) int {
		if a.p != b.p {
			if a.p < b.p {
				return -1
			}
			return 1
		}
		switch {
		case a.s < b.s:
			return -1
		case a.s > b.s:
			return 1
		}
		return 0
	})
	if weights == nil {
		c := 0
		for i := range keys {
			if i == 0 || keys[i].p != keys[i-1].p || keys[i].s != keys[i-1].s {
				c++
			}
		}
		return float64(c)
	}
	var total float64
	for _, k := range keys {
		total += k.w
	}
	var s, mass float64
	for i := range keys {
		mass += keys[i].w
		if i == len(keys)-1 || keys[i+1].p != keys[i].p || keys[i+1].s != keys[i].s {
			if p := mass / total; p > 0 {
				s -= p * math.Log(p)
			}
			mass = 0
		}
	}
	return math.Exp(s)
}
