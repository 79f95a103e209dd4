package adapter

import (
	"context"
	"errors"
	"fmt"
	"slices"

	"gusset/engine/progress"
	"gusset/engine/sweep"
	"gusset/protocol"
)

// sweep runs the parameter sweep of the request's model.
func (a *Adapter) sweep(ctx context.Context, r *request[protocol.SweepParams]) (*protocol.SweepResult, error) {
	p, m, st := r.Params, r.Model, r.Stream
	plan := sweep.Plan{Workers: a.Limits.Workers, MaxSteps: a.Limits.MaxSweepSteps}
	names := make([]string, len(p.Parameters))
	var warnings []protocol.Problem
	for i, axis := range p.Parameters {
		values, err := axisValues(axis, fmt.Sprintf("/params/parameters/%d", i))
		if err != nil {
			return nil, err
		}
		if m.ParamIndex(axis.Name) < 0 {
			return nil, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
				fmt.Sprintf("The model has no parameter %q; its parameters are %q.", axis.Name, m.ParamNames),
				protocol.Problem{Path: fmt.Sprintf("/params/parameters/%d/name", i), Message: "not a model parameter"})
		}
		if !m.ParamUsed(m.ParamIndex(axis.Name)) {
			warnings = append(warnings, protocol.Problem{Path: fmt.Sprintf("/params/parameters/%d/name", i),
				Message: fmt.Sprintf("no expression of the model reads parameter %q, so every step along this axis is the same model and a refinement along it finds nothing; write it into a coordinate, load, section or material expression", axis.Name)})
		}
		names[i] = axis.Name
		plan.Axes = append(plan.Axes, sweep.Axis{Name: axis.Name, Values: values})
	}
	if p.Shard != nil {
		plan.Shard = sweep.Shard{Index: p.Shard.Index, Count: p.Shard.Count}
	}
	if p.Objective != nil {
		plan.Objective = p.Objective.Metric
		plan.Maximise = p.Objective.Goal == "maximise"
		plan.Tolerance = p.Objective.Tolerance
	}
	if n := plan.StepCount(); n > a.Limits.MaxSweepSteps {
		return nil, protocol.NewError(protocol.CodeLimitExceeded, "limit exceeded",
			fmt.Sprintf("The sweep has %d steps, more than the limit of %d. Use fewer values, shards, or start the server with a larger --max-sweep-steps.", n, a.Limits.MaxSweepSteps),
			protocol.Problem{Path: "/params/parameters", Message: fmt.Sprintf("%d steps; the limit is %d", n, a.Limits.MaxSweepSteps)})
	}
	opt, err := sizingOptions(p.Sizing, "/params/sizing")
	if err != nil {
		return nil, err
	}
	objective := ""
	if p.Objective != nil {
		objective = p.Objective.Metric
	}
	metrics := sweep.Metrics(m, p.Metrics, p.Sizing != nil, objective)
	for _, c := range p.Constraints {
		plan.Constraints = append(plan.Constraints, sweep.Constraint{Metric: c.Metric, Min: c.Min, Max: c.Max})
		if !slices.Contains(metrics, c.Metric) {
			metrics = append(metrics, c.Metric)
		}
	}
	solver := sweep.StiffnessSolverFor(m, p.Cases, metrics)
	eval, err := sweep.ModelEvaluatorModal(m, names, metrics, solver, opt, sweep.Modal{Cases: p.Cases})
	if err != nil {
		return nil, sweepError(err)
	}
	res, err := sweep.Run(ctx, plan, eval, stepReporter{st})
	if err != nil {
		return nil, sweepError(err)
	}
	out := &protocol.SweepResult{Parameters: names, Total: res.Total, Failed: res.Failed, Best: -1, Steps: []protocol.SweepStep{}, Caution: Caution,
		Warnings: warnings}
	if p.Steps != "summary" {
		for _, s := range res.Steps {
			out.Steps = append(out.Steps, wireStep(s))
		}
	}
	if r := res.Refinement; r != nil {
		out.Best = r.StartIndex
		out.Refinement = &protocol.Refinement{Method: r.Method, StartIndex: r.StartIndex, Values: r.Values, Objective: r.Objective,
			Metrics: r.Metrics, Evaluations: r.Evaluations, Converged: r.Converged, AtEdge: r.AtEdge, Message: r.Message,
			Feasible: r.Feasible, ActiveConstraints: append([]int{}, r.Active...)}
		if out.Refinement.Values == nil {
			out.Refinement.Values = []float64{}
		}
		if out.Refinement.Metrics == nil {
			out.Refinement.Metrics = map[string]float64{}
		}
	}
	return out, nil
}

// stepReporter streams each step the sweep records in its wire form.
type stepReporter struct{ st progress.Reporter }

// Record sends the step as the partial result of a progress notification.
func (r stepReporter) Record(stage string, done, total int, s sweep.Step) {
	r.st.Progress(stage, done, total, wireStep(s))
}

func wireStep(s sweep.Step) protocol.SweepStep {
	out := protocol.SweepStep{Index: s.Index, Values: s.Values, Metrics: s.Metrics, Error: s.Message}
	if out.Metrics == nil {
		out.Metrics = map[string]float64{}
	}
	return out
}

// axisValues turns explicit values or a range into the axis's values.
func axisValues(axis protocol.SweepAxis, pointer string) ([]float64, error) {
	bad := func(msg string) error {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", msg, protocol.Problem{Path: pointer, Message: msg})
	}
	switch {
	case len(axis.Values) > 0 && (axis.From != nil || axis.To != nil || axis.Count != 0):
		return nil, bad("Give either values or a range (from, to, count) for a swept parameter, not both.")
	case len(axis.Values) > 0:
		return axis.Values, nil
	case axis.From == nil:
		return nil, bad("A swept parameter needs values, or a range: from, to and count.")
	case axis.Count == 1 && axis.To == nil:
		return []float64{*axis.From}, nil
	case axis.To == nil || axis.Count < 2:
		return nil, bad("A range needs from, to and a count of at least 2 (or from alone with count 1).")
	}
	values, err := sweep.Range(*axis.From, *axis.To, axis.Count)
	if err != nil {
		return nil, bad(err.Error())
	}
	return values, nil
}

// sweepError maps the sweep's plan errors to the wire.
func sweepError(err error) error {
	var pe *sweep.PlanError
	if errors.As(err, &pe) {
		code, kind := protocol.CodeInvalidParams, "invalid params"
		if errors.Is(err, sweep.ErrTooManySteps) {
			code, kind = protocol.CodeLimitExceeded, "limit exceeded"
		}
		path := "/params" + pe.Path
		if len(pe.Path) > 5 && pe.Path[:5] == "/axes" {
			path = "/params/parameters" + pe.Path[5:]
		}
		return protocol.NewError(code, kind, pe.Message+".", protocol.Problem{Path: path, Message: pe.Message})
	}
	return at("/params/model", err)
}
