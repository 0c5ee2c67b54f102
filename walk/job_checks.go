package walk

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// Input checks of the job format that sit between decoding and building:
// a leading byte order mark, the id of a request with a repeated key,
// lattice size parameters (sizes beyond any machine are "too-large" with
// the estimate, not "invalid"), remove lists, classical bond weights and
// the points of a regime fit.

// utf8BOM is the UTF-8 encoding of U+FEFF, which some editors put at the
// start of a file. Decode strips it from the start of a line.
var utf8BOM = []byte("\xef\xbb\xbf")

// stripBOM removes a leading UTF-8 byte order mark.
func stripBOM(line []byte) []byte { return bytes.TrimPrefix(line, utf8BOM) }

// idDespite returns the id of a request whose top-level object has a repeated
// key other than "id" (err names the key), so that the error line can echo
// it; "" when the id itself repeats or cannot be read.
func idDespite(line []byte, err error) string {
	fe, ok := err.(*fault.Error)
	if !ok || fe.Field == "id" {
		return ""
	}
	var v struct {
		ID *string `json:"id"`
	}
	if json.Unmarshal(line, &v) != nil || v.ID == nil {
		return ""
	}
	return *v.ID
}

// maxExactInt is the largest integer a JSON number is read to exactly.
const maxExactInt = 1 << 53

// latticeInt reads the integer lattice parameter key. Integral values up to
// 2⁵³ in magnitude are stored; their range is checked by checkFormulaSize
// (sizes) and the builders. A positive value beyond that is "too-large"; a
// non-integral or non-numeric value, or a negative one beyond it, is
// "invalid" without advertising a range of sizes that includes negatives.
func (o *object) latticeInt(key string, dst *int) error {
	raw, ok := o.take(key)
	if !ok {
		return nil
	}
	path := join(o.path, key)
	v, err := number(path, raw)
	if err != nil || v != math.Trunc(v) {
		return fault.New(path, "must be a whole number; got %s", describe(raw))
	}
	switch {
	case v > maxExactInt:
		return &fault.Error{Kind: fault.TooLarge, Field: path,
			Msg: fmt.Sprintf("is %s: a lattice of that size would need more than %d bytes for its site positions alone, beyond any machine (the largest graph has %d sites)",
				describe(raw), int64(16)*maxExactInt, lattice.MaxSites)}
	case v < -maxExactInt:
		return fault.New(path, "must be a small non-negative whole number; got %s", describe(raw))
	}
	*dst = int(v)
	return nil
}

// graphSites reads lattice.sites of the graph kind: 1 … lattice.MaxSites,
// with counts beyond MaxSites "too-large".
func (o *object) graphSites(dst *int) error {
	var n int
	if err := o.latticeInt("sites", &n); err != nil {
		return err
	}
	if n > lattice.MaxSites {
		return tooLargeLattice("lattice.sites", "graph", float64(n), 0, 2,
			fmt.Sprintf("the largest graph has %d sites", lattice.MaxSites))
	}
	if n < 1 {
		return fault.Range("lattice.sites", fmt.Sprintf("between 1 and %d", lattice.MaxSites), n)
	}
	*dst = n
	return nil
}

// formulaCounts returns the numbers of sites and bonds of the lattice s
// describes, from the closed forms of its builder (bonds rounded up where
// open boundaries remove a few), the dimension of its positions, the field
// that drives the size, and the builder's own parameter cap as prose when
// the parameters exceed it. ok is false for kinds without a closed form
// (graph and the extensions decoded elsewhere) and for parameters below
// their minimum, which the builder refuses as "invalid".
func (s *LatticeSpec) formulaCounts() (n, m float64, dim int, field, capped string, ok bool) {
	fw, fh, fd := float64(s.Width), float64(s.Height), float64(s.Depth)
	cell := func(perCell, bondsPerCell float64) (float64, float64, int, string, string, bool) {
		if s.Width < 1 || s.Height < 1 {
			return 0, 0, 0, "", "", false
		}
		return perCell * fw * fh, bondsPerCell * fw * fh, 2, "lattice.width", "", true
	}
	line := func() (float64, float64, int, string, string, bool) {
		if s.Sites < 1 {
			return 0, 0, 0, "", "", false
		}
		return float64(s.Sites), float64(s.Sites), 2, "lattice.sites", "", true
	}
	gen := func(max int, name string) string {
		if s.Generation > max {
			return fmt.Sprintf("the %s builder stops at generation %d", name, max)
		}
		return ""
	}
	switch s.Kind {
	case "chain", "ring", "fibonacci", "harper":
		return line()
	case "complete":
		if s.Sites < 1 {
			return 0, 0, 0, "", "", false
		}
		f := float64(s.Sites)
		return f, f * (f - 1) / 2, 2, "lattice.sites", "", true
	case "square":
		return cell(1, 2)
	case "triangular":
		return cell(1, 3)
	case "honeycomb":
		return cell(2, 3)
	case "kagome":
		return cell(3, 6)
	case "lieb":
		return cell(3, 4)
	case "cubic":
		if s.Width < 1 || s.Height < 1 || s.Depth < 1 {
			return 0, 0, 0, "", "", false
		}
		return fw * fh * fd, 3 * fw * fh * fd, 3, "lattice.width", "", true
	case "triangle":
		if s.Side < 1 {
			return 0, 0, 0, "", "", false
		}
		L := float64(s.Side)
		c := ""
		if s.Side > 1<<15 {
			c = fmt.Sprintf("the triangle builder stops at side %d", 1<<15)
		}
		return (L + 1) * (L + 2) / 2, 3 * L * (L + 1) / 2, 2, "lattice.side", c, true
	case "gasket":
		if s.Generation < 0 {
			return 0, 0, 0, "", "", false
		}
		p := math.Pow(3, float64(s.Generation))
		return 3 * (p + 1) / 2, 3 * p, 2, "lattice.generation", gen(lattice.MaxGasketGeneration, "gasket"), true
	case "carpet":
		if s.Generation < 0 {
			return 0, 0, 0, "", "", false
		}
		// The builder's recursion for the cell count n and bond count m.
		n, m, p3 := 1.0, 0.0, 1.0
		if s.Variant == "corners" {
			n, m = 4, 4
		}
		for range min(s.Generation, 400) {
			if s.Variant == "corners" {
				n, m = 8*n-8*(p3+1), 8*m-8*p3
			} else {
				n, m = 8*n, 8*m+8*p3
			}
			p3 *= 3
		}
		if s.Generation > 400 {
			n, m = math.Inf(1), math.Inf(1)
		}
		return n, m, 2, "lattice.generation", gen(lattice.MaxCarpetGeneration, "carpet"), true
	case "hypercube":
		if s.Dimension < 1 {
			return 0, 0, 0, "", "", false
		}
		d := float64(s.Dimension)
		c := ""
		if s.Dimension > lattice.MaxHypercubeDimension {
			c = fmt.Sprintf("the hypercube builder stops at dimension %d", lattice.MaxHypercubeDimension)
		}
		return math.Pow(2, d), d * math.Pow(2, d-1), min(s.Dimension, 1<<20), "lattice.dimension", c, true
	case "star":
		if s.Leaves < 1 {
			return 0, 0, 0, "", "", false
		}
		return float64(s.Leaves) + 1, float64(s.Leaves), 2, "lattice.leaves", "", true
	case "cayley":
		if s.Coordination < 2 || s.Coordination > 1_000_000 || s.Shells < 0 {
			return 0, 0, 0, "", "", false
		}
		n, shell := 1.0, float64(s.Coordination)
		for r := 1; r <= s.Shells && n <= 4*lattice.MaxSites; r++ {
			n += shell
			shell *= float64(s.Coordination - 1)
		}
		return n, n - 1, 2, "lattice.shells", "", true
	case "vicsek":
		if s.Generation < 0 {
			return 0, 0, 0, "", "", false
		}
		p := math.Pow(5, float64(s.Generation))
		return p, p - 1, 2, "lattice.generation", gen(lattice.MaxVicsekGeneration, "vicsek"), true
	case "tfractal":
		if s.Generation < 0 {
			return 0, 0, 0, "", "", false
		}
		p := math.Pow(3, float64(s.Generation))
		return p + 1, p, 2, "lattice.generation", gen(lattice.MaxTFractalGeneration, "tfractal"), true
	}
	return 0, 0, 0, "", "", false
}

// checkFormulaSize refuses, before anything is built, a lattice whose size
// parameters give more sites than any graph may have (lattice.MaxSites),
// exceed the builder's own cap (which exists for the same reason), or whose
// graph alone (lattice.EstimateBytes of the closed-form counts) exceeds the
// memory limit: code "too-large" with the estimate in bytes. Parameters
// below their minimum are left to the builder ("invalid").
func (s *LatticeSpec) checkFormulaSize() error {
	n, m, dim, field, capped, ok := s.formulaCounts()
	if !ok {
		return nil
	}
	switch {
	case capped != "":
		return tooLargeLattice(field, s.Kind, n, m, dim, capped)
	case n > lattice.MaxSites:
		return tooLargeLattice(field, s.Kind, n, m, dim, fmt.Sprintf("the largest graph has %d sites", lattice.MaxSites))
	}
	if est, lim := latticeBytes(n, m, dim), float64(fault.MemoryLimit()); est > lim {
		return tooLargeLattice(field, s.Kind, n, m, dim, fmt.Sprintf("the memory limit is %d bytes", int64(lim)))
	}
	return nil
}

// latticeBytes is lattice.EstimateBytes for counts that may exceed an int
// (the same formula in floating point beyond 2⁵⁰).
func latticeBytes(n, m float64, dim int) float64 {
	const big = 1 << 50
	if n <= big && m <= big {
		return float64(lattice.EstimateBytes(int(n), int(m), dim))
	}
	return 8*n*float64(dim) + 16*m + 4*(n+1)
}

// tooLargeLattice is the "too-large" error of a lattice of n sites and m
// bonds, with the estimate of its graph in bytes.
func tooLargeLattice(field, kind string, n, m float64, dim int, why string) error {
	est := latticeBytes(n, m, dim)
	var size string
	switch {
	case est < 1<<62:
		size = fmt.Sprintf("about %d bytes (%.3g GiB)", int64(est), est/(1<<30))
	case math.IsInf(est, 1):
		size = fmt.Sprintf("more than %.3g bytes", math.MaxFloat64)
	default:
		size = fmt.Sprintf("about %.3g bytes", est)
	}
	return &fault.Error{Kind: fault.TooLarge, Field: field,
		Msg: fmt.Sprintf("gives a %s lattice of %s sites and %s bonds, whose graph alone needs %s before any propagation; %s",
			kind, count(n), count(m), size, why)}
}

// count renders a site or bond count for a message; counts beyond the
// float64 range (2³¹ generations, say) read "more than 1.8e+308".
func count(x float64) string {
	if math.IsInf(x, 1) || math.IsNaN(x) {
		return fmt.Sprintf("more than %.3g", math.MaxFloat64)
	}
	return fmt.Sprintf("%.4g", x)
}

// checkRemove validates the remove list against a graph of n sites: every
// entry a site index (field "remove[k]"), no site twice ("remove[k]" of the
// repeat), and at least one site left (field "remove").
func checkRemove(remove []int, n int) error {
	seen := make(map[int]int, len(remove))
	for k, i := range remove {
		if i < 0 || i >= n {
			return fault.New(index("remove", k), "must be a site index between 0 and %d; got %d", n-1, i)
		}
		if p, dup := seen[i]; dup {
			return fault.New(index("remove", k), "repeats site %d (already remove[%d]); list each site once", i, p)
		}
		seen[i] = k
	}
	if len(seen) >= n {
		return fault.New("remove", "must leave at least one site; it lists all %d sites", n)
	}
	return nil
}

// checkClassical refuses what classical dynamics cannot honour: a negative
// listed bond weight (the weight is a rate, and a negative one makes −L
// non-stochastic, populations leaving [0, 1]) and on-site disorder (−L,
// L = D − W, has no on-site term, so it would be a silent no-op). A zero
// weight is accepted: a bond of rate 0 carries no transfer, as if it were
// not listed. Graph onsite energies are accepted and documented as unused
// (a graph is often shared between quantum and classical jobs).
func (job *Job) checkClassical() error {
	if job.Dynamics != Classical || job.Lattice == nil {
		return nil
	}
	if d := job.Disorder; d != nil && d.Onsite != 0 {
		return fault.New("disorder.onsite", "is not used by classical dynamics (the generator −L, L = D − W, has no on-site term); got %v", d.Onsite)
	}
	for k, b := range job.Lattice.Bonds {
		if b.W < 0 {
			return fault.Range(index("lattice.bonds", k),
				"a positive weight for classical dynamics (a rate; 0 is accepted and carries no transfer)", b.W)
		}
	}
	return nil
}

// checkFitWindow refuses a regime fit of a walk job whose window holds
// fewer than 4 usable points (t > 0 and a positive fitted quantity): a user
// input problem, "invalid", field "fit" when a window was given and "times"
// otherwise.
func (j *Job) checkFitWindow(t []float64) error {
	c := 0
	for _, x := range t {
		if x >= j.Fit.From && (j.Fit.To == 0 || x <= j.Fit.To) {
			c++
		}
	}
	if c >= 4 {
		return nil
	}
	if j.Fit.From != 0 || j.Fit.To != 0 {
		to := "the last time"
		if j.Fit.To != 0 {
			to = fmt.Sprint(j.Fit.To)
		}
		return fault.New("fit", "window from %v to %s holds %d usable times (t > 0 with the fitted quantity positive); the regime analysis needs at least 4: widen \"from\"/\"to\" or report more times in it",
			j.Fit.From, to, c)
	}
	return fault.New("times", "give %d usable times (t > 0 with the fitted quantity positive); the regime analysis needs at least 4", c)
}

// logGridPoint returns the point at fraction f of a log-spaced grid from a
// to b: a·(b/a)^f, except that a point whose decimal exponent
// log₁₀a + f·(log₁₀b − log₁₀a) is an integer (to 10⁻¹² relative) is that
// power of ten exactly, so that {"from": 0.001, "to": 1000, "count": 7}
// gives 0.01, 0.1, 10 and 100 without round-off.
func logGridPoint(a, b, f float64) float64 {
	la, lb := math.Log10(a), math.Log10(b)
	e := la + f*(lb-la)
	if r := math.Round(e); math.Abs(e-r) <= 1e-12*max(1, math.Abs(e)) && math.Abs(r) < 300 {
		return math.Pow10(int(r))
	}
	return a * math.Pow(b/a, f)
}

// hamiltonianNorm returns an upper bound on the spectral norm of the
// generator of g with hopping gamma: Gershgorin's bound
// max_i (|ε_i| + |γ| Σ_j |W_ij|) (Gershgorin, Izv. Akad. Nauk SSSR 6, 749
// (1931)), widened by the disorder's on-site strength and bond spread.
// The classical generator L = D − W has the bound 2|γ| max_i Σ_j |W_ij|.
func (j *Job) hamiltonianNorm(g *lattice.Graph) float64 {
	row := make([]float64, g.Len())
	for k := range g.NumBonds() {
		b := g.Bond(k)
		row[b.I] += math.Abs(b.W)
		row[b.J] += math.Abs(b.W)
	}
	scale := 1.0
	var extra float64
	if d := j.Disorder; d != nil {
		scale += d.Bond
		extra = d.Onsite
		if d.Law == "gauss" {
			scale += 3 * d.Bond // three standard deviations
			extra *= 3
		}
	}
	var norm float64
	for i, r := range row {
		v := math.Abs(j.Hopping) * r * scale
		if j.Dynamics == Classical {
			v *= 2
		} else {
			v += math.Abs(g.Onsite(i)) + extra
		}
		norm = math.Max(norm, v)
	}
	return norm
}

// roundingFloor raises the reported error bound to the error double
// precision cannot avoid, which a propagator's own bound (truncation only)
// can miss at very long times. For a quantum walk the phases λt carry a
// relative rounding error ε = 2⁻⁵² each, so the state at time t is
// uncertain by about ε·‖H‖·t. A classical walk damps instead, so its
// rounding does not grow with t past the relaxation of the slowest mode;
// it is estimated as 10·ε per matrix–vector product (each product and its
// update round the state by a few ε, amplified up to k² in a Chebyshev
// recurrence near the end of the interval, where the slow modes of γL
// sit). An audit on a chain with rates 10⁻³ and 10³ at ‖γL‖·t ≈ 1.6·10⁶
// found 2.5e-11 after 20,044 products (5.5·ε per product) against a
// truncation bound of 7.6e-13; this floor gives 4.5e-11 there.
func (j *Job) roundingFloor(resp *Response, g *lattice.Graph) {
	d := resp.Diagnostics
	if d == nil || len(j.Times) == 0 {
		return
	}
	const eps = 0x1p-52
	if j.Dynamics == Classical {
		d.ErrorBound = math.Max(d.ErrorBound, 10*eps*float64(d.Products))
		return
	}
	tmax := j.Times[len(j.Times)-1]
	d.ErrorBound = math.Max(d.ErrorBound, eps*j.hamiltonianNorm(g)*tmax)
}

// maxChebyshevProducts bounds the matrix–vector products a "chebyshev" job
// may need: about ‖H‖·t_max products reach t_max (the series of e^{−iHt}
// converges after about ‖H‖t terms; Tal-Ezer & Kosloff, J. Chem. Phys. 81,
// 3967 (1984)). 10⁹ products take hours even on a small graph (chosen here).
const maxChebyshevProducts = 1e9

// checkChebyshevTime refuses a "chebyshev" job whose product count alone
// exceeds maxChebyshevProducts, as "too-large" with the estimate.
func (j *Job) checkChebyshevTime(g *lattice.Graph) error {
	if j.Method != Chebyshev || len(j.Times) == 0 {
		return nil
	}
	p := j.hamiltonianNorm(g) * j.Times[len(j.Times)-1]
	if p <= maxChebyshevProducts {
		return nil
	}
	work := p * float64(2*g.NumBonds()+g.Len())
	return &fault.Error{Kind: fault.TooLarge, Field: "method",
		Msg: fmt.Sprintf("\"chebyshev\" needs about %.3g matrix–vector products to reach t = %v (‖H‖·t with ‖H‖ ≤ %.4g), about %.3g multiply-adds, beyond the limit of %.0e products: use \"exact\" (small graphs) or \"auto\"",
			p, j.Times[len(j.Times)-1], j.hamiltonianNorm(g), work, maxChebyshevProducts)}
}

// negligibleTimes returns times with every t at which the propagator is the
// identity to double precision (‖H‖·t < 2⁻⁵³, ‖H‖ by hamiltonianNorm)
// replaced by 0, so that no propagation method is asked to resolve a time
// step below rounding (a series expansion in ‖H‖t can underflow there).
// The response still echoes the requested times. times itself is not
// modified; it is returned unchanged when no time is negligible.
func (j *Job) negligibleTimes(g *lattice.Graph, times []float64) []float64 {
	norm := j.hamiltonianNorm(g)
	var out []float64
	for k, t := range times {
		if t > 0 && norm*t < 0x1p-53 {
			if out == nil {
				out = append([]float64(nil), times...)
			}
			out[k] = 0
		}
	}
	if out == nil {
		return times
	}
	return out
}

// autoRetry reports whether a propagation under method "auto" that ended
// with err should be run once more with Krylov: a numerical failure (not an
// input error, not a cancellation) of the method Auto chose, typically a
// Chebyshev series at a time step far below the spectral scale.
func autoRetry(ctx context.Context, set Settings, err error) bool {
	if err == nil || set.Method != Auto || ctx.Err() != nil {
		return false
	}
	var fe *fault.Error
	if errors.As(err, &fe) {
		return false
	}
	return !errors.Is(err, context.Canceled) && !errors.Is(err, context.DeadlineExceeded)
}

// checkPoints validates the points of a series in index order, so that the
// error names the lowest offending index over all lists (times[k], then
// values[k], then errors[k]): times positive and strictly increasing,
// values positive and finite, errors (when given) positive and finite, one
// rule for every error, as observables.FitRegimes weights by 1/σ².
func (s *SeriesSpec) checkPoints() error {
	for k, t := range s.Times {
		if t <= 0 {
			return fault.Range(index("series.times", k), "a positive time", t)
		}
		if k > 0 && t <= s.Times[k-1] {
			return fault.New(index("series.times", k), "must be greater than the time before it (%v); got %v", s.Times[k-1], t)
		}
		if v := s.Values[k]; v <= 0 || math.IsInf(v, 0) || math.IsNaN(v) {
			return fault.Range(index("series.values", k), "a positive finite number", v)
		}
		if s.Errors != nil {
			if e := s.Errors[k]; e <= 0 || math.IsInf(e, 0) || math.IsNaN(e) {
				return fault.Range(index("series.errors", k), "a positive finite number (a standard error)", e)
			}
		}
	}
	return nil
}

// clampProbabilities clamps every p_i into [0, 1] in place and returns p:
// a propagated state within its tolerance can give a probability a
// rounding step outside (1 + 10⁻¹², −10⁻¹⁷), which the reductions (Pólya
// number, entropy) must not see. The norm drift in the diagnostics still
// reports the deviation.
func clampProbabilities(p []float64) []float64 {
	for i, v := range p {
		if v < 0 {
			p[i] = 0
		} else if v > 1 {
			p[i] = 1
		}
	}
	return p
}

// maxNear bounds the coordinates of start.near: squared distances to the
// lattice's sites must stay finite (1e150² = 1e300 < MaxFloat64), or every
// site would tie at +Inf.
const maxNear = 1e150

// checkNear refuses a start.near coordinate beyond ±maxNear.
func checkNear(field string, near []float64) error {
	for k, x := range near {
		if math.Abs(x) > maxNear {
			return fault.Range(index(field+".near", k), "a coordinate of magnitude at most 1e150 (squared distances must stay finite)", x)
		}
	}
	return nil
}

// autoLoose reports whether a successful propagation under method "auto"
// came back with an error bound beyond what the job accepts
// (maxErrorBound): the dense eigensystem's bound grows like t·‖HV − VΛ‖
// even where the state does not (classical walks at very long times), and
// Krylov may bound the same step tightly.
func (j *Job) autoLoose(set Settings, d Diagnostics, err error) bool {
	return err == nil && set.Method == Auto && d.ErrorBound > maxErrorBound(j.Tolerance)
}
