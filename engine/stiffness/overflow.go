package stiffness

import (
	"fmt"
	"math"
	"strconv"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// overflowLimit is the magnitude beyond which a force or displacement
// counts as overflowing: its square, which norms and residuals form,
// exceeds the largest finite double, about 1.8e308 (IEEE 754-2019 binary64).
const overflowLimit = 1e150

// overflowError explains a solution that is not finite although its
// stiffness matrix factorised: the numbers left the range of a double.
// It names the input responsible, with its pointer: the largest load when
// that alone overflows, otherwise the softest member's elastic modulus or
// area (whichever lies further from 1 in orders of magnitude), whose
// displacements of about (largest load)/(E·A/L) overflow. When neither
// explains it, the error stays the numerically singular one.
func overflowError(m *model.Model) *fault.Error {
	load, loadPath := largestLoad(m)
	soft, k := softestMember(m)
	if load > overflowLimit {
		msg := fmt.Sprintf("the numbers overflow: a load of %.3g makes the forces and their squares exceed the range of a double (about 1.8e308); give the loads in a larger force unit", load)
		return &fault.Error{Kind: fault.InvalidModel, Message: msg, Problems: []fault.Problem{{Path: loadPath, Message: msg}}}
	}
	if soft < 0 || !(load/k > overflowLimit) {
		return fault.New(fault.Unstable, "the solution is not finite: the stiffness matrix is numerically singular")
	}
	mem := m.Members[soft]
	e, a := m.Materials[mem.Material].ElasticModulus, m.Sections[mem.Section].Area
	msg := fmt.Sprintf("the numbers overflow: member %q has axial stiffness E·A/L = %.3g (elastic_modulus %.3g, area %.3g), so loads up to %.3g move it by about %.3g, beyond the range of a double; check the units of the elastic modulus and the area",
		mem.ID, k, e, a, load, load/k)
	materialPath := "materials/" + strconv.Itoa(mem.Material) + "/elastic_modulus"
	sectionPath := "sections/" + strconv.Itoa(mem.Section) + "/area"
	problems := []fault.Problem{{Path: materialPath, Message: msg}, {Path: sectionPath, Message: msg}}
	if math.Abs(math.Log10(a)) > math.Abs(math.Log10(e)) {
		problems[0], problems[1] = problems[1], problems[0]
	}
	if loadPath != "" {
		problems = append(problems, fault.Problem{Path: loadPath, Message: fmt.Sprintf("the largest load, %.3g", load)})
	}
	return &fault.Error{Kind: fault.InvalidModel, Message: msg, Problems: problems}
}

// largestLoad returns the largest magnitude of a nodal force or moment
// component or member load value over every case (at least 1 when the
// model has no load, so that self-weight and settlements are measured
// against a unit load), and its pointer ("" when there is none).
func largestLoad(m *model.Model) (float64, string) {
	largest, path := 0.0, ""
	consider := func(v float64, at func() string) {
		if math.Abs(v) > largest {
			largest, path = math.Abs(v), at()
		}
	}
	for ci, lc := range m.Cases {
		for j, nl := range lc.Nodal {
			for k, v := range nl.Force[:m.Dim] {
				consider(v, func() string { return fmt.Sprintf("load_cases/%d/loads/%d/force/%d", ci, j, k) })
			}
			for k, v := range nl.Moment {
				consider(v, func() string { return fmt.Sprintf("load_cases/%d/loads/%d/moment", ci, j) + momentIndex(m.Dim, k) })
			}
		}
		for j, ml := range lc.MemberLoads {
			for k, v := range ml.Value[:m.Dim] {
				consider(v, func() string { return fmt.Sprintf("load_cases/%d/member_loads/%d/value/%d", ci, j, k) })
			}
		}
	}
	if largest == 0 {
		return 1, ""
	}
	return largest, path
}

// momentIndex is the wire index of moment component k (about x, y, z):
// a 2D model's one moment, about z, is entry 0.
func momentIndex(dim, k int) string {
	if dim == 2 {
		return "/0"
	}
	return "/" + strconv.Itoa(k)
}

// softestMember returns the member with the smallest axial stiffness
// E·A/L and that stiffness (−1 and 0 for a model without members).
func softestMember(m *model.Model) (int, float64) {
	soft, least := -1, math.Inf(1)
	for e, mem := range m.Members {
		k := m.Materials[mem.Material].ElasticModulus * m.Sections[mem.Section].Area / m.Length(e)
		if k < least {
			soft, least = e, k
		}
	}
	return soft, least
}
