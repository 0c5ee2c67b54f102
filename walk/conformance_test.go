package walk

import (
	"context"
	"encoding/json"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"os"
	"strconv"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

// The conformance suite: one table of cases, each run against every
// propagator (Exact, Krylov, Chebyshev and Auto). Every method must
//   - keep the norm (quantum) or Σp (classical) to the tolerance,
//   - agree with the closed form of the case where there is one,
//   - agree with every other method to the stated tolerance.

var allMethods = []Method{Exact, Krylov, Chebyshev, Auto}

// confCase is one propagation problem.
type confCase struct {
	name  string
	g     *lattice.Graph
	gamma float64
	dyn   Dynamics
	start int
	times []float64
	tol   float64 // Settings.Tolerance (0: default)
	// want, when set, returns the exact amplitude (quantum) or probability
	// (classical, in the real part) at site j and time t, or ok = false for
	// sites it does not predict.
	want func(j int, t float64) (v complex128, ok bool)
	// wantTol is the accepted deviation from want.
	wantTol float64
	// check, when set, tests the state at time t further.
	check func(t *testing.T, tm float64, psi []complex128)
}

// graph builds a graph with lattice.New, failing the test on error.
func graph(t testing.TB, n int, bonds []lattice.Bond, onsite []float64) *lattice.Graph {
	t.Helper()
	g, err := lattice.New(n, 1, nil, bonds, onsite)
	require.NoError(t, err)
	return g
}

func chainBonds(n int, periodic bool) []lattice.Bond {
	var b []lattice.Bond
	for i := 0; i+1 < n; i++ {
		b = append(b, lattice.Bond{I: i, J: i + 1, W: 1})
	}
	if periodic && n > 2 {
		b = append(b, lattice.Bond{I: n - 1, J: 0, W: 1})
	}
	return b
}

// randomGraph returns a connected random graph: a spanning path in shuffled
// order plus extra random bonds, weights in [0.5, 1.5], on-site energies in
// [−1, 1] (when onsite), and phases in [−π, π] (when phases).
func randomGraph(t testing.TB, seed uint64, n, extra int, onsite, phases bool) *lattice.Graph {
	rng := rand.New(rand.NewPCG(seed, 1))
	perm := rng.Perm(n)
	seen := map[[2]int]bool{}
	var bonds []lattice.Bond
	add := func(i, j int) {
		if i == j {
			return
		}
		k := [2]int{min(i, j), max(i, j)}
		if seen[k] {
			return
		}
		seen[k] = true
		b := lattice.Bond{I: i, J: j, W: 0.5 + rng.Float64()}
		if phases {
			b.Phase = (2*rng.Float64() - 1) * math.Pi
		}
		bonds = append(bonds, b)
	}
	for k := 0; k+1 < n; k++ {
		add(perm[k], perm[k+1])
	}
	for k := 0; k < extra; k++ {
		add(rng.IntN(n), rng.IntN(n))
	}
	var eps []float64
	if onsite {
		eps = make([]float64, n)
		for i := range eps {
			eps[i] = 2*rng.Float64() - 1
		}
	}
	return graph(t, n, bonds, eps)
}

// run propagates c with method m and returns copies of the states.
func (c confCase) run(t *testing.T, m Method) ([][]complex128, Diagnostics) {
	t.Helper()
	n := c.g.Len()
	psi0 := make([]complex128, n)
	psi0[c.start] = 1
	var op Operator
	if c.dyn == Classical {
		op = c.g.Laplacian(c.gamma)
	} else {
		op = c.g.Hamiltonian(c.gamma)
	}
	states := make([][]complex128, len(c.times))
	d, err := Propagate(context.Background(), op, c.dyn, psi0, c.times, Settings{Method: m, Tolerance: c.tol},
		func(k int, tm float64, psi []complex128) error {
			require.Equal(t, c.times[k], tm)
			states[k] = append([]complex128(nil), psi...)
			return nil
		})
	require.NoError(t, err)
	return states, d
}

func conformanceCases(t *testing.T) []confCase {
	var cases []confCase

	// Infinite line from a long chain started mid-chain: ⟨n|U(t)|0⟩ =
	// (−i)^n J_n(2γt) (Childs, Farhi & Gutmann, Quantum Inf. Process. 1, 35
	// (2002) (from memory); shared guide references.md [derived]). With 301
	// sites and t ≤ 20 the front (speed 2γ) stays 100 sites from the ends,
	// where J_100(40) < 1e-20 (bound (x/2)^k/k!).
	{
		n, mid := 301, 150
		cases = append(cases, confCase{
			name: "chain-bessel", g: graph(t, n, chainBonds(n, false), nil), gamma: 1, start: mid,
			times: []float64{0, 0.25, 1, 1, 3, 7.5, 20},
			want: func(j int, tm float64) (complex128, bool) {
				k := j - mid
				if k < -60 || k > 60 {
					return 0, false
				}
				return cmplx.Pow(complex(0, -1), complex(float64(k), 0)) * complex(math.Jn(k, 2*tm), 0), true
			},
			wantTol: 1e-9,
			check: func(t *testing.T, tm float64, psi []complex128) {
				if tm != 1 {
					return
				}
				// Check values at γ=1, t=1: p0 = J_0(2)², p1 = J_1(2)²
				// (shared guide references.md, [derived]).
				p := func(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }
				require.InDelta(t, 0.0501270809844695, p(psi[mid]), 1e-12)
				require.InDelta(t, 0.332611503882203, p(psi[mid+1]), 1e-12)
				require.InDelta(t, 0.332611503882203, p(psi[mid-1]), 1e-12)
				// MSD Σ n² J_n(2t)² = 2γ²t² (references.md, [derived]).
				var msd float64
				for j, z := range psi {
					msd += float64((j-mid)*(j-mid)) * p(z)
				}
				require.InDelta(t, 2.0, msd, 1e-9)
			},
		})
	}

	// The same line with γ = 0.35: amplitudes (−i)^n J_n(2γt); time in units
	// of 1/γ (references.md).
	{
		n, mid := 121, 60
		gamma := 0.35
		cases = append(cases, confCase{
			name: "chain-gamma", g: graph(t, n, chainBonds(n, false), nil), gamma: gamma, start: mid,
			times: []float64{0.5, 4, 10},
			want: func(j int, tm float64) (complex128, bool) {
				k := j - mid
				return cmplx.Pow(complex(0, -1), complex(float64(k), 0)) * complex(math.Jn(k, 2*gamma*tm), 0), true
			},
			wantTol: 1e-9,
		})
	}

	// Square lattice, product form: ψ(x, y) = ψ_line(x)ψ_line(y), so
	// p_0 = J_0(2t)^4 (references.md, Z^d [derived]). 21×21 open lattice
	// started in the centre; sites within 3 of the start at t ≤ 2 differ from
	// the infinite lattice by less than J_19(4) < 1e-11 (method of images).
	{
		w, c := 21, 10
		var bonds []lattice.Bond
		for y := 0; y < w; y++ {
			for x := 0; x < w; x++ {
				if x+1 < w {
					bonds = append(bonds, lattice.Bond{I: x + w*y, J: x + 1 + w*y, W: 1})
				}
				if y+1 < w {
					bonds = append(bonds, lattice.Bond{I: x + w*y, J: x + w*(y+1), W: 1})
				}
			}
		}
		line := func(k int, tm float64) complex128 {
			return cmplx.Pow(complex(0, -1), complex(float64(k), 0)) * complex(math.Jn(k, 2*tm), 0)
		}
		cases = append(cases, confCase{
			name: "square-product", g: graph(t, w*w, bonds, nil), gamma: 1, start: c + w*c,
			times: []float64{0.5, 1, 2},
			want: func(j int, tm float64) (complex128, bool) {
				x, y := j%w-c, j/w-c
				if x < -3 || x > 3 || y < -3 || y > 3 {
					return 0, false
				}
				return line(x, tm) * line(y, tm), true
			},
			wantTol: 1e-9,
		})
	}

	// Hypercube Q_6: U(t) = ⊗ exp(−itσ_x), so ⟨antipode|U|0⟩ = (−i sin t)^d
	// and ⟨0|U|0⟩ = cos^d t; perfect transfer at t = π/2 (Christandl, Datta,
	// Ekert & Landahl, PRL 92, 187902 (2004)).
	{
		d := 6
		n := 1 << d
		var bonds []lattice.Bond
		for i := 0; i < n; i++ {
			for k := 0; k < d; k++ {
				if j := i ^ (1 << k); j > i {
					bonds = append(bonds, lattice.Bond{I: i, J: j, W: 1})
				}
			}
		}
		cases = append(cases, confCase{
			name: "hypercube-transfer", g: graph(t, n, bonds, nil), gamma: 1, start: 0,
			times: []float64{0.3, 1, math.Pi / 2, 4},
			want: func(j int, tm float64) (complex128, bool) {
				h := 0
				for v := j; v > 0; v >>= 1 {
					h += v & 1
				}
				s, c := math.Sincos(tm)
				return cmplx.Pow(complex(0, -s), complex(float64(h), 0)) * complex(math.Pow(c, float64(d-h)), 0), true
			},
			wantTol: 1e-9,
			check: func(t *testing.T, tm float64, psi []complex128) {
				if tm == math.Pi/2 {
					require.InDelta(t, 1, cmplx.Abs(psi[n-1]), 1e-9)
				}
			},
		})
	}

	// Engineered chain J_n = (λ/2)√(n(N−n)), n = 1…N−1: |⟨N|U|1⟩| =
	// |sin(λt/2)|^{N−1}, perfect transfer at t = π/λ (references.md
	// [derived]; Christandl et al., PRL 92, 187902 (2004)).
	{
		N, lambda := 24, 1.3
		var bonds []lattice.Bond
		for k := 1; k < N; k++ {
			bonds = append(bonds, lattice.Bond{I: k - 1, J: k, W: lambda / 2 * math.Sqrt(float64(k*(N-k)))})
		}
		cases = append(cases, confCase{
			name: "engineered-transfer", g: graph(t, N, bonds, nil), gamma: 1, start: 0,
			times: []float64{0.7, 2, math.Pi / lambda, 9},
			check: func(t *testing.T, tm float64, psi []complex128) {
				want := math.Pow(math.Abs(math.Sin(lambda*tm/2)), float64(N-1))
				require.InDelta(t, want, cmplx.Abs(psi[N-1]), 1e-9)
			},
		})
	}

	// Cycle C_N: eigenvalues 2cos(2πk/N) with plane-wave vectors, so
	// ⟨0|U|0⟩ = (1/N)Σ_k e^{−2it cos(2πk/N)} (references.md [derived]); long
	// times test long steps (TestChebyshevSplitsLongSteps covers a·Δt beyond
	// maxSegment).
	for _, N := range []int{17, 40} {
		cases = append(cases, confCase{
			name: "cycle-" + strconv.Itoa(N), g: graph(t, N, chainBonds(N, true), nil), gamma: 1, start: 0,
			times: []float64{1, 13.7, 150, 450},
			check: func(t *testing.T, tm float64, psi []complex128) {
				var z complex128
				for k := 0; k < N; k++ {
					z += cmplx.Exp(complex(0, -2*tm*math.Cos(2*math.Pi*float64(k)/float64(N))))
				}
				z /= complex(float64(N), 0)
				require.InDelta(t, 0, cmplx.Abs(z-psi[0]), 1e-9)
			},
		})
	}

	// Path P_N: eigenvalues 2cos(πk/(N+1)), vectors √(2/(N+1)) sin(πk(j+1)/(N+1))
	// (references.md [derived]); return amplitude of an end site.
	{
		N := 25
		cases = append(cases, confCase{
			name: "path-25", g: graph(t, N, chainBonds(N, false), nil), gamma: 1, start: 0,
			times: []float64{2, 30, 99},
			check: func(t *testing.T, tm float64, psi []complex128) {
				var z complex128
				for k := 1; k <= N; k++ {
					th := math.Pi * float64(k) / float64(N+1)
					v := math.Sqrt(2/float64(N+1)) * math.Sin(th)
					z += complex(v*v, 0) * cmplx.Exp(complex(0, -2*tm*math.Cos(th)))
				}
				require.InDelta(t, 0, cmplx.Abs(z-psi[0]), 1e-9)
			},
		})
	}

	// Complete graph K_N: p_0 = 1 − (4(N−1)/N²) sin²(Nγt/2) (Mülken &
	// Blumen, Phys. Rep. 502, 37 (2011) (from memory)).
	{
		N, gamma := 12, 0.7
		var bonds []lattice.Bond
		for i := 0; i < N; i++ {
			for j := i + 1; j < N; j++ {
				bonds = append(bonds, lattice.Bond{I: i, J: j, W: 1})
			}
		}
		cases = append(cases, confCase{
			name: "complete-12", g: graph(t, N, bonds, nil), gamma: gamma, start: 3,
			times: []float64{0.1, 0.5, 2, 31},
			check: func(t *testing.T, tm float64, psi []complex128) {
				s := math.Sin(float64(N) * gamma * tm / 2)
				want := 1 - 4*float64(N-1)/float64(N*N)*s*s
				got := real(psi[3])*real(psi[3]) + imag(psi[3])*imag(psi[3])
				require.InDelta(t, want, got, 1e-9)
			},
		})
	}

	// Classical line: p_n = e^{−2γt} I_n(2γt), MSD = 2γt (references.md).
	// I_n by its power series (Abramowitz & Stegun 9.6.10 (from memory)),
	// independent of the propagator's recurrence.
	{
		n, mid := 201, 100
		cases = append(cases, confCase{
			name: "classical-line", g: graph(t, n, chainBonds(n, false), nil), gamma: 1, dyn: Classical, start: mid,
			times: []float64{0, 0.5, 1, 3, 10},
			want: func(j int, tm float64) (complex128, bool) {
				k := j - mid
				if k < -40 || k > 40 || tm == 0 {
					return 0, false
				}
				return complex(scaledISeries(abs(k), 2*tm), 0), true
			},
			wantTol: 1e-10,
			check: func(t *testing.T, tm float64, psi []complex128) {
				// A state error δ moves the MSD by at most ‖n²‖₂‖δ‖₂
				// (Cauchy–Schwarz), so the tolerance 1e-10 allows that much.
				var msd, n4 float64
				for j, z := range psi {
					d2 := float64((j - mid) * (j - mid))
					msd += d2 * real(z)
					n4 += d2 * d2
				}
				require.InDelta(t, 2*tm, msd, 1e-10*math.Sqrt(n4), "t=%v", tm)
			},
		})
	}

	// Seeded random weighted graphs with on-site energies, with and without
	// Peierls phases, quantum and classical: no closed form, the methods
	// must agree with each other.
	for k, sz := range []struct{ n, extra int }{{40, 60}, {150, 300}} {
		seed := uint64(20 + k)
		cases = append(cases,
			confCase{name: "random-onsite-" + strconv.Itoa(sz.n), g: randomGraph(t, seed, sz.n, sz.extra, true, false),
				gamma: 1, start: 0, times: []float64{0.1, 1, 5, 5, 40}},
			confCase{name: "random-peierls-" + strconv.Itoa(sz.n), g: randomGraph(t, seed, sz.n, sz.extra, true, true),
				gamma: 0.8, start: sz.n / 2, times: []float64{0.2, 3, 25}},
			confCase{name: "random-classical-" + strconv.Itoa(sz.n), g: randomGraph(t, seed, sz.n, sz.extra, false, false),
				gamma: 1.3, dyn: Classical, start: 1, times: []float64{0.05, 1, 10, 100}},
			confCase{name: "random-loose-" + strconv.Itoa(sz.n), g: randomGraph(t, seed, sz.n, sz.extra, true, true),
				gamma: 1, start: 2, times: []float64{0.5, 2, 12}, tol: 1e-6},
		)
	}
	return cases
}

func abs(k int) int {
	if k < 0 {
		return -k
	}
	return k
}

// scaledISeries returns e^{−x}I_k(x) = Σ_m (x/2)^{2m+k}/(m!(m+k)!)·e^{−x}
// summed in log space (Abramowitz & Stegun 9.6.10 (from memory)).
func scaledISeries(k int, x float64) float64 {
	var s float64
	for m := 0; m < 400; m++ {
		l1, _ := math.Lgamma(float64(m + 1))
		l2, _ := math.Lgamma(float64(m + k + 1))
		s += math.Exp(float64(2*m+k)*math.Log(x/2) - l1 - l2 - x)
	}
	return s
}

func diffNorm(a, b []complex128) float64 {
	var s float64
	for i := range a {
		d := a[i] - b[i]
		s += real(d)*real(d) + imag(d)*imag(d)
	}
	return math.Sqrt(s)
}

func TestConformance(t *testing.T) {
	for _, c := range conformanceCases(t) {
		t.Run(c.name, func(t *testing.T) {
			tol := c.tol
			if tol == 0 {
				tol = DefaultTolerance
			}
			results := map[Method][][]complex128{}
			for _, m := range allMethods {
				states, d := c.run(t, m)
				results[m] = states
				if m != Auto {
					require.Equal(t, m.String(), d.Method)
				} else {
					require.NotEmpty(t, d.Reason, "Auto must say why")
				}
				require.GreaterOrEqual(t, d.ErrorBound, 0.0)
				require.LessOrEqual(t, d.ErrorBound, tol, "%v: the error bound exceeds the tolerance", m)
				for k, psi := range states {
					tm := c.times[k]
					if tm == 0 {
						// Time 0 returns psi0 exactly.
						for j, z := range psi {
							want := complex(0, 0)
							if j == c.start {
								want = 1
							}
							require.Equal(t, want, z)
						}
					}
					// Unitarity (quantum) or conservation of Σp (classical), to the
					// tolerance (references.md conventions; common practice).
					if c.dyn == Quantum {
						require.InDelta(t, 1, math.Sqrt(real(dot(psi, psi))), tol, "%v t=%v: norm", m, tm)
					} else {
						require.InDelta(t, 1, sumReal(psi), tol, "%v t=%v: Σp", m, tm)
						for j, z := range psi {
							require.GreaterOrEqual(t, real(z), -tol, "%v t=%v: p_%d negative", m, tm, j)
						}
					}
					if c.want != nil {
						for j, z := range psi {
							if w, ok := c.want(j, tm); ok {
								require.InDelta(t, 0, cmplx.Abs(z-w), c.wantTol, "%v t=%v site %d: got %v want %v", m, tm, j, z, w)
							}
						}
					}
					if c.check != nil {
						c.check(t, tm, psi)
					}
				}
			}
			// Mutual agreement: each method is within tol of the truth, so two
			// are within 2·tol of each other; allow rounding (1e-12).
			for i, a := range allMethods {
				for _, b := range allMethods[i+1:] {
					for k := range c.times {
						d := diffNorm(results[a][k], results[b][k])
						require.LessOrEqual(t, d, 2*tol+1e-12, "%v vs %v at t=%v", a, b, c.times[k])
					}
				}
			}
		})
	}
}

// TestConformanceSciPy runs every propagator against states made offline by
// scipy.linalg.expm (SciPy 1.10.1, NumPy 1.24.2; script and data in
// testdata/expm_ref.py and testdata/expm_ref.json) on two weighted graphs
// with on-site energies and Peierls phases, quantum and classical.
func TestConformanceSciPy(t *testing.T) {
	raw, err := os.ReadFile("testdata/expm_ref.json")
	require.NoError(t, err)
	var ref struct {
		Cases []struct {
			Sites     int
			Bonds     [][4]float64
			Onsite    []float64
			Start     int
			Times     []float64
			Quantum   [][][2]float64
			Classical [][]float64
		}
	}
	require.NoError(t, json.Unmarshal(raw, &ref))
	require.Len(t, ref.Cases, 2)
	for _, c := range ref.Cases {
		bonds := make([]lattice.Bond, len(c.Bonds))
		for k, b := range c.Bonds {
			bonds[k] = lattice.Bond{I: int(b[0]), J: int(b[1]), W: b[2], Phase: b[3]}
		}
		g := graph(t, c.Sites, bonds, c.Onsite)
		for _, dyn := range []Dynamics{Quantum, Classical} {
			for _, m := range allMethods {
				cc := confCase{g: g, gamma: 1, dyn: dyn, start: c.Start, times: c.Times}
				states, _ := cc.run(t, m)
				for k, psi := range states {
					want := make([]complex128, c.Sites)
					for j := range want {
						if dyn == Quantum {
							want[j] = complex(c.Quantum[k][j][0], c.Quantum[k][j][1])
						} else {
							want[j] = complex(c.Classical[k][j], 0)
						}
					}
					// The default tolerance 1e-10 plus expm's own error
					// (≈1e-13 at these norms; Al-Mohy & Higham 2009).
					require.LessOrEqual(t, diffNorm(psi, want), 1e-10+1e-12, "n=%d %v %v t=%v", c.Sites, dyn, m, c.Times[k])
				}
			}
		}
	}
}

// TestConformanceStructured runs Krylov, Chebyshev and Auto against exact
// diagonalisation on graphs with awkward spectra: the complete graph (two
// eigenvalues, the Lanczos runs break down at once), a star (an isolated
// pair ±√(N−1)), the Sierpinski gasket (massive degeneracy), and a chain
// plus a disconnected heavy dimer (an extreme eigenvalue ±50 carried by two
// sites only, which the spectral bounds must still find).
func TestConformanceStructured(t *testing.T) {
	if testing.Short() {
		t.Skip("exact references on several graphs")
	}
	var gs []*lattice.Graph
	var names []string
	kn := func(n int) *lattice.Graph {
		var b []lattice.Bond
		for i := 0; i < n; i++ {
			for j := i + 1; j < n; j++ {
				b = append(b, lattice.Bond{I: i, J: j, W: 1})
			}
		}
		return graph(t, n, b, nil)
	}
	star := func(n int) *lattice.Graph {
		var b []lattice.Bond
		for i := 1; i < n; i++ {
			b = append(b, lattice.Bond{I: 0, J: i, W: 1})
		}
		return graph(t, n, b, nil)
	}
	gas, err := lattice.Gasket(5)
	require.NoError(t, err)
	// disconnected: chain of 200 plus a heavy dimer
	b := chainBonds(200, false)
	b = append(b, lattice.Bond{I: 200, J: 201, W: 50})
	disc := graph(t, 202, b, nil)
	gs = append(gs, kn(150), star(200), gas, disc)
	names = append(names, "K150", "star200", "gasket5", "disc")
	for gi, g := range gs {
		for _, dyn := range []Dynamics{Quantum, Classical} {
			op := g.Hamiltonian(1)
			if dyn == Classical {
				op = g.Laplacian(1)
			}
			n := g.Len()
			times := []float64{0.01, 0.5, 3, 30, 100}
			run := func(m Method, start int) [][]complex128 {
				var out [][]complex128
				_, err := Propagate(context.Background(), op, dyn, basis(n, start), times, Settings{Method: m},
					func(_ int, _ float64, psi []complex128) error {
						out = append(out, append([]complex128(nil), psi...))
						return nil
					})
				require.NoError(t, err, "%s %v %v", names[gi], dyn, m)
				return out
			}
			for _, start := range []int{0, n - 1} {
				ref := run(Exact, start)
				for _, m := range []Method{Krylov, Chebyshev, Auto} {
					got := run(m, start)
					for k := range times {
						// The default tolerance plus the reference's rounding
						// (common practice).
						require.LessOrEqual(t, diffNorm(got[k], ref[k]), 1e-10+1e-11, "%s %v %v start %d t=%v", names[gi], dyn, m, start, times[k])
					}
				}
			}
		}
	}
}
