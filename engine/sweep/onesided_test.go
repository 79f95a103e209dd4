package sweep

import (
	"context"
	"math"
	"testing"

	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// bracedPanelSpec is an X-braced panel b = 4 m wide and h (a parameter)
// high, A and B pinned, H = 12 kN along +x at D; the diagonals AC (a
// cable) and BD (a tension-only bar) are one-sided.
func bracedPanelSpec() *model.Spec {
	mem := func(id, a, b, typ, behaviour string) model.MemberSpec {
		return model.MemberSpec{ID: id, Ends: [2]string{a, b}, Material: "steel", Section: "rod", Type: typ, Behaviour: behaviour}
	}
	return &model.Spec{
		Dimension:  2,
		Parameters: []model.ParameterSpec{{Name: "h", Value: 3}},
		Materials:  []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(2e8)}},
		Sections:   []model.SectionSpec{{ID: "rod", Area: model.Num(1e-3)}},
		Nodes: []model.NodeSpec{
			{ID: "A", At: []model.Value{model.Num(0), model.Num(0)}},
			{ID: "B", At: []model.Value{model.Num(4), model.Num(0)}},
			{ID: "C", At: []model.Value{model.Num(4), model.Expr("h")}},
			{ID: "D", At: []model.Value{model.Num(0), model.Expr("h")}},
		},
		Members: []model.MemberSpec{mem("AD", "A", "D", "", ""), mem("BC", "B", "C", "", ""), mem("DC", "D", "C", "", ""),
			mem("AC", "A", "C", "cable", ""), mem("BD", "B", "D", "", "tension-only")},
		Supports:  []model.SupportSpec{{Node: "A", Fix: []string{"x", "y"}}, {Node: "B", Fix: []string{"x", "y"}}},
		LoadCases: []model.LoadCaseSpec{{ID: "wind", Loads: []model.NodalLoadSpec{{Node: "D", Force: []model.Value{model.Num(12), model.Num(0)}}}}},
	}
}

// TestSweepUsesConvergedForces checks that a sweep's solver and the load
// path it computes use the active-set forces: with BD slack the panel is
// determinate, and joint equilibrium by hand (derived in
// engine/stiffness/activeset_test.go) gives N_AC = H·d/b over d, N_DC = −H
// over b and N_BC = −H·h/b over h, so the load path is
// Z = H·(d² + b² + h²)/b = 2H·(b² + h²)/b (150 kN·m at h = 3), where the
// two-way panel would share the shear between both diagonals.
func TestSweepUsesConvergedForces(t *testing.T) {
	const b, H = 4.0, 12.0
	m, err := model.Compile(bracedPanelSpec())
	if err != nil {
		t.Fatal(err)
	}
	solve := StiffnessSolver(m, nil)
	eval, err := ModelEvaluator(m, []string{"h"}, []string{MetricLoadPath}, solve, loadpath.Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, h := range []float64{3, 5} {
		mm, err := m.WithParameters(map[string]float64{"h": h})
		if err != nil {
			t.Fatal(err)
		}
		sol, err := solve(context.Background(), mm)
		if err != nil {
			t.Fatal(err)
		}
		d := math.Hypot(b, h)
		want := []float64{0, -H * h / b, -H, H * d / b, 0}
		for e, got := range sol.Cases[0].AxialForce {
			if math.Abs(got-want[e]) > 1e-9*H {
				t.Errorf("h=%g member %d: N = %g, want %g", h, e, got, want[e])
			}
		}
		metrics, err := eval(context.Background(), []float64{h})
		if err != nil {
			t.Fatal(err)
		}
		if z := 2 * H * (b*b + h*h) / b; math.Abs(metrics[MetricLoadPath]-z) > 1e-9*z {
			t.Errorf("h=%g: load path %g, want %g", h, metrics[MetricLoadPath], z)
		}
	}
}
