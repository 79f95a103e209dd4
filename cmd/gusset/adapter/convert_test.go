package adapter

import (
	"math/rand/v2"
	"reflect"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// TestSpecOfInvertsWireModel converts generated models to the wire form
// and back (WireModel, then specOf) and checks that the engine's input is
// what it was, field for field: the conversion drops, shares or moves
// nothing (nodes' coordinates share one array, members are written in
// place).
func TestSpecOfInvertsWireModel(t *testing.T) {
	specs := map[string]*model.Spec{
		"grid":   modelgen.GridTruss2D(7, 5),
		"space":  modelgen.SpaceTruss3D(4, 3),
		"frame":  modelgen.Frame2D(3, 2),
		"frame3": modelgen.Frame3D(2, 2, 2),
		"pratt":  modelgen.Pratt(6, 12, 2, 10),
		"random": modelgen.RandomPlanarTruss(rand.New(rand.NewPCG(3, 4)), 30),
	}
	for name, spec := range specs {
		got := specOf(WireModel(spec))
		if !reflect.DeepEqual(got.Nodes, spec.Nodes) {
			t.Errorf("%s: nodes differ", name)
		}
		if !reflect.DeepEqual(got.Members, spec.Members) {
			t.Errorf("%s: members differ:\n%+v\n%+v", name, got.Members[0], spec.Members[0])
		}
		a, errA := model.Compile(spec)
		b, errB := model.Compile(got)
		if errA != nil || errB != nil || !reflect.DeepEqual(a, b) {
			t.Errorf("%s: compiled models differ (%v, %v)", name, errA, errB)
		}
	}
}
