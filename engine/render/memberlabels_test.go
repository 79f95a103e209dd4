package render

import (
	"bytes"
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gusset/engine/model"
)

// longTruss returns a Pratt-like truss of n panels (4 m by 3 m), and
// axial values of distinct magnitudes for it. The values only exercise
// the label placement; no mechanics is checked here.
func longTruss(n int) (*model.Model, []float64) {
	m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"}}
	for i := 0; i <= n; i++ {
		m.NodeIDs = append(m.NodeIDs, fmt.Sprintf("B%d", i), fmt.Sprintf("T%d", i))
		m.Coords = append(m.Coords, 4*float64(i), 0, 4*float64(i), 3)
	}
	add := func(a, b int) {
		m.Members = append(m.Members, model.Member{ID: fmt.Sprintf("M%d", len(m.Members)), Ends: [2]int{a, b}})
	}
	for i := 0; i < n; i++ {
		add(2*i, 2*i+2)
		add(2*i+1, 2*i+3)
		add(2*i, 2*i+1)
		add(2*i+1, 2*i+2)
	}
	add(2*n, 2*n+1)
	m.Supports = []model.Support{{Node: 0, Fixed: [6]bool{true, true}}, {Node: 2 * n, Fixed: [6]bool{false, true}}}
	axial := make([]float64, len(m.Members))
	for e := range axial {
		axial[e] = float64(e%37+1) * 1.25
		if e%3 == 0 {
			axial[e] = -axial[e]
		}
	}
	return m, axial
}

// TestLargeFormLabelsWhereTheyFit checks issue 21's item 16: a form
// diagram of 181 members writes member forces where they fit, with no
// label defect (CheckLabels), and its caption states how many of how many
// it wrote, matching the numbers actually drawn.
func TestLargeFormLabelsWhereTheyFit(t *testing.T) {
	m, axial := longTruss(45)
	unlabelled := map[string]func() string{
		"form": func() string {
			var b bytes.Buffer
			_ = Form(&b, m, axial, Options{})
			return b.String()
		},
		"solved": func() string {
			var b bytes.Buffer
			_ = Solved(&b, m, make([][]float64, m.NodeCount()), axial, Options{})
			return b.String()
		},
	}
	for name, draw := range map[string]func(*bytes.Buffer) error{
		"form": func(b *bytes.Buffer) error { return Form(b, m, axial, Options{ForceLabels: true}) },
		"solved": func(b *bytes.Buffer) error {
			return Solved(b, m, make([][]float64, m.NodeCount()), axial, Options{ForceLabels: true})
		},
	} {
		b := drawWithoutLabelDefects(t, name, draw)
		note := regexp.MustCompile(`written where they fit: (\d+) of (\d+) members`).FindStringSubmatch(b.String())
		if note == nil {
			t.Fatalf("%s: no note on the member forces written", name)
		}
		written, _ := strconv.Atoi(note[1])
		if note[2] != strconv.Itoa(len(m.Members)) || written == 0 || written >= len(m.Members) {
			t.Errorf("%s: note says %s of %s members", name, note[1], note[2])
		}
		drawn := strings.Count(b.String(), `class="small label"`) - strings.Count(unlabelled[name](), `class="small label"`)
		if drawn != written {
			t.Errorf("%s: %d force labels drawn, caption says %d", name, drawn, written)
		}
	}
}
