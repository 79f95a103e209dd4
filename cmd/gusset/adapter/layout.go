package adapter

import (
	"bytes"
	"context"
	"fmt"

	"gusset/engine/layout"
	"gusset/engine/model"
	"gusset/protocol"
)

// defaultModulus is steel's Young's modulus in kN/m², the default for the
// returned model.
const defaultModulus = 2.1e8

// optimiseLayout finds the least-volume layout the request describes.
func (a *Adapter) optimiseLayout(ctx context.Context, r *request[protocol.LayoutParams]) (*protocol.LayoutResult, error) {
	p, st := r.Params, r.Stream
	prob := layout.Problem{Level: p.Connectivity, TensionLimit: p.TensionLimit, CompressionLimit: p.CompressionLimit, JointCost: p.JointCost}
	switch p.Mode {
	case "together":
		prob.Mode = layout.Together
	case "single-equivalent":
		prob.Mode = layout.SingleEquivalent
	}
	if p.Domain != nil {
		prob.Domain.Outline = points(p.Domain.Outline)
		for _, h := range p.Domain.Holes {
			prob.Domain.Holes = append(prob.Domain.Holes, points(h))
		}
	}
	if len(p.Divisions) == 2 {
		prob.Divisions = [2]int{p.Divisions[0], p.Divisions[1]}
	}
	prob.Nodes = points(p.Nodes)
	if p.Domain == nil && len(p.Nodes) == 0 {
		return nil, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
			"Give a design domain (with divisions) or your own candidate nodes.", protocol.Problem{Path: "/params/domain", Message: "domain or nodes required"})
	}
	if p.Domain != nil && len(p.Nodes) == 0 && len(p.Divisions) != 2 {
		return nil, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
			"A design domain needs divisions: the number of grid divisions along x and y.", protocol.Problem{Path: "/params/divisions", Message: "required with a domain"})
	}
	for _, s := range p.Supports {
		sup := layout.Support{Node: -1, At: [2]float64{s.At[0], s.At[1]}}
		for _, c := range s.Fix {
			switch c {
			case "x":
				sup.Fix[0] = true
			case "y":
				sup.Fix[1] = true
			}
		}
		prob.Supports = append(prob.Supports, sup)
	}
	for _, c := range p.Cases {
		lc := layout.Case{ID: c.ID}
		for _, l := range c.Loads {
			lc.Loads = append(lc.Loads, layout.Load{Node: -1, At: [2]float64{l.At[0], l.At[1]}, Force: [2]float64{l.Force[0], l.Force[1]}})
		}
		prob.Cases = append(prob.Cases, lc)
	}
	l, err := layout.Optimise(ctx, prob, layout.Options{MaxCandidates: a.Limits.MaxCandidates}, layoutReporter{st})
	if err != nil {
		return nil, at("/params", err)
	}
	modulus := p.ElasticModulus
	if modulus == 0 {
		modulus = defaultModulus
	}
	out := layoutResult(l, p.Units, modulus)
	if p.Picture {
		var svg bytes.Buffer
		unit := "m"
		if p.Units != nil && p.Units.Length != "" {
			unit = p.Units.Length
		}
		if err := l.WriteSVG(&svg, layout.SVGOptions{Title: "Least-volume layout", LengthUnit: unit}); err != nil {
			return nil, err
		}
		out.Picture = svg.String()
	}
	return out, nil
}

// layoutReporter passes the member-adding rounds on as partial results.
type layoutReporter struct{ st protocol.Stream }

func (r layoutReporter) Progress(stage string, done, total int, partial any) {
	if round, ok := partial.(layout.Round); ok {
		partial = map[string]any{"iteration": round.Iteration, "members": round.Members, "added": round.Added,
			"volume": round.Volume, "max_violation": round.MaxViolation}
	}
	r.st.Progress(stage, done, total, partial)
}

func points(ps [][]float64) [][2]float64 {
	if ps == nil {
		return nil
	}
	out := make([][2]float64, len(ps))
	for i, p := range ps {
		if len(p) >= 2 {
			out[i] = [2]float64{p[0], p[1]}
		}
	}
	return out
}

// layoutResult converts a layout, building the model a host sends on to
// solve, reciprocate and load-path: the kept nodes and members, one section
// per member with its optimal area, the supports and the load cases.
func layoutResult(l *layout.Layout, units *protocol.Units, modulus float64) *protocol.LayoutResult {
	spec := &model.Spec{Dimension: 2}
	if units != nil {
		spec.Units = model.UnitsSpec{Length: units.Length, Force: units.Force}
	}
	tension, compression := model.Num(l.TensionLimit), model.Num(l.CompressionLimit)
	spec.Materials = []model.MaterialSpec{{ID: "material", ElasticModulus: model.Num(modulus), TensionLimit: &tension, CompressionLimit: &compression}}
	nodeID := func(i int) string { return fmt.Sprintf("n%d", i) }
	for i, n := range l.Nodes {
		spec.Nodes = append(spec.Nodes, model.NodeSpec{ID: nodeID(i), At: []model.Value{model.Num(n[0]), model.Num(n[1])}})
	}
	out := &protocol.LayoutResult{Volume: l.Volume, Objective: l.Objective, Caution: Caution}
	for e, m := range l.Members {
		id, section := fmt.Sprintf("m%d", e), fmt.Sprintf("a%d", e)
		spec.Sections = append(spec.Sections, model.SectionSpec{ID: section, Area: model.Num(m.Area)})
		spec.Members = append(spec.Members, model.MemberSpec{ID: id, Ends: [2]string{nodeID(m.Ends[0]), nodeID(m.Ends[1])}, Material: "material", Section: section})
		out.Members = append(out.Members, protocol.LayoutMember{ID: id, Ends: []string{nodeID(m.Ends[0]), nodeID(m.Ends[1])},
			Length: m.Length, Area: m.Area, Forces: m.Forces})
	}
	for _, s := range l.Supports {
		sup := model.SupportSpec{Node: nodeID(s.Node)}
		if s.Fix[0] {
			sup.Fix = append(sup.Fix, "x")
		}
		if s.Fix[1] {
			sup.Fix = append(sup.Fix, "y")
		}
		spec.Supports = append(spec.Supports, sup)
	}
	for _, c := range l.Cases {
		lc := model.LoadCaseSpec{ID: c.ID}
		for _, f := range c.Loads {
			lc.Loads = append(lc.Loads, model.NodalLoadSpec{Node: nodeID(f.Node), Force: []model.Value{model.Num(f.Force[0]), model.Num(f.Force[1])}})
		}
		spec.LoadCases = append(spec.LoadCases, lc)
		out.Cases = append(out.Cases, protocol.LayoutCaseResult{ID: c.ID, LoadPath: c.LoadPath, TensionLoadPath: c.TensionPath,
			CompressionLoadPath: c.CompressionPath, Constant: c.LoadPathConstant, MaxwellResidual: c.MaxwellResidual,
			EquilibriumResidual: c.EquilibriumResidual})
	}
	out.Model = *WireModel(spec)
	s := l.Stats
	out.Stats = protocol.LayoutStats{Nodes: s.Nodes, Candidates: s.Candidates, Iterations: s.Iterations,
		InteriorPointIterations: s.InteriorPointIterations, MembersInProgram: s.MembersInProgram, OptimalityGap: s.OptimalityGap}
	return out
}
