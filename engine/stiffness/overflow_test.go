package stiffness

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// overflowTriangle is the two-bar triangle of the bad-input catalogue
// (spans 8 m, apex (4, 3), area 0.002) with elastic modulus e and a
// vertical load p at the apex. Each bar is 5 m long and carries
// N = (p/2)/(3/5) = 5p/6 (equilibrium of the apex, by hand; compression
// for a downward p), and the apex moves by a distance of order p·L/(E·A).
func overflowTriangle(t *testing.T, e, p float64) *model.Model {
	t.Helper()
	m, err := model.Compile(&model.Spec{Dimension: 2,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(e)}},
		Sections:  []model.SectionSpec{{ID: "tube", Area: model.Num(0.002)}},
		Nodes: []model.NodeSpec{{ID: "A", At: []model.Value{model.Num(0), model.Num(0)}},
			{ID: "B", At: []model.Value{model.Num(8), model.Num(0)}}, {ID: "C", At: []model.Value{model.Num(4), model.Num(3)}}},
		Members: []model.MemberSpec{{ID: "AC", Ends: [2]string{"A", "C"}, Material: "steel", Section: "tube"},
			{ID: "BC", Ends: [2]string{"B", "C"}, Material: "steel", Section: "tube"}},
		Supports:  []model.SupportSpec{{Node: "A", Fix: []string{"x", "y"}}, {Node: "B", Fix: []string{"x", "y"}}},
		LoadCases: []model.LoadCaseSpec{{ID: "point", Loads: []model.NodalLoadSpec{{Node: "C", Force: []model.Value{model.Num(0), model.Num(p)}}}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// TestOverflowNamesTheInput checks that a valid model whose numbers leave
// the range of a double (largest finite value about 1.8e308, IEEE
// 754-2019 §3.6 binary64) is an invalid-model error pointing at the input
// that makes them overflow, not a mechanism or an unencodable result: with
// E = 1e-300 the displacements are of order p·L/(E·A) = 10·5/(2e-303) =
// 2.5e304, whose squares overflow; a load of 1e300 overflows the
// residual's sum of squares directly. The sound case beside them gives
// the hand value N = −5p/6.
func TestOverflowNamesTheInput(t *testing.T) {
	for _, tc := range []struct {
		name string
		e, p float64
		path string
	}{
		{"tiny-elastic-modulus", 1e-300, -10, "materials/0/elastic_modulus"},
		{"huge-load", 2.1e8, -1e300, "load_cases/0/loads/0/force/1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Solve(context.Background(), overflowTriangle(t, tc.e, tc.p), Options{})
			fe, ok := fault.As(err)
			if !ok || fe.Kind != fault.InvalidModel {
				t.Fatalf("got %v, want an invalid-model error", err)
			}
			if len(fe.Problems) == 0 || fe.Problems[0].Path != tc.path {
				t.Fatalf("problems %+v, want the first at %s", fe.Problems, tc.path)
			}
			if !strings.Contains(fe.Message, "overflow") {
				t.Errorf("message %q does not say the numbers overflow", fe.Message)
			}
			if errors.Is(err, &fault.Error{Kind: fault.Unstable}) {
				t.Error("reported as a mechanism")
			}
		})
	}
	r, err := Solve(context.Background(), overflowTriangle(t, 2.1e8, -10), Options{})
	if err != nil {
		t.Fatal(err)
	}
	for e, n := range r.Cases[0].AxialForce {
		if want := -5 * 10.0 / 6; math.Abs(n-want) > 1e-12*math.Abs(want) {
			t.Errorf("member %d: N = %v, want %v", e, n, want)
		}
	}
}
