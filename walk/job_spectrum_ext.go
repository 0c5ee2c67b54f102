package walk

import (
	"context"
	"fmt"
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/spectra"
)

// SpectrumExt holds the spectrum-job extensions (embedded in SpectrumSpec):
// eigenstate measures, an energy-window map, the local density of states,
// symmetry sectors and the spectral dimension. Their JSON form is in
// job_doc.go.
type SpectrumExt struct {
	// IPR asks for the inverse participation ratio and the participation
	// number of every eigenstate, in ascending energy order.
	IPR bool
	// Window asks for the map Σ_{E_n ∈ [From, To]} |ψ_n(r)|² over the sites.
	Window *EnergyWindowSpec
	// LDOS asks for the local density of states on one site.
	LDOS *LDOSSpec
	// Sectors asks for the translation sectors of a periodic chain, ring or
	// square lattice, each with its levels and spacing ratio.
	Sectors bool
	// SpectralDimension asks for d_s from the integrated density of states
	// near the lower edge of the spectrum (spectra.SpectralDimensionLevels).
	SpectralDimension bool
	// Bands asks for the Bloch bands of a unit cell along a path of
	// high-symmetry points.
	Bands *BandsSpec
}

// BandsSpec selects a unit cell ("square", "triangular", "honeycomb",
// "kagome" or "lieb"; empty for the lattice's own kind), the Path of named
// high-symmetry points ("G" stands for "Γ") and the Points per segment.
type BandsSpec struct {
	Cell   string
	Path   []string
	Points int
}

// EnergyWindowSpec is the energy interval [From, To] of "window_map".
type EnergyWindowSpec struct {
	From, To float64
}

// LDOSSpec configures the local density of states on Site: Bins bins,
// Method "exact" (eigenstates, binned) or "kpm" (Moments Chebyshev moments,
// Jackson kernel).
type LDOSSpec struct {
	Site    int
	Bins    int
	Method  string
	Moments int
}

// any reports whether any extension is asked for.
func (x *SpectrumExt) any() bool {
	return x.IPR || x.Window != nil || x.LDOS != nil || x.Sectors || x.SpectralDimension || x.Bands != nil
}

// needsVectors reports whether the extensions need all eigenstates.
func (x *SpectrumExt) needsVectors() bool {
	return x.IPR || x.Window != nil || (x.LDOS != nil && x.LDOS.Method == "exact")
}

// spectrumExtKeys are the extension keys of the "spectrum" object.
var spectrumExtKeys = []string{"ipr", "window", "ldos", "sectors", "spectral_dimension", "bands"}

// decodeSpectrumExt reads the extension keys of the "spectrum" object so.
func decodeSpectrumExt(so *object, x *SpectrumExt) error {
	if err := so.bool("ipr", &x.IPR); err != nil {
		return err
	}
	if err := so.bool("sectors", &x.Sectors); err != nil {
		return err
	}
	if err := so.bool("spectral_dimension", &x.SpectralDimension); err != nil {
		return err
	}
	wo, err := so.sub("window")
	if err != nil {
		return err
	}
	if wo != nil {
		if err := wo.only("from", "to"); err != nil {
			return err
		}
		if !wo.has("from") {
			return wo.required("from", "the lower energy of the window")
		}
		if !wo.has("to") {
			return wo.required("to", "the upper energy of the window")
		}
		w := &EnergyWindowSpec{}
		if err := wo.num("from", &w.From); err != nil {
			return err
		}
		if err := wo.num("to", &w.To); err != nil {
			return err
		}
		if !(w.To >= w.From) {
			return fault.Range("spectrum.window.to", fmt.Sprintf("at least spectrum.window.from (%v)", w.From), w.To)
		}
		x.Window = w
	}
	lo, err := so.sub("ldos")
	if err != nil {
		return err
	}
	if lo != nil {
		if err := lo.only("site", "bins", "method", "moments"); err != nil {
			return err
		}
		if !lo.has("site") {
			return lo.required("site", "the site index of the local density of states")
		}
		l := &LDOSSpec{Bins: 200, Method: "kpm", Moments: 512}
		if err := lo.int("site", &l.Site, 0, 1<<31-1); err != nil {
			return err
		}
		if err := lo.int("bins", &l.Bins, 1, 1<<20); err != nil {
			return err
		}
		if err := lo.choice("method", &l.Method, "exact", "kpm"); err != nil {
			return err
		}
		if err := lo.int("moments", &l.Moments, 2, 1<<16); err != nil {
			return err
		}
		x.LDOS = l
	}
	bo, err := so.sub("bands")
	if err != nil {
		return err
	}
	if bo != nil {
		if err := bo.only("cell", "path", "points"); err != nil {
			return err
		}
		b := &BandsSpec{Points: 50}
		if err := bo.choice("cell", &b.Cell, bandCells...); err != nil {
			return err
		}
		raw, ok := bo.take("path")
		if !ok {
			return bo.required("path", "at least two named points, e.g. [\"G\", \"K\", \"M\", \"G\"]")
		}
		items, err := list("spectrum.bands.path", raw)
		if err != nil {
			return err
		}
		if len(items) < 2 || len(items) > 64 {
			return fault.Range("spectrum.bands.path", "a list of 2 to 64 named points", len(items))
		}
		for k, it := range items {
			name, err := str(index("spectrum.bands.path", k), it)
			if err != nil {
				return err
			}
			b.Path = append(b.Path, name)
		}
		if err := bo.int("points", &b.Points, 1, 10000); err != nil {
			return err
		}
		x.Bands = b
	}
	return nil
}

// bandCells are the unit cells of "bands", named after the lattice kinds.
var bandCells = []string{"square", "triangular", "honeycomb", "kagome", "lieb"}

// BandsResult holds Bloch bands along a path: K the cumulative path length
// at each wave vector (in units of the inverse nearest-neighbour spacing),
// Wavevectors the Cartesian wave vectors, Energies[p] the band energies at
// K[p] (ascending) and Corners the index of each named point of the path.
type BandsResult struct {
	K           []float64   `json:"k"`
	Wavevectors [][]float64 `json:"wavevectors"`
	Energies    [][]float64 `json:"energies"`
	Corners     []int       `json:"corners"`
}

// bands computes the Bloch bands of b (spectra.Bands) with hopping γ.
func (j *Job) bands(b *BandsSpec) (*BandsResult, error) {
	const field = "spectrum.bands"
	name := b.Cell
	if name == "" {
		name = j.Lattice.Kind
	}
	var c *spectra.UnitCell
	switch name {
	case "square":
		c = spectra.SquareCell()
	case "triangular":
		c = spectra.TriangularCell()
	case "honeycomb":
		c = spectra.HoneycombCell()
	case "kagome":
		c = spectra.KagomeCell()
	case "lieb":
		c = spectra.LiebCell()
	default:
		return nil, fault.New(field+".cell", "is required unless the lattice kind is one of square, triangular, honeycomb, kagome, lieb; the lattice kind is %q", j.Lattice.Kind)
	}
	corners := make([][]float64, len(b.Path))
	for i, p := range b.Path {
		key := p
		if key == "G" {
			key = "Γ"
		}
		k, ok := c.Points[key]
		if !ok {
			names := []string{"G"}
			for _, q := range []string{"K", "M", "X"} {
				if _, ok := c.Points[q]; ok {
					names = append(names, q)
				}
			}
			return nil, fault.New(index(field+".path", i), "must name a high-symmetry point of the %s cell (one of %v); got %q", name, names, p)
		}
		corners[i] = k
	}
	if v := int64(len(b.Path)-1)*int64(b.Points)*int64(c.Sites()+c.Dim) + int64(c.Sites()); v > MaxPopulationValues {
		return nil, &fault.Error{Kind: fault.TooLarge, Field: field + ".points",
			Msg: fmt.Sprintf("the bands would hold about %d values; the limit is %d", v, MaxPopulationValues)}
	}
	bp, err := spectra.Bands(c, j.Hopping, corners, b.Points)
	if err != nil {
		return nil, within(field, err)
	}
	return &BandsResult{K: bp.Distance, Wavevectors: bp.K, Energies: bp.Energy, Corners: bp.Corners}, nil
}

// SectorResult is one symmetry sector of a spectrum job: its momentum label
// (k_j in units of 2π/Orders[j] for the j-th translation), the number of
// levels, the levels themselves (ascending) and their spacing ratio (absent
// below three levels).
type SectorResult struct {
	Momentum []int `json:"momentum"`
	Orders   []int `json:"orders"`
	// Parity (±1) splits a self-conjugate sector of a gasket or carpet by
	// the mirror; Copies (1 or 2) is how often its levels occur in the full
	// spectrum (2 for the merged pair of rotation sectors q and −q).
	Parity      int          `json:"parity,omitzero"`
	Copies      int          `json:"copies"`
	Size        int          `json:"size"`
	Eigenvalues []float64    `json:"eigenvalues"`
	Ratio       *RatioResult `json:"ratio,omitzero"`
}

// SpectralDimResult is the spectral dimension fitted on the integrated
// density of states, over the energies From … To above the lower edge.
type SpectralDimResult struct {
	Value  float64 `json:"value"`
	Error  float64 `json:"error"`
	From   float64 `json:"from"`
	To     float64 `json:"to"`
	Points int     `json:"points"`
}

// SpectrumExtResult holds the extension outputs of a spectrum job (embedded
// in Response; "ipr" and "participation" reuse the walk-job fields).
type SpectrumExtResult struct {
	WindowMap         []float64          `json:"window_map,omitzero"`
	WindowStates      *int               `json:"window_states,omitzero"`
	LDOS              *DOSResult         `json:"ldos,omitzero"`
	Sectors           []SectorResult     `json:"sectors,omitzero"`
	SpectralDimension *SpectralDimResult `json:"spectral_dimension,omitzero"`
	Bands             *BandsResult       `json:"bands,omitzero"`
}

// runSpectrumExt computes the extension outputs for the realised graph g;
// values are its eigenvalues when already computed (nil otherwise).
func (j *Job) runSpectrumExt(ctx context.Context, g *lattice.Graph, values []float64, resp *Response) error {
	x := &j.Spectrum.SpectrumExt
	n := g.Len()
	var e *spectra.Eigen
	if x.needsVectors() {
		if n > MaxExactSites {
			return &fault.Error{Kind: fault.TooLarge, Field: "spectrum",
				Msg: fmt.Sprintf("all eigenstates of a %d-site graph need a dense %d×%d diagonalisation with vectors (about %d bytes); the limit is %d sites: use \"ldos\" with method \"kpm\"",
					n, n, n, int64(24)*int64(n)*int64(n), MaxExactSites)}
		}
		var err error
		if e, err = spectra.Eigensystem(g, j.Hopping); err != nil {
			return within("spectrum", err)
		}
		values = e.Values
	}
	if values == nil && x.SpectralDimension {
		if n > MaxEigenvalueSites {
			return &fault.Error{Kind: fault.TooLarge, Field: "spectrum.spectral_dimension",
				Msg: fmt.Sprintf("all eigenvalues of a %d-site graph need a dense %d×%d diagonalisation (about %d bytes); the limit is %d sites",
					n, n, n, int64(16)*int64(n)*int64(n), MaxEigenvalueSites)}
		}
		var err error
		if values, err = spectra.Eigenvalues(g, j.Hopping); err != nil {
			return within("spectrum", err)
		}
	}
	if err := ctx.Err(); err != nil {
		return err
	}
	if x.IPR {
		resp.IPR = spectra.IPR(nil, e)
		resp.Participation = make([]float64, n)
		for k, v := range resp.IPR {
			resp.Participation[k] = 1 / v
		}
	}
	if w := x.Window; w != nil {
		m, err := spectra.WindowMap(nil, e, w.From, w.To)
		if err != nil {
			return within("spectrum.window", err)
		}
		c := 0
		for _, v := range e.Values {
			if v >= w.From && v <= w.To {
				c++
			}
		}
		resp.WindowMap, resp.WindowStates = m, &c
	}
	if l := x.LDOS; l != nil {
		if l.Site >= n {
			return fault.Range("spectrum.ldos.site", fmt.Sprintf("a site index between 0 and %d", n-1), l.Site)
		}
		var d spectra.DOS
		var err error
		if l.Method == "exact" {
			d, err = spectra.LocalHistogram(e, l.Site, l.Bins)
		} else {
			d, err = spectra.LocalDOS(g.Hamiltonian(j.Hopping), l.Site, spectra.KPMSettings{Moments: l.Moments, Bins: l.Bins})
		}
		if err != nil {
			return within("spectrum.ldos", err)
		}
		resp.LDOS = &DOSResult{Energy: d.Energy, Density: d.Density, Method: l.Method}
	}
	if x.Sectors {
		s, err := j.sectors(g)
		if err != nil {
			return err
		}
		resp.Sectors = s
	}
	if x.Bands != nil {
		b, err := j.bands(x.Bands)
		if err != nil {
			return err
		}
		resp.Bands = b
	}
	if x.SpectralDimension {
		est, err := spectra.SpectralDimensionLevels(values, 0)
		if err != nil {
			return within("spectrum.spectral_dimension", err)
		}
		resp.SpectralDimension = &SpectralDimResult{Value: est.Value, Error: est.Error, From: est.From, To: est.To, Points: est.Points}
	}
	return nil
}

// sectors block-diagonalises H of a periodic chain, ring or square lattice
// by its translations (spectra.Sectors) and reports each sector's levels and
// spacing ratio.
func (j *Job) sectors(g *lattice.Graph) ([]SectorResult, error) {
	const field = "spectrum.sectors"
	l := j.Lattice
	if len(j.Remove) > 0 {
		return nil, fault.New(field, "needs the full periodic lattice; \"remove\" breaks its translations")
	}
	var syms []spectra.Symmetry
	var mirror *spectra.Symmetry
	switch {
	case l.Kind == "ring" || l.Kind == "chain" && l.Periodic:
		syms = []spectra.Symmetry{spectra.Translation(g.Len())}
	case l.Kind == "square" && l.Periodic:
		syms = spectra.SquareTranslations(l.Width, l.Height)
	case l.Kind == "gasket" || l.Kind == "carpet":
		// C3v of the gasket about its centre (2^(g−1), 2^(g−1)/√3), C4v of
		// the carpet about (3^g/2, 3^g/2); the mirrors are vertical.
		var cx, cy float64
		order := 3
		if l.Kind == "gasket" {
			cx = math.Ldexp(1, l.Generation-1)
			cy = cx / math.Sqrt(3)
		} else {
			order = 4
			cx = math.Pow(3, float64(l.Generation)) / 2
			cy = cx
		}
		th := 2 * math.Pi / float64(order)
		c, s := math.Cos(th), math.Sin(th)
		rot, err := spectra.PositionSymmetry(g, fmt.Sprintf("C%d", order), func(dst, p []float64) {
			x, y := p[0]-cx, p[1]-cy
			dst[0], dst[1] = cx+c*x-s*y, cy+s*x+c*y
		})
		if err != nil {
			return nil, within(field, err)
		}
		mir, err := spectra.PositionSymmetry(g, "mirror", func(dst, p []float64) {
			dst[0], dst[1] = 2*cx-p[0], p[1]
		})
		if err != nil {
			return nil, within(field, err)
		}
		syms, mirror = []spectra.Symmetry{rot}, &mir
	default:
		return nil, fault.New(field, "is available for a ring, a periodic chain, a periodic square lattice, a gasket or a carpet; got lattice kind %q (periodic %v)", l.Kind, l.Periodic)
	}
	if n := g.Len(); n > MaxPopulationValues {
		return nil, &fault.Error{Kind: fault.TooLarge, Field: field,
			Msg: fmt.Sprintf("the sector levels of a %d-site lattice exceed the response limit of %d values", n, MaxPopulationValues)}
	}
	var secs []spectra.Sector
	var err error
	if mirror != nil {
		secs, err = spectra.DihedralSectors(g, j.Hopping, syms, *mirror, false)
	} else {
		secs, err = spectra.Sectors(g, j.Hopping, syms, false)
	}
	if err != nil {
		return nil, within(field, err)
	}
	out := make([]SectorResult, len(secs))
	for i, s := range secs {
		out[i] = SectorResult{Momentum: s.Label, Orders: s.Orders, Parity: s.Parity, Copies: max(s.Copies, 1), Size: len(s.Values), Eigenvalues: s.Values}
		if len(s.Values) >= 3 {
			if out[i].Ratio, err = spacingRatio(s.Values); err != nil {
				return nil, within(field, err)
			}
		}
	}
	return out, nil
}
