package spectra

import (
	"errors"
	"math"
	"sort"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

func sorted(v []float64) []float64 {
	v = append([]float64(nil), v...)
	sort.Float64s(v)
	return v
}

func requireClose(t *testing.T, want, got []float64, tol float64) {
	t.Helper()
	require.Equal(t, len(want), len(got))
	want, got = sorted(want), sorted(got)
	for i := range want {
		require.InDelta(t, want[i], got[i], tol, "level %d", i)
	}
}

func TestEigenvaluesClosedForms(t *testing.T) {
	binom := func(n, k int) int {
		r := 1
		for i := 0; i < k; i++ {
			r = r * (n - i) / (i + 1)
		}
		return r
	}
	cases := []struct {
		name  string
		g     *lattice.Graph
		gamma float64
		want  func() []float64
	}{
		// Cycle C_N: 2cos(2πk/N), references.md [derived].
		{"cycle12", cycleGraph(t, 12), 1, func() (w []float64) {
			for k := 0; k < 12; k++ {
				w = append(w, 2*math.Cos(2*math.Pi*float64(k)/12))
			}
			return
		}},
		// Path P_N: 2cos(πk/(N+1)), references.md [derived]; γ scales them.
		{"path9", pathGraph(t, 9), 0.5, func() (w []float64) {
			for k := 1; k <= 9; k++ {
				w = append(w, 0.5*2*math.Cos(math.Pi*float64(k)/10))
			}
			return
		}},
		// Hypercube Q_d: d − 2k with multiplicity C(d,k), Christandl et al., PRL 92, 187902 (2004).
		{"hypercube5", hypercubeGraph(t, 5), 1, func() (w []float64) {
			for k := 0; k <= 5; k++ {
				for m := 0; m < binom(5, k); m++ {
					w = append(w, float64(5-2*k))
				}
			}
			return
		}},
		// Complete graph K_N: N−1 once and −1 with multiplicity N−1 (common practice).
		{"complete7", completeGraph(t, 7), 1, func() []float64 {
			return []float64{6, -1, -1, -1, -1, -1, -1}
		}},
		// Periodic L×L square: 2cos(2πk/L) + 2cos(2πl/L), references.md [derived].
		{"torus6", torusGraph(t, 6), 1, func() (w []float64) {
			for k := 0; k < 6; k++ {
				for l := 0; l < 6; l++ {
					w = append(w, 2*math.Cos(2*math.Pi*float64(k)/6)+2*math.Cos(2*math.Pi*float64(l)/6))
				}
			}
			return
		}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			v, err := Eigenvalues(c.g, c.gamma)
			require.NoError(t, err)
			require.True(t, sort.Float64sAreSorted(v))
			requireClose(t, c.want(), v, 1e-10)
		})
	}
}

func TestEigensystemResidual(t *testing.T) {
	g := gasketGraph(t, 3)
	e, err := Eigensystem(g, 1.3)
	require.NoError(t, err)
	n := e.N
	h := DenseReal(g, 1.3)
	// ‖Hv − λv‖ and orthonormality, common practice.
	for k := 0; k < n; k++ {
		for i := 0; i < n; i++ {
			var s float64
			for j := 0; j < n; j++ {
				s += h[i*n+j] * e.Real[j*n+k]
			}
			require.InDelta(t, e.Values[k]*e.Real[i*n+k], s, 1e-10)
		}
		var w float64
		for i := 0; i < n; i++ {
			w += e.Weight(i, k)
		}
		require.InDelta(t, 1, w, 1e-12)
	}
}

func TestEigensystemComplex(t *testing.T) {
	// A ring of 8 threaded by flux Φ: bond phases Φ/8 give 2cos((2πk + Φ)/8)
	// (common practice: Peierls substitution on a ring).
	const n, phi = 8, 0.7
	var b []lattice.Bond
	for i := 0; i < n; i++ {
		b = append(b, lattice.Bond{I: i, J: (i + 1) % n, W: 1, Phase: phi / n})
	}
	g := mustGraph(t, n, 1, nil, b)
	e, err := Eigensystem(g, 1)
	require.NoError(t, err)
	require.Nil(t, e.Real)
	var want []float64
	for k := 0; k < n; k++ {
		want = append(want, 2*math.Cos((2*math.Pi*float64(k)+phi)/n))
	}
	requireClose(t, want, e.Values, 1e-10)
	v, err := Eigenvalues(g, 1)
	require.NoError(t, err)
	requireClose(t, want, v, 1e-10)
}

func TestLaplacianEigenvaluesGasket(t *testing.T) {
	// Laplacian of C_N: 2 − 2cos(2πk/N), common practice.
	v, err := LaplacianEigenvalues(cycleGraph(t, 10), 2)
	require.NoError(t, err)
	var want []float64
	for k := 0; k < 10; k++ {
		want = append(want, 2*(2-2*math.Cos(2*math.Pi*float64(k)/10)))
	}
	requireClose(t, want, v, 1e-10)
}

func TestEigenvaluesRefuse(t *testing.T) {
	_, err := Eigenvalues(pathGraph(t, 3), math.NaN())
	var fe *InputError
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "hopping", fe.Field)

	g, err := lattice.New(MaxDense+1, 1, nil, nil, nil)
	require.NoError(t, err)
	_, err = Eigensystem(g, 1)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, fault.TooLarge, fe.Kind)

	t.Setenv("AMPWALK_MEMORY_LIMIT", "1000")
	_, err = Eigenvalues(pathGraph(t, 100), 1)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, fault.TooLarge, fe.Kind)
}
