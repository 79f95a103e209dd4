package render

import (
	"bytes"
	"testing"
)

// TestCheckLabelsFindsDefects checks the checker on hand-made pictures:
// two texts at one point overlap; a text without a halo across a line is
// on it; a text on an arrowhead is on it; a text well clear of all is
// none of these.
func TestCheckLabelsFindsDefects(t *testing.T) {
	doc := `<svg xmlns="http://www.w3.org/2000/svg">
<line x1="0" y1="100" x2="200" y2="100" stroke-width="2"/>
<line x1="300" y1="0" x2="300" y2="50" stroke-width="2" marker-end="url(#arrow)"/>
<text x="50" y="50" class="label" text-anchor="middle">AB</text>
<text x="52" y="52" class="label" text-anchor="middle">CD</text>
<text x="100" y="104" class="small" text-anchor="middle">on line</text>
<text x="100" y="104" class="small label" text-anchor="middle" dy="40">x</text>
<text x="300" y="48" class="small label" text-anchor="middle">head</text>
<text x="500" y="300" class="small" text-anchor="middle">clear</text>
</svg>`
	rep, err := CheckLabels([]byte(doc))
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.TextOverlaps) != 2 || len(rep.UnhaloedOnLine) != 1 || len(rep.ArrowOverlaps) != 1 {
		t.Errorf("report %+v; want 2 text overlaps (CD on AB, x on 'on line'), 1 unhaloed on a line, 1 on an arrowhead", rep)
	}
}

// TestPicturesHaveNoLabelDefects draws every picture kind of this package
// on the Pratt truss and a chart, and counts label defects: none.
func TestPicturesHaveNoLabelDefects(t *testing.T) {
	m, axial, _ := pratt()
	disp := make([][]float64, m.NodeCount())
	for v := range disp {
		x := m.Coords[2*v]
		disp[v] = []float64{0, -0.001 * x * (16 - x) / 64}
	}
	pictures := map[string]func(*bytes.Buffer) error{
		"form":   func(b *bytes.Buffer) error { return Form(b, m, axial, Options{ForceLabels: true}) },
		"solved": func(b *bytes.Buffer) error { return Solved(b, m, disp, axial, Options{ForceLabels: true}) },
		"chart": func(b *bytes.Buffer) error {
			s := Series{Name: "load path at each step", X: []float64{1, 2, 3, 4}, Y: []float64{4, 2, 1.5, 3}}
			return Chart(b, ChartSpec{Title: "t", XLabel: "h (m)", YLabel: "load path (kN·m)", Series: []Series{s},
				Optimum: &[2]float64{3, 1.5}, OptimumLabel: "least 1.5 kN·m at 3 m"})
		},
	}
	for name, draw := range pictures {
		drawWithoutLabelDefects(t, name, draw)
	}
}

// drawWithoutLabelDefects draws a picture and fails t, naming it, when
// CheckLabels finds a label defect in it; it returns the picture.
func drawWithoutLabelDefects(t *testing.T, name string, draw func(*bytes.Buffer) error) *bytes.Buffer {
	t.Helper()
	var b bytes.Buffer
	if err := draw(&b); err != nil {
		t.Fatal(err)
	}
	rep, err := CheckLabels(b.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	if rep.Defects() != 0 {
		t.Errorf("%s: %d label defects: %v %v %v %v", name, rep.Defects(), rep.TextOverlaps, rep.ArrowOverlaps, rep.HingeOverlaps, rep.UnhaloedOnLine)
	}
	return &b
}
