package reciprocal_test

import (
	"context"
	"fmt"
	"math"

	"gusset/engine/model"
	"gusset/engine/reciprocal"
)

// The 3-4-5 roof truss: span 8 m, rise 3 m, 12 kN at the apex, reactions
// 6 kN; by the method of joints the rafters carry −10 kN and the tie 8 kN
// (common practice). The force diagram's segments have those lengths.
func ExampleBuild() {
	m := &model.Model{
		Dim:     2,
		NodeIDs: []string{"left", "right", "apex"},
		Coords:  []float64{0, 0, 8, 0, 4, 3},
		Members: []model.Member{
			{ID: "tie", Ends: [2]int{0, 1}},
			{ID: "left rafter", Ends: [2]int{0, 2}},
			{ID: "right rafter", Ends: [2]int{1, 2}},
		},
	}
	d, err := reciprocal.Build(context.Background(), reciprocal.Input{
		Model:      m,
		AxialForce: []float64{8, -10, -10},
		External:   [][2]float64{{0, 6}, {0, 6}, {0, -12}},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range d.Members {
		p, q := d.Points[s.Left], d.Points[s.Right]
		fmt.Printf("%-12s %s %4.1f kN %v\n", m.Members[s.Index].ID, s.Label, math.Hypot(q[0]-p[0], q[1]-p[1]), s.Sense)
	}
	for _, f := range d.Forces {
		fmt.Printf("at %-5s %s %4.1f kN\n", m.NodeIDs[f.Node], f.Label, f.Force)
	}
	// Output:
	// tie          C-1  8.0 kN tension
	// left rafter  A-1 10.0 kN compression
	// right rafter B-1 10.0 kN compression
	// at left  C-A  6.0 kN
	// at apex  A-B 12.0 kN
	// at right B-C  6.0 kN
}
