package observables_test

import (
	"fmt"
	"math"
	"math/cmplx"

	"github.com/ampwalk/ampwalk/observables"
)

// The quantum walk on the infinite line started at site 0 has amplitudes
// (−i)^n J_n(2t) (γ = 1); its MSD is 2t² and its return probability J₀(2t)².
func ExampleMSD() {
	const m, t = 60, 3.0
	psi := make([]complex128, 2*m+1)
	coords := make([]float64, 2*m+1) // one coordinate per site
	for n := -m; n <= m; n++ {
		psi[n+m] = cmplx.Pow(-1i, complex(float64(n), 0)) * complex(math.Jn(n, 2*t), 0)
		coords[n+m] = float64(n)
	}
	p := observables.Probabilities(nil, psi)
	fmt.Printf("MSD    %.6f (2t² = %.1f)\n", observables.MSD(p, coords, 1, []float64{0}), 2*t*t)
	fmt.Printf("spread %.6f\n", observables.Spread(p, coords, 1))
	fmt.Printf("return %.6f\n", p[m])
	fmt.Printf("participation %.2f\n", observables.Participation(p))
	// Output:
	// MSD    18.000000 (2t² = 18.0)
	// spread 18.000000
	// return 0.022694
	// participation 10.58
}

// The Pólya number of the walk on the line measured at t = 1, 2, …, 10.
func ExamplePolya() {
	returns := make([]float64, 10)
	for k := range returns {
		j0 := math.J0(2 * float64(k+1))
		returns[k] = j0 * j0
	}
	p, err := observables.Polya(returns)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("P = %.6f\n", p)
	// Output:
	// P = 0.349394
}

// A series that grows ballistically, then diffusively, then saturates, as a
// walk on a finite disordered sample might (invented numbers). The fit finds
// the three regimes and the crossovers between them.
func ExampleFitRegimes() {
	var times, msd []float64
	for i := range 60 {
		t := math.Pow(10, -1+4*float64(i)/59) // 0.1 … 1000
		y := 2 * t * t
		if t > 1 {
			y = 2 * t
		}
		if t > 100 {
			y = 200
		}
		// A small deterministic ripple stands in for noise.
		times = append(times, t)
		msd = append(msd, y*(1+0.01*math.Sin(float64(7*i))))
	}
	fit, err := observables.FitRegimes(times, msd, nil, observables.RegimeSettings{Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range fit.Regimes {
		α := math.Round(r.Exponent*100)/100 + 0 // + 0 turns −0 into 0
		fmt.Printf("%-10s α = %.2f on [%.2g, %.2g]\n", r.Kind, α, r.From, r.To)
	}
	for _, c := range fit.Crossovers {
		fmt.Printf("crossover near t = %.2g\n", c.Time)
	}
	// Output:
	// ballistic  α = 2.00 on [0.1, 1]
	// diffusive  α = 1.00 on [1, 1e+02]
	// saturated  α = 0.00 on [1e+02, 1e+03]
	// crossover near t = 1
	// crossover near t = 1e+02
}

// Two photons entering neighbouring waveguides of a directional coupler
// (H = Cσ_x) at Ct = π/4: bosons always leave together (the coincidence Γ₁₂
// vanishes), distinguishable particles leave apart half the time.
func ExampleCorrelations() {
	c, s := math.Cos(math.Pi/4), math.Sin(math.Pi/4)
	u0 := []complex128{complex(c, 0), complex(0, -s)}
	u1 := []complex128{complex(0, -s), complex(c, 0)}
	for _, kind := range []observables.Statistics{observables.Bosons, observables.Fermions, observables.Distinguishable} {
		g := observables.Correlations(nil, u0, u1, kind)
		fmt.Printf("%-15s Γ11 %.2f Γ12 %.2f Γ21 %.2f Γ22 %.2f\n", kind, g[0], g[1], g[2], g[3])
	}
	// Output:
	// bosons          Γ11 1.00 Γ12 0.00 Γ21 0.00 Γ22 1.00
	// fermions        Γ11 0.00 Γ12 1.00 Γ21 1.00 Γ22 0.00
	// distinguishable Γ11 0.50 Γ12 0.50 Γ21 0.50 Γ22 0.50
}

// The infinite-time average return probability on the 4-cycle, whose
// eigenvalue 0 is doubly degenerate: (2N−2)/N² = 3/8.
func ExampleLongTimeAverageReal() {
	const n = 4
	values := []float64{-2, 0, 0, 2}
	h := 0.5
	r := 1 / math.Sqrt2
	// Columns: eigenvectors of the cycle adjacency for −2, 0, 0, 2.
	vectors := []float64{
		h, r, 0, h,
		-h, 0, r, h,
		h, -r, 0, h,
		-h, 0, -r, h,
	}
	p, err := observables.LongTimeAverageReal(values, vectors, n, 0, 1e-9)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p̄ = %.4f %.4f %.4f %.4f\n", p[0], p[1], p[2], p[3])
	// Output:
	// p̄ = 0.3750 0.1250 0.3750 0.1250
}

// Realisations may finish in any order; the ensemble folds them in
// realisation order, so the result does not depend on scheduling.
func ExampleEnsemble() {
	e := observables.NewEnsemble(2)
	results := map[int][]float64{2: {3, 30}, 0: {1, 10}, 1: {2, 20}}
	for _, k := range []int{2, 0, 1} {
		if err := e.Add(k, results[k]); err != nil {
			fmt.Println(err)
			return
		}
	}
	fmt.Printf("%d realisations: mean %.4g, standard error %.4g\n", e.Count(), e.Mean(nil), e.StdErr(nil))
	// Output:
	// 3 realisations: mean [2 20], standard error [0.5774 5.774]
}
