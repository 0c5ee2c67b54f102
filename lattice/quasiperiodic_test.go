package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/mat"
)

func TestFibonacciWord(t *testing.T) {
	phi := (1 + math.Sqrt(5)) / 2
	w := fibonacciWord(1000)
	for k, s := range w {
		// Letter k+1 (1-based) of the Fibonacci word over {0, 1} is
		// 2 + ⌊(k+1)φ⌋ − ⌊(k+2)φ⌋ (common practice; Lothaire, Algebraic
		// Combinatorics on Words (2002), from memory); 0 is our S.
		want := 2+int(math.Floor(float64(k+1)*phi))-int(math.Floor(float64(k+2)*phi)) == 0
		require.Equal(t, want, s, "letter %d", k)
	}
	g, err := Fibonacci(13, 0.5, 2)
	require.NoError(t, err)
	requireValid(t, g)
	require.Equal(t, 12, g.NumBonds())
	var got []float64
	for k := 0; k < g.NumBonds(); k++ {
		got = append(got, g.Bond(k).W)
	}
	// S W S S W S W S S W S S: the word's first 12 letters (doc comment).
	assert.Equal(t, []float64{2, .5, 2, 2, .5, 2, .5, 2, 2, .5, 2, 2}, got)
	one, err := Fibonacci(1, 1, 2)
	require.NoError(t, err)
	assert.Equal(t, 1, one.Len())
	for _, tc := range []struct {
		n            int
		weak, strong float64
		field        string
	}{
		{0, 1, 2, "sites"}, {5, 0, 2, "weak"}, {5, math.NaN(), 2, "weak"}, {5, 1, math.Inf(1), "strong"},
	} {
		_, err := Fibonacci(tc.n, tc.weak, tc.strong)
		requireInputError(t, err, fault.Invalid, tc.field)
	}
}

func TestHarper(t *testing.T) {
	g, err := Harper(10, 1.5, 0.3, 0.2)
	require.NoError(t, err)
	requireValid(t, g)
	for i := 0; i < 10; i++ {
		assert.InDelta(t, 1.5*math.Cos(2*math.Pi*0.3*float64(i)+0.2), g.Onsite(i), 1e-15)
	}
	g, err = Harper(4, 0, 0.3, 0)
	require.NoError(t, err)
	assert.Nil(t, g.onsite)
	for _, tc := range []struct {
		lambda, beta, phase float64
		field               string
	}{{math.NaN(), 0.5, 0, "lambda"}, {1, math.Inf(-1), 0, "beta"}, {1, 0.5, math.NaN(), "phase"}} {
		_, err := Harper(5, tc.lambda, tc.beta, tc.phase)
		requireInputError(t, err, fault.Invalid, tc.field)
	}
	_, err = Harper(0, 1, 1, 1)
	requireInputError(t, err, fault.Invalid, "sites")
}

func TestHarperTransition(t *testing.T) {
	// Aubry–André self-duality: extended states for λ < 2, localised for
	// λ > 2 (Aubry & André 1980, from memory). Mean eigenstate IPR on 233
	// sites, β = (√5−1)/2: the thresholds 0.05 and 0.2 are common practice
	// (extended states have IPR ~ 3/(2N) ≈ 0.006).
	beta := (math.Sqrt(5) - 1) / 2
	meanIPR := func(lambda float64) float64 {
		g, err := Harper(233, lambda, beta, 0.1)
		require.NoError(t, err)
		n := g.Len()
		a := mat.NewSymDense(n, nil)
		for i := 0; i < n; i++ {
			a.SetSym(i, i, g.Onsite(i))
		}
		for k := 0; k < g.NumBonds(); k++ {
			b := g.Bond(k)
			a.SetSym(b.I, b.J, b.W)
		}
		var es mat.EigenSym
		require.True(t, es.Factorize(a, true))
		var v mat.Dense
		es.VectorsTo(&v)
		var s float64
		for j := 0; j < n; j++ {
			for i := 0; i < n; i++ {
				x := v.At(i, j)
				s += x * x * x * x
			}
		}
		return s / float64(n)
	}
	assert.Less(t, meanIPR(1), 0.05)
	assert.Greater(t, meanIPR(3), 0.2)
}
