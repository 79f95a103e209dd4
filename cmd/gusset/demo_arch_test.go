package main

import (
	"io"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gusset/protocol"
)

// TestDemoArch runs the demo's arch alternative and checks its figures
// against the closed forms of a thrust line of n panels of width d under
// equal loads P (derived in engine/formfind's tests): through a crown f,
// q = −Pn²/(8f) and the horizontal thrust is |q|·d; the least load path
// is at the rise f* = (n²d/4)·√(3/(n² − 1)).
func TestDemoArch(t *testing.T) {
	s, err := newServer(protocol.Limits{}, io.Discard)
	if err != nil {
		t.Fatal(err)
	}
	var out strings.Builder
	d := &demo{out: &out, dir: t.TempDir(), server: s}
	if err := d.archAlternative(); err != nil {
		t.Fatal(err)
	}
	const n, dd, P = archPanels, archPanel, 1.35*10.8 + 1.5*45
	q := P * n * n / (8 * archRise)
	number := func(pattern string) float64 {
		m := regexp.MustCompile(pattern).FindStringSubmatch(out.String())
		if m == nil {
			t.Fatalf("output lacks %s:\n%s", pattern, out.String())
		}
		v, _ := strconv.ParseFloat(m[1], 64)
		return v
	}
	if got := number(`Force density (-?[0-9.]+) kN/m`); math.Abs(got+q) > 0.005 {
		t.Errorf("force density %g, want −Pn²/(8f) = %g", got, -q)
	}
	if got := number(`horizontal thrust ([0-9.]+) kN`); math.Abs(got-q*dd) > 0.05 {
		t.Errorf("thrust %g, want %g", got, q*dd)
	}
	if got, want := number(`at a rise of ([0-9.]+) m`), n*n*dd/4*math.Sqrt(3.0/(n*n-1)); math.Abs(got-want) > 0.0005 {
		t.Errorf("least-material rise %g, want %g", got, want)
	}
}
