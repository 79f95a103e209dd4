package adapter

import (
	"bytes"
	"context"
	"fmt"

	"gusset/engine/fault"
	"gusset/engine/loadpath"
	"gusset/engine/model"
	"gusset/engine/reciprocal"
	"gusset/engine/render"
	"gusset/engine/statics"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// reciprocate draws the reciprocal force diagram of the request's model.
func (a *Adapter) reciprocate(ctx context.Context, r *request[protocol.ReciprocateParams]) (*protocol.ReciprocateResult, error) {
	p, m, st := r.Params, r.Model, r.Stream
	if m.Dim != 2 {
		return nil, protocol.NewError(fault.WrongDimension.Code(), fault.WrongDimension.String(),
			"Reciprocal diagrams are drawn for planar networks: the model has dimension 3. Send a 2D model.",
			protocol.Problem{Path: "/params/model/dimension", Message: "must be 2 for reciprocate"})
	}
	if p.Case != "" {
		if err := checkCases(m, []string{p.Case}, "/params/case"); err != nil {
			e := err.(*protocol.Error)
			e.Data.Problems[0].Path = "/params/case"
			return nil, e
		}
	}
	in, label, err := a.diagramInput(ctx, m, p, st)
	if err != nil {
		return nil, err
	}
	in.Perpendicular = p.Perpendicular
	in.Progress = st
	d, err := reciprocal.Build(ctx, in)
	if err != nil {
		return nil, at("/params/model", err)
	}
	out := diagramResult(m, d, label)
	if p.Edit != nil {
		form, err := redraw(ctx, m, d, p.Edit)
		if err != nil {
			return nil, err
		}
		out.Form = form
	}
	if p.Picture {
		var svg bytes.Buffer
		if err := render.FormAndForce(&svg, m, d, render.Options{Title: "Form and force diagrams: " + label, ForceLabels: true}); err != nil {
			return nil, err
		}
		out.Picture = svg.String()
	}
	return out, nil
}

// diagramInput finds the forces to draw: given, a state of self-stress, or
// the solve of the named case.
func (a *Adapter) diagramInput(ctx context.Context, m *model.Model, p *protocol.ReciprocateParams, st jsonrpc.Stream) (reciprocal.Input, string, error) {
	switch {
	case p.Forces != nil:
		var ids []string
		if p.Case != "" {
			ids = []string{p.Case}
		}
		c, err := givenForces(m, p.Forces, ids)
		if err != nil {
			return reciprocal.Input{}, "", err
		}
		return reciprocal.Input{Model: m, AxialForce: c.AxialForce, External: planar(c.External)}, "given forces", nil
	case p.SelfStress != nil || (len(m.Cases) == 0 && p.Case == ""):
		k := 0
		if p.SelfStress != nil {
			k = *p.SelfStress
		}
		report, err := statics.Analyse(ctx, m, statics.Options{})
		if err != nil {
			return reciprocal.Input{}, "", at("/params/model", err)
		}
		if !report.Computed {
			return reciprocal.Input{}, "", protocol.NewError(protocol.CodeLimitExceeded, "limit exceeded",
				"The network is too large for its states of self-stress to be found; give the forces instead.",
				protocol.Problem{Path: "/params/self_stress", Message: "too large for the rank computation"})
		}
		if k >= len(report.SelfStressStates) {
			return reciprocal.Input{}, "", protocol.NewError(fault.NoSolution.Code(), fault.NoSolution.String(),
				fmt.Sprintf("The network has %d states of self-stress (and no load cases), so there is no state %d to draw. Add loads, or brace the network so that it can carry a self-stress.", len(report.SelfStressStates), k),
				protocol.Problem{Path: "/params/self_stress", Message: fmt.Sprintf("%d states available", len(report.SelfStressStates))})
		}
		return reciprocal.SelfStressInput(m, report.SelfStressStates[k]), fmt.Sprintf("self-stress %d", k), nil
	}
	var cases []string
	if p.Case != "" {
		cases = []string{p.Case}
	} else if len(m.Cases) > 0 {
		cases = []string{m.Cases[0].ID}
	}
	r, err := a.analyse(ctx, m, cases, st)
	if err != nil {
		return reciprocal.Input{}, "", err
	}
	c := loadpath.Solved(r)[0]
	external, separate := apartAtSupports(m, &r.Cases[0], planar(c.External))
	return reciprocal.Input{Model: m, AxialForce: c.AxialForce, External: external, Separate: separate}, c.ID, nil
}

func planar(vs [][]float64) [][2]float64 {
	out := make([][2]float64, len(vs))
	for i, v := range vs {
		if len(v) >= 2 {
			out[i] = [2]float64{v[0], v[1]}
		}
	}
	return out
}

// redraw runs the reverse direction: the form parallel to the edited
// diagram.
func redraw(ctx context.Context, m *model.Model, d *reciprocal.Diagram, edit *protocol.DiagramEdit) (*protocol.RedrawnForm, error) {
	points := append([][2]float64(nil), d.Points...)
	index := map[string]int{}
	for i, s := range d.Spaces {
		index[s.Label] = i
	}
	for label, at := range edit.Points {
		i, ok := index[label]
		if !ok || len(at) != 2 {
			return nil, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
				fmt.Sprintf("The edited point %q is not a space of this diagram (or is not an [x, y] pair).", label),
				protocol.Problem{Path: "/params/edit/points/" + label, Message: "unknown space label or not two numbers"})
		}
		points[i] = [2]float64{at[0], at[1]}
	}
	fixed := make([]bool, m.NodeCount())
	for k, id := range edit.Fixed {
		found := false
		for i, n := range m.NodeIDs {
			if n == id {
				fixed[i], found = true, true
			}
		}
		if !found {
			return nil, protocol.NewError(protocol.CodeInvalidParams, "invalid params", fmt.Sprintf("There is no node %q to keep fixed.", id),
				protocol.Problem{Path: fmt.Sprintf("/params/edit/fixed/%d", k), Message: "no such node"})
		}
	}
	r, err := reciprocal.Reverse(ctx, m, d, points, fixed)
	if err != nil {
		return nil, at("/params/model", err)
	}
	form := &protocol.RedrawnForm{Residual: r.Residual}
	for i, id := range m.NodeIDs {
		form.Nodes = append(form.Nodes, protocol.RedrawnNode{ID: id, At: []float64{r.Coords[2*i], r.Coords[2*i+1]}, Moved: r.Moved[i]})
	}
	return form, nil
}

func diagramResult(m *model.Model, d *reciprocal.Diagram, label string) *protocol.ReciprocateResult {
	out := &protocol.ReciprocateResult{Case: label, Perpendicular: d.Perpendicular, Caution: Caution,
		Closure:       protocol.Closure{Nodes: d.NodeClosure, Total: d.TotalClosure, Max: d.MaxClosure, MaxMisfit: d.MaxMisfit},
		Disagreements: []string{}, LoadLine: []string{}}
	for i, s := range d.Spaces {
		out.Spaces = append(out.Spaces, protocol.DiagramSpace{Label: s.Label, Outer: s.Outer,
			Point: []float64{d.Points[i][0], d.Points[i][1]}, Anchor: []float64{s.Anchor[0], s.Anchor[1]}})
	}
	segment := func(s reciprocal.Segment) protocol.DiagramSegment {
		from, to := d.Points[s.Left], d.Points[s.Right]
		return protocol.DiagramSegment{Label: s.Label, Spaces: []string{d.Spaces[s.Left].Label, d.Spaces[s.Right].Label},
			From: []float64{from[0], from[1]}, To: []float64{to[0], to[1]}, Force: s.Force, Sense: s.Sense.String(), Misfit: s.Misfit}
	}
	for e, s := range d.Members {
		seg := segment(s)
		seg.Member = m.Members[e].ID
		out.Members = append(out.Members, seg)
	}
	out.ExternalForces = []protocol.DiagramSegment{}
	for _, s := range d.Forces {
		seg := segment(s)
		seg.Node = m.NodeIDs[s.Node]
		seg.Sense = ""
		out.ExternalForces = append(out.ExternalForces, seg)
	}
	for _, k := range d.LoadLine {
		out.LoadLine = append(out.LoadLine, d.Spaces[k].Label)
	}
	for _, e := range d.Disagreements {
		out.Disagreements = append(out.Disagreements, m.Members[e].ID)
	}
	if l := d.Lift; l != nil {
		out.Airy = protocol.AiryFunction{Heights: l.Heights, Jumps: l.Jumps, Mismatch: l.Mismatch}
		for _, pl := range l.Planes {
			out.Airy.Planes = append(out.Airy.Planes, []float64{pl[0], pl[1], pl[2]})
		}
		for _, f := range l.Folds {
			out.Airy.Folds = append(out.Airy.Folds, f.String())
		}
		for _, v := range l.Polar.Vertices {
			out.Airy.PolarVertices = append(out.Airy.PolarVertices, []float64{v[0], v[1], v[2]})
		}
		for _, v := range l.Polar.Planes {
			out.Airy.PolarPlanes = append(out.Airy.PolarPlanes, []float64{v[0], v[1], v[2]})
		}
	}
	return out
}
