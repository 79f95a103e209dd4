package loadpath

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestSectionCoefficient checks c = I/A² of each named family against the
// section properties of the shape itself (circle A = πd²/4, I = πd⁴/64;
// square A = b², I = b⁴/12; annulus A = π(D² − d²)/4, I = π(D⁴ − d⁴)/64:
// W. C. Young & R. G. Budynas, Roark's Formulas for Stress and Strain, 7th
// ed., 2002, table A.1, from memory) and the thin-walled limit r/(8π)
// (A ≈ πDt, I ≈ πD³t/8, same source).
func TestSectionCoefficient(t *testing.T) {
	annulus := func(D, t float64) float64 {
		d := D - 2*t
		A := math.Pi * (D*D - d*d) / 4
		I := math.Pi * (math.Pow(D, 4) - math.Pow(d, 4)) / 64
		return I / (A * A)
	}
	b := 0.37
	for _, tc := range []struct {
		name string
		f    SectionFamily
		want float64
		tol  float64
	}{
		{"solid round", SectionFamily{Shape: ShapeSolidRound}, (math.Pi * math.Pow(0.2, 4) / 64) / math.Pow(math.Pi*0.04/4, 2), 1e-14},
		{"solid square", SectionFamily{Shape: ShapeSolidSquare}, (math.Pow(b, 4) / 12) / math.Pow(b*b, 2), 1e-14},
		{"tube D/t=20", SectionFamily{Shape: ShapeTube, DiameterToThickness: 20}, annulus(100, 5), 1e-13},
		{"tube D/t=168.3/8", SectionFamily{Shape: ShapeTube, DiameterToThickness: 168.3 / 8}, annulus(168.3, 8), 1e-13},
		{"tube D/t=2 is solid", SectionFamily{Shape: ShapeTube, DiameterToThickness: 2}, 1 / (4 * math.Pi), 1e-14},
		{"thin tube D/t=1e6", SectionFamily{Shape: ShapeTube, DiameterToThickness: 1e6}, 1e6 / (8 * math.Pi), 2e-6},
		{"given", SectionFamily{Coefficient: 0.75}, 0.75, 0},
		{"none", SectionFamily{}, 0, 0},
	} {
		c, ok, reason := tc.f.SectionCoefficient()
		if !ok || !scalar.EqualWithinAbsOrRel(c, tc.want, 0, tc.tol) {
			t.Errorf("%s: c=%g ok=%v (%s), want %g", tc.name, c, ok, reason, tc.want)
		}
	}
	for _, f := range []SectionFamily{
		{Shape: ShapeTube, DiameterToThickness: 1.5},
		{Shape: ShapeTube},
		{Shape: "hexagon"},
		{Coefficient: -1},
		{Coefficient: math.Inf(1)},
	} {
		if _, ok, reason := f.SectionCoefficient(); ok || reason == "" {
			t.Errorf("%+v: accepted", f)
		}
	}
}
