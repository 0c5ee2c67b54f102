package observables

import (
	"math"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// polyaSlack is the round-off allowance for return probabilities: values in
// [−polyaSlack, 0) and (1, 1+polyaSlack] are clamped to 0 and 1; a
// propagated p0 can overshoot 1 by a few ulps at short times.
const polyaSlack = 1e-9

// Polya returns the Pólya number P = 1 − Π_k (1 − p0(t_k)) for the return
// probabilities returns[k] = p0(t_k) measured at a sequence of times t_k:
// the probability that at least one of these measurements finds the walker
// back at its start, when each measurement that fails to find it does not
// otherwise disturb the walk's statistics. Štefaňák, Jex, Kiss, PRL 100,
// 020501 (2008); the continuous-time version is Darázs & Kiss, PRA 81,
// 062319 (2010).
//
// P depends on the sampling schedule, not only on the walk: adding
// measurement times can only increase it, and a denser schedule at short
// times (where p0 is close to 1) drives it towards 1. Compare Pólya numbers
// only for the same schedule (the reference values in the tests use
// t_k = k, k = 1…K). Pass only times t_k > 0: at t = 0, p0 = 1 and P = 1
// trivially.
//
// The product is computed stably as P = −expm1(Σ_k log1p(−p_k)), which keeps
// full relative precision when every p_k is tiny. Values outside [0, 1]
// (beyond a round-off allowance of 1e-9, which is clamped) or NaN return an
// *InputError naming the first offending index; an empty slice gives 0.
func Polya(returns []float64) (float64, error) {
	var s float64
	for k, p := range returns {
		if math.IsNaN(p) || p < -polyaSlack || p > 1+polyaSlack {
			return 0, fault.New("returns", "returns[%d] must be a probability in [0, 1]; got %v", k, p)
		}
		p = math.Min(math.Max(p, 0), 1)
		s += math.Log1p(-p)
	}
	return -math.Expm1(s), nil
}
