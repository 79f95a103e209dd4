package modes

import (
	"context"

	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// analysisFor returns the stiffness analysis of m's topology for the
// static solve options sopt: opt.Analysis's, shared, when given, otherwise
// a new one.
func analysisFor(m *model.Model, opt Options, sopt stiffness.Options) *stiffness.Analysis {
	if opt.Analysis != nil {
		return opt.Analysis.With(sopt)
	}
	return stiffness.NewAnalysis(m, sopt)
}

// assembleFor returns the scaled stiffness matrices of m for an
// eigenvalue analysis alone, reusing opt.Analysis's order when given.
func assembleFor(ctx context.Context, m *model.Model, opt Options) (*stiffness.Matrices, error) {
	sopt := stiffness.Options{Workers: opt.Workers, Reporter: opt.Reporter}
	if opt.Analysis != nil {
		return opt.Analysis.With(sopt).Matrices(ctx, m)
	}
	return stiffness.Assemble(ctx, m, sopt)
}
