package sweep

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime/debug"
	"sort"
	"sync"
	"sync/atomic"

	"gusset/engine/progress"
)

// Evaluator computes named metrics at one point of a sweep: values holds
// one number per axis, in axis order. It must be safe for concurrent use,
// must not keep or modify values, and should return promptly with an error
// once ctx is done. An error makes the step fail (the sweep goes on); a
// non-finite metric fails the step too.
type Evaluator func(ctx context.Context, values []float64) (map[string]float64, error)

// Step is the outcome of one point of a sweep.
type Step struct {
	// Index is the step's global index (see Plan.Axes).
	Index int
	// Values are the parameter values, one per axis.
	Values []float64
	// Metrics are the evaluator's metrics; nil when the step failed.
	Metrics map[string]float64
	// Message is empty on success and says why the step failed otherwise.
	Message string
	// Err is the evaluator's error when the step failed (it may be a
	// *fault.Error carrying a kind and problems); it is not serialised.
	Err error `json:"-"`
}

// Failed reports whether the step failed.
func (s *Step) Failed() bool { return s.Message != "" }

// Result is the outcome of a sweep.
type Result struct {
	// Total is the number of steps of the whole sweep (all shards).
	Total int
	// Steps holds this shard's steps in increasing index order.
	Steps []Step
	// Failed counts the steps that failed.
	Failed int
	// Refinement is the refined optimum; nil when the plan has no
	// objective.
	Refinement *Refinement
}

// Stage names reported through the sweep's progress.Recorder.
const (
	StageStep     = "step"     // partial: a Step; done/total count this shard's steps
	StageRefining = "refining" // partial: a Step (Index −1); done counts evaluations, total is 0 (unknown)
)

// Run evaluates the plan's steps with plan.Workers goroutines and, when the
// plan names an objective, refines the best step (see Refinement).
//
// Each finished step goes at once to recorder.Record(StageStep, done,
// total, step) (a nil recorder drops them), calls being serialised so that done increases by one each
// time; the steps' order among themselves depends on scheduling, but
// Result.Steps is in index order and identical whatever the scheduling.
// A failing step is kept in its place with its reason. When ctx is done,
// no further step starts; Run waits for the steps in flight and returns
// ctx.Err(). A panic in the evaluator stops the sweep and is raised again
// in the caller's goroutine. Run returns a *PlanError for an invalid plan
// and panics if eval is nil.
func Run(ctx context.Context, plan Plan, eval Evaluator, recorder progress.Recorder[Step]) (*Result, error) {
	if eval == nil {
		panic("sweep: nil evaluator")
	}
	if err := plan.Validate(); err != nil {
		return nil, err
	}
	var rep progress.Recorder[Step] = progress.Drop[Step]{}
	if recorder != nil {
		rep = recorder
	}
	indices := plan.stepIndices()
	steps := make([]Step, len(indices))

	runCtx, stop := context.WithCancel(ctx)
	defer stop()
	var (
		next     atomic.Int64
		mu       sync.Mutex
		done     int
		panicMsg string
		wg       sync.WaitGroup
	)
	workers := min(plan.workers(), len(indices))
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for runCtx.Err() == nil {
				k := int(next.Add(1) - 1)
				if k >= len(indices) {
					return
				}
				step, msg := evaluate(runCtx, eval, indices[k], plan.valuesAt(indices[k]))
				if msg != "" {
					mu.Lock()
					if panicMsg == "" {
						panicMsg = msg
					}
					mu.Unlock()
					stop()
					return
				}
				if step.Failed() && runCtx.Err() != nil {
					return // cut short by cancellation: not a result
				}
				steps[k] = step
				mu.Lock()
				done++
				rep.Record(StageStep, done, len(indices), step)
				mu.Unlock()
			}
		}()
	}
	wg.Wait()
	if panicMsg != "" {
		panic(panicMsg)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	res := &Result{Total: plan.StepCount(), Steps: steps}
	for i := range steps {
		if steps[i].Failed() {
			res.Failed++
		}
	}
	if plan.Objective != "" {
		ref, err := refine(ctx, &plan, eval, steps, rep)
		if err != nil {
			return nil, err
		}
		res.Refinement = ref
	}
	return res, nil
}

// evaluate runs one step. A panic in the evaluator is caught and returned
// as panicMsg so that Run can raise it on the caller's goroutine.
func evaluate(ctx context.Context, eval Evaluator, index int, values []float64) (step Step, panicMsg string) {
	step = Step{Index: index, Values: values}
	defer func() {
		if r := recover(); r != nil {
			panicMsg = fmt.Sprintf("sweep: evaluator panicked at step %d (values %v): %v\n%s", index, values, r, debug.Stack())
		}
	}()
	metrics, err := eval(ctx, append([]float64(nil), values...))
	if err != nil {
		step.Err, step.Message = err, err.Error()
		if step.Message == "" {
			step.Message = "evaluation failed"
		}
		return step, ""
	}
	if err := checkMetrics(metrics); err != nil {
		step.Err, step.Message = err, err.Error()
		return step, ""
	}
	step.Metrics = metrics
	return step, ""
}

// errNotFinite is wrapped by the error of a step whose metric is NaN or
// infinite.
var errNotFinite = errors.New("metric is not finite")

func checkMetrics(metrics map[string]float64) error {
	var bad []string
	for name, v := range metrics {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			bad = append(bad, name)
		}
	}
	if len(bad) == 0 {
		return nil
	}
	sort.Strings(bad)
	return fmt.Errorf("%w: %q", errNotFinite, bad)
}
