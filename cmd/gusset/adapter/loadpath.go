package adapter

import (
	"context"
	"errors"
	"fmt"

	"gusset/engine/loadpath"
	"gusset/engine/model"
	"gusset/engine/stiffness"
	"gusset/protocol"
)

// loadPath computes the load path and quantities of the request's model.
func (a *Adapter) loadPath(ctx context.Context, r *request[protocol.LoadPathParams]) (*protocol.LoadPathResult, error) {
	p, m, st := r.Params, r.Model, r.Stream
	var cases []loadpath.Case
	var caveats []string
	if p.Forces != nil {
		c, err := givenForcesCase(m, p.Forces, p.Cases)
		if err != nil {
			return nil, err
		}
		cases = []loadpath.Case{c}
	} else {
		r, err := a.analyse(ctx, m, p.Cases, st)
		if err != nil {
			return nil, err
		}
		cases = loadPathCases(r)
		caveats = loadPathCaveats(m, r)
	}
	opt, err := sizingOptions(p.Sizing, "/params/sizing")
	if err != nil {
		return nil, err
	}
	opt.FloorArea = p.FloorArea
	res, err := loadpath.Compute(m, cases, opt)
	if err != nil {
		return nil, loadPathError(err)
	}
	out := loadPathResult(m, res)
	out.Warnings = caveats
	return out, nil
}

// loadPathCases turns a stiffness result into load-path cases: the mean
// axial force of each member and, as external forces, the applied loads
// (member loads and self-weight carried to the nodes) plus the reactions,
// both computed by the solver independently of the member forces, so that
// Maxwell's residual measures equilibrium.
//
// The mean (N₁ + N₂)/2 of the end values is the force that balances the
// loads as carried to the nodes: a bar's own weight has a component along
// an inclined bar, so its axial force varies along it and the end values
// differ by that component; the elastic force EA·δ/L between the nodes is
// their mean. For members without loads along them N₁ = N₂.
func loadPathCases(r *stiffness.Result) []loadpath.Case {
	cases := make([]loadpath.Case, len(r.Cases))
	for i, c := range r.Cases {
		axial := make([]float64, len(c.AxialForce))
		for e, n := range c.AxialForce {
			p := c.EndForces[e]
			axial[e] = n
			if half := len(p) / 2; half > 0 {
				axial[e] = (-p[0] + p[half]) / 2
			}
		}
		cases[i] = loadpath.Case{ID: c.ID, AxialForce: axial, External: c.External}
	}
	return cases
}

// givenForcesCase builds the one case of given member forces: at unsupported
// nodes the external force is the applied nodal load of the named case (or
// the first case; none when the model has no cases), and at supported nodes
// it is whatever balances the members there (load and reaction together).
// Maxwell's residual then measures the equilibrium of the free nodes.
func givenForcesCase(m *model.Model, forces []float64, ids []string) (loadpath.Case, error) {
	if len(forces) != len(m.Members) {
		return loadpath.Case{}, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
			fmt.Sprintf("forces has %d entries but the model has %d members; give one axial force per member.", len(forces), len(m.Members)),
			protocol.Problem{Path: "/params/forces", Message: fmt.Sprintf("want %d entries", len(m.Members))})
	}
	c := loadpath.Case{ID: "given", AxialForce: forces, External: make([][]float64, m.NodeCount())}
	for i := range c.External {
		c.External[i] = make([]float64, m.Dim)
	}
	caseIndex := -1
	if len(ids) > 0 {
		caseIndex = m.CaseIndex(ids[0])
		if caseIndex < 0 {
			return c, protocol.NewError(1009, "unknown case", fmt.Sprintf("There is no load case %q.", ids[0]),
				protocol.Problem{Path: "/params/cases/0", Message: "no such load case"})
		}
		c.ID = ids[0]
	} else if len(m.Cases) > 0 {
		caseIndex = 0
		c.ID = m.Cases[0].ID
	}
	if caseIndex >= 0 {
		for _, l := range m.Cases[caseIndex].Nodal {
			for k := 0; k < m.Dim; k++ {
				c.External[l.Node][k] += l.Force[k]
			}
		}
	}
	supported := make([]bool, m.NodeCount())
	for _, s := range m.Supports {
		supported[s.Node] = true
	}
	for e, mem := range m.Members {
		a, b := m.Node(mem.Ends[0]), m.Node(mem.Ends[1])
		length := m.Length(e)
		for k := 0; k < m.Dim; k++ {
			u := (b[k] - a[k]) / length
			// A member in tension pulls each end towards the other; the
			// external force at a supported node balances it.
			if supported[mem.Ends[0]] {
				c.External[mem.Ends[0]][k] -= forces[e] * u
			}
			if supported[mem.Ends[1]] {
				c.External[mem.Ends[1]][k] += forces[e] * u
			}
		}
	}
	// At supported nodes the external force is the total that balances the
	// members: replace the partial load added above.
	if caseIndex >= 0 {
		for _, l := range m.Cases[caseIndex].Nodal {
			if supported[l.Node] {
				for k := 0; k < m.Dim; k++ {
					c.External[l.Node][k] -= l.Force[k]
				}
			}
		}
	}
	return c, nil
}

// sizingOptions converts the wire sizing declaration.
func sizingOptions(s *protocol.Sizing, pointer string) (loadpath.Options, error) {
	var opt loadpath.Options
	if s == nil {
		return opt, nil
	}
	opt.Size = true
	opt.MinimumArea = s.MinimumArea
	switch s.Shape {
	case "tube":
		if s.DiameterToThickness == 0 {
			return opt, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
				"A tube section family needs diameter_to_thickness (D/t, more than 2).",
				protocol.Problem{Path: pointer + "/diameter_to_thickness", Message: "required for shape tube"})
		}
		opt.Section = loadpath.SectionFamily{Shape: loadpath.ShapeTube, DiameterToThickness: s.DiameterToThickness}
	case "solid-round":
		opt.Section = loadpath.SectionFamily{Shape: loadpath.ShapeSolidRound}
	case "solid-square":
		opt.Section = loadpath.SectionFamily{Shape: loadpath.ShapeSolidSquare}
	case "custom":
		if s.Coefficient <= 0 {
			return opt, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
				"A custom section family needs a positive coefficient c in I = c·A².",
				protocol.Problem{Path: pointer + "/coefficient", Message: "required for shape custom"})
		}
		opt.Section = loadpath.SectionFamily{Coefficient: s.Coefficient}
	}
	return opt, nil
}

// loadPathError locates loadpath's errors in the request.
func loadPathError(err error) error {
	var ie *loadpath.InputError
	if errors.As(err, &ie) {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", ie.Message+".",
			protocol.Problem{Path: "/params" + ie.Path, Message: ie.Message})
	}
	return at("/params/model", err)
}

func loadPathResult(m *model.Model, r *loadpath.Result) *protocol.LoadPathResult {
	out := &protocol.LoadPathResult{Cases: make([]protocol.LoadPathCase, len(r.Cases)), Sized: r.Sized, Caution: Caution}
	for i, c := range r.Cases {
		lc := protocol.LoadPathCase{ID: c.ID, LoadPath: c.LoadPath, TensionLoadPath: c.TensionLoadPath,
			CompressionLoadPath: c.CompressionLoadPath, Constant: c.Constant, Residual: c.Residual,
			RelativeResidual: c.RelativeResidual, Resultant: c.Resultant, StressVolume: c.StressVolume}
		if c.HasTheoremVolume {
			v := c.TheoremVolume
			lc.TheoremVolume = &v
		}
		out.Cases[i] = lc
	}
	out.Members = protocol.MemberQuantities{Length: r.Length, Force: r.Force, GoverningCase: r.GoverningCase,
		Area: nonNil(r.Area), Volume: nonNil(r.Volume), Mass: nonNil(r.Mass), Criterion: []string{}}
	for _, c := range r.Criterion {
		out.Members.Criterion = append(out.Members.Criterion, c.String())
	}
	out.Totals = protocol.QuantityTotals{Tension: quantity(r.Totals.Tension), Compression: quantity(r.Totals.Compression),
		All: quantity(r.Totals.All), CarbonMissing: r.Totals.CarbonMissing}
	if out.Totals.CarbonMissing == nil {
		out.Totals.CarbonMissing = []string{}
	}
	if r.Totals.PerFloorArea != nil {
		q := quantity(*r.Totals.PerFloorArea)
		out.Totals.PerFloorArea = &q
	}
	return out
}

func quantity(q loadpath.Quantity) protocol.Quantity {
	return protocol.Quantity{LoadPath: q.LoadPath, Volume: q.Volume, Mass: q.Mass, Carbon: q.Carbon}
}

func nonNil(x []float64) []float64 {
	if x == nil {
		return []float64{}
	}
	return x
}
