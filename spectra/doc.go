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
// classical generator is −γL with L = D − W. Energies are in units of γ when
// γ = 1, times in units of 1/γ, positions in units of the nearest-neighbour
// spacing. Eigenvalues are ascending; eigenvectors are stored row-major
// with one eigenvector per column (component i of vector k at i·n + k).
// Densities of states are per site: Σ_b Density[b]·Width = 1. Every random
// draw comes from math/rand/v2's PCG with an explicit seed and a stream per
// random vector, so results do not depend on scheduling.
//
// User input outside its accepted range returns an *InputError naming the
// field ("dos.bins", "dos.moments", "dos.vectors" …), the accepted range and
// the value received; jobs too large for dense methods return one of kind
// too-large.
package spectra
