package render

import (
	"bytes"
	"context"
	"encoding/xml"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/layout"
)

// svgLines returns the line elements of a document with their attributes.
func svgLines(t *testing.T, doc []byte) []map[string]string {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(doc))
	var out []map[string]string
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			return out
		}
		if err != nil {
			t.Fatalf("not well-formed: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && se.Name.Local == "line" {
			attr := map[string]string{}
			for _, a := range se.Attr {
				attr[a.Name.Local] = a.Value
			}
			out = append(out, attr)
		}
	}
}

// spanLayout is a 10 kN point load between two pins 2 m apart in a 2 m ×
// 1 m domain with a hole above the load, optimised on a 12 × 6 grid.
func spanLayout(t *testing.T, dim int) *layout.Layout {
	t.Helper()
	pin := [3]bool{true, true, dim == 3}
	p := layout.Problem{
		Dim:          dim,
		Domain:       layout.Domain{Outline: [][2]float64{{0, 0}, {2, 0}, {2, 1}, {0, 1}}, Holes: [][][2]float64{{{0.8, 0.4}, {1.2, 0.4}, {1.2, 0.8}, {0.8, 0.8}}}},
		Divisions:    [3]int{12, 6, 2},
		Supports:     []layout.Support{{Node: -1, At: [3]float64{0, 0}, Fix: pin}, {Node: -1, At: [3]float64{2, 0}, Fix: pin}},
		Cases:        []layout.Case{{ID: "P", Loads: []layout.Load{{Node: -1, At: [3]float64{1, 0}, Force: [3]float64{0, -10}}}}},
		TensionLimit: 1, CompressionLimit: 1,
	}
	if dim == 3 {
		p.Solid = layout.Solid{Vertices: layout.Box([3]float64{0, 0, -0.5}, [3]float64{2, 1, 0.5}),
			Holes: [][][3]float64{layout.Box([3]float64{0.8, 0.4, -0.5}, [3]float64{1.2, 0.8, 0.5})}}
		p.Supports = append(p.Supports, layout.Support{Node: -1, At: [3]float64{0, 0, 0.5}, Fix: pin})
	}
	l, err := layout.Optimise(context.Background(), p, layout.Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// TestLayoutPicture checks the plane picture: the caution, the domain and
// the hole, the load's magnitude, a scale bar; one centre line per member
// styled by the sign of its force; widths proportional to area, a wide
// member drawn as a pale band under a thin centre line in its style.
func TestLayoutPicture(t *testing.T) {
	l := spanLayout(t, 2)
	var buf bytes.Buffer
	if err := Layout(&buf, l, LayoutOptions{Title: "Span & hole", ForceUnit: "kN", LengthUnit: "m"}); err != nil {
		t.Fatal(err)
	}
	text := parseSVG(t, buf.Bytes())
	for _, want := range []string{Caution, "Span & hole", "Design domain", "Hole (no member crosses)", "10 kN", " m\n", "Tension", "Compression", "m³"} {
		if !strings.Contains(text, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
	lines := svgLines(t, buf.Bytes())
	count := map[string]int{}
	var centres, bands []map[string]string
	for _, ln := range lines {
		count[ln["class"]]++
		switch ln["class"] {
		case "tension", "compression":
			centres = append(centres, ln)
		case "tension-band", "compression-band":
			bands = append(bands, ln)
		}
	}
	if count["domain"] != 4+1 || count["hole"] != 4+1 {
		t.Errorf("%d domain and %d hole edges, want 4 and 4 and one legend line each", count["domain"], count["hole"])
	}
	largest, tension := 0.0, 0
	for _, m := range l.Members {
		largest = math.Max(largest, m.Area)
		if m.Forces[0] > 0 {
			tension++
		}
	}
	// The legend draws one band and one centre line per sense.
	if len(centres) != len(l.Members)+2 {
		t.Fatalf("%d centre lines for %d members and a legend of 2", len(centres), len(l.Members))
	}
	wide := 0
	for _, m := range l.Members {
		if 10*m.Area/largest >= bandWidth {
			wide++
		}
	}
	if len(bands) != wide+2 || wide == 0 {
		t.Errorf("%d bands, want %d wide members and 2 in the legend", len(bands), wide)
	}
	for _, b := range bands[:wide] {
		w, _ := strconv.ParseFloat(b["stroke-width"], 64)
		if w < bandWidth || w > 10.0001 {
			t.Errorf("band width %g outside [%g, 10]", w, bandWidth)
		}
	}
	// Widths are proportional to area: the widest band is the largest area.
	widest := 0.0
	for _, b := range bands[:wide] {
		w, _ := strconv.ParseFloat(b["stroke-width"], 64)
		widest = math.Max(widest, w)
	}
	if !scalar.EqualWithinAbsOrRel(widest, 10, 0.01, 0) {
		t.Errorf("widest band %g, want 10 for the largest area", widest)
	}
	if tension == 0 || tension == len(l.Members) {
		t.Errorf("%d of %d members in tension: the span needs both senses", tension, len(l.Members))
	}
}

// TestLayoutPictureSpace checks the space picture: three views, each with
// the domain's 12 box edges and the hole's 12, scale bars in the plan and
// the elevation only, and the caution.
func TestLayoutPictureSpace(t *testing.T) {
	l := spanLayout(t, 3)
	var buf bytes.Buffer
	if err := Layout(&buf, l, LayoutOptions{}); err != nil {
		t.Fatal(err)
	}
	text := parseSVG(t, buf.Bytes())
	for _, want := range []string{Caution, "Axonometric view", "Plan", "Elevation", "not to scale", "10 kN"} {
		if !strings.Contains(text, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
	count := map[string]int{}
	for _, ln := range svgLines(t, buf.Bytes()) {
		count[ln["class"]]++
	}
	if count["domain"] != 3*12+1 || count["hole"] != 3*12+1 {
		t.Errorf("%d domain and %d hole edges, want 3 × 12 and one legend line each", count["domain"], count["hole"])
	}
	if n := strings.Count(text, " m\n"); n != 2 {
		t.Errorf("%d scale bars, want 2 (plan and elevation)", n)
	}
}
