package model

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestShapeCatalogue checks three catalogue shapes against their published
// tables (values from memory of the EN 10365 and EN 10210-2 tables, in cm
// units; mm in, mm out here). The catalogue properties include the root
// fillets, as ours do, so area and second moments agree to the tables'
// rounding; the torsion constant of an I section ignores the fillets and
// is checked only to be below the table value, within 25 %.
func TestShapeCatalogue(t *testing.T) {
	const cm2, cm3, cm4 = 1e2, 1e3, 1e4
	cases := []struct {
		name  string
		shape ShapeSpec
		want  ShapeProperties
		tol   float64
	}{
		// IPE 300: h 300, b 150, tw 7.1, tf 10.7, r 15 (EN 10365 table).
		{"IPE 300", ShapeSpec{Kind: ShapeI, Depth: 300, Width: 150, WebThickness: 7.1, FlangeThickness: 10.7, RootRadius: 15},
			ShapeProperties{Area: 53.81 * cm2, SecondMoment: 8356 * cm4, SecondMomentY: 603.8 * cm4, TorsionConstant: 20.12 * cm4,
				SectionModulus: 557.1 * cm3, SectionModulusY: 80.50 * cm3}, 2e-3},
		// HE 200 B: h 200, b 200, tw 9, tf 15, r 18 (EN 10365 table).
		{"HE 200 B", ShapeSpec{Kind: ShapeI, Depth: 200, Width: 200, WebThickness: 9, FlangeThickness: 15, RootRadius: 18},
			ShapeProperties{Area: 78.08 * cm2, SecondMoment: 5696 * cm4, SecondMomentY: 2003 * cm4, TorsionConstant: 59.28 * cm4,
				SectionModulus: 569.6 * cm3, SectionModulusY: 200.3 * cm3}, 2e-3},
		// CHS 168.3 × 8 (EN 10210-2 table): A 40.3 cm², I 1297 cm⁴,
		// Wel 154 cm³, It 2590 cm⁴ (tables round to three or four figures).
		{"CHS 168.3×8", ShapeSpec{Kind: ShapeCHS, Diameter: 168.3, Thickness: 8},
			ShapeProperties{Area: 40.3 * cm2, SecondMoment: 1297 * cm4, SecondMomentY: 1297 * cm4, TorsionConstant: 2594 * cm4,
				SectionModulus: 154 * cm3, SectionModulusY: 154 * cm3}, 3e-3},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, bad, msg := c.shape.Properties()
			if bad != "" {
				t.Fatalf("%s: %s", bad, msg)
			}
			check := func(what string, g, w, tol float64) {
				if !scalar.EqualWithinRel(g, w, tol) {
					t.Errorf("%s = %.5g, table %.5g (relative %.2g)", what, g, w, (g-w)/w)
				}
			}
			check("area", got.Area, c.want.Area, c.tol)
			check("second moment (major, local z)", got.SecondMoment, c.want.SecondMoment, c.tol)
			check("second moment (minor, local y)", got.SecondMomentY, c.want.SecondMomentY, c.tol)
			check("section modulus (major)", got.SectionModulus, c.want.SectionModulus, c.tol)
			check("section modulus (minor)", got.SectionModulusY, c.want.SectionModulusY, c.tol)
			if c.shape.Kind == ShapeI {
				if got.TorsionConstant > c.want.TorsionConstant || got.TorsionConstant < 0.75*c.want.TorsionConstant {
					t.Errorf("torsion constant %.4g: want below the table's %.4g, within 25 %%", got.TorsionConstant, c.want.TorsionConstant)
				}
				return
			}
			check("torsion constant", got.TorsionConstant, c.want.TorsionConstant, c.tol)
		})
	}
}

// TestShapeClosedForms checks the other shapes against closed forms:
// a solid rectangle bh³/12, bh²/6 and (square) J = 0.1406·a⁴ (Roark,
// 2002, Table 10.7 case 4, from memory: 2.25·(a/2)⁴ = 0.1406a⁴); a round
// πd⁴/64, πd³/32, J = πd⁴/32; an RHS whose walls are thin against Bredt's
// J = 4Aₕ²t/p (Timoshenko & Goodier, Theory of Elasticity, 1970, §115)
// and whose area with corners is 2t(b + h − 2t) − (4 − π)(r₀² − rᵢ²)
// (EN 10210-2 Annex B, from memory).
func TestShapeClosedForms(t *testing.T) {
	near := func(what string, g, w, tol float64) {
		t.Helper()
		if !scalar.EqualWithinRel(g, w, tol) {
			t.Errorf("%s = %.8g, want %.8g", what, g, w)
		}
	}
	r, _, _ := (&ShapeSpec{Kind: ShapeRectangle, Depth: 0.4, Width: 0.2}).Properties()
	near("rectangle I", r.SecondMoment, 0.2*0.4*0.4*0.4/12, 1e-14)
	near("rectangle Iy", r.SecondMomentY, 0.4*0.2*0.2*0.2/12, 1e-14)
	near("rectangle W", r.SectionModulus, 0.2*0.4*0.4/6, 1e-14)
	sq, _, _ := (&ShapeSpec{Kind: ShapeRectangle, Depth: 0.3, Width: 0.3}).Properties()
	near("square J", sq.TorsionConstant, 0.1406*0.3*0.3*0.3*0.3, 2e-3)
	d, _, _ := (&ShapeSpec{Kind: ShapeRound, Diameter: 0.1}).Properties()
	near("round J", d.TorsionConstant, 3.141592653589793*1e-4/32, 1e-14)
	near("round W", d.SectionModulus, 3.141592653589793*1e-3/32, 1e-14)
	const h, b, th = 300.0, 200.0, 2.0
	hs, _, _ := (&ShapeSpec{Kind: ShapeRHS, Depth: h, Width: b, Thickness: th}).Properties()
	near("RHS area", hs.Area, 2*th*(b+h-2*th)-(4-3.141592653589793)*(1.5*1.5-1)*th*th, 1e-12)
	ah, p := (h-th)*(b-th), 2*((h-th)+(b-th))
	near("RHS J, thin walls (Bredt)", hs.TorsionConstant, 4*ah*ah*th/p, 5e-3)
}

// TestShapeErrors: dimensions that do not make the shape name their field.
func TestShapeErrors(t *testing.T) {
	cases := []struct {
		shape ShapeSpec
		field string
	}{
		{ShapeSpec{Kind: ShapeI, Depth: 300, Width: 150, WebThickness: 7, FlangeThickness: 160}, "flange_thickness"},
		{ShapeSpec{Kind: ShapeI, Depth: 300, Width: 150, FlangeThickness: 10}, "web_thickness"},
		{ShapeSpec{Kind: ShapeRHS, Depth: 100, Width: 50, Thickness: 30}, "thickness"},
		{ShapeSpec{Kind: ShapeCHS, Diameter: 100}, "thickness"},
		{ShapeSpec{Kind: "tee", Depth: 1}, "kind"},
	}
	for _, c := range cases {
		if _, bad, _ := c.shape.Properties(); bad != c.field {
			t.Errorf("%+v: field %q, want %q", c.shape, bad, c.field)
		}
	}
}
