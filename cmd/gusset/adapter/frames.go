package adapter

import (
	"bytes"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/render"
	"gusset/engine/stiffness"
	"gusset/protocol"
)

// areaOf converts a section's optional area; a missing one is the zero
// value, which the compiler takes from the section's shape (or refuses
// with a pointer when there is none).
func areaOf(n *protocol.Number) model.Value {
	if n == nil {
		return model.Num(0)
	}
	return value(*n)
}

// shapeOf converts a section shape.
func shapeOf(s *protocol.SectionShape) *model.ShapeSpec {
	if s == nil {
		return nil
	}
	return &model.ShapeSpec{Kind: s.Kind, Depth: s.Depth, Width: s.Width, WebThickness: s.WebThickness,
		FlangeThickness: s.FlangeThickness, RootRadius: s.RootRadius, Thickness: s.Thickness, Diameter: s.Diameter}
}

// wireShape is the inverse of shapeOf.
func wireShape(s *model.ShapeSpec) *protocol.SectionShape {
	if s == nil {
		return nil
	}
	return &protocol.SectionShape{Kind: s.Kind, Depth: s.Depth, Width: s.Width, WebThickness: s.WebThickness,
		FlangeThickness: s.FlangeThickness, RootRadius: s.RootRadius, Thickness: s.Thickness, Diameter: s.Diameter}
}

// wireArea is a spec's area on the wire: omitted when the shape gives it.
func wireArea(v model.Value, shape *model.ShapeSpec) *protocol.Number {
	if shape != nil && !v.IsExpr && v.Num == 0 {
		return nil
	}
	n := protocol.Number{Value: v.Num, Expr: v.Expr, IsExpr: v.IsExpr}
	return &n
}

// stationOption maps the wire's stations (default 11, 0 for none) to
// stiffness.Options.Stations (0 for the default, negative for none).
func stationOption(n *int) int {
	switch {
	case n == nil:
		return 0
	case *n == 0:
		return -1
	}
	return *n
}

// caseSummaries fills the wire case's utilisation, its summaries (largest
// displacement and moment, anywhere along the members) and its results
// along the members. The station arrays are the engine's, not copies.
func caseSummaries(m *model.Model, c *stiffness.CaseResult, cr *protocol.CaseResult) {
	cr.Utilisation = make([]*float64, len(c.Utilisation))
	for j, u := range c.Utilisation {
		if u < 0 {
			cr.UncheckedMembers++
			continue
		}
		v := u
		cr.Utilisation[j] = &v
		if u > cr.MaxUtilisation.Value || cr.MaxUtilisation.At == "" {
			cr.MaxUtilisation = protocol.Extreme{Value: u, At: m.Members[j].ID}
		}
	}
	cr.AxialUtilisation = axialParts(c)
	cr.MaxDisplacement = wirePeak(m, c.MaxDisplacement)
	cr.MaxMoment = wirePeak(m, c.MaxMoment)
	cr.Members = make([]*protocol.MemberResult, c.MemberCount())
	var scratch stiffness.MemberResult
	for e := range c.MemberCount() {
		// A beam's or loaded bar's results are the case's own (not
		// scratch), which the wire member may share.
		if r := c.Member(e, &scratch); m.Members[e].Kind == model.Beam || r.LoadedAcross {
			cr.Members[e] = wireMember(m, e, r)
		}
	}
}

// wirePeak converts a case's peak: at a node, or in a member at a
// distance.
func wirePeak(m *model.Model, p stiffness.Peak) protocol.Extreme {
	switch {
	case p.Node >= 0:
		return protocol.Extreme{Value: p.Value, At: m.NodeIDs[p.Node]}
	case p.Member >= 0:
		at := p.At
		return protocol.Extreme{Value: p.Value, At: m.Members[p.Member].ID, Distance: &at}
	}
	return protocol.Extreme{}
}

// wireMember converts the results along one beam, or one bar loaded
// across its length.
func wireMember(m *model.Model, e int, r *stiffness.MemberResult) *protocol.MemberResult {
	along := func(x stiffness.Extreme) protocol.Along { return protocol.Along{Value: x.Value, At: x.At} }
	check := func(u float64) *float64 {
		if u < 0 {
			return nil
		}
		return &u
	}
	out := &protocol.MemberResult{ID: m.Members[e].ID, Stations: r.Stations, Axial: r.Axial, ShearY: r.ShearY, ShearZ: r.ShearZ,
		Torsion: r.Torsion, MomentY: r.MomentY, MomentZ: r.MomentZ, Displacements: r.Displacements,
		MaxAxial: along(r.MaxAxial), MinAxial: along(r.MinAxial), PeakMomentZ: along(r.PeakMomentZ),
		PeakDeflectionY: along(r.PeakDeflectionY), PeakDisplacement: along(r.PeakDisplacement),
		AxialUtilisation: check(r.AxialUtilisation), BendingUtilisation: check(r.BendingUtilisation),
		CombinedUtilisation: check(r.CombinedUtilisation),
		StrainEnergy:        protocol.StrainEnergy{Axial: r.AxialEnergy, Bending: r.BendingEnergy, Torsion: r.TorsionEnergy}}
	if r.MinAxial.Value < 0 {
		out.BucklingReduction = r.BucklingReduction
	}
	if m.Dim == 3 {
		my, wz := along(r.PeakMomentY), along(r.PeakDeflectionZ)
		out.PeakMomentY, out.PeakDeflectionZ = &my, &wz
	}
	return out
}

// uncheckedWire converts the engine's unchecked notes, locating their
// pointers in the request's model.
func uncheckedWire(notes []fault.Problem) []protocol.Problem {
	out := make([]protocol.Problem, len(notes))
	for i, p := range notes {
		out[i] = protocol.Problem{Path: "/params/model" + p.Path, Message: p.Message}
	}
	return out
}

// loadPathCaveats says, case by case, what an axial load path leaves out
// when members bend.
func loadPathCaveats(m *model.Model, r *stiffness.Result) []string {
	var out []string
	for i := range r.Cases {
		if s := stiffness.LoadPathCaveat(m, &r.Cases[i]); s != "" {
			out = append(out, s)
		}
	}
	return out
}

// solvePicture draws the first reported case: for a model with beams,
// the bending-moment diagrams and the deflected shape along the members
// (render.Beams in 2D, render.Beams3D in 3D, from the stations);
// otherwise, or without stations, the
// deflected shape with the members styled by their axial force
// (render.Solved).
func solvePicture(m *model.Model, res *stiffness.Result) (string, error) {
	c := &res.Cases[0]
	var svg bytes.Buffer
	var curves []render.BeamCurve
	var scratch stiffness.MemberResult
	for e := range c.MemberCount() {
		r := c.Member(e, &scratch)
		if len(r.Stations) == 0 {
			continue
		}
		curves = append(curves, render.BeamCurve{Member: e, Stations: r.Stations, Moment: r.MomentZ, Displacements: r.Displacements,
			PeakMoment: [2]float64{r.PeakMomentZ.Value, r.PeakMomentZ.At}, PeakDisplacement: [2]float64{r.PeakDisplacement.Value, r.PeakDisplacement.At},
			MomentY: r.MomentY, PeakMomentY: [2]float64{r.PeakMomentY.Value, r.PeakMomentY.At}})
	}
	if len(curves) > 0 {
		opt := render.Options{Title: "Moments and deflections along the members: " + c.ID}
		var err error
		if m.Dim == 3 {
			err = render.Beams3D(&svg, m, c.Displacements, curves, opt)
		} else {
			err = render.Beams(&svg, m, c.Displacements, curves, opt)
		}
		return svg.String(), err
	}
	title := "Deflected shape and axial forces: " + c.ID
	err := render.Solved(&svg, m, c.Displacements, c.AxialForce, render.Options{Title: title, ForceLabels: true})
	return svg.String(), err
}
