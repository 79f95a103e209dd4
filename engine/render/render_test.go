package render

import (
	"bytes"
	"context"
	"encoding/xml"
	"fmt"
	"io"
	"os"
	"strings"
	"testing"

	"gusset/engine/model"
	"gusset/engine/reciprocal"
)

// pratt returns a four-panel Pratt truss (panels 4 m, depth 3 m, 10 kN at
// the interior bottom nodes) with its member forces by the method of
// joints: end posts −25, bottom chords 20, hangers 10, diagonals 25/3, top
// chords −80/3, centre vertical 0 kN (common practice), and its external
// forces (reactions 15 kN up at each end).
func pratt() (*model.Model, []float64, [][2]float64) {
	xy := [][2]float64{{0, 0}, {4, 0}, {8, 0}, {12, 0}, {16, 0}, {4, 3}, {8, 3}, {12, 3}}
	ends := [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 4}, {5, 6}, {6, 7}, {0, 5}, {4, 7}, {5, 1}, {6, 2}, {7, 3}, {5, 2}, {7, 2}}
	axial := []float64{20, 20, 20, 20, -80.0 / 3, -80.0 / 3, -25, -25, 10, 0, 10, 25.0 / 3, 25.0 / 3}
	m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"}}
	for v, p := range xy {
		m.NodeIDs = append(m.NodeIDs, fmt.Sprintf("N%d", v))
		m.Coords = append(m.Coords, p[0], p[1])
	}
	for e, en := range ends {
		m.Members = append(m.Members, model.Member{ID: fmt.Sprintf("M%d", e), Ends: en})
	}
	m.Supports = []model.Support{{Node: 0, Fixed: [6]bool{true, true}}, {Node: 4, Fixed: [6]bool{false, true}}}
	ext := make([][2]float64, len(xy))
	ext[0], ext[4] = [2]float64{0, 15}, [2]float64{0, 15}
	for _, v := range []int{1, 2, 3} {
		ext[v] = [2]float64{0, -10}
	}
	return m, axial, ext
}

// parseSVG checks the document is well-formed XML with an svg root and
// returns its text content.
func parseSVG(t *testing.T, doc []byte) string {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(doc))
	var text strings.Builder
	root := ""
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		switch el := tok.(type) {
		case xml.StartElement:
			if root == "" {
				root = el.Name.Local
			}
		case xml.CharData:
			text.Write(el)
			text.WriteByte('\n')
		}
	}
	if root != "svg" {
		t.Fatalf("root element %q", root)
	}
	return text.String()
}

func TestFormAndForce(t *testing.T) {
	m, axial, ext := pratt()
	d, err := reciprocal.Build(context.Background(), reciprocal.Input{Model: m, AxialForce: axial, External: ext})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := FormAndForce(&buf, m, d, Options{ForceLabels: true}); err != nil {
		t.Fatal(err)
	}
	if path := os.Getenv("GUSSET_RENDER_OUT"); path != "" {
		if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	text := parseSVG(t, buf.Bytes())
	for _, want := range []string{
		Caution, "Tension", "Compression", "Zero force", "Load, kN", "Reaction",
		"kN", "Form diagram", "Force diagram",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("SVG lacks %q", want)
		}
	}
	// Every space label appears in both diagrams: once in the form and
	// once (alone or merged with coincident points) in the force diagram.
	for _, sp := range d.Spaces {
		count := 0
		for _, line := range strings.Split(text, "\n") {
			for _, part := range strings.Split(line, "=") {
				if part == sp.Label {
					count++
				}
			}
		}
		if count < 2 {
			t.Errorf("label %q appears %d times, want both diagrams", sp.Label, count)
		}
	}
	// Both line styles are present, told apart by colour and dash.
	doc := buf.String()
	for _, want := range []string{`class="tension"`, `class="compression"`, "stroke-dasharray", tensionColour, compressionColour} {
		if !strings.Contains(doc, want) {
			t.Errorf("SVG lacks %s", want)
		}
	}
}

func TestForm(t *testing.T) {
	m, axial, _ := pratt()
	var buf bytes.Buffer
	if err := Form(&buf, m, axial, Options{ForceLabels: true}); err != nil {
		t.Fatal(err)
	}
	if path := os.Getenv("GUSSET_RENDER_FORM_OUT"); path != "" {
		if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	text := parseSVG(t, buf.Bytes())
	// The force labels are pratt's forces by the method of joints (top
	// chords −80/3, end posts −25, diagonals 25/3), the largest |N| = 80/3
	// = 26.67 kN. A bare "m" would match "Compression" and could not fail,
	// so the length unit is looked for in its sentence.
	for _, want := range []string{Caution, "Tension", "Compression", "-26.7", "-25", "8.33", "Lengths in m", "Largest axial force 26.67 kN"} {
		if !strings.Contains(text, want) {
			t.Errorf("SVG lacks %q", want)
		}
	}
}

// failWriter fails every write.
type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, fmt.Errorf("disk full") }

func TestWriteError(t *testing.T) {
	m, axial, _ := pratt()
	if err := Form(failWriter{}, m, axial, Options{}); err == nil {
		t.Error("write error not returned")
	}
}

// TestLabelsStepAside writes five labels at one point: each must land
// where its estimated box overlaps none placed before.
func TestLabelsStepAside(t *testing.T) {
	var buf bytes.Buffer
	c := newCanvas(&buf, 400, 300)
	for _, s := range []string{"A", "2.36 kN", "B", "84.1 kN", "C"} {
		c.label(200, 150, s, "small label", "middle", stepsVertical)
	}
	if err := c.close(); err != nil {
		t.Fatal(err)
	}
	for i, a := range c.placed {
		for _, b := range c.placed[:i] {
			if a.overlaps(b) {
				t.Fatalf("label %d at %v overlaps %v", i, a, b)
			}
		}
	}
}
