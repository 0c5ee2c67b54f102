package observables

import (
	"fmt"
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// InputError is the error returned for input outside its accepted range. It
// names the field, the accepted range and the value received.
type InputError = fault.Error

func panicf(format string, args ...any) {
	panic(fmt.Sprintf("observables: "+format, args...))
}

// finite reports whether x is neither NaN nor ±Inf.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// checkSeries validates a time series: times strictly increasing, positive
// and finite; values positive and finite; errors (optional) positive and
// finite; all of the same length.
func checkSeries(times, values, errors []float64) error {
	if len(times) == 0 {
		return fault.New("times", "must hold at least one time; got none")
	}
	if len(values) != len(times) {
		return fault.New("values", "must have the same length as times (%d); got %d", len(times), len(values))
	}
	if len(errors) != 0 && len(errors) != len(times) {
		return fault.New("errors", "must be empty or have the same length as times (%d); got %d", len(times), len(errors))
	}
	for i, t := range times {
		if !finite(t) || t <= 0 {
			return fault.New("times", "times[%d] must be positive and finite; got %v", i, t)
		}
		if i > 0 && t <= times[i-1] {
			return fault.New("times", "times[%d] must be greater than times[%d] = %v (strictly increasing); got %v", i, i-1, times[i-1], t)
		}
	}
	for i, v := range values {
		if !finite(v) || v <= 0 {
			return fault.New("values", "values[%d] must be positive and finite; got %v", i, v)
		}
	}
	for i, e := range errors {
		if !finite(e) || e <= 0 {
			return fault.New("errors", "errors[%d] must be positive and finite; got %v", i, e)
		}
	}
	return nil
}
