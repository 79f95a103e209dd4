package statics_test

import (
	"context"
	"fmt"

	"gusset/engine/model"
	"gusset/engine/statics"
)

// ExampleAnalyse counts a square frame braced by both diagonals: one state
// of self-stress and no mechanism: Maxwell's rule b − d·j + k with b = 6
// bars, j = 4 joints, k = 3 constraints gives 6 − 8 + 3 = 1 = s − m (J. C.
// Maxwell, Phil. Mag. 27, 1864, from memory), and by inspection the square
// with one diagonal is already stiff, so m = 0 and s = 1.
func ExampleAnalyse() {
	m := &model.Model{
		Dim:     2,
		NodeIDs: []string{"a", "b", "c", "d"},
		Coords:  []float64{0, 0, 1, 0, 1, 1, 0, 1},
		Members: []model.Member{
			{ID: "ab", Ends: [2]int{0, 1}}, {ID: "bc", Ends: [2]int{1, 2}},
			{ID: "cd", Ends: [2]int{2, 3}}, {ID: "da", Ends: [2]int{3, 0}},
			{ID: "ac", Ends: [2]int{0, 2}}, {ID: "bd", Ends: [2]int{1, 3}},
		},
		Supports: []model.Support{
			{Node: 0, Fixed: [6]bool{model.X: true, model.Y: true}},
			{Node: 1, Fixed: [6]bool{model.Y: true}},
		},
	}
	r, err := statics.Analyse(context.Background(), m, statics.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("b − dj + k = %d, s = %d, m = %d\n", r.MaxwellNumber, r.SelfStress, r.Mechanisms)
	// Output:
	// b − dj + k = 1, s = 1, m = 0
}
