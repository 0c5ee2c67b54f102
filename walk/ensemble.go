package walk

import (
	"context"
	"fmt"
	"math"
	"sync"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/observables"
)

// Ensemble runs fn for the realisations r = 0 … n−1 on at most workers
// goroutines (workers ≤ 0: GOMAXPROCS) and returns the n results in
// realisation order, so that anything combined from them in that order does
// not depend on scheduling. fn receives a context that is cancelled as soon
// as any realisation fails; the error returned is that of the lowest
// failing realisation index (or ctx's error when ctx ends first). A panic
// in fn is recovered and returned as a Numerical *InputError.
//
// Ensemble is the runner behind the "disorder" extension: realisation r
// draws its disorder from its own seeded stream, so any single realisation
// can be recomputed alone.
func Ensemble[R any](ctx context.Context, n, workers int, fn func(ctx context.Context, r int) (R, error)) ([]R, error) {
	out := make([]R, n)
	if n <= 0 {
		return out, nil
	}
	errs := make([]error, n)
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	w := min(workersFor(workers), n)
	next := make(chan int)
	var wg sync.WaitGroup
	for range w {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for r := range next {
				res, err := safeCall(ctx, r, fn)
				if err != nil {
					errs[r] = err
					cancel()
					continue
				}
				out[r] = res
			}
		}()
	}
feed:
	for r := 0; r < n; r++ {
		select {
		case next <- r:
		case <-ctx.Done():
			break feed
		}
	}
	close(next)
	wg.Wait()
	for _, err := range errs {
		if err != nil && ctx.Err() != nil && isCancel(err) {
			continue // a consequence of another failure; report that one
		}
		if err != nil {
			return nil, err
		}
	}
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	if err := ctx.Err(); err != nil {
		// ctx (not a failure) stopped the feed early.
		return nil, err
	}
	return out, nil
}

// safeCall runs fn and turns a panic into a Numerical error, so that a
// failing realisation cannot crash the process that serves jobs.
func safeCall[R any](ctx context.Context, r int, fn func(ctx context.Context, r int) (R, error)) (res R, err error) {
	defer func() {
		if p := recover(); p != nil {
			err = &fault.Error{Kind: fault.Numerical, Msg: fmt.Sprintf("internal failure in realisation %d: %v", r, p)}
		}
	}()
	return fn(ctx, r)
}

// MeanErr returns the element-wise mean over samples and the standard
// error of that mean (zero for one sample), folding the samples in order
// with observables.Ensemble, so the result does not depend on how the
// samples were computed. Every sample must have the same length ≥ 1. A
// non-finite value makes every entry of both results NaN (callers that
// report them check for that; the job format never prints NaN).
func MeanErr(samples [][]float64) (mean, stderr []float64) {
	if len(samples) == 0 {
		return nil, nil
	}
	e := observables.NewEnsemble(len(samples[0]))
	for r, s := range samples {
		if len(s) != len(samples[0]) {
			panic("walk: MeanErr samples of different lengths")
		}
		if err := e.Add(r, s); err != nil {
			mean, stderr = make([]float64, len(s)), make([]float64, len(s))
			for i := range mean {
				mean[i], stderr[i] = math.NaN(), math.NaN()
			}
			return mean, stderr
		}
	}
	return e.Mean(nil), e.StdErr(nil)
}
