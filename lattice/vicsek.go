package lattice

// MaxVicsekGeneration is the largest generation Vicsek accepts (5¹²
// sites); the memory estimate may refuse less.
const MaxVicsekGeneration = 12

// Vicsek returns the Vicsek fractal graph (cross variant) of generation g:
// in the 3^g × 3^g square with its lower-left corner at (0, 0), the unit
// cell (x, y) is kept when, for every k, the k-th base-3 digits of x and y
// are not both different from 1 (a cross of five cells at every scale).
// A site sits at the centre (x+0.5, y+0.5) of every kept cell and kept
// cells sharing an edge are bonded: 5^g sites and 5^g − 1 bonds (a tree),
// fractal dimension ln5/ln3.
//
// Site order is recursive. Generation 0 is one site at (0.5, 0.5).
// Generation g+1 is five copies of generation g (side s = 3^g), each in its
// own order, copy by copy: bottom (shifted by (s, 0)), left (0, s), centre
// (s, s), right (2s, s), top (s, 2s). Bonds are the copies' bonds, copy by
// copy, followed by the four bonds joining the centre copy to the bottom,
// left, right and top copies (each between the mid-edge sites that face
// each other). Parameters: "generation" g between 0 and
// MaxVicsekGeneration.
func Vicsek(g int) (*Graph, error) {
	if err := checkInt("generation", g, 0, MaxVicsekGeneration); err != nil {
		return nil, err
	}
	n := ipow(5, g)
	if err := checkSize("generation", float64(n), float64(n-1), 2); err != nil {
		return nil, err
	}
	b := newBuilder(n, 2, n-1)
	b.bi, b.bj = b.bi[:n-1], b.bj[:n-1]
	pos := b.pos
	pos[0], pos[1] = 0.5, 0.5
	// tip holds the sites at the middle of the left, right, bottom and top
	// edges of the current generation.
	const left, right, bottom, top = 0, 1, 2, 3
	var tip [4]int32
	nk, mk := int32(1), int32(0)
	s := 1.0
	for k := 0; k < g; k++ {
		off := [5][2]float64{{s, 0}, {0, s}, {s, s}, {2 * s, s}, {s, 2 * s}}
		for c := int32(1); c < 5; c++ { // copy 0 is the current generation, shifted below
			for i := int32(0); i < nk; i++ {
				j := c*nk + i
				pos[2*j] = pos[2*i] + off[c][0]
				pos[2*j+1] = pos[2*i+1] + off[c][1]
			}
			for q := int32(0); q < mk; q++ {
				b.bi[c*mk+q], b.bj[c*mk+q] = b.bi[q]+c*nk, b.bj[q]+c*nk
			}
		}
		for i := int32(0); i < nk; i++ {
			pos[2*i] += off[0][0]
		}
		const cb, cl, cc, cr, ct = 0, 1, 2, 3, 4 // copy numbers
		q := 5 * mk
		join := func(c1 int32, t1 int, c2 int32, t2 int) {
			b.bi[q], b.bj[q] = c1*nk+tip[t1], c2*nk+tip[t2]
			q++
		}
		join(cc, bottom, cb, top)
		join(cc, left, cl, right)
		join(cc, right, cr, left)
		join(cc, top, ct, bottom)
		tip = [4]int32{cl*nk + tip[left], cr*nk + tip[right], cb*nk + tip[bottom], ct*nk + tip[top]}
		nk, mk = 5*nk, 5*mk+4
		s *= 3
	}
	return b.graph(), nil
}
