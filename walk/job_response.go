package walk

import (
	"context"
	"encoding/json"
	"errors"
	"math"
	"strings"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Response is the answer to one Job, encoded as one JSON line. Absent
// outputs are omitted; the field names are the job format's.
type Response struct {
	ID           string `json:"id"`
	Sites        *int   `json:"sites,omitzero"`
	Bonds        *int   `json:"bonds,omitzero"`
	Kept         []int  `json:"kept,omitzero"`
	Realisations int    `json:"realisations,omitzero"`

	Times            []float64   `json:"times,omitzero"`
	MSD              []float64   `json:"msd,omitzero"`
	MSDErr           []float64   `json:"msd_err,omitzero"`
	Return           []float64   `json:"return,omitzero"`
	ReturnErr        []float64   `json:"return_err,omitzero"`
	Populations      [][]float64 `json:"populations,omitzero"`
	PopulationsErr   [][]float64 `json:"populations_err,omitzero"`
	Spread           []float64   `json:"spread,omitzero"`
	SpreadErr        []float64   `json:"spread_err,omitzero"`
	IPR              []float64   `json:"ipr,omitzero"`
	IPRErr           []float64   `json:"ipr_err,omitzero"`
	Entropy          []float64   `json:"entropy,omitzero"`
	EntropyErr       []float64   `json:"entropy_err,omitzero"`
	Participation    []float64   `json:"participation,omitzero"`
	ParticipationErr []float64   `json:"participation_err,omitzero"`
	Polya            *float64    `json:"polya,omitzero"`
	PolyaErr         *float64    `json:"polya_err,omitzero"`

	Regimes       []Regime    `json:"regimes,omitzero"`
	Crossovers    []Crossover `json:"crossovers,omitzero"`
	LocalExponent []float64   `json:"local_exponent,omitzero"`
	// LocalExponentErr is the standard error of the local exponent over
	// disorder realisations; FitTimes are the times of LocalExponent.
	LocalExponentErr []float64 `json:"local_exponent_err,omitzero"`
	FitTimes         []float64 `json:"fit_times,omitzero"`

	Average    *Average `json:"average,omitzero"`
	AverageErr *Average `json:"average_err,omitzero"`

	Correlations    [][][]float64 `json:"correlations,omitzero"`
	CorrelationsErr [][][]float64 `json:"correlations_err,omitzero"`

	Eigenvalues  []float64     `json:"eigenvalues,omitzero"`
	DOS          *DOSResult    `json:"dos,omitzero"`
	Ratio        *RatioResult  `json:"ratio,omitzero"`
	BoxDimension *BoxDimResult `json:"box_dimension,omitzero"`
	// Spectrum-job extensions (job_spectrum_ext.go).
	SpectrumExtResult

	// Lab-workflow outputs (job_lab*.go): with "units", TimeUnit names the
	// unit of Times (and of regimes, crossovers, fit_times) and
	// DimensionlessTimes gives C_ref·z; Points and Comparison answer a
	// measurement job, Plan a plan job.
	TimeUnit           string            `json:"time_unit,omitzero"`
	DimensionlessTimes []float64         `json:"dimensionless_times,omitzero"`
	Points             []MeasuredPoint   `json:"points,omitzero"`
	Comparison         []ComparisonPoint `json:"comparison,omitzero"`
	Plan               json.RawMessage   `json:"plan,omitzero"`

	Diagnostics *JobDiagnostics `json:"diagnostics,omitzero"`

	Error *ErrorBody `json:"error,omitzero"`
}

// Regime is one segment of the regime analysis: y ∝ t^Exponent on
// [From, To], Error the one-sigma uncertainty of the exponent, Kind its label.
type Regime struct {
	From     float64 `json:"from"`
	To       float64 `json:"to"`
	Exponent float64 `json:"exponent"`
	Error    float64 `json:"error"`
	Kind     string  `json:"kind"`
	// Prefactor A of y ≈ A·t^Exponent (an extension).
	Prefactor float64 `json:"prefactor"`
}

// Crossover is the time between two consecutive regimes with its 95%
// interval [Low, High].
type Crossover struct {
	Time float64 `json:"time"`
	Low  float64 `json:"low"`
	High float64 `json:"high"`
}

// Average is the "average" output: the infinite-time (or windowed) mean of
// the return probability and, when populations are reported, of every p_j.
type Average struct {
	Return      float64   `json:"return"`
	Populations []float64 `json:"populations,omitzero"`
	// Window and Samples are set for a windowed average.
	Window  float64 `json:"window,omitzero"`
	Samples int     `json:"samples,omitzero"`
}

// DOSResult is the density of states per site on bin centres.
type DOSResult struct {
	Energy  []float64 `json:"energy"`
	Density []float64 `json:"density"`
	Method  string    `json:"method"`
}

// RatioResult is the mean ratio of consecutive level spacings.
type RatioResult struct {
	Mean       float64 `json:"mean"`
	Used       int     `json:"used"`
	Degenerate int     `json:"degenerate"`
}

// BoxDimResult is the box-counting dimension of the site positions.
type BoxDimResult struct {
	Dimension float64 `json:"dimension"`
	Error     float64 `json:"error"`
	Smallest  float64 `json:"smallest"`
	Largest   float64 `json:"largest"`
}

// JobDiagnostics is the "diagnostics" output. Over disorder realisations,
// Products and Seconds are totals and NormDrift and ErrorBound maxima.
type JobDiagnostics struct {
	Method     string  `json:"method"`
	Products   int     `json:"products"`
	NormDrift  float64 `json:"norm_drift"`
	ErrorBound float64 `json:"error_bound"`
	Seconds    float64 `json:"seconds"`
	Reason     string  `json:"reason,omitzero"`
}

// ErrorBody is the "error" object of a failed request.
type ErrorBody struct {
	Code    string `json:"code"`
	Field   string `json:"field,omitzero"`
	Message string `json:"message"`
}

// ErrorCode returns the job-format error code of err: "invalid",
// "unknown-field", "too-large", "malformed", "numerical" or "cancelled".
func ErrorCode(err error) string {
	var de *decodeError
	var fe *fault.Error
	switch {
	case errors.As(err, &de):
		return de.code
	case errors.Is(err, context.Canceled), errors.Is(err, context.DeadlineExceeded):
		return "cancelled"
	case errors.As(err, &fe):
		return fe.Kind.String()
	}
	return "numerical"
}

// errorBody converts err to the error object of the job format.
func errorBody(err error) *ErrorBody {
	var de *decodeError
	var fe *fault.Error
	b := &ErrorBody{Code: ErrorCode(err), Message: err.Error()}
	switch {
	case errors.As(err, &de):
		b.Field, b.Message = de.field, de.msg
	case errors.As(err, &fe):
		b.Field, b.Message = fe.Field, fe.Msg
	case b.Code == "cancelled":
		b.Message = "the job was cancelled before it finished"
	}
	if b.Field != "" && b.Message != "" {
		b.Message = b.Field + " " + b.Message
	}
	return b
}

func asFault(err error, dst **fault.Error) bool { return errors.As(err, dst) }

// within names err's field inside the request object prefix: an empty field
// becomes prefix, a field already under prefix or naming a top-level request
// field stays as it is, anything else becomes prefix + "." + field.
func within(prefix string, err error) error {
	var fe *fault.Error
	if err == nil || !errors.As(err, &fe) {
		return err
	}
	f := fe.Field
	if f == prefix || strings.HasPrefix(f, prefix+".") || strings.HasPrefix(f, prefix+"[") {
		return fe
	}
	for _, k := range topLevel {
		if f == k || strings.HasPrefix(f, k+".") || strings.HasPrefix(f, k+"[") {
			return fe
		}
	}
	return fault.Prefix(prefix, fe)
}

// finite reports whether every number in the response is finite (JSON has
// no NaN); it returns the name of the first offending output.
func (r *Response) finite() string {
	lists := []struct {
		name string
		v    []float64
	}{{"msd", r.MSD}, {"msd_err", r.MSDErr}, {"return", r.Return}, {"return_err", r.ReturnErr},
		{"spread", r.Spread}, {"spread_err", r.SpreadErr}, {"ipr", r.IPR}, {"ipr_err", r.IPRErr},
		{"entropy", r.Entropy}, {"entropy_err", r.EntropyErr}, {"participation", r.Participation},
		{"participation_err", r.ParticipationErr}, {"local_exponent", r.LocalExponent},
		{"local_exponent_err", r.LocalExponentErr}, {"fit_times", r.FitTimes},
		{"eigenvalues", r.Eigenvalues}}
	for _, l := range lists {
		if !allFinite(l.v) {
			return l.name
		}
	}
	for _, p := range [][][]float64{r.Populations, r.PopulationsErr} {
		for _, row := range p {
			if !allFinite(row) {
				return "populations"
			}
		}
	}
	for _, c := range [][][][]float64{r.Correlations, r.CorrelationsErr} {
		for _, m := range c {
			for _, row := range m {
				if !allFinite(row) {
					return "correlations"
				}
			}
		}
	}
	for _, p := range []*float64{r.Polya, r.PolyaErr} {
		if p != nil && !allFinite([]float64{*p}) {
			return "polya"
		}
	}
	for _, a := range []*Average{r.Average, r.AverageErr} {
		if a != nil && (!allFinite([]float64{a.Return}) || !allFinite(a.Populations)) {
			return "average"
		}
	}
	for _, g := range r.Regimes {
		if !allFinite([]float64{g.From, g.To, g.Exponent, g.Error, g.Prefactor}) {
			return "regimes"
		}
	}
	for _, c := range r.Crossovers {
		if !allFinite([]float64{c.Time, c.Low, c.High}) {
			return "crossovers"
		}
	}
	if d := r.DOS; d != nil && (!allFinite(d.Energy) || !allFinite(d.Density)) {
		return "dos"
	}
	if q := r.Ratio; q != nil && !allFinite([]float64{q.Mean}) {
		return "ratio"
	}
	if b := r.BoxDimension; b != nil && !allFinite([]float64{b.Dimension, b.Error, b.Smallest, b.Largest}) {
		return "box_dimension"
	}
	if d := r.Diagnostics; d != nil && !allFinite([]float64{d.NormDrift, d.ErrorBound, d.Seconds}) {
		return "diagnostics"
	}
	return r.finiteLab()
}

func allFinite(v []float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}
