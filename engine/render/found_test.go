package render

import (
	"bytes"
	"encoding/xml"
	"io"
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestFoundForm3D draws a small 3D net with a member in tension and one in
// compression and checks that the picture is well-formed XML with both
// views, both line styles, the fixed nodes and the caution.
func TestFoundForm3D(t *testing.T) {
	num := func(xs ...float64) []model.Value {
		out := make([]model.Value, len(xs))
		for i, x := range xs {
			out[i] = model.Num(x)
		}
		return out
	}
	spec := &model.Spec{Dimension: 3,
		Materials: []model.MaterialSpec{{ID: "s", ElasticModulus: model.Num(1)}},
		Sections:  []model.SectionSpec{{ID: "a", Area: model.Num(1)}},
		Nodes:     []model.NodeSpec{{ID: "A", At: num(0, 0, 0)}, {ID: "B", At: num(1, 0.5, -1)}, {ID: "C", At: num(2, 1, 0)}},
		Members: []model.MemberSpec{{ID: "AB", Ends: [2]string{"A", "B"}, Material: "s", Section: "a"},
			{ID: "BC", Ends: [2]string{"B", "C"}, Material: "s", Section: "a"}},
		Supports: []model.SupportSpec{{Node: "A", Fix: []string{"x", "y", "z"}}, {Node: "C", Fix: []string{"x", "y", "z"}}},
	}
	m, err := model.Compile(spec)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := FoundForm(&buf, m, []float64{3, -2}, Options{}); err != nil {
		t.Fatal(err)
	}
	svg := buf.String()
	for _, want := range []string{"Plan (x, y)", "Elevation (x, z)", `class="tension"`, `class="compression"`, `class="support"`, Caution} {
		if !strings.Contains(svg, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
	dec := xml.NewDecoder(&buf)
	for {
		if _, err := dec.Token(); err == io.EOF {
			break
		} else if err != nil {
			t.Fatalf("not well-formed: %v", err)
		}
	}
}
