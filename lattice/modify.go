package lattice

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// ScaleHopping returns a copy of g with every bond weight multiplied by s
// (phases and on-site energies unchanged). The copy shares g's positions
// and bond ends; both graphs are immutable. Parameters: "hopping" s finite
// and non-zero.
func (g *Graph) ScaleHopping(s float64) (*Graph, error) {
	if err := checkHopping("hopping", s); err != nil {
		return nil, err
	}
	h := *g
	if s == 1 {
		return &h, nil
	}
	h.w = make([]float64, len(g.bi))
	for k := range h.w {
		w := 1.0
		if g.w != nil {
			w = g.w[k]
		}
		h.w[k] = s * w
	}
	return &h, nil
}

// Remove returns g without the listed sites (holes, vacancies) and the
// bonds that touch them. Survivors keep their relative order and are
// renumbered 0, 1, …; kept[i] is the original index of new site i. Bonds
// keep their relative order, weights and phases; on-site energies and
// positions follow their sites. An empty list returns a copy of g. Errors
// (field "remove") for an index outside [0, Len()), an index listed twice,
// or a list that removes every site.
func (g *Graph) Remove(sites []int) (h *Graph, kept []int, err error) {
	drop := make([]bool, g.n)
	for k, i := range sites {
		if i < 0 || i >= g.n {
			return nil, nil, fault.New("remove", "site indices must be between 0 and %d; entry %d is %d", g.n-1, k, i)
		}
		if drop[i] {
			return nil, nil, fault.New("remove", "each site may be listed once; entry %d repeats site %d", k, i)
		}
		drop[i] = true
	}
	return g.removeMask(drop, len(sites))
}

// RemoveIf returns g without the sites for which drop(i, pos) is true, pos
// being site i's position (a buffer reused between calls: do not retain
// it), and kept as for Remove. drop is called once per site in index
// order. Errors (field "remove") when drop is nil or drops every site.
func (g *Graph) RemoveIf(drop func(i int, pos []float64) bool) (h *Graph, kept []int, err error) {
	if drop == nil {
		return nil, nil, fault.New("remove", "needs a predicate; got nil")
	}
	mask := make([]bool, g.n)
	p := make([]float64, g.dim)
	count := 0
	for i := range mask {
		copy(p, g.pos[i*g.dim:(i+1)*g.dim])
		if drop(i, p) {
			mask[i] = true
			count++
		}
	}
	return g.removeMask(mask, count)
}

// removeMask removes the count sites marked in drop.
func (g *Graph) removeMask(drop []bool, count int) (*Graph, []int, error) {
	if count >= g.n {
		return nil, nil, fault.New("remove", "must leave at least one site; it removes all %d", g.n)
	}
	n := g.n - count
	kept := make([]int, 0, n)
	index := make([]int32, g.n) // new index, −1 for removed sites
	for i, d := range drop {
		index[i] = -1
		if !d {
			index[i] = int32(len(kept))
			kept = append(kept, i)
		}
	}
	h := &Graph{n: n, dim: g.dim, pos: make([]float64, n*g.dim)}
	for a, i := range kept {
		copy(h.pos[a*g.dim:(a+1)*g.dim], g.pos[i*g.dim:(i+1)*g.dim])
	}
	if g.onsite != nil {
		h.onsite = make([]float64, n)
		for a, i := range kept {
			h.onsite[a] = g.onsite[i]
		}
	}
	m := 0
	for k := range g.bi {
		if index[g.bi[k]] >= 0 && index[g.bj[k]] >= 0 {
			m++
		}
	}
	h.bi, h.bj = make([]int32, 0, m), make([]int32, 0, m)
	if g.w != nil {
		h.w = make([]float64, 0, m)
	}
	if g.phase != nil {
		h.phase = make([]float64, 0, m)
	}
	for k := range g.bi {
		a, b := index[g.bi[k]], index[g.bj[k]]
		if a < 0 || b < 0 {
			continue
		}
		h.bi, h.bj = append(h.bi, a), append(h.bj, b)
		if g.w != nil {
			h.w = append(h.w, g.w[k])
		}
		if g.phase != nil {
			h.phase = append(h.phase, g.phase[k])
		}
	}
	return h, kept, nil
}

// isFinite reports whether v is neither NaN nor infinite.
func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
