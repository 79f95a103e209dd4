package reciprocal

import (
	"context"
	"strings"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// TestBeamsNameTheCause checks that a portal frame of beams whose axial
// forces cannot balance its loads fails saying that beams carry shear and
// bending, with the beams' pointers, rather than suggesting a mechanism:
// with a sideways load of 10 at B, the beam BC in compression 10 and the
// columns unloaded (an axial-only reading), C is left 10 out of balance by
// hand; the frame carries the load by bending, which a diagram of axial
// forces cannot show. A reciprocal figure pairs one segment with each
// pin-jointed member (Maxwell, "On reciprocal figures and diagrams of
// forces", Phil. Mag. 27, 1864).
func TestBeamsNameTheCause(t *testing.T) {
	node := func(id string, x, y float64) model.NodeSpec {
		return model.NodeSpec{ID: id, At: []model.Value{model.Num(x), model.Num(y)}}
	}
	beam := func(id, a, b string) model.MemberSpec {
		return model.MemberSpec{ID: id, Ends: [2]string{a, b}, Material: "steel", Section: "ibeam", Type: "beam"}
	}
	second := model.Num(8e-5)
	m, err := model.Compile(&model.Spec{Dimension: 2,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(2.1e8)}},
		Sections:  []model.SectionSpec{{ID: "ibeam", Area: model.Num(5e-3), SecondMoment: &second}},
		Nodes:     []model.NodeSpec{node("A", 0, 0), node("B", 0, 4), node("C", 6, 4), node("D", 6, 0)},
		Members:   []model.MemberSpec{beam("AB", "A", "B"), beam("BC", "B", "C"), beam("CD", "C", "D")},
		Supports:  []model.SupportSpec{{Node: "A", Fix: []string{"x", "y", "rz"}}, {Node: "D", Fix: []string{"x", "y", "rz"}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	external := [][2]float64{{-5, 0}, {10, 0}, {0, 0}, {-5, 0}}
	_, err = Build(context.Background(), Input{Model: m, AxialForce: []float64{0, -10, 0}, External: external})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.NotInEquilibrium {
		t.Fatalf("got %v, want not in equilibrium", err)
	}
	if !strings.Contains(fe.Message, "shear and bending") || strings.Contains(fe.Message, "mechanism") {
		t.Errorf("message %q does not name the beams' shear and bending as the cause", fe.Message)
	}
	if len(fe.Problems) == 0 || !strings.HasSuffix(fe.Problems[0].Path, "/type") {
		t.Errorf("problems %+v, want the beams' types", fe.Problems)
	}
}
