package model

import (
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

// ipe300 is the IPE 300 of EN 10365 in metres (see TestShapeCatalogue).
var ipe300 = ShapeSpec{Kind: ShapeI, Depth: 0.3, Width: 0.15, WebThickness: 0.0071, FlangeThickness: 0.0107, RootRadius: 0.015}

// TestCompileShape: a section given by its shape takes the shape's
// properties (the table values of IPE 300 in m: 53.81 cm², 8356 cm⁴,
// 557.1 cm³; EN 10365, from memory); a given value wins over the shape's.
func TestCompileShape(t *testing.T) {
	s := portal()
	shape := ipe300
	s.Sections[0] = SectionSpec{ID: "tube", Shape: &shape, TorsionConstant: num(2.012e-7)}
	s.Members[0].BucklingCurve = "b"
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	sec := m.Sections[0]
	for _, c := range []struct {
		what      string
		got, want float64
	}{
		{"area", sec.Area, 53.81e-4},
		{"second moment", sec.SecondMoment, 8356e-8},
		{"second moment y", sec.SecondMomentY, 603.8e-8},
		{"section modulus", sec.SectionModulus, 557.1e-6},
		{"torsion constant (given wins)", sec.TorsionConstant, 2.012e-7},
	} {
		if !scalar.EqualWithinRel(c.got, c.want, 2e-3) {
			t.Errorf("%s = %g, want %g", c.what, c.got, c.want)
		}
	}
	if m.Members[0].BucklingCurve != "b" || m.Members[1].BucklingCurve != "" {
		t.Errorf("buckling curves %q, %q", m.Members[0].BucklingCurve, m.Members[1].BucklingCurve)
	}
}

// TestCompileShapeProblems: contradictions and bad shapes carry pointers.
func TestCompileShapeProblems(t *testing.T) {
	cases := []struct {
		name, path, text string
		edit             func(s *Spec)
	}{
		{"area contradicts shape", "sections/0/area", "shape gives", func(s *Spec) {
			shape := ipe300
			s.Sections[0] = SectionSpec{ID: "tube", Area: Num(80e-4), Shape: &shape}
		}},
		{"modulus contradicts shape", "sections/0/section_modulus", "shape gives", func(s *Spec) {
			shape := ipe300
			s.Sections[0] = SectionSpec{ID: "tube", Shape: &shape, SectionModulus: num(300e-6)}
		}},
		{"flanges thicker than the depth", "sections/0/shape/flange_thickness", "flanges", func(s *Spec) {
			shape := ipe300
			shape.FlangeThickness = 0.2
			s.Sections[0] = SectionSpec{ID: "tube", Shape: &shape}
		}},
		{"unknown curve", "members/1/buckling_curve", "a0", func(s *Spec) { s.Members[1].BucklingCurve = "e" }},
		{"non-positive modulus", "sections/0/section_modulus", "positive", func(s *Spec) { s.Sections[0].SectionModulus = num(-1) }},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			s := portal()
			tc.edit(s)
			_, err := Compile(s)
			fe, ok := fault.As(err)
			if !ok {
				t.Fatalf("err = %v, want a fault", err)
			}
			for _, p := range fe.Problems {
				if strings.TrimPrefix(p.Path, "/") == tc.path && strings.Contains(p.Message, tc.text) {
					return
				}
			}
			t.Errorf("no problem at %q mentioning %q; got %+v", tc.path, tc.text, fe.Problems)
		})
	}
}
