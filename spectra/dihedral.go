package spectra

import (
	"math"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/internal/sparse"
	"github.com/ampwalk/ampwalk/lattice"
)

// DihedralSectors reduces H with the generalised dihedral group generated
// by the commuting symmetries syms and a reflection σ (σ² = 1) that inverts
// each of them: σ g_j σ = g_j⁻¹. Examples: a ring's translation with its
// mirror (D_n), the 120° rotation of a gasket with a mirror through a
// corner (D_3), the 90° rotation of a carpet with a mirror (D_4), the
// translations of a periodic square lattice with the inversion through a
// site.
//
// σ maps sector q of the abelian group to sector −q. A pair q ≠ −q carries
// the same spectrum twice (two-dimensional irreducible representations):
// only the lexicographically smaller label is returned, with Copies = 2. A
// self-conjugate sector (q = −q) is split by σ into Parity +1 and −1
// sectors, ψ(σ(i)) = Parity·ψ(i). The union of the sector spectra, each
// level counted Copies times, is the full spectrum, and level statistics
// within one returned sector see no symmetry-induced degeneracy.
//
// Errors as for Sectors, plus "reflection" when σ is not an involution, does
// not leave H invariant or does not invert every generator.
func DihedralSectors(g *lattice.Graph, gamma float64, syms []Symmetry, reflection Symmetry, vectors bool) ([]Sector, error) {
	if err := checkGamma(gamma); err != nil {
		return nil, err
	}
	n := g.Len()
	if len(syms) == 0 {
		return nil, fault.New("symmetry", "must list at least one symmetry")
	}
	orders, err := checkSymmetries(g, syms)
	if err != nil {
		return nil, err
	}
	sig := reflection.Perm
	if _, err := permOrder(sig, n); err != nil {
		return nil, fault.Prefix("reflection", err)
	}
	for i := 0; i < n; i++ {
		if sig[sig[i]] != i {
			return nil, fault.New("reflection", "must be an involution (σ² = 1); σ(σ(%d)) = %d", i, sig[sig[i]])
		}
	}
	if err := invariant(g, sig); err != nil {
		return nil, fault.Prefix("reflection", err)
	}
	for j, s := range syms {
		p := s.Perm
		for i := 0; i < n; i++ {
			// σ g σ = g⁻¹  ⇔  g(σ(g(σ(i)))) = i.
			if p[sig[p[sig[i]]]] != i {
				return nil, fault.New("reflection", "must invert symmetry[%d] (%s): σgσ ≠ g⁻¹ on site %d", j, s.Name, i)
			}
		}
	}
	limit := fault.MemoryLimit()
	if vectors {
		if b := 16 * int64(n) * int64(n); b > limit {
			return nil, fault.Large("lattice", b, limit)
		}
	}
	orb := orbits(syms, orders, n)
	h := g.Hamiltonian(gamma)
	r := len(syms)
	var out []Sector
	q := make([]int, r)
	neg := make([]int, r)
	for {
		for j := range q {
			neg[j] = (orders[j] - q[j]) % orders[j]
		}
		switch c := compareLabels(neg, q); {
		case c > 0: // q < −q: one sector for the pair
			sec, err := sector(h, orb, orders, q, vectors, limit)
			if err != nil {
				return nil, err
			}
			if sec != nil {
				sec.Copies = 2
				out = append(out, *sec)
			}
		case c == 0: // self-conjugate: split by σ
			secs, err := splitSector(h, orb, orders, q, sig, vectors, limit)
			if err != nil {
				return nil, err
			}
			out = append(out, secs...)
		}
		j := r - 1
		for ; j >= 0; j-- {
			q[j]++
			if q[j] < orders[j] {
				break
			}
			q[j] = 0
		}
		if j < 0 {
			return out, nil
		}
	}
}

func compareLabels(a, b []int) int {
	for j := range a {
		if a[j] != b[j] {
			if a[j] < b[j] {
				return -1
			}
			return 1
		}
	}
	return 0
}

// splitSector diagonalises the self-conjugate sector q separately on the
// even and odd subspaces of σ. σ maps the basis vector of orbit b to
// s_b times that of orbit b' = orbit of σ(rep_b), with the real sign
// s_b = χ_q(a_{σ(rep_b)}) (σ g^a = g^{−a} σ and χ_q real).
func splitSector(h *sparse.CSR, o *orbitSet, orders, q, sig []int, vectors bool, limit int64) ([]Sector, error) {
	idx, d := admissible(o, orders, q)
	if d == 0 {
		return nil, nil
	}
	if err := checkBlock(d, vectors, limit); err != nil {
		return nil, err
	}
	blk := block(h, o, orders, q, idx, d)
	// Columns of U_± as (basis index, coefficient) pairs.
	type term struct {
		i int
		c float64
	}
	var cols [2][][]term // [0] even, [1] odd
	for b, rep := range o.rep {
		i := idx[b]
		if i < 0 {
			continue
		}
		t := sig[rep]
		bp := o.of[t]
		ip := idx[bp]
		sb := math.Cos(2 * math.Pi * phase(o.exp[t], q, orders)) // ±1
		sb = math.Copysign(1, sb)
		switch {
		case ip == i:
			if sb > 0 {
				cols[0] = append(cols[0], []term{{i, 1}})
			} else {
				cols[1] = append(cols[1], []term{{i, 1}})
			}
		case ip > i:
			r := 1 / math.Sqrt2
			cols[0] = append(cols[0], []term{{i, r}, {ip, sb * r}})
			cols[1] = append(cols[1], []term{{i, r}, {ip, -sb * r}})
		}
	}
	var out []Sector
	for p, cs := range cols {
		k := len(cs)
		if k == 0 {
			continue
		}
		sub := make([]complex128, k*k)
		for a, ca := range cs {
			for b, cb := range cs {
				var z complex128
				for _, x := range ca {
					for _, y := range cb {
						z += complex(x.c*y.c, 0) * blk[x.i*d+y.i]
					}
				}
				sub[a*k+b] = z
			}
		}
		vals, vecs, err := HermEigen(sub, k, vectors)
		if err != nil {
			return nil, err
		}
		sec := Sector{Label: append([]int(nil), q...), Orders: append([]int(nil), orders...),
			Values: vals, Copies: 1, Parity: 1 - 2*p}
		if vectors {
			// Coefficients in the orbit basis: U·vecs (d×k).
			c := make([]complex128, d*k)
			for a, ca := range cs {
				for _, x := range ca {
					for v := 0; v < k; v++ {
						c[x.i*k+v] += complex(x.c, 0) * vecs[a*k+v]
					}
				}
			}
			sec.Vectors = expand(h.N, o, orders, q, idx, c, d, k)
		}
		out = append(out, sec)
	}
	return out, nil
}

// checkSymmetries validates commuting site permutations leaving H invariant
// and returns their orders; errors name "symmetry[j]".
func checkSymmetries(g *lattice.Graph, syms []Symmetry) ([]int, error) {
	n := g.Len()
	orders := make([]int, len(syms))
	size := 1
	for j, s := range syms {
		f := "symmetry[" + strconv.Itoa(j) + "]"
		m, err := permOrder(s.Perm, n)
		if err != nil {
			return nil, fault.Prefix(f, err)
		}
		orders[j] = m
		size *= m
		if size > 1<<20 {
			return nil, fault.New("symmetry", "the group may have at most 1048576 elements; the orders %v exceed it", orders[:j+1])
		}
		if err := invariant(g, s.Perm); err != nil {
			return nil, fault.Prefix(f, err)
		}
		for k := 0; k < j; k++ {
			q := syms[k].Perm
			for i := 0; i < n; i++ {
				if s.Perm[q[i]] != q[s.Perm[i]] {
					return nil, fault.New(f, "must commute with symmetry[%d] (%s); they differ on site %d", k, syms[k].Name, i)
				}
			}
		}
	}
	return orders, nil
}
