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

// pictureParts are what drawnMarks reads of a picture, in document order:
// the members drawn in ink (the moment panels' members, one line each),
// the first and second drawn segments of each deflected member (from its
// first end, and from its second end backwards), the hinge marks' centres
// and the torsion marks' centres.
type pictureParts struct {
	members, deflectedFirst, deflectedLast [][4]float64
	hinges, torsions                       [][2]float64
}

// drawnMarks reads the members drawn in ink and the hinge marks' centres
// of a picture (see drawnParts).
func drawnMarks(t *testing.T, svg []byte) (members [][4]float64, hinges [][2]float64) {
	t.Helper()
	p := drawnParts(t, svg)
	return p.members, p.hinges
}

// drawnParts reads the parts of a picture that the release marks are
// checked against.
func drawnParts(t *testing.T, svg []byte) (p pictureParts) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(svg))
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			return p
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
			p.members = append(p.members, [4]float64{f("x1"), f("y1"), f("x2"), f("y2")})
		case el.Name.Local == "circle" && attrs["class"] == "hinge":
			p.hinges = append(p.hinges, [2]float64{f("cx"), f("cy")})
		case el.Name.Local == "polyline" && attrs["stroke"] == DeflectedColour:
			pts := points(t, attrs["points"])
			n := len(pts)
			p.deflectedFirst = append(p.deflectedFirst, [4]float64{pts[0][0], pts[0][1], pts[1][0], pts[1][1]})
			p.deflectedLast = append(p.deflectedLast, [4]float64{pts[n-1][0], pts[n-1][1], pts[n-2][0], pts[n-2][1]})
		case el.Name.Local == "polygon" && attrs["class"] == "torsion-release":
			pts := points(t, attrs["points"])
			// A diamond: its centre is the mean of its corners.
			var c [2]float64
			for _, q := range pts {
				c[0], c[1] = c[0]+q[0]/float64(len(pts)), c[1]+q[1]/float64(len(pts))
			}
			p.torsions = append(p.torsions, c)
		}
	}
}

// points reads an SVG points list of at least two points.
func points(t *testing.T, list string) [][2]float64 {
	t.Helper()
	var out [][2]float64
	for _, pair := range strings.Fields(list) {
		xs, ys, _ := strings.Cut(pair, ",")
		x, errX := strconv.ParseFloat(xs, 64)
		y, errY := strconv.ParseFloat(ys, 64)
		if errX != nil || errY != nil {
			t.Fatalf("points %q: %v %v", list, errX, errY)
		}
		out = append(out, [2]float64{x, y})
	}
	if len(out) < 2 {
		t.Fatalf("points %q: fewer than two", list)
	}
	return out
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
// memory). Each panel must mark the beam's end at B with one open circle
// (in the deflected shape at the end of the beam's deflected curve), and
// neither the column's end there nor the beam's other end; the caption
// must explain the mark, and no label may touch it. The same frame
// without the release has no mark and no note.
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
	p := drawnParts(t, svg)
	members, hinges := p.members, p.hinges
	if len(members) != 2 || len(hinges) != 2 || len(p.deflectedFirst) != 2 || len(p.torsions) != 0 {
		t.Fatalf("%d members drawn in ink, %d deflected, %d hinge and %d torsion marks; want 2, 2, 2 (one per panel) and 0",
			len(members), len(p.deflectedFirst), len(hinges), len(p.torsions))
	}
	if !markAt(hinges[0], members[1]) {
		t.Errorf("moment panel: hinge mark at %v is not at the beam's end B (beam drawn %v)", hinges[0], members[1])
	}
	if markAt(hinges[0], reversed(members[0])) || markAt(hinges[0], reversed(members[1])) {
		t.Errorf("moment panel: hinge mark at %v sits on the column's end or at the beam's other end", hinges[0])
	}
	if !markAt(hinges[1], p.deflectedFirst[1]) {
		t.Errorf("deflected shape: hinge mark at %v is not at the beam's end B (drawn from %v)", hinges[1], p.deflectedFirst[1])
	}
	if markAt(hinges[1], p.deflectedLast[0]) || markAt(hinges[1], p.deflectedLast[1]) {
		t.Errorf("deflected shape: hinge mark at %v sits on the column's end or at the beam's other end", hinges[1])
	}
	if !strings.Contains(string(svg), hingeNote) || strings.Contains(string(svg), torsionNote) {
		t.Error("the caption does not explain the hinge mark, or explains a torsion mark not drawn")
	}
	if rep, err := CheckLabels(svg); err != nil || rep.Defects() != 0 || rep.Hinges != 2 {
		t.Errorf("label report %+v (%v); want 2 hinges and no defects", rep, err)
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
// the column; the deflected shape marks both ends of the beam's curve.
func TestBeams3DMarkHinges(t *testing.T) {
	svg := drawReleasedSpaceFrame(t, [2]uint8{model.ReleaseBit(model.RZ), model.ReleaseBit(model.RY)})
	p := drawnParts(t, svg)
	members, hinges := p.members, p.hinges
	if len(members) != 4 || len(hinges) != 4 || len(p.deflectedFirst) != 2 || len(p.torsions) != 0 {
		t.Fatalf("%d members drawn in ink, %d deflected, %d hinge and %d torsion marks; want 4 (two per moment panel), 2, 4 and 0",
			len(members), len(p.deflectedFirst), len(hinges), len(p.torsions))
	}
	// Document order: the Mz panel's column and beam, its marks, then the
	// My panel's, then the deflected shape's (the beam's first end, then
	// its second).
	if !markAt(hinges[0], members[1]) || markAt(hinges[0], members[0]) || markAt(hinges[0], reversed(members[0])) {
		t.Errorf("Mz panel: hinge mark at %v is not at the beam's end A alone (beam drawn %v)", hinges[0], members[1])
	}
	if !markAt(hinges[1], reversed(members[3])) || markAt(hinges[1], members[3]) {
		t.Errorf("My panel: hinge mark at %v is not at the beam's end B (beam drawn %v)", hinges[1], members[3])
	}
	if !markAt(hinges[2], p.deflectedFirst[1]) || markAt(hinges[2], p.deflectedLast[0]) {
		t.Errorf("deflected shape: hinge mark at %v is not at the beam's end A alone (drawn from %v)", hinges[2], p.deflectedFirst[1])
	}
	if !markAt(hinges[3], p.deflectedLast[1]) {
		t.Errorf("deflected shape: hinge mark at %v is not at the beam's end B (drawn back from %v)", hinges[3], p.deflectedLast[1])
	}
	if !strings.Contains(string(svg), hingeNote) || strings.Contains(string(svg), torsionNote) {
		t.Error("the caption does not explain the hinge marks, or explains a torsion mark not drawn")
	}
	if rep, err := CheckLabels(svg); err != nil || rep.Defects() != 0 || rep.Hinges != 4 || rep.TorsionMarks != 0 {
		t.Errorf("label report %+v (%v); want 4 hinges, no torsion marks and no defects", rep, err)
	}
}

// TestBeams3DMarksTorsionRelease draws the frame of TestBeams3DMarkHinges
// with the beam released in torsion alone at A (its bending continues
// through the joint, so the moment panels show no hinge): the deflected
// shape marks the beam's end at A with one open diamond, no open circle
// is drawn, and the caption explains the diamond alone. Released about rx
// and rz at A, the end is a hinge (a circle in the Mz panel and the
// deflected shape), not a diamond.
func TestBeams3DMarksTorsionRelease(t *testing.T) {
	svg := drawReleasedSpaceFrame(t, [2]uint8{model.ReleaseBit(model.RX), 0})
	p := drawnParts(t, svg)
	if len(p.hinges) != 0 || len(p.torsions) != 1 || len(p.deflectedFirst) != 2 {
		t.Fatalf("%d hinge and %d torsion marks, %d deflected members; want 0, 1 and 2", len(p.hinges), len(p.torsions), len(p.deflectedFirst))
	}
	if !markAt(p.torsions[0], p.deflectedFirst[1]) || markAt(p.torsions[0], p.deflectedLast[0]) || markAt(p.torsions[0], p.deflectedLast[1]) {
		t.Errorf("torsion mark at %v is not at the beam's end A alone (drawn from %v)", p.torsions[0], p.deflectedFirst[1])
	}
	if !strings.Contains(string(svg), torsionNote) || strings.Contains(string(svg), hingeNote) {
		t.Error("the caption does not explain the torsion mark alone")
	}
	if rep, err := CheckLabels(svg); err != nil || rep.Defects() != 0 || rep.Hinges != 0 || rep.TorsionMarks != 1 {
		t.Errorf("label report %+v (%v); want 1 torsion mark and no defects", rep, err)
	}
	p = drawnParts(t, drawReleasedSpaceFrame(t, [2]uint8{model.ReleaseBit(model.RX) | model.ReleaseBit(model.RZ), 0}))
	if len(p.hinges) != 2 || len(p.torsions) != 0 {
		t.Errorf("released about rx and rz: %d hinge and %d torsion marks; want 2 (Mz panel, deflected shape) and 0", len(p.hinges), len(p.torsions))
	}
}

// drawReleasedSpaceFrame draws the frame of TestBeams3DMarkHinges with
// the beam's ends released as releases says.
func drawReleasedSpaceFrame(t *testing.T, releases [2]uint8) []byte {
	t.Helper()
	const l, w, ei = 5.0, 10.0, 21000.0
	m := &model.Model{Dim: 3, Units: model.UnitsSpec{Length: "m", Force: "kN"},
		NodeIDs: []string{"G", "A", "B"}, Coords: []float64{0, 0, -3, 0, 0, 0, l, 0, 0},
		Members: []model.Member{{ID: "column", Ends: [2]int{0, 1}, Kind: model.Beam},
			{ID: "beam", Ends: [2]int{1, 2}, Kind: model.Beam, Releases: releases}},
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
	return buf.Bytes()
}

// TestCheckLabelsFindsTextOnHinge checks the checker: a text over a hinge
// mark or a torsion mark is a defect, one clear of them is not.
func TestCheckLabelsFindsTextOnHinge(t *testing.T) {
	doc := `<svg xmlns="http://www.w3.org/2000/svg">
<circle cx="100" cy="100" r="4" class="hinge"/>
<polygon points="200,196 204,200 200,204 196,200" class="torsion-release"/>
<text x="96" y="104" class="small label" text-anchor="start">on</text>
<text x="196" y="204" class="small label" text-anchor="start">on torsion</text>
<text x="300" y="300" class="small label" text-anchor="start">clear</text>
</svg>`
	rep, err := CheckLabels([]byte(doc))
	if err != nil {
		t.Fatal(err)
	}
	if rep.Hinges != 1 || rep.TorsionMarks != 1 || len(rep.HingeOverlaps) != 2 || rep.Defects() != 2 ||
		!strings.Contains(rep.HingeOverlaps[1], "torsion mark") {
		t.Errorf("report %+v; want 1 hinge, 1 torsion mark, 1 text on each and no other defect", rep)
	}
}
