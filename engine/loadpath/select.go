package loadpath

import (
	"fmt"

	"gusset/engine/fault"
)

// Select returns the cases whose ids are listed, in the order listed, or a
// *fault.Error of kind UnknownCase with one problem per id not found (path
// "/cases/k" for the k-th id; the caller prefixes it with the pointer of
// its list). An empty ids list selects every case.
func Select(cases []Case, ids []string) ([]Case, error) {
	if len(ids) == 0 {
		return cases, nil
	}
	byID := make(map[string]int, len(cases))
	for i := range cases {
		if _, dup := byID[cases[i].ID]; !dup {
			byID[cases[i].ID] = i
		}
	}
	out := make([]Case, 0, len(ids))
	var problems []fault.Problem
	for k, id := range ids {
		i, ok := byID[id]
		if !ok {
			problems = append(problems, fault.Problem{Path: fmt.Sprintf("/cases/%d", k),
				Message: fmt.Sprintf("no load case or combination %q", id)})
			continue
		}
		out = append(out, cases[i])
	}
	if len(problems) > 0 {
		return nil, &fault.Error{Kind: fault.UnknownCase, Message: "unknown load case or combination", Problems: problems}
	}
	return out, nil
}
