package render

import (
	"bytes"
	"encoding/xml"
	"io"
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestBeams draws a simple span of 10 m under 10 kN/m from its closed
// forms (M = wx(L−x)/2, y = wx(L³ − 2Lx² + x³)/24EI with EI = 21 000 kN·m²;
// Roark, Table 8.1 case 2e, from memory) and checks the picture is valid
// SVG that states its scales and labels the extremes.
func TestBeams(t *testing.T) {
	const l, w, ei = 10.0, 10.0, 21000.0
	m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"},
		NodeIDs: []string{"a", "b"}, Coords: []float64{0, 0, l, 0},
		Members:  []model.Member{{ID: "span", Ends: [2]int{0, 1}, Kind: model.Beam}},
		Supports: []model.Support{{Node: 0, Fixed: [6]bool{true, true}}, {Node: 1, Fixed: [6]bool{false, true}}},
	}
	bc := BeamCurve{Member: 0, PeakMoment: [2]float64{w * l * l / 8, l / 2}, PeakDisplacement: [2]float64{5 * w * l * l * l * l / (384 * ei), l / 2}}
	for k := range 11 {
		x := l * float64(k) / 10
		bc.Stations = append(bc.Stations, x)
		bc.Moment = append(bc.Moment, w*x*(l-x)/2)
		bc.Displacements = append(bc.Displacements, []float64{0, -w * x * (l*l*l - 2*l*x*x + x*x*x) / (24 * ei)})
	}
	var buf bytes.Buffer
	if err := Beams(&buf, m, [][]float64{{0, 0}, {0, 0}}, []BeamCurve{bc}, Options{}); err != nil {
		t.Fatal(err)
	}
	svg := buf.String()
	dec := xml.NewDecoder(strings.NewReader(svg))
	for {
		if _, err := dec.Token(); err == io.EOF {
			break
		} else if err != nil {
			t.Fatalf("not well-formed: %v", err)
		}
	}
	// 125 kN·m over 15 % of the 10 m model is 83 kN·m per m: the scale
	// rounds up to 100; 62 mm magnified to about 8 % of 10 m is ×10.
	for _, want := range []string{"Moment scale: 1 m of drawing = 100 kN·m", "125 kN·m", "largest 0.062 m",
		"magnified ×10", Caution, DeflectedColour, TensionBandColour} {
		if !strings.Contains(svg, want) {
			t.Errorf("picture lacks %q", want)
		}
	}
}
