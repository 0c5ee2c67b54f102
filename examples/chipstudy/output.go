package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
)

// write saves the curves and fits as CSV and the whole study as JSON.
func write(s scenario, runs []run, log io.Writer) error {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }
	curves := [][]string{{"geometry", "injection", "dynamics", "t", "z_cm", "msd", "return"}}
	regimes := [][]string{{"geometry", "injection", "dynamics", "row", "from", "to", "exponent", "error", "kind", "crossover_time", "crossover_low", "crossover_high"}}
	for _, r := range runs {
		p := r.Response
		for k, t := range p.Times {
			curves = append(curves, []string{r.Geometry, r.Injection, r.Dynamics, f(t), f(s.z(t)), f(p.MSD[k]), f(p.Return[k])})
		}
		for i, g := range p.Regimes {
			row := []string{r.Geometry, r.Injection, r.Dynamics, "regime", f(g.From), f(g.To), f(g.Exponent), f(g.Error), g.Kind, "", "", ""}
			regimes = append(regimes, row)
			if i < len(p.Crossovers) {
				c := p.Crossovers[i]
				regimes = append(regimes, []string{r.Geometry, r.Injection, r.Dynamics, "crossover", "", "", "", "", "", f(c.Time), f(c.Low), f(c.High)})
			}
		}
	}
	if err := writeCSV(filepath.Join(s.Out, "curves.csv"), curves); err != nil {
		return err
	}
	if err := writeCSV(filepath.Join(s.Out, "regimes.csv"), regimes); err != nil {
		return err
	}
	b, err := json.MarshalIndent(struct {
		Scenario scenario `json:"scenario"`
		Lab      string   `json:"lab"`
		Caution  string   `json:"caution"`
		Runs     []run    `json:"runs"`
	}{s, "Halvorsen Lab (invented), chip HL-7 (invented)",
		"Model predictions: calibrate couplings and lengths against measurements on the real device; the lab's own laser and fabrication safety rules apply.",
		runs}, "", " ")
	if err != nil {
		return err
	}
	if err := os.WriteFile(filepath.Join(s.Out, "report.json"), b, 0o644); err != nil {
		return err
	}
	fmt.Fprintf(log, "chipstudy: wrote %s\n", s.Out)
	return nil
}

func writeCSV(path string, rows [][]string) error {
	fh, err := os.Create(path)
	if err != nil {
		return err
	}
	cw := csv.NewWriter(fh)
	if err := cw.WriteAll(rows); err != nil {
		fh.Close()
		return err
	}
	return fh.Close()
}
