package observables

// Region is a set of sites, decided by index and position. Disc, Box and
// Sites implement it; users may supply their own.
type Region interface {
	// Contains reports whether site i at position pos belongs to the region.
	Contains(i int, pos []float64) bool
}

// Disc is the closed ball ‖r − Center‖ ≤ Radius (a disc in two dimensions,
// an interval in one). Center must have as many coordinates as the
// positions.
type Disc struct {
	Center []float64
	Radius float64
}

// Contains implements Region.
func (c Disc) Contains(_ int, pos []float64) bool {
	if len(pos) != len(c.Center) {
		panicf("Disc: position has %d coordinates, centre has %d", len(pos), len(c.Center))
	}
	var r2 float64
	for d, x := range pos {
		dx := x - c.Center[d]
		r2 += dx * dx
	}
	return r2 <= c.Radius*c.Radius
}

// Box is the closed axis-aligned box Min[d] ≤ r_d ≤ Max[d] for every d.
type Box struct {
	Min, Max []float64
}

// Contains implements Region.
func (b Box) Contains(_ int, pos []float64) bool {
	if len(pos) != len(b.Min) || len(pos) != len(b.Max) {
		panicf("Box: position has %d coordinates, Min %d, Max %d", len(pos), len(b.Min), len(b.Max))
	}
	for d, x := range pos {
		if x < b.Min[d] || x > b.Max[d] {
			return false
		}
	}
	return true
}

// Sites is an explicit set of site indices. RegionProbability sums a Sites
// region directly by index (each listed index counted once per listing), in
// O(len(Sites)); its Contains method is a linear scan for other uses.
type Sites []int

// Contains implements Region.
func (s Sites) Contains(i int, _ []float64) bool {
	for _, k := range s {
		if k == i {
			return true
		}
	}
	return false
}

// RegionProbability returns Σ_{j∈r} p_j, the probability found in region r.
// For Sites the indices are summed directly (indices outside [0, len(p))
// panic); other regions are tested site by site in one pass. It allocates
// nothing.
func RegionProbability(p, coords []float64, dim int, r Region) float64 {
	var s float64
	if set, ok := r.(Sites); ok {
		for _, k := range set {
			if k < 0 || k >= len(p) {
				panicf("RegionProbability: site %d outside [0, %d)", k, len(p))
			}
			s += p[k]
		}
		return s
	}
	checkCoords("RegionProbability", p, coords, dim)
	for j, pj := range p {
		if r.Contains(j, coords[j*dim:(j+1)*dim]) {
			s += pj
		}
	}
	return s
}
