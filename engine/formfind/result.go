package formfind

import (
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/floats"

	"gusset/engine/fault"
	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// Result is a found form. Per-member slices are aligned with the model's
// members, per-node ones with its nodes.
type Result struct {
	// Dim is the model's dimension.
	Dim int
	// Case is the id of the load case or combination used ("" for none).
	Case string
	// Coords holds node i's found coordinates at Coords[i*Dim:(i+1)*Dim]
	// (length units); fixed nodes keep their given ones.
	Coords []float64
	// Fixed tells the nodes held by supports.
	Fixed []bool
	// ForceDensity is each member's force density in the found form, after
	// the through scaling and target iterations (force per length, tension
	// positive).
	ForceDensity []float64
	// Force is each member's axial force q·L (tension positive).
	Force []float64
	// Length is each member's length in the found form.
	Length []float64
	// Loads holds per node the applied load the form balances (Dim
	// entries): nodal loads plus self-weight and member loads lumped on
	// the geometry of the last iteration.
	Loads [][]float64
	// Reactions holds per node the force its supports exert on it (Dim
	// entries; zeros at free nodes).
	Reactions [][]float64
	// Residual is the largest equilibrium residual of a free node,
	// ‖pᵢ + Σ qₑ(xⱼ − xᵢ)‖ divided by ‖pᵢ‖ + Σ |qₑ|·Lₑ at that node.
	Residual float64
	// Sign is +1 when the matrix D of the found force densities is
	// positive definite (a tension network), −1 when negative definite (a
	// compression network).
	Sign float64
	// Scale is the factor s the through constraint applied to the given
	// force densities (1 without one); ThroughMisfit is the distance from
	// the node to the asked point that no scaling could remove.
	Scale         float64
	ThroughMisfit float64
	// Targets reports each target with the value achieved.
	Targets []TargetResult
	// Iterations is the number of linear solves of the iteration (1 for
	// the plain linear method); Change is the largest move of a free node
	// in the last one (length units): the change at exit of loads that
	// follow the form.
	Iterations int
	Change     float64
	// Converged is false when the iteration stopped at MaxIterations.
	Converged bool
	// Warnings locate what the form finding did not use or could not meet.
	Warnings []fault.Problem
	// FreeNodes and Nonzeros size the factorised matrix D.
	FreeNodes, Nonzeros int

	m      *model.Model
	family *family
}

// family is the one-parameter family of forms a through constraint
// chooses from when the loads do not follow the form: free node i's
// coordinate along axis k is h[k][f] + t·l[k][f] (f its free index) for
// force densities q/t.
type family struct {
	node int
	free []int
	h, l [][]float64
}

// TargetResult is one target with the value reached.
type TargetResult struct {
	Member   int
	Length   bool    // a length target; else a force target
	Target   float64 // asked
	Achieved float64 // reached
	Misfit   float64 // |Achieved − Target| / |Target|
}

func (f *finder) result(iterations int, change float64) *Result {
	m, d := f.m, f.m.Dim
	r := &Result{Dim: d, Case: f.load.caseID, Coords: f.coords, Fixed: make([]bool, m.NodeCount()),
		ForceDensity: slices.Clone(f.q), Force: make([]float64, len(m.Members)), Length: f.lengths,
		Sign: f.nw.sign, Scale: 1, Iterations: iterations, Change: change, Warnings: f.warnings,
		FreeNodes: len(f.nw.freeNodes), Nonzeros: f.nw.pattern.Nonzeros(), m: m}
	r.Converged = f.converged
	for i, fi := range f.nw.free {
		r.Fixed[i] = fi < 0
	}
	if f.through != nil {
		r.Scale = f.through.scale
		if r.Scale < 0 {
			r.Sign = -r.Sign
		}
		for e := range r.ForceDensity {
			r.ForceDensity[e] *= r.Scale
		}
		var s float64
		for k := 0; k < d; k++ {
			dx := f.coords[f.through.node*d+k] - f.through.at[k]
			s += dx * dx
		}
		r.ThroughMisfit = math.Sqrt(s)
		if r.ThroughMisfit > 1e-9*f.size {
			r.Warnings = append(r.Warnings, fault.Problem{Path: "/through/at",
				Message: fmt.Sprintf("no single scale of the force densities puts node %q on the point: it passes %.4g from it (the nearest by least squares); with vertical loads only its height can be met",
					f.m.NodeIDs[f.through.node], r.ThroughMisfit)})
		}
		if !f.load.follows {
			r.family = &family{node: f.through.node, free: f.nw.free, h: f.fixedRHS, l: f.rhs}
		}
	}
	for e := range r.Force {
		r.Force[e] = r.ForceDensity[e] * r.Length[e]
	}
	for _, t := range f.targets {
		a := f.achieved(t)
		r.Targets = append(r.Targets, TargetResult{Member: t.member, Length: t.length, Target: t.value, Achieved: a,
			Misfit: math.Abs(a-t.value) / math.Abs(t.value)})
	}
	r.balance(f.loads)
	return r
}

// balance fills Loads, Reactions and Residual: the sum of member forces
// and load at every node, which a support takes at a fixed node and which
// is the residual at a free one.
func (r *Result) balance(loads []float64) {
	m, d := r.m, r.Dim
	n := m.NodeCount()
	sum := slices.Clone(loads)
	scale := make([]float64, n)
	for i := 0; i < n; i++ {
		scale[i] = math.Sqrt(floats.Dot(loads[i*d:(i+1)*d], loads[i*d:(i+1)*d]))
	}
	for e, mem := range m.Members {
		a, b := mem.Ends[0]*d, mem.Ends[1]*d
		q := r.ForceDensity[e]
		for k := 0; k < d; k++ {
			pull := q * (r.Coords[b+k] - r.Coords[a+k])
			sum[a+k] += pull
			sum[b+k] -= pull
		}
		scale[mem.Ends[0]] += math.Abs(r.Force[e])
		scale[mem.Ends[1]] += math.Abs(r.Force[e])
	}
	r.Loads, r.Reactions = make([][]float64, n), make([][]float64, n)
	for i := 0; i < n; i++ {
		r.Loads[i] = slices.Clone(loads[i*d : (i+1)*d])
		r.Reactions[i] = make([]float64, d)
		s := sum[i*d : (i+1)*d]
		if r.Fixed[i] {
			for k := range s {
				r.Reactions[i][k] = -s[k]
			}
			continue
		}
		if scale[i] > 0 {
			r.Residual = max(r.Residual, math.Sqrt(floats.Dot(s, s))/scale[i])
		}
	}
}

// Model returns the model at the found coordinates: m with Coords replaced
// (the rest shared with the model Find was given, so it must not be
// modified). It serves pictures and load paths; Ready gives the model to
// send on.
func (r *Result) Model() *model.Model {
	found := *r.m
	found.Coords = r.Coords
	return &found
}

// LoadPath returns Maxwell's load-path quantities of the found form
// (engine/loadpath) with its forces, loads and reactions.
func (r *Result) LoadPath() (*loadpath.CaseResult, error) {
	external := make([][]float64, len(r.Loads))
	for i := range external {
		external[i] = make([]float64, r.Dim)
		for k := range external[i] {
			external[i][k] = r.Loads[i][k] + r.Reactions[i][k]
		}
	}
	lp, err := loadpath.Compute(r.Model(), []loadpath.Case{{ID: r.Case, AxialForce: r.Force, External: external}}, loadpath.Options{})
	if err != nil {
		return nil, err
	}
	return &lp.Cases[0], nil
}
