package sweep

import (
	"context"
	"fmt"
	"math"
	"testing"

	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// strut returns a pinned-pinned 2D beam column of height "L" (a
// parameter) in eight elements under P = 1 kN at its head: E = 2.1e8, I =
// 1e-5, A = 1e-2, mass density 7.85.
func strut() *model.Model {
	mass := model.Num(7.85)
	i := model.Num(1e-5)
	spec := &model.Spec{Dimension: 2, Parameters: []model.ParameterSpec{{Name: "L", Value: 5}},
		Materials: []model.MaterialSpec{{ID: "s", ElasticModulus: model.Num(2.1e8), MassDensity: &mass}},
		Sections:  []model.SectionSpec{{ID: "c", Area: model.Num(1e-2), SecondMoment: &i}},
		LoadCases: []model.LoadCaseSpec{{ID: "P", Loads: []model.NodalLoadSpec{{Node: "n8", Force: []model.Value{model.Num(0), model.Num(-1)}}}}},
		Supports:  []model.SupportSpec{{Node: "n0", Fix: []string{"x", "y"}}, {Node: "n8", Fix: []string{"x"}}}}
	for k := range 9 {
		spec.Nodes = append(spec.Nodes, model.NodeSpec{ID: fmt.Sprintf("n%d", k), At: []model.Value{model.Num(0), model.Expr(fmt.Sprintf("L*%d/8", k))}})
		if k > 0 {
			spec.Members = append(spec.Members, model.MemberSpec{ID: fmt.Sprintf("m%d", k), Ends: [2]string{fmt.Sprintf("n%d", k-1), fmt.Sprintf("n%d", k)},
				Material: "s", Section: "c", Type: "beam"})
		}
	}
	m, err := model.Compile(spec)
	if err != nil {
		panic(err)
	}
	return m
}

// TestModalMetrics checks the modal metrics of a sweep over a strut's
// length against Euler's load π²EI/L² (Timoshenko and Gere, Theory of
// Elastic Stability, 1961, §2.1; from memory) and the first frequency of
// a simply supported beam (π²/(2π))·√(EI/(ρA·L⁴)) (Blevins, Formulas for
// Natural Frequency and Mode Shape, 1979, Table 8-1; from memory), and
// that a constraint critical_load_factor ≥ 1000 with the objective "the
// longest strut" stops at Euler's length √(π²EI/1000).
func TestModalMetrics(t *testing.T) {
	m := strut()
	solve := func(ctx context.Context, mm *model.Model) (*Solution, error) { return &Solution{}, nil }
	eval, err := ModelEvaluatorModal(m, []string{"L"}, []string{MetricCriticalLoadFactor, MetricFirstFrequency}, solve, loadpath.Options{}, Modal{})
	if err != nil {
		t.Fatal(err)
	}
	const ei = 2.1e8 * 1e-5
	values, _ := Range(3, 8, 6)
	plan := Plan{Axes: []Axis{{"L", values}}, Objective: MetricCriticalLoadFactor, Maximise: false, Tolerance: 1e-9,
		Constraints: []Constraint{{Metric: MetricCriticalLoadFactor, Min: bound(1000)}}}
	res, err := Run(context.Background(), plan, eval, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range res.Steps {
		L := s.Values[0]
		euler := math.Pi * math.Pi * ei / (L * L)
		freq := math.Pi / 2 * math.Sqrt(ei/(7.85*1e-2*L*L*L*L))
		if rel := math.Abs(s.Metrics[MetricCriticalLoadFactor]-euler) / euler; rel > 1e-4 {
			t.Errorf("L = %g: factor %g, Euler %g", L, s.Metrics[MetricCriticalLoadFactor], euler)
		}
		if rel := math.Abs(s.Metrics[MetricFirstFrequency]-freq) / freq; rel > 1e-4 {
			t.Errorf("L = %g: %g Hz, Blevins %g Hz", L, s.Metrics[MetricFirstFrequency], freq)
		}
	}
	r := res.Refinement
	if r.Values == nil {
		t.Fatalf("no refinement: %s (steps %+v)", r.Message, res.Steps)
	}
	// Minimising the factor subject to factor ≥ 1000 puts the optimum on
	// the constraint's boundary: the longest strut with that factor.
	want := math.Sqrt(math.Pi * math.Pi * ei / 1000)
	if math.Abs(r.Values[0]-want)/want > 1e-4 || len(r.Active) != 1 {
		t.Errorf("constrained optimum L = %g (active %v), want about %g with the constraint active", r.Values[0], r.Active, want)
	}
}
