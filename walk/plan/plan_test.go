package plan

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestExponentError compares the closed form with the ordinary least-squares
// slope error s/√Σ(x − x̄)² computed directly (common practice).
func TestExponentError(t *testing.T) {
	for _, n := range []int{2, 3, 5, 17} {
		L, s := 2.3, 0.04
		var xs []float64
		for c := 0; c < n; c++ {
			xs = append(xs, L*(float64(c)+0.5)/float64(n))
		}
		var m, sxx float64
		for _, x := range xs {
			m += x / float64(n)
		}
		for _, x := range xs {
			sxx += (x - m) * (x - m)
		}
		assert.InDelta(t, s/math.Sqrt(sxx), exponentError(s, L, n), 1e-14)
	}
	assert.True(t, math.IsInf(exponentError(1, 1, 1), 1))
}

// chainRequest is a 31-site straight array at 15 µm spacing with the
// exponential law C(15 µm) = 1.5 cm⁻¹, κ = 0.2 µm⁻¹ (demo values, Szameit
// & Nolte, J. Phys. B 43, 163001 (2010), from memory; not references). The
// ballistic front (speed 2C sites per cm) reaches the ends near z = 5 cm.
func chainRequest() Request {
	n := 31
	pos := make([]float64, n)
	for i := range pos {
		pos[i] = 15 * float64(i)
	}
	return Request{
		Positions: pos, Dim: 1, Law: lattice.Exponential{C0: 1.5, Kappa: 0.2, D0: 15}, Cutoff: 16,
		Start: 15, MaxLength: 15, MinLength: 0.1, Samples: 12,
		Fabrication:  lattice.Fabrication{Jitter: 0.2, Law: lattice.Gauss},
		Realisations: 8, Seed: 1, Precision: 0.05, Noise: 0.02,
	}
}

func TestMakeChain(t *testing.T) {
	req := chainRequest()
	pl, err := Make(context.Background(), req)
	require.NoError(t, err)
	require.Len(t, pl.Samples, req.Samples)
	require.NotEmpty(t, pl.Regimes)
	// The first regime is the ballistic spreading of the chain: MSD ∝ z²
	// (Childs, Farhi & Gutmann, Quantum Inf. Process. 1, 35 (2002), from
	// memory; the fit is loose on a short window, allow ±0.2).
	assert.InDelta(t, 2, pl.Regimes[0].Exponent, 0.2)
	total := 0
	for _, g := range pl.Regimes {
		assert.GreaterOrEqual(t, g.Samples, 3)
		total += g.Samples
		assert.Equal(t, g.PredictedError <= req.Precision, g.Meets)
	}
	assert.Equal(t, req.Samples, total)
	for i, s := range pl.Samples {
		assert.GreaterOrEqual(t, s.Length, req.MinLength)
		assert.LessOrEqual(t, s.Length, req.MaxLength)
		if i > 0 {
			assert.Greater(t, s.Length, pl.Samples[i-1].Length)
		}
		g := pl.Regimes[s.Regime]
		assert.True(t, s.Length > g.From && s.Length < g.To)
		assert.Greater(t, s.MSD, 0.0)
	}
	// Early on the ensemble MSD is ballistic with the nominal coupling:
	// 2(Cz)² sites², times (15 µm)² (Childs et al. 2002, from memory).
	z0 := pl.Grid[0]
	want := 2 * 1.5 * 1.5 * z0 * z0 * 15 * 15
	assert.InDelta(t, want, pl.MSD[0], 0.02*want)
	assert.Contains(t, pl.Rationale, "calibrated")

	// Same seed, same plan.
	pl2, err := Make(context.Background(), req)
	require.NoError(t, err)
	assert.Equal(t, pl.MSD, pl2.MSD)
	assert.Equal(t, pl.Samples, pl2.Samples)

	var b bytes.Buffer
	require.NoError(t, pl.WriteCSV(&b))
	lines := strings.Split(strings.TrimSpace(b.String()), "\n")
	assert.Equal(t, "sample,length,regime,kind,msd,msd_spread", lines[0])
	assert.Len(t, lines, req.Samples+1)
	b.Reset()
	require.NoError(t, pl.WriteJSON(&b))
	var back map[string]any
	require.NoError(t, json.Unmarshal(b.Bytes(), &back))
	assert.Contains(t, back, "samples")
	assert.Contains(t, back, "rationale")
}

// TestMakeMoreSamplesHelp checks that the allocation is monotone: with
// Needed samples every regime meets the target, and more samples never
// increase any predicted error.
func TestMakeMoreSamplesHelp(t *testing.T) {
	req := chainRequest()
	req.Samples = 3 * 4 // enough for up to four regimes
	pl, err := Make(context.Background(), req)
	require.NoError(t, err)
	if pl.Needed > req.Samples && pl.Needed <= 200 {
		req.Samples = pl.Needed
		pl2, err := Make(context.Background(), req)
		require.NoError(t, err)
		for i, g := range pl2.Regimes {
			assert.True(t, g.Meets, "regime %d: %+v", i, g)
			assert.LessOrEqual(t, g.PredictedError, pl.Regimes[i].PredictedError)
		}
	}
}

func TestMakeErrors(t *testing.T) {
	var ie *InputError
	for _, c := range []struct {
		mod   func(*Request)
		field string
	}{
		{func(r *Request) { r.Dim = 0 }, "dim"},
		{func(r *Request) { r.Start = 99 }, "start"},
		{func(r *Request) { r.MaxLength = 0 }, "max_length"},
		{func(r *Request) { r.MinLength = 20 }, "min_length"},
		{func(r *Request) { r.Samples = 2 }, "samples"},
		{func(r *Request) { r.Precision = -1 }, "precision"},
		{func(r *Request) { r.Noise = math.NaN() }, "noise"},
		{func(r *Request) { r.Points = 3 }, "points"},
		{func(r *Request) { r.Fabrication.Jitter = -1 }, "fabrication.jitter"},
		{func(r *Request) { r.Cutoff = 0 }, "cutoff"},
	} {
		req := chainRequest()
		c.mod(&req)
		_, err := Make(context.Background(), req)
		require.True(t, errors.As(err, &ie), "%s: %v", c.field, err)
		assert.Equal(t, c.field, ie.Field)
	}
}
