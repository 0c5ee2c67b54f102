package spectra

import (
	"context"
	"errors"
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

func TestJackson(t *testing.T) {
	// Jackson kernel for M = 8: Weiße, Wellein, Alvermann, Fehske, Rev. Mod.
	// Phys. 78, 275 (2006) (from memory); references.md [derived].
	want := []float64{1, 0.9396926, 0.7920395, 0.5977095, 0.3971087, 0.2234605, 0.0977095, 0.0259951}
	require.InDeltaSlice(t, want, Jackson(8), 5e-8)
}

func TestBoundsEnclose(t *testing.T) {
	// Gasket adjacency spectrum [−2, 4]: benchmarks.md and references.md.
	g := gasketGraph(t, 5)
	lo, hi, err := Bounds(g.Hamiltonian(1), 0, 1)
	require.NoError(t, err)
	require.LessOrEqual(t, lo, -2+1e-9)
	require.GreaterOrEqual(t, hi, 4-1e-9)
	// Tighter than Gershgorin's [−4, 4] on the low side (benchmarks.md: a = 3, not 4).
	require.Greater(t, lo, -2.5)
	require.Less(t, hi, 4.5)
}

// cumulativeAt returns the integrated density at energy e by linear
// interpolation inside the bin.
func cumulativeAt(d DOS, e float64) float64 {
	var s float64
	for b, v := range d.Density {
		left := d.Energy[b] - d.Width/2
		if e >= left+d.Width {
			s += v * d.Width
			continue
		}
		if e > left {
			s += v * (e - left)
		}
		break
	}
	return s
}

func TestKPMMatchesExact(t *testing.T) {
	// The periodic 40×40 square lattice: KPM against the exact counting
	// function from 2cos(2πk/L) + 2cos(2πl/L) (references.md [derived]).
	const L = 40
	g := torusGraph(t, L)
	var exact []float64
	for k := 0; k < L; k++ {
		for l := 0; l < L; l++ {
			exact = append(exact, 2*math.Cos(2*math.Pi*float64(k)/L)+2*math.Cos(2*math.Pi*float64(l)/L))
		}
	}
	for _, complexH := range []bool{false, true} {
		h := g.Hamiltonian(1)
		if complexH {
			// The same real matrix stored as complex (zero phases) takes the
			// random-phase path.
			h.Val = make([]float64, h.NNZ())
			h.Imag = make([]float64, h.NNZ())
			for k := range h.Val {
				h.Val[k] = 1
			}
		}
		d, err := KPM(h, KPMSettings{Moments: 256, Vectors: 20, Seed: 3, Bins: 100})
		require.NoError(t, err)
		require.InDelta(t, 1, integral(d), 1e-9)
		require.Len(t, d.Error, 100)
		// 1/√(R·N) with R = 20, N = 1600 (Weiße et al. 2006).
		require.InDelta(t, 1/math.Sqrt(20*1600), d.Nominal, 1e-15)
		// The integrated DOS agrees with the exact one to a few times the
		// stochastic error plus the kernel's resolution (≈ πa/M ≈ 0.05 in energy
		// here, which moves at most a few per cent of the levels).
		for _, e := range []float64{-3, -2, -1, -0.5, 0.5, 1, 2, 3} {
			want := Counting(exact, []float64{e})[0]
			require.InDelta(t, want, cumulativeAt(d, e), 0.03, "E=%v complex=%v", e, complexH)
		}
		require.GreaterOrEqual(t, d.Lo, -4.5)
		require.LessOrEqual(t, d.Hi, 4.5)
	}
}

func TestKPMReproducible(t *testing.T) {
	h := gasketGraph(t, 4).Hamiltonian(1)
	a, err := KPM(h, KPMSettings{Moments: 64, Vectors: 5, Seed: 9, Workers: 1})
	require.NoError(t, err)
	b, err := KPM(h, KPMSettings{Moments: 64, Vectors: 5, Seed: 9, Workers: 2})
	require.NoError(t, err)
	require.Equal(t, a.Density, b.Density) // per-vector streams: independent of workers
}

func TestLocalDOS(t *testing.T) {
	// The LDOS at a site is Σ_n |ψ_n(i)|² δ(E − E_n): compare its integral
	// up to E with the exact eigenvector weights (common practice).
	g := gasketGraph(t, 4)
	e, err := Eigensystem(g, 1)
	require.NoError(t, err)
	const site = 0
	d, err := LocalDOS(g.Hamiltonian(1), site, KPMSettings{Moments: 400, Bins: 300})
	require.NoError(t, err)
	require.Nil(t, d.Error)
	require.InDelta(t, 1, integral(d), 1e-9)
	for _, x := range []float64{-1.5, 0, 1, 2.5, 3.5} {
		var want float64
		for k, v := range e.Values {
			if v <= x {
				want += e.Weight(site, k)
			}
		}
		// Exact moments: the error is the Jackson kernel's smearing of the
		// steps (width ≈ πa/M ≈ 0.025 here, Weiße et al. 2006) at the test
		// energies, which sit at least that far from the largest steps.
		require.InDelta(t, want, cumulativeAt(d, x), 0.02, "E=%v", x)
	}
}

func TestKPMKnownBoundsTooTight(t *testing.T) {
	h := cycleGraph(t, 20).Hamiltonian(1)
	_, err := KPM(h, KPMSettings{Moments: 64, Lo: -1, Hi: 1})
	var fe *InputError
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "numerical", fe.Kind.String())
}

func TestKPMSettingsErrors(t *testing.T) {
	h := cycleGraph(t, 5).Hamiltonian(1)
	var fe *InputError
	for _, c := range []struct {
		s     KPMSettings
		field string
	}{
		{KPMSettings{Moments: 1}, "dos.moments"},
		{KPMSettings{Vectors: -2}, "dos.vectors"},
		{KPMSettings{Bins: -1}, "dos.bins"},
		{KPMSettings{Lo: math.NaN()}, "dos.bounds"},
		{KPMSettings{Lo: 2, Hi: 1}, "dos.bounds"},
	} {
		_, err := KPM(h, c.s)
		require.True(t, errors.As(err, &fe))
		require.Equal(t, c.field, fe.Field)
	}
	_, err := LocalDOS(h, 5, KPMSettings{})
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "dos.site", fe.Field)
}

func TestKPMSingleSite(t *testing.T) {
	g, err := lattice.New(1, 1, nil, nil, []float64{0.5})
	require.NoError(t, err)
	d, err := KPM(g.Hamiltonian(1), KPMSettings{Moments: 32, Bins: 10})
	require.NoError(t, err)
	require.InDelta(t, 1, integral(d), 1e-9)
}

func TestKPMFluxRing(t *testing.T) {
	// A ring of 30 threaded by flux Φ = 0.9 (bond phases Φ/30): levels
	// 2cos((2πk + Φ)/30) (common practice: Peierls substitution), each with
	// weight 1/30 on every site, so the LDOS and the DOS agree with the
	// exact counting function.
	const n, phi = 30, 0.9
	var b []lattice.Bond
	for i := 0; i < n; i++ {
		b = append(b, lattice.Bond{I: i, J: (i + 1) % n, W: 1, Phase: phi / n})
	}
	g := mustGraph(t, n, 1, nil, b)
	require.False(t, g.IsReal())
	var exact []float64
	for k := 0; k < n; k++ {
		exact = append(exact, 2*math.Cos((2*math.Pi*float64(k)+phi)/n))
	}
	ld, err := LocalDOS(g.Hamiltonian(1), 7, KPMSettings{Moments: 600, Bins: 400})
	require.NoError(t, err)
	d, err := KPM(g.Hamiltonian(1), KPMSettings{Moments: 600, Vectors: 40, Seed: 2, Bins: 400})
	require.NoError(t, err)
	// Between levels, away from the steps by more than the kernel width
	// (πa/M ≈ 0.01): halfway between consecutive exact levels.
	s := sorted(exact)
	for k := 1; k < n; k += 3 {
		if s[k]-s[k-1] < 0.05 {
			continue
		}
		e := (s[k] + s[k-1]) / 2
		want := Counting(exact, []float64{e})[0]
		require.InDelta(t, want, cumulativeAt(ld, e), 0.01, "LDOS E=%v", e)
		// The stochastic trace with 40 random phase vectors on 30 sites:
		// error ≈ 1/√(R·N) ≈ 0.03 (Weiße et al. 2006); 3σ.
		require.InDelta(t, want, cumulativeAt(d, e), 0.09, "DOS E=%v", e)
	}
}

func TestKPMCancel(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := KPMContext(ctx, gasketGraph(t, 5).Hamiltonian(1), KPMSettings{})
	require.True(t, errors.Is(err, context.Canceled))
	var fe *InputError
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "cancelled", fe.Kind.String())
}

func TestKPMLimits(t *testing.T) {
	h := cycleGraph(t, 5).Hamiltonian(1)
	var fe *InputError
	_, err := KPM(h, KPMSettings{Moments: 65536, Vectors: 1000})
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "dos.vectors", fe.Field)
	_, err = KPM(h, KPMSettings{Moments: 65536, Bins: 1 << 20})
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "dos.bins", fe.Field)
}
