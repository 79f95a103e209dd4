package adapter

import (
	"gusset/engine/model"
	"gusset/engine/stiffness"
	"gusset/protocol"
)

// secondOrderOption maps the wire's second_order object to the solver's
// option (nil stays nil: a first-order analysis).
func secondOrderOption(so *protocol.SecondOrder) *stiffness.SecondOrder {
	if so == nil {
		return nil
	}
	return &stiffness.SecondOrder{Tolerance: so.Tolerance, MaxIterations: so.MaxIterations}
}

// iterationWire converts a case's iteration report (nil for a case
// solved by superposition) to the wire, naming the slack members by id.
func iterationWire(m *model.Model, it *stiffness.Iteration) *protocol.CaseIteration {
	if it == nil {
		return nil
	}
	out := &protocol.CaseIteration{Iterations: it.Iterations, Factorisations: it.Factorisations, LowRankSolves: it.LowRankSolves, SlackMembers: []string{}}
	for _, e := range it.Slack {
		out.SlackMembers = append(out.SlackMembers, m.Members[e].ID)
	}
	if it.SecondOrder && it.HasAmplification {
		a := it.Amplification
		out.Amplification = &a
	}
	if it.SecondOrder && it.CriticalFactor > 0 {
		c := it.CriticalFactor
		out.CriticalFactorBound = &c
	}
	return out
}
