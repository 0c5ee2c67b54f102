// Command chiplab runs the laboratory loop of ampwalk — design, plan,
// measure, reduce, compare — on an invented device: the Morvane Photonics
// test chip M-7, an 11 × 11 square array of laser-written waveguides at
// 15 µm pitch, written for the (equally invented) Quillon Optics Lab.
//
// The "measurements" are SYNTHETIC: the engine fabricates one disordered
// device whose true coupling differs from the design value, propagates light
// through it to each planned length and adds camera noise. Everything it
// writes into -out is labelled as such.
//
//	go run ./examples/chiplab -out chiplab-out
//
// Outputs: design.txt, plan.csv, plan.json, measured_synthetic.csv,
// reduction.csv, comparison.csv, report.txt. It finishes in a few seconds.
//
// Predicted couplings and lengths must be calibrated against measurements on
// the real device, and the lab's own laser and fabrication safety rules
// apply.
package main

import (
	"context"
	"flag"
	"fmt"
	"os"
)

const caution = "CAUTION: the couplings and lengths predicted here are model outputs. Calibrate them against measurements on the real device before fabricating, and follow the lab's own laser and fabrication safety rules."

func main() {
	out := flag.String("out", "chiplab-out", "directory for the output files")
	seed := flag.Uint64("seed", 7, "seed of every random draw (fabrication, synthetic noise)")
	samples := flag.Int("samples", 12, "number of samples the lab can fabricate")
	flag.Parse()
	if err := run(context.Background(), *out, *seed, *samples, os.Stdout); err != nil {
		fmt.Fprintln(os.Stderr, "chiplab:", err)
		os.Exit(1)
	}
}

// Chip is the invented device.
type Chip struct {
	Name      string
	Side      int     // waveguides per side
	Pitch     float64 // µm
	C0, Kappa float64 // predicted coupling at the pitch (1/cm) and decay (1/µm)
	Cutoff    float64 // µm: nearest and diagonal neighbours
	MaxLength float64 // cm, the longest sample that fits the glass
	MinLength float64 // cm, the shortest worth cutting
	Jitter    float64 // µm, writing tolerance (standard deviation)
	TrueC0    float64 // 1/cm, the coupling the synthetic chip really has
	Noise     float64 // relative camera noise per waveguide
}

// m7 is the Morvane M-7: demo values in the range typical of laser-written
// fused-silica arrays (C ~ 1–2 cm⁻¹ at 13–15 µm, κ ≈ 0.15–0.25 µm⁻¹; Szameit
// & Nolte, J. Phys. B 43, 163001 (2010), from memory).
var m7 = Chip{
	Name: "Morvane Photonics test chip M-7 (invented)", Side: 11, Pitch: 15,
	C0: 1.5, Kappa: 0.2, Cutoff: 22, MaxLength: 10, MinLength: 0.2,
	Jitter: 0.3, TrueC0: 1.35, Noise: 0.03,
}
