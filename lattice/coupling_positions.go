package lattice

import (
	"math"
	"sort"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// FromPositions returns the graph of sites at pos (n·dim values, site i at
// [i·dim, (i+1)·dim)) in which every pair closer than or at cutoff is bonded
// with weight law.Coupling(d), d the Euclidean distance. Next-nearest and
// farther neighbours appear by themselves when they lie within the cutoff.
// detuning (nil for none) gives the on-site energies ε_i, in the law's
// coupling unit. Positions are kept as given, in their own unit; divide
// MSDs by the spacing squared to express them in units of the spacing.
//
// The neighbour search bins sites into a grid of cubic cells of side cutoff
// over the first min(dim, 3) coordinates and compares each site only with
// the sites in its own and adjacent cells: O(N) distance evaluations for
// arrays of bounded density (plus an O(N log N) sort of the sites by cell),
// instead of the O(N²) of all pairs; about 0.3 s for 10⁵ sites with
// next-nearest neighbours on one core (BenchmarkFromPositions100k).
//
// Errors (*InputError) name the field: "dim", "positions", "cutoff",
// "detuning[i]", "law" (invalid parameters, a distance outside a Table's
// calibrated range, or a non-finite coupling) and report coincident sites.
// Bonds whose coupling is exactly zero are left out. Bonds are ordered by
// (I, J) with I < J.
func FromPositions(pos []float64, dim int, law CouplingLaw, cutoff float64, detuning []float64) (*Graph, error) {
	if dim < 1 || dim > 64 {
		return nil, fault.Range("dim", "between 1 and 64", dim)
	}
	if len(pos) == 0 || len(pos)%dim != 0 {
		return nil, fault.New("positions", "must hold a whole number (≥ 1) of points of %d coordinates; got %d values", dim, len(pos))
	}
	n := len(pos) / dim
	if n > MaxSites {
		return nil, fault.Range("positions", "at most "+strconv.Itoa(MaxSites)+" points", n)
	}
	for k, v := range pos {
		if !isFiniteCoupling(v) {
			return nil, fault.New("positions", "must be finite; point %d has %v", k/dim, v)
		}
	}
	if !isFiniteCoupling(cutoff) || cutoff <= 0 {
		return nil, fault.Range("cutoff", "a finite distance > 0", cutoff)
	}
	if law == nil {
		return nil, fault.New("law", "must be a coupling law; got nil")
	}
	if v, ok := law.(interface{ Validate() error }); ok {
		if err := v.Validate(); err != nil {
			return nil, err
		}
	}
	if detuning != nil && len(detuning) != n {
		return nil, fault.New("detuning", "must have one value per site (%d); got %d", n, len(detuning))
	}
	for i, e := range detuning {
		if !isFiniteCoupling(e) {
			return nil, fault.Range("detuning["+strconv.Itoa(i)+"]", "a finite number", e)
		}
	}
	lo, hi := math.Inf(-1), math.Inf(1)
	if dl, ok := law.(Domained); ok {
		lo, hi = dl.Domain()
	}

	var bonds []Bond
	var bad error
	neighbourPairs(pos, dim, cutoff, func(i, j int, d float64) bool {
		if d == 0 {
			bad = fault.New("positions", "sites %d and %d coincide at distance 0; every site needs its own position", i, j)
			return false
		}
		if d < lo || d > hi {
			bad = fault.New("law", "distance %g between sites %d and %d lies outside the calibrated range [%g, %g] of the coupling table (lower the cutoff, extend the calibration or build the table with clamping)", d, i, j, lo, hi)
			return false
		}
		c := law.Coupling(d)
		if !isFiniteCoupling(c) {
			bad = fault.New("law", "coupling at distance %g (sites %d and %d) must be finite; got %v", d, i, j, c)
			return false
		}
		if c != 0 {
			bonds = append(bonds, Bond{I: i, J: j, W: c})
		}
		return true
	})
	if bad != nil {
		return nil, bad
	}
	// Pairs arrive in increasing I; order each I's partners by J.
	for a := 0; a < len(bonds); {
		b := a
		for b < len(bonds) && bonds[b].I == bonds[a].I {
			b++
		}
		seg := bonds[a:b]
		sort.Slice(seg, func(x, y int) bool { return seg[x].J < seg[y].J })
		a = b
	}
	// Everything New checks holds by construction (finite positions and
	// weights, I < J, each pair once), so skip its O(m log m) duplicate
	// search and build the graph directly, as the builders do.
	g := &Graph{n: n, dim: dim, pos: append([]float64(nil), pos...),
		bi: make([]int32, len(bonds)), bj: make([]int32, len(bonds)), w: make([]float64, len(bonds))}
	for k, b := range bonds {
		g.bi[k], g.bj[k], g.w[k] = int32(b.I), int32(b.J), b.W
	}
	if detuning != nil {
		g.onsite = append([]float64(nil), detuning...)
	}
	return g, nil
}

// neighbourPairs calls f(i, j, d) once for every pair i < j with Euclidean
// distance d ≤ cutoff, until f returns false. It bins the first min(dim, 3)
// coordinates into cells of side cutoff; a pair within the cutoff has
// projected distance within it too, so it lies in the same or adjacent
// cells. Sites are sorted by cell (no map), and each site looks up the 3^k
// neighbouring cells by binary search: O(N log N) with a small constant for
// the sort and O(N·z) for the pairs, z the sites per cell neighbourhood.
// Pairs come in increasing i, and for each i in no particular order of j.
func neighbourPairs(pos []float64, dim int, cutoff float64, f func(i, j int, d float64) bool) {
	n := len(pos) / dim
	k := min(dim, 3)
	var origin [3]float64
	for a := 0; a < k; a++ {
		origin[a] = math.Inf(1)
		for i := 0; i < n; i++ {
			origin[a] = math.Min(origin[a], pos[i*dim+a])
		}
	}
	cell := make([][3]int64, n)
	for i := range cell {
		for a := 0; a < k; a++ {
			cell[i][a] = int64(math.Floor((pos[i*dim+a] - origin[a]) / cutoff))
		}
	}
	less := func(x, y [3]int64) bool {
		if x[0] != y[0] {
			return x[0] < y[0]
		}
		if x[1] != y[1] {
			return x[1] < y[1]
		}
		return x[2] < y[2]
	}
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
	}
	sort.Slice(order, func(a, b int) bool {
		ca, cb := cell[order[a]], cell[order[b]]
		if ca != cb {
			return less(ca, cb)
		}
		return order[a] < order[b]
	})
	sorted := make([][3]int64, n)
	for r, i := range order {
		sorted[r] = cell[i]
	}
	c2 := cutoff * cutoff
	offsets := 1
	for a := 0; a < k; a++ {
		offsets *= 3
	}
	for i := 0; i < n; i++ {
		c := cell[i]
		pi := pos[i*dim : (i+1)*dim]
		for o := 0; o < offsets; o++ {
			nc, q := c, o
			for a := 0; a < k; a++ {
				nc[a] += int64(q%3) - 1
				q /= 3
			}
			r := sort.Search(n, func(r int) bool { return !less(sorted[r], nc) })
			for ; r < n && sorted[r] == nc; r++ {
				j := int(order[r])
				if j <= i {
					continue
				}
				var s float64
				for a, x := range pos[j*dim : (j+1)*dim] {
					t := x - pi[a]
					s += t * t
				}
				if s <= c2 {
					if !f(i, j, math.Sqrt(s)) {
						return
					}
				}
			}
		}
	}
}
