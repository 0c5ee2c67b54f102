package walk

import (
	"context"
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/observables"
	"github.com/ampwalk/ampwalk/observables/measure"
)

// MaxMeasurementCSV bounds the size of measurement.csv in bytes.
const MaxMeasurementCSV = 64 << 20

// MeasurementSpec is the "measurement" object of a measurement job: CSV
// text in the format of measure.ReadCSV (header length,site,intensity and
// optionally uncertainty; sites in the built lattice's numbering), the
// input site Start and the Quantity ("msd" or "spread") the regime analysis
// fits.
type MeasurementSpec struct {
	CSV      string
	Start    int
	Quantity string
}

// MeasuredPoint is one length of a measurement job's "points": the
// measured intensities normalised and reduced (measure.Reduce), each
// quantity with its propagated standard deviation (0 without uncertainties).
type MeasuredPoint struct {
	Length    float64 `json:"length"`
	MSD       float64 `json:"msd"`
	MSDErr    float64 `json:"msd_err"`
	Spread    float64 `json:"spread"`
	SpreadErr float64 `json:"spread_err"`
	IPR       float64 `json:"ipr"`
	IPRErr    float64 `json:"ipr_err"`
}

// ComparisonPoint compares the measured and the simulated distribution at
// one length: Overlap Σ_j √(p_j q_j) and total variation Distance
// ½Σ_j |p_j − q_j| (measure.Comparison).
type ComparisonPoint struct {
	Length   float64 `json:"length"`
	Overlap  float64 `json:"overlap"`
	Distance float64 `json:"distance"`
}

// decodeMeasurementJob reads a measurement job: lattice, measurement and
// optionally hopping, remove, units, compare, fit, tolerance and method.
func (job *Job) decodeMeasurementJob(o *object) error {
	job.Hopping, job.Tolerance = 1, 1e-10
	job.Fit = FitSpec{Quantity: "msd", Segments: 4}
	if err := forbid(o, "a measurement job", "start", "times", "dynamics", "report", "disorder",
		"fabrication", "window", "plan", "series", "spectrum"); err != nil {
		return err
	}
	raw, ok := o.take("lattice")
	if !ok {
		return fault.New("lattice", "is required by a measurement job: the measured array, sites in the CSV's numbering")
	}
	var err error
	if job.Lattice, err = decodeLattice(raw); err != nil {
		return err
	}
	if err := job.decodeCommon(o); err != nil {
		return err
	}
	mo, err := o.sub("measurement")
	if err != nil {
		return err
	}
	if err := mo.only("csv", "start", "quantity"); err != nil {
		return err
	}
	m := &MeasurementSpec{Quantity: "msd"}
	raw, ok = mo.take("csv")
	if !ok {
		return mo.required("csv", "the measured intensities as CSV text with the header length,site,intensity[,uncertainty]")
	}
	if m.CSV, err = str("measurement.csv", raw); err != nil {
		return err
	}
	if len(m.CSV) > MaxMeasurementCSV {
		return fault.New("measurement.csv", "must be at most %d bytes; got %d", MaxMeasurementCSV, len(m.CSV))
	}
	if !mo.has("start") {
		return mo.required("start", "the input site (where the light was injected), the origin of the MSD")
	}
	if err := mo.int("start", &m.Start, 0, 1<<31-1); err != nil {
		return err
	}
	mq := mo.has("quantity")
	if err := mo.choice("quantity", &m.Quantity, "msd", "spread"); err != nil {
		return err
	}
	job.Measurement = m
	job.Fit.Quantity = m.Quantity
	if err := o.bool("compare", &job.Compare); err != nil {
		return err
	}
	if uo, err := o.sub("units"); err != nil {
		return err
	} else if uo != nil {
		if job.Units, err = decodeUnits(uo); err != nil {
			return err
		}
	}
	if fo, err := o.sub("fit"); err != nil {
		return err
	} else if fo != nil {
		// fit.quantity, as in walk jobs, may name the curve instead of
		// measurement.quantity; given both, they must agree.
		fq := fo.has("quantity")
		if err := decodeFit(fo, &job.Fit, true); err != nil {
			return err
		}
		if fq {
			if mq && job.Fit.Quantity != m.Quantity {
				return fault.New("fit.quantity", "must agree with measurement.quantity (%q); got %q", m.Quantity, job.Fit.Quantity)
			}
			m.Quantity = job.Fit.Quantity
		}
	}
	return job.decodeTolMethod(o)
}

// runMeasurement reads, reduces and fits the measurement and, with
// compare, simulates the quantum walk from the input site at the measured
// lengths (converted with units when given) and compares the distributions.
func (j *Job) runMeasurement(ctx context.Context, log io.Writer) (*Response, error) {
	ms := j.Measurement
	g, kept, err := j.graph()
	if err != nil {
		return nil, err
	}
	n, nb := g.Len(), g.NumBonds()
	fmt.Fprintf(log, "ampwalk: job %q: measurement on a %s lattice with %d sites\n", j.ID, j.Lattice.Kind, n)
	m, err := measure.ReadCSV(strings.NewReader(ms.CSV), n)
	if err != nil {
		return nil, csvFault(err)
	}
	red, err := measure.Reduce(m, measure.Geometry{Coords: g.Coords(), Dim: g.Dim(), Start: ms.Start})
	if err != nil {
		var fe *fault.Error
		if errors.As(err, &fe) && fe.Field == "geometry.start" {
			return nil, fault.New("measurement.start", "must be a site index between 0 and %d; got %d", n-1, ms.Start)
		}
		return nil, within("measurement", err)
	}
	resp := &Response{ID: j.ID, Sites: &n, Bonds: &nb, Kept: kept}
	positive := 0
	for _, p := range red.Points {
		resp.Points = append(resp.Points, MeasuredPoint{Length: p.Length, MSD: p.MSD, MSDErr: p.MSDErr,
			Spread: p.Spread, SpreadErr: p.SpreadErr, IPR: p.IPR, IPRErr: p.IPRErr})
		if p.Length > 0 {
			positive++
		}
	}
	// The regime analysis needs 4 points per segment; shorter measurements
	// are reduced and compared only.
	if positive >= 4 {
		err := red.FitRegimes(ms.Quantity, observables.RegimeSettings{MaxSegments: j.Fit.Segments, From: j.Fit.From, To: j.Fit.To})
		if err != nil {
			return nil, fitError(err, false)
		}
		setRegimes(resp, red.Fit.Regimes, red.Fit.Crossovers)
		resp.LocalExponent, resp.FitTimes = red.Fit.LocalExponent, red.Fit.Times
	}
	f := 1.0 // engine time per length unit, as in runUnits
	if j.Units != nil {
		sc, err := j.Units.scale()
		if err != nil {
			return nil, err
		}
		f = engineFactor(sc.Unit)
		resp.TimeUnit = sc.Unit.TimeUnit()
		resp.DimensionlessTimes = make([]float64, len(red.Points))
		for k, p := range red.Points {
			resp.DimensionlessTimes[k] = sc.Time(p.Length)
		}
	}
	if !j.Compare {
		return resp, nil
	}
	c := *j
	c.Dynamics, c.Units = Quantum, nil
	c.Report = []string{"populations"}
	c.Times = make([]float64, len(red.Points))
	for k, p := range red.Points {
		c.Times[k] = f * p.Length
	}
	if err := c.checkTimes(); err != nil {
		return nil, within("measurement", err)
	}
	if err := c.checkSize(g); err != nil {
		return nil, err
	}
	sims := make([][]float64, len(c.Times))
	if c.Tolerance == 0 {
		c.Tolerance = 1e-10
	}
	d, err := c.evolve(ctx, g, ms.Start, c.Times, Settings{Method: c.Method, Tolerance: c.Tolerance},
		func(k int, p []float64) error {
			sims[k] = append([]float64(nil), p...)
			return nil
		})
	if err != nil {
		return nil, err
	}
	cmp, err := red.Compare(sims)
	if err != nil {
		return nil, &fault.Error{Kind: fault.Numerical, Field: "compare", Msg: "the simulated distributions cannot be compared: " + err.Error()}
	}
	resp.Comparison = make([]ComparisonPoint, len(cmp))
	for k, x := range cmp {
		resp.Comparison[k] = ComparisonPoint{Length: x.Length, Overlap: x.Overlap, Distance: x.Distance}
	}
	resp.Diagnostics = &JobDiagnostics{Method: d.Method, Reason: d.Reason, Products: d.Products,
		NormDrift: d.NormDrift, ErrorBound: d.ErrorBound}
	return resp, nil
}

// csvFault names every CSV error "measurement.csv"; the message keeps
// measure.ReadCSV's leading "line N:" and names the column after it when
// the rest is about that column's value ("line 4: site must be …").
func csvFault(err error) error {
	var fe *fault.Error
	if !errors.As(err, &fe) {
		return fault.New("measurement.csv", "cannot be read: %v", err)
	}
	c := *fe
	msg := c.Msg
	if col, ok := strings.CutPrefix(c.Field, "csv."); ok && col != "header" {
		if i := strings.Index(msg, ": "); strings.HasPrefix(msg, "line ") && i > 0 && strings.HasPrefix(msg[i+2:], "must ") {
			msg = msg[:i+2] + col + " " + msg[i+2:]
		}
	}
	c.Field, c.Msg = "measurement.csv", msg
	return &c
}
