package layout

import (
	"bytes"
	"context"
	"encoding/xml"
	"io"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestWriteSVG(t *testing.T) {
	l, err := Optimise(context.Background(), threePoint(8), Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := l.WriteSVG(&buf, SVGOptions{Title: "Point load & two pins"}); err != nil {
		t.Fatal(err)
	}
	text := buf.String()
	for _, want := range []string{Caution, "tension (solid)", "compression (dashed)", "&amp; two pins"} {
		if !strings.Contains(text, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
	// Well-formed XML, one line per member plus two legend lines; strokes
	// proportional to area; compression dashed, tension solid.
	dec := xml.NewDecoder(&buf)
	largest := 0.0
	for _, m := range l.Members {
		largest = max(largest, m.Area)
	}
	var lines []xml.StartElement
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && se.Name.Local == "line" {
			lines = append(lines, se)
		}
	}
	loads := len(l.Cases[0].Loads)
	if len(lines) != len(l.Members)+loads+2 {
		t.Fatalf("%d lines for %d members, %d loads and a legend of 2", len(lines), len(l.Members), loads)
	}
	attr := func(se xml.StartElement, name string) string {
		for _, a := range se.Attr {
			if a.Name.Local == name {
				return a.Value
			}
		}
		return ""
	}
	for i, m := range l.Members {
		width, _ := strconv.ParseFloat(attr(lines[i], "stroke-width"), 64)
		want := max(0.5, 10*m.Area/largest)
		if !scalar.EqualWithinAbsOrRel(width, want, 0.01, 0.01) {
			t.Errorf("member %d: stroke %g, want %g", i, width, want)
		}
		dashed := attr(lines[i], "stroke-dasharray") != ""
		if dashed != (m.Forces[0] < 0) {
			t.Errorf("member %d: force %g drawn dashed=%v", i, m.Forces[0], dashed)
		}
	}
}
