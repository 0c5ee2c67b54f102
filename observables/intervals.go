package observables

import (
	"math"
	"math/rand/v2"
	"sort"
)

// segmentCovariance returns s²(JᵀJ)⁻¹ restricted to the line coefficients
// (row-major, (K+2)×(K+2)) and the standard errors of the breakpoints, from
// the Jacobian of η with respect to (b₀, b₁, c₁…c_K, ψ₁…ψ_K):
// ∂η/∂ψ_k = −c_k·1(x > ψ_k). When the full problem is singular (a kink of
// zero angle) the breakpoints are dropped and their errors reported as 0.
func segmentCovariance(x, sw, psi, beta []float64, s2 float64) ([]float64, []float64) {
	n, k := len(x), len(psi)
	pl := k + 2
	for _, full := range []bool{true, false} {
		p := pl
		if full {
			p += k
		}
		a := make([]float64, n*p)
		for i, xi := range x {
			w := 1.0
			if sw != nil {
				w = sw[i]
			}
			a[i] = w
			a[i+n] = w * xi
			for j, s := range psi {
				if xi > s {
					a[i+(j+2)*n] = w * (xi - s)
					if full {
						a[i+(pl+j)*n] = -w * beta[j+2]
					}
				}
			}
		}
		dummyY := make([]float64, n)
		dummyB := make([]float64, p)
		if _, ok := householderLS(a, n, p, dummyY, dummyB); !ok {
			continue
		}
		c := make([]float64, p*p)
		if !rInverseCov(a, n, p, c) {
			continue
		}
		cov := make([]float64, pl*pl)
		for r := range pl {
			for cc := range pl {
				cov[r*pl+cc] = s2 * c[r*p+cc]
			}
		}
		se := make([]float64, k)
		if full {
			for j := range k {
				se[j] = math.Sqrt(math.Max(s2*c[(pl+j)*p+pl+j], 0))
			}
		}
		return cov, se
	}
	return make([]float64, pl*pl), make([]float64, k)
}

// bootstrapIntervals fills the Low and High of each crossover with 95%
// percentile bootstrap intervals and returns the kind of bootstrap used.
func bootstrapIntervals(bl *brokenLine, y, sw, psi []float64, cr []Crossover, s RegimeSettings, dof int) string {
	n, k := len(y), len(psi)
	bl.fit(psi, y)
	// Fitted curve and (unweighted) residuals in ln y.
	fitted := make([]float64, n)
	beta := bl.beta[:k+2]
	for i, x := range bl.x {
		e := beta[0] + beta[1]*x
		for j, p := range psi {
			if x > p {
				e += beta[j+2] * (x - p)
			}
		}
		fitted[i] = e
	}
	rng := rand.New(rand.NewPCG(s.Seed, 0x5e9))
	kind := "bootstrap-parametric"
	var resid []float64
	if sw == nil {
		kind = "bootstrap-residual"
		resid = make([]float64, n)
		var mean float64
		for i := range n {
			resid[i] = y[i] - fitted[i]
			mean += resid[i]
		}
		mean /= float64(n)
		infl := 1.0
		if dof > 0 {
			infl = math.Sqrt(float64(n) / float64(dof))
		}
		for i := range resid {
			resid[i] = (resid[i] - mean) * infl
		}
	}
	ys := make([]float64, n)
	trial := make([]float64, k)
	draws := make([][]float64, k)
	for j := range draws {
		draws[j] = make([]float64, 0, s.Replicates)
	}
	for range s.Replicates {
		for i := range n {
			if sw != nil {
				ys[i] = fitted[i] + rng.NormFloat64()/sw[i]
			} else {
				ys[i] = fitted[i] + resid[rng.IntN(n)]
			}
		}
		copy(trial, psi)
		bl.setY(ys)
		bl.refine(trial)
		for j, p := range trial {
			draws[j] = append(draws[j], p)
		}
	}
	for j := range cr {
		d := draws[j]
		sort.Float64s(d)
		cr[j].Low = math.Exp(quantile(d, 0.025))
		cr[j].High = math.Exp(quantile(d, 0.975))
		// The interval always contains the estimate itself.
		cr[j].Low = math.Min(cr[j].Low, cr[j].Time)
		cr[j].High = math.Max(cr[j].High, cr[j].Time)
	}
	return kind
}

// quantile returns the q-quantile of sorted data by linear interpolation
// between order statistics (Hyndman & Fan, Am. Stat. 50, 361 (1996), type 7).
func quantile(sorted []float64, q float64) float64 {
	if len(sorted) == 1 {
		return sorted[0]
	}
	h := q * float64(len(sorted)-1)
	i := int(h)
	if i >= len(sorted)-1 {
		return sorted[len(sorted)-1]
	}
	return sorted[i] + (h-float64(i))*(sorted[i+1]-sorted[i])
}
