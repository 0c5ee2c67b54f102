package measure

import (
	"bufio"
	"fmt"
	"io"
	"strings"
)

// ReportOptions adds context to Report. The zero value writes a report in
// unnamed units without comparison or calibration.
type ReportOptions struct {
	// LengthUnit and PositionUnit name the units ("mm", "µm"); empty means
	// "length unit" and "position unit".
	LengthUnit, PositionUnit string
	// Comparison, when set, adds the length-by-length agreement with a
	// simulation, described by Model.
	Comparison []Comparison
	Model      string
	// Scale, when set, adds the coupling calibration from FitScale, with
	// ScaleUnit naming its unit ("1/cm").
	Scale     *ScaleFit
	ScaleUnit string
	// Synthetic marks data produced by a simulation rather than measured.
	Synthetic bool
}

// Report writes a plain-text account of the reduction that a laboratory
// can adapt for the methods section of a paper: what was done to the
// intensities, the table of reduced values with their uncertainties, the
// regime analysis when FitRegimes was run, and the comparison with the
// simulation when given. It states methods only and cites nothing.
func (r *Reduction) Report(w io.Writer, o ReportOptions) error {
	lu, pu := o.LengthUnit, o.PositionUnit
	if lu == "" {
		lu = "length unit"
	}
	if pu == "" {
		pu = "position unit"
	}
	b := bufio.NewWriter(w)
	p := func(format string, a ...any) { fmt.Fprintf(b, format, a...) }
	n := len(r.P[0])
	if o.Synthetic {
		p("NOTE: the intensities reduced here are SYNTHETIC (simulated with added noise), not measurements.\n\n")
	}
	p("Data reduction\n")
	p("Per-site output intensities I_j were recorded for %d sites at %d propagation lengths between %s and %s %s. ",
		n, len(r.Points), g(r.Points[0].Length), g(r.Points[len(r.Points)-1].Length), lu)
	p("At each length the intensities were normalised to a probability distribution p_j = I_j / Σ_k I_k. ")
	p("From it we computed the mean squared displacement from the input site %d, MSD = Σ_j p_j |r_j − r_in|², ", r.Geometry.Start)
	p("the spread about the centroid, Σ_j p_j |r_j − r̄|², and the inverse participation ratio, IPR = Σ_j p_j², with positions r_j in %s. ", pu)
	if r.HasErrors {
		p("Uncertainties were propagated to first order from the per-site intensity uncertainties, treating different sites as independent.\n")
	} else {
		p("No per-site intensity uncertainties were given, so no uncertainties are quoted for the reduced values.\n")
	}
	p("\n%12s %14s %12s %14s %12s %12s %12s\n", "length", "MSD", "±", "spread", "±", "IPR", "±")
	for _, pt := range r.Points {
		p("%12s %14.6g %12.3g %14.6g %12.3g %12.5g %12.3g\n", g(pt.Length), pt.MSD, pt.MSDErr, pt.Spread, pt.SpreadErr, pt.IPR, pt.IPRErr)
	}
	r.reportRegimes(p, lu)
	if o.Scale != nil {
		s := o.Scale
		p("\nCoupling calibration\n")
		p("The time scale of the simulated MSD curve was fitted to the measured one by least squares (%s), ", map[bool]string{true: "weighted by the propagated uncertainties", false: "unweighted"}[s.Weighted])
		p("giving a reference coupling of %.5g ± %.2g %s (χ² = %.3g for %d degrees of freedom).", s.Scale, s.Err, o.ScaleUnit, s.Chi2, s.Dof)
		if s.Weighted && s.Dof > 0 && s.Chi2 > 2*float64(s.Dof) {
			p(" χ² per degree of freedom is %.3g, well above 1: the model misses systematic effects (such as fabrication disorder or next-nearest couplings that depart from the assumed law), and the quoted error, which reflects the intensity uncertainties only, understates the true uncertainty.", s.Chi2/float64(s.Dof))
		}
		p("\n")
	}
	if o.Comparison != nil {
		model := o.Model
		if model == "" {
			model = "the simulation"
		}
		p("\nComparison with %s\n", model)
		p("Length by length we report the classical fidelity F = Σ_j √(p_j q_j) and the total variation distance D = ½ Σ_j |p_j − q_j| between the measured (p) and simulated (q) distributions.\n")
		p("%12s %10s %10s\n", "length", "F", "D")
		for _, c := range o.Comparison {
			p("%12s %10.4f %10.4f\n", g(c.Length), c.Overlap, c.Distance)
		}
	}
	p("\nPredicted couplings and lengths must be calibrated against measurements on the real device; the laboratory's own laser and fabrication safety rules apply.\n")
	return b.Flush()
}

func g(x float64) string { return strings.TrimSpace(fmt.Sprintf("%.6g", x)) }
