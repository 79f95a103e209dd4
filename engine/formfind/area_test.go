package formfind

import (
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// TestAreaLoadsRefused checks that a case with area loads is refused with
// the pointer of its area loads: a panel's shares depend on the geometry
// form finding has yet to find, so spreading them over the given one
// would silently misplace the load.
func TestAreaLoadsRefused(t *testing.T) {
	m := &model.Model{Dim: 3, NodeIDs: []string{"A", "B", "C"}, Coords: []float64{0, 0, 0, 1, 0, 0, 0, 1, 0},
		Cases: []model.LoadCase{{ID: "snow", Areas: []model.AreaLoad{{Nodes: []int{0, 1, 2}, HasPressure: true, Pressure: 1}},
			Nodal: []model.NodalLoad{{Node: 0}, {Node: 1}, {Node: 2}}}}}
	_, err := newLoading(m, "snow", func(string, string, ...any) {})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.InvalidModel || fe.Problems[0].Path != "/model/load_cases/0/area_loads" {
		t.Fatalf("got %v, want an invalid model at /model/load_cases/0/area_loads", err)
	}
}
