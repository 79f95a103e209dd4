package sweep

import (
	"context"
	"fmt"
	"math"
	"sort"
	"strings"

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
	// failed, none reported the objective, or none met the constraints).
	Message string
	// Feasible reports that the optimum meets every constraint (always,
	// once refinement has started: only feasible points are kept).
	Feasible bool
	// Active lists the constraints (indices into Plan.Constraints) whose
	// boundary the optimum lies on: a step of four tolerances along an
	// axis towards a better objective breaks them. Empty when the optimum
	// is interior to the feasible region.
	Active []int
}

// refine finds the best successful step that meets the plan's
// constraints and refines it: Brent's method between its neighbours in one
// dimension, Nelder–Mead within the bounds in two. Failed evaluations and
// points that break a constraint count as infinitely bad, so that the
// search stays in the feasible region and converges onto its boundary when
// the optimum lies there; the constraints active at the end are then found
// by probing a step of four tolerances along each axis.
func refine(ctx context.Context, plan *Plan, eval Evaluator, steps []Step, rep progress.Recorder[Step]) (*Refinement, error) {
	r := newRefiner(ctx, plan, eval, rep)
	start := r.bestStep(steps)
	if start < 0 {
		r.ref.Message = r.noStartMessage(steps)
		return r.ref, nil
	}
	s := &steps[start]
	r.ref.StartIndex = s.Index
	r.ref.Values = append([]float64(nil), s.Values...)
	r.ref.Objective = s.Metrics[plan.Objective]
	r.ref.Metrics = s.Metrics
	r.ref.Converged, r.ref.Feasible = true, true
	r.bestF = r.sign * r.ref.Objective
	if len(plan.Axes) == 1 {
		r.line(s)
	} else {
		r.simplex(s)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	for i, x := range r.ref.Values {
		if x-r.bounds[i].Lower <= 2*r.tol(i, x) || r.bounds[i].Upper-x <= 2*r.tol(i, x) {
			r.ref.AtEdge = true
		}
	}
	if len(plan.Constraints) > 0 {
		r.findActive()
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	return r.ref, nil
}

// refiner holds the state of one refinement.
type refiner struct {
	ctx     context.Context
	plan    *Plan
	eval    Evaluator
	rep     progress.Recorder[Step]
	bounds  []Bound
	sign    float64 // −1 when maximising
	tau     float64
	maxEval int
	ref     *Refinement
	bestF   float64 // sign × the best feasible objective so far
}

func newRefiner(ctx context.Context, plan *Plan, eval Evaluator, rep progress.Recorder[Step]) *refiner {
	dim := len(plan.Axes)
	r := &refiner{ctx: ctx, plan: plan, eval: eval, rep: rep, sign: 1, tau: plan.tolerance() / 3,
		maxEval: plan.MaxEvaluations, bounds: make([]Bound, dim)}
	for i := range r.bounds {
		r.bounds[i] = plan.bounds(i)
	}
	if plan.Maximise {
		r.sign = -1
	}
	method := MethodBrent
	if dim == 2 {
		method = MethodNelderMead
	}
	if r.maxEval == 0 {
		r.maxEval = 100
		if dim == 2 {
			r.maxEval = 400
		}
	}
	r.ref = &Refinement{Method: method, StartIndex: -1}
	return r
}

// tol is the absolute accuracy wanted near x along axis i.
func (r *refiner) tol(i int, x float64) float64 {
	return r.tau * (math.Abs(x) + 1e-3*(r.bounds[i].Upper-r.bounds[i].Lower))
}

// bestStep returns the position in steps of the best successful step
// within the bounds that meets the constraints, or −1.
func (r *refiner) bestStep(steps []Step) int {
	obj := r.plan.Objective
	start := -1
	for k := range steps {
		s := &steps[k]
		v, ok := s.Metrics[obj]
		if s.Failed() || !ok || !inside(s.Values, r.bounds) || len(violated(r.plan.Constraints, s.Metrics)) > 0 {
			continue
		}
		if start < 0 || r.sign*v < r.sign*steps[start].Metrics[obj] {
			start = k
		}
	}
	return start
}

// noStartMessage says why no step could start the refinement.
func (r *refiner) noStartMessage(steps []Step) string {
	if len(r.plan.Constraints) > 0 {
		for k := range steps {
			if _, ok := steps[k].Metrics[r.plan.Objective]; ok && !steps[k].Failed() && inside(steps[k].Values, r.bounds) {
				var cs []string
				for _, c := range r.plan.Constraints {
					cs = append(cs, c.Describe())
				}
				return fmt.Sprintf("no successful step within the bounds meets the constraints (%s); widen the range or relax them", strings.Join(cs, ", "))
			}
		}
	}
	return fmt.Sprintf("no successful step within the bounds reports the objective %q", r.plan.Objective)
}

// evaluate calls the evaluator at x, checks its metrics and reports the
// point as a refining step.
func (r *refiner) evaluate(x []float64) ([]float64, map[string]float64, error) {
	values := append([]float64(nil), x...)
	metrics, err := r.eval(r.ctx, values)
	r.ref.Evaluations++
	step := Step{Index: -1, Values: values}
	if err == nil {
		err = checkMetrics(metrics)
	}
	if err == nil {
		if _, ok := metrics[r.plan.Objective]; !ok {
			err = fmt.Errorf("the evaluator did not report the objective %q", r.plan.Objective)
		}
	}
	if err != nil {
		step.Err, step.Message = err, err.Error()
	} else {
		step.Metrics = metrics
	}
	// Total 0 (unknown): the cap is a bound, not a forecast; Brent's
	// method usually stops far below it.
	r.rep.Record(StageRefining, r.ref.Evaluations, 0, step)
	return values, metrics, err
}

// f is the function the minimisers see: sign × the objective, +Inf where
// the evaluation fails or a constraint is broken. It keeps the best
// feasible point and reports stop once ctx is done.
func (r *refiner) f(x []float64) (float64, bool) {
	if r.ctx.Err() != nil {
		return math.Inf(1), true
	}
	values, metrics, err := r.evaluate(x)
	if err != nil || len(violated(r.plan.Constraints, metrics)) > 0 {
		return math.Inf(1), false
	}
	fx := r.sign * metrics[r.plan.Objective]
	if fx < r.bestF {
		r.bestF = fx
		r.ref.Values, r.ref.Objective, r.ref.Metrics = values, metrics[r.plan.Objective], metrics
	}
	return fx, false
}

// line runs Brent's method between the neighbours of the start step s.
func (r *refiner) line(s *Step) {
	lo, hi := bracket(r.plan.Axes[0].Values, s.Values[0], r.bounds[0])
	if lo < hi {
		res := brent(func(x float64) (float64, bool) { return r.f([]float64{x}) }, lo, hi, s.Values[0], r.bestF,
			func(x float64) float64 { return r.tol(0, x) }, r.maxEval)
		r.ref.Converged = res.converged
	}
}

// simplex runs Nelder–Mead from the start step s, the initial simplex
// reaching its nearer neighbour along each axis.
func (r *refiner) simplex(s *Step) {
	dim := len(r.plan.Axes)
	step := make([]float64, dim)
	lower, upper := make([]float64, dim), make([]float64, dim)
	for i := range step {
		lower[i], upper[i] = r.bounds[i].Lower, r.bounds[i].Upper
		lo, hi := bracket(r.plan.Axes[i].Values, s.Values[i], r.bounds[i])
		switch x := s.Values[i]; {
		case lo < x && (hi == x || x-lo <= hi-x):
			step[i] = x - lo
		case hi > x:
			step[i] = hi - x
		default:
			step[i] = (upper[i] - lower[i]) / 10
		}
	}
	res := nelderMead(r.f, s.Values, r.bestF, step, lower, upper, r.tol, r.maxEval)
	r.ref.Converged = res.converged
}

// findActive probes the optimum a step of four tolerances either way
// along each axis, within the bounds: the constraints broken at a probe
// whose objective is better are active (the optimum lies on their
// boundary). A probe that is feasible and better becomes the optimum.
func (r *refiner) findActive() {
	x0 := append([]float64(nil), r.ref.Values...)
	active := map[int]bool{}
	for i := range x0 {
		for _, dir := range []float64{-1, 1} {
			x := append([]float64(nil), x0...)
			x[i] += dir * 4 * r.tol(i, x0[i])
			if x[i] < r.bounds[i].Lower || x[i] > r.bounds[i].Upper || r.ctx.Err() != nil {
				continue
			}
			values, metrics, err := r.evaluate(x)
			if err != nil || r.sign*metrics[r.plan.Objective] >= r.bestF {
				continue
			}
			broken := violated(r.plan.Constraints, metrics)
			for _, k := range broken {
				active[k] = true
			}
			if len(broken) == 0 {
				r.bestF = r.sign * metrics[r.plan.Objective]
				r.ref.Values, r.ref.Objective, r.ref.Metrics = values, metrics[r.plan.Objective], metrics
			}
		}
	}
	for k := range r.plan.Constraints {
		if active[k] {
			r.ref.Active = append(r.ref.Active, k)
		}
	}
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
