package observables

import "math"

// Probabilities sets dst[j] = |ψ_j|² and returns dst. When dst is nil it is
// allocated; otherwise it must have the length of psi.
func Probabilities(dst []float64, psi []complex128) []float64 {
	if dst == nil {
		dst = make([]float64, len(psi))
	}
	if len(dst) != len(psi) {
		panicf("Probabilities: len(dst) = %d, len(psi) = %d", len(dst), len(psi))
	}
	for j, a := range psi {
		re, im := real(a), imag(a)
		dst[j] = re*re + im*im
	}
	return dst
}

// checkCoords panics when coords does not hold one point of dim coordinates
// per entry of p.
func checkCoords(name string, p, coords []float64, dim int) {
	if dim < 1 {
		panicf("%s: dim = %d, must be at least 1", name, dim)
	}
	if len(coords) != len(p)*dim {
		panicf("%s: len(coords) = %d, want len(p)·dim = %d·%d", name, len(coords), len(p), dim)
	}
}

// MSD returns the mean squared displacement Σ_j p_j ‖r_j − r0‖² from origin
// r0, with r_j = coords[j*dim:(j+1)*dim]. origin must have dim coordinates.
// It costs one pass over the sites and allocates nothing.
func MSD(p, coords []float64, dim int, origin []float64) float64 {
	checkCoords("MSD", p, coords, dim)
	if len(origin) != dim {
		panicf("MSD: len(origin) = %d, want dim = %d", len(origin), dim)
	}
	var s float64
	switch dim {
	case 1:
		x0 := origin[0]
		for j, pj := range p {
			dx := coords[j] - x0
			s += pj * dx * dx
		}
	case 2:
		x0, y0 := origin[0], origin[1]
		for j, pj := range p {
			c := coords[2*j : 2*j+2]
			dx, dy := c[0]-x0, c[1]-y0
			s += pj * (dx*dx + dy*dy)
		}
	default:
		for j, pj := range p {
			c := coords[j*dim : (j+1)*dim]
			var r2 float64
			for d, x := range c {
				dx := x - origin[d]
				r2 += dx * dx
			}
			s += pj * r2
		}
	}
	return s
}

// Centroid sets dst to the centroid r̄ = Σ_j p_j r_j / Σ_j p_j (for a
// normalised p simply Σ_j p_j r_j) and returns dst. When dst is nil it is
// allocated; otherwise it must have length dim. An all-zero p gives the
// zero vector.
func Centroid(dst, p, coords []float64, dim int) []float64 {
	checkCoords("Centroid", p, coords, dim)
	if dst == nil {
		dst = make([]float64, dim)
	}
	if len(dst) != dim {
		panicf("Centroid: len(dst) = %d, want dim = %d", len(dst), dim)
	}
	for d := range dst {
		dst[d] = 0
	}
	var w float64
	for j, pj := range p {
		w += pj
		c := coords[j*dim : (j+1)*dim]
		for d, x := range c {
			dst[d] += pj * x
		}
	}
	if w == 0 {
		for d := range dst {
			dst[d] = 0
		}
		return dst
	}
	for d := range dst {
		dst[d] /= w
	}
	return dst
}

// Spread returns Σ_j p_j ‖r_j − r̄‖², the spread about the centroid
// r̄ = Σ_j p_j r_j / Σ_j p_j. It is computed coordinate by coordinate in two
// passes (mean, then centred squares), which avoids the cancellation of the
// one-pass formula far from the origin, and allocates nothing.
func Spread(p, coords []float64, dim int) float64 {
	checkCoords("Spread", p, coords, dim)
	var w float64
	for _, pj := range p {
		w += pj
	}
	if w == 0 {
		return 0
	}
	var s float64
	for d := 0; d < dim; d++ {
		var m float64
		for j, pj := range p {
			m += pj * coords[j*dim+d]
		}
		m /= w
		for j, pj := range p {
			dx := coords[j*dim+d] - m
			s += pj * dx * dx
		}
	}
	return s
}

// IPR returns the inverse participation ratio Σ_j p_j².
func IPR(p []float64) float64 {
	var s float64
	for _, pj := range p {
		s += pj * pj
	}
	return s
}

// Participation returns the participation number 1/Σ_j p_j², the effective
// number of occupied sites; 0 for an all-zero p (instead of +Inf).
func Participation(p []float64) float64 {
	s := IPR(p)
	if s == 0 {
		return 0
	}
	return 1 / s
}

// Entropy returns the Shannon entropy −Σ_j p_j ln p_j in nats, with
// 0 ln 0 = 0. Entries p_j ≤ 0 (zero, or round-off negatives in measured
// data) contribute nothing.
func Entropy(p []float64) float64 {
	var s float64
	for _, pj := range p {
		if pj > 0 {
			s -= pj * math.Log(pj)
		}
	}
	return s
}
