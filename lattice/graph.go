package lattice

import (
	"math"
	"sort"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/internal/sparse"
)

// InputError is the error returned for input outside its accepted range. It
// names the field, the accepted range and the value received.
type InputError = fault.Error

// Bond is an undirected bond between sites I and J (I ≠ J). Its hopping is
// W·e^{iPhase}: H[I][J] = W e^{iφ} and H[J][I] = W e^{−iφ}.
type Bond struct {
	I, J  int
	W     float64
	Phase float64
}

// Graph is a set of N sites with positions in Dim dimensions, weighted bonds
// and on-site energies. Its Hamiltonian is H = W + diag(ε), W the weighted
// (possibly complex, Hermitian) adjacency. A Graph is immutable: modifiers
// return a new Graph.
//
// Storage is compact (int32 bond ends, weights and phases only when they
// are not all 1 and 0) so that graphs of 10⁷ sites fit comfortably.
type Graph struct {
	n, dim int
	pos    []float64 // n·dim, site i at pos[i*dim : (i+1)*dim]
	bi, bj []int32
	w      []float64 // nil: every weight is 1
	phase  []float64 // nil: every phase is 0
	onsite []float64 // nil: every on-site energy is 0
}

// Len returns the number of sites.
func (g *Graph) Len() int { return g.n }

// Dim returns the number of coordinates of each position.
func (g *Graph) Dim() int { return g.dim }

// NumBonds returns the number of bonds.
func (g *Graph) NumBonds() int { return len(g.bi) }

// Bond returns bond k.
func (g *Graph) Bond(k int) Bond {
	b := Bond{I: int(g.bi[k]), J: int(g.bj[k]), W: 1}
	if g.w != nil {
		b.W = g.w[k]
	}
	if g.phase != nil {
		b.Phase = g.phase[k]
	}
	return b
}

// Pos returns the position of site i in dst (allocated when nil or short).
func (g *Graph) Pos(dst []float64, i int) []float64 {
	if cap(dst) < g.dim {
		dst = make([]float64, g.dim)
	}
	dst = dst[:g.dim]
	copy(dst, g.pos[i*g.dim:(i+1)*g.dim])
	return dst
}

// Coords returns all positions as one slice of length Len()·Dim(), site i at
// [i·Dim, (i+1)·Dim). It is the Graph's own storage: do not modify it.
func (g *Graph) Coords() []float64 { return g.pos }

// Onsite returns the on-site energy of site i.
func (g *Graph) Onsite(i int) float64 {
	if g.onsite == nil {
		return 0
	}
	return g.onsite[i]
}

// IsReal reports whether every hopping is real (no Peierls phases).
func (g *Graph) IsReal() bool { return g.phase == nil }

// Nearest returns the site whose position is nearest to p (Euclidean), ties to
// the lowest index. It returns an error when len(p) ≠ Dim().
func (g *Graph) Nearest(p []float64) (int, error) {
	if len(p) != g.dim {
		return 0, fault.New("near", "must have %d coordinates (the lattice's dimension); got %d", g.dim, len(p))
	}
	for _, v := range p {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fault.Range("near", "finite coordinates", p)
		}
	}
	best, bd := 0, math.Inf(1)
	for i := 0; i < g.n; i++ {
		var d float64
		for k, x := range g.pos[i*g.dim : (i+1)*g.dim] {
			t := x - p[k]
			d += t * t
		}
		if d < bd {
			best, bd = i, d
		}
	}
	return best, nil
}

// New returns the graph with n sites, positions pos (n·dim values, site i at
// [i·dim, (i+1)·dim); nil places site i at (i, 0, …) when dim ≥ 1), the bonds
// and the on-site energies (nil for zero). Each undirected bond is listed
// once. New validates everything and returns an *InputError naming the field:
// "sites", "positions", "bonds[k]", "onsite[i]".
func New(n, dim int, pos []float64, bonds []Bond, onsite []float64) (*Graph, error) {
	if n < 1 || n > MaxSites {
		return nil, fault.Range("sites", "between 1 and "+strconv.Itoa(MaxSites), n)
	}
	if dim < 1 || dim > 64 {
		return nil, fault.Range("positions", "points with 1 to 64 coordinates", dim)
	}
	if pos == nil {
		pos = make([]float64, n*dim)
		for i := 0; i < n; i++ {
			pos[i*dim] = float64(i)
		}
	} else {
		if len(pos) != n*dim {
			return nil, fault.New("positions", "must hold %d points of %d coordinates (%d values); got %d values", n, dim, n*dim, len(pos))
		}
		for k, v := range pos {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fault.New("positions", "must be finite; point %d has %v", k/dim, v)
			}
		}
		pos = append([]float64(nil), pos...)
	}
	if onsite != nil {
		if len(onsite) != n {
			return nil, fault.New("onsite", "must have one value per site (%d); got %d", n, len(onsite))
		}
		for i, v := range onsite {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fault.Range("onsite["+strconv.Itoa(i)+"]", "a finite number", v)
			}
		}
		onsite = append([]float64(nil), onsite...)
	}
	g := &Graph{n: n, dim: dim, pos: pos, onsite: onsite,
		bi: make([]int32, len(bonds)), bj: make([]int32, len(bonds))}
	var w, ph []float64
	for k, b := range bonds {
		f := "bonds[" + strconv.Itoa(k) + "]"
		switch {
		case b.I < 0 || b.I >= n || b.J < 0 || b.J >= n:
			return nil, fault.New(f, "site indices must be between 0 and %d; got [%d, %d]", n-1, b.I, b.J)
		case b.I == b.J:
			return nil, fault.New(f, "must join two different sites; got a self-loop on site %d (use onsite for diagonal terms)", b.I)
		case math.IsNaN(b.W) || math.IsInf(b.W, 0):
			return nil, fault.Range(f+".weight", "a finite number", b.W)
		case math.IsNaN(b.Phase) || math.IsInf(b.Phase, 0):
			return nil, fault.Range(f+".phase", "a finite number", b.Phase)
		}
		g.bi[k], g.bj[k] = int32(b.I), int32(b.J)
		if b.W != 1 && w == nil {
			w = make([]float64, len(bonds))
			for q := range k {
				w[q] = 1
			}
		}
		if w != nil {
			w[k] = b.W
		}
		if b.Phase != 0 && ph == nil {
			ph = make([]float64, len(bonds))
		}
		if ph != nil {
			ph[k] = b.Phase
		}
	}
	g.w, g.phase = w, ph
	if k1, k2, ok := g.duplicate(); ok {
		b := g.Bond(k2)
		return nil, fault.New("bonds["+strconv.Itoa(k2)+"]", "each bond must be listed once; [%d, %d] repeats bonds[%d]", b.I, b.J, k1)
	}
	return g, nil
}

// MaxSites is the largest number of sites a Graph may have (int32 indices
// and a CSR with at most 2³¹−1 stored entries).
const MaxSites = 1 << 28

// duplicate finds two bonds joining the same pair of sites.
func (g *Graph) duplicate() (int, int, bool) {
	m := len(g.bi)
	idx := make([]int32, m)
	for k := range idx {
		idx[k] = int32(k)
	}
	key := func(k int32) uint64 {
		a, b := g.bi[k], g.bj[k]
		if a > b {
			a, b = b, a
		}
		return uint64(a)<<32 | uint64(b)
	}
	sort.Slice(idx, func(x, y int) bool {
		kx, ky := key(idx[x]), key(idx[y])
		if kx != ky {
			return kx < ky
		}
		return idx[x] < idx[y]
	})
	for k := 1; k < m; k++ {
		if key(idx[k]) == key(idx[k-1]) {
			return int(idx[k-1]), int(idx[k]), true
		}
	}
	return 0, 0, false
}

// Hamiltonian returns H = γ·W + diag(ε) as a CSR matrix with sorted columns.
// Unit weights with no phases give a pattern-only matrix (Val == nil).
func (g *Graph) Hamiltonian(gamma float64) *sparse.CSR {
	m := g.csr(false)
	if m.Val == nil {
		m.Unit = gamma
	} else {
		for k := range m.Val {
			m.Val[k] *= gamma
		}
	}
	for k := range m.Imag {
		m.Imag[k] *= gamma
	}
	if g.onsite != nil {
		m.Diag = append([]float64(nil), g.onsite...)
	}
	m.DetectGrid() // open square lattices and chains: matrix-free products
	return m
}

// Laplacian returns γ·L with L = D − W the weighted graph Laplacian
// (D_ii = Σ_j w_ij). Phases and on-site energies play no part: the classical
// walk dp/dt = −γLp sees only the bond weights.
func (g *Graph) Laplacian(gamma float64) *sparse.CSR {
	m := g.csr(true)
	deg := make([]float64, g.n)
	for i := 0; i < g.n; i++ {
		for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
			v := 1.0
			if m.Val != nil {
				v = m.Val[k]
			}
			deg[i] += v
		}
	}
	if m.Val == nil {
		m.Unit = -gamma
	} else {
		for k := range m.Val {
			m.Val[k] *= -gamma
		}
	}
	for i := range deg {
		deg[i] *= gamma
	}
	m.Diag = deg
	m.DetectGrid() // open square lattices and chains: matrix-free products
	return m
}

// csr assembles the weighted adjacency; real drops phases.
func (g *Graph) csr(real bool) *sparse.CSR {
	n := g.n
	rp := make([]int32, n+1)
	for k := range g.bi {
		rp[g.bi[k]+1]++
		rp[g.bj[k]+1]++
	}
	for i := 0; i < n; i++ {
		rp[i+1] += rp[i]
	}
	nnz := rp[n]
	col := make([]int32, nnz)
	var val, im []float64
	if g.w != nil {
		val = make([]float64, nnz)
	}
	complexH := g.phase != nil && !real
	if complexH {
		im = make([]float64, nnz)
		if val == nil {
			val = make([]float64, nnz)
		}
	}
	next := append([]int32(nil), rp[:n]...)
	put := func(i, j int32, k int, conj bool) {
		p := next[i]
		next[i]++
		col[p] = j
		w := 1.0
		if g.w != nil {
			w = g.w[k]
		}
		if complexH {
			s, c := math.Sincos(g.phase[k])
			if conj {
				s = -s
			}
			val[p], im[p] = w*c, w*s
		} else if val != nil {
			val[p] = w
		}
	}
	for k := range g.bi {
		put(g.bi[k], g.bj[k], k, false)
		put(g.bj[k], g.bi[k], k, true)
	}
	m := &sparse.CSR{N: n, RowPtr: rp, Col: col, Val: val, Imag: im, Unit: 1}
	sortRows(m)
	return m
}

// sortRows orders each row's columns ascending (values follow).
func sortRows(m *sparse.CSR) {
	for i := 0; i < m.N; i++ {
		a, b := m.RowPtr[i], m.RowPtr[i+1]
		r := rowSorter{m.Col[a:b], nil, nil}
		if m.Val != nil {
			r.v = m.Val[a:b]
		}
		if m.Imag != nil {
			r.im = m.Imag[a:b]
		}
		if b-a <= 32 {
			r.insertionSort() // no interface boxing: rows of lattices are short
		} else if !sort.IsSorted(r) {
			sort.Sort(r)
		}
	}
}

type rowSorter struct {
	c     []int32
	v, im []float64
}

func (r rowSorter) Len() int           { return len(r.c) }
func (r rowSorter) Less(a, b int) bool { return r.c[a] < r.c[b] }
func (r rowSorter) Swap(a, b int) {
	r.c[a], r.c[b] = r.c[b], r.c[a]
	if r.v != nil {
		r.v[a], r.v[b] = r.v[b], r.v[a]
	}
	if r.im != nil {
		r.im[a], r.im[b] = r.im[b], r.im[a]
	}
}

// insertionSort orders r by column without going through sort.Interface
// (which allocates per row); it is for short rows. It is stable and leaves
// sorted rows untouched.
func (r rowSorter) insertionSort() {
	for a := 1; a < len(r.c); a++ {
		for b := a; b > 0 && r.c[b] < r.c[b-1]; b-- {
			r.Swap(b, b-1)
		}
	}
}
