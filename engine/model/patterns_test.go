package model

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"gusset/engine/fault"
)

// spans returns the triangle with three more load cases, one per "span",
// for pattern loading.
func spans() *Spec {
	s := triangle()
	for _, id := range []string{"L1", "L2", "L3"} {
		s.LoadCases = append(s.LoadCases, LoadCaseSpec{ID: id,
			Loads: []NodalLoadSpec{{Node: "B", Force: []Value{Num(0), Num(-1)}}}})
	}
	return s
}

func TestPatternsGenerateEveryOnOffCombination(t *testing.T) {
	s := spans()
	s.Patterns = []PatternSpec{{ID: "live", Permanent: map[string]float64{"dead": 1.35},
		Variable: []VariableSpec{{Case: "L1", FactorOn: fptr(1.5)}, {Case: "L2", FactorOn: fptr(1.5), FactorOff: fptr(0.5)}, {Case: "L3"}}}}
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	// Three variable cases have 2³ = 8 on/off patterns (counting all
	// subsets of a 3-set, common practice), after the given combination.
	if got := len(m.Combinations); got != 1+8 {
		t.Fatalf("%d combinations, want 9", got)
	}
	want := []string{"live/all-off", "live/on:L1", "live/on:L2", "live/on:L1+L2", "live/on:L3", "live/on:L1+L3", "live/on:L2+L3", "live/on:L1+L2+L3"}
	for k, id := range want {
		cb := m.Combinations[1+k]
		if cb.ID != id || cb.Pattern != "live" {
			t.Errorf("combination %d is %q of pattern %q, want %q of live", 1+k, cb.ID, cb.Pattern, id)
		}
	}
	// live/on:L1+L3: dead 1.35, L1 on 1.5, L2 off 0.5, L3 on 1 (default).
	got := fmt.Sprint(m.Combinations[1+5].Terms)
	if wantTerms := "[{0 1.35} {1 1.5} {2 0.5} {3 1}]"; got != wantTerms {
		t.Errorf("terms of live/on:L1+L3 are %s, want %s", got, wantTerms)
	}
	// All off: L1 and L3 (off factor 0) leave no term.
	if got := fmt.Sprint(m.Combinations[1].Terms); got != "[{0 1.35} {2 0.5}]" {
		t.Errorf("terms of live/all-off are %s", got)
	}
	if m.CombinationIndex("live/on:L2+L3") != 7 {
		t.Errorf("generated combinations are not found by id")
	}
}

func TestPatternsEachMode(t *testing.T) {
	s := spans()
	s.Patterns = []PatternSpec{{ID: "p", Mode: "each", Variable: []VariableSpec{{Case: "L1"}, {Case: "L2"}, {Case: "L3"}}}}
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	var ids []string
	for _, cb := range m.Combinations[1:] {
		ids = append(ids, cb.ID)
	}
	if got := strings.Join(ids, " "); got != "p/on:L1 p/on:L2 p/on:L3" {
		t.Errorf("mode each generated %s", got)
	}
}

func TestPatternProblems(t *testing.T) {
	many := make([]VariableSpec, MaxPatternVariables+1)
	for k := range many {
		many[k] = VariableSpec{Case: "L1"}
	}
	cases := []struct {
		name    string
		pattern PatternSpec
		path    string
		message string
	}{
		{"too many variable cases", PatternSpec{ID: "p", Variable: many}, "patterns/0/variable", "2048 combinations"},
		{"unknown case", PatternSpec{ID: "p", Variable: []VariableSpec{{Case: "snow"}}}, "patterns/0/variable/0/case", `"snow", which does not exist`},
		{"unknown permanent case", PatternSpec{ID: "p", Permanent: map[string]float64{"x/y": 1}, Variable: []VariableSpec{{Case: "L1"}}}, "patterns/0/permanent/x~1y", "does not exist"},
		{"case twice", PatternSpec{ID: "p", Permanent: map[string]float64{"L1": 1}, Variable: []VariableSpec{{Case: "L1"}}}, "patterns/0/variable/0/case", "twice"},
		{"no variable cases", PatternSpec{ID: "p"}, "patterns/0/variable", "no variable cases"},
		{"empty id", PatternSpec{Variable: []VariableSpec{{Case: "L1"}}}, "patterns/0/id", "empty id"},
		{"bad mode", PatternSpec{ID: "p", Mode: "some", Variable: []VariableSpec{{Case: "L1"}}}, "patterns/0/mode", `"all"`},
		{"id clash", PatternSpec{ID: "p", Mode: "each", Variable: []VariableSpec{{Case: "L1"}}}, "patterns/0/id", "already the id of a combination"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			s := spans()
			s.Combos = append(s.Combos, CombinationSpec{ID: "p/on:L1", Factors: map[string]float64{"L1": 1}})
			s.Patterns = []PatternSpec{tc.pattern}
			_, err := Compile(s)
			var fe *fault.Error
			if !errors.As(err, &fe) {
				t.Fatalf("err = %v, want a fault", err)
			}
			for _, p := range fe.Problems {
				if p.Path == tc.path && strings.Contains(p.Message, tc.message) {
					return
				}
			}
			t.Errorf("problems %v lack %s: …%s…", fe.Problems, tc.path, tc.message)
		})
	}
}

func TestPatternsLimitOfGeneratedCombinations(t *testing.T) {
	s := spans()
	ten := make([]VariableSpec, MaxPatternVariables)
	for k := range ten {
		id := fmt.Sprintf("V%d", k)
		s.LoadCases = append(s.LoadCases, LoadCaseSpec{ID: id})
		ten[k] = VariableSpec{Case: id}
	}
	for i := range 5 {
		s.Patterns = append(s.Patterns, PatternSpec{ID: fmt.Sprintf("p%d", i), Variable: ten})
	}
	// Four patterns of 1024 reach the limit of 4096; the fifth passes it.
	_, err := Compile(s)
	var fe *fault.Error
	if !errors.As(err, &fe) || len(fe.Problems) != 1 || fe.Problems[0].Path != "patterns/4" {
		t.Fatalf("err = %v, want one problem at patterns/4", err)
	}
}
