package observables

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/assert"
	"gonum.org/v1/gonum/mat"
)

func TestDimerDip(t *testing.T) {
	// H = Cσ_x: U = [[cos Ct, −i sin Ct], [−i sin Ct, cos Ct]]; Γ^B_12 =
	// cos²(2Ct), zero at Ct = π/4 where the distinguishable value is 1/2.
	// Bromberg et al., PRL 102, 253904 (2009) (from memory); references.md [derived].
	for _, ct := range []float64{0, 0.1, 0.5, math.Pi / 4, 1, 2} {
		c, s := math.Cos(ct), math.Sin(ct)
		u0 := []complex128{complex(c, 0), complex(0, -s)} // column k = 0
		u1 := []complex128{complex(0, -s), complex(c, 0)} // column l = 1
		b := Correlations(nil, u0, u1, Bosons)
		f := Correlations(nil, u0, u1, Fermions)
		d := Correlations(nil, u0, u1, Distinguishable)
		c2 := math.Cos(2 * ct)
		assert.InDelta(t, c2*c2, b[1], 1e-15, "Ct=%v", ct)
		assert.InDelta(t, c2*c2, b[2], 1e-15)
		// Fermions never share a site; for two sites they are always apart.
		assert.InDelta(t, 0, f[0], 1e-15)
		assert.InDelta(t, 1, f[1], 1e-15)
		for _, g := range [][]float64{b, f, d} {
			assert.InDelta(t, 2, g[0]+g[1]+g[2]+g[3], 1e-14)
		}
		if ct == math.Pi/4 {
			assert.InDelta(t, 0, b[1], 1e-15)
			assert.InDelta(t, 0.5, d[1], 1e-15)
		}
	}
}

func TestCorrelationsSum(t *testing.T) {
	// For a random unitary (eigenvectors of a random real symmetric matrix) and
	// k ≠ l, Σ_qr Γ_qr = 2 for all three statistics (references.md [derived]);
	// Γ is symmetric in (q, r).
	rng := rand.New(rand.NewPCG(7, 1))
	for n := 2; n <= 9; n++ {
		a := mat.NewSymDense(n, nil)
		for i := range n {
			for j := i; j < n; j++ {
				a.SetSym(i, j, rng.NormFloat64())
			}
		}
		var es mat.EigenSym
		if !es.Factorize(a, true) {
			t.Fatal("eigen failed")
		}
		var v mat.Dense
		es.VectorsTo(&v)
		k, l := 0, n-1
		uk, ul := make([]complex128, n), make([]complex128, n)
		for q := range n {
			// Complex phases per column keep the check general.
			uk[q] = complex(v.At(q, k), 0) * complex(0, 1)
			ul[q] = complex(v.At(q, l), 0)
		}
		dst := make([]float64, n*n)
		for _, kind := range []Statistics{Bosons, Fermions, Distinguishable} {
			g := Correlations(dst, uk, ul, kind)
			var s float64
			for q := range n {
				for r := range n {
					s += g[q*n+r]
					assert.InDelta(t, g[q*n+r], g[r*n+q], 1e-14)
				}
				if kind == Fermions {
					assert.InDelta(t, 0, g[q*n+q], 1e-15)
				}
			}
			assert.InDelta(t, 2, s, 1e-12, "n=%d %v", n, kind)
		}
	}
}
