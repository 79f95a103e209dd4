package model_test

import (
	"fmt"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// ExampleModel_WithParameters changes a member's rise: from (0, 0) to
// (4, 3) it is √(16 + 9) = 5 long, to (4, 7.5) √(16 + 56.25) = 8.5
// (Pythagoras, derived by hand).
func ExampleModel_WithParameters() {
	spec := &model.Spec{
		Dimension:  2,
		Parameters: []model.ParameterSpec{{Name: "depth", Value: 3}},
		Materials:  []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(2.1e8)}},
		Sections:   []model.SectionSpec{{ID: "tube", Area: model.Num(2e-3)}},
		Nodes: []model.NodeSpec{
			{ID: "A", At: []model.Value{model.Num(0), model.Num(0)}},
			{ID: "B", At: []model.Value{model.Num(4), model.Expr("depth")}},
		},
		Members: []model.MemberSpec{{ID: "AB", Ends: [2]string{"A", "B"}, Material: "steel", Section: "tube"}},
	}
	m, err := model.Compile(spec)
	if err != nil {
		fmt.Println(err)
		return
	}
	deeper, err := m.WithParameters(map[string]float64{"depth": 7.5})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(m.Length(0), deeper.Length(0))

	spec.Members[0].Ends[1] = "A"
	_, err = model.Compile(spec)
	if fe, ok := fault.As(err); ok {
		for _, p := range fe.Problems {
			fmt.Printf("%v at %s: %s\n", fe.Kind, p.Path, p.Message)
		}
	}
	// Output:
	// 5 8.5
	// invalid model at members/0/ends/1: member "AB" has zero length: both ends are at node "A"
}
