package observables

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// chainState returns the infinite-line amplitudes ψ_n(t) = (−i)^n J_n(2t),
// n = −m…m (site n at index n+m, position n), for H = +A, γ = 1, start 0.
// Childs, Farhi, Gutmann, Quantum Inf. Process. 1, 35 (2002) (from memory).
func chainState(t float64, m int) (psi []complex128, coords []float64) {
	psi = make([]complex128, 2*m+1)
	coords = make([]float64, 2*m+1)
	for n := -m; n <= m; n++ {
		psi[n+m] = cmplx.Pow(-1i, complex(float64(n), 0)) * complex(math.Jn(n, 2*t), 0)
		coords[n+m] = float64(n)
	}
	return psi, coords
}

func TestChainExact(t *testing.T) {
	// MSD = 2γ²t² and p0 = J0(2γt)²: Childs, Farhi, Gutmann, Quantum Inf.
	// Process. 1, 35 (2002) (from memory); references.md [derived].
	for _, tt := range []float64{0.1, 0.5, 1, 2.5, 5, 10} {
		psi, coords := chainState(tt, 80) // J_80(20) ≈ 1e-30: truncation invisible (common practice)
		p := Probabilities(nil, psi)
		var norm float64
		for _, v := range p {
			norm += v
		}
		assert.InDelta(t, 1, norm, 1e-13, "norm t=%v", tt)
		assert.InDelta(t, 2*tt*tt, MSD(p, coords, 1, []float64{0}), 1e-10*(1+tt*tt), "MSD t=%v", tt)
		// Symmetric distribution: centroid 0, spread = MSD.
		c := Centroid(nil, p, coords, 1)
		assert.InDelta(t, 0, c[0], 1e-12)
		assert.InDelta(t, 2*tt*tt, Spread(p, coords, 1), 1e-10*(1+tt*tt))
		j0 := math.J0(2 * tt)
		assert.InDelta(t, j0*j0, p[80], 1e-15)
	}
	// Check values at γ = 1, t = 1: p0 = 0.0501270809844695, p1 = 0.332611503882203
	// (references.md, [derived]).
	psi, _ := chainState(1, 40)
	p := Probabilities(nil, psi)
	assert.InDelta(t, 0.0501270809844695, p[40], 1e-15)
	assert.InDelta(t, 0.332611503882203, p[41], 1e-14)
}

func TestSquareFactorised(t *testing.T) {
	// Z²: amplitudes factorise, MSD = 2dγ²t² with d = 2 (references.md [derived]).
	const m = 40
	tt := 3.0
	psi1, x := chainState(tt, m)
	n := len(psi1)
	p := make([]float64, n*n)
	coords := make([]float64, 2*n*n)
	for i := range n {
		for j := range n {
			k := i + n*j
			p[k] = abs2(psi1[i] * psi1[j])
			coords[2*k], coords[2*k+1] = x[i], x[j]
		}
	}
	assert.InDelta(t, 4*tt*tt, MSD(p, coords, 2, []float64{0, 0}), 1e-10)
	assert.InDelta(t, 4*tt*tt, Spread(p, coords, 2), 1e-10)
	// The generic path (dim > 2) agrees with the two-dimensional one when a
	// third zero coordinate is appended.
	c3 := make([]float64, 3*n*n)
	for k := range n * n {
		c3[3*k], c3[3*k+1] = coords[2*k], coords[2*k+1]
	}
	assert.InDelta(t, MSD(p, coords, 2, []float64{1, -2}), MSD(p, c3, 3, []float64{1, -2, 0}), 1e-10)
}

func TestSpreadShift(t *testing.T) {
	// Spread is translation invariant, MSD about the centroid equals Spread,
	// and MSD(r0) = Spread + ‖r̄ − r0‖² (parallel-axis theorem, common practice).
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := range 20 {
		n, dim := 1+rng.IntN(50), 1+rng.IntN(4)
		p := make([]float64, n)
		var w float64
		for i := range p {
			p[i] = rng.Float64()
			w += p[i]
		}
		for i := range p {
			p[i] /= w
		}
		coords := make([]float64, n*dim)
		shifted := make([]float64, n*dim)
		for i := range coords {
			coords[i] = rng.NormFloat64() * 3
			shifted[i] = coords[i] + 1e6 // far from the origin: one-pass formula would lose ~12 digits
		}
		s := Spread(p, coords, dim)
		assert.InDelta(t, s, Spread(p, shifted, dim), 1e-8*(1+s), "trial %d", trial)
		c := Centroid(nil, p, coords, dim)
		assert.InDelta(t, s, MSD(p, coords, dim, c), 1e-10*(1+s))
		r0 := make([]float64, dim)
		var d2 float64
		for d := range r0 {
			r0[d] = rng.NormFloat64()
			d2 += (c[d] - r0[d]) * (c[d] - r0[d])
		}
		assert.InDelta(t, s+d2, MSD(p, coords, dim, r0), 1e-10*(1+s+d2))
	}
}

func TestIPREntropy(t *testing.T) {
	// Uniform on N sites: IPR 1/N, participation N, entropy ln N (common practice).
	for _, n := range []int{1, 2, 7, 1000} {
		p := make([]float64, n)
		for i := range p {
			p[i] = 1 / float64(n)
		}
		assert.InDelta(t, 1/float64(n), IPR(p), 1e-15)
		assert.InDelta(t, float64(n), Participation(p), 1e-9*float64(n))
		assert.InDelta(t, math.Log(float64(n)), Entropy(p), 1e-12)
	}
	// 0 ln 0 = 0; localised state has zero entropy; all-zero vector gives
	// participation 0, not +Inf.
	assert.Equal(t, 0.0, Entropy([]float64{0, 1, 0}))
	assert.Equal(t, 0.0, Participation([]float64{0, 0}))
	assert.Equal(t, 0.0, Entropy([]float64{0, -1e-18}))
}

func TestRegion(t *testing.T) {
	// A 5×5 grid with uniform weights.
	const w = 5
	p := make([]float64, w*w)
	coords := make([]float64, 2*w*w)
	for y := range w {
		for x := range w {
			k := x + w*y
			p[k] = 1.0 / (w * w)
			coords[2*k], coords[2*k+1] = float64(x), float64(y)
		}
	}
	// Disc of radius 1 around (2,2): 5 sites.
	assert.InDelta(t, 5.0/25, RegionProbability(p, coords, 2, Disc{Center: []float64{2, 2}, Radius: 1}), 1e-15)
	// Disc of radius √2: 9 sites (boundary included).
	assert.InDelta(t, 9.0/25, RegionProbability(p, coords, 2, Disc{Center: []float64{2, 2}, Radius: math.Sqrt2 + 1e-12}), 1e-15)
	// Box [0,1]×[0,4]: 10 sites.
	assert.InDelta(t, 10.0/25, RegionProbability(p, coords, 2, Box{Min: []float64{0, 0}, Max: []float64{1, 4}}), 1e-15)
	assert.InDelta(t, 3.0/25, RegionProbability(p, coords, 2, Sites{0, 4, 24}), 1e-15)
	assert.True(t, Sites{3, 9}.Contains(9, nil))
	assert.False(t, Sites{3, 9}.Contains(8, nil))

	// Radial profile about (0,0) with unit shells: counts per shell of a 5×5
	// quarter grid by floor(r); the total is conserved (common practice).
	prof, over := RadialProfile(nil, p, coords, 2, []float64{0, 0}, 1)
	var tot float64
	for _, v := range prof {
		tot += v
	}
	assert.InDelta(t, 1, tot, 1e-15)
	assert.Equal(t, 0.0, over)
	assert.Len(t, prof, 6)                    // r_max = √32 ≈ 5.66
	assert.InDelta(t, 1.0/25, prof[0], 1e-15) // (0,0)
	assert.InDelta(t, 3.0/25, prof[1], 1e-15) // (1,0),(0,1),(1,1)
	dst := make([]float64, 2)
	_, over = RadialProfile(dst, p, coords, 2, []float64{0, 0}, 1)
	assert.InDelta(t, 21.0/25, over, 1e-15)
}

func TestAllocFree(t *testing.T) {
	psi, coords := chainState(2, 30)
	p := make([]float64, len(psi))
	c := make([]float64, 1)
	prof := make([]float64, 10)
	origin := []float64{0}
	var r Region = Disc{Center: origin, Radius: 3}
	allocs := testing.AllocsPerRun(10, func() {
		Probabilities(p, psi)
		MSD(p, coords, 1, origin)
		Spread(p, coords, 1)
		Centroid(c, p, coords, 1)
		IPR(p)
		Participation(p)
		Entropy(p)
		RegionProbability(p, coords, 1, r)
		RadialProfile(prof, p, coords, 1, origin, 1)
	})
	require.Equal(t, 0.0, allocs)
}

func TestPanicsOnMisuse(t *testing.T) {
	assert.Panics(t, func() { MSD([]float64{1}, []float64{0, 0, 0}, 2, []float64{0, 0}) })
	assert.Panics(t, func() { MSD([]float64{1}, []float64{0, 0}, 2, []float64{0}) })
	assert.Panics(t, func() { Probabilities(make([]float64, 2), make([]complex128, 3)) })
	assert.Panics(t, func() { RadialProfile(nil, []float64{1}, []float64{0}, 1, []float64{0}, 0) })
}
