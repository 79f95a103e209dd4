package model

import (
	"math"
)

// shapeTolerance is how far (relative) a given area, second moment or
// section modulus may lie from the one its section's shape gives before
// the two are taken to contradict each other: catalogue values differ
// from the simplified formulas by a few per cent at most (our own rule,
// not a code's).
const shapeTolerance = 0.10

// sectionModuli compiles the given elastic section moduli.
func (c *compiler) sectionModuli(i int) {
	ss, sec := &c.spec.Sections[i], &c.m.Sections[i]
	bind := func(set func(*Section, float64)) binding {
		return binding{target: targetSections, sign: positive, set: func(m *Model, v float64) { set(&m.Sections[i], v) }}
	}
	if ss.SectionModulus != nil {
		sec.SectionModulus = c.positive(*ss.SectionModulus, pathf("sections/%d/section_modulus", i), "section", ss.ID, "section_modulus",
			bind(func(s *Section, v float64) { s.SectionModulus = v }))
	}
	if ss.SectionModulusY != nil {
		sec.SectionModulusY = c.positive(*ss.SectionModulusY, pathf("sections/%d/section_modulus_y", i), "section", ss.ID, "section_modulus_y",
			bind(func(s *Section, v float64) { s.SectionModulusY = v }))
	}
}

// sectionShape fills the properties that section i does not give from its
// shape, and reports a given area, second moment or section modulus that
// contradicts the shape (more than shapeTolerance apart) at the given
// value's pointer. Given values win over derived ones; the torsion
// constant is not compared, since the shape's ignores the root fillets.
func (c *compiler) sectionShape(i int) {
	ss, sec := &c.spec.Sections[i], &c.m.Sections[i]
	props, bad, msg := ss.Shape.Properties()
	if bad != "" {
		c.problem(pathf("sections/%d/shape/%s", i, bad)(), "section %q: %s", ss.ID, msg)
		return
	}
	take := func(given bool, name string, value *float64, derived float64, compare bool) {
		if !given {
			*value = derived
			return
		}
		if compare && !math.IsNaN(*value) && math.Abs(*value-derived) > shapeTolerance*derived {
			c.problem(pathf("sections/%d/%s", i, name)(),
				"section %q gives %s %g but its shape gives %g, more than %g %% apart: correct one of them, or leave the given value out to use the shape's",
				ss.ID, name, *value, derived, 100*shapeTolerance)
		}
	}
	take(ss.Area.IsExpr || ss.Area.Num != 0, "area", &sec.Area, props.Area, true)
	take(ss.SecondMoment != nil, "second_moment", &sec.SecondMoment, props.SecondMoment, true)
	take(ss.SecondMomentY != nil, "second_moment_y", &sec.SecondMomentY, props.SecondMomentY, true)
	take(ss.TorsionConstant != nil, "torsion_constant", &sec.TorsionConstant, props.TorsionConstant, false)
	take(ss.SectionModulus != nil, "section_modulus", &sec.SectionModulus, props.SectionModulus, true)
	take(ss.SectionModulusY != nil, "section_modulus_y", &sec.SectionModulusY, props.SectionModulusY, true)
}

// BucklingCurves maps the buckling curves of EN 1993-1-1:2005 Table 6.1 to
// their imperfection factors α.
var BucklingCurves = map[string]float64{"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}

// bucklingCurve checks member i's buckling curve name.
func (c *compiler) bucklingCurve(i int) {
	ms := &c.spec.Members[i]
	if _, ok := BucklingCurves[ms.BucklingCurve]; !ok {
		c.problem(pathf("members/%d/buckling_curve", i)(), "member %q has buckling_curve %q; use \"a0\", \"a\", \"b\", \"c\" or \"d\" (EN 1993-1-1 Table 6.1)", ms.ID, ms.BucklingCurve)
		return
	}
	c.m.Members[i].BucklingCurve = ms.BucklingCurve
}
