package statics_test

import (
	"context"
	"fmt"

	"gusset/engine/model"
	"gusset/engine/statics"
)

// ExampleAnalyse counts a square frame braced by both diagonals: one state
// of self-stress and no mechanism.
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
