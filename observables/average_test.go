package observables

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/mat"
)

// eigenOf diagonalises a real symmetric matrix with gonum and returns
// eigenvalues and row-major eigenvectors (column k = eigenvector k).
func eigenOf(t *testing.T, a *mat.SymDense) ([]float64, []float64) {
	t.Helper()
	var es mat.EigenSym
	require.True(t, es.Factorize(a, true))
	n := a.SymmetricDim()
	var v mat.Dense
	es.VectorsTo(&v)
	vec := make([]float64, n*n)
	for i := range n {
		for k := range n {
			vec[i*n+k] = v.At(i, k)
		}
	}
	return es.Values(nil), vec
}

func cycle(n int) *mat.SymDense {
	a := mat.NewSymDense(n, nil)
	for i := range n {
		j := (i + 1) % n
		a.SetSym(i, j, a.At(i, j)+1)
	}
	return a
}

func TestLongTimeAverageCycle(t *testing.T) {
	// Long-time average return probability on C_N: (2N−1)/N² for odd N,
	// (2N−2)/N² for even N (references.md [derived]). The cycle's doubly
	// degenerate levels must be summed as groups; gonum's EigenSym returns an
	// arbitrary basis inside each degenerate pair.
	for n := 3; n <= 24; n++ {
		vals, vecs := eigenOf(t, cycle(n))
		want := float64(2*n-1) / float64(n*n)
		if n%2 == 0 {
			want = float64(2*n-2) / float64(n*n)
		}
		for _, start := range []int{0, n / 2} {
			p, err := LongTimeAverageReal(vals, vecs, n, start, 1e-9)
			require.NoError(t, err)
			assert.InDelta(t, want, p[start], 1e-12, "N=%d", n)
			var s float64
			for _, v := range p {
				s += v
			}
			assert.InDelta(t, 1, s, 1e-12)
			// Complex variant on the same data.
			cv := make([]complex128, len(vecs))
			for i, x := range vecs {
				cv[i] = complex(x, 0)
			}
			pc, err := LongTimeAverage(vals, cv, n, start, 1e-9)
			require.NoError(t, err)
			assert.InDeltaSlice(t, p, pc, 1e-13)
		}
	}
}

func TestLongTimeAverageComplete(t *testing.T) {
	// K_N: eigenvalue N−1 once and −1 with multiplicity N−1 (massive
	// degeneracy). p̄_0 = (1 − 1/N)² + 1/N², p̄_j = 2/N² (from the closed
	// form p0 = 1 − (4(N−1)/N²) sin²(Nγt/2), Mülken & Blumen, Phys. Rep. 502,
	// 37 (2011) (from memory), averaging sin² to 1/2).
	for _, n := range []int{2, 5, 16, 40} {
		a := mat.NewSymDense(n, nil)
		for i := range n {
			for j := i + 1; j < n; j++ {
				a.SetSym(i, j, 1)
			}
		}
		vals, vecs := eigenOf(t, a)
		p, err := LongTimeAverageReal(vals, vecs, n, 0, 1e-8)
		require.NoError(t, err)
		fn := float64(n)
		assert.InDelta(t, (1-1/fn)*(1-1/fn)+1/(fn*fn), p[0], 1e-12)
		for j := 1; j < n; j++ {
			assert.InDelta(t, 2/(fn*fn), p[j], 1e-12)
		}
	}
}

func TestWindowAverageApproaches(t *testing.T) {
	// On C_7 the finite-window average of p(t) approaches the exact long-time
	// average as the window grows (error ~ 1/(ΔE T), common practice).
	const n = 7
	vals, vecs := eigenOf(t, cycle(n))
	exact, err := LongTimeAverageReal(vals, vecs, n, 0, 1e-9)
	require.NoError(t, err)
	var w WindowAverage
	p := make([]float64, n)
	const T, dt = 2000.0, 0.05
	for k := 0; float64(k)*dt <= T; k++ {
		tt := float64(k) * dt
		for j := range n {
			var a complex128
			for m := range n {
				a += complex(vecs[j*n+m]*vecs[0*n+m], 0) * complex(math.Cos(vals[m]*tt), -math.Sin(vals[m]*tt))
			}
			p[j] = abs2(a)
		}
		require.NoError(t, w.Add(tt, p))
	}
	mean := w.Mean(nil)
	assert.InDeltaSlice(t, exact, mean, 5e-3)
	assert.Equal(t, int(T/dt)+1, w.Len())

	// Errors: time going backwards, length change, NaN.
	assert.Error(t, w.Add(1, p))
	assert.Error(t, w.Add(T+1, p[:3]))
	assert.Error(t, w.Add(T+1, []float64{0, 0, 0, 0, 0, 0, math.NaN()}))
}

func TestLongTimeAverageErrors(t *testing.T) {
	vals, vecs := eigenOf(t, cycle(4))
	for _, c := range []struct {
		vals  []float64
		vecs  []float64
		n, s  int
		tol   float64
		field string
	}{
		{vals, vecs, 0, 0, 0, "n"},
		{vals[:3], vecs, 4, 0, 0, "values"},
		{vals, vecs[:15], 4, 0, 0, "vectors"},
		{vals, vecs, 4, 4, 0, "start"},
		{vals, vecs, 4, -1, 0, "start"},
		{vals, vecs, 4, 0, -1, "tol"},
		{vals, vecs, 4, 0, math.NaN(), "tol"},
		{[]float64{0, 1, math.Inf(1), 2}, vecs, 4, 0, 0, "values"},
	} {
		_, err := LongTimeAverageReal(c.vals, c.vecs, c.n, c.s, c.tol)
		var ie *InputError
		require.True(t, errors.As(err, &ie), "%+v", c.field)
		assert.Equal(t, c.field, ie.Field)
	}
}

func TestLongTimeAverageCycleFlux(t *testing.T) {
	// Cycle C_N threaded by flux φ: plane-wave eigenvectors V_jk =
	// e^{2πijk/N}/√N with eigenvalues 2cos((2πk + φ)/N) (Bloch's theorem,
	// common practice). φ = 0 has degenerate pairs k, N−k and gives
	// (2N−1)/N² or (2N−2)/N² (references.md [derived]); a generic φ lifts
	// every degeneracy and the average becomes uniform, 1/N on every site.
	for _, n := range []int{5, 6, 11, 12} {
		vecs := make([]complex128, n*n)
		for j := range n {
			for k := range n {
				a := 2 * math.Pi * float64(j*k) / float64(n)
				vecs[j*n+k] = complex(math.Cos(a), math.Sin(a)) / complex(math.Sqrt(float64(n)), 0)
			}
		}
		for _, phi := range []float64{0, 0.37} {
			vals := make([]float64, n)
			for k := range vals {
				vals[k] = 2 * math.Cos((2*math.Pi*float64(k)+phi)/float64(n))
			}
			p, err := LongTimeAverage(vals, vecs, n, 2, 1e-9)
			require.NoError(t, err)
			if phi == 0 {
				want := float64(2*n-1) / float64(n*n)
				if n%2 == 0 {
					want = float64(2*n-2) / float64(n*n)
				}
				assert.InDelta(t, want, p[2], 1e-13, "N=%d", n)
			} else {
				for j := range n {
					assert.InDelta(t, 1/float64(n), p[j], 1e-13, "N=%d j=%d", n, j)
				}
			}
		}
	}
}
