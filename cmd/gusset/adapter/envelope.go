package adapter

import (
	"fmt"

	"gusset/engine/envelope"
	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/stiffness"
	"gusset/protocol"
)

// envelopePlan is what solve does for params.envelope: the cases to
// solve and, among them, the ids to envelope, folded into env as each case
// is recovered.
type envelopePlan struct {
	solve     []string // for stiffness.Options.Cases; nil means all
	enveloped []string // nil when no envelope is asked for
	reported  int      // the cases the result reports, first in the solve order; −1 means all
	omit      bool     // params.envelope.omit_cases
	position  []int    // per solved case, its index in enveloped or −1
	added     []bool   // per enveloped case, folded in
	env       *envelope.Envelope
}

// planEnvelope resolves params.envelope against m: the ids it names (a
// pattern's id stands for its generated combinations; unknown ids are
// errors at /params/envelope/cases/k), by default every reported case;
// ids the result does not report are solved after the reported ones.
func planEnvelope(m *model.Model, p *protocol.SolveParams) (*envelopePlan, error) {
	plan := &envelopePlan{solve: p.Cases, reported: -1}
	if p.Cases != nil {
		plan.reported = len(p.Cases)
	}
	if p.Envelope == nil {
		return plan, nil
	}
	reported := p.Cases
	if reported == nil {
		reported = allCaseIDs(m)
	}
	plan.enveloped, plan.omit = reported, p.Envelope.OmitCases
	if p.Envelope.Cases != nil {
		var err error
		if plan.enveloped, err = expandEnvelopeIDs(m, p.Envelope.Cases); err != nil {
			return nil, err
		}
	}
	if len(plan.enveloped) == 0 {
		return nil, protocol.NewError(protocol.CodeInvalidParams, "invalid params", "The envelope needs at least one load case or combination; name some in envelope.cases or cases.",
			protocol.Problem{Path: "/params/envelope", Message: "no case to envelope"})
	}
	if p.Cases != nil {
		solved := map[string]bool{}
		for _, id := range p.Cases {
			solved[id] = true
		}
		plan.solve = append([]string(nil), p.Cases...)
		for _, id := range plan.enveloped {
			if !solved[id] {
				solved[id] = true
				plan.solve = append(plan.solve, id)
			}
		}
	}
	plan.index(m)
	return plan, nil
}

// index relates the solved cases to the enveloped ones and makes the
// empty envelope.
func (plan *envelopePlan) index(m *model.Model) {
	order := plan.solve
	if order == nil {
		order = allCaseIDs(m)
	}
	at := make(map[string]int, len(plan.enveloped))
	for k, id := range plan.enveloped {
		at[id] = k
	}
	plan.position = make([]int, len(order))
	for i, id := range order {
		plan.position[i] = -1
		if k, ok := at[id]; ok {
			plan.position[i] = k
			delete(at, id) // a case listed twice is enveloped once
		}
	}
	plan.added = make([]bool, len(plan.enveloped))
	plan.env = envelope.New(m, plan.enveloped)
}

// fold is stiffness.Options.Fold for the plan (nil without an envelope):
// it folds each enveloped case into the envelope as soon as it is
// recovered and keeps whole only the cases the result reports, so an
// envelope over many cases holds one case per worker at a time.
func (plan *envelopePlan) fold() func(int, *stiffness.CaseResult) bool {
	if plan.env == nil {
		return nil
	}
	return func(i int, c *stiffness.CaseResult) bool {
		plan.add(i, c)
		return !plan.omit && (plan.reported < 0 || i < plan.reported)
	}
}

// add folds solved case i into the envelope once.
func (plan *envelopePlan) add(i int, c *stiffness.CaseResult) {
	if k := plan.position[i]; k >= 0 && !plan.added[k] {
		plan.env.Add(k, c)
		plan.added[k] = true
	}
}

// allCaseIDs lists every case and then every combination (generated ones
// included), the order solve reports them in by default.
func allCaseIDs(m *model.Model) []string {
	ids := make([]string, 0, len(m.Cases)+len(m.Combinations))
	for _, c := range m.Cases {
		ids = append(ids, c.ID)
	}
	for _, c := range m.Combinations {
		ids = append(ids, c.ID)
	}
	return ids
}

// expandEnvelopeIDs resolves the envelope's ids, each once, in order.
func expandEnvelopeIDs(m *model.Model, ids []string) ([]string, error) {
	var out []string
	var problems []protocol.Problem
	seen := map[string]bool{}
	add := func(id string) {
		if !seen[id] {
			seen[id] = true
			out = append(out, id)
		}
	}
	for k, id := range ids {
		if m.CaseIndex(id) >= 0 || m.CombinationIndex(id) >= 0 {
			add(id)
			continue
		}
		found := false
		for _, c := range m.Combinations {
			if c.Pattern == id {
				add(c.ID)
				found = true
			}
		}
		if !found {
			problems = append(problems, protocol.Problem{Path: fmt.Sprintf("/params/envelope/cases/%d", k),
				Message: fmt.Sprintf("no load case, combination or pattern is called %q", id)})
		}
	}
	if problems != nil {
		return nil, protocol.NewError(fault.UnknownCase.Code(), fault.UnknownCase.String(),
			fmt.Sprintf("%s; the model's cases and combinations are %s.", problems[0].Message, quotedList(allCaseIDs(m))), problems...)
	}
	return out, nil
}

// finish folds in the enveloped cases the solve did not fold (those
// solved by iteration come back whole), trims res to the cases the result
// reports (none with omit_cases) and returns the envelope, nil when none
// was asked for.
func (plan *envelopePlan) finish(m *model.Model, res *stiffness.Result) *protocol.Envelope {
	if plan.env == nil {
		return nil
	}
	for i := range res.Cases {
		if res.Cases[i].MemberCount() > 0 || len(m.Members) == 0 {
			plan.add(i, &res.Cases[i])
		}
	}
	switch {
	case plan.omit:
		res.Cases = res.Cases[:0]
	case plan.reported >= 0 && plan.reported < len(res.Cases):
		res.Cases = res.Cases[:plan.reported]
	}
	return envelopeWire(m, plan.env)
}

// envelopeWire converts an envelope to wire types.
func envelopeWire(m *model.Model, env *envelope.Envelope) *protocol.Envelope {
	out := &protocol.Envelope{Cases: env.Cases, Nodes: make([]protocol.NodeEnvelope, len(env.Nodes)),
		Reactions: make([]protocol.ReactionEnvelope, len(env.Supports)), Members: make([]protocol.MemberEnvelope, len(env.Members))}
	w := envelopeWriter{cases: env.Cases}
	for n, node := range env.Nodes {
		out.Nodes[n] = protocol.NodeEnvelope{Node: m.NodeIDs[n], Displacements: w.ranges(node.Displacement), Rotations: w.ranges(node.Rotation)}
	}
	for s, sup := range env.Supports {
		out.Reactions[s] = protocol.ReactionEnvelope{Node: m.NodeIDs[m.Supports[s].Node], Force: w.ranges(sup.Force), Moment: w.ranges(sup.Moment)}
	}
	// Distances along members, one backing array: the axial range and up
	// to five internal forces, two ends each.
	w.distances = make([]float64, 0, 2*(1+stiffness.RangeCount)*len(env.Members))
	best := -1
	for e := range env.Members {
		mem := &env.Members[e]
		out.Members[e] = w.member(m, e, mem)
		switch {
		case mem.Unchecked >= 0 || mem.Utilisation.Max.Case < 0:
			out.UncheckedMembers++
		case best < 0 || mem.Utilisation.Max.Value > env.Members[best].Utilisation.Max.Value:
			best = e
		}
	}
	if best >= 0 {
		u := env.Members[best].Utilisation.Max
		out.MaxUtilisation = protocol.EnvelopeExtreme{Value: u.Value, At: m.Members[best].ID, Case: env.Cases[u.Case]}
	}
	return out
}

// envelopeWriter converts bounds, naming their cases.
type envelopeWriter struct {
	cases     []string
	distances []float64
}

func (w *envelopeWriter) value(b envelope.Bound, along bool) protocol.EnvelopeValue {
	v := protocol.EnvelopeValue{Value: b.Value, Case: w.cases[b.Case]}
	if along {
		w.distances = append(w.distances, b.At)
		v.At = &w.distances[len(w.distances)-1]
	}
	return v
}

func (w *envelopeWriter) rangeOf(iv envelope.Interval, along bool) protocol.EnvelopeRange {
	return protocol.EnvelopeRange{Max: w.value(iv.Max, along), Min: w.value(iv.Min, along)}
}

func (w *envelopeWriter) ranges(ivs []envelope.Interval) []protocol.EnvelopeRange {
	out := make([]protocol.EnvelopeRange, len(ivs))
	for i, iv := range ivs {
		out[i] = w.rangeOf(iv, false)
	}
	return out
}

// member converts member e's envelope: a utilisation unchecked in some
// case is null with the reason; a beam's internal forces along it are
// those of its dimension.
func (w *envelopeWriter) member(m *model.Model, e int, mem *envelope.Member) protocol.MemberEnvelope {
	out := protocol.MemberEnvelope{ID: m.Members[e].ID, Axial: w.rangeOf(mem.Axial, true), EndForces: w.ranges(mem.EndForces)}
	if mem.Unchecked >= 0 {
		out.UtilisationNote = fmt.Sprintf("not checked in case %q (see unchecked): the envelope does not leave a case out", w.cases[mem.Unchecked])
	} else {
		u := w.rangeOf(mem.Utilisation, false)
		out.Utilisation = &u
	}
	if mem.Along == nil {
		return out
	}
	along := func(q int) *protocol.EnvelopeRange {
		r := w.rangeOf(mem.Along[q], true)
		return &r
	}
	out.ShearY, out.MomentZ = along(stiffness.RangeShearY), along(stiffness.RangeMomentZ)
	if m.Dim == 3 {
		out.ShearZ, out.Torsion, out.MomentY = along(stiffness.RangeShearZ), along(stiffness.RangeTorsion), along(stiffness.RangeMomentY)
	}
	return out
}
