package lattice

// MaxHypercubeDimension is the largest dimension Hypercube accepts
// (2²⁶ sites); the memory estimate may refuse less.
const MaxHypercubeDimension = 26

// Hypercube returns the d-dimensional hypercube graph Q_d: 2^d sites and
// d·2^(d−1) bonds, site i bonded to i XOR 2^k for k = 0 … d−1. Site i sits
// at the d-dimensional point whose k-th coordinate is bit k of i, so the
// squared distance between two sites is their Hamming distance. Bonds are
// listed site by site in index order, each site i listing i–(i | 2^k) for
// the k (ascending) whose bit is 0 in i. Parameters: "dimension" d between
// 1 and MaxHypercubeDimension.
func Hypercube(d int) (*Graph, error) {
	if err := checkInt("dimension", d, 1, MaxHypercubeDimension); err != nil {
		return nil, err
	}
	n := 1 << d
	m := d * n / 2
	if err := checkSize("dimension", float64(n), float64(m), d); err != nil {
		return nil, err
	}
	b := newBuilder(n, d, m)
	for i := 0; i < n; i++ {
		p := b.pos[i*d : (i+1)*d]
		for k := 0; k < d; k++ {
			if i&(1<<k) != 0 {
				p[k] = 1
			} else {
				b.bond(i, i|1<<k)
			}
		}
	}
	return b.graph(), nil
}
