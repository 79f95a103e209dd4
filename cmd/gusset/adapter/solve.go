package adapter

import (
	"context"
	"errors"
	"fmt"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/stiffness"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// solve runs the stiffness analysis of the request's model.
func (a *Adapter) solve(ctx context.Context, r *request[protocol.SolveParams]) (*protocol.SolveResult, error) {
	plan, err := planEnvelope(r.Model, r.Params)
	if err != nil {
		return nil, err
	}
	res, err := a.analyseWith(ctx, r.Model, stiffness.Options{Cases: plan.solve, Reporter: r.Stream, Stations: stationOption(r.Params.Stations),
		Fold: plan.fold(), SecondOrder: secondOrderOption(r.Params.SecondOrder)})
	if err != nil {
		return nil, err
	}
	env := plan.finish(r.Model, res)
	out := solveResult(r.Model, res)
	out.Envelope = env
	for _, w := range r.Warnings {
		out.Warnings = append(out.Warnings, w.Path+": "+w.Message)
	}
	if r.Params.Picture && len(res.Cases) > 0 {
		if out.Picture, err = solvePicture(r.Model, res); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// analyse runs the stiffness solve and locates its errors in the request.
func (a *Adapter) analyse(ctx context.Context, m *model.Model, cases []string, st jsonrpc.Stream) (*stiffness.Result, error) {
	return a.analyseWith(ctx, m, stiffness.Options{Cases: cases, Reporter: st})
}

// analyseWith is analyse with the solver's options.
func (a *Adapter) analyseWith(ctx context.Context, m *model.Model, opt stiffness.Options) (*stiffness.Result, error) {
	// Workers 0 lets one large solve use every core; results are
	// bit-identical for any number of workers, and with several requests in
	// flight the Go scheduler shares the cores among their goroutines.
	r, err := stiffness.Solve(ctx, m, opt)
	if err == nil {
		return r, nil
	}
	if fe, ok := fault.As(err); ok {
		switch fe.Kind {
		case fault.UnknownCase:
			return nil, located("/params", fe)
		case fault.Unstable:
			e := located("/params/model", fe)
			var mech *stiffness.Mechanism
			if mm, ok := fe.Detail.(*stiffness.Mechanism); ok {
				mech = mm
			}
			e.Data.Detail = mechanismOf(mech)
			return nil, e
		}
		return nil, located("/params/model", fe)
	}
	if errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) {
		return nil, err
	}
	return nil, err
}

func mechanismOf(m *stiffness.Mechanism) *protocol.Mechanism {
	if m == nil {
		return nil
	}
	out := &protocol.Mechanism{Freedoms: []protocol.Freedom{}, Modes: []protocol.Mode{}}
	for _, f := range m.Freedoms {
		out.Freedoms = append(out.Freedoms, protocol.Freedom{Node: f.Node, Component: f.Component})
	}
	for _, mode := range m.Modes {
		out.Modes = append(out.Modes, protocol.Mode{Translations: finiteRows(mode.Translations), Rotations: finiteRows(mode.Rotations)})
	}
	return out
}

// finiteRows replaces nil rows by empty ones so they encode as [] and not
// null.
func finiteRows(rows [][]float64) [][]float64 {
	out := make([][]float64, len(rows))
	for i, r := range rows {
		if r == nil {
			r = []float64{}
		}
		out[i] = r
	}
	return out
}

func solveResult(m *model.Model, r *stiffness.Result) *protocol.SolveResult {
	out := &protocol.SolveResult{
		Cases:    make([]protocol.CaseResult, len(r.Cases)),
		Warnings: r.Warnings,
		Stats: protocol.SolveStats{Solver: string(r.Stats.Path), Freedoms: r.Stats.Freedoms, Equations: r.Stats.Equations,
			NonzerosStiffness: r.Stats.NonzerosK, NonzerosFactor: r.Stats.NonzerosFactor},
		Caution: Caution,
	}
	if out.Warnings == nil {
		out.Warnings = []string{}
	}
	out.Unchecked = uncheckedWire(r.Unchecked)
	if s := r.Stability; s != nil {
		out.Stability = protocol.Stability{Joints: s.Joints, Bars: s.Bars, Beams: s.Beams, Constraints: s.Constraints,
			MaxwellNumber: s.MaxwellNumber, Computed: s.Computed, Rank: s.Rank, SelfStress: s.SelfStress, Mechanisms: s.Mechanisms}
		out.Stability.Rule = maxwellRule(m, s.Bars, s.Beams, s.Joints, s.Constraints, s.MaxwellNumber, s.Computed, s.SelfStress, s.Mechanisms)
	}
	for i, c := range r.Cases {
		kind := "case"
		if c.Combination {
			kind = "combination"
		}
		cr := protocol.CaseResult{ID: c.ID, Kind: kind, Displacements: c.Displacements, Rotations: finiteRows(c.Rotations),
			AxialForces: c.AxialForce, EndForces: c.EndForces, Stresses: c.Stress, Residual: c.Residual, BalanceError: c.BalanceError}
		cr.Reactions = make([]protocol.Reaction, len(c.Reactions))
		for j, re := range c.Reactions {
			cr.Reactions[j] = protocol.Reaction{Node: m.NodeIDs[m.Supports[j].Node], Force: re.Force, Moment: re.Moment,
				LocalForce: re.LocalForce, LocalMoment: re.LocalMoment}
		}
		caseSummaries(m, &r.Cases[i], &cr)
		cr.Iteration = iterationWire(m, c.Iteration)
		out.Cases[i] = cr
	}
	return out
}

// maxwellRule writes the counting rule with the model's numbers.
func maxwellRule(m *model.Model, bars, beams, joints, constraints, number int, computed bool, s, mech int) string {
	var rule string
	if beams == 0 {
		rule = fmt.Sprintf("b − d·j + k = s − m: %d − %d·%d + %d = %d", bars, m.Dim, joints, constraints, number)
	} else {
		rule = fmt.Sprintf("independent member forces − free freedoms = s − m: %d", number)
	}
	if computed {
		rule += fmt.Sprintf(" (s = %d, m = %d)", s, mech)
	} else {
		rule += " (s and m not computed: the model is above the size limit of the rank computation)"
	}
	return rule
}
