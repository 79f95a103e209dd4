package stiffness_test

import (
	"context"
	"fmt"

	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// The symmetric two-bar truss: pins 2 m either side of the apex, which is
// 1.5 m up and carries 10 kN downward; steel bars of 1000 mm². By the
// apex's vertical equilibrium each 2.5 m bar carries N = −P·L/(2h) =
// −10·2.5/3 = −8.3333 kN, the pins react with 5 kN up and 6.6667 kN
// inward, and by the unit-load method the apex drops
// P·L³/(2h²·E·A) = 10·2.5³/(2·1.5²·2.1e8·1e-3) = 0.16534 mm (hand
// statics; e.g. Hibbeler, Structural Analysis, ch. 9, from memory).
func ExampleSolve() {
	num := model.Num
	m, err := model.Compile(&model.Spec{
		Dimension: 2,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: num(2.1e8)}},
		Sections:  []model.SectionSpec{{ID: "bar", Area: num(1e-3)}},
		Nodes: []model.NodeSpec{
			{ID: "left", At: []model.Value{num(-2), num(0)}},
			{ID: "right", At: []model.Value{num(2), num(0)}},
			{ID: "apex", At: []model.Value{num(0), num(1.5)}},
		},
		Members: []model.MemberSpec{
			{ID: "l", Ends: [2]string{"left", "apex"}, Material: "steel", Section: "bar"},
			{ID: "r", Ends: [2]string{"right", "apex"}, Material: "steel", Section: "bar"},
		},
		Supports: []model.SupportSpec{{Node: "left", Fix: []string{"x", "y"}}, {Node: "right", Fix: []string{"x", "y"}}},
		LoadCases: []model.LoadCaseSpec{{ID: "P", Loads: []model.NodalLoadSpec{
			{Node: "apex", Force: []model.Value{num(0), num(-10)}}}}},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := stiffness.Solve(context.Background(), m, stiffness.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	c := r.Cases[0]
	fmt.Printf("axial forces %.4f, %.4f kN\n", c.AxialForce[0], c.AxialForce[1])
	fmt.Printf("left pin reacts with (%.4f, %.4f) kN\n", c.Reactions[0].Force[0], c.Reactions[0].Force[1])
	fmt.Printf("apex moves %.5f mm down\n", -c.Displacements[2][1]*1000)
	// Output:
	// axial forces -8.3333, -8.3333 kN
	// left pin reacts with (6.6667, 5.0000) kN
	// apex moves 0.16534 mm down
}
