package main

import (
	"context"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/ampwalk/ampwalk/observables"
	"github.com/ampwalk/ampwalk/observables/measure"
	"github.com/ampwalk/ampwalk/walk"
	"github.com/ampwalk/ampwalk/walk/plan"
)

// run is the whole loop; w receives the console summary.
func run(ctx context.Context, out string, seed uint64, samples int, w io.Writer) error {
	if err := os.MkdirAll(out, 0o755); err != nil {
		return err
	}
	c := m7
	fmt.Fprintf(w, "%s — lab loop with SYNTHETIC measurements\n\n", c.Name)

	// 1. Design: positions in µm, couplings in 1/cm, lengths in cm.
	n := c.Side * c.Side
	pos := make([]float64, 0, 2*n)
	for y := 0; y < c.Side; y++ {
		for x := 0; x < c.Side; x++ {
			pos = append(pos, c.Pitch*float64(x), c.Pitch*float64(y))
		}
	}
	start := n / 2 // the centre waveguide
	law := lattice.Exponential{C0: c.C0, Kappa: c.Kappa, D0: c.Pitch}
	g, err := lattice.FromPositions(pos, 2, law, c.Cutoff, nil)
	if err != nil {
		return err
	}
	scale, err := lattice.NewScale(c.C0, lattice.PerCentimetre)
	if err != nil {
		return err
	}
	design := fmt.Sprintf("%s\n%d waveguides at %g µm pitch, %d couplings within %g µm (nearest %.3g /cm, diagonal %.3g /cm)\n"+
		"input waveguide %d (centre); lengths %g–%g cm = dimensionless times %.3g–%.3g (t = C·z)\n",
		c.Name, n, c.Pitch, g.NumBonds(), c.Cutoff, law.Coupling(c.Pitch), law.Coupling(c.Pitch*math.Sqrt2),
		start, c.MinLength, c.MaxLength, scale.Time(c.MinLength), scale.Time(c.MaxLength))
	fmt.Fprint(w, "1. Design\n", design, "\n")
	if err := os.WriteFile(filepath.Join(out, "design.txt"), []byte(design+"\n"+caution+"\n"), 0o644); err != nil {
		return err
	}

	// 2. Plan the lengths to fabricate.
	pl, err := plan.Make(ctx, plan.Request{
		Positions: pos, Dim: 2, Law: law, Cutoff: c.Cutoff, Start: start,
		MaxLength: c.MaxLength, MinLength: c.MinLength, Samples: samples,
		Fabrication:  lattice.Fabrication{Jitter: c.Jitter, Law: lattice.Gauss},
		Realisations: 16, Seed: seed, Precision: 0.05, Noise: c.Noise,
	})
	if err != nil {
		return err
	}
	if err := writeFile(out, "plan.csv", pl.WriteCSV); err != nil {
		return err
	}
	if err := writeFile(out, "plan.json", pl.WriteJSON); err != nil {
		return err
	}
	fmt.Fprintf(w, "2. Plan (%d samples; plan.csv, plan.json; MSD there in µm²)\n", len(pl.Samples))
	for _, r := range pl.Regimes {
		fmt.Fprintf(w, "   %-16s %6.3g–%-6.3g cm  exponent %5.2f  samples %2d  predicted ± %.3g\n", r.Kind, r.From, r.To, r.Exponent, r.Samples, r.PredictedError)
	}
	fmt.Fprintf(w, "   %s\n\n", pl.Rationale)

	// 3. "Measure": one fabricated chip, true coupling TrueC0, camera noise.
	var lengths []float64
	for _, s := range pl.Samples {
		z := math.Round(s.Length*100) / 100 // cut to 0.1 mm
		if len(lengths) == 0 || z > lengths[len(lengths)-1] {
			lengths = append(lengths, z) // samples closer than the cut merge
		}
	}
	trueLaw := lattice.Exponential{C0: c.TrueC0, Kappa: c.Kappa, D0: c.Pitch}
	chip, _, err := lattice.Fabrication{Jitter: c.Jitter, Law: lattice.Gauss}.Fabricate(pos, 2, trueLaw, c.Cutoff, nil, lattice.Realisation(seed, 1_000_000))
	if err != nil {
		return err
	}
	truth, err := populations(ctx, chip, start, lengths)
	if err != nil {
		return err
	}
	noise := rand.New(rand.NewPCG(seed, 2_000_000))
	m := &measure.Measurement{Lengths: lengths}
	for _, p := range truth {
		in, un := make([]float64, n), make([]float64, n)
		for j, v := range p {
			in[j] = 4000 * v * math.Exp(c.Noise*noise.NormFloat64()) // camera counts
			un[j] = c.Noise * in[j]
		}
		m.Intensity = append(m.Intensity, in)
		m.Uncertainty = append(m.Uncertainty, un)
	}
	mpath := filepath.Join(out, "measured_synthetic.csv")
	if err := writeFile(out, "measured_synthetic.csv", func(f io.Writer) error {
		fmt.Fprintf(f, "# SYNTHETIC data for %s: simulated with true coupling %g /cm, jitter %g µm, %g%% noise\n", c.Name, c.TrueC0, c.Jitter, 100*c.Noise)
		return m.WriteCSV(f)
	}); err != nil {
		return err
	}
	fmt.Fprintf(w, "3. Measure: SYNTHETIC intensities at %d lengths (planned lengths cut to 0.1 mm) written to %s\n\n", len(lengths), mpath)

	// 4. Reduce: strict import, normalise, MSD with errors, regimes.
	f, err := os.Open(mpath)
	if err != nil {
		return err
	}
	mm, err := measure.ReadCSV(f, n)
	f.Close()
	if err != nil {
		return err
	}
	site := make([]float64, len(pos)) // positions in units of the pitch
	for i, v := range pos {
		site[i] = v / c.Pitch
	}
	red, err := measure.Reduce(mm, measure.Geometry{Coords: site, Dim: 2, Start: start})
	if err != nil {
		return err
	}
	if err := red.FitRegimes("msd", observables.RegimeSettings{Seed: seed, MaxSegments: 3, MinPoints: 3}); err != nil {
		fmt.Fprintf(w, "   regime fit skipped: %v\n", err)
	}

	// 5. Calibrate the coupling on the ballistic samples and compare.
	sf, err := calibrate(ctx, red, pos, site, start, c, pl)
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "4. Reduce and calibrate: fitted coupling %.4g ± %.2g /cm (design %.3g, synthetic truth %.3g; χ²/dof %.3g)\n", sf.Scale, sf.Err, c.C0, c.TrueC0, sf.Chi2/float64(max(sf.Dof, 1)))
	fmt.Fprintf(w, "   the ± covers camera noise only; the chip's own fabrication disorder shifts the fitted value too\n")
	if red.Fit != nil {
		for _, r := range red.Fit.Regimes {
			fmt.Fprintf(w, "   measured %-16s %6.3g–%-6.3g cm  exponent %5.2f ± %.2g\n", r.Kind, r.From, r.To, r.Exponent, r.Error)
		}
	}
	calLaw := lattice.Exponential{C0: sf.Scale, Kappa: c.Kappa, D0: c.Pitch}
	cal, err := lattice.FromPositions(pos, 2, calLaw, c.Cutoff, nil)
	if err != nil {
		return err
	}
	sim, err := populations(ctx, cal, start, mm.Lengths)
	if err != nil {
		return err
	}
	cmp, err := red.Compare(sim)
	if err != nil {
		return err
	}
	nominal, err := populations(ctx, g, start, mm.Lengths)
	if err != nil {
		return err
	}
	cmpNom, err := red.Compare(nominal)
	if err != nil {
		return err
	}
	if err := writeFile(out, "reduction.csv", func(f io.Writer) error { return writeReduction(f, red) }); err != nil {
		return err
	}
	if err := writeFile(out, "comparison.csv", func(f io.Writer) error { return writeComparison(f, cmpNom, cmp) }); err != nil {
		return err
	}
	fmt.Fprintf(w, "5. Compare (fidelity F, total variation D):\n   %8s %18s %18s\n", "z (cm)", "design F / D", "calibrated F / D")
	for k := range cmp {
		fmt.Fprintf(w, "   %8.3g %9.3f / %-6.3f %9.3f / %-6.3f\n", cmp[k].Length, cmpNom[k].Overlap, cmpNom[k].Distance, cmp[k].Overlap, cmp[k].Distance)
	}
	if err := writeFile(out, "report.txt", func(f io.Writer) error {
		return red.Report(f, measure.ReportOptions{LengthUnit: "cm", PositionUnit: "units of the 15 µm pitch",
			Comparison: cmp, Model: "the coupled-mode model with the calibrated coupling law", Scale: &sf, ScaleUnit: "/cm", Synthetic: true})
	}); err != nil {
		return err
	}
	fmt.Fprintf(w, "\nReport for a methods section: %s\n\n%s\n", filepath.Join(out, "report.txt"), caution)
	return nil
}

// populations returns the site probabilities of the walk on g from start at
// each length (hopping 1: couplings in /cm, lengths in cm).
func populations(ctx context.Context, g *lattice.Graph, start int, lengths []float64) ([][]float64, error) {
	psi0 := make([]complex128, g.Len())
	psi0[start] = 1
	out := make([][]float64, len(lengths))
	_, err := walk.QuantumWalk(ctx, g, 1, psi0, lengths, walk.Settings{}, func(k int, _ float64, psi []complex128) error {
		out[k] = observables.Probabilities(nil, psi)
		return nil
	})
	return out, err
}

// calibrate fits the nearest-neighbour coupling: the MSD of the design with
// unit coupling at the pitch, as a function of t = C·z, is fitted to the
// measured MSD over the samples planned in the first (ballistic) regime.
func calibrate(ctx context.Context, red *measure.Reduction, pos, site []float64, start int, c Chip, pl *plan.Plan) (measure.ScaleFit, error) {
	unit, err := lattice.FromPositions(pos, 2, lattice.Exponential{C0: 1, Kappa: c.Kappa, D0: c.Pitch}, c.Cutoff, nil)
	if err != nil {
		return measure.ScaleFit{}, err
	}
	const points = 400
	tmax := 5 * c.MaxLength // covers couplings up to 5 /cm
	ts := make([]float64, points)
	for i := range ts {
		ts[i] = tmax * float64(i) / (points - 1)
	}
	probs, err := populations(ctx, unit, start, ts)
	if err != nil {
		return measure.ScaleFit{}, err
	}
	curve := make([]float64, points)
	for i, p := range probs {
		curve[i] = observables.MSD(p, site, 2, site[2*start:2*start+2])
	}
	model := func(t float64) float64 {
		x := t / tmax * (points - 1)
		i := min(int(x), points-2)
		u := x - float64(i)
		return curve[i]*(1-u) + curve[i+1]*u
	}
	y, e, _ := red.Series("msd")
	var z, yy, ee []float64
	end := pl.Regimes[0].To
	for k, pt := range red.Points {
		if pt.Length < end {
			z, yy, ee = append(z, pt.Length), append(yy, y[k]), append(ee, e[k])
		}
	}
	if len(z) < 2 {
		z, yy, ee = red.Lengths(), y, e
	}
	return measure.FitScale(z, yy, ee, model, 0.2, 4.9)
}

func writeFile(dir, name string, f func(io.Writer) error) error {
	fh, err := os.Create(filepath.Join(dir, name))
	if err != nil {
		return err
	}
	if err := f(fh); err != nil {
		fh.Close()
		return err
	}
	return fh.Close()
}

func writeReduction(w io.Writer, r *measure.Reduction) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"length_cm", "msd", "msd_err", "spread", "spread_err", "ipr", "ipr_err"})
	for _, p := range r.Points {
		cw.Write(fs(p.Length, p.MSD, p.MSDErr, p.Spread, p.SpreadErr, p.IPR, p.IPRErr))
	}
	cw.Flush()
	return cw.Error()
}

func writeComparison(w io.Writer, nom, cal []measure.Comparison) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"length_cm", "fidelity_design", "tvd_design", "fidelity_calibrated", "tvd_calibrated"})
	for k := range cal {
		cw.Write(fs(cal[k].Length, nom[k].Overlap, nom[k].Distance, cal[k].Overlap, cal[k].Distance))
	}
	cw.Flush()
	return cw.Error()
}

func fs(x ...float64) []string {
	s := make([]string, len(x))
	for i, v := range x {
		s[i] = strconv.FormatFloat(v, 'g', 8, 64)
	}
	return s
}
