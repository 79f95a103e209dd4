package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestDemo runs the demo end to end as a newcomer would and checks what it
// promises: a summary, the pictures, the optimum found, and the caution.
func TestDemo(t *testing.T) {
	dir := t.TempDir()
	code, out, errOut := runCapture([]string{"demo", "--out", dir}, "")
	if code != 0 {
		t.Fatalf("demo exit %d: %s", code, errOut)
	}
	for _, want := range []string{"Brannock Cut", "Stability: b − d·j + k = s − m: 29 − 2·16 + 3 = 0", "Least steel at depth", "qualified engineer"} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q:\n%s", want, out)
		}
	}
	// The crowd case alone is a uniform 15 kN/m over 24 m carried as panel
	// loads on an 8-panel truss 2 m deep: the mid-span chord force is
	// M/h = (wL²/8)/h = 1080/2 = 540 kN (method of sections, any statics
	// text).
	if !strings.Contains(out, "largest compression  -540.0 kN (U4-U5)") {
		t.Errorf("crowd case chord force not as derived by sections:\n%s", out)
	}
	for _, file := range []string{"depth-study.svg", "form-and-force.svg", "least-material-layout.svg"} {
		b, err := os.ReadFile(filepath.Join(dir, file))
		if err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(string(b), "<svg") || !strings.Contains(string(b), "qualified engineer") {
			t.Errorf("%s is not an SVG with the caution", file)
		}
	}
}
