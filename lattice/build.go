package lattice

// builder accumulates sites and bonds for the generators in this package,
// which construct valid graphs by design and so skip New's O(m log m)
// duplicate check. Every generator's test checks its counts and that New
// accepts its bonds.
type builder struct {
	n, dim int
	pos    []float64
	bi, bj []int32
}

func newBuilder(n, dim, bondsHint int) *builder {
	return &builder{n: n, dim: dim, pos: make([]float64, n*dim),
		bi: make([]int32, 0, bondsHint), bj: make([]int32, 0, bondsHint)}
}

// at sets the position of site i.
func (b *builder) at(i int, x ...float64) { copy(b.pos[i*b.dim:], x) }

// bond adds the unit bond i–j.
func (b *builder) bond(i, j int) {
	b.bi = append(b.bi, int32(i))
	b.bj = append(b.bj, int32(j))
}

func (b *builder) graph() *Graph {
	return &Graph{n: b.n, dim: b.dim, pos: b.pos, bi: b.bi, bj: b.bj}
}
