package render

import (
	"bytes"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestSolved2D draws the Pratt truss with a made-up sag (the picture only
// draws what it is given) and checks the drawing's parts: the undeformed
// members dotted beneath, the deflected members by the sense of pratt's
// forces (by the method of joints, see pratt), the magnification stated and within 4–8% of the model's size for the
// largest displacement, supports, legend and caution.
func TestSolved2D(t *testing.T) {
	m, axial, _ := pratt()
	disp := make([][]float64, m.NodeCount())
	for v := range disp {
		x := m.Coords[2*v]
		disp[v] = []float64{0, -0.001 * x * (16 - x) / 64} // largest 1 mm at mid-span
	}
	var buf bytes.Buffer
	if err := Solved(&buf, m, disp, axial, Options{ForceLabels: true}); err != nil {
		t.Fatal(err)
	}
	text := parseSVG(t, buf.Bytes())
	for _, want := range []string{"Deflected shape", Caution, "Tension", "Compression", "Largest displacement 0.001 m", "-26.7"} {
		if !strings.Contains(text, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
	doc := buf.String()
	tension, compression := 0, 0
	for _, a := range axial {
		if a > 1e-9 {
			tension++
		} else if a < -1e-9 {
			compression++
		}
	}
	// Legend lines add one of each class; the undeformed members add
	// len(members) zero-class lines.
	if got := strings.Count(doc, `class="tension"`); got != tension+1 {
		t.Errorf("%d tension lines, want %d members + legend", got, tension)
	}
	if got := strings.Count(doc, `class="compression"`); got != compression+1 {
		t.Errorf("%d compression lines, want %d members + legend", got, compression)
	}
	if got := strings.Count(doc, `class="zero"`); got < len(m.Members) {
		t.Errorf("%d dotted lines, want the %d undeformed members at least", got, len(m.Members))
	}
	if strings.Count(doc, `class="support"`) != 2 {
		t.Error("want two support symbols")
	}
	mag := regexp.MustCompile(`×([0-9.e+]+)`).FindStringSubmatch(text)
	if mag == nil {
		t.Fatal("magnification not stated")
	}
	k, _ := strconv.ParseFloat(mag[1], 64)
	if drawn := k * 0.001 / 16; drawn < 0.03 || drawn > 0.08 {
		t.Errorf("largest displacement drawn at %.3f of the span, want 0.03–0.08", drawn)
	}
}

// TestSolved3D draws a tripod in 3D: three panels (isometric, plan,
// elevation).
func TestSolved3D(t *testing.T) {
	m := &model.Model{Dim: 3, Units: model.UnitsSpec{Length: "m", Force: "kN"}}
	for i, p := range [][3]float64{{0, 0, 0}, {4, 0, 0}, {2, 3.46, 0}, {2, 1.15, 3}} {
		m.NodeIDs = append(m.NodeIDs, strconv.Itoa(i))
		m.Coords = append(m.Coords, p[:]...)
	}
	for i := range 3 {
		m.Members = append(m.Members, model.Member{ID: "leg" + strconv.Itoa(i), Ends: [2]int{i, 3}})
		m.Supports = append(m.Supports, model.Support{Node: i, Fixed: [6]bool{true, true, true}})
	}
	disp := [][]float64{{0, 0, 0}, {0, 0, 0}, {0, 0, 0}, {0, 0, -0.002}}
	var buf bytes.Buffer
	if err := Solved(&buf, m, disp, []float64{-3, -3, -3}, Options{}); err != nil {
		t.Fatal(err)
	}
	text := parseSVG(t, buf.Bytes())
	for _, want := range []string{"Axonometric view", "Plan", "Elevation", Caution} {
		if !strings.Contains(text, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
	if got := strings.Count(buf.String(), `class="compression"`); got != 3*3+1 {
		t.Errorf("%d compression lines, want 3 legs in 3 views + legend", got)
	}
}
