package render

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestModeBeamCurve checks the curve drawn along a beam against the
// deflection of a cantilever under a tip load, v(x) = P·x²·(3L − x)/(6EI),
// scaled to a tip deflection of 1 (tip slope 3/(2L)), whose value at
// mid-span is 5/16 (J. M. Gere and S. P. Timoshenko, "Mechanics of
// Materials", 1997, Table G-1; from memory): a cubic, which the Hermite
// interpolation reproduces exactly.
func TestModeBeamCurve(t *testing.T) {
	const L = 4.0
	m := &model.Model{Dim: 2, NodeIDs: []string{"a", "b"}, Coords: []float64{0, 0, L, 0},
		Members:  []model.Member{{ID: "ab", Ends: [2]int{0, 1}, Kind: model.Beam}},
		Supports: []model.Support{{Node: 0, Fixed: [6]bool{true, true, false, false, false, true}}}}
	shape := ModeShape{Displacements: [][]float64{{0, 0}, {0, 1}}, Rotations: [][]float64{{0}, {1.5 / L}},
		Heading: "Test mode 1", Notes: []string{"a note"}}
	pts := modeMemberPoints(m, 0, shape, 1)
	mid := pts[len(pts)/2]
	if math.Abs(mid[0]-L/2) > 1e-12 || math.Abs(mid[1]-5.0/16) > 1e-12 {
		t.Errorf("mid-span point %v, want (%g, %g)", mid, L/2, 5.0/16)
	}
	var svg bytes.Buffer
	if err := Mode(&svg, m, shape, Options{}); err != nil {
		t.Fatal(err)
	}
	out := svg.String()
	for _, want := range []string{"Test mode 1", "a note", Caution, DeflectedColour, "<polyline"} {
		if !strings.Contains(out, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
}
