// Package lattice turns a description into a graph: sites with positions,
// weighted bonds and on-site energies, and assembles its sparse Hamiltonian
// (quantum walk) or Laplacian (classical walk). It knows nothing of time.
//
// # Conventions
//
//   - ħ = 1. H = γW + diag(ε): W is the weighted adjacency, Hermitian and
//     possibly complex (a bond's hopping is W·e^{iφ}, H[I][J] = W e^{iφ},
//     H[J][I] = W e^{−iφ}), ε the on-site energies, γ the hopping scale
//     passed to Graph.Hamiltonian. The sign is +.
//   - The classical walk is dp/dt = −γLp with L = D − W (bond weights only;
//     phases and on-site energies play no part), see Graph.Laplacian.
//   - Time is in units of 1/γ; positions are in units of the
//     nearest-neighbour spacing (except where a builder documents a drawing,
//     such as CayleyTree and Complete).
//   - A Graph is immutable. Modifiers (ScaleHopping, Remove, RemoveIf,
//     WithDisorder, WithFlux) return a new Graph, which may share the
//     positions and bond ends of the old one.
//   - Every random draw comes from a *rand.Rand the caller passes in,
//     seeded explicitly: rand.New(rand.NewPCG(seed, stream)). Nothing here
//     uses a global source.
//   - Input a user can get wrong returns an *InputError naming the
//     parameter ("sites", "width", "height", "depth", "side", "generation",
//     "dimension", "variant", "leaves", "coordination", "shells", "weak",
//     "strong", "lambda", "beta", "phase", "hopping", "remove", "onsite",
//     "bond", "law", "flux"), the accepted range and the value received.
//     Before allocating, each builder estimates its memory (EstimateBytes)
//     and refuses with a TooLarge error above fault's memory limit (the
//     AMPWALK_MEMORY_LIMIT environment variable, else 80% of the machine's
//     memory).
//
// # Site order
//
// Each builder fixes and documents its site order; the job format's
// contract fixes the first six.
//
//	Chain(n, p)            site i at (i, 0); bonds i–(i+1), then (n−1)–0 if periodic and n ≥ 3
//	Square(w, h, p)        site x + w·y at (x, y)
//	Triangle(L)            rows from the bottom; site a of row r at (a + r/2, r√3/2)
//	Gasket(g)              recursive: bottom-left copy, bottom-right copy, top copy (GasketCorners)
//	Carpet(g, v)           row-major over kept cell centres (cells) or kept cell corners (corners)
//	Hypercube(d)           site i at the point whose k-th coordinate is bit k of i
//	TriangularPatch(w, h)  site x + w·y at (x + y/2, y√3/2)
//	Honeycomb(w, h)        cell x + w·y: sites A, B; Kagome and Lieb: A, B, C
//	Cubic(w, h, d)         site x + w·(y + h·z) at (x, y, z)
//	Complete(n)            site i at (i, 0)
//	Star(k)                centre 0 at the origin, leaves on the unit circle
//	CayleyTree(z, r)       breadth first, shell r at radius r
//	Vicsek(g)              recursive: bottom, left, centre, right, top copies
//	TFractal(g)            ends of the first bond, then depth-first substitution
//	Fibonacci, Harper      chains, site i at (i, 0)
//
// Periodic lattices wrap a direction only when it is at least 3 long, so
// that no bond is doubled.
//
// # Example
//
// A gasket of generation 2 has 15 sites and 27 bonds; its corners are
// sites 0, 8 and 14:
//
//	g, err := lattice.Gasket(2)
//	if err != nil { … }
//	c, _ := lattice.GasketCorners(2)
//	h := g.Hamiltonian(1)  // CSR, pattern only, H = W
//	l := g.Laplacian(1)    // CSR, L = D − W
//
// Results that may guide fabrication or laboratory work (couplings, times,
// lattice designs) are predictions of an idealised model: calibrate them
// against measurements on the real device, and follow the lab's own safety
// rules.
package lattice
