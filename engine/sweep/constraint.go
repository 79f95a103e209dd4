package sweep

import (
	"fmt"
	"math"
)

// Constraint bounds one metric during refinement: a point is feasible when
// Min ≤ metric ≤ Max, a nil bound being absent.
type Constraint struct {
	Metric   string
	Min, Max *float64
}

// validateConstraints returns a *PlanError for the first malformed
// constraint.
func validateConstraints(cs []Constraint) error {
	for i, c := range cs {
		path := fmt.Sprintf("/constraints/%d", i)
		switch {
		case c.Metric == "":
			return &PlanError{Path: path + "/metric", Message: "constraint names no metric"}
		case c.Min == nil && c.Max == nil:
			return &PlanError{Path: path, Message: fmt.Sprintf("constraint on %q gives neither min nor max", c.Metric)}
		case c.Min != nil && !finite(*c.Min):
			return &PlanError{Path: path + "/min", Message: fmt.Sprintf("min of %q is not finite", c.Metric)}
		case c.Max != nil && !finite(*c.Max):
			return &PlanError{Path: path + "/max", Message: fmt.Sprintf("max of %q is not finite", c.Metric)}
		case c.Min != nil && c.Max != nil && *c.Min > *c.Max:
			return &PlanError{Path: path, Message: fmt.Sprintf("constraint on %q: min %g above max %g", c.Metric, *c.Min, *c.Max)}
		}
	}
	return nil
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// violated returns the indices of the constraints that metrics break; a
// missing metric breaks its constraint.
func violated(cs []Constraint, metrics map[string]float64) []int {
	var out []int
	for i, c := range cs {
		v, ok := metrics[c.Metric]
		if !ok || (c.Min != nil && v < *c.Min) || (c.Max != nil && v > *c.Max) {
			out = append(out, i)
		}
	}
	return out
}

// Describe returns the constraint as a sentence fragment ("critical_load_factor ≥ 3").
func (c Constraint) Describe() string {
	switch {
	case c.Min != nil && c.Max != nil:
		return fmt.Sprintf("%g ≤ %s ≤ %g", *c.Min, c.Metric, *c.Max)
	case c.Min != nil:
		return fmt.Sprintf("%s ≥ %g", c.Metric, *c.Min)
	}
	return fmt.Sprintf("%s ≤ %g", c.Metric, *c.Max)
}
