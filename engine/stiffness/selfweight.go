package stiffness

import (
	"fmt"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// noteSelfWeight warns, for each material without a weight density whose
// members a requested case loads by their own weight, that those members
// carry no self-weight: a sentence in res.Warnings and a problem in
// res.Unchecked at the material's weight_density ("/materials/i/...", as
// the other unchecked notes have it), so that a host can point at it.
// Absent and zero densities alike count as none.
func noteSelfWeight(m *model.Model, requests []request, res *Result) {
	cases := map[int]bool{}
	for _, rq := range requests {
		for _, t := range rq.terms {
			if m.Cases[t.Case].SelfWeight && t.Factor != 0 {
				cases[t.Case] = true
			}
		}
	}
	if len(cases) == 0 {
		return
	}
	var names []string
	for i, lc := range m.Cases {
		if cases[i] {
			names = append(names, fmt.Sprintf("%q", lc.ID))
		}
	}
	members := make([][]string, len(m.Materials))
	for _, mem := range m.Members {
		if m.Materials[mem.Material].WeightDensity == 0 {
			members[mem.Material] = append(members[mem.Material], mem.ID)
		}
	}
	for i, ids := range members {
		if len(ids) == 0 {
			continue
		}
		listed, more := ids, ""
		if len(listed) > 5 {
			listed, more = listed[:5], ", …"
		}
		msg := fmt.Sprintf("load case %s adds self-weight, but material %q has no weight_density: its %d member(s) (%s%s) carry none; give the material a weight_density",
			strings.Join(names, ", "), m.Materials[i].ID, len(ids), strings.Join(listed, ", "), more)
		res.Warnings = append(res.Warnings, msg)
		res.Unchecked = append(res.Unchecked, fault.Problem{Path: fmt.Sprintf("/materials/%d/weight_density", i), Message: msg})
	}
}
