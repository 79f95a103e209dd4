package adapter

import (
	"context"
	"errors"
	"fmt"

	"gusset/engine/fault"
	"gusset/engine/loadpath"
	"gusset/engine/model"
	"gusset/protocol"
)

// loadPath computes the load path and quantities of the request's model.
func (a *Adapter) loadPath(ctx context.Context, r *request[protocol.LoadPathParams]) (*protocol.LoadPathResult, error) {
	p, m, st := r.Params, r.Model, r.Stream
	var cases []loadpath.Case
	var caveats []string
	if p.Forces != nil {
		c, err := givenForces(m, p.Forces, p.Cases)
		if err != nil {
			return nil, err
		}
		cases = []loadpath.Case{c}
	} else {
		r, err := a.analyse(ctx, m, p.Cases, st)
		if err != nil {
			return nil, err
		}
		cases = loadpath.Solved(r)
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

// givenForces builds the case of given member forces
// (loadpath.GivenForces) with the nodal loads of the load case ids[0]
// names, or of the model's first case.
func givenForces(m *model.Model, forces []float64, ids []string) (loadpath.Case, error) {
	k := -1
	if len(ids) > 0 {
		if k = m.CaseIndex(ids[0]); k < 0 {
			return loadpath.Case{}, protocol.NewError(fault.UnknownCase.Code(), fault.UnknownCase.String(), fmt.Sprintf("There is no load case %q.", ids[0]),
				protocol.Problem{Path: "/params/cases/0", Message: "no such load case"})
		}
	} else if len(m.Cases) > 0 {
		k = 0
	}
	c, err := loadpath.GivenForces(m, forces, k)
	if err != nil {
		return c, loadPathError(err)
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
