package model

import (
	"math"
	"strconv"
)

// Shape kinds of ShapeSpec.Kind.
const (
	ShapeI         = "i"         // rolled I or H section: depth, width, web and flange thickness, root radius
	ShapeRHS       = "rhs"       // rectangular (or square) hollow section: depth, width, thickness
	ShapeCHS       = "chs"       // circular hollow section: diameter, thickness
	ShapeRectangle = "rectangle" // solid rectangle: depth, width
	ShapeRound     = "round"     // solid round: diameter
)

// ShapeSpec describes a cross-section by its shape. Dimensions are in the
// model's length unit. Depth runs along the member's local y axis and
// width along local z, so SecondMoment (about local z) is the major-axis
// second moment of an I section or a hollow section deeper than wide.
type ShapeSpec struct {
	Kind            string
	Depth           float64
	Width           float64
	WebThickness    float64
	FlangeThickness float64
	RootRadius      float64 // I sections; 0 means square corners
	Thickness       float64 // hollow sections: wall thickness
	Diameter        float64
}

// ShapeProperties are the properties of a cross-section that follow from
// its shape: area, second moments about local z and y, St Venant's
// torsion constant, and elastic section moduli (second moment over the
// distance to the extreme fibre) about local z and y.
type ShapeProperties struct {
	Area, SecondMoment, SecondMomentY, TorsionConstant float64
	SectionModulus, SectionModulusY                    float64
}

// spandrel returns the area, the distance of the centroid from its base
// edge and the second moment about its own centroidal axis parallel to
// that edge, of the fillet between two faces at a right angle and a
// quarter circle of radius r (a root fillet or the material a rounded
// corner removes): A = (1 − π/4)r², ȳ = r(10 − 3π)/(12 − 3π),
// I_base = r⁴(1 − 5π/16) (a square less a quarter disc, by the parallel
// axis theorem; the same fillet terms stand in the property formulas of
// EN 10365 and EN 10210-2, Annex B, from memory).
func spandrel(r float64) (area, centroid, own float64) {
	area = (1 - math.Pi/4) * r * r
	centroid = r * (10 - 3*math.Pi) / (12 - 3*math.Pi)
	base := r * r * r * r * (1 - 5*math.Pi/16)
	return area, centroid, base - area*centroid*centroid
}

// Properties returns the shape's properties, or the name of the offending
// field and a sentence (both empty when all is well) when a dimension is
// missing or the dimensions do not make the shape.
func (s *ShapeSpec) Properties() (ShapeProperties, string, string) {
	switch s.Kind {
	case ShapeI:
		return s.iSection()
	case ShapeRHS:
		return s.hollowRectangle()
	case ShapeCHS:
		if bad, msg := need(map[string]float64{"diameter": s.Diameter, "thickness": s.Thickness}); bad != "" {
			return ShapeProperties{}, bad, msg
		}
		if 2*s.Thickness >= s.Diameter {
			return ShapeProperties{}, "thickness", "the wall thickness must be less than half the diameter"
		}
		// EN 10210-2, Annex B (from memory): the annulus.
		d, di := s.Diameter, s.Diameter-2*s.Thickness
		i := math.Pi * (d*d*d*d - di*di*di*di) / 64
		return ShapeProperties{Area: math.Pi * (d*d - di*di) / 4, SecondMoment: i, SecondMomentY: i,
			TorsionConstant: 2 * i, SectionModulus: 2 * i / d, SectionModulusY: 2 * i / d}, "", ""
	case ShapeRectangle:
		if bad, msg := need(map[string]float64{"depth": s.Depth, "width": s.Width}); bad != "" {
			return ShapeProperties{}, bad, msg
		}
		h, b := s.Depth, s.Width
		return ShapeProperties{Area: h * b, SecondMoment: b * h * h * h / 12, SecondMomentY: h * b * b * b / 12,
			TorsionConstant: rectangleTorsion(h, b), SectionModulus: b * h * h / 6, SectionModulusY: h * b * b / 6}, "", ""
	case ShapeRound:
		if bad, msg := need(map[string]float64{"diameter": s.Diameter}); bad != "" {
			return ShapeProperties{}, bad, msg
		}
		d := s.Diameter
		i := math.Pi * d * d * d * d / 64
		return ShapeProperties{Area: math.Pi * d * d / 4, SecondMoment: i, SecondMomentY: i, TorsionConstant: 2 * i,
			SectionModulus: 2 * i / d, SectionModulusY: 2 * i / d}, "", ""
	}
	return ShapeProperties{}, "kind", "unknown shape " + strconv.Quote(s.Kind) + `; use "i", "rhs", "chs", "rectangle" or "round"`
}

// rectangleTorsion is St Venant's torsion constant of a solid h × b
// rectangle, J = a·b³[1/3 − 0.21(b/a)(1 − b⁴/12a⁴)] with a ≥ b the longer
// side (Young & Budynas, Roark's Formulas for Stress and Strain, 7th ed.,
// 2002, Table 10.7 case 4, within 4 % for every ratio; from memory).
func rectangleTorsion(h, b float64) float64 {
	a, c := max(h, b), min(h, b)
	r := c / a
	return a * c * c * c * (1.0/3 - 0.21*r*(1-r*r*r*r/12))
}

// need names the first missing (non-positive or non-finite) dimension, in
// a fixed order.
func need(dims map[string]float64) (string, string) {
	for _, name := range []string{"depth", "width", "web_thickness", "flange_thickness", "thickness", "diameter"} {
		v, ok := dims[name]
		if ok && !(v > 0 && !math.IsInf(v, 0)) {
			return name, "this shape needs a positive, finite " + name
		}
	}
	return "", ""
}

// iSection: a doubly symmetric rolled I or H section with root fillets
// (EN 10365:2017, the dimensions and the property formulas of its
// catalogue: flanges, web and four root fillets; from memory). The
// torsion constant ignores the root fillets and the flange–web junctions:
// J = (2·b·tf³ + (h − 2tf)·tw³)/3, the open thin-walled rectangles (Young
// & Budynas, Roark, 2002, Table 10.7 case 26, from memory), which is below
// the catalogue value (about 15 % for IPE, 25 % for HEB): less stiff in
// torsion, never stiffer.
func (s *ShapeSpec) iSection() (ShapeProperties, string, string) {
	if bad, msg := need(map[string]float64{"depth": s.Depth, "width": s.Width, "web_thickness": s.WebThickness, "flange_thickness": s.FlangeThickness}); bad != "" {
		return ShapeProperties{}, bad, msg
	}
	h, b, tw, tf, r := s.Depth, s.Width, s.WebThickness, s.FlangeThickness, s.RootRadius
	switch {
	case 2*tf >= h:
		return ShapeProperties{}, "flange_thickness", "two flanges are as thick as the section is deep"
	case tw >= b:
		return ShapeProperties{}, "web_thickness", "the web is as thick as the flanges are wide"
	case r < 0 || math.IsInf(r, 0) || math.IsNaN(r):
		return ShapeProperties{}, "root_radius", "the root radius must be zero or positive and finite"
	case tw+2*r > b || 2*tf+2*r > h:
		return ShapeProperties{}, "root_radius", "the root fillets do not fit between the web and the flange tips"
	}
	hw := h - 2*tf
	area := 2*b*tf + hw*tw
	iz := (b*h*h*h - (b-tw)*hw*hw*hw) / 12
	iy := (2*tf*b*b*b + hw*tw*tw*tw) / 12
	if r > 0 {
		fa, fc, fi := spandrel(r)
		area += 4 * fa
		dz := hw/2 - fc // fillet centroid from the major axis
		dy := tw/2 + fc // and from the minor axis
		iz += 4 * (fi + fa*dz*dz)
		iy += 4 * (fi + fa*dy*dy)
	}
	j := (2*b*tf*tf*tf + hw*tw*tw*tw) / 3
	return ShapeProperties{Area: area, SecondMoment: iz, SecondMomentY: iy, TorsionConstant: j,
		SectionModulus: iz / (h / 2), SectionModulusY: iy / (b / 2)}, "", ""
}

// hollowRectangle: a hot-finished rectangular hollow section (EN 10210-2:
// 2006, Annex B, from memory) with the outer corner radius 1.5t and the
// inner radius t that its property formulas assume: the outer rectangle
// less its four corner spandrels, less the inner rectangle less its four.
// Torsion by Annex B's thin-walled formula: J = t³·p/3 + 2K·Aₕ with the
// mean corner radius Rc = (1.5t + t)/2, the perimeter of the wall's
// centre line p = 2[(b − t) + (h − t)] − 2Rc(4 − π), the area it encloses
// Aₕ = (b − t)(h − t) − Rc²(4 − π), and K = 2Aₕ·t/p (from memory).
func (s *ShapeSpec) hollowRectangle() (ShapeProperties, string, string) {
	if bad, msg := need(map[string]float64{"depth": s.Depth, "width": s.Width, "thickness": s.Thickness}); bad != "" {
		return ShapeProperties{}, bad, msg
	}
	h, b, t := s.Depth, s.Width, s.Thickness
	if 2*t >= min(h, b) {
		return ShapeProperties{}, "thickness", "the walls meet: the thickness must be less than half the smaller side"
	}
	outer, inner := 1.5*t, t
	// Rectangle less four corner spandrels of radius r, second moments
	// about the axes through the centre (depth d along local y).
	rounded := func(d, w, r float64) (a, iz, iy float64) {
		fa, fc, fi := spandrel(r)
		a = d*w - 4*fa
		dz, dy := d/2-fc, w/2-fc
		iz = w*d*d*d/12 - 4*(fi+fa*dz*dz)
		iy = d*w*w*w/12 - 4*(fi+fa*dy*dy)
		return a, iz, iy
	}
	ao, izo, iyo := rounded(h, b, outer)
	ai, izi, iyi := rounded(h-2*t, b-2*t, inner)
	iz, iy := izo-izi, iyo-iyi
	rc := (outer + inner) / 2
	p := 2*((b-t)+(h-t)) - 2*rc*(4-math.Pi)
	ah := (b-t)*(h-t) - rc*rc*(4-math.Pi)
	k := 2 * ah * t / p
	j := t*t*t*p/3 + 2*k*ah
	return ShapeProperties{Area: ao - ai, SecondMoment: iz, SecondMomentY: iy, TorsionConstant: j,
		SectionModulus: iz / (h / 2), SectionModulusY: iy / (b / 2)}, "", ""
}
