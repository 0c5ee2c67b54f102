// Command propbench times one quantum-walk propagation the way a user
// would run it: build a Sierpinski gasket (or a square lattice), start on
// the corner near (0, 0) (the square lattice: its centre), propagate with
// walk.QuantumWalk by the Chebyshev method to a list of reported times, and
// record the mean squared displacement. It prints the matrix–vector
// products beside a·t_max (a, the spectral half-width, from the extreme
// Ritz values of 80 Lanczos steps), the wall time, the memory estimate and the peak resident set, and
// writes the MSD and those numbers as JSON to -out.
//
// With -graph PREFIX it also writes the bonds and positions in binary
// (PREFIX.bonds.i32, PREFIX.pos.f64) so that benchdata/scipy_expm.py can
// propagate the same graph, in the same site order, from the same start.
//
//	go run ./benchdata/propbench -generation 10 -tmax 500 -count 60 -out msd.json
package main

import (
	"flag"
	"fmt"
	"os"
)

func main() {
	var c config
	var out string
	flag.StringVar(&c.Lattice, "lattice", "gasket", "gasket or square")
	flag.IntVar(&c.Generation, "generation", 10, "gasket generation g: (3^(g+1)+3)/2 sites")
	flag.IntVar(&c.Width, "width", 1000, "square lattice side (width·width sites)")
	flag.Float64Var(&c.TMin, "tmin", 0.1, "first reported time (units of 1/γ)")
	flag.Float64Var(&c.TMax, "tmax", 500, "last reported time (units of 1/γ)")
	flag.IntVar(&c.Count, "count", 60, "number of reported times")
	flag.BoolVar(&c.Classical, "classical", false, "propagate the classical walk dp/dt = −Lp (MSD of the probabilities) instead of the quantum walk")
	flag.StringVar(&c.Spacing, "spacing", "log", "log or linear spacing of the reported times")
	flag.Float64Var(&c.Tol, "tol", 1e-10, "target 2-norm error of the state at every reported time")
	flag.IntVar(&c.Workers, "workers", 0, "worker goroutines for the products (0: all cores)")
	flag.StringVar(&c.Graph, "graph", "", "write the graph to PREFIX.bonds.i32 and PREFIX.pos.f64")
	flag.BoolVar(&c.GraphOnly, "graph-only", false, "write the graph and the job (-out) without propagating")
	flag.StringVar(&out, "out", "msd.json", "JSON file for the times, MSD and measurements")
	verbose := flag.Bool("v", false, "print the MSD at every reported time to standard error")
	flag.Parse()

	var log *os.File
	if *verbose {
		log = os.Stderr
	}
	r, err := run(c, log)
	if err != nil {
		fmt.Fprintln(os.Stderr, "propbench:", err)
		os.Exit(1)
	}
	if out != "" {
		if err := writeJSON(out, r); err != nil {
			fmt.Fprintln(os.Stderr, "propbench:", err)
			os.Exit(1)
		}
	}
	fmt.Printf("lattice %s: %d sites, %d bonds, start site %d, %d times to t_max=%g, tol %g\n",
		r.Lattice, r.Sites, r.Bonds, r.Start, len(r.Times), c.TMax, c.Tol)
	if c.GraphOnly {
		fmt.Printf("graph written (build %.3f s)\n", r.BuildSeconds)
		return
	}
	if c.Classical {
		fmt.Printf("classical walk, method %s, products %d\n", r.Method, r.Products)
	} else {
		fmt.Printf("method %s, products %d, a=%.6g (Ritz), a·t_max=%.6g, ratio %.3f\n",
			r.Method, r.Products, r.HalfWidth, r.ATMax, r.Ratio)
	}
	fmt.Printf("build %.3f s, propagate %.3f s, workers %d, norm drift %.2g, error bound %.2g\n",
		r.BuildSeconds, r.PropSeconds, r.Workers, r.NormDrift, r.ErrorBound)
	fmt.Printf("memory estimate %.1f MiB, peak RSS %.1f MiB (ratio %.2f)\n",
		float64(r.EstimateBytes)/(1<<20), float64(r.PeakRSSBytes)/(1<<20),
		float64(r.PeakRSSBytes)/float64(r.EstimateBytes))
}
