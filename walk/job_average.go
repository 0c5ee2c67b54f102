package walk

import (
	"context"
	"math"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/observables"
	"github.com/ampwalk/ampwalk/spectra"
)

// average computes the "average" report for one realisation.
//
// Quantum, no window: the exact infinite-time average
// p̄_j = Σ_λ |Σ_{k∈λ} V_jk V*_{s,k}|² over the distinct eigenvalues λ
// (degenerate groups summed as projections), from the dense eigensystem
// (spectra.Eigensystem, observables.LongTimeAverage). Classical, no window:
// the walk relaxes to the uniform distribution on the start's connected
// component, which is its exact infinite-time average (the null space of L
// is spanned by the component indicators). With a window: the trapezoidal
// time average over Samples+1 equally spaced times on [0, To].
func (j *Job) average(ctx context.Context, g *lattice.Graph, s0 int, set Settings) (*Average, error) {
	var p []float64
	var err error
	switch {
	case j.Window != nil:
		p, err = j.windowAverage(ctx, g, s0, set)
	case j.Dynamics == Classical:
		p = componentAverage(g, s0)
	default:
		p, err = exactAverage(g, j.Hopping, s0)
	}
	if err != nil {
		return nil, err
	}
	a := &Average{Return: p[s0]}
	if j.reports("populations") {
		a.Populations = p
	}
	if j.Window != nil {
		a.Window, a.Samples = j.Window.To, j.Window.Samples
	}
	return a, nil
}

func exactAverage(g *lattice.Graph, gamma float64, s0 int) ([]float64, error) {
	e, err := spectra.Eigensystem(g, gamma)
	if err != nil {
		return nil, within("average", err)
	}
	n := e.N
	width := math.Max(1, e.Values[n-1]-e.Values[0])
	// Degeneracy tolerance: eigenvalues of a dense solver are accurate to a
	// few ulps of the spectral width (common practice: 1e-9 relative).
	tol := 1e-9 * width
	if e.Real != nil {
		return observables.LongTimeAverageReal(e.Values, e.Real, n, s0, tol)
	}
	return observables.LongTimeAverage(e.Values, e.Complex, n, s0, tol)
}

// componentAverage returns the uniform distribution on the connected
// component of s0 (bonds of zero weight do not connect).
func componentAverage(g *lattice.Graph, s0 int) []float64 {
	n := g.Len()
	parent := make([]int32, n)
	for i := range parent {
		parent[i] = int32(i)
	}
	var find func(i int32) int32
	find = func(i int32) int32 {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		if b.W == 0 {
			continue
		}
		a, c := find(int32(b.I)), find(int32(b.J))
		if a != c {
			parent[a] = c
		}
	}
	root := find(int32(s0))
	count := 0
	for i := range parent {
		if find(int32(i)) == root {
			count++
		}
	}
	p := make([]float64, n)
	for i := range p {
		if find(int32(i)) == root {
			p[i] = 1 / float64(count)
		}
	}
	return p
}

func (j *Job) windowAverage(ctx context.Context, g *lattice.Graph, s0 int, set Settings) ([]float64, error) {
	m := j.Window.Samples
	ts := make([]float64, m+1)
	for k := range ts {
		ts[k] = j.Window.To * float64(k) / float64(m)
	}
	var w observables.WindowAverage
	if _, err := j.evolve(ctx, g, s0, ts, set, func(k int, p []float64) error { return w.Add(ts[k], p) }); err != nil {
		return nil, err
	}
	return w.Mean(nil), nil
}

// correlations fills tr.corr with the two-particle correlation matrix Γ at
// each reported time for particles injected on s0 and s1
// (observables.Correlations; Bromberg et al., PRL 102, 253904 (2009)). The
// second particle's states are stored (len(times)·n amplitudes), then the
// first particle is propagated alongside.
func (j *Job) correlations(ctx context.Context, g *lattice.Graph, s0, s1 int, set Settings, tr *trace) error {
	n, T := g.Len(), len(j.Times)
	stat := map[string]observables.Statistics{"bosons": observables.Bosons,
		"fermions": observables.Fermions, "distinguishable": observables.Distinguishable}[j.Start.Statistics]
	ul := make([][]complex128, T)
	psi := make([]complex128, n)
	psi[s1] = 1
	if _, err := QuantumWalk(ctx, g, j.Hopping, psi, j.Times, set, func(k int, t float64, state []complex128) error {
		ul[k] = append([]complex128(nil), state...)
		return nil
	}); err != nil {
		return propagationError(err)
	}
	tr.corr = make([][]float64, T)
	psi = make([]complex128, n)
	psi[s0] = 1
	if _, err := QuantumWalk(ctx, g, j.Hopping, psi, j.Times, set, func(k int, t float64, state []complex128) error {
		tr.corr[k] = observables.Correlations(nil, state, ul[k], stat)
		return nil
	}); err != nil {
		return propagationError(err)
	}
	return nil
}
