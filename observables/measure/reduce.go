package measure

import (
	"math"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/observables"
)

// Geometry gives the positions of the measured sites: Coords holds one point
// of Dim coordinates per site (site j at Coords[j·Dim : (j+1)·Dim]), and
// Start is the site where light was injected, the origin of the MSD.
type Geometry struct {
	Coords []float64
	Dim    int
	Start  int
}

// Point is the reduction of the intensities at one propagation length. Each
// quantity X has its first-order standard deviation XErr (zero when the
// measurement has no uncertainties).
type Point struct {
	Length float64
	// Total is Σ_j I_j, the normalisation.
	Total, TotalErr float64
	// MSD is Σ_j p_j ‖r_j − r_start‖².
	MSD, MSDErr float64
	// Spread is Σ_j p_j ‖r_j − r̄‖² about the centroid r̄.
	Spread, SpreadErr float64
	// IPR is Σ_j p_j².
	IPR, IPRErr float64
}

// Reduction is a measurement normalised and reduced length by length.
type Reduction struct {
	Geometry Geometry
	Points   []Point
	// P[k] is the normalised distribution at Points[k].Length, PErr[k] its
	// standard deviations (nil without uncertainties).
	P, PErr [][]float64
	// HasErrors reports whether the measurement carried uncertainties.
	HasErrors bool
	// Fit is the regime analysis set by FitRegimes (nil before), and
	// FitQuantity the curve it analysed ("msd" or "spread").
	Fit         *observables.RegimeFit
	FitQuantity string
	// FitWeighted reports whether the fit used the propagated errors.
	FitWeighted bool
}

// Reduce normalises every length of m and computes MSD, spread and IPR with
// propagated uncertainties (see the package documentation). The geometry
// must have one point per measured site and a start site among them.
func Reduce(m *Measurement, g Geometry) (*Reduction, error) {
	if m == nil || len(m.Lengths) == 0 {
		return nil, fault.New("measurement", "must hold at least one length; got none")
	}
	n := m.Sites()
	if g.Dim < 1 || g.Dim > 64 {
		return nil, fault.Range("geometry.dim", "between 1 and 64", g.Dim)
	}
	if len(g.Coords) != n*g.Dim {
		return nil, fault.New("geometry.coords", "must hold one point of %d coordinates per measured site (%d values for %d sites); got %d values", g.Dim, n*g.Dim, n, len(g.Coords))
	}
	for k, v := range g.Coords {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fault.New("geometry.coords", "must be finite; point %d has %v", k/g.Dim, v)
		}
	}
	if g.Start < 0 || g.Start >= n {
		return nil, fault.Range("geometry.start", "a site between 0 and "+itoa(n-1), g.Start)
	}
	if len(m.Intensity) != len(m.Lengths) || (m.Uncertainty != nil && len(m.Uncertainty) != len(m.Lengths)) {
		return nil, fault.New("measurement", "must have one intensity (and uncertainty) row per length (%d); got %d and %d", len(m.Lengths), len(m.Intensity), len(m.Uncertainty))
	}
	for k, z := range m.Lengths {
		if math.IsNaN(z) || math.IsInf(z, 0) || z < 0 || (k > 0 && z <= m.Lengths[k-1]) {
			return nil, fault.New("measurement.lengths", "must be finite, ≥ 0 and strictly increasing; lengths[%d] = %v", k, z)
		}
		if len(m.Intensity[k]) != n || (m.Uncertainty != nil && len(m.Uncertainty[k]) != n) {
			return nil, fault.New("measurement.intensity", "must have %d sites at every length; length %v has %d", n, z, len(m.Intensity[k]))
		}
		var tot float64
		for j, v := range m.Intensity[k] {
			if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
				return nil, fault.New("measurement.intensity", "must be finite and ≥ 0; length %v, site %d has %v", z, j, v)
			}
			if m.Uncertainty != nil {
				u := m.Uncertainty[k][j]
				if math.IsNaN(u) || math.IsInf(u, 0) || u < 0 {
					return nil, fault.New("measurement.uncertainty", "must be finite and ≥ 0; length %v, site %d has %v", z, j, u)
				}
			}
			tot += v
		}
		if !(tot > 0) || math.IsInf(tot, 0) {
			return nil, fault.New("measurement.intensity", "must have a positive finite sum at every length; length %v sums to %v", z, tot)
		}
	}

	dim, c := g.Dim, g.Coords
	origin := c[g.Start*dim : (g.Start+1)*dim]
	r := &Reduction{Geometry: g, HasErrors: m.Uncertainty != nil}
	r2 := make([]float64, n) // ‖r_j − r_start‖²
	for j := 0; j < n; j++ {
		r2[j] = sqdist(c[j*dim:(j+1)*dim], origin)
	}
	cen := make([]float64, dim)
	for k, z := range m.Lengths {
		in := m.Intensity[k]
		var s float64
		for _, v := range in {
			s += v
		}
		p := make([]float64, n)
		for j, v := range in {
			p[j] = v / s
		}
		pt := Point{Length: z, Total: s}
		pt.MSD = observables.MSD(p, c, dim, origin)
		pt.Spread = observables.Spread(p, c, dim)
		pt.IPR = observables.IPR(p)
		r.P = append(r.P, p)
		if m.Uncertainty != nil {
			u := m.Uncertainty[k]
			observables.Centroid(cen, p, c, dim)
			var su2, vm, vs, vi float64
			for j := 0; j < n; j++ {
				u2 := u[j] * u[j]
				su2 += u2
				dm := r2[j] - pt.MSD
				ds := sqdist(c[j*dim:(j+1)*dim], cen) - pt.Spread
				di := 2 * (p[j] - pt.IPR)
				vm += u2 * dm * dm
				vs += u2 * ds * ds
				vi += u2 * di * di
			}
			pe := make([]float64, n)
			for j := 0; j < n; j++ {
				// σ_pj² = [σ_j²(1 − 2p_j) + p_j² Σ_k σ_k²] / S².
				pe[j] = math.Sqrt(math.Max(0, u[j]*u[j]*(1-2*p[j])+p[j]*p[j]*su2)) / s
			}
			r.PErr = append(r.PErr, pe)
			pt.TotalErr = math.Sqrt(su2)
			pt.MSDErr = math.Sqrt(vm) / s
			pt.SpreadErr = math.Sqrt(vs) / s
			pt.IPRErr = math.Sqrt(vi) / s
		}
		r.Points = append(r.Points, pt)
	}
	return r, nil
}

// Lengths returns the reduced lengths.
func (r *Reduction) Lengths() []float64 {
	z := make([]float64, len(r.Points))
	for k, p := range r.Points {
		z[k] = p.Length
	}
	return z
}

// Series returns the curve named q ("msd", "spread" or "ipr") and its
// errors (nil without uncertainties).
func (r *Reduction) Series(q string) (values, errs []float64, err error) {
	get := map[string]func(Point) (float64, float64){
		"msd":    func(p Point) (float64, float64) { return p.MSD, p.MSDErr },
		"spread": func(p Point) (float64, float64) { return p.Spread, p.SpreadErr },
		"ipr":    func(p Point) (float64, float64) { return p.IPR, p.IPRErr },
	}[q]
	if get == nil {
		return nil, nil, fault.Range("quantity", `"msd", "spread" or "ipr"`, q)
	}
	values = make([]float64, len(r.Points))
	if r.HasErrors {
		errs = make([]float64, len(r.Points))
	}
	for k, p := range r.Points {
		v, e := get(p)
		values[k] = v
		if errs != nil {
			errs[k] = e
		}
	}
	return values, errs, nil
}

func sqdist(a, b []float64) float64 {
	var s float64
	for i, x := range a {
		d := x - b[i]
		s += d * d
	}
	return s
}

func itoa(i int) string { return strconv.Itoa(i) }
