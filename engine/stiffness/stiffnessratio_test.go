package stiffness

import (
	"context"
	"math"
	"strings"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// alternatingPratt is modelgen's 20-panel Pratt truss (span 40 m, depth
// 4 m, 10 kN at each of the 19 inner bottom nodes) whose members alternate
// between the steel tube and a section ratio times smaller in area, so
// that their stiffnesses EA/L alternate by that factor. Without the
// diagonal of the second inner panel it is a mechanism.
func alternatingPratt(t *testing.T, ratio float64, dropDiagonal bool) (*model.Model, *model.Spec) {
	t.Helper()
	s := modelgen.Pratt(20, 40, 4, 10)
	soft := modelgen.Tube()
	soft.ID = "soft"
	soft.Area = model.Num(soft.Area.Num / ratio)
	s.Sections = append(s.Sections, soft)
	for i := range s.Members {
		if i%2 == 1 {
			s.Members[i].Section = "soft"
		}
	}
	if dropDiagonal {
		s.Members = s.Members[:len(s.Members)-17] // the inner diagonals come last
	}
	m, err := model.Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	return m, s
}

// memberBetween returns the index of the member joining the nodes at
// (x1, y1) and (x2, y2).
func memberBetween(t *testing.T, m *model.Model, x1, y1, x2, y2 float64) int {
	t.Helper()
	at := func(n int, x, y float64) bool { p := m.Node(n); return p[0] == x && p[1] == y }
	for e, mem := range m.Members {
		a, b := mem.Ends[0], mem.Ends[1]
		if (at(a, x1, y1) && at(b, x2, y2)) || (at(a, x2, y2) && at(b, x1, y1)) {
			return e
		}
	}
	t.Fatalf("no member between (%g, %g) and (%g, %g)", x1, y1, x2, y2)
	return -1
}

// TestStiffnessRatioIsNotAMechanism checks that a statically determinate
// truss whose member stiffnesses alternate by a large ratio is never
// refused as a mechanism: mechanisms are a property of the geometry and
// supports (the rank of the equilibrium matrix, which holds no stiffness:
// J. C. Maxwell, "On the calculation of the equilibrium and stiffness of
// frames", Phil. Mag. 27, 1864, and the rule's extended form with states of
// self-stress and mechanisms), not of the stiffnesses.
// A determinate truss's forces follow from equilibrium alone, so they are
// the hand values of the method of sections: reactions 19·10/2 = 95 kN;
// the top chord beside mid-span carries −M(20)/4 = −(95·20 −
// 10·(2+4+…+18))/4 = −1000/4 = −250 kN and the bottom chord of the panel
// before mid-span M(18)/4 = (95·18 − 10·(2+…+16))/4 = 990/4 = 247.5 kN.
// At a ratio of 1e6 they hold to 1e-7 (κ·ε with κ of order 1e9 here);
// at 1e12 the forces lose digits
// (forward error of order κ·ε, Higham, Accuracy and Stability of Numerical
// Algorithms, 2002, ch. 10) and the warnings say by how much, the stated
// residual bounding the error seen; at 1e13 (once a false mechanism, code
// 1002) the model is an invalid model naming the members' sections. The
// same geometry without its inner diagonals is still a mechanism.
func TestStiffnessRatioIsNotAMechanism(t *testing.T) {
	for _, tc := range []struct {
		ratio     float64
		tolerance float64 // relative, on the hand values; 0: from the residual
	}{
		{1e6, 1e-7},
		{1e12, 0},
	} {
		m, _ := alternatingPratt(t, tc.ratio, false)
		r, err := Solve(context.Background(), m, Options{})
		if err != nil {
			t.Fatalf("ratio %g: %v", tc.ratio, err)
		}
		c := r.Cases[0]
		tolerance := tc.tolerance
		if tolerance == 0 {
			tolerance = c.Residual
			warnings := strings.Join(r.Warnings, "\n")
			if !strings.Contains(warnings, "ratio of 2.2e+12") || !strings.Contains(warnings, "relative residual") {
				t.Errorf("ratio %g: warnings %q do not name the stiffness ratio and the residual", tc.ratio, r.Warnings)
			}
		}
		for _, f := range []struct {
			name           string
			x1, y1, x2, y2 float64
			want           float64
		}{
			{"top chord at mid-span", 18, 4, 20, 4, -250},
			{"bottom chord before mid-span", 18, 0, 20, 0, 247.5},
		} {
			e := memberBetween(t, m, f.x1, f.y1, f.x2, f.y2)
			if got := c.AxialForce[e]; math.Abs(got-f.want) > tolerance*math.Abs(f.want) {
				t.Errorf("ratio %g: %s N = %v, want %v within %.2g", tc.ratio, f.name, got, f.want, tolerance)
			}
		}
	}
	m, _ := alternatingPratt(t, 1e13, false)
	_, err := Solve(context.Background(), m, Options{})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.InvalidModel || !strings.Contains(fe.Message, "no mechanism") {
		t.Fatalf("ratio 1e13: got %v, want an invalid model saying there is no mechanism", err)
	}
	if len(fe.Problems) == 0 || !strings.HasPrefix(fe.Problems[0].Path, "sections/") {
		t.Errorf("ratio 1e13: problems %+v, want the stiffest member's section first", fe.Problems)
	}
	m, _ = alternatingPratt(t, 1e12, true)
	_, err = Solve(context.Background(), m, Options{})
	if fe, ok := fault.As(err); !ok || fe.Kind != fault.Unstable {
		t.Fatalf("without its diagonals: got %v, want a mechanism", err)
	}
}
