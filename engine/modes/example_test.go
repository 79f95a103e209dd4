package modes_test

import (
	"context"
	"fmt"

	"gusset/engine/model"
	"gusset/engine/modes"
)

// A rigid strut of length 4 m pinned at its foot, its head held sideways
// by a spring of 50 kN/m and carrying 10 kN and a mass of 2 t: it buckles
// at λ = k·L/P = 20 and sways at ω = √(k/M) = 5 rad/s (single-freedom
// closed forms).
func Example() {
	mass := 2.0
	spec := &model.Spec{Dimension: 2,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(2.1e8)}},
		Sections:  []model.SectionSpec{{ID: "rod", Area: model.Num(0.002)}},
		Nodes: []model.NodeSpec{{ID: "A", At: []model.Value{model.Num(0), model.Num(0)}},
			{ID: "B", At: []model.Value{model.Num(0), model.Num(4)}, Mass: &mass}},
		Members:   []model.MemberSpec{{ID: "AB", Ends: [2]string{"A", "B"}, Material: "steel", Section: "rod"}},
		Supports:  []model.SupportSpec{{Node: "A", Fix: []string{"x", "y"}}, {Node: "B", Springs: map[string]float64{"x": 50}}},
		LoadCases: []model.LoadCaseSpec{{ID: "down", Loads: []model.NodalLoadSpec{{Node: "B", Force: []model.Value{model.Num(0), model.Num(-10)}}}}},
	}
	m, err := model.Compile(spec)
	if err != nil {
		fmt.Println(err)
		return
	}
	b, err := modes.Buckling(context.Background(), m, modes.Options{Count: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	v, err := modes.Vibration(context.Background(), m, modes.Options{Count: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("critical load factor %.4f\n", b.Critical)
	fmt.Printf("first mode %.4f rad/s, %.4f Hz, effective mass %.4f t\n", v.Modes[0].Angular, v.Modes[0].Frequency, v.Modes[0].EffectiveMass[0])
	// Output:
	// critical load factor 20.0000
	// first mode 5.0000 rad/s, 0.7958 Hz, effective mass 2.0000 t
}
