package main

import (
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/ampwalk/ampwalk/walk"
)

// z converts a dimensionless time to the propagation length in cm at the
// design coupling: t = C·z (lattice.Scale; common practice for coupled-mode
// equations).
func (s scenario) z(t float64) float64 { return t / s.Coupling }

// at returns the regime in force at time t (the first whose window holds it).
func at(rs []walk.Regime, t float64) (walk.Regime, bool) {
	for _, r := range rs {
		if t >= r.From && t <= r.To {
			return r, true
		}
	}
	return walk.Regime{}, false
}

func findPolya(runs []run, geo, inj, dyn string) *walk.Response {
	for _, r := range runs {
		if r.Geometry == geo && r.Injection == inj && r.Dynamics == dyn {
			return r.Polya
		}
	}
	return nil
}

func gsPolya(runs []run) *walk.Response { return runs[0].Polya }

func find(runs []run, geo, inj, dyn string) *walk.Response {
	for _, r := range runs {
		if r.Geometry == geo && r.Injection == inj && r.Dynamics == dyn {
			return r.Response
		}
	}
	return nil
}

func report(w io.Writer, s scenario, runs []run, took time.Duration) {
	line := strings.Repeat("─", 78)
	gs, ts := find(runs, "gasket", "corner", "quantum"), find(runs, "triangle", "corner", "quantum")
	fmt.Fprintf(w, "HL-7 chip geometry study — Halvorsen Lab (an invented scenario)\n%s\n", line)
	fmt.Fprintf(w, "Candidates of about the same size (waveguides = sites, evanescent couplings = bonds):\n")
	fmt.Fprintf(w, "  gasket   generation %d : %6d waveguides, %6d couplings\n", s.Generation, *gs.Sites, *gs.Bonds)
	fmt.Fprintf(w, "  triangle side %-4d     : %6d waveguides, %6d couplings\n", s.Side, *ts.Sites, *ts.Bonds)
	fmt.Fprintf(w, "Single-waveguide injection at a corner and in the bulk; quantum walk (coherent light)\n")
	fmt.Fprintf(w, "and classical random walk (incoherent hopping) on the same graphs.\n")
	fmt.Fprintf(w, "Units: time t in 1/γ; at the design coupling C = %.3g/cm, t ↔ propagation length z = t/C\n", s.Coupling)
	fmt.Fprintf(w, "(t = %.3g ↔ z = %.3g cm). MSD in (waveguide spacing)².\n", s.TMax, s.z(s.TMax))
	fmt.Fprintf(w, "%d log-spaced times from %.3g to %.3g; state tolerance %.0e. Pólya numbers use the\n", s.Points, s.TMin, s.TMax, s.Tolerance)
	fmt.Fprintf(w, "measurement schedule t = 1, 2, …, %d.\n\n", len(gsPolya(runs).Times))

	for _, geo := range []string{"gasket", "triangle"} {
		for _, inj := range []string{"corner", "bulk"} {
			fmt.Fprintf(w, "%s — %s injection\n%s\n", strings.ToUpper(geo), inj, line)
			for _, dyn := range []string{"quantum", "classical"} {
				r := find(runs, geo, inj, dyn)
				fmt.Fprintf(w, "  %s walk: MSD regimes\n", dyn)
				for _, g := range r.Regimes {
					fmt.Fprintf(w, "    t ∈ [%8.3g, %8.3g]  (z %6.3g–%6.3g cm)   MSD ∝ t^%.3f ± %.3f   %s\n",
						g.From, g.To, s.z(g.From), s.z(g.To), g.Exponent, g.Error, g.Kind)
				}
				for _, c := range r.Crossovers {
					fmt.Fprintf(w, "    crossover at t = %.3g   (95%% interval %.3g … %.3g; z = %.3g cm)\n", c.Time, c.Low, c.High, s.z(c.Time))
				}
				n := len(r.Times)
				p := findPolya(runs, geo, inj, dyn)
				fmt.Fprintf(w, "    at t = %.3g: MSD %.4g, return probability %.4g;  Pólya number (t = 1…%d): %.4f\n",
					r.Times[n-1], r.MSD[n-1], r.Return[n-1], len(p.Times), *p.Polya)
				d := r.Diagnostics
				fmt.Fprintf(w, "    method %s, %d matrix–vector products, error bound %.1e, norm drift %.1e, %.2f s\n",
					d.Method, d.Products, d.ErrorBound, d.NormDrift, d.Seconds)
			}
			fmt.Fprintln(w)
		}
	}

	fmt.Fprintf(w, "SUMMARY: the regime in force at t = %.3g (z = %.3g cm)\n%s\n", s.TRef, s.z(s.TRef), line)
	fmt.Fprintf(w, "  %-9s %-7s %-10s %-16s %-16s %-19s %11s %7s\n", "geometry", "inject", "dynamics", "regime", "exponent", "window (t)", "MSD at tmax", "Pólya")
	for _, r := range runs {
		resp := r.Response
		g, ok := at(resp.Regimes, s.TRef)
		if !ok {
			continue
		}
		fmt.Fprintf(w, "  %-9s %-7s %-10s %-16s %6.3f ± %-7.3f [%7.3g, %7.3g] %11.4g %7.4f\n", r.Geometry, r.Injection, r.Dynamics,
			g.Kind, g.Exponent, g.Error, g.From, g.To, resp.MSD[len(resp.MSD)-1], *r.Polya.Polya)
	}
	fmt.Fprintln(w)
	fq, _ := at(gs.Regimes, s.TRef)
	tq, _ := at(ts.Regimes, s.TRef)
	gc := find(runs, "gasket", "corner", "classical")
	fc := gc.Regimes[len(gc.Regimes)-1]
	end := len(gs.MSD) - 1
	fmt.Fprintf(w, "Reading (corner injection): at t = %.3g coherent light spreads as MSD ∝ t^%.2f (%s) on the gasket\n", s.TRef, fq.Exponent, fq.Kind)
	fmt.Fprintf(w, "chip and as t^%.2f (%s) on the full triangle. At t = %.3g the MSD is %.4g on the gasket against\n", tq.Exponent, tq.Kind, s.TMax, gs.MSD[end])
	fmt.Fprintf(w, "%.4g on the triangle, and %.3g of the light is back in the input waveguide (triangle: %.3g).\n", ts.MSD[end], gs.Return[end], ts.Return[end])
	fmt.Fprintf(w, "Incoherent hopping on the gasket ends with MSD ∝ t^%.3f ± %.3f over t ∈ [%.3g, %.3g]; on the infinite\n", fc.Exponent, fc.Error, fc.From, fc.To)
	fmt.Fprintf(w, "gasket the anomalous-diffusion value is 2/d_w = 2 ln2/ln5 ≈ 0.861 (Rammal & Toulouse 1983), which a\n")
	fmt.Fprintf(w, "finite chip approaches only over long windows before saturating.\n\n")
	fmt.Fprintf(w, "CAUTION: these are model predictions with unit couplings between nearest neighbours only.\n")
	fmt.Fprintf(w, "Predicted couplings, propagation lengths and times must be calibrated against measurements on the\n")
	fmt.Fprintf(w, "real device before fabrication decisions, and the lab's own laser and fabrication safety rules apply.\n")
	fmt.Fprintf(w, "\nComputed in %.1f s. Output: %s/{curves.csv, regimes.csv, report.json}\n", took.Seconds(), s.Out)
}
