package walk

import (
	"context"
	"fmt"
	"io"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/spectra"
)

// spacingRatio adapts spectra.SpacingRatio: spacings below 1e-9 of the
// spectral width (at least 1e-12) count as degeneracies (common practice for
// eigenvalues from a dense solver, accurate to a few ulps of the width).
func spacingRatio(values []float64) (*RatioResult, error) {
	if len(values) < 3 {
		return nil, fault.New("", "needs at least 3 levels; the graph has %d", len(values))
	}
	width := values[len(values)-1] - values[0]
	r := spectra.SpacingRatio(values, max(1e-9*width, 1e-12))
	return &RatioResult{Mean: r.Mean, Used: r.Used, Degenerate: r.Degenerate}, nil
}

// boxDimension adapts spectra.BoxDimension (unweighted box counting of the
// site positions).
func boxDimension(coords []float64, dim int) (*BoxDimResult, error) {
	b, err := spectra.BoxDimension(coords, dim, nil)
	if err != nil {
		return nil, err
	}
	return &BoxDimResult{Dimension: b.Dimension, Error: b.Error, Smallest: b.Smallest, Largest: b.Largest}, nil
}

// runSpectrum answers a spectrum job: eigenvalues, density of states,
// spacing ratio and box-counting dimension of the (possibly thinned and
// disordered) lattice, through package spectra.
func (j *Job) runSpectrum(ctx context.Context, log io.Writer) (*Response, error) {
	g, kept, err := j.graph()
	if err != nil {
		return nil, err
	}
	first, _ := j.realisations()
	if g, err = j.realise(g, first); err != nil {
		return nil, err
	}
	n, m := g.Len(), g.NumBonds()
	fmt.Fprintf(log, "ampwalk: job %q: spectrum of a %s lattice with %d sites\n", j.ID, j.Lattice.Kind, n)
	resp := &Response{ID: j.ID, Sites: &n, Bonds: &m, Kept: kept}
	s := j.Spectrum
	needValues := s.Eigenvalues || s.Ratio || (s.DOS != nil && s.DOS.Method == "exact")
	var values []float64
	if needValues {
		if n > MaxEigenvalueSites {
			return nil, &fault.Error{Kind: fault.TooLarge, Field: "spectrum",
				Msg: fmt.Sprintf("all eigenvalues of a %d-site graph need a dense %d×%d diagonalisation (about %d bytes); the limit is %d sites: use \"dos\" with method \"kpm\"",
					n, n, n, int64(16)*int64(n)*int64(n), MaxEigenvalueSites)}
		}
		if values, err = spectra.Eigenvalues(g, j.Hopping); err != nil {
			return nil, within("spectrum", err)
		}
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if s.Eigenvalues {
		resp.Eigenvalues = values
	}
	if d := s.DOS; d != nil {
		var dos spectra.DOS
		if d.Method == "exact" {
			dos, err = spectra.Histogram(values, d.Bins)
		} else {
			dos, err = spectra.KPM(g.Hamiltonian(j.Hopping), spectra.KPMSettings{
				Moments: d.Moments, Vectors: d.Vectors, Seed: d.Seed, Bins: d.Bins})
		}
		if err != nil {
			return nil, within("spectrum", err)
		}
		resp.DOS = &DOSResult{Energy: dos.Energy, Density: dos.Density, Method: d.Method}
	}
	if s.Ratio {
		r, err := spacingRatio(values)
		if err != nil {
			return nil, within("spectrum.ratio", err)
		}
		resp.Ratio = r
	}
	if s.BoxDimension {
		b, err := boxDimension(g.Coords(), g.Dim())
		if err != nil {
			return nil, within("spectrum.box_dimension", err)
		}
		resp.BoxDimension = b
	}
	if s.SpectrumExt.any() {
		if err := j.runSpectrumExt(ctx, g, values, resp); err != nil {
			return nil, err
		}
	}
	return resp, nil
}
