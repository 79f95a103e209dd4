package sweep

import (
	"context"
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// twoMetrics reports the objective "f" and the constraint metric "g".
func twoMetrics(f, g func(x []float64) float64) Evaluator {
	return func(_ context.Context, x []float64) (map[string]float64, error) {
		return map[string]float64{"f": f(x), "g": g(x)}, nil
	}
}

func bound(x float64) *float64 { return &x }

// TestConstrainedLine checks 1-D refinement under a constraint: minimising
// (x − 3)² subject to x ≥ 4 has its optimum on the constraint's boundary,
// x = 4 (the Karush–Kuhn–Tucker conditions with the multiplier 2(4 − 3) >
// 0; common practice); subject to x ≤ 10 the constraint is slack and the
// optimum is x = 3; a maximisation of −(x − 3)² subject to g = x² ≤ 4
// stops at x = 2.
func TestConstrainedLine(t *testing.T) {
	sq := func(x []float64) float64 { return (x[0] - 3) * (x[0] - 3) }
	for _, tc := range []struct {
		name     string
		f, g     func(x []float64) float64
		c        Constraint
		maximise bool
		x        float64
		active   []int
	}{
		{"x ≥ 4 active", sq, func(x []float64) float64 { return x[0] }, Constraint{Metric: "g", Min: bound(4)}, false, 4, []int{0}},
		{"x ≤ 10 slack", sq, func(x []float64) float64 { return x[0] }, Constraint{Metric: "g", Max: bound(10)}, false, 3, nil},
		{"maximise, x² ≤ 4", func(x []float64) float64 { return -sq(x) }, func(x []float64) float64 { return x[0] * x[0] },
			Constraint{Metric: "g", Max: bound(4)}, true, 2, []int{0}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			values, _ := Range(0, 8, 9)
			plan := Plan{Axes: []Axis{{"x", values}}, Objective: "f", Maximise: tc.maximise, Tolerance: 1e-8,
				Constraints: []Constraint{tc.c}}
			res, err := Run(context.Background(), plan, twoMetrics(tc.f, tc.g), nil)
			if err != nil {
				t.Fatal(err)
			}
			r := res.Refinement
			if !scalar.EqualWithinAbsOrRel(r.Values[0], tc.x, 1e-6, 1e-6) || !r.Feasible || !slices.Equal(r.Active, tc.active) {
				t.Errorf("x = %g, feasible %v, active %v; want x = %g, active %v", r.Values[0], r.Feasible, r.Active, tc.x, tc.active)
			}
			if len(violated(plan.Constraints, r.Metrics)) > 0 {
				t.Errorf("the optimum breaks its constraint: %v", r.Metrics)
			}
		})
	}
}

// TestConstrainedPlane checks 2-D refinement: the point of the half-plane
// x + y ≥ 4 nearest (1, 2) is its projection onto the line, (1.5, 2.5)
// (common practice), with the constraint active.
func TestConstrainedPlane(t *testing.T) {
	values, _ := Range(0, 4, 9)
	plan := Plan{Axes: []Axis{{"x", values}, {"y", values}}, Objective: "f", Tolerance: 1e-8,
		Constraints: []Constraint{{Metric: "g", Min: bound(4)}}}
	f := func(x []float64) float64 { return (x[0]-1)*(x[0]-1) + (x[1]-2)*(x[1]-2) }
	g := func(x []float64) float64 { return x[0] + x[1] }
	res, err := Run(context.Background(), plan, twoMetrics(f, g), nil)
	if err != nil {
		t.Fatal(err)
	}
	r := res.Refinement
	if math.Hypot(r.Values[0]-1.5, r.Values[1]-2.5) > 1e-3 || !slices.Equal(r.Active, []int{0}) {
		t.Errorf("optimum %v active %v, want (1.5, 2.5) with the constraint active", r.Values, r.Active)
	}
}

// TestNoFeasibleStep checks that refinement says so when no step meets
// the constraints, and that malformed constraints are refused.
func TestNoFeasibleStep(t *testing.T) {
	values, _ := Range(0, 8, 9)
	plan := Plan{Axes: []Axis{{"x", values}}, Objective: "f", Constraints: []Constraint{{Metric: "g", Min: bound(100)}}}
	res, err := Run(context.Background(), plan, twoMetrics(func(x []float64) float64 { return x[0] }, func(x []float64) float64 { return x[0] }), nil)
	if err != nil {
		t.Fatal(err)
	}
	if r := res.Refinement; r.StartIndex != -1 || r.Message == "" || r.Feasible {
		t.Errorf("refinement %+v, want none with a message", r)
	}
	for _, c := range []Constraint{{Metric: "g"}, {Min: bound(1)}, {Metric: "g", Min: bound(2), Max: bound(1)}, {Metric: "g", Max: bound(math.Inf(1))}} {
		plan.Constraints = []Constraint{c}
		if err := plan.Validate(); err == nil {
			t.Errorf("constraint %+v accepted", c)
		}
	}
}
