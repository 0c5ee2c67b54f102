package spectra

import (
	"errors"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

func unionValues(secs []Sector) []float64 {
	var v []float64
	for _, s := range secs {
		v = append(v, s.Values...)
	}
	return v
}

func TestSectorsRing(t *testing.T) {
	const n = 12
	g := cycleGraph(t, n)
	secs, err := Sectors(g, 1, []Symmetry{Translation(n)}, true)
	require.NoError(t, err)
	require.Len(t, secs, n)
	for _, s := range secs {
		// Momentum sector q: the single level 2cos(2πq/N) (references.md [derived]).
		require.Len(t, s.Values, 1)
		require.InDelta(t, 2*math.Cos(2*math.Pi*float64(s.Label[0])/n), s.Values[0], 1e-12)
		// ψ(x+1) = e^{−2πiq/N} ψ(x), as documented.
		want := cmplx.Rect(1, -2*math.Pi*float64(s.Label[0])/n)
		for x := 0; x < n; x++ {
			require.InDelta(t, 0, cmplx.Abs(s.Vectors[(x+1)%n]-want*s.Vectors[x]), 1e-12)
		}
	}
}

func TestSectorsUnionEqualsFull(t *testing.T) {
	tor := torusGraph(t, 6)
	gas := gasketGraph(t, 3)
	// Rotation of the gasket by 120° about its centroid: a C3 symmetry of
	// the graph as built (common practice).
	cx, cy := 4.0, 4.0/math.Sqrt(3) // centroid of (0,0), (8,0), (4, 4√3)
	rot, err := PositionSymmetry(gas, "C3", func(dst, p []float64) {
		s, c := math.Sincos(2 * math.Pi / 3)
		x, y := p[0]-cx, p[1]-cy
		dst[0], dst[1] = cx+c*x-s*y, cy+s*x+c*y
	})
	require.NoError(t, err)
	cases := []struct {
		name  string
		g     *lattice.Graph
		syms  []Symmetry
		count int
	}{
		{"torus", tor, SquareTranslations(6, 6), 36},
		{"path reflection", pathGraph(t, 9), []Symmetry{Reflection(9)}, 2},
		{"ring reflection", cycleGraph(t, 10), []Symmetry{Reflection(10)}, 2},
		{"gasket C3", gas, []Symmetry{rot}, 3},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			full, err := Eigenvalues(c.g, 0.7)
			require.NoError(t, err)
			secs, err := Sectors(c.g, 0.7, c.syms, true)
			require.NoError(t, err)
			require.Len(t, secs, c.count)
			requireClose(t, full, unionValues(secs), 1e-10)
			// Each sector's vectors are eigenvectors of H: check H·ψ = Eψ.
			h := DenseReal(c.g, 0.7)
			n := c.g.Len()
			for _, s := range secs {
				d := len(s.Values)
				for k := 0; k < d; k++ {
					for i := 0; i < n; i++ {
						var z complex128
						for j := 0; j < n; j++ {
							z += complex(h[i*n+j], 0) * s.Vectors[j*d+k]
						}
						require.InDelta(t, 0, cmplx.Abs(z-complex(s.Values[k], 0)*s.Vectors[i*d+k]), 1e-10)
					}
				}
			}
		})
	}
}

func TestSectorsPathReflection(t *testing.T) {
	// Path P_9: even states sin(πjk/10) with k odd, odd ones with k even
	// (references.md [derived] for the levels 2cos(πk/(N+1))).
	secs, err := Sectors(pathGraph(t, 9), 1, []Symmetry{Reflection(9)}, false)
	require.NoError(t, err)
	var even, odd []float64
	for k := 1; k <= 9; k++ {
		e := 2 * math.Cos(math.Pi*float64(k)/10)
		if k%2 == 1 {
			even = append(even, e)
		} else {
			odd = append(odd, e)
		}
	}
	require.Equal(t, []int{0}, secs[0].Label)
	requireClose(t, even, secs[0].Values, 1e-12)
	requireClose(t, odd, secs[1].Values, 1e-12)
}

func TestSectorsRatio(t *testing.T) {
	// A ring of L identical random cells (GOE-like couplings inside and
	// between cells): the full spectrum superposes L independent sectors and
	// pairs q with L−q exactly, so its r̃ falls towards Poisson, while inside
	// a sector r̃ is of GOE (q = 0, L/2) or GUE type (Atas et al., PRL 110,
	// 084101 (2013): 0.5307 and 0.5996).
	const m, L = 60, 8
	rng := rand.New(rand.NewPCG(11, 12))
	var bonds []lattice.Bond
	type cb struct {
		a, b int
		w    float64
	}
	var inside, between []cb
	for a := 0; a < m; a++ {
		for b := a + 1; b < m; b++ {
			inside = append(inside, cb{a, b, rng.NormFloat64()})
		}
		for b := 0; b < m; b++ {
			between = append(between, cb{a, b, rng.NormFloat64()})
		}
	}
	for c := 0; c < L; c++ {
		for _, x := range inside {
			bonds = append(bonds, lattice.Bond{I: c*m + x.a, J: c*m + x.b, W: x.w})
		}
		for _, x := range between {
			bonds = append(bonds, lattice.Bond{I: c*m + x.a, J: ((c+1)%L)*m + x.b, W: x.w})
		}
	}
	g := mustGraph(t, m*L, 1, nil, bonds)
	shift := make([]int, m*L)
	for i := range shift {
		shift[i] = (i + m) % (m * L)
	}
	secs, err := Sectors(g, 1, []Symmetry{{Name: "cell shift", Perm: shift}}, false)
	require.NoError(t, err)
	require.Len(t, secs, L)
	full, err := Eigenvalues(g, 1)
	require.NoError(t, err)
	requireClose(t, full, unionValues(secs), 1e-9)
	var sum float64
	var used int
	for _, s := range secs[:L/2+1] { // q and L−q are time-reversed copies
		st := SpacingRatio(s.Values[m/6:m-m/6], 1e-9) // away from the band edges
		sum += st.Mean * float64(st.Used)
		used += st.Used
	}
	inSector := sum / float64(used)
	// 5 sectors × 38 ratios: standard error ≈ 0.25/√190 ≈ 0.02 (σ from Atas
	// et al. 2013, from memory); between GOE and GUE, with 3σ margins.
	require.Greater(t, inSector, 0.47)
	require.Less(t, inSector, 0.66)
	all := SpacingRatio(full[m*L/6:m*L-m*L/6], 1e-9)
	require.Greater(t, all.Degenerate, 100) // the q, L−q pairs
	require.Less(t, all.Mean, 0.45)
}

func TestSectorsErrors(t *testing.T) {
	var fe *InputError
	g := pathGraph(t, 5)
	_, err := Sectors(g, 1, []Symmetry{Translation(5)}, false)
	require.True(t, errors.As(err, &fe)) // the open chain is not translation invariant
	require.Equal(t, "symmetry[0]", fe.Field)
	_, err = Sectors(g, 1, []Symmetry{{Perm: []int{0, 1, 2}}}, false)
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "symmetry[0]", fe.Field)
	_, err = Sectors(g, 1, []Symmetry{{Perm: []int{0, 0, 2, 3, 4}}}, false)
	require.True(t, errors.As(err, &fe))
	_, err = Sectors(cycleGraph(t, 6), 1, []Symmetry{Translation(6), Reflection(6)}, false)
	require.True(t, errors.As(err, &fe)) // translations and reflections do not commute
	require.Equal(t, "symmetry[1]", fe.Field)
	_, err = Sectors(g, 1, nil, false)
	require.True(t, errors.As(err, &fe))
	_, err = PositionSymmetry(g, "shift", func(dst, p []float64) { dst[0] = p[0] + 0.5 })
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "symmetry", fe.Field)
}

func TestSectorsCarpetRotation(t *testing.T) {
	// The carpet (cells variant, generation 2, 64 sites) is invariant under
	// the 90° rotation about its centre (common practice): four sectors
	// whose union is the full spectrum.
	g, err := lattice.Carpet(2, lattice.CarpetCells)
	require.NoError(t, err)
	rot, err := PositionSymmetry(g, "C4", func(dst, p []float64) {
		dst[0], dst[1] = 9-p[1], p[0] // (x, y) → (L − y, x) about (L/2, L/2), L = 9
	})
	require.NoError(t, err)
	secs, err := Sectors(g, 1, []Symmetry{rot}, false)
	require.NoError(t, err)
	require.Len(t, secs, 4)
	full, err := Eigenvalues(g, 1)
	require.NoError(t, err)
	requireClose(t, full, unionValues(secs), 1e-10)
}

func TestSectorsLargeRing(t *testing.T) {
	// Beyond MaxDense sites a dense diagonalisation is refused, but the
	// momentum sectors of a ring are 1×1: 2cos(2πq/N) (references.md [derived]).
	n := MaxDense + 7
	g := cycleGraph(t, n)
	_, err := Eigenvalues(g, 1)
	require.Error(t, err)
	secs, err := Sectors(g, 1, []Symmetry{Translation(n)}, false)
	require.NoError(t, err)
	require.Len(t, secs, n)
	for _, q := range []int{0, 1, n / 3, n - 1} {
		require.InDelta(t, 2*math.Cos(2*math.Pi*float64(q)/float64(n)), secs[q].Values[0], 1e-12)
	}
	t.Setenv("AMPWALK_MEMORY_LIMIT", "100000")
	_, err = Sectors(cycleGraph(t, 200), 1, []Symmetry{Translation(200)}, true)
	var fe *InputError
	require.True(t, errors.As(err, &fe))
	require.Equal(t, "too-large", fe.Kind.String())
}

func TestSectorsFluxRing(t *testing.T) {
	// A ring of 10 threaded by flux Φ (bond phases Φ/10): sector q holds
	// 2cos(2πq/N − Φ/N) for ψ(x) ∝ e^{−2πiqx/N} (derived from the
	// documented convention; Peierls substitution, common practice).
	const n, phi = 10, 1.3
	var b []lattice.Bond
	for i := 0; i < n; i++ {
		b = append(b, lattice.Bond{I: i, J: (i + 1) % n, W: 1, Phase: phi / n})
	}
	g := mustGraph(t, n, 1, nil, b)
	secs, err := Sectors(g, 1, []Symmetry{Translation(n)}, false)
	require.NoError(t, err)
	for _, s := range secs {
		require.InDelta(t, 2*math.Cos((2*math.Pi*float64(s.Label[0])-phi)/n), s.Values[0], 1e-12)
	}
	full, err := Eigenvalues(g, 1)
	require.NoError(t, err)
	requireClose(t, full, unionValues(secs), 1e-12)
	// Reversing the flux on one bond breaks the translation symmetry.
	b[3].Phase = -b[3].Phase
	g2 := mustGraph(t, n, 1, nil, b)
	_, err = Sectors(g2, 1, []Symmetry{Translation(n)}, false)
	require.Error(t, err)
}

func TestSectorsRandomSweep(t *testing.T) {
	// Seeded sweep: rings of identical random complex cells (phases, on-site
	// energies), reduced by the cell shift, by the shift and its square as
	// two (dependent) generators, and on a torus of cells by two shifts.
	// Invariant: the union of the sector spectra is the full spectrum
	// (common practice).
	rng := rand.New(rand.NewPCG(31, 32))
	for trial := 0; trial < 12; trial++ {
		m := 1 + rng.IntN(4)
		L1, L2 := 3+rng.IntN(4), 1+rng.IntN(3)
		if trial%3 != 2 {
			L2 = 1
		}
		cell := func(c1, c2 int) int { return ((c1%L1+L1)%L1 + L1*((c2%L2+L2)%L2)) * m }
		n := m * L1 * L2
		type tmpl struct {
			a, b, d1, d2 int
			w, ph        float64
		}
		var ts []tmpl
		for a := 0; a < m; a++ {
			for b := a + 1; b < m; b++ {
				ts = append(ts, tmpl{a, b, 0, 0, rng.NormFloat64(), rng.Float64() * 6})
			}
			for b := 0; b < m; b++ {
				ts = append(ts, tmpl{a, b, 1, 0, rng.NormFloat64(), rng.Float64() * 6})
				if L2 > 2 {
					ts = append(ts, tmpl{a, b, 0, 1, rng.NormFloat64(), rng.Float64() * 6})
				}
			}
		}
		on := make([]float64, m)
		for a := range on {
			on[a] = rng.NormFloat64()
		}
		var bonds []lattice.Bond
		onsite := make([]float64, n)
		for c2 := 0; c2 < L2; c2++ {
			for c1 := 0; c1 < L1; c1++ {
				for a := 0; a < m; a++ {
					onsite[cell(c1, c2)+a] = on[a]
				}
				for _, x := range ts {
					bonds = append(bonds, lattice.Bond{I: cell(c1, c2) + x.a, J: cell(c1+x.d1, c2+x.d2) + x.b, W: x.w, Phase: x.ph})
				}
			}
		}
		g, err := lattice.New(n, 1, nil, bonds, onsite)
		require.NoError(t, err)
		shift := func(d1, d2 int) Symmetry {
			p := make([]int, n)
			for c2 := 0; c2 < L2; c2++ {
				for c1 := 0; c1 < L1; c1++ {
					for a := 0; a < m; a++ {
						p[cell(c1, c2)+a] = cell(c1+d1, c2+d2) + a
					}
				}
			}
			return Symmetry{Perm: p}
		}
		var syms []Symmetry
		switch trial % 3 {
		case 0:
			syms = []Symmetry{shift(1, 0)}
		case 1:
			syms = []Symmetry{shift(1, 0), shift(2, 0)}
		default:
			syms = []Symmetry{shift(1, 0), shift(0, 1)}
		}
		full, err := Eigenvalues(g, 0.9)
		require.NoError(t, err)
		secs, err := Sectors(g, 0.9, syms, false)
		require.NoError(t, err, "trial %d", trial)
		requireClose(t, full, unionValues(secs), 1e-10)
	}
}
