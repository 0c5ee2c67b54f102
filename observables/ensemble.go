package observables

import (
	"math"
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// MeanErr accumulates scalars and returns their mean and the standard error
// of the mean, by Welford's update (Welford, Technometrics 4, 419 (1962)).
// The result depends on the order of Add calls in the last bits: add in
// realisation order (or use Ensemble, which enforces it). The zero value is
// ready to use.
type MeanErr struct {
	n        int
	mean, m2 float64
}

// Add records one value.
func (m *MeanErr) Add(x float64) {
	m.n++
	d := x - m.mean
	m.mean += d / float64(m.n)
	m.m2 += d * (x - m.mean)
}

// N returns the number of values added.
func (m *MeanErr) N() int { return m.n }

// Mean returns the mean (0 when empty).
func (m *MeanErr) Mean() float64 { return m.mean }

// StdErr returns the standard error of the mean, s/√n with s² the unbiased
// sample variance; 0 for fewer than two values (undefined, reported as 0
// rather than NaN).
func (m *MeanErr) StdErr() float64 {
	if m.n < 2 {
		return 0
	}
	return math.Sqrt(math.Max(m.m2, 0) / float64(m.n-1) / float64(m.n))
}

// Ensemble accumulates per-realisation vectors (a scalar is a vector of
// length one) and returns their element-wise mean and standard error of the
// mean. Realisations are numbered 0, 1, 2, … and folded in that order
// whatever order they arrive in: results that arrive early wait (a copy is
// kept) until their predecessors have been added, so a parallel run gives
// the same bits as a serial one. Memory is the vector length times (2 + the
// number of realisations waiting). An Ensemble is not safe for concurrent
// use; guard it with a mutex or feed it from one goroutine.
type Ensemble struct {
	size    int
	next    int
	mean    []float64
	m2      []float64
	pending map[int][]float64
}

// NewEnsemble returns an Ensemble for vectors of the given length (≥ 1).
func NewEnsemble(size int) *Ensemble {
	if size < 1 {
		panicf("NewEnsemble: size = %d, must be at least 1", size)
	}
	return &Ensemble{size: size, mean: make([]float64, size), m2: make([]float64, size),
		pending: map[int][]float64{}}
}

// Add records the result x of realisation k. x is copied when it has to
// wait. It returns an *InputError when k is negative or was already added,
// when x has the wrong length or holds a NaN or Inf.
func (e *Ensemble) Add(k int, x []float64) error {
	field := "realisations[" + strconv.Itoa(k) + "]"
	if k < 0 {
		return fault.Range("realisation", "a non-negative index", k)
	}
	if _, dup := e.pending[k]; dup || k < e.next {
		return fault.New(field, "was already added")
	}
	if len(x) != e.size {
		return fault.New(field, "must have length %d; got %d", e.size, len(x))
	}
	for i, v := range x {
		if !finite(v) {
			return fault.New(field, "entry %d must be finite; got %v", i, v)
		}
	}
	if k != e.next {
		e.pending[k] = append([]float64(nil), x...)
		return nil
	}
	e.fold(x)
	for {
		y, ok := e.pending[e.next]
		if !ok {
			return nil
		}
		delete(e.pending, e.next)
		e.fold(y)
	}
}

func (e *Ensemble) fold(x []float64) {
	e.next++
	inv := 1 / float64(e.next)
	for i, v := range x {
		d := v - e.mean[i]
		e.mean[i] += d * inv
		e.m2[i] += d * (v - e.mean[i])
	}
}

// Count returns the number of realisations folded in (0…Count−1 all
// present); Waiting the number held back for a missing predecessor.
func (e *Ensemble) Count() int   { return e.next }
func (e *Ensemble) Waiting() int { return len(e.pending) }

// Mean sets dst to the element-wise mean over the folded realisations and
// returns it (nil allocates).
func (e *Ensemble) Mean(dst []float64) []float64 {
	dst = e.dst(dst)
	copy(dst, e.mean)
	return dst
}

// StdErr sets dst to the element-wise standard error of the mean and returns
// it (nil allocates); zeros with fewer than two realisations.
func (e *Ensemble) StdErr(dst []float64) []float64 {
	dst = e.dst(dst)
	if e.next < 2 {
		for i := range dst {
			dst[i] = 0
		}
		return dst
	}
	f := 1 / (float64(e.next-1) * float64(e.next))
	for i, m2 := range e.m2 {
		dst[i] = math.Sqrt(math.Max(m2, 0) * f)
	}
	return dst
}

func (e *Ensemble) dst(dst []float64) []float64 {
	if dst == nil {
		return make([]float64, e.size)
	}
	if len(dst) != e.size {
		panicf("Ensemble: len(dst) = %d, want %d", len(dst), e.size)
	}
	return dst
}

// RegimeAverage is the mean of regime fits over realisations.
type RegimeAverage struct {
	// Regimes and Crossovers averaged over the fits that chose Segments
	// segments (the most common choice; the smaller on a tie). Each regime's
	// Exponent is the mean and Error the standard error from the spread
	// over those fits; From, To and Prefactor are geometric means. Each
	// crossover's Time is the geometric mean and [Low, High] the 95%
	// interval exp(mean ln t ± 1.96·SEM of ln t).
	Regimes    []Regime
	Crossovers []Crossover
	Segments   int
	// Used counts the fits averaged, Total all fits given.
	Used, Total int
}

// AverageRegimes averages fitted regimes across realisations (fits in
// realisation order; nil entries are skipped). Fits that chose a different
// number of segments from the most common one are left out, since their
// regimes do not correspond. With a single fit used, the errors and
// intervals are that fit's own. It returns an *InputError when no fit is
// given.
func AverageRegimes(fits []*RegimeFit) (*RegimeAverage, error) {
	counts := map[int]int{}
	total := 0
	for _, f := range fits {
		if f != nil && len(f.Regimes) > 0 {
			counts[len(f.Regimes)]++
			total++
		}
	}
	if total == 0 {
		return nil, fault.New("fits", "must hold at least one fit; got none")
	}
	best, bestN := 0, 0
	for m, c := range counts {
		if c > bestN || (c == bestN && m < best) {
			best, bestN = m, c
		}
	}
	avg := &RegimeAverage{Segments: best, Used: bestN, Total: total,
		Regimes: make([]Regime, best), Crossovers: make([]Crossover, best-1)}
	alpha := make([]MeanErr, best)
	from := make([]MeanErr, best)
	to := make([]MeanErr, best)
	pre := make([]MeanErr, best)
	cross := make([]MeanErr, best-1)
	var single *RegimeFit
	for _, f := range fits {
		if f == nil || len(f.Regimes) != best {
			continue
		}
		single = f
		for s, r := range f.Regimes {
			alpha[s].Add(r.Exponent)
			from[s].Add(math.Log(r.From))
			to[s].Add(math.Log(r.To))
			pre[s].Add(math.Log(r.Prefactor))
		}
		for j, c := range f.Crossovers {
			cross[j].Add(math.Log(c.Time))
		}
	}
	for s := range avg.Regimes {
		a := alpha[s].Mean()
		avg.Regimes[s] = Regime{From: math.Exp(from[s].Mean()), To: math.Exp(to[s].Mean()),
			Exponent: a, Error: alpha[s].StdErr(), Prefactor: math.Exp(pre[s].Mean()), Kind: Classify(a)}
	}
	for j := range avg.Crossovers {
		m, se := cross[j].Mean(), cross[j].StdErr()
		avg.Crossovers[j] = Crossover{Time: math.Exp(m), Low: math.Exp(m - 1.96*se), High: math.Exp(m + 1.96*se)}
	}
	if bestN == 1 {
		avg.Regimes = append(avg.Regimes[:0], single.Regimes...)
		avg.Crossovers = append(avg.Crossovers[:0], single.Crossovers...)
	}
	return avg, nil
}
