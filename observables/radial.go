package observables

import "math"

// RadialProfile bins p by distance from origin: dst[k] = Σ p_j over the
// sites with k·width ≤ ‖r_j − origin‖ < (k+1)·width, and returns dst. When
// dst is nil, enough bins are allocated to hold every site; otherwise
// len(dst) bins are filled and the probability of sites beyond the last bin
// is returned as overflow (it is 0 when every site fits). width must be
// positive. One pass over the sites, no allocation with a caller dst.
func RadialProfile(dst, p, coords []float64, dim int, origin []float64, width float64) (profile []float64, overflow float64) {
	checkCoords("RadialProfile", p, coords, dim)
	if len(origin) != dim {
		panicf("RadialProfile: len(origin) = %d, want dim = %d", len(origin), dim)
	}
	if !(width > 0) || math.IsInf(width, 0) {
		panicf("RadialProfile: width = %v, must be positive and finite", width)
	}
	if dst == nil {
		var rmax float64
		for j := range p {
			rmax = math.Max(rmax, dist(coords[j*dim:(j+1)*dim], origin))
		}
		dst = make([]float64, int(rmax/width)+1)
	}
	for k := range dst {
		dst[k] = 0
	}
	for j, pj := range p {
		k := int(dist(coords[j*dim:(j+1)*dim], origin) / width)
		if k < len(dst) {
			dst[k] += pj
		} else {
			overflow += pj
		}
	}
	return dst, overflow
}

func dist(a, b []float64) float64 {
	var r2 float64
	for d, x := range a {
		dx := x - b[d]
		r2 += dx * dx
	}
	return math.Sqrt(r2)
}
