package stiffness

import (
	"context"
	"fmt"
	"math"

	"gusset/engine/model"
	"gusset/engine/statics"
)

// heldTolerance is the largest force a held freedom may take, relative to
// the loads, member forces and reactions of the case, for the loads to
// count as carried without the mechanism moving.
const heldTolerance = 1e-8

// solveHeld analyses a model that is a mechanism under loads that may not
// set the mechanism moving, as optimal layouts, funicular forms and frames
// braced only for their own loads often are. It holds the freedoms whose
// pivots vanished (supports added in a copy of the model) and solves. When
// every requested case leaves those held freedoms without force, the loads
// are orthogonal to every mechanism mode: they are carried by the members
// alone, and the result stands, with a warning. (The held freedoms are the
// pivots' columns, on which the mechanism modes are independent, so a
// solution with them at rest exists exactly when the loads are in the range
// of the equilibrium matrix.) Otherwise ok is false and the caller reports
// the mechanism.
func solveHeld(ctx context.Context, m *model.Model, nb *numbering, equations []int, opt Options, stability *statics.Report, warnings []string) (*Result, bool) {
	held := *m
	held.Supports = append([]model.Support(nil), m.Supports...)
	var names []string
	for _, eq := range equations {
		f := nb.freedomOf[eq]
		s := model.Support{Node: nb.node[f]}
		s.Fixed[nb.component[f]] = true
		held.Supports = append(held.Supports, s)
		names = append(names, fmt.Sprintf("node %q %s", m.NodeIDs[nb.node[f]], model.ComponentNames[nb.component[f]]))
	}
	opt.StabilityLimit = -1
	opt.Fold = nil // the held cases are rescaled below, whole
	r, err := Solve(ctx, &held, opt)
	if err != nil {
		return nil, false
	}
	extra := len(m.Supports)
	for i := range r.Cases {
		c := &r.Cases[i]
		scale := 0.0
		for _, v := range c.LoadSum {
			scale = math.Max(scale, math.Abs(v))
		}
		for _, n := range c.AxialForce {
			scale = math.Max(scale, math.Abs(n))
		}
		for _, re := range c.Reactions[:extra] {
			for _, v := range re.Force {
				scale = math.Max(scale, math.Abs(v))
			}
		}
		for _, re := range c.Reactions[extra:] {
			for _, v := range append(append([]float64(nil), re.Force...), re.Moment...) {
				if math.Abs(v) > heldTolerance*scale {
					return nil, false
				}
			}
		}
		// The held reactions are round-off: drop them, and take their
		// share out of the external forces and the reaction sum.
		for k, re := range c.Reactions[extra:] {
			node := held.Supports[extra+k].Node
			for d, v := range re.Force {
				c.External[node][d] -= v
				c.ReactionSum[d] -= v
			}
		}
		c.Reactions = c.Reactions[:extra]
	}
	r.Stability = stability
	r.Warnings = append(warnings, fmt.Sprintf(
		"the structure is a mechanism (%s can move without straining any member), but these loads do not set it moving: the members carry them alone, so it is stable for these loads only and any other load will move it; displacements along the mechanism are not determined and are reported with it at rest",
		joinNames(names)))
	return r, true
}

func joinNames(names []string) string {
	if len(names) > 6 {
		return fmt.Sprintf("%s and %d more freedoms", joinNames(names[:6]), len(names)-6)
	}
	out := ""
	for i, n := range names {
		if i > 0 {
			out += ", "
		}
		out += n
	}
	return out
}
