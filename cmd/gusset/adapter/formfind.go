package adapter

import (
	"bytes"
	"context"

	"gusset/engine/formfind"
	"gusset/engine/progress"
	"gusset/engine/render"
	"gusset/protocol"
)

// findForm finds the equilibrium form of the request's network by the
// force density method and returns it with the model of the found form.
func (a *Adapter) findForm(ctx context.Context, r *request[protocol.FindFormParams]) (*protocol.FindFormResult, error) {
	p := r.Params
	problem := formfind.Problem{Case: p.Case}
	if p.ForceDensity != nil {
		v := value(*p.ForceDensity)
		problem.ForceDensity = &v
	}
	if p.ForceDensities != nil {
		problem.ForceDensities = values(p.ForceDensities)
	}
	if p.Through != nil {
		problem.Through = &formfind.Through{Node: p.Through.Node, At: p.Through.At}
	}
	for _, t := range p.Targets {
		problem.Targets = append(problem.Targets, formfind.Target{Member: t.Member, Length: t.Length, Force: t.Force})
	}
	res, err := formfind.Find(ctx, r.Model, problem, formfind.Options{MaxIterations: p.MaxIterations, Tolerance: p.Tolerance,
		Reporter: r.Stream, Iterations: formIterations{r.Stream}})
	if err != nil {
		return nil, at("/params", err)
	}
	lp, err := res.LoadPath()
	if err != nil {
		return nil, at("/params/model", err)
	}
	ready := res.Ready(r.Spec)
	out := formResult(res, ready)
	out.LoadPath = protocol.FormLoadPath{LoadPath: lp.LoadPath, TensionLoadPath: lp.TensionLoadPath,
		CompressionLoadPath: lp.CompressionLoadPath, Constant: lp.Constant, RelativeResidual: lp.RelativeResidual}
	if p.Picture {
		var svg bytes.Buffer
		if err := render.FoundForm(&svg, res.Model(), res.Force, render.Options{}); err != nil {
			return nil, err
		}
		out.Picture = svg.String()
	}
	return out, nil
}

// formResult converts a found form and its ready model.
func formResult(res *formfind.Result, ready *formfind.Ready) *protocol.FindFormResult {
	m := res.Model()
	d := res.Dim
	out := &protocol.FindFormResult{Case: res.Case, Coordinates: make([][]float64, m.NodeCount()),
		ForceDensities: res.ForceDensity, Forces: res.Force, Lengths: res.Length, Reactions: []protocol.FormReaction{},
		Network: "tension", Residual: res.Residual, Scale: res.Scale, ThroughMisfit: res.ThroughMisfit,
		Targets: []protocol.FormTargetResult{}, Iterations: res.Iterations, Change: res.Change, Converged: res.Converged,
		Model: *WireModel(ready.Spec), ModelCase: ready.Case, RiseParameter: ready.Parameter, Sized: ready.Sized, Warnings: []protocol.Problem{},
		Stats: protocol.FormStats{FreeNodes: res.FreeNodes, Nonzeros: res.Nonzeros}, Caution: Caution}
	if res.Sign < 0 {
		out.Network = "compression"
	}
	for i := range out.Coordinates {
		out.Coordinates[i] = res.Coords[i*d : (i+1)*d]
		if res.Fixed[i] {
			out.Reactions = append(out.Reactions, protocol.FormReaction{Node: m.NodeIDs[i], Force: res.Reactions[i]})
		}
	}
	for _, t := range res.Targets {
		kind := "force"
		if t.Length {
			kind = "length"
		}
		out.Targets = append(out.Targets, protocol.FormTargetResult{Member: m.Members[t.Member].ID, Kind: kind,
			Target: t.Target, Achieved: t.Achieved, Misfit: t.Misfit})
	}
	for _, w := range append(res.Warnings, ready.Warnings...) {
		out.Warnings = append(out.Warnings, protocol.Problem{Path: "/params" + w.Path, Message: w.Message})
	}
	return out
}

// formIterations passes the iterations on as partial results to the
// request's stream.
type formIterations struct{ st progress.Reporter }

func (r formIterations) Record(stage string, done, total int, it formfind.Iteration) {
	r.st.Progress(stage, done, total, map[string]any{"iteration": it.Iteration, "change": it.Change, "misfit": it.Misfit})
}
