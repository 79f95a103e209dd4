package stiffness

import (
	"gusset/engine/model"
)

// Loads returns the right-hand side D·f of the scaled system for the load
// case or combination caseID of m (nodal loads, equivalent member loads and
// self-weight; prescribed displacements left out), so that the
// displacements of the equations are u = D·S⁻¹·(D·f). m must be the model
// mx was assembled from. It fails as Solve does for an unknown case.
//
// With K it hands the very system Solve factorises to another solver (the
// reference benchmark, cmd/refbench).
func (mx *Matrices) Loads(m *model.Model, caseID string) ([]float64, error) {
	requests, err := requested(m, []string{caseID})
	if err != nil {
		return nil, err
	}
	f := newLoadSet(m, mx.nb, requests[0].terms).rightHandSide(m, mx.nb)
	for i := range f {
		f[i] *= mx.Scale[i]
	}
	return f, nil
}
