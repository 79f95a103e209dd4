package sweep

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"strconv"
)

// ErrInvalidPlan is matched (with errors.Is) by every *PlanError.
var ErrInvalidPlan = errors.New("sweep: invalid plan")

// ErrTooManySteps is matched (with errors.Is) by the *PlanError returned
// when a plan has more steps than Plan.MaxSteps allows, so that a server
// can report it as a limit rather than as bad input.
var ErrTooManySteps = errors.New("sweep: too many steps")

// PlanError reports a defect in a Plan. Path is a JSON pointer relative to
// the plan, with field names in snake case ("/axes/0/values").
type PlanError struct {
	Path    string
	Message string
	limit   bool
}

// Error returns the message with its path.
func (e *PlanError) Error() string { return "sweep: " + e.Path + ": " + e.Message }

// Is reports whether target is ErrInvalidPlan, or ErrTooManySteps for a
// step-count error.
func (e *PlanError) Is(target error) bool {
	return target == ErrInvalidPlan || (e.limit && target == ErrTooManySteps)
}

// Axis is one swept parameter and the values it takes, in the order the
// steps visit them.
type Axis struct {
	Name   string
	Values []float64
}

// Range returns count values evenly spaced from from to to, both included
// (from alone when count is 1): from + i·(to − from)/(count − 1), each
// rounded to the shortest decimal within a few units in the last place.
// It returns a *PlanError when count < 1 or an end is not finite.
func Range(from, to float64, count int) ([]float64, error) {
	if count < 1 {
		return nil, &PlanError{Path: "/count", Message: fmt.Sprintf("a range needs at least one value, not %d", count)}
	}
	if math.IsNaN(from) || math.IsInf(from, 0) || math.IsNaN(to) || math.IsInf(to, 0) {
		return nil, &PlanError{Path: "/from", Message: fmt.Sprintf("range ends must be finite, not %g and %g", from, to)}
	}
	out := make([]float64, count)
	out[0] = from
	if count == 1 {
		return out, nil
	}
	step := (to - from) / float64(count-1)
	for i := 1; i < count-1; i++ {
		out[i] = shortDecimal(from + float64(i)*step)
	}
	out[count-1] = to
	return out, nil
}

// shortDecimal returns the double of the shortest decimal (fewest
// significant digits) within four units in the last place of v, so that
// a range step computed as 0.6000000000000001 reads 0.6; a v that no such
// decimal is near is returned as it is. Zero is returned positive.
func shortDecimal(v float64) float64 {
	if v == 0 {
		return 0
	}
	tolerance := 4 * (math.Nextafter(math.Abs(v), math.Inf(1)) - math.Abs(v))
	for digits := 1; digits <= 17; digits++ {
		r, err := strconv.ParseFloat(strconv.FormatFloat(v, 'g', digits, 64), 64)
		if err == nil && math.Abs(r-v) <= tolerance {
			return r
		}
	}
	return v
}

// Shard selects part of a sweep: the steps whose global index i satisfies
// i % Count == Index. Interleaving, rather than contiguous blocks, spreads
// the cost evenly when it varies smoothly along an axis. The zero value
// (Count 0) means the whole sweep.
type Shard struct {
	Index, Count int
}

// Bound limits the refinement along one axis to [Lower, Upper].
type Bound struct {
	Lower, Upper float64
}

// Plan describes a sweep. The zero values of the optional fields are valid
// and documented.
type Plan struct {
	// Axes holds one axis (a list of steps) or two (a grid: the step for
	// values Axes[0].Values[i] and Axes[1].Values[j] has index
	// i·len(Axes[1].Values) + j).
	Axes []Axis
	// Shard restricts the run to part of the steps; zero means all.
	Shard Shard
	// Workers is the number of steps evaluated at once; 0 means
	// runtime.GOMAXPROCS(0).
	Workers int
	// MaxSteps, when positive, is the most steps a plan may have (before
	// sharding).
	MaxSteps int

	// Objective names the metric to refine; "" means no refinement.
	// Refinement needs the whole sweep (no Shard).
	Objective string
	// Maximise refines to a maximum of the objective instead of a minimum.
	Maximise bool
	// Tolerance is the relative accuracy of the optimum's location: the
	// refinement stops when each coordinate is known within about
	// Tolerance·(|x| + 10⁻³·w), w being the width of the bounds along that
	// axis. Zero means 1e-6; values below 1e-8 act as 1e-8, the square
	// root of machine precision, below which a minimum cannot be located
	// by function values alone (Brent 1973, ch. 5).
	Tolerance float64
	// MaxEvaluations caps the refinement's evaluations; 0 means 100 in one
	// dimension and 400 in two.
	MaxEvaluations int
	// Bounds, one per axis, limit the refinement; nil means the range of
	// each axis's values.
	Bounds []Bound
	// Constraints bound metrics during refinement: it starts from the best
	// step that meets them all and minimises (or maximises) the objective
	// over the points that do (see Refinement.Active). The evaluator must
	// report each constraint's metric.
	Constraints []Constraint
}

// StepCount returns the number of steps in the whole sweep (all shards).
func (p *Plan) StepCount() int {
	n := 1
	for _, a := range p.Axes {
		n *= len(a.Values)
	}
	return n
}

// Validate returns a *PlanError for the first defect found in the plan.
func (p *Plan) Validate() error {
	if len(p.Axes) < 1 || len(p.Axes) > 2 {
		return &PlanError{Path: "/axes", Message: fmt.Sprintf("a sweep takes one or two parameters, not %d", len(p.Axes))}
	}
	for i, a := range p.Axes {
		if a.Name == "" {
			return &PlanError{Path: fmt.Sprintf("/axes/%d/name", i), Message: "parameter name is empty"}
		}
		if i == 1 && a.Name == p.Axes[0].Name {
			return &PlanError{Path: "/axes/1/name", Message: fmt.Sprintf("parameter %q is swept twice", a.Name)}
		}
		if len(a.Values) == 0 {
			return &PlanError{Path: fmt.Sprintf("/axes/%d/values", i), Message: fmt.Sprintf("parameter %q has no values to sweep", a.Name)}
		}
		for j, v := range a.Values {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &PlanError{Path: fmt.Sprintf("/axes/%d/values/%d", i, j), Message: fmt.Sprintf("value %g of %q is not finite", v, a.Name)}
			}
		}
	}
	total := 1
	for _, a := range p.Axes {
		if p.MaxSteps > 0 && total*len(a.Values) > p.MaxSteps {
			return &PlanError{Path: "/axes", limit: true,
				Message: fmt.Sprintf("the sweep has more than the %d steps allowed", p.MaxSteps)}
		}
		total *= len(a.Values)
	}
	if p.Shard.Count < 0 || p.Shard.Index < 0 || (p.Shard.Count > 0 && p.Shard.Index >= p.Shard.Count) ||
		(p.Shard.Count == 0 && p.Shard.Index != 0) {
		return &PlanError{Path: "/shard", Message: fmt.Sprintf("shard %d of %d: want 0 ≤ index < count", p.Shard.Index, p.Shard.Count)}
	}
	if p.Workers < 0 {
		return &PlanError{Path: "/workers", Message: fmt.Sprintf("workers must not be negative, not %d", p.Workers)}
	}
	if !(p.Tolerance >= 0 && p.Tolerance < 1) {
		return &PlanError{Path: "/tolerance", Message: fmt.Sprintf("tolerance must be in [0, 1), not %g", p.Tolerance)}
	}
	if p.MaxEvaluations < 0 {
		return &PlanError{Path: "/max_evaluations", Message: fmt.Sprintf("max evaluations must not be negative, not %d", p.MaxEvaluations)}
	}
	if p.Objective != "" && p.Shard.Count > 1 {
		return &PlanError{Path: "/objective", Message: "refinement needs the whole sweep: merge the shards, then refine"}
	}
	if err := validateConstraints(p.Constraints); err != nil {
		return err
	}
	if p.Bounds != nil {
		if len(p.Bounds) != len(p.Axes) {
			return &PlanError{Path: "/bounds", Message: fmt.Sprintf("%d bounds for %d parameters", len(p.Bounds), len(p.Axes))}
		}
		for i, b := range p.Bounds {
			if math.IsNaN(b.Lower) || math.IsInf(b.Lower, 0) || math.IsNaN(b.Upper) || math.IsInf(b.Upper, 0) || b.Lower > b.Upper {
				return &PlanError{Path: fmt.Sprintf("/bounds/%d", i), Message: fmt.Sprintf("bounds [%g, %g] of %q: want finite lower ≤ upper", b.Lower, b.Upper, p.Axes[i].Name)}
			}
		}
	}
	return nil
}

// stepIndices returns the global indices of the steps of the plan's shard,
// in increasing order.
func (p *Plan) stepIndices() []int {
	total, count := p.StepCount(), p.Shard.Count
	if count < 1 {
		count = 1
	}
	out := make([]int, 0, (total+count-1)/count)
	for i := p.Shard.Index; i < total; i += count {
		out = append(out, i)
	}
	return out
}

// valuesAt returns the parameter values of the step with global index i.
func (p *Plan) valuesAt(i int) []float64 {
	if len(p.Axes) == 1 {
		return []float64{p.Axes[0].Values[i]}
	}
	n := len(p.Axes[1].Values)
	return []float64{p.Axes[0].Values[i/n], p.Axes[1].Values[i%n]}
}

func (p *Plan) workers() int {
	if p.Workers > 0 {
		return p.Workers
	}
	return runtime.GOMAXPROCS(0)
}

func (p *Plan) tolerance() float64 {
	switch {
	case p.Tolerance == 0:
		return 1e-6
	case p.Tolerance < 1e-8:
		return 1e-8
	}
	return p.Tolerance
}

// bounds returns the refinement bounds of axis i.
func (p *Plan) bounds(i int) Bound {
	if p.Bounds != nil {
		return p.Bounds[i]
	}
	b := Bound{Lower: math.Inf(1), Upper: math.Inf(-1)}
	for _, v := range p.Axes[i].Values {
		b.Lower = math.Min(b.Lower, v)
		b.Upper = math.Max(b.Upper, v)
	}
	return b
}
