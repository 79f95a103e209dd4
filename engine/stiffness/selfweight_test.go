package stiffness

import (
	"context"
	"math"
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestSelfWeightWithoutDensity checks that a self-weight case over a
// material without weight_density says so with the material's pointer,
// and that the material with a density still loads its member: a bar of
// length 5 m, area 0.002 m² and density 77 kN/m³ weighs 0.77 kN, half of it
// lumped at each end (equivalent nodal loads of a uniform load, common
// practice), so the vertical reactions sum to 0.77 kN.
func TestSelfWeightWithoutDensity(t *testing.T) {
	density := model.Num(77)
	spec := &model.Spec{Dimension: 2,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(2.1e8), WeightDensity: &density},
			{ID: "timber", ElasticModulus: model.Num(1.1e7)}},
		Sections: []model.SectionSpec{{ID: "tube", Area: model.Num(0.002)}},
		Nodes: []model.NodeSpec{{ID: "A", At: []model.Value{model.Num(0), model.Num(0)}},
			{ID: "B", At: []model.Value{model.Num(8), model.Num(0)}}, {ID: "C", At: []model.Value{model.Num(4), model.Num(3)}}},
		Members: []model.MemberSpec{{ID: "AC", Ends: [2]string{"A", "C"}, Material: "steel", Section: "tube"},
			{ID: "BC", Ends: [2]string{"B", "C"}, Material: "timber", Section: "tube"}},
		Supports: []model.SupportSpec{{Node: "A", Fix: []string{"x", "y"}}, {Node: "B", Fix: []string{"x", "y"}}},
		LoadCases: []model.LoadCaseSpec{{ID: "dead", SelfWeight: true},
			{ID: "point", Loads: []model.NodalLoadSpec{{Node: "C", Force: []model.Value{model.Num(0), model.Num(-10)}}}}},
	}
	m, err := model.Compile(spec)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Solve(context.Background(), m, Options{Cases: []string{"dead"}})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(r.Warnings, "\n"), `material "timber" has no weight_density`) {
		t.Errorf("warnings %q do not name the material without density", r.Warnings)
	}
	found := false
	for _, p := range r.Unchecked {
		found = found || p.Path == "/materials/1/weight_density"
	}
	if !found {
		t.Errorf("unchecked %+v, want /materials/1/weight_density", r.Unchecked)
	}
	if got := r.Cases[0].ReactionSum[1]; math.Abs(got-0.77) > 1e-12 {
		t.Errorf("vertical reactions sum to %v, want 0.77", got)
	}
	r, err = Solve(context.Background(), m, Options{Cases: []string{"point"}})
	if err != nil {
		t.Fatal(err)
	}
	if strings.Contains(strings.Join(r.Warnings, "\n"), "weight_density") {
		t.Errorf("a case without self-weight warns: %q", r.Warnings)
	}
}
