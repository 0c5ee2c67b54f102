package walk

import (
	"bytes"
	"encoding/json"
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// topLevel lists every request field of the job format and its extensions.
var topLevel = []string{"id", "lattice", "hopping", "start", "dynamics", "times",
	"tolerance", "method", "report", "remove", "disorder", "fit", "window",
	"series", "spectrum",
	// Lab-workflow extensions (job_lab*.go).
	"units", "fabrication", "plan", "measurement", "compare"}

// Decode reads one request line strictly: non-JSON is "malformed", a key the
// format does not define is "unknown-field" (named with its path, e.g.
// "lattice.generaton"), and a value of the wrong type or out of range is
// "invalid" (named with its path, e.g. "times[3]"). Defaults are applied as
// the contract states. When the id could be read, the returned Job carries
// it even when err is non-nil, so the error line can echo it.
func Decode(line []byte) (*Job, error) {
	job := &Job{}
	line = bytes.TrimSpace(stripBOM(line))
	if !json.Valid(line) {
		return job, &decodeError{code: codeMalformed, msg: "the line is not valid JSON"}
	}
	o, err := parseObject("", line)
	if err != nil {
		if fe, ok := err.(*fault.Error); ok && fe.Field == "" {
			return job, &decodeError{code: codeMalformed, msg: "a request must be a JSON object; got " + describe(line)}
		}
		job.ID = idDespite(line, err) // a repeated key is "invalid", naming the key
		return job, err
	}
	// The id first, so that every later error can echo it.
	if raw, ok := o.take("id"); ok {
		if job.ID, err = str("id", raw); err != nil {
			return job, err
		}
	}
	if err := o.only(topLevel...); err != nil {
		return job, err
	}
	return job, job.decode(o)
}

func (job *Job) decode(o *object) error {
	switch {
	case o.has("series"):
		return job.decodeSeriesJob(o)
	case o.has("spectrum"):
		return job.decodeSpectrumJob(o)
	case o.has("plan"):
		return job.decodePlanJob(o)
	case o.has("measurement"):
		return job.decodeMeasurementJob(o)
	}
	return job.decodeWalkJob(o)
}

// forbid returns an invalid error when any of keys is present in o.
func forbid(o *object, what string, keys ...string) error {
	for _, k := range keys {
		if o.has(k) {
			return fault.New(k, "is not used by %s", what)
		}
	}
	return nil
}

func (job *Job) decodeWalkJob(o *object) error {
	job.Hopping = 1
	job.Tolerance = 1e-10
	job.Report = []string{"msd", "return"}
	job.Fit = FitSpec{Quantity: "msd", Segments: 4}
	if err := forbid(o, "a walk job (it belongs to a measurement job)", "compare"); err != nil {
		return err
	}

	raw, ok := o.take("lattice")
	if !ok {
		return fault.New("lattice", "is required: an object such as {\"kind\": \"gasket\", \"generation\": 6}")
	}
	var err error
	if job.Lattice, err = decodeLattice(raw); err != nil {
		return err
	}
	if err := job.decodeCommon(o); err != nil {
		return err
	}
	raw, ok = o.take("start")
	if !ok {
		return fault.New("start", "is required: {\"site\": i} or {\"near\": [x, y, ...]}")
	}
	if job.Start, err = decodeStart(raw); err != nil {
		return err
	}
	var dyn string
	if err := o.choice("dynamics", &dyn, "quantum", "classical"); err != nil {
		return err
	}
	if dyn == "classical" {
		job.Dynamics = Classical
	}
	raw, ok = o.take("times")
	if !ok {
		return fault.New("times", "is required: a list of non-negative increasing times or {\"from\", \"to\", \"count\", \"spacing\"}")
	}
	if job.Times, err = decodeTimes(raw); err != nil {
		return err
	}
	if err := job.decodeTolMethod(o); err != nil {
		return err
	}
	if raw, ok := o.take("report"); ok {
		items, err := list("report", raw)
		if err != nil {
			return err
		}
		job.Report = job.Report[:0]
		for k, it := range items {
			name, err := choice(index("report", k), it, walkReports...)
			if err != nil {
				return err
			}
			job.Report = append(job.Report, name)
		}
	}
	if fo, err := o.sub("fit"); err != nil {
		return err
	} else if fo != nil {
		if err := decodeFit(fo, &job.Fit, true); err != nil {
			return err
		}
	}
	if wo, err := o.sub("window"); err != nil {
		return err
	} else if wo != nil {
		w := &WindowSpec{Samples: 200}
		if err := wo.only("to", "samples"); err != nil {
			return err
		}
		raw, ok := wo.take("to")
		if !ok {
			return wo.required("to", "the end of the averaging window, a positive time")
		}
		if w.To, err = number("window.to", raw); err != nil || w.To <= 0 {
			return fault.New("window.to", "must be a positive time; got %s", describe(raw))
		}
		if err := wo.int("samples", &w.Samples, 1, MaxTimes); err != nil {
			return err
		}
		job.Window = w
	}
	if job.Dynamics == Classical {
		if job.Hopping < 0 {
			return fault.Range("hopping", "non-negative for classical dynamics (it is a rate)", job.Hopping)
		}
		if err := job.checkClassical(); err != nil {
			return err
		}
		if job.reports("correlations") {
			return fault.New("report", "\"correlations\" needs quantum dynamics")
		}
		if d := job.Disorder; d != nil && d.Bond > 0 && (d.Law == "gauss" || d.Bond > 2) {
			return fault.New("disorder.bond", "must keep rates non-negative for classical dynamics: box law with bond at most 2; got %s law with bond %v", d.Law, d.Bond)
		}
	}
	if job.reports("correlations") && job.Start.Second < 0 {
		return fault.New("start.second", "is required by the \"correlations\" report: the site of the second particle")
	}
	return job.decodeLab(o)
}

// decodeCommon reads the fields shared by walk and spectrum jobs: hopping,
// remove and disorder.
func (job *Job) decodeCommon(o *object) error {
	if err := o.num("hopping", &job.Hopping); err != nil {
		return err
	}
	if raw, ok := o.take("remove"); ok {
		var err error
		if job.Remove, err = integers("remove", raw, maxListLen, 0, math.MaxInt32); err != nil {
			return err
		}
	}
	if raw, ok := o.take("disorder"); ok {
		d, err := decodeDisorder(raw)
		if err != nil {
			return err
		}
		job.Disorder = d
	}
	return nil
}

// maxListLen bounds any list in a request.
const maxListLen = 1 << 28

func decodeStart(raw json.RawMessage) (*StartSpec, error) {
	o, err := parseObject("start", raw)
	if err != nil {
		return nil, err
	}
	if err := o.only("site", "near", "second", "statistics"); err != nil {
		return nil, err
	}
	s := &StartSpec{Site: -1, Second: -1, Statistics: "bosons"}
	switch {
	case o.has("site") && o.has("near"):
		return nil, fault.New("start", "must give either site or near, not both")
	case o.has("site"):
		if err := o.int("site", &s.Site, 0, math.MaxInt32); err != nil {
			return nil, err
		}
	case o.has("near"):
		raw, _ := o.take("near")
		if s.Near, err = numbers("start.near", raw, 64); err != nil {
			return nil, err
		}
		if len(s.Near) == 0 {
			return nil, fault.New("start.near", "must be a point with 1 to 64 coordinates; got an empty list")
		}
	default:
		return nil, fault.New("start", "must give site (an index) or near (a point)")
	}
	if err := o.int("second", &s.Second, 0, math.MaxInt32); err != nil {
		return nil, err
	}
	if err := o.choice("statistics", &s.Statistics, "bosons", "fermions", "distinguishable"); err != nil {
		return nil, err
	}
	return s, nil
}

func decodeTimes(raw json.RawMessage) ([]float64, error) {
	if t := bytes.TrimSpace(raw); len(t) > 0 && t[0] == '{' {
		return decodeTimeRange(raw)
	}
	ts, err := numbers("times", raw, MaxTimes)
	if err != nil {
		return nil, err
	}
	if len(ts) == 0 {
		return nil, fault.New("times", "must hold at least one time; got an empty list")
	}
	for k, t := range ts {
		if t < 0 {
			return nil, fault.Range(index("times", k), "a non-negative time", t)
		}
		if k > 0 && t < ts[k-1] {
			return nil, fault.New(index("times", k), "must not be smaller than the time before it (%v); got %v", ts[k-1], t)
		}
	}
	return ts, nil
}

// decodeTimeRange expands {"from": a, "to": b, "count": n, "spacing": s}.
// Linear: a + (b−a)k/(n−1); log: a·(b/a)^(k/(n−1)), a > 0 required; both
// include a and b exactly. spacing defaults to "linear"; count to 50.
func decodeTimeRange(raw json.RawMessage) ([]float64, error) {
	o, err := parseObject("times", raw)
	if err != nil {
		return nil, err
	}
	if err := o.only("from", "to", "count", "spacing"); err != nil {
		return nil, err
	}
	var a, b float64
	n, spacing := 50, "linear"
	if !o.has("from") {
		return nil, o.required("from", "the first time")
	}
	if !o.has("to") {
		return nil, o.required("to", "the last time")
	}
	if err := o.num("from", &a); err != nil {
		return nil, err
	}
	if err := o.num("to", &b); err != nil {
		return nil, err
	}
	if err := o.int("count", &n, 1, MaxTimes); err != nil {
		return nil, err
	}
	if err := o.choice("spacing", &spacing, "linear", "log"); err != nil {
		return nil, err
	}
	if a < 0 {
		return nil, fault.Range("times.from", "a non-negative time", a)
	}
	if b < a {
		return nil, fault.New("times.to", "must be at least times.from (%v); got %v", a, b)
	}
	if spacing == "log" && a <= 0 {
		return nil, fault.Range("times.from", "positive for log spacing", a)
	}
	return TimeGrid(a, b, n, spacing == "log"), nil
}

// TimeGrid returns the n times of the job format's {"from": a, "to": b,
// "count": n, "spacing": …} form: linear a + (b−a)k/(n−1), or with log
// a·(b/a)^(k/(n−1)) (a > 0); both hold a and b exactly and never decrease.
// n = 1 gives [a].
func TimeGrid(a, b float64, n int, log bool) []float64 {
	ts := make([]float64, n)
	for k := range ts {
		if n == 1 {
			ts[k] = a
			break
		}
		f := float64(k) / float64(n-1)
		if log {
			ts[k] = logGridPoint(a, b, f)
		} else {
			ts[k] = a + (b-a)*f
		}
	}
	if n > 1 {
		ts[0], ts[n-1] = a, b
	}
	// Rounding can break monotonicity only for nearly equal a and b.
	for k := 1; k < n; k++ {
		if ts[k] < ts[k-1] {
			ts[k] = ts[k-1]
		}
	}
	return ts
}

func decodeDisorder(raw json.RawMessage) (*DisorderSpec, error) {
	o, err := parseObject("disorder", raw)
	if err != nil {
		return nil, err
	}
	if err := o.only("onsite", "bond", "law", "realisations", "seed", "first"); err != nil {
		return nil, err
	}
	d := &DisorderSpec{Law: "box", Realisations: 1}
	if err := o.num("onsite", &d.Onsite); err != nil {
		return nil, err
	}
	if d.Onsite < 0 {
		return nil, fault.Range("disorder.onsite", "a non-negative width", d.Onsite)
	}
	if err := o.num("bond", &d.Bond); err != nil {
		return nil, err
	}
	if d.Bond < 0 {
		return nil, fault.Range("disorder.bond", "a non-negative width", d.Bond)
	}
	if err := o.choice("law", &d.Law, "box", "gauss"); err != nil {
		return nil, err
	}
	if err := o.int("realisations", &d.Realisations, 1, MaxRealisations); err != nil {
		return nil, err
	}
	if raw, ok := o.take("seed"); ok {
		if d.Seed, err = uinteger("disorder.seed", raw); err != nil {
			return nil, err
		}
	}
	if err := o.int("first", &d.First, 0, math.MaxInt32); err != nil {
		return nil, err
	}
	return d, nil
}

func decodeFit(o *object, f *FitSpec, walk bool) error {
	if err := o.only("from", "to", "segments", "quantity"); err != nil {
		return err
	}
	q := &f.Quantity
	if !walk {
		q = new(string) // checked and ignored: the curve is given (one fit object serves both)
	}
	if err := o.choice("quantity", q, "msd", "spread"); err != nil {
		return err
	}
	if err := o.num("from", &f.From); err != nil {
		return err
	}
	if f.From < 0 {
		return fault.Range("fit.from", "a non-negative time", f.From)
	}
	if err := o.num("to", &f.To); err != nil {
		return err
	}
	if o.has("to") && f.To <= f.From {
		return fault.New("fit.to", "must be greater than fit.from (%v); got %v", f.From, f.To)
	}
	return o.int("segments", &f.Segments, 1, 8)
}

func (job *Job) decodeSeriesJob(o *object) error {
	job.Report = []string{"regimes"}
	job.Fit = FitSpec{Quantity: "series", Segments: 4}
	if err := forbid(o, "a series job", "lattice", "start", "times", "hopping", "dynamics",
		"tolerance", "method", "remove", "disorder", "window", "spectrum",
		"units", "fabrication", "plan", "measurement", "compare"); err != nil {
		return err
	}
	so, err := o.sub("series")
	if err != nil {
		return err
	}
	if err := so.only("times", "values", "errors"); err != nil {
		return err
	}
	s := &SeriesSpec{}
	raw, ok := so.take("times")
	if !ok {
		return so.required("times", "the sample times, positive and strictly increasing")
	}
	if s.Times, err = numbers("series.times", raw, MaxTimes); err != nil {
		return err
	}
	raw, ok = so.take("values")
	if !ok {
		return so.required("values", "one positive value per time")
	}
	if s.Values, err = numbers("series.values", raw, MaxTimes); err != nil {
		return err
	}
	if raw, ok := so.take("errors"); ok {
		if s.Errors, err = numbers("series.errors", raw, MaxTimes); err != nil {
			return err
		}
	}
	if err := s.validate(); err != nil {
		return err
	}
	job.Series = s
	if raw, ok := o.take("report"); ok {
		items, err := list("report", raw)
		if err != nil {
			return err
		}
		for k, it := range items {
			if _, err := choice(index("report", k), it, "regimes"); err != nil {
				return err
			}
		}
	}
	if fo, err := o.sub("fit"); err != nil {
		return err
	} else if fo != nil {
		if err := decodeFit(fo, &job.Fit, false); err != nil {
			return err
		}
	}
	return nil
}

func (s *SeriesSpec) validate() error {
	n := len(s.Times)
	if n < 2 {
		return fault.New("series.times", "must hold at least 2 times; got %d", n)
	}
	if len(s.Values) != n {
		return fault.New("series.values", "must hold one value per time (%d); got %d", n, len(s.Values))
	}
	if s.Errors != nil && len(s.Errors) != n {
		return fault.New("series.errors", "must hold one error per time (%d); got %d", n, len(s.Errors))
	}
	return s.checkPoints()
}

func (job *Job) decodeSpectrumJob(o *object) error {
	job.Hopping = 1
	if err := forbid(o, "a spectrum job", "start", "times", "dynamics", "tolerance",
		"method", "report", "fit", "window", "units", "fabrication", "plan", "measurement", "compare"); err != nil {
		return err
	}
	raw, ok := o.take("lattice")
	if !ok {
		return fault.New("lattice", "is required by a spectrum job")
	}
	var err error
	if job.Lattice, err = decodeLattice(raw); err != nil {
		return err
	}
	if err := job.decodeCommon(o); err != nil {
		return err
	}
	if job.Disorder != nil && job.Disorder.Realisations != 1 {
		return fault.New("disorder.realisations", "must be 1 in a spectrum job; got %d", job.Disorder.Realisations)
	}
	so, err := o.sub("spectrum")
	if err != nil {
		return err
	}
	if err := so.only(append([]string{"eigenvalues", "dos", "ratio", "box_dimension"}, spectrumExtKeys...)...); err != nil {
		return err
	}
	s := &SpectrumSpec{}
	if err := so.bool("eigenvalues", &s.Eigenvalues); err != nil {
		return err
	}
	if err := so.bool("ratio", &s.Ratio); err != nil {
		return err
	}
	if err := so.bool("box_dimension", &s.BoxDimension); err != nil {
		return err
	}
	do, err := so.sub("dos")
	if err != nil {
		return err
	}
	if do != nil {
		if err := do.only("bins", "method", "moments", "vectors", "seed"); err != nil {
			return err
		}
		d := &DOSSpec{Bins: 200, Method: "kpm", Moments: 512, Vectors: 10}
		if err := do.int("bins", &d.Bins, 1, 1<<20); err != nil {
			return err
		}
		if err := do.choice("method", &d.Method, "exact", "kpm"); err != nil {
			return err
		}
		if err := do.int("moments", &d.Moments, 2, 1<<16); err != nil {
			return err
		}
		if err := do.int("vectors", &d.Vectors, 1, 1<<12); err != nil {
			return err
		}
		if raw, ok := do.take("seed"); ok {
			if d.Seed, err = uinteger("spectrum.dos.seed", raw); err != nil {
				return err
			}
		}
		s.DOS = d
	}
	if err := decodeSpectrumExt(so, &s.SpectrumExt); err != nil {
		return err
	}
	if !s.Eigenvalues && s.DOS == nil && !s.Ratio && !s.BoxDimension && !s.SpectrumExt.any() {
		return fault.New("spectrum", "must ask for at least one of eigenvalues, dos, ratio, box_dimension, ipr, window, ldos, sectors, spectral_dimension, bands")
	}
	job.Spectrum = s
	return nil
}

// decodeTolMethod reads tolerance (in (0, 0.1]) and method, for walk, plan
// and measurement jobs.
func (job *Job) decodeTolMethod(o *object) error {
	if raw, ok := o.take("tolerance"); ok {
		v, err := number("tolerance", raw)
		if err != nil || v <= 0 || v > 0.1 {
			return fault.New("tolerance", "must be a number greater than 0 and at most 0.1; got %s", describe(raw))
		}
		job.Tolerance = v
	}
	var method string
	if err := o.choice("method", &method, "auto", "exact", "krylov", "chebyshev"); err != nil {
		return err
	}
	job.Method = map[string]Method{"": Auto, "auto": Auto, "exact": Exact, "krylov": Krylov, "chebyshev": Chebyshev}[method]
	return nil
}
