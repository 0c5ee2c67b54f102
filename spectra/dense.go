package spectra

import (
	"math"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// MaxDense is the largest number of sites Eigenvalues and Eigensystem accept.
// Beyond it a full diagonalisation takes hours in pure Go; use the kernel
// polynomial method (KPM) for densities of states, or symmetry sectors.
const MaxDense = 20000

// Eigen is the full eigen-decomposition of a Hermitian H = γW + diag(ε).
//
// Values are ascending. For a real H the eigenvectors are in Real and
// Complex is nil; otherwise Complex holds them. Either way component i of
// eigenvector k is at index i·N + k (row-major, one eigenvector per column).
type Eigen struct {
	N       int
	Values  []float64
	Real    []float64
	Complex []complex128
}

// Weight returns |ψ_k(i)|², the probability of eigenstate k on site i.
func (e *Eigen) Weight(i, k int) float64 {
	if e.Real != nil {
		v := e.Real[i*e.N+k]
		return v * v
	}
	z := e.Complex[i*e.N+k]
	return real(z)*real(z) + imag(z)*imag(z)
}

// denseBytes estimates the peak memory of a dense diagonalisation of n
// sites, in units of n² float64 values: the matrix (1 real, 2 complex); with
// vectors, the tridiagonal eigenvectors, the back-transformation and the
// divide-and-conquer workspace (3 in all for a real H, 9 for a complex one,
// whose Householder vectors and real/imaginary planes are held separately).
func denseBytes(n int, isReal, vectors bool) int64 {
	// Peak float64 counts measured for SymEigen/HermEigen: real with vectors
	// 3n² + 512n (4n² for n ≤ 512), real values only n², complex with vectors
	// 7n² + 512n, complex values only 4n².
	units := int64(4)
	switch {
	case isReal && vectors:
		units = 3
		if n <= 512 {
			units = 4
		}
	case isReal:
		units = 1
	case vectors:
		units = 9
	}
	return units*int64(n)*int64(n)*8 + 512*8*int64(n)
}

// checkDense refuses graphs too large for a dense diagonalisation.
func checkDense(g *lattice.Graph, vectors bool) error {
	n := g.Len()
	if n > MaxDense {
		return &fault.Error{Kind: fault.TooLarge, Field: "lattice",
			Msg: "a dense diagonalisation accepts at most " + strconv.Itoa(MaxDense) +
				" sites; got " + strconv.Itoa(n) + " (use the kernel polynomial method for the density of states)"}
	}
	if b, lim := denseBytes(n, g.IsReal(), vectors), fault.MemoryLimit(); b > lim {
		return fault.Large("lattice", b, lim)
	}
	return nil
}

func checkGamma(gamma float64) error {
	if math.IsNaN(gamma) || math.IsInf(gamma, 0) {
		return fault.Range("hopping", "a finite number", gamma)
	}
	return nil
}

// DenseReal returns H = γW + diag(ε) of g as a row-major n×n real matrix. It
// panics if g carries Peierls phases (check g.IsReal first).
func DenseReal(g *lattice.Graph, gamma float64) []float64 {
	if !g.IsReal() {
		panic("spectra: DenseReal of a complex Hamiltonian")
	}
	n := g.Len()
	a := make([]float64, n*n)
	for i := 0; i < n; i++ {
		a[i*n+i] = g.Onsite(i)
	}
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		a[b.I*n+b.J] += gamma * b.W
		a[b.J*n+b.I] += gamma * b.W
	}
	return a
}

// DenseComplex returns H = γW + diag(ε) of g as a row-major n×n complex
// matrix: H[I][J] = γ W e^{iφ} and H[J][I] its conjugate for each bond.
func DenseComplex(g *lattice.Graph, gamma float64) []complex128 {
	n := g.Len()
	a := make([]complex128, n*n)
	for i := 0; i < n; i++ {
		a[i*n+i] = complex(g.Onsite(i), 0)
	}
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		s, c := math.Sincos(b.Phase)
		h := complex(gamma*b.W*c, gamma*b.W*s)
		a[b.I*n+b.J] += h
		a[b.J*n+b.I] += complex(real(h), -imag(h))
	}
	return a
}

// Eigenvalues returns the eigenvalues of H = γW + diag(ε) of g in ascending
// order by dense diagonalisation: O(n²) memory, O(n³) time. It refuses with
// a too-large *InputError when n exceeds MaxDense or the memory estimate
// exceeds fault.MemoryLimit().
func Eigenvalues(g *lattice.Graph, gamma float64) ([]float64, error) {
	if err := checkGamma(gamma); err != nil {
		return nil, err
	}
	if err := checkDense(g, false); err != nil {
		return nil, err
	}
	if g.IsReal() {
		v, _, err := SymEigen(DenseReal(g, gamma), g.Len(), false)
		return v, err
	}
	v, _, err := HermEigen(DenseComplex(g, gamma), g.Len(), false)
	return v, err
}

// Eigensystem returns the eigenvalues (ascending) and orthonormal
// eigenvectors of H = γW + diag(ε) of g. Limits as for Eigenvalues, with
// twice the memory.
func Eigensystem(g *lattice.Graph, gamma float64) (*Eigen, error) {
	if err := checkGamma(gamma); err != nil {
		return nil, err
	}
	if err := checkDense(g, true); err != nil {
		return nil, err
	}
	n := g.Len()
	if g.IsReal() {
		v, z, err := SymEigen(DenseReal(g, gamma), n, true)
		if err != nil {
			return nil, err
		}
		return &Eigen{N: n, Values: v, Real: z}, nil
	}
	v, z, err := HermEigen(DenseComplex(g, gamma), n, true)
	if err != nil {
		return nil, err
	}
	return &Eigen{N: n, Values: v, Complex: z}, nil
}

// LaplacianEigenvalues returns the eigenvalues of γL, L = D − W the weighted
// graph Laplacian of g (phases and on-site energies ignored), ascending.
// These are the decay rates of the classical walk dp/dt = −γLp.
func LaplacianEigenvalues(g *lattice.Graph, gamma float64) ([]float64, error) {
	if err := checkGamma(gamma); err != nil {
		return nil, err
	}
	if err := checkDense(g, false); err != nil {
		return nil, err
	}
	n := g.Len()
	a := make([]float64, n*n)
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		w := gamma * b.W
		a[b.I*n+b.J] -= w
		a[b.J*n+b.I] -= w
		a[b.I*n+b.I] += w
		a[b.J*n+b.J] += w
	}
	v, _, err := SymEigen(a, n, false)
	return v, err
}
