package lattice

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Fibonacci returns the Fibonacci chain of n sites: site i at (i, 0), bond
// i–(i+1) (in order of i) with hopping strong or weak according to letter i
// of the infinite Fibonacci word S W S S W S W S S W S S W … (the fixed
// point of the substitution S → SW, W → S; a fraction 1/φ of the letters
// are S, φ the golden ratio). Kohmoto, Kadanoff, Tang, PRL 50, 1870 (1983)
// (from memory) for the model. Parameters: "sites" n ≥ 1, "weak" and
// "strong" finite and non-zero.
func Fibonacci(n int, weak, strong float64) (*Graph, error) {
	if err := checkInt("sites", n, 1, MaxSites); err != nil {
		return nil, err
	}
	if err := checkHopping("weak", weak); err != nil {
		return nil, err
	}
	if err := checkHopping("strong", strong); err != nil {
		return nil, err
	}
	if err := checkSize("sites", float64(n), float64(n-1), 2); err != nil {
		return nil, err
	}
	g, _ := Chain(n, false)
	g.w = make([]float64, n-1)
	for i, strongLetter := range fibonacciWord(n - 1) {
		if strongLetter {
			g.w[i] = strong
		} else {
			g.w[i] = weak
		}
	}
	return g, nil
}

// fibonacciWord returns the first m letters of the Fibonacci word, true
// for S, built by the substitution S → SW, W → S.
func fibonacciWord(m int) []bool {
	w := []bool{true}
	for len(w) < m {
		next := make([]bool, 0, 2*len(w))
		for _, s := range w {
			if s {
				next = append(next, true, false)
			} else {
				next = append(next, true)
			}
		}
		w = next
	}
	return w[:m]
}

// Harper returns the Aubry–André–Harper chain of n sites: site i at (i, 0),
// unit hoppings i–(i+1) (in order of i, open ends) and on-site energies
// ε_i = λ·cos(2πβ·i + phase). For irrational β the eigenstates are all
// extended for λ < 2 and all localised for λ > 2 (Aubry & André, Ann. Israel
// Phys. Soc. 3, 133 (1980); Harper, Proc. Phys. Soc. A 68, 874 (1955); both
// from memory). Parameters: "sites" n ≥ 1; "lambda", "beta" and "phase"
// finite.
func Harper(n int, lambda, beta, phase float64) (*Graph, error) {
	if err := checkInt("sites", n, 1, MaxSites); err != nil {
		return nil, err
	}
	for _, p := range []struct {
		name string
		v    float64
	}{{"lambda", lambda}, {"beta", beta}, {"phase", phase}} {
		if math.IsNaN(p.v) || math.IsInf(p.v, 0) {
			return nil, fault.Range(p.name, "a finite number", p.v)
		}
	}
	if err := checkSize("sites", float64(n), float64(n-1), 2); err != nil {
		return nil, err
	}
	g, _ := Chain(n, false)
	if lambda != 0 {
		g.onsite = make([]float64, n)
		for i := range g.onsite {
			g.onsite[i] = lambda * math.Cos(2*math.Pi*beta*float64(i)+phase)
		}
	}
	return g, nil
}

// checkHopping returns an Invalid error unless v is finite and non-zero.
func checkHopping(field string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) || v == 0 {
		return fault.Range(field, "a finite, non-zero number", v)
	}
	return nil
}
