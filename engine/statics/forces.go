package statics

import (
	"context"
	"fmt"
	"math"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// Equilibrium is the result of Forces.
type Equilibrium struct {
	// Axial holds the axial force of each member, tension positive.
	Axial []float64
	// Reactions holds, per support, the force (Dim entries) the support
	// exerts on its node; components the support leaves free are zero, and
	// a component fixed by several supports is carried by the first.
	Reactions [][]float64
	// Residual is ‖A·t − f‖ / ‖f‖ over the unconstrained freedoms (0 when
	// there is no load).
	Residual float64
}

// equilibriumTolerance is the scaled residual above which the loads are
// taken not to be in the range of the equilibrium matrix.
const equilibriumTolerance = 1e-8

// Forces returns the member forces of a statically determinate pin-jointed
// model under the nodal loads (Dim entries per node, global axes; loads on
// fixed components go straight to the supports), by least squares on the
// equilibrium matrix. It fails with InvalidModel when m has beams or states
// of self-stress (the forces then depend on the stiffnesses: use the
// stiffness method) or is larger than DefaultDenseLimit, and with
// NotInEquilibrium when a mechanism cannot carry the loads. It panics if
// len(loads) != m.Dim·m.NodeCount().
func Forces(ctx context.Context, m *model.Model, loads []float64) (*Equilibrium, error) {
	if len(loads) != m.Dim*m.NodeCount() {
		panic(fmt.Sprintf("statics: %d load entries for %d nodes in %dD", len(loads), m.NodeCount(), m.Dim))
	}
	rep, err := Analyse(ctx, m, Options{})
	if err != nil {
		return nil, err
	}
	switch {
	case model.NodeAxes(m) != nil:
		return nil, fault.New(fault.InvalidModel, "the model has inclined supports: their reactions need the stiffness method")
	case rep.Beams > 0:
		return nil, fault.New(fault.InvalidModel, "the model has beams: member forces need the stiffness method")
	case !rep.Computed:
		return nil, fault.New(fault.InvalidModel, "the model is too large for the dense equilibrium solution (%d freedoms, %d members)", rep.Freedoms, rep.Columns)
	case rep.SelfStress > 0:
		return nil, fault.New(fault.InvalidModel, "the model is statically indeterminate (%d states of self-stress): member forces need the stiffness method", rep.SelfStress)
	}
	l := rep.Layout
	out := &Equilibrium{Axial: make([]float64, len(m.Members)), Reactions: make([][]float64, len(m.Supports))}
	for i := range out.Reactions {
		out.Reactions[i] = make([]float64, m.Dim)
	}
	f := make([]float64, len(l.Rows))
	for i, fr := range l.Rows {
		f[i] = loads[fr.Node*m.Dim+fr.Component]
	}
	if err := out.solveAxial(m, rep, f); err != nil {
		return nil, err
	}
	if err := out.reactions(m, loads); err != nil {
		return nil, err
	}
	return out, nil
}

// solveAxial solves the equilibrium matrix for the bar forces with the
// loads f on the unconstrained freedoms (least squares by SVD at the
// report's rank) and fails when the residual shows a mechanism the loads
// excite.
func (out *Equilibrium) solveAxial(m *model.Model, rep *Report, f []float64) error {
	a := EquilibriumMatrix(m)
	if a == nil {
		return nil
	}
	var svd mat.SVD
	if !svd.Factorize(a, mat.SVDThin) {
		return fault.New(fault.NotInEquilibrium, "the singular value decomposition of the equilibrium matrix did not converge")
	}
	var t mat.VecDense
	svd.SolveVecTo(&t, mat.NewVecDense(len(f), f), rep.Rank)
	for i := range out.Axial {
		out.Axial[i] = t.AtVec(i)
	}
	var at mat.VecDense
	at.MulVec(a, &t)
	fNorm := floats.Norm(f, 2)
	if fNorm > 0 {
		diff := make([]float64, len(f))
		floats.SubTo(diff, at.RawVector().Data, f)
		out.Residual = floats.Norm(diff, 2) / fNorm
	}
	if out.Residual > equilibriumTolerance {
		return fault.New(fault.NotInEquilibrium,
			"the loads excite a mechanism: %d mechanism(s), scaled residual %.3g", rep.Mechanisms, out.Residual)
	}
	return nil
}

// reactions fills out.Reactions: a reaction balances, at its fixed
// component, the load there and the pull of the bars: R = Σ bar forces on
// the node's freedom − load, with the bar terms from the full
// (unconstrained) equilibrium rows.
func (out *Equilibrium) reactions(m *model.Model, loads []float64) error {
	owner := make(map[[2]int]int)
	for si := len(m.Supports) - 1; si >= 0; si-- {
		s := m.Supports[si]
		for c := range m.Dim {
			if s.Fixed[c] {
				owner[[2]int{s.Node, c}] = si
			}
		}
	}
	for e, mem := range m.Members {
		axes, _ := MemberAxes(m, e)
		for side, node := range mem.Ends {
			sign := -1.0
			if side == 1 {
				sign = 1
			}
			for c := range m.Dim {
				if si, ok := owner[[2]int{node, c}]; ok {
					out.Reactions[si][c] += sign * axes[0][c] * out.Axial[e]
				}
			}
		}
	}
	for key, si := range owner {
		out.Reactions[si][key[1]] -= loads[key[0]*m.Dim+key[1]]
	}
	for _, r := range out.Reactions {
		for _, v := range r {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return fault.New(fault.NotInEquilibrium, "non-finite reaction")
			}
		}
	}
	return nil
}
