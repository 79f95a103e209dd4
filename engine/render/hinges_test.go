package render

import (
	"bytes"
	"encoding/xml"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"

	"gusset/engine/model"
)

// drawnMarks reads, in document order, the members drawn in ink (the
// moment panels' members, one line each) and the hinge marks' centres of
// a picture.
func drawnMarks(t *testing.T, svg []byte) (members [][4]float64, hinges [][2]float64) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(svg))
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			return members, hinges
		}
		if err != nil {
			t.Fatalf("not well-formed: %v", err)
		}
		el, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		attrs := map[string]string{}
		for _, a := range el.Attr {
			attrs[a.Name.Local] = a.Value
		}
		f := func(name string) float64 {
			v, err := strconv.ParseFloat(attrs[name], 64)
			if err != nil {
				t.Fatalf("%s's %s: %v", el.Name.Local, name, err)
			}
			return v
		}
		switch {
		case el.Name.Local == "line" && attrs["stroke"] == InkColour:
			members = append(members, [4]float64{f("x1"), f("y1"), f("x2"), f("y2")})
		case el.Name.Local == "circle" && attrs["class"] == "hinge":
			hinges = append(hinges, [2]float64{f("cx"), f("cy")})
		}
	}
}

// markAt reports whether the hinge mark h sits at the first end of the
// member drawn as the segment s: on the segment (within half a pixel),
// inside the member and no further from that end than a mark's diameter.
func markAt(h [2]float64, s [4]float64) bool {
	dx, dy := s[2]-s[0], s[3]-s[1]
	l := math.Hypot(dx, dy)
	along := ((h[0]-s[0])*dx + (h[1]-s[1])*dy) / l
	across := math.Abs((h[0]-s[0])*dy-(h[1]-s[1])*dx) / l
	return across < 0.5 && along > 0 && along <= 2*hingeRadius
}

// reversed is the segment s drawn from its second end.
func reversed(s [4]float64) [4]float64 { return [4]float64{s[2], s[3], s[0], s[1]} }

// TestBeamsMarkHinges draws a plane frame whose beam is released at the
// knee: a column fixed at its base A (0, 0) up to the knee B (0, 4), and
// a beam from B to C (6, 4) on a roller, released in bending at B (the
// model's releases say so), under 10 kN/m. By statics the beam is simply
// supported between the hinge and the roller, M = wx(L − x)/2 with
// wL²/8 = 45 kN·m, and the column carries wL/2 axially and no moment
// (common practice; the column's shortening is left out of the drawn
// deflection, v = wx(L³ − 2Lx² + x³)/24EI, Roark, Table 8.1 case 2e, from
// memory). The picture must mark the beam's end at B with one open
// circle, and neither the column's end there nor the beam's other end;
// the caption must explain the mark, and no label may touch it. The same
// frame without the release has no mark and no note.
func TestBeamsMarkHinges(t *testing.T) {
	const l, w, ei = 6.0, 10.0, 21000.0
	frame := func(released bool) *model.Model {
		m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"},
			NodeIDs: []string{"A", "B", "C"}, Coords: []float64{0, 0, 0, 4, l, 4},
			Members: []model.Member{{ID: "column", Ends: [2]int{0, 1}, Kind: model.Beam},
				{ID: "beam", Ends: [2]int{1, 2}, Kind: model.Beam}},
			Supports: []model.Support{{Node: 0, Fixed: [6]bool{true, true, false, false, false, true}}, {Node: 2, Fixed: [6]bool{false, true}}}}
		if released {
			m.Members[1].Releases[0] = model.ReleaseBit(model.RZ)
		}
		return m
	}
	column := BeamCurve{Member: 0}
	beam := BeamCurve{Member: 1, PeakMoment: [2]float64{w * l * l / 8, l / 2}, PeakDisplacement: [2]float64{5 * w * l * l * l * l / (384 * ei), l / 2}}
	for k := range 11 {
		x := l * float64(k) / 10
		column.Stations = append(column.Stations, 0.4*float64(k))
		column.Moment = append(column.Moment, 0)
		column.Displacements = append(column.Displacements, []float64{0, 0})
		beam.Stations = append(beam.Stations, x)
		beam.Moment = append(beam.Moment, w*x*(l-x)/2)
		beam.Displacements = append(beam.Displacements, []float64{0, -w * x * (l*l*l - 2*l*x*x + x*x*x) / (24 * ei)})
	}
	draw := func(m *model.Model) []byte {
		var buf bytes.Buffer
		if err := Beams(&buf, m, [][]float64{{0, 0}, {0, 0}, {0, 0}}, []BeamCurve{column, beam}, Options{}); err != nil {
			t.Fatal(err)
		}
		return buf.Bytes()
	}
	svg := draw(frame(true))
	members, hinges := drawnMarks(t, svg)
	if len(members) != 2 || len(hinges) != 1 {
		t.Fatalf("%d members drawn in ink and %d hinge marks; want 2 and 1", len(members), len(hinges))
	}
	if !markAt(hinges[0], members[1]) {
		t.Errorf("hinge mark at %v is not at the beam's end B (beam drawn %v)", hinges[0], members[1])
	}
	if markAt(hinges[0], reversed(members[0])) || markAt(hinges[0], reversed(members[1])) {
		t.Errorf("hinge mark at %v sits on the column's end or at the beam's other end", hinges[0])
	}
	if !strings.Contains(string(svg), hingeNote) {
		t.Error("the caption does not explain the hinge mark")
	}
	if rep, err := CheckLabels(svg); err != nil || rep.Defects() != 0 || rep.Hinges != 1 {
		t.Errorf("label report %+v (%v); want 1 hinge and no defects", rep, err)
	}
	svg = draw(frame(false))
	if _, hinges := drawnMarks(t, svg); len(hinges) != 0 || strings.Contains(string(svg), hingeNote) {
		t.Errorf("frame without releases: %d hinge marks, note %v; want none", len(hinges), strings.Contains(string(svg), hingeNote))
	}
}

// TestBeams3DMarkHinges draws a space frame: a column from its fixed base
// G (0, 0, −3) up to A (0, 0, 0), and a beam from A to B (5, 0, 0), fixed
// at B, released about its local z at A and about its local y at B (the
// model's releases), under 10 kN/m along −z (along its local −y, so
// bending about local z). About z the beam is a propped cantilever:
// Mz = 3wLx/8 − wx²/2 from the prop, −wL²/8 at the fixed end, deflection
// wx(L³ − 3Lx² + 2x³)/48EI (Roark, propped cantilever under uniform load,
// from memory); My is zero (statics). The Mz panel must mark the beam's
// end at A, the My panel its end at B, once each and on the beam, not on
// the column.
func TestBeams3DMarkHinges(t *testing.T) {
	const l, w, ei = 5.0, 10.0, 21000.0
	m := &model.Model{Dim: 3, Units: model.UnitsSpec{Length: "m", Force: "kN"},
		NodeIDs: []string{"G", "A", "B"}, Coords: []float64{0, 0, -3, 0, 0, 0, l, 0, 0},
		Members: []model.Member{{ID: "column", Ends: [2]int{0, 1}, Kind: model.Beam},
			{ID: "beam", Ends: [2]int{1, 2}, Kind: model.Beam, Releases: [2]uint8{model.ReleaseBit(model.RZ), model.ReleaseBit(model.RY)}}},
		Supports: []model.Support{{Node: 0, Fixed: [6]bool{true, true, true, true, true, true}}, {Node: 2, Fixed: [6]bool{true, true, true, true, true, true}}}}
	column := BeamCurve{Member: 0}
	beam := BeamCurve{Member: 1, PeakMoment: [2]float64{-w * l * l / 8, l}, PeakDisplacement: [2]float64{0.0054 * w * l * l * l * l / ei, 0.4215 * l}}
	for k := range 11 {
		x := l * float64(k) / 10
		column.Stations = append(column.Stations, 0.3*float64(k))
		column.Moment = append(column.Moment, 0)
		column.MomentY = append(column.MomentY, 0)
		column.Displacements = append(column.Displacements, []float64{0, 0, 0})
		beam.Stations = append(beam.Stations, x)
		beam.Moment = append(beam.Moment, 3*w*l*x/8-w*x*x/2)
		beam.MomentY = append(beam.MomentY, 0)
		beam.Displacements = append(beam.Displacements, []float64{0, 0, -w * x * (l*l*l - 3*l*x*x + 2*x*x*x) / (48 * ei)})
	}
	var buf bytes.Buffer
	if err := Beams3D(&buf, m, [][]float64{{0, 0, 0}, {0, 0, 0}, {0, 0, 0}}, []BeamCurve{column, beam}, Options{}); err != nil {
		t.Fatal(err)
	}
	members, hinges := drawnMarks(t, buf.Bytes())
	if len(members) != 4 || len(hinges) != 2 {
		t.Fatalf("%d members drawn in ink and %d hinge marks; want 4 (two per moment panel) and 2", len(members), len(hinges))
	}
	// Document order: the Mz panel's column and beam, its marks, then the
	// My panel's.
	if !markAt(hinges[0], members[1]) || markAt(hinges[0], members[0]) || markAt(hinges[0], reversed(members[0])) {
		t.Errorf("Mz panel: hinge mark at %v is not at the beam's end A alone (beam drawn %v)", hinges[0], members[1])
	}
	if !markAt(hinges[1], reversed(members[3])) || markAt(hinges[1], members[3]) {
		t.Errorf("My panel: hinge mark at %v is not at the beam's end B (beam drawn %v)", hinges[1], members[3])
	}
	if !strings.Contains(buf.String(), hingeNote) {
		t.Error("the caption does not explain the hinge marks")
	}
	if rep, err := CheckLabels(buf.Bytes()); err != nil || rep.Defects() != 0 || rep.Hinges != 2 {
		t.Errorf("label report %+v (%v); want 2 hinges and no defects", rep, err)
	}
}

// TestCheckLabelsFindsTextOnHinge checks the checker: a text over a hinge
// mark is a defect, one clear of it is not.
func TestCheckLabelsFindsTextOnHinge(t *testing.T) {
	doc := `<svg xmlns="http://www.w3.org/2000/svg">
<circle cx="100" cy="100" r="4" class="hinge"/>
<text x="96" y="104" class="small label" text-anchor="start">on</text>
<text x="300" y="300" class="small label" text-anchor="start">clear</text>
</svg>`
	rep, err := CheckLabels([]byte(doc))
	if err != nil {
		t.Fatal(err)
	}
	if rep.Hinges != 1 || len(rep.HingeOverlaps) != 1 || rep.Defects() != 1 {
		t.Errorf("report %+v; want 1 hinge, 1 text on it and no other defect", rep)
	}
}
