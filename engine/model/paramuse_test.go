package model

import "testing"

// TestParamUsed checks which parameters the model's expressions read: the
// depth in a coordinate and the load in a force are read, the spare one
// declared but never written in an expression is not, and neither is a
// parameter that appears only in a plain number's place (none can).
func TestParamUsed(t *testing.T) {
	m, err := Compile(&Spec{Dimension: 2,
		Parameters: []ParameterSpec{{Name: "depth", Value: 3}, {Name: "spare", Value: 1}, {Name: "load", Value: 10}},
		Materials:  []MaterialSpec{{ID: "steel", ElasticModulus: Num(2.1e8)}},
		Sections:   []SectionSpec{{ID: "tube", Area: Num(0.002)}},
		Nodes: []NodeSpec{{ID: "A", At: []Value{Num(0), Num(0)}}, {ID: "B", At: []Value{Num(8), Num(0)}},
			{ID: "C", At: []Value{Num(4), Expr("depth")}}},
		Members: []MemberSpec{{ID: "AC", Ends: [2]string{"A", "C"}, Material: "steel", Section: "tube"},
			{ID: "BC", Ends: [2]string{"B", "C"}, Material: "steel", Section: "tube"}},
		Supports:  []SupportSpec{{Node: "A", Fix: []string{"x", "y"}}, {Node: "B", Fix: []string{"x", "y"}}},
		LoadCases: []LoadCaseSpec{{ID: "point", Loads: []NodalLoadSpec{{Node: "C", Force: []Value{Num(0), Expr("-load")}}}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []bool{true, false, true} {
		if got := m.ParamUsed(i); got != want {
			t.Errorf("ParamUsed(%d) (%s) = %v, want %v", i, m.ParamNames[i], got, want)
		}
	}
	if m.ParamUsed(-1) || m.ParamUsed(3) {
		t.Error("an index outside the parameters counts as used")
	}
}
