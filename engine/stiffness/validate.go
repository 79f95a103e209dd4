package stiffness

import (
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/statics"
)

// validate checks what the compiler cannot know (a 3D beam's axes) or
// what a model built by hand may get wrong, collecting every problem: non-
// positive modulus, area or beam properties, orientation parallel to a
// member, moments at nodes without rotational freedom and point loads off
// their member.
func validate(m *model.Model, nb *numbering) error {
	var problems []fault.Problem
	add := func(path, format string, args ...any) {
		problems = append(problems, fault.Problem{Path: path, Message: fmt.Sprintf(format, args...)})
	}
	positive := func(x float64) bool { return x > 0 && !math.IsInf(x, 0) }
	usedAsBeam := make([]bool, len(m.Sections))
	beamMaterial := make([]bool, len(m.Materials))
	for e, mem := range m.Members {
		if mem.Kind == model.Beam {
			usedAsBeam[mem.Section] = true
			beamMaterial[mem.Material] = true
			if _, ok := statics.MemberAxes(m, e); !ok {
				add(fmt.Sprintf("/members/%d/orientation", e), "member %q: the orientation vector is parallel to the member", mem.ID)
			}
		}
		if !(m.Length(e) > 0) {
			add(fmt.Sprintf("/members/%d", e), "member %q has zero length", mem.ID)
		}
	}
	for i, mat := range m.Materials {
		if !positive(mat.ElasticModulus) {
			add(fmt.Sprintf("/materials/%d/elastic_modulus", i), "material %q: the elastic modulus must be positive", mat.ID)
		}
		if m.Dim == 3 && beamMaterial[i] && !positive(mat.ShearModulus) {
			add(fmt.Sprintf("/materials/%d/shear_modulus", i), "material %q: 3D beams need a positive shear modulus", mat.ID)
		}
	}
	for i, sec := range m.Sections {
		if !positive(sec.Area) {
			add(fmt.Sprintf("/sections/%d/area", i), "section %q: the area must be positive", sec.ID)
		}
		if !usedAsBeam[i] {
			continue
		}
		if !positive(sec.SecondMoment) {
			add(fmt.Sprintf("/sections/%d/second_moment", i), "section %q: beams need a positive second moment", sec.ID)
		}
		if m.Dim == 3 && !positive(sec.SecondMomentY) {
			add(fmt.Sprintf("/sections/%d/second_moment_y", i), "section %q: 3D beams need a positive second moment about local y", sec.ID)
		}
		if m.Dim == 3 && !positive(sec.TorsionConstant) {
			add(fmt.Sprintf("/sections/%d/torsion_constant", i), "section %q: 3D beams need a positive torsion constant", sec.ID)
		}
	}
	validateReleases(m, add)
	for ci, lc := range m.Cases {
		for li, nl := range lc.Nodal {
			moment := nl.Moment[2] != 0
			if m.Dim == 3 {
				moment = nl.Moment != [3]float64{}
			}
			if moment && !nb.rotational[nl.Node] {
				add(fmt.Sprintf("/load_cases/%d/loads/%d/moment", ci, li),
					"node %q has no rotational freedom (no beam reaches it), so it cannot take a moment", m.NodeIDs[nl.Node])
			}
		}
		for li, ml := range lc.MemberLoads {
			if ml.Kind == model.Point && !(ml.Distance >= 0 && ml.Distance <= m.Length(ml.Member)) {
				add(fmt.Sprintf("/load_cases/%d/member_loads/%d/distance", ci, li),
					"the point load lies off member %q (distance %g, length %g)", m.Members[ml.Member].ID, ml.Distance, m.Length(ml.Member))
			}
		}
	}
	if len(problems) == 0 {
		return nil
	}
	msg := problems[0].Message
	if len(problems) > 1 {
		msg = fmt.Sprintf("%s (and %d more problems)", msg, len(problems)-1)
	}
	return &fault.Error{Kind: fault.InvalidModel, Message: msg, Problems: problems}
}
