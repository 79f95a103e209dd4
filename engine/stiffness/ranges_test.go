package stiffness

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/model"
)

// TestRangesOfSimplySupportedBeam checks the exact ranges of a simply
// supported beam under a uniform load w and a point load P at a from the
// first end, against beam-table statics (Roark's Formulas for Stress and
// Strain, 7th ed., 2002, Table 8.1 cases 1a and 2a; derived in the test by
// superposition): with the reactions R₁ = wL/2 + P(L − a)/L and
// R₂ = wL/2 + Pa/L, the table shear V = R₁ − wx (− P past a) is −shear_y
// here, so shear_y runs from −R₁ at the first end to +R₂ at the second,
// and the moment (sagging positive) is largest where the table shear
// changes sign.
func TestRangesOfSimplySupportedBeam(t *testing.T) {
	const length, w, p, a = 8.0, 3.0, 20.0, 3.0
	b := newBuilder(2, 2.1e8, 8e7, 5e-3, 8e-5, 8e-5, 1e-5)
	n0, n1 := b.node(0, 0), b.node(length, 0)
	b.beam(n0, n1)
	b.fix(n0, pinned2...)
	b.fix(n1, model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}})
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Point, Value: [3]float64{0, -p}, Distance: a})
	r := solve1(t, b.m, Options{}).Member(0, nil).Ranges
	r1, r2 := w*length/2+p*(length-a)/length, w*length/2+p*a/length
	// The table shear R₁ − wx is 26.75 − 3x before a: positive there, and
	// 26.75 − 9 − 20 < 0 just past a, so the moment peaks at a.
	peak := r1*a - w*a*a/2
	cases := []struct {
		name     string
		got      Extreme
		want, at float64
	}{
		{"largest shear_y", r[RangeShearY].Max, r2, length},
		{"smallest shear_y", r[RangeShearY].Min, -r1, 0},
		{"largest moment_z", r[RangeMomentZ].Max, peak, a},
		{"smallest moment_z", r[RangeMomentZ].Min, 0, 0},
		{"largest axial", r[RangeAxial].Max, 0, 0},
	}
	for _, tc := range cases {
		if !scalar.EqualWithinAbsOrRel(tc.got.Value, tc.want, 1e-9, 1e-9) || !scalar.EqualWithinAbs(tc.got.At, tc.at, 1e-9) {
			t.Errorf("%s: %g at %g, want %g at %g", tc.name, tc.got.Value, tc.got.At, tc.want, tc.at)
		}
	}
	if r[RangeTorsion] != (Range{}) || r[RangeMomentY] != (Range{}) || r[RangeShearZ] != (Range{}) {
		t.Errorf("a 2D beam has 3D ranges %v", r[RangeShearZ:RangeMomentZ])
	}
}
