// Package spectra answers static questions about the Hamiltonian of a
// lattice.Graph: its eigenvalues and eigenvectors, densities of states
// (exact histograms, broadened, and the kernel polynomial method for
// millions of sites), level statistics, eigenstate measures, box-counting
// dimensions, Bloch bands of periodic unit cells, spectral dimensions and
// symmetry sectors. It knows nothing of time.
//
// # Conventions
//
// ħ = 1. The Hamiltonian is H = γW + diag(ε), W the weighted (possibly
// complex, Hermitian) adjacency with a plus sign, γ the hopping; the
// classical generator is −γL with L = D − W. Energies carry the units of γ
// (γ = 1 measures them in units of the hopping), times are in units of 1/γ,
// positions in units of the nearest-neighbour spacing. Eigenvalues are ascending; eigenvectors are stored row-major
// with one eigenvector per column (component i of vector k at i·n + k).
// Densities of states are per site: Σ_b Density[b]·Width = 1. Every random
// draw comes from math/rand/v2's PCG with an explicit seed and a stream per
// random vector, so results do not depend on scheduling.
//
// # What is where
//
//   - dense.go: Eigenvalues, Eigensystem, LaplacianEigenvalues of a graph by
//     dense diagonalisation (SymEigen, HermEigen in eigen.go), refused beyond
//     MaxDense sites or the memory limit.
//   - dos.go, kpm.go, bounds.go: densities of states — Histogram,
//     WeightedHistogram and LocalHistogram (exact), Broadened (Lorentzian,
//     Gaussian), KPM, KPMContext and LocalDOS (kernel polynomial method with
//     the Jackson kernel, Weiße et al., Rev. Mod. Phys. 78, 275 (2006)),
//     spectral Bounds from a few Lanczos steps, Counting and DOS.Integrated
//     for integrated densities.
//   - ratio.go: SpacingRatio (mean r̃ with degeneracies counted) and Unfold.
//   - states.go: IPR, Participation and the energy-window map WindowMap.
//   - box.go: BoxDimension, the box-counting dimension of a (weighted) point set,
//     fitted from the spacing scale up to boxes of a quarter of the extent.
//   - dimension.go: spectral dimension from the integrated DOS or from a
//     return-probability series.
//   - bands.go, cells.go: UnitCell, Bloch Hamiltonians, Bands along k paths,
//     Periodic finite lattices; square, triangular, honeycomb, kagome and Lieb cells.
//   - sectors.go, dihedral.go: Sectors of abelian symmetry groups
//     (Translation, Reflection, SquareTranslations, PositionSymmetry) and
//     DihedralSectors adding a reflection that inverts them (D_n of rings,
//     D_3 of gaskets, D_4 of carpets, inversion of periodic lattices).
//
// The gasket graph as lattice.Gasket builds it (corners of degree 2, no
// boundary condition imposed) carries the Neumann spectrum of spectral
// decimation: the normalised Laplacian 4(I − D⁻¹A) of generation 1 has
// {0:1, 3:2, 6:3} (Fukushima & Shima, Potential Anal. 1, 1 (1992)), checked
// in the tests up to generation 2. Its adjacency spectrum is massively
// degenerate, which SpacingRatio counts and leaves out.
//
// # Example
//
// The density of states of a gasket, exactly and by KPM, and its level
// statistics:
//
//	g, _ := lattice.Gasket(6)                      // 1095 sites
//	v, _ := spectra.Eigenvalues(g, 1)              // ascending, dense
//	exact, _ := spectra.Histogram(v, 100)          // {Energy, Density}
//	kpm, _ := spectra.KPM(g.Hamiltonian(1), spectra.KPMSettings{Moments: 512, Vectors: 10, Seed: 1, Bins: 100})
//	r := spectra.SpacingRatio(v, 1e-9)             // r.Mean, r.Used, r.Degenerate
//	box, _ := spectra.BoxDimension(g.Coords(), g.Dim(), nil)
//
// Spectra of lattices predict device behaviour only as well as the couplings
// fed in: predicted couplings and energies must be calibrated against
// measurements on the real device, and the lab's own safety rules apply to
// any experiment planned from them.
//
// User input outside its accepted range returns an *InputError naming the
// field ("dos.bins", "dos.moments", "dos.vectors" …), the accepted range and
// the value received; jobs too large for dense methods return one of kind
// too-large.
package spectra
