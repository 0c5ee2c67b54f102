package observables

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestHingeSumsMatchesQR(t *testing.T) {
	// The O(K³) normal-equation evaluator agrees with the Householder
	// least-squares fit (the reference) on random data, weights and
	// breakpoints (seeded sweep, common practice).
	rng := rand.New(rand.NewPCG(6, 6))
	compared := 0
	for trial := range 200 {
		n := 8 + rng.IntN(60)
		k := rng.IntN(4)
		x := make([]float64, n)
		y := make([]float64, n)
		for i := range x {
			x[i] = 3 * rng.NormFloat64()
			y[i] = rng.NormFloat64() + 0.5*x[i]
		}
		sort.Float64s(x)
		var sw []float64
		if trial%2 == 1 {
			sw = make([]float64, n)
			for i := range sw {
				sw[i] = 0.2 + 3*rng.Float64()
			}
		}
		psi := make([]float64, k)
		for j := range psi {
			psi[j] = x[1+rng.IntN(n-2)]
		}
		sort.Float64s(psi)
		bl := newBrokenLine(x, sw, 3, 3)
		bl.setY(y)
		fast := bl.h.rss(psi)
		ref := bl.fit(psi, y)
		if math.IsInf(fast, 1) {
			continue // coincident breakpoints: singular, rejected by design
		}
		assert.InDelta(t, ref, fast, 1e-9*(1+ref), "trial %d n=%d k=%d", trial, n, k)
		compared++
	}
	assert.Greater(t, compared, 150)
}
