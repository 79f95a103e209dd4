package sweep

import (
	"context"
	"fmt"
	"math"
	"sort"

	"gusset/engine/progress"
)

// Refinement methods.
const (
	MethodBrent      = "brent"
	MethodNelderMead = "nelder-mead"
)

// Refinement is the optimum of the plan's objective found from the best
// step of the sweep.
type Refinement struct {
	// Method is MethodBrent (one axis) or MethodNelderMead (two).
	Method string
	// StartIndex is the index of the best step, where refinement started;
	// −1 when no step could start it.
	StartIndex int
	// Values are the parameter values at the optimum found; nil when
	// Message says refinement could not run.
	Values []float64
	// Objective is the objective's value there.
	Objective float64
	// Metrics are all the evaluator's metrics there.
	Metrics map[string]float64
	// Evaluations counts the evaluator calls made by the refinement (the
	// sweep's own steps not included).
	Evaluations int
	// Converged reports whether the tolerance was met within
	// Plan.MaxEvaluations.
	Converged bool
	// AtEdge reports whether the optimum lies at a bound (within the
	// tolerance): the true optimum may then lie outside the range swept.
	AtEdge bool
	// Message is empty, or says why refinement could not run (every step
	// failed, or none reported the objective).
	Message string
}

// refine finds the best successful step and refines it: Brent's method
// between its neighbours in one dimension, Nelder–Mead within the bounds in
// two. Failed evaluations count as infinitely bad points.
func refine(ctx context.Context, plan *Plan, eval Evaluator, steps []Step, rep progress.Reporter) (*Refinement, error) {
	dim := len(plan.Axes)
	bounds := make([]Bound, dim)
	for i := range bounds {
		bounds[i] = plan.bounds(i)
	}
	sign := 1.0
	if plan.Maximise {
		sign = -1
	}
	obj := plan.Objective
	method := MethodBrent
	if dim == 2 {
		method = MethodNelderMead
	}
	ref := &Refinement{Method: method, StartIndex: -1}

	start := -1
	for k := range steps {
		s := &steps[k]
		v, ok := s.Metrics[obj]
		if s.Failed() || !ok || !inside(s.Values, bounds) {
			continue
		}
		if start < 0 || sign*v < sign*steps[start].Metrics[obj] {
			start = k
		}
	}
	if start < 0 {
		ref.Message = fmt.Sprintf("no successful step within the bounds reports the objective %q", obj)
		return ref, nil
	}
	s := &steps[start]
	ref.StartIndex = s.Index
	ref.Values = append([]float64(nil), s.Values...)
	ref.Objective = s.Metrics[obj]
	ref.Metrics = s.Metrics
	ref.Converged = true

	tau := plan.tolerance() / 3
	tol := func(i int, x float64) float64 {
		return tau * (math.Abs(x) + 1e-3*(bounds[i].Upper-bounds[i].Lower))
	}
	maxEval := plan.MaxEvaluations
	if maxEval == 0 {
		maxEval = 100
		if dim == 2 {
			maxEval = 400
		}
	}
	bestF := sign * ref.Objective
	f := func(x []float64) (float64, bool) {
		if ctx.Err() != nil {
			return math.Inf(1), true
		}
		values := append([]float64(nil), x...)
		metrics, err := eval(ctx, values)
		ref.Evaluations++
		step := Step{Index: -1, Values: values}
		if err == nil {
			err = checkMetrics(metrics)
		}
		if err == nil {
			if _, ok := metrics[obj]; !ok {
				err = fmt.Errorf("the evaluator did not report the objective %q", obj)
			}
		}
		if err != nil {
			step.Err, step.Message = err, err.Error()
		} else {
			step.Metrics = metrics
		}
		rep.Progress(StageRefining, ref.Evaluations, maxEval, step)
		if err != nil {
			return math.Inf(1), false
		}
		fx := sign * metrics[obj]
		if fx < bestF {
			bestF = fx
			ref.Values, ref.Objective, ref.Metrics = values, metrics[obj], metrics
		}
		return fx, false
	}

	if dim == 1 {
		lo, hi := bracket(plan.Axes[0].Values, s.Values[0], bounds[0])
		if lo < hi {
			r := brent(func(x float64) (float64, bool) { return f([]float64{x}) }, lo, hi, s.Values[0], bestF,
				func(x float64) float64 { return tol(0, x) }, maxEval)
			ref.Converged = r.converged
		}
	} else {
		step := make([]float64, dim)
		lower, upper := make([]float64, dim), make([]float64, dim)
		for i := range step {
			lower[i], upper[i] = bounds[i].Lower, bounds[i].Upper
			lo, hi := bracket(plan.Axes[i].Values, s.Values[i], bounds[i])
			switch x := s.Values[i]; {
			case lo < x && (hi == x || x-lo <= hi-x):
				step[i] = x - lo
			case hi > x:
				step[i] = hi - x
			default:
				step[i] = (upper[i] - lower[i]) / 10
			}
		}
		r := nelderMead(f, s.Values, bestF, step, lower, upper, tol, maxEval)
		ref.Converged = r.converged
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	for i, x := range ref.Values {
		if x-bounds[i].Lower <= 2*tol(i, x) || bounds[i].Upper-x <= 2*tol(i, x) {
			ref.AtEdge = true
		}
	}
	return ref, nil
}

// inside reports whether values lie within the bounds.
func inside(values []float64, bounds []Bound) bool {
	for i, v := range values {
		if v < bounds[i].Lower || v > bounds[i].Upper {
			return false
		}
	}
	return true
}

// bracket returns the nearest distinct axis values below and above x
// within the bound, or the bound's ends where there are none.
func bracket(values []float64, x float64, b Bound) (lo, hi float64) {
	sorted := append([]float64(nil), values...)
	sort.Float64s(sorted)
	lo, hi = b.Lower, b.Upper
	for _, v := range sorted {
		if v < x && v >= b.Lower {
			lo = v
		}
		if v > x && v <= b.Upper {
			hi = v
			break
		}
	}
	return lo, hi
}
