package model

import (
	"slices"
	"strconv"
	"strings"
)

// PatternSpec generates combinations for pattern loading: the permanent
// cases with their factors in every combination, and the variable cases
// each either on (FactorOn) or off (FactorOff) in every pattern that
// Mode asks for.
type PatternSpec struct {
	// ID names the pattern; the generated combinations are called
	// "<id>/on:<case>+<case>…" (the variable cases on, in the order given)
	// or "<id>/all-off".
	ID string
	// Permanent maps load-case ids to the factor they carry in every
	// generated combination.
	Permanent map[string]float64
	// Variable lists the cases that are switched on and off.
	Variable []VariableSpec
	// Mode is "all" (every on/off pattern: 2ⁿ combinations for n variable
	// cases, the all-off one included) or "each" (each variable case on
	// alone: n combinations); empty means "all".
	Mode string
}

// VariableSpec is one variable case of a pattern with its factors.
type VariableSpec struct {
	Case      string
	FactorOn  *float64 // nil means 1
	FactorOff *float64 // nil means 0
}

// Pattern limits: at most MaxPatternVariables variable cases in a pattern
// of mode "all" (2¹⁰ = 1024 combinations), and at most MaxPatternCombinations
// generated combinations in a model.
const (
	MaxPatternVariables    = 10
	MaxPatternCombinations = 4096
)

// patterns compiles s.Patterns into combinations appended to
// m.Combinations (after the given ones), each with its Pattern set.
func (c *compiler) patterns() {
	s, m := c.spec, c.m
	taken := make(map[string]string, len(s.LoadCases)+len(m.Combinations))
	for _, lc := range s.LoadCases {
		taken[lc.ID] = "a load case"
	}
	for _, cb := range m.Combinations {
		taken[cb.ID] = "a combination"
	}
	seen := map[string]int{}
	generated := 0
	for i := range s.Patterns {
		ps := &s.Patterns[i]
		base := "patterns/" + strconv.Itoa(i)
		switch j, dup := seen[ps.ID]; {
		case ps.ID == "":
			c.problem(base+"/id", "pattern %d has an empty id; give it a unique id", i)
			continue
		case dup:
			c.problem(base+"/id", "pattern id %q is used twice (also by patterns/%d); ids must be unique", ps.ID, j)
			continue
		}
		seen[ps.ID] = i
		fixed, variable, ok := c.patternTerms(ps, base)
		if !ok {
			continue
		}
		count := 1 << len(variable)
		if ps.Mode == "each" {
			count = len(variable)
		}
		generated += count
		if generated > MaxPatternCombinations {
			c.problem(base, "pattern %q would bring the generated combinations to %d, more than the limit of %d; split the variable cases over fewer patterns or use mode \"each\"", ps.ID, generated, MaxPatternCombinations)
			return
		}
		for k := range count {
			on := uint(k)
			if ps.Mode == "each" {
				on = 1 << k
			}
			cb := patternCombination(ps, fixed, variable, on)
			if what, clash := taken[cb.ID]; clash {
				c.problem(base+"/id", "pattern %q generates the combination %q, which is already the id of %s; rename the pattern", ps.ID, cb.ID, what)
				break
			}
			taken[cb.ID] = "a generated combination"
			m.Combinations = append(m.Combinations, cb)
		}
	}
}

// patternVariable is a compiled variable case of a pattern.
type patternVariable struct {
	id      string
	term    int // load-case index
	on, off float64
}

// patternTerms resolves a pattern's case ids and factors, reporting every
// problem with its pointer; ok is false when there was one.
func (c *compiler) patternTerms(ps *PatternSpec, base string) (fixed []Term, variable []patternVariable, ok bool) {
	before := len(c.problems)
	caseIndex := func(id, path string) int {
		i := c.m.CaseIndex(id)
		if i < 0 {
			c.problem(path, "pattern %q names load case %q, which does not exist%s", ps.ID, id,
				listIDs("; cases are: ", len(c.m.Cases), func(i int) string { return c.m.Cases[i].ID }))
		}
		return i
	}
	factor := func(v *float64, fallback float64, path string) float64 {
		if v == nil {
			return fallback
		}
		if !finite(*v) {
			c.problem(path, "factor must be a finite number, got %v", *v)
		}
		return *v
	}
	used := map[string]string{}
	for _, id := range sortedKeys(ps.Permanent) {
		path := base + "/permanent/" + escapePointer(id)
		f := ps.Permanent[id]
		if ci := caseIndex(id, path); ci >= 0 && finite(f) {
			fixed = append(fixed, Term{Case: ci, Factor: f})
		} else if ci >= 0 {
			c.problem(path, "factor of %q must be a finite number, got %v", id, f)
		}
		used[id] = path
	}
	switch {
	case len(ps.Variable) == 0:
		c.problem(base+"/variable", "pattern %q has no variable cases; list at least one", ps.ID)
	case ps.Mode != "each" && len(ps.Variable) > MaxPatternVariables:
		c.problem(base+"/variable", "pattern %q has %d variable cases: all on/off patterns of them would be %d combinations, and the limit is %d cases (%d combinations); split them over several patterns or use mode \"each\"",
			ps.ID, len(ps.Variable), uint64(1)<<min(len(ps.Variable), 63), MaxPatternVariables, 1<<MaxPatternVariables)
	}
	if ps.Mode != "" && ps.Mode != "all" && ps.Mode != "each" {
		c.problem(base+"/mode", "pattern %q has mode %q; use \"all\" (every on/off pattern) or \"each\" (each variable case on alone)", ps.ID, ps.Mode)
	}
	for k, v := range ps.Variable {
		path := base + "/variable/" + strconv.Itoa(k)
		if prior, dup := used[v.Case]; dup {
			c.problem(path+"/case", "pattern %q names load case %q twice (also at %s); name each case once", ps.ID, v.Case, prior)
			continue
		}
		used[v.Case] = path + "/case"
		ci := caseIndex(v.Case, path+"/case")
		on := factor(v.FactorOn, 1, path+"/factor_on")
		off := factor(v.FactorOff, 0, path+"/factor_off")
		variable = append(variable, patternVariable{id: v.Case, term: ci, on: on, off: off})
	}
	return fixed, variable, len(c.problems) == before
}

// patternCombination builds the combination of pattern ps in which the
// variable cases whose bits are set in on are on.
func patternCombination(ps *PatternSpec, fixed []Term, variable []patternVariable, on uint) Combination {
	cb := Combination{Pattern: ps.ID}
	cb.Terms = make([]Term, 0, len(fixed)+len(variable))
	for _, t := range fixed {
		if t.Factor != 0 {
			cb.Terms = append(cb.Terms, t)
		}
	}
	var names []string
	for k, v := range variable {
		f := v.off
		if on&(1<<k) != 0 {
			f = v.on
			names = append(names, v.id)
		}
		if f != 0 {
			cb.Terms = append(cb.Terms, Term{Case: v.term, Factor: f})
		}
	}
	slices.SortFunc(cb.Terms, func(a, b Term) int { return a.Case - b.Case })
	cb.ID = ps.ID + "/all-off"
	if len(names) > 0 {
		cb.ID = ps.ID + "/on:" + strings.Join(names, "+")
	}
	return cb
}
