package plan

import (
	"context"

	"github.com/ampwalk/ampwalk/walk"
)

// Importing this package makes the JSON bridge (walk.Serve, walk.Job.Run)
// answer plan jobs: package walk cannot import plan, which builds on it, so
// plan registers itself (as image decoders register with package image).
func init() { walk.RegisterPlanner(planJob) }

// planJob answers a plan job of the bridge with Make; the response's "plan"
// is the Plan encoded as WriteJSON writes it.
func planJob(ctx context.Context, in walk.PlanInput) (any, walk.Diagnostics, error) {
	pl, err := Make(ctx, Request{
		Positions: in.Positions, Dim: in.Dim, Law: in.Law, Cutoff: in.Cutoff, Detuning: in.Detuning,
		Start:     in.Start,
		MaxLength: in.Plan.MaxLength, MinLength: in.Plan.MinLength, Samples: in.Plan.Samples,
		Precision: in.Plan.Precision, Noise: in.Plan.Noise, Points: in.Plan.Points,
		Fabrication: in.Fabrication, Realisations: in.Realisations, Seed: in.Seed,
		Walk: in.Settings,
	})
	if err != nil {
		return nil, walk.Diagnostics{}, err
	}
	return pl, pl.Diagnostics, nil
}
