package adapter

import (
	"errors"
	"fmt"
	"regexp"
	"strconv"

	"gusset/protocol"
)

// caseProblem matches a pointer into a load case or a combination.
var caseProblem = regexp.MustCompile(`^/params/model/(load_cases|combinations)/(\d+)(/|$)`)

// dropUnusedBadCases handles a model that failed to compile only because
// of load cases or combinations the request does not use (selected names
// the cases and combinations it asks for; nil means all, and then nothing
// is dropped). It removes them from w and returns one warning per removed
// entry, with its pointer in the request as sent, and true; otherwise it
// leaves w alone and returns false. A case a selected combination uses
// counts as used.
func dropUnusedBadCases(w *protocol.Model, selected []string, err error) ([]protocol.Problem, bool) {
	var pe *protocol.Error
	// A pattern's generated combinations use its cases unseen here, so a
	// model with patterns keeps every case.
	if selected == nil || len(w.Patterns) > 0 || !errors.As(err, &pe) || pe.Data == nil || len(pe.Data.Problems) == 0 {
		return nil, false
	}
	used := map[string]bool{}
	for _, id := range selected {
		used[id] = true
		for _, c := range w.Combinations {
			if c.ID == id {
				for caseID := range c.Factors {
					used[caseID] = true
				}
			}
		}
	}
	bad := map[string]map[int]string{"load_cases": {}, "combinations": {}} // index -> first message
	for _, p := range pe.Data.Problems {
		m := caseProblem.FindStringSubmatch(p.Path)
		if m == nil {
			return nil, false
		}
		i, _ := strconv.Atoi(m[2])
		if (m[1] == "load_cases" && (i >= len(w.LoadCases) || used[w.LoadCases[i].ID])) ||
			(m[1] == "combinations" && (i >= len(w.Combinations) || used[w.Combinations[i].ID])) {
			return nil, false
		}
		if _, seen := bad[m[1]][i]; !seen {
			bad[m[1]][i] = p.Message
		}
	}
	removed := map[string]bool{}
	var warnings []protocol.Problem
	var cases []protocol.LoadCase
	for i, c := range w.LoadCases {
		msg, ok := bad["load_cases"][i]
		if !ok {
			cases = append(cases, c)
			continue
		}
		removed[c.ID] = true
		warnings = append(warnings, protocol.Problem{Path: fmt.Sprintf("/params/model/load_cases/%d", i),
			Message: fmt.Sprintf("load case %q, which this request does not use, was left out: %s", c.ID, msg)})
	}
	var combinations []protocol.Combination
	for i, c := range w.Combinations {
		msg, ok := bad["combinations"][i]
		if !ok && !used[c.ID] {
			for caseID := range c.Factors {
				if removed[caseID] {
					ok, msg = true, fmt.Sprintf("it uses load case %q, which was left out", caseID)
					break
				}
			}
		}
		if !ok {
			combinations = append(combinations, c)
			continue
		}
		warnings = append(warnings, protocol.Problem{Path: fmt.Sprintf("/params/model/combinations/%d", i),
			Message: fmt.Sprintf("combination %q, which this request does not use, was left out: %s", c.ID, msg)})
	}
	w.LoadCases, w.Combinations = cases, combinations
	return warnings, true
}
