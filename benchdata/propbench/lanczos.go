package main

import (
	"math"
	"math/rand/v2"

	"github.com/ampwalk/ampwalk/internal/sparse"
	"gonum.org/v1/gonum/mat"
)

// ritzHalfWidth estimates the spectral half-width a = (λmax − λmin)/2 of
// the real symmetric h by the extreme Ritz values of a Lanczos run (Lanczos,
// J. Res. Natl. Bur. Stand. 45, 255 (1950)) of the given number of steps from
// a seeded random start, keeping three vectors and reorthogonalising each new
// one against the previous two. Ritz values lie inside the spectrum, so the
// estimate is at most the true a and converges to it from below (Kaniel–Paige
// theory; Parlett, The Symmetric Eigenvalue Problem, 1998, ch. 12): the
// yardstick a·t_max is never overstated. It uses steps products with h.
func ritzHalfWidth(h *sparse.CSR, steps int, seed uint64) float64 {
	n := h.N
	steps = min(steps, n)
	rng := rand.New(rand.NewPCG(seed, 1))
	v := make([]float64, n)
	for i := range v {
		v[i] = rng.Float64() - 0.5
	}
	scal(v, 1/nrm(v))
	prev := make([]float64, n)
	w := make([]float64, n)
	var alpha, beta []float64
	for j := 0; j < steps; j++ {
		h.MulVecReal(w, v)
		a := dotR(v, w)
		alpha = append(alpha, a)
		axpyR(w, -a, v)
		if j > 0 {
			axpyR(w, -beta[j-1], prev)
		}
		axpyR(w, -dotR(v, w), v)
		if j > 0 {
			axpyR(w, -dotR(prev, w), prev)
		}
		b := nrm(w)
		if b < 1e-12 || j == steps-1 {
			break
		}
		beta = append(beta, b)
		for i := range w {
			prev[i], v[i] = v[i], w[i]/b
		}
	}
	k := len(alpha)
	t := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		t.SetSym(i, i, alpha[i])
		if i+1 < k {
			t.SetSym(i, i+1, beta[i])
		}
	}
	var es mat.EigenSym
	if !es.Factorize(t, false) {
		return math.NaN()
	}
	ev := es.Values(nil)
	return (ev[k-1] - ev[0]) / 2
}

func dotR(x, y []float64) float64 {
	var s float64
	for i, v := range x {
		s += v * y[i]
	}
	return s
}

func nrm(x []float64) float64 { return math.Sqrt(dotR(x, x)) }

func scal(x []float64, a float64) {
	for i := range x {
		x[i] *= a
	}
}

func axpyR(y []float64, a float64, x []float64) {
	for i, v := range x {
		y[i] += a * v
	}
}
