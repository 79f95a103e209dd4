package sweep

import (
	"context"
	"errors"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestRange checks evenly spaced values: both ends exact, spacing
// (to − from)/(count − 1) (common practice, as in a linspace).
func TestRange(t *testing.T) {
	for _, tc := range []struct {
		from, to float64
		count    int
		want     []float64
	}{
		{0, 1, 5, []float64{0, 0.25, 0.5, 0.75, 1}},
		{2, -1, 4, []float64{2, 1, 0, -1}},
		{0.1, 0.7, 7, []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7}},
		{3, 9, 1, []float64{3}},
	} {
		got, err := Range(tc.from, tc.to, tc.count)
		if err != nil || len(got) != len(tc.want) {
			t.Fatalf("Range(%g, %g, %d) = %v, %v", tc.from, tc.to, tc.count, got, err)
		}
		for i := range got {
			if !scalar.EqualWithinAbsOrRel(got[i], tc.want[i], 1e-15, 1e-15) {
				t.Errorf("Range(%g, %g, %d)[%d] = %.17g, want %g", tc.from, tc.to, tc.count, i, got[i], tc.want[i])
			}
		}
		if got[len(got)-1] != tc.want[len(tc.want)-1] {
			t.Errorf("last value %.17g is not exactly %g", got[len(got)-1], tc.want[len(tc.want)-1])
		}
	}
	for _, count := range []int{0, -3} {
		if _, err := Range(0, 1, count); !errors.Is(err, ErrInvalidPlan) {
			t.Errorf("count %d: %v", count, err)
		}
	}
}

// TestBadPlan checks that each defective plan is refused with a pointer to
// the defect, before any evaluation.
func TestBadPlan(t *testing.T) {
	axis := Axis{Name: "depth", Values: []float64{1, 2, 3}}
	nan := 0.0
	nan /= nan
	for _, tc := range []struct {
		name  string
		plan  Plan
		path  string
		limit bool
	}{
		{"no axes", Plan{}, "/axes", false},
		{"three axes", Plan{Axes: []Axis{axis, {Name: "a", Values: []float64{1}}, {Name: "b", Values: []float64{1}}}}, "/axes", false},
		{"empty range", Plan{Axes: []Axis{{Name: "depth"}}}, "/axes/0/values", false},
		{"unnamed", Plan{Axes: []Axis{{Values: []float64{1}}}}, "/axes/0/name", false},
		{"same parameter twice", Plan{Axes: []Axis{axis, axis}}, "/axes/1/name", false},
		{"NaN value", Plan{Axes: []Axis{{Name: "depth", Values: []float64{1, nan}}}}, "/axes/0/values/1", false},
		{"too many steps", Plan{Axes: []Axis{axis, {Name: "rise", Values: []float64{1, 2}}}, MaxSteps: 5}, "/axes", true},
		{"shard index", Plan{Axes: []Axis{axis}, Shard: Shard{Index: 2, Count: 2}}, "/shard", false},
		{"shard count", Plan{Axes: []Axis{axis}, Shard: Shard{Index: 0, Count: -1}}, "/shard", false},
		{"negative workers", Plan{Axes: []Axis{axis}, Workers: -1}, "/workers", false},
		{"tolerance", Plan{Axes: []Axis{axis}, Tolerance: 2}, "/tolerance", false},
		{"max evaluations", Plan{Axes: []Axis{axis}, MaxEvaluations: -1}, "/max_evaluations", false},
		{"refining a shard", Plan{Axes: []Axis{axis}, Objective: "z", Shard: Shard{Index: 0, Count: 2}}, "/objective", false},
		{"bounds count", Plan{Axes: []Axis{axis}, Bounds: []Bound{{0, 1}, {0, 1}}}, "/bounds", false},
		{"inverted bounds", Plan{Axes: []Axis{axis}, Bounds: []Bound{{3, 1}}}, "/bounds/0", false},
	} {
		called := false
		eval := func(context.Context, []float64) (map[string]float64, error) { called = true; return nil, nil }
		_, err := Run(context.Background(), tc.plan, eval, nil)
		var pe *PlanError
		if !errors.As(err, &pe) || pe.Path != tc.path || !errors.Is(err, ErrInvalidPlan) || errors.Is(err, ErrTooManySteps) != tc.limit {
			t.Errorf("%s: got %v, want a plan error at %s (limit %v)", tc.name, err, tc.path, tc.limit)
		}
		if called {
			t.Errorf("%s: evaluated despite the bad plan", tc.name)
		}
	}
}
