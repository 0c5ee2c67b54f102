package lattice

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestDisorderReproducible(t *testing.T) {
	g, err := Gasket(3)
	require.NoError(t, err)
	d := Disorder{Onsite: 0.7, Bond: 0.3, Law: Gauss}
	a, err := g.WithDisorder(d, rand.New(rand.NewPCG(42, 3)))
	require.NoError(t, err)
	b, err := g.WithDisorder(d, rand.New(rand.NewPCG(42, 3)))
	require.NoError(t, err)
	c, err := g.WithDisorder(d, rand.New(rand.NewPCG(42, 4)))
	require.NoError(t, err)
	for i := 0; i < g.Len(); i++ {
		assert.Equal(t, a.Onsite(i), b.Onsite(i))
		assert.NotEqual(t, a.Onsite(i), c.Onsite(i))
	}
	for k := 0; k < g.NumBonds(); k++ {
		assert.Equal(t, a.Bond(k), b.Bond(k))
	}
	// The documented draw order: on-site draws in site order, then bonds.
	rng := rand.New(rand.NewPCG(42, 3))
	for i := 0; i < g.Len(); i++ {
		assert.Equal(t, 0.7*rng.NormFloat64(), a.Onsite(i))
	}
	for k := 0; k < g.NumBonds(); k++ {
		assert.Equal(t, 1+0.3*rng.NormFloat64(), a.Bond(k).W)
	}
	// The original is untouched.
	assert.Equal(t, 0.0, g.Onsite(0))
	assert.Equal(t, 1.0, g.Bond(0).W)
}

func TestDisorderStatistics(t *testing.T) {
	g, err := Chain(200001, false)
	require.NoError(t, err)
	for _, tc := range []struct {
		law      Law
		w, v     float64
		sdW, sdV float64 // box: width/√12; gauss: the width (common practice)
	}{
		{Box, 2, 0.5, 2 / math.Sqrt(12), 0.5 / math.Sqrt(12)},
		{Gauss, 1.5, 0.2, 1.5, 0.2},
	} {
		h, err := g.WithDisorder(Disorder{Onsite: tc.w, Bond: tc.v, Law: tc.law}, rand.New(rand.NewPCG(7, 0)))
		require.NoError(t, err)
		var s, s2 float64
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := 0; i < h.Len(); i++ {
			e := h.Onsite(i)
			s += e
			s2 += e * e
			lo, hi = math.Min(lo, e), math.Max(hi, e)
		}
		n := float64(h.Len())
		mean, sd := s/n, math.Sqrt(s2/n-(s/n)*(s/n))
		// Tolerances: 5 standard errors of the mean, 1% on the standard
		// deviation for 2·10⁵ draws (common practice).
		assert.InDelta(t, 0, mean, 5*tc.sdW/math.Sqrt(n))
		assert.InDelta(t, tc.sdW, sd, 0.01*tc.sdW)
		if tc.law == Box {
			assert.GreaterOrEqual(t, lo, -tc.w/2)
			assert.LessOrEqual(t, hi, tc.w/2)
		}
		s, s2 = 0, 0
		m := float64(h.NumBonds())
		for k := 0; k < h.NumBonds(); k++ {
			d := h.Bond(k).W - 1
			s += d
			s2 += d * d
		}
		mean, sd = s/m, math.Sqrt(s2/m-(s/m)*(s/m))
		assert.InDelta(t, 0, mean, 5*tc.sdV/math.Sqrt(m))
		assert.InDelta(t, tc.sdV, sd, 0.01*tc.sdV)
	}
}

func TestDisorderAddsToExisting(t *testing.T) {
	g, err := Harper(50, 1, 0.618, 0)
	require.NoError(t, err)
	g, err = g.ScaleHopping(2)
	require.NoError(t, err)
	h, err := g.WithDisorder(Disorder{Onsite: 0.1, Bond: 0.1}, rand.New(rand.NewPCG(1, 1)))
	require.NoError(t, err)
	for i := 0; i < g.Len(); i++ {
		assert.InDelta(t, g.Onsite(i), h.Onsite(i), 0.05+1e-15)
		assert.NotEqual(t, g.Onsite(i), h.Onsite(i))
	}
	for k := 0; k < g.NumBonds(); k++ {
		assert.InDelta(t, 2, h.Bond(k).W, 2*0.05+1e-15)
	}
	// A zero width draws nothing and changes nothing.
	z, err := g.WithDisorder(Disorder{}, rand.New(rand.NewPCG(1, 1)))
	require.NoError(t, err)
	assert.Equal(t, g.Onsite(3), z.Onsite(3))
	assert.Equal(t, g.Bond(3), z.Bond(3))
}

func TestDisorderErrors(t *testing.T) {
	g, err := Chain(5, false)
	require.NoError(t, err)
	rng := rand.New(rand.NewPCG(1, 1))
	for _, tc := range []struct {
		d     Disorder
		rng   *rand.Rand
		field string
	}{
		{Disorder{Onsite: -1}, rng, "onsite"},
		{Disorder{Onsite: math.NaN()}, rng, "onsite"},
		{Disorder{Bond: math.Inf(1)}, rng, "bond"},
		{Disorder{Law: Law(5)}, rng, "law"},
		{Disorder{Onsite: 1}, nil, "rng"},
	} {
		_, err := g.WithDisorder(tc.d, tc.rng)
		requireInputError(t, err, fault.Invalid, tc.field)
	}
	assert.Equal(t, "box", Box.String())
	assert.Equal(t, "gauss", Gauss.String())
}
