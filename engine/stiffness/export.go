package stiffness

import (
	"context"

	"gusset/engine/model"
	"gusset/engine/progress"
	"gusset/engine/sparse"
)

// ScaledSystem assembles the stiffness equations of m's unconstrained
// freedoms exactly as Solve factorises them: the lower triangle of
// S = D^(-1/2)·K·D^(-1/2) (D the diagonal of K, so S has a unit diagonal)
// and the right-hand side g = D^(-1/2)·f of the load case or combination
// caseID (nodal loads, equivalent member loads and self-weight; prescribed
// displacements left out). The displacements of the equations are
// u = D^(-1/2)·S⁻¹·g.
//
// It exists so that a benchmark can hand the very matrices the engine
// solves to a reference library; it fails as Solve does for an unknown
// case or an invalid model.
func ScaledSystem(ctx context.Context, m *model.Model, caseID string) (s *sparse.Matrix, g []float64, err error) {
	requests, err := requested(m, []string{caseID})
	if err != nil {
		return nil, nil, err
	}
	nb := newNumbering(m)
	if err := validate(m, nb); err != nil {
		return nil, nil, err
	}
	sys, err := assemble(ctx, m, nb, newPattern(m, nb), 0, progress.Or(nil))
	if err != nil {
		return nil, nil, err
	}
	f := newLoadSet(m, nb, requests[0].terms).rightHandSide(m, nb)
	for i := range f {
		f[i] *= sys.scale[i]
	}
	return sys.k, f, nil
}
