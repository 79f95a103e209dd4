package render

import (
	"bytes"
	"math"
	"strings"
	"testing"
)

// TestChart draws y = (x − 2)² + 1 over [0, 5] with its minimum at (2, 1)
// (elementary calculus) and checks the chart's text: title, axis labels
// with units, the optimum's label, the caution, and ticks that cover the
// data.
func TestChart(t *testing.T) {
	var s Series
	s.Name = "volume at each step"
	for i := 0; i <= 20; i++ {
		x := 0.25 * float64(i)
		s.X = append(s.X, x)
		s.Y = append(s.Y, (x-2)*(x-2)+1)
	}
	s.Y[7] = math.NaN() // a failed step breaks the line
	var buf bytes.Buffer
	err := Chart(&buf, ChartSpec{Title: "Volume against depth", XLabel: "depth (m)", YLabel: "volume (m³)",
		Series: []Series{s}, Optimum: &[2]float64{2, 1}, OptimumLabel: "least volume 1 m³ at 2 m"})
	if err != nil {
		t.Fatal(err)
	}
	text := parseSVG(t, buf.Bytes())
	for _, want := range []string{"Volume against depth", "depth (m)", "volume (m³)", "least volume 1 m³ at 2 m", Caution, "0", "5"} {
		if !strings.Contains(text, want) {
			t.Errorf("chart lacks %q", want)
		}
	}
	// The series path restarts once, after the failed step.
	doc := buf.String()
	i := strings.Index(doc, `class="tension" stroke-width="2"`)
	j := strings.LastIndex(doc[:i], `d="`)
	if i < 0 || j < 0 || strings.Count(doc[j:i], "M") != 2 {
		t.Errorf("the line does not break once at the failed step")
	}
	ticks := niceTicks(1, 10, 6)
	if ticks[0] > 1 || ticks[len(ticks)-1] < 10 {
		t.Errorf("ticks %v do not cover [1, 10]", ticks)
	}
}

func TestNiceTicks(t *testing.T) {
	for _, tc := range []struct {
		lo, hi float64
		n      int
	}{{0.75, 6, 8}, {0.0123, 0.0456, 6}, {-3, 3, 6}, {5, 5, 6}, {1e5, 3.2e5, 6}, {3.7223, 745.15, 6}, {0, 4.2, 6}} {
		ticks := niceTicks(tc.lo, tc.hi, tc.n)
		if ticks[0] > tc.lo || ticks[len(ticks)-1] < tc.hi || len(ticks) > tc.n+2 || len(ticks) < 2 {
			t.Errorf("niceTicks(%g, %g, %d) = %v", tc.lo, tc.hi, tc.n, ticks)
		}
	}
}
