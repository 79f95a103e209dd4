package main

import (
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
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
	// The stability line is the extended Maxwell rule b − d·j + k = s − m
	// (J. C. Maxwell, Phil. Mag. 27, 1864, extended with s and m as in
	// statics' tests; from memory) for the demo's truss: 29 bars, 16 joints,
	// 3 support constraints, 29 − 32 + 3 = 0, statically determinate and
	// stiff.
	for _, want := range []string{"Brannock Cut", "Stability: b − d·j + k = s − m: 29 − 2·16 + 3 = 0", "Least steel at depth", "qualified engineer"} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q:\n%s", want, out)
		}
	}
	// The crowd case alone is a uniform 15 kN/m over 24 m carried as panel
	// loads on an 8-panel truss 2 m deep: the mid-span chord force is
	// M/h = (wL²/8)/h = 1080/2 = 540 kN (method of sections, any statics
	// text).
	// The deck bay against statics by hand (demo_deck.go): wL²/8 on the
	// middle cross-beam, PL/4 on a chord, the panels' total on the
	// bearings.
	for _, want := range []string{"largest moment 16.9 kN·m at 1.50 m", "north chord: largest moment 33.7", "the bearings carry 90.0 kN up"} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q", want)
		}
	}
	if !strings.Contains(out, "largest compression  -540.0 kN (U4-U5)") {
		t.Errorf("crowd case chord force not as derived by sections:\n%s", out)
	}
	// In the crowd case every load and both reactions are vertical and act
	// at nodes on y = 0, so M = Σ F·r = Σ F_y·y = 0 and Maxwell's theorem
	// Z_T − Z_C = M (J. C. Maxwell, Trans. RSE 26, 1870) splits the load
	// path evenly: Z_T = Z_C = Z/2.
	crowd := regexp.MustCompile(`crowd\s+Z =\s*([0-9.]+) kN·m \(tension ([0-9.]+), compression ([0-9.]+)\); M =\s*(-?[0-9.]+)`).FindStringSubmatch(out)
	if crowd == nil {
		t.Fatalf("demo output lacks the crowd case's load path:\n%s", out)
	}
	var z, zt, zc, mm float64
	for i, p := range []*float64{&z, &zt, &zc, &mm} {
		v, err := strconv.ParseFloat(crowd[i+1], 64)
		if err != nil {
			t.Fatal(err)
		}
		*p = v
	}
	// The printed figures carry one decimal: allow for its rounding.
	if math.Abs(mm) > 0.05 || math.Abs(zt-zc) > 0.1 || math.Abs(zt+zc-z) > 0.15 || z <= 0 {
		t.Errorf("crowd case: Z = %g, Z_T = %g, Z_C = %g, M = %g; want M = 0 and Z_T = Z_C = Z/2", z, zt, zc, mm)
	}
	// The depth study under the demo brief's limits: the least steel with
	// a buckling factor of at least 200 lies deeper than the free optimum,
	// on the boundary of that constraint (the factor grows with the depth
	// in this truss, the steel falls and then rises).
	modal := regexp.MustCompile(`unconstrained:\s+depth ([0-9.]+) m[^\n]*\n[^\n]*Least steel with λ ≥ 200 and f₁ ≥ 5 Hz:\s+depth ([0-9.]+) m, [0-9.]+ m³ \(λ = ([0-9.]+),[^\n]*active: critical_load_factor ≥ 200`).FindStringSubmatch(out)
	if modal == nil {
		t.Errorf("demo output lacks the constrained depth study:\n%s", out)
	} else if free, held, factor := atof(modal[1]), atof(modal[2]), atof(modal[3]); !(held > free) || math.Abs(factor-200) > 0.05 {
		t.Errorf("constrained depth %g (factor %g) against the free %g: want deeper, at a factor of 200", held, factor, free)
	}
	for _, file := range []string{"depth-study.svg", "form-and-force.svg", "least-material-layout.svg", "buckling-mode.svg", "vibration-mode.svg"} {
		b, err := os.ReadFile(filepath.Join(dir, file))
		if err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(string(b), "<svg") || !strings.Contains(string(b), "qualified engineer") {
			t.Errorf("%s is not an SVG with the caution", file)
		}
	}
}

// atof parses a number the demo printed, NaN when it is not one.
func atof(s string) float64 {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return math.NaN()
	}
	return v
}
