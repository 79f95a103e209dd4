package adapter

import (
	"bytes"
	"context"
	"fmt"

	"gusset/engine/layout"
	"gusset/engine/model"
	"gusset/engine/progress"
	"gusset/engine/render"
	"gusset/protocol"
)

// optimiseLayout finds the least-volume layout the request describes.
func (a *Adapter) optimiseLayout(ctx context.Context, r *request[protocol.LayoutParams]) (*protocol.LayoutResult, error) {
	p, st := r.Params, r.Stream
	prob, err := layoutProblem(p)
	if err != nil {
		return nil, err
	}
	l, err := layout.Optimise(ctx, prob, layout.Options{MaxCandidates: a.Limits.MaxCandidates, Rounds: layoutRounds{st}}, st)
	if err != nil {
		return nil, at("/params", err)
	}
	modulus := p.ElasticModulus
	if modulus == 0 {
		// Steel's, in the request's units (the schema allows only units
		// StressFromPascals knows).
		var units model.UnitsSpec
		if p.Units != nil {
			units = model.UnitsSpec{Length: p.Units.Length, Force: p.Units.Force}
		}
		modulus, _ = model.StressFromPascals(units, model.SteelElasticModulus)
	}
	out := layoutResult(l, p.Units, modulus)
	if p.Picture {
		var svg bytes.Buffer
		opt := render.LayoutOptions{Title: "Least-volume layout"}
		if p.Units != nil {
			opt.LengthUnit, opt.ForceUnit = p.Units.Length, p.Units.Force
		}
		if err := render.Layout(&svg, l, opt); err != nil {
			return nil, err
		}
		out.Picture = svg.String()
	}
	return out, nil
}

// invalidLayout is an invalid-params error at a pointer into the params.
func invalidLayout(path, message, problem string) error {
	return protocol.NewError(protocol.CodeInvalidParams, "invalid params", message, protocol.Problem{Path: "/params" + path, Message: problem})
}

// layoutProblem converts the params, checking that every point has the
// dimension's number of entries.
func layoutProblem(p *protocol.LayoutParams) (layout.Problem, error) {
	dim := p.Dimension
	if dim == 0 {
		dim = 2
	}
	prob := layout.Problem{Dim: dim, Level: p.Connectivity, TensionLimit: p.TensionLimit, CompressionLimit: p.CompressionLimit, JointCost: p.JointCost}
	switch p.Mode {
	case "together":
		prob.Mode = layout.Together
	case "single-equivalent":
		prob.Mode = layout.SingleEquivalent
	}
	if p.Domain == nil && len(p.Nodes) == 0 {
		return prob, invalidLayout("/domain", "Give a design domain (with divisions) or your own candidate nodes.", "domain or nodes required")
	}
	if p.Domain != nil && len(p.Nodes) == 0 && len(p.Divisions) != dim {
		return prob, invalidLayout("/divisions", fmt.Sprintf("A design domain needs divisions: the number of grid divisions along each of the %d axes.", dim), fmt.Sprintf("%d entries required with a domain", dim))
	}
	copy(prob.Divisions[:], p.Divisions)
	pc := pointChecker{dim: dim}
	prob.Nodes = pc.points(p.Nodes, "/nodes")
	if p.Domain != nil {
		if err := layoutDomain(&prob, p.Domain, &pc); err != nil {
			return prob, err
		}
	}
	for i, s := range p.Supports {
		sup := layout.Support{Node: -1, At: pc.point(s.At, fmt.Sprintf("/supports/%d/at", i))}
		for j, c := range s.Fix {
			switch c {
			case "x":
				sup.Fix[0] = true
			case "y":
				sup.Fix[1] = true
			case "z":
				if dim == 2 {
					pc.fail(fmt.Sprintf("/supports/%d/fix/%d", i, j), "a plane layout has only x and y")
				}
				sup.Fix[2] = true
			}
		}
		prob.Supports = append(prob.Supports, sup)
	}
	for k, c := range p.Cases {
		lc := layout.Case{ID: c.ID}
		for i, l := range c.Loads {
			path := fmt.Sprintf("/cases/%d/loads/%d", k, i)
			lc.Loads = append(lc.Loads, layout.Load{Node: -1, At: pc.point(l.At, path+"/at"), Force: pc.point(l.Force, path+"/force")})
		}
		prob.Cases = append(prob.Cases, lc)
	}
	return prob, pc.err
}

// layoutDomain converts the domain: a plane polygon or a space polyhedron,
// each given by its points or as a box, with holes of either kind.
func layoutDomain(prob *layout.Problem, d *protocol.Domain, pc *pointChecker) error {
	if (d.Box == nil) == (len(d.Outline) == 0) {
		return invalidLayout("/domain", "Give the design domain as an outline or as a box, not both.", "one of outline and box")
	}
	outline := pc.points(d.Outline, "/domain/outline")
	if d.Box != nil {
		outline = pc.box(d.Box, "/domain/box")
	}
	var holes [][][3]float64
	for h, hole := range d.Holes {
		holes = append(holes, pc.points(hole, fmt.Sprintf("/domain/holes/%d", h)))
	}
	for h, b := range d.BoxHoles {
		holes = append(holes, pc.box(&b, fmt.Sprintf("/domain/box_holes/%d", h)))
	}
	if pc.dim == 3 {
		prob.Solid = layout.Solid{Vertices: outline, Holes: holes}
		return nil
	}
	flat := func(ps [][3]float64) [][2]float64 {
		out := make([][2]float64, len(ps))
		for i, q := range ps {
			out[i] = [2]float64{q[0], q[1]}
		}
		return out
	}
	prob.Domain.Outline = flat(outline)
	for _, h := range holes {
		prob.Domain.Holes = append(prob.Domain.Holes, flat(h))
	}
	return nil
}

// pointChecker converts wire points, remembering the first one whose
// length is not the dimension.
type pointChecker struct {
	dim int
	err error
}

func (pc *pointChecker) fail(path, problem string) {
	if pc.err == nil {
		pc.err = invalidLayout(path, fmt.Sprintf("Every point and vector of a %dD layout has %d entries; %s.", pc.dim, pc.dim, path[1:]+": "+problem), problem)
	}
}

func (pc *pointChecker) point(p []float64, path string) [3]float64 {
	var out [3]float64
	if len(p) != pc.dim {
		pc.fail(path, fmt.Sprintf("%d entries, want %d", len(p), pc.dim))
		return out
	}
	copy(out[:], p)
	return out
}

func (pc *pointChecker) points(ps [][]float64, path string) [][3]float64 {
	if ps == nil {
		return nil
	}
	out := make([][3]float64, len(ps))
	for i, p := range ps {
		out[i] = pc.point(p, fmt.Sprintf("%s/%d", path, i))
	}
	return out
}

// box returns a box's corners: four in the plane, in order round the
// rectangle, eight in space.
func (pc *pointChecker) box(b *protocol.LayoutBox, path string) [][3]float64 {
	lo, hi := pc.point(b.Min, path+"/min"), pc.point(b.Max, path+"/max")
	for a := 0; a < pc.dim; a++ {
		if !(lo[a] < hi[a]) {
			pc.fail(path+"/max", "each coordinate of max must exceed min's")
			return nil
		}
	}
	if pc.dim == 2 {
		return [][3]float64{{lo[0], lo[1]}, {hi[0], lo[1]}, {hi[0], hi[1]}, {lo[0], hi[1]}}
	}
	return layout.Box(lo, hi)
}

// layoutRounds passes the member-adding rounds on as partial results.
type layoutRounds struct{ st progress.Reporter }

func (r layoutRounds) Record(stage string, done, total int, round layout.Round) {
	r.st.Progress(stage, done, total, map[string]any{"iteration": round.Iteration, "members": round.Members, "added": round.Added,
		"volume": round.Volume, "max_violation": round.MaxViolation, "violators": round.Violators})
}

// layoutResult converts a layout, building the model a host sends on to
// solve, reciprocate and load-path: the kept nodes and members, one section
// per member with its optimal area, the supports and the load cases.
func layoutResult(l *layout.Layout, units *protocol.Units, modulus float64) *protocol.LayoutResult {
	spec := &model.Spec{Dimension: l.Dim}
	numbers := func(p [3]float64) []model.Value {
		out := make([]model.Value, l.Dim)
		for a := range out {
			out[a] = model.Num(p[a])
		}
		return out
	}
	if units != nil {
		spec.Units = model.UnitsSpec{Length: units.Length, Force: units.Force}
	}
	tension, compression := model.Num(l.TensionLimit), model.Num(l.CompressionLimit)
	spec.Materials = []model.MaterialSpec{{ID: "material", ElasticModulus: model.Num(modulus), TensionLimit: &tension, CompressionLimit: &compression}}
	nodeID := func(i int) string { return fmt.Sprintf("n%d", i) }
	for i, n := range l.Nodes {
		spec.Nodes = append(spec.Nodes, model.NodeSpec{ID: nodeID(i), At: numbers(n)})
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
		for a := 0; a < l.Dim; a++ {
			if s.Fix[a] {
				sup.Fix = append(sup.Fix, model.ComponentNames[a])
			}
		}
		spec.Supports = append(spec.Supports, sup)
	}
	for _, c := range l.Cases {
		lc := model.LoadCaseSpec{ID: c.ID}
		for _, f := range c.Loads {
			lc.Loads = append(lc.Loads, model.NodalLoadSpec{Node: nodeID(f.Node), Force: numbers(f.Force)})
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
