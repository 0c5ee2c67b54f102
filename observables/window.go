package observables

import (
	"github.com/ampwalk/ampwalk/internal/fault"
)

// WindowAverage accumulates the finite-window time average
// (1/(t_last − t_first)) ∫ p(t) dt of distributions sampled at increasing
// times, by the trapezoidal rule on the samples given. With a single sample
// the average is that sample. The zero value is ready to use; the first Add
// fixes the length. Add allocates only on its first call.
//
// For the infinite-time average use LongTimeAverage, which is exact; a
// window average approaches it as the window grows (the oscillating terms
// decay like 1/(ΔE·T) for the smallest gap ΔE that matters).
type WindowAverage struct {
	sum, prev   []float64
	first, last float64
	count       int
}

// Add records the distribution p sampled at time t. Times must be finite and
// strictly increasing and every p the same length; otherwise Add returns an
// *InputError and records nothing.
func (w *WindowAverage) Add(t float64, p []float64) error {
	if !finite(t) {
		return fault.Range("time", "finite", t)
	}
	if w.count > 0 && t <= w.last {
		return fault.New("time", "must be greater than the previous time %v; got %v", w.last, t)
	}
	if w.count > 0 && len(p) != len(w.sum) {
		return fault.New("populations", "must have length %d like the first sample; got %d", len(w.sum), len(p))
	}
	for i, v := range p {
		if !finite(v) {
			return fault.New("populations", "populations[%d] must be finite; got %v", i, v)
		}
	}
	if w.count == 0 {
		w.sum = make([]float64, len(p))
		w.prev = make([]float64, len(p))
		copy(w.prev, p)
		w.first, w.last, w.count = t, t, 1
		return nil
	}
	h := (t - w.last) / 2
	for i, v := range p {
		w.sum[i] += h * (w.prev[i] + v)
	}
	copy(w.prev, p)
	w.last = t
	w.count++
	return nil
}

// Len returns the number of samples added.
func (w *WindowAverage) Len() int { return w.count }

// Window returns the first and last sample times.
func (w *WindowAverage) Window() (from, to float64) { return w.first, w.last }

// Mean sets dst to the window average and returns it (nil dst allocates; an
// empty accumulator returns dst unchanged, nil for nil).
func (w *WindowAverage) Mean(dst []float64) []float64 {
	if w.count == 0 {
		return dst
	}
	if dst == nil {
		dst = make([]float64, len(w.sum))
	}
	if len(dst) != len(w.sum) {
		panicf("WindowAverage.Mean: len(dst) = %d, want %d", len(dst), len(w.sum))
	}
	if w.count == 1 {
		copy(dst, w.prev)
		return dst
	}
	span := w.last - w.first
	for i, s := range w.sum {
		dst[i] = s / span
	}
	return dst
}
