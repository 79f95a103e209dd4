package stiffness

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestBucklingReduction checks χ at λ̄ = 0.2, 1.0 and 2.0 for the five
// curves against the tabulated values of EN 1993-1-1:2005 (Figure 6.4 and
// the χ tables of the design guides built on §6.3.1.2; from memory, four
// decimals).
func TestBucklingReduction(t *testing.T) {
	table := []struct {
		curve string
		chi   [3]float64 // λ̄ = 0.2, 1.0, 2.0
	}{
		{"a0", [3]float64{1, 0.7253, 0.2323}},
		{"a", [3]float64{1, 0.6656, 0.2229}},
		{"b", [3]float64{1, 0.5970, 0.2095}},
		{"c", [3]float64{1, 0.5399, 0.1962}},
		{"d", [3]float64{1, 0.4671, 0.1766}},
	}
	for _, row := range table {
		for k, lambda := range []float64{0.2, 1, 2} {
			t.Run(fmt.Sprintf("%s/λ=%g", row.curve, lambda), func(t *testing.T) {
				got := BucklingReduction(lambda, model.BucklingCurves[row.curve])
				if math.Abs(got-row.chi[k]) > 5e-5 {
					t.Errorf("χ = %.5f, table %.4f", got, row.chi[k])
				}
			})
		}
	}
}

// checkedSpan is a simply supported 2D beam (L = 10 m, I = 1e-4 m⁴,
// W = 1e-3 m³, f = 235 MPa in kN and m) under 10 kN/m and an end thrust.
func checkedSpan(thrust float64, curve string) *builder {
	b := newBuilder(2, 2.1e8, 0, 1e-2, 1e-4, 0, 0)
	b.m.Sections[0].SectionModulus = 1e-3
	b.m.Materials[0].TensionLimit, b.m.Materials[0].CompressionLimit = 2.35e5, 2.35e5
	n0, n1 := b.node(0, 0), b.node(10, 0)
	b.beam(n0, n1)
	b.m.Members[0].BucklingCurve = curve
	b.fix(n0, pinned2...)
	b.fix(n1, model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -10}})
	b.force(n1, [3]float64{-thrust, 0}, [3]float64{})
	return b
}

// TestBendingAndCombined: M = wL²/8 = 125 kN·m (Roark Table 8.1 case 2e)
// gives |M|/(W·f) = 125/235; with a thrust N the linear interaction adds
// N/(χ·A·f), χ from the curve at λ̄ = √(A·f/Ncr), Ncr = π²EI/L²
// (EN 1993-1-1 eq. 6.46–6.50 with k = 1).
func TestBendingAndCombined(t *testing.T) {
	b := checkedSpan(0, "b")
	r := solve1(t, b.m, Options{})
	mr := *r.Member(0, nil)
	near(t, "bending", mr.BendingUtilisation, 125.0/235, 1e-12)
	near(t, "axial", mr.AxialUtilisation, 0, 1e-12)
	near(t, "governing", r.Utilisation[0], 125.0/235, 1e-12)

	const thrust = 300.0
	b = checkedSpan(thrust, "b")
	r = solve1(t, b.m, Options{})
	mr = *r.Member(0, nil)
	squash := 1e-2 * 2.35e5
	ncr := math.Pi * math.Pi * 2.1e8 * 1e-4 / 100
	chi := BucklingReduction(math.Sqrt(squash/ncr), 0.34)
	near(t, "χ", mr.BucklingReduction, chi, 1e-12)
	near(t, "axial with buckling", mr.AxialUtilisation, thrust/(chi*squash), 1e-12)
	near(t, "combined", mr.CombinedUtilisation, thrust/(chi*squash)+125.0/235, 1e-12)
	near(t, "governing is the combined", r.Utilisation[0], mr.CombinedUtilisation, 1e-12)
}

// TestColumnOnTheCurve: a pinned column whose length puts λ̄ at exactly 1
// is checked against χ = 0.5970 on curve b (EN 1993-1-1 Table 6.1 and
// eq. 6.49), not against min(squash, Euler), which would be 1/0.597 ≈
// 1.7 times too high.
func TestColumnOnTheCurve(t *testing.T) {
	const e, a, i, f, n = 2.1e8, 1e-2, 1e-4, 2.35e5, 1000.0
	l := math.Pi * math.Sqrt(e*i/(a*f)) // Ncr = A·f
	b := newBuilder(2, e, 0, a, i, 0, 0)
	b.m.Materials[0].TensionLimit, b.m.Materials[0].CompressionLimit = f, f
	n0, n1 := b.node(0, 0), b.node(0, l)
	b.bar(n0, n1)
	b.m.Members[0].BucklingCurve = "b"
	b.fix(n0, pinned2...)
	b.fix(n1, model.X)
	b.force(n1, [3]float64{0, -n}, [3]float64{})
	r := solve1(t, b.m, Options{})
	near(t, "utilisation", r.Utilisation[0], n/(0.5970*a*f), 1e-4)
}

// TestUncheckedIsSaid: a beam without a section modulus is not reported
// as checked (utilisation −1, a note with the pointer); a member in
// compression without a buckling curve is checked on curve d and says so.
func TestUncheckedIsSaid(t *testing.T) {
	b := checkedSpan(100, "")
	b.m.Sections[0].SectionModulus = 0
	res, err := Solve(t.Context(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if u := res.Cases[0].Utilisation[0]; u != -1 {
		t.Errorf("utilisation %g of a beam whose bending is unchecked, want -1", u)
	}
	want := map[string]string{"/sections/0/section_modulus": "not made", "/members/0/buckling_curve": "curve, d"}
	for path, text := range want {
		found := false
		for _, p := range res.Unchecked {
			found = found || (p.Path == path && strings.Contains(p.Message, text))
		}
		if !found {
			t.Errorf("no note at %s saying %q: %+v", path, text, res.Unchecked)
		}
	}
	// A bar loaded across its length without a section modulus: it bends
	// as a simple span, but its bending cannot be checked.
	b = newBuilder(2, 2.1e8, 0, 1e-2, 0, 0, 0)
	b.m.Materials[0].TensionLimit = 2.35e5
	n0, n1 := b.node(0, 0), b.node(4, 0)
	b.bar(n0, n1)
	b.fix(n0, pinned2...)
	b.fix(n1, model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -1}})
	res, err = Solve(t.Context(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if u := res.Cases[0].Utilisation[0]; u != -1 || len(res.Unchecked) == 0 || res.Unchecked[0].Path != "/sections/0/section_modulus" ||
		!strings.Contains(res.Unchecked[0].Message, "bends") {
		t.Errorf("bar loaded across: utilisation %g, notes %+v", u, res.Unchecked)
	}
}
