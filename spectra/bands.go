package spectra

import (
	"math"
	"math/cmplx"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// Hop is a bond of a periodic lattice: from basis site From in the home cell
// to basis site To in the cell displaced by Σ_d Cell[d]·a_d, with weight W.
// Each bond is listed once; its Hermitian partner is implied.
type Hop struct {
	From, To int
	Cell     []int
	W        float64
}

// UnitCell describes a periodic lattice: Dim-dimensional lattice vectors,
// basis sites and the hoppings between cells. Positions are in units of the
// nearest-neighbour spacing.
type UnitCell struct {
	Dim int
	// Vectors holds the lattice vectors a_d, a_d at [d·Dim, (d+1)·Dim).
	Vectors []float64
	// Basis holds the basis positions, site b at [b·Dim, (b+1)·Dim).
	Basis []float64
	Hops  []Hop
	// Onsite energies of the basis sites; nil for zero.
	Onsite []float64
	// Points names high-symmetry wave vectors (Cartesian), e.g. "Γ", "K".
	Points map[string][]float64
}

// Sites returns the number of basis sites.
func (c *UnitCell) Sites() int { return len(c.Basis) / max(c.Dim, 1) }

// validate checks c; errors name "cell.…".
func (c *UnitCell) validate() error {
	d := c.Dim
	if d < 1 || d > 3 {
		return fault.Range("cell.dim", "1, 2 or 3", d)
	}
	if len(c.Vectors) != d*d {
		return fault.New("cell.vectors", "must hold %d vectors of %d coordinates; got %d values", d, d, len(c.Vectors))
	}
	if len(c.Basis) == 0 || len(c.Basis)%d != 0 {
		return fault.New("cell.basis", "must hold whole points of %d coordinates; got %d values", d, len(c.Basis))
	}
	for _, v := range append(append([]float64(nil), c.Vectors...), c.Basis...) {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fault.New("cell", "vectors and basis must be finite; got %v", v)
		}
	}
	if _, ok := invert(c.Vectors, d); !ok {
		return fault.New("cell.vectors", "must be linearly independent; got %v", c.Vectors)
	}
	nb := c.Sites()
	if c.Onsite != nil && len(c.Onsite) != nb {
		return fault.New("cell.onsite", "must have one value per basis site (%d); got %d", nb, len(c.Onsite))
	}
	for i, h := range c.Hops {
		f := "cell.hops[" + strconv.Itoa(i) + "]"
		if h.From < 0 || h.From >= nb || h.To < 0 || h.To >= nb {
			return fault.New(f, "basis indices must be between 0 and %d; got %d → %d", nb-1, h.From, h.To)
		}
		if len(h.Cell) != d {
			return fault.New(f, "cell displacement must have %d integers; got %d", d, len(h.Cell))
		}
		zero := true
		for _, x := range h.Cell {
			zero = zero && x == 0
		}
		if zero && h.From == h.To {
			return fault.New(f, "must not join a site to itself (use cell.onsite); got %d → %d in the home cell", h.From, h.To)
		}
		if math.IsNaN(h.W) || math.IsInf(h.W, 0) {
			return fault.Range(f+".weight", "a finite number", h.W)
		}
	}
	return nil
}

// invert returns the inverse of the d×d row-major matrix a (Gauss–Jordan
// with partial pivoting), ok false when singular.
func invert(a []float64, d int) ([]float64, bool) {
	m := append([]float64(nil), a...)
	inv := make([]float64, d*d)
	for i := 0; i < d; i++ {
		inv[i*d+i] = 1
	}
	scale := 0.0
	for _, v := range a {
		scale = math.Max(scale, math.Abs(v))
	}
	for col := 0; col < d; col++ {
		p := col
		for r := col + 1; r < d; r++ {
			if math.Abs(m[r*d+col]) > math.Abs(m[p*d+col]) {
				p = r
			}
		}
		if !(math.Abs(m[p*d+col]) > 1e-12*scale) {
			return nil, false
		}
		for k := 0; k < d; k++ {
			m[col*d+k], m[p*d+k] = m[p*d+k], m[col*d+k]
			inv[col*d+k], inv[p*d+k] = inv[p*d+k], inv[col*d+k]
		}
		piv := m[col*d+col]
		for k := 0; k < d; k++ {
			m[col*d+k] /= piv
			inv[col*d+k] /= piv
		}
		for r := 0; r < d; r++ {
			if r == col {
				continue
			}
			f := m[r*d+col]
			for k := 0; k < d; k++ {
				m[r*d+k] -= f * m[col*d+k]
				inv[r*d+k] -= f * inv[col*d+k]
			}
		}
	}
	return inv, true
}

// Reciprocal returns the reciprocal vectors b_d (b_i·a_j = 2π δ_ij), b_d at
// [d·Dim, (d+1)·Dim).
func (c *UnitCell) Reciprocal() ([]float64, error) {
	if err := c.validate(); err != nil {
		return nil, err
	}
	d := c.Dim
	inv, _ := invert(c.Vectors, d)
	// Rows of A are the a_i; B = 2π (A⁻¹)ᵀ has the b_j as rows.
	b := make([]float64, d*d)
	for i := 0; i < d; i++ {
		for j := 0; j < d; j++ {
			b[j*d+i] = 2 * math.Pi * inv[i*d+j]
		}
	}
	return b, nil
}

// Bloch returns the Bloch Hamiltonian H(k) of the cell (Hermitian,
// row-major nb×nb) at the Cartesian wave vector k, in the periodic gauge:
// H_ab(k) = Σ_hops γW e^{ik·R} over hops a → b in cell R, plus the Hermitian
// partners and the on-site energies. Eigenvalues do not depend on the gauge.
func (c *UnitCell) Bloch(gamma float64, k []float64) ([]complex128, error) {
	if err := c.validate(); err != nil {
		return nil, err
	}
	if err := checkGamma(gamma); err != nil {
		return nil, err
	}
	if len(k) != c.Dim {
		return nil, fault.New("k", "must have %d components; got %d", c.Dim, len(k))
	}
	return c.bloch(gamma, k), nil
}

func (c *UnitCell) bloch(gamma float64, k []float64) []complex128 {
	nb, d := c.Sites(), c.Dim
	h := make([]complex128, nb*nb)
	for b := 0; b < nb; b++ {
		if c.Onsite != nil {
			h[b*nb+b] = complex(c.Onsite[b], 0)
		}
	}
	for _, hp := range c.Hops {
		var ph float64
		for q := 0; q < d; q++ {
			var r float64
			for p := 0; p < d; p++ {
				r += float64(hp.Cell[p]) * c.Vectors[p*d+q]
			}
			ph += k[q] * r
		}
		z := complex(gamma*hp.W, 0) * cmplx.Exp(complex(0, ph))
		h[hp.From*nb+hp.To] += z
		h[hp.To*nb+hp.From] += cmplx.Conj(z)
	}
	return h
}

// BandPath holds the bands along a path through the Brillouin zone.
type BandPath struct {
	// K holds the wave vectors, Distance the cumulative path length at each.
	K        [][]float64
	Distance []float64
	// Energy[p] holds the nb band energies at K[p], ascending.
	Energy [][]float64
	// Corners gives the index into K of each corner of the path.
	Corners []int
}

// Bands diagonalises H(k) (HermEigen) at perSegment points on each straight
// segment between consecutive corners (Cartesian wave vectors), both ends of
// the path included. Errors name "cell…", "path" and "points".
func Bands(c *UnitCell, gamma float64, corners [][]float64, perSegment int) (BandPath, error) {
	if err := c.validate(); err != nil {
		return BandPath{}, err
	}
	if err := checkGamma(gamma); err != nil {
		return BandPath{}, err
	}
	if len(corners) < 2 {
		return BandPath{}, fault.New("path", "must have at least two corners; got %d", len(corners))
	}
	for i, p := range corners {
		if len(p) != c.Dim {
			return BandPath{}, fault.New("path", "corner %d must have %d components; got %d", i, c.Dim, len(p))
		}
		for _, v := range p {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return BandPath{}, fault.New("path", "corner %d must be finite; got %v", i, p)
			}
		}
	}
	if perSegment < 1 || perSegment > 100000 {
		return BandPath{}, fault.Range("points", "between 1 and 100000", perSegment)
	}
	var bp BandPath
	var dist float64
	add := func(k []float64) error {
		if len(bp.K) > 0 {
			prev := bp.K[len(bp.K)-1]
			var s float64
			for q := range k {
				s += (k[q] - prev[q]) * (k[q] - prev[q])
			}
			dist += math.Sqrt(s)
		}
		nb := c.Sites()
		v, _, err := HermEigen(c.bloch(gamma, k), nb, false)
		if err != nil {
			return err
		}
		bp.K = append(bp.K, k)
		bp.Distance = append(bp.Distance, dist)
		bp.Energy = append(bp.Energy, v)
		return nil
	}
	for s := 0; s+1 < len(corners); s++ {
		a, b := corners[s], corners[s+1]
		bp.Corners = append(bp.Corners, len(bp.K))
		for p := 0; p < perSegment; p++ {
			f := float64(p) / float64(perSegment)
			k := make([]float64, c.Dim)
			for q := range k {
				k[q] = a[q] + f*(b[q]-a[q])
			}
			if err := add(k); err != nil {
				return BandPath{}, err
			}
		}
	}
	bp.Corners = append(bp.Corners, len(bp.K))
	if err := add(append([]float64(nil), corners[len(corners)-1]...)); err != nil {
		return BandPath{}, err
	}
	return bp, nil
}

// Periodic returns the finite periodic lattice of L[0]×…×L[Dim−1] cells
// built from c, site b of cell (n_0, n_1, …) at index b + nb·(n_0 + L_0·n_1 +
// L_0·L_1·n_2) and position basis_b + Σ n_d a_d. Its spectrum is the union
// of the spectra of H(k) over k = Σ_d (m_d/L_d) b_d. Each L_d must be large
// enough that no bond wraps onto another (at least 3 for nearest-neighbour
// cells); lattice.New reports a repeated bond otherwise.
func (c *UnitCell) Periodic(L ...int) (*lattice.Graph, error) {
	if err := c.validate(); err != nil {
		return nil, err
	}
	d, nb := c.Dim, c.Sites()
	if len(L) != d {
		return nil, fault.New("size", "must give %d cell counts; got %d", d, len(L))
	}
	cells := 1
	for i, l := range L {
		if l < 1 || l > 1<<14 {
			return nil, fault.Range("size["+strconv.Itoa(i)+"]", "between 1 and 16384", l)
		}
		cells *= l
	}
	if cells*nb > lattice.MaxSites {
		return nil, fault.Range("size", "at most "+strconv.Itoa(lattice.MaxSites)+" sites", cells*nb)
	}
	n := cells * nb
	pos := make([]float64, n*d)
	idx := make([]int, d)
	var bonds []lattice.Bond
	for cell := 0; cell < cells; cell++ {
		r := cell
		for q := 0; q < d; q++ {
			idx[q] = r % L[q]
			r /= L[q]
		}
		for b := 0; b < nb; b++ {
			s := b + nb*cell
			for q := 0; q < d; q++ {
				x := c.Basis[b*d+q]
				for p := 0; p < d; p++ {
					x += float64(idx[p]) * c.Vectors[p*d+q]
				}
				pos[s*d+q] = x
			}
		}
		for _, h := range c.Hops {
			other, stride := 0, 1
			for q := 0; q < d; q++ {
				m := ((idx[q]+h.Cell[q])%L[q] + L[q]) % L[q]
				other += m * stride
				stride *= L[q]
			}
			bonds = append(bonds, lattice.Bond{I: h.From + nb*cell, J: h.To + nb*other, W: h.W})
		}
	}
	var on []float64
	if c.Onsite != nil {
		on = make([]float64, n)
		for i := range on {
			on[i] = c.Onsite[i%nb]
		}
	}
	g, err := lattice.New(n, d, pos, bonds, on)
	if err != nil {
		return nil, fault.Prefix("cell", err)
	}
	return g, nil
}
