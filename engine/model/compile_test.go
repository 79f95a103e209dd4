package model

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

func num(x float64) *Value { v := Num(x); return &v }
func ex(s string) *Value   { v := Expr(s); return &v }
func fptr(x float64) *float64 {
	return &x
}

// triangle returns a small valid 2D model: a three-bar truss A–B–C with B
// raised by the parameter depth, pinned at A and on a roller at C.
func triangle() *Spec {
	return &Spec{
		Dimension:  2,
		Parameters: []ParameterSpec{{Name: "depth", Value: 3}, {Name: "span", Value: 8}, {Name: "w", Value: 10}},
		Materials: []MaterialSpec{{ID: "steel", ElasticModulus: Num(2.1e8), WeightDensity: num(77),
			TensionLimit: num(2.35e5), CompressionLimit: num(2.35e5), CarbonFactor: num(1.5)}},
		Sections: []SectionSpec{{ID: "tube", Area: Num(2e-3), SecondMoment: num(3e-6)}},
		Nodes: []NodeSpec{
			{ID: "A", At: []Value{Num(0), Num(0)}},
			{ID: "B", At: []Value{Expr("span/2"), Expr("depth")}},
			{ID: "C", At: []Value{Expr("span"), Num(0)}},
		},
		Members: []MemberSpec{
			{ID: "AB", Ends: [2]string{"A", "B"}, Material: "steel", Section: "tube", Type: "bar"},
			{ID: "BC", Ends: [2]string{"B", "C"}, Material: "steel", Section: "tube"},
			{ID: "AC", Ends: [2]string{"A", "C"}, Material: "steel", Section: "tube"},
		},
		Supports: []SupportSpec{{Node: "A", Fix: []string{"x", "y"}}, {Node: "C", Fix: []string{"y"}}},
		LoadCases: []LoadCaseSpec{{ID: "dead", SelfWeight: true,
			Loads: []NodalLoadSpec{{Node: "B", Force: []Value{Num(0), Expr("-w")}}}}},
		Combos: []CombinationSpec{{ID: "ultimate", Factors: map[string]float64{"dead": 1.35}}},
	}
}

// portal returns a small valid 3D model: one column and one beam.
func portal() *Spec {
	return &Spec{
		Dimension: 3,
		Materials: []MaterialSpec{{ID: "steel", ElasticModulus: Num(2.1e8)}},
		Sections:  []SectionSpec{{ID: "tube", Area: Num(2e-3), SecondMoment: num(3e-6)}},
		Nodes: []NodeSpec{
			{ID: "base", At: []Value{Num(0), Num(0), Num(0)}},
			{ID: "top", At: []Value{Num(0), Num(0), Num(3)}},
			{ID: "tip", At: []Value{Num(4), Num(0), Num(3)}},
		},
		Members: []MemberSpec{
			{ID: "column", Ends: [2]string{"base", "top"}, Material: "steel", Section: "tube", Type: "beam"},
			{ID: "beam", Ends: [2]string{"top", "tip"}, Material: "steel", Section: "tube", Type: "beam",
				Orientation: []float64{0, 0, 1}},
		},
		Supports:  []SupportSpec{{Node: "base", Fix: []string{"x", "y", "z", "rx", "ry", "rz"}}},
		LoadCases: []LoadCaseSpec{{ID: "tip", Loads: []NodalLoadSpec{{Node: "tip", Force: []Value{Num(0), Num(0), Num(-5)}, Moment: []Value{Num(0), Num(1), Num(0)}}}}},
	}
}

func TestCompileValid(t *testing.T) {
	m, err := Compile(triangle())
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-14
	for _, tc := range []struct {
		name      string
		got, want float64
	}{
		{"B.x = span/2", m.Coords[2], 4},
		{"B.y = depth", m.Coords[3], 3},
		{"C.x = span", m.Coords[4], 8},
		// G = E / (2 (1 + ν)) with ν = 0.3 (Timoshenko and Goodier, Theory
		// of Elasticity, 1970, §4: the isotropic relation; ν = 0.3 for steel,
		// common practice).
		{"shear modulus", m.Materials[0].ShearModulus, 2.1e8 / 2.6},
		{"load = -w", m.Cases[0].Nodal[0].Force[1], -10},
		{"AB length = hypot(4, 3)", m.Length(0), 5}, // the 3-4-5 right triangle
		{"buckling factor default", m.Members[0].BucklingFactor, 1},
		{"combination factor", m.Combinations[0].Terms[0].Factor, 1.35},
	} {
		if !scalar.EqualWithinAbsOrRel(tc.got, tc.want, tol, tol) {
			t.Errorf("%s: got %v, want %v", tc.name, tc.got, tc.want)
		}
	}
	if m.Units.Length != "m" || m.Units.Force != "kN" {
		t.Errorf("default units %+v, want m and kN", m.Units)
	}
	if m.Members[1].Kind != Bar || m.Members[2].Ends != [2]int{0, 2} {
		t.Errorf("member BC kind %v, AC ends %v", m.Members[1].Kind, m.Members[2].Ends)
	}
	if !m.Supports[0].Fixed[X] || !m.Supports[0].Fixed[Y] || m.Supports[1].Fixed[X] || !m.Supports[1].Fixed[Y] {
		t.Errorf("supports %+v", m.Supports)
	}
	if m.ParamIndex("span") != 1 || m.ParamIndex("nope") != -1 {
		t.Errorf("ParamIndex: span %d, nope %d", m.ParamIndex("span"), m.ParamIndex("nope"))
	}

	p, err := Compile(portal())
	if err != nil {
		t.Fatal(err)
	}
	// A round section's polar moment is twice its second moment (Roark's
	// Formulas for Stress and Strain, 7th ed., 2002, Table 10.1 case 1).
	if s := p.Sections[0]; s.SecondMomentY != 3e-6 || s.TorsionConstant != 6e-6 {
		t.Errorf("3D section defaults %+v", s)
	}
	if p.Members[1].Orientation != [3]float64{0, 0, 1} || p.Cases[0].Nodal[0].Moment != [3]float64{0, 1, 0} {
		t.Errorf("orientation %v, moment %v", p.Members[1].Orientation, p.Cases[0].Nodal[0].Moment)
	}
}

func TestCompileProblems(t *testing.T) {
	for _, tc := range []struct {
		name   string
		base   func() *Spec
		mutate func(s *Spec)
		kind   fault.Kind
		path   string
		text   string // a phrase the message must hold
	}{
		{"dimension", triangle, func(s *Spec) { s.Dimension = 4 }, fault.InvalidModel, "dimension", "2 (a plane model) or 3"},
		{"length unit", triangle, func(s *Spec) { s.Units.Length = "furlong" }, fault.InvalidModel, "units/length", `"furlong"`},
		{"force unit", triangle, func(s *Spec) { s.Units.Force = "ton" }, fault.InvalidModel, "units/force", "N, kN, MN, lbf, kip"},
		{"parameter NaN", triangle, func(s *Spec) { s.Parameters[0].Value = math.NaN() }, fault.InvalidModel, "parameters/depth", "finite"},
		{"parameter name", triangle, func(s *Spec) { s.Parameters[0].Name = "a/b" }, fault.InvalidModel, "parameters/a~1b", "letter"},
		{"parameter twice", triangle, func(s *Spec) { s.Parameters[1].Name = "depth" }, fault.InvalidModel, "parameters/depth", "twice"},
		{"E zero", triangle, func(s *Spec) { s.Materials[0].ElasticModulus = Num(0) }, fault.InvalidModel, "materials/0/elastic_modulus", "positive"},
		{"E infinite", triangle, func(s *Spec) { s.Materials[0].ElasticModulus = Num(math.Inf(1)) }, fault.InvalidModel, "materials/0/elastic_modulus", "finite"},
		{"G negative", triangle, func(s *Spec) { s.Materials[0].ShearModulus = num(-1) }, fault.InvalidModel, "materials/0/shear_modulus", "positive"},
		{"weight negative", triangle, func(s *Spec) { s.Materials[0].WeightDensity = num(-1) }, fault.InvalidModel, "materials/0/weight_density", "negative"},
		{"tension limit zero", triangle, func(s *Spec) { s.Materials[0].TensionLimit = num(0) }, fault.InvalidModel, "materials/0/tension_limit", "positive"},
		{"compression limit negative", triangle, func(s *Spec) { s.Materials[0].CompressionLimit = num(-5) }, fault.InvalidModel, "materials/0/compression_limit", "positive"},
		{"carbon negative", triangle, func(s *Spec) { s.Materials[0].CarbonFactor = num(-1) }, fault.InvalidModel, "materials/0/carbon_factor", "negative"},
		{"thermal NaN", triangle, func(s *Spec) { s.Materials[0].ThermalExpansion = num(math.NaN()) }, fault.InvalidModel, "materials/0/thermal_expansion", "finite"},
		{"material id twice", triangle, func(s *Spec) { s.Materials = append(s.Materials, s.Materials[0]) }, fault.InvalidModel, "materials/1/id", "used twice"},
		{"area zero", triangle, func(s *Spec) { s.Sections[0].Area = Num(0) }, fault.InvalidModel, "sections/0/area", "positive"},
		{"I negative", triangle, func(s *Spec) { s.Sections[0].SecondMoment = num(-1) }, fault.InvalidModel, "sections/0/second_moment", "positive"},
		{"Iy zero", triangle, func(s *Spec) { s.Sections[0].SecondMomentY = num(0) }, fault.InvalidModel, "sections/0/second_moment_y", "positive"},
		{"J zero", triangle, func(s *Spec) { s.Sections[0].TorsionConstant = num(0) }, fault.InvalidModel, "sections/0/torsion_constant", "positive"},
		{"section id twice", triangle, func(s *Spec) { s.Sections = append(s.Sections, s.Sections[0]) }, fault.InvalidModel, "sections/1/id", "used twice"},
		{"beam without I", triangle, func(s *Spec) { s.Sections[0].SecondMoment = nil; s.Members[1].Type = "beam" }, fault.InvalidModel, "sections/0/second_moment", `beam "BC"`},
		{"node coordinates count", triangle, func(s *Spec) { s.Nodes[0].At = append(s.Nodes[0].At, Num(0)) }, fault.InvalidModel, "nodes/0/at", "3 coordinates"},
		{"node coordinate NaN", triangle, func(s *Spec) { s.Nodes[0].At[1] = Num(math.NaN()) }, fault.InvalidModel, "nodes/0/at/1", "finite"},
		{"node id twice", triangle, func(s *Spec) { s.Nodes[2].ID = "A" }, fault.InvalidModel, "nodes/2/id", `"A" is used twice`},
		{"node id empty", triangle, func(s *Spec) { s.Nodes[2].ID = "" }, fault.InvalidModel, "nodes/2/id", "empty id"},
		{"coincident nodes", triangle, func(s *Spec) {
			s.Nodes = append(s.Nodes, NodeSpec{ID: "D", At: []Value{Num(8), Num(1e-12)}})
			s.Members = append(s.Members, MemberSpec{ID: "BD", Ends: [2]string{"B", "D"}, Material: "steel", Section: "tube"})
		}, fault.InvalidModel, "nodes/3/at", `node "D" is at the same point as node "C"`},
		{"dangling end", triangle, func(s *Spec) { s.Members[0].Ends[1] = "Z" }, fault.InvalidModel, "members/0/ends/1", `names node "Z", which does not exist`},
		{"same node twice", triangle, func(s *Spec) { s.Members[0].Ends[1] = "A" }, fault.InvalidModel, "members/0/ends/1", `member "AB" has zero length: both ends are at node "A"`},
		{"zero length by position", triangle, func(s *Spec) { s.Nodes[1].At = []Value{Num(0), Num(0)} }, fault.InvalidModel, "members/0/ends/1", `member "AB" has zero length: its ends "A" and "B"`},
		{"missing material", triangle, func(s *Spec) { s.Members[2].Material = "oak" }, fault.InvalidModel, "members/2/material", `material "oak", which does not exist; materials are: "steel"`},
		{"missing section", triangle, func(s *Spec) { s.Members[2].Section = "box" }, fault.InvalidModel, "members/2/section", `section "box"`},
		{"member type", triangle, func(s *Spec) { s.Members[2].Type = "rope" }, fault.InvalidModel, "members/2/type", `"bar", "cable" or "beam"`},
		{"member id twice", triangle, func(s *Spec) { s.Members[2].ID = "AB" }, fault.InvalidModel, "members/2/id", "used twice"},
		{"orientation in 2D", triangle, func(s *Spec) { s.Members[0].Orientation = []float64{0, 0, 1} }, fault.InvalidModel, "members/0/orientation", "only a beam in a 3D model"},
		{"orientation parallel", portal, func(s *Spec) { s.Members[0].Orientation = []float64{0, 0, 2} }, fault.InvalidModel, "members/0/orientation", "parallel"},
		{"orientation length", portal, func(s *Spec) { s.Members[1].Orientation = []float64{0, 1} }, fault.InvalidModel, "members/1/orientation", "needs 3"},
		{"orientation on a 3D bar", portal, func(s *Spec) { s.Members[1].Type = "bar" }, fault.InvalidModel, "members/1/orientation", "only a beam"},
		{"buckling factor", triangle, func(s *Spec) { s.Members[0].BucklingFactor = fptr(0) }, fault.InvalidModel, "members/0/buckling_factor", "positive"},
		{"support node missing", triangle, func(s *Spec) { s.Supports[0].Node = "Q" }, fault.InvalidModel, "supports/0/node", `"Q"`},
		{"node supported twice", triangle, func(s *Spec) { s.Supports[1].Node = "A" }, fault.InvalidModel, "supports/1/node", "already has a support (supports/0)"},
		{"component for 2D", triangle, func(s *Spec) { s.Supports[0].Fix = []string{"x", "z"} }, fault.InvalidModel, "supports/0/fix/1", "x, y, rz"},
		{"component unknown 3D", portal, func(s *Spec) { s.Supports[0].Fix[5] = "rw" }, fault.InvalidModel, "supports/0/fix/5", "x, y, z, rx, ry, rz"},
		{"spring zero", triangle, func(s *Spec) { s.Supports[1].Springs = map[string]float64{"x": 0} }, fault.InvalidModel, "supports/1/springs/x", "positive"},
		{"spring on fixed", triangle, func(s *Spec) { s.Supports[1].Springs = map[string]float64{"y": 100} }, fault.InvalidModel, "supports/1/springs/y", "both fixed and on a spring"},
		{"displacement on free", triangle, func(s *Spec) { s.Supports[1].Displacement = map[string]float64{"x": 0.01} }, fault.InvalidModel, "supports/1/displacement/x", "not fixed"},
		{"case id twice", triangle, func(s *Spec) { s.LoadCases = append(s.LoadCases, LoadCaseSpec{ID: "dead"}) }, fault.InvalidModel, "load_cases/1/id", "used twice"},
		{"load node missing", triangle, func(s *Spec) { s.LoadCases[0].Loads[0].Node = "Q" }, fault.InvalidModel, "load_cases/0/loads/0/node", `"Q"`},
		{"force length", triangle, func(s *Spec) { s.LoadCases[0].Loads[0].Force = []Value{Num(0), Num(0), Num(1)} }, fault.InvalidModel, "load_cases/0/loads/0/force", "needs 2"},
		{"moment length 2D", triangle, func(s *Spec) { s.LoadCases[0].Loads[0].Moment = []Value{Num(0), Num(0), Num(1)} }, fault.InvalidModel, "load_cases/0/loads/0/moment", "needs 1"},
		{"moment length 3D", portal, func(s *Spec) { s.LoadCases[0].Loads[0].Moment = []Value{Num(1)} }, fault.InvalidModel, "load_cases/0/loads/0/moment", "needs 3"},
		{"force infinite", triangle, func(s *Spec) { s.LoadCases[0].Loads[0].Force[0] = Num(math.Inf(-1)) }, fault.InvalidModel, "load_cases/0/loads/0/force/0", "finite"},
		{"member load member missing", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "XY", Kind: "uniform", Value: []Value{Num(0), Num(-1)}}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/member", `"XY"`},
		{"member load kind", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AC", Kind: "blast"}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/kind", "uniform, linear, point, thermal"},
		{"member load axes", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AC", Kind: "uniform", Axes: "diagonal", Value: []Value{Num(0), Num(-1)}}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/axes", `"global" or "local"`},
		{"uniform value length", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AC", Kind: "uniform", Value: []Value{Num(-1)}}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/value", "2 entries, got 1"},
		{"linear end value", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AC", Kind: "linear", Value: []Value{Num(0), Num(-1)}}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/end_value", "end_value with 2 entries"},
		{"linear end value NaN", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AC", Kind: "linear", Value: []Value{Num(0), Num(-1)}, EndValue: []Value{Num(0), Num(math.NaN())}}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/end_value/1", "finite"},
		{"point distance beyond", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AB", Kind: "point", Value: []Value{Num(0), Num(-1)}, Distance: num(5.5)}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/distance", "whose length is 5"},
		{"point distance missing", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AB", Kind: "point", Value: []Value{Num(0), Num(-1)}}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/distance", "needs distance"},
		{"thermal without strain", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AB", Kind: "thermal"}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/strain", "needs strain, or temperature_change"},
		{"thermal without expansion", triangle, func(s *Spec) {
			s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AB", Kind: "thermal", TemperatureChange: num(30)}}
		}, fault.InvalidModel, "load_cases/0/member_loads/0/temperature_change", `material "steel", which has no thermal_expansion`},
		{"combination names missing case", triangle, func(s *Spec) { s.Combos[0].Factors["live"] = 1.5 }, fault.InvalidModel, "combinations/0/factors/live", `load case "live", which does not exist; cases are: "dead"`},
		{"combination names combination", triangle, func(s *Spec) {
			s.Combos = append(s.Combos, CombinationSpec{ID: "double", Factors: map[string]float64{"ultimate": 2}})
		}, fault.InvalidModel, "combinations/1/factors/ultimate", "which is a combination"},
		{"combination id of a case", triangle, func(s *Spec) { s.Combos[0].ID = "dead" }, fault.InvalidModel, "combinations/0/id", "share one set of ids"},
		{"combination id twice", triangle, func(s *Spec) { s.Combos = append(s.Combos, s.Combos[0]) }, fault.InvalidModel, "combinations/1/id", "used twice"},
		{"combination factor NaN", triangle, func(s *Spec) { s.Combos[0].Factors["dead"] = math.NaN() }, fault.InvalidModel, "combinations/0/factors/dead", "finite"},
		{"combination empty", triangle, func(s *Spec) { s.Combos[0].Factors = nil }, fault.InvalidModel, "combinations/0/factors", "no factors"},
		{"no nodes", triangle, func(s *Spec) { s.Nodes = nil; s.Members = nil; s.Supports = nil; s.LoadCases = nil }, fault.InvalidModel, "nodes", "no nodes"},
		{"no members", triangle, func(s *Spec) { s.Members = nil }, fault.InvalidModel, "members", "no members"},
		{"unknown parameter", triangle, func(s *Spec) { s.Nodes[1].At[1] = Expr("2*dpeth") }, fault.Expression, "nodes/1/at/1",
			`expression "2*dpeth": unknown parameter "dpeth" (did you mean "depth"?)`},
		{"division by zero", triangle, func(s *Spec) { s.LoadCases[0].Loads[0].Force[1] = Expr("w/(span-8)") }, fault.Expression, "load_cases/0/loads/0/force/1",
			`expression "w/(span-8)" cannot be evaluated with depth = 3, span = 8, w = 10: division by zero`},
		{"syntax error", triangle, func(s *Spec) { s.Sections[0].Area = Expr("2e-3*(depth") }, fault.Expression, "sections/0/area", `expression "2e-3*(depth" has a syntax error at byte 11`},
		{"expression in material", triangle, func(s *Spec) { s.Materials[0].ElasticModulus = Expr("sqrt(-depth)") }, fault.Expression, "materials/0/elastic_modulus", "square root of a negative"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := tc.base()
			tc.mutate(s)
			m, err := Compile(s)
			if err == nil {
				t.Fatalf("compiled without error: %d nodes", m.NodeCount())
			}
			fe, ok := fault.As(err)
			if !ok {
				t.Fatalf("error %T is not a *fault.Error: %v", err, err)
			}
			if fe.Kind != tc.kind {
				t.Errorf("kind %v, want %v", fe.Kind, tc.kind)
			}
			for _, p := range fe.Problems {
				if p.Path == tc.path && strings.Contains(p.Message, tc.text) {
					return
				}
			}
			t.Errorf("no problem at %q mentioning %q; got %+v", tc.path, tc.text, fe.Problems)
		})
	}
}

// TestCompileReportsEveryProblem checks that problems in several parts of
// the model are all reported, each at its own pointer.
func TestCompileReportsEveryProblem(t *testing.T) {
	s := triangle()
	s.Materials[0].ElasticModulus = Num(-1)
	s.Nodes[2].ID = "A"
	s.Members[0].Ends[1] = "Z"
	s.Members[1].Ends[0] = "C" // ends C, C: zero length
	s.Supports[0].Fix = []string{"q"}
	s.LoadCases[0].Loads[0].Force[1] = Expr("w/0")
	s.Combos[0].Factors["wind"] = 1
	want := []string{
		"materials/0/elastic_modulus", "nodes/2/id", "members/0/ends/1", "members/1/ends/1",
		"supports/0/fix/0", "load_cases/0/loads/0/force/1", "combinations/0/factors/wind",
	}
	_, err := Compile(s)
	fe, ok := fault.As(err)
	if !ok {
		t.Fatalf("got %v", err)
	}
	if fe.Kind != fault.InvalidModel {
		t.Errorf("kind %v, want invalid model (mixed problems)", fe.Kind)
	}
	got := make(map[string]bool)
	for _, p := range fe.Problems {
		got[p.Path] = true
	}
	for _, path := range want {
		if !got[path] {
			t.Errorf("no problem at %s; got %+v", path, fe.Problems)
		}
	}
	if !strings.Contains(fe.Message, "problems") {
		t.Errorf("message %q does not say how many problems", fe.Message)
	}
}

func TestCompileNilPanics(t *testing.T) {
	defer func() {
		if r := recover(); r == nil || !strings.HasPrefix(r.(string), "model: ") {
			t.Errorf("recovered %v, want a model: panic", r)
		}
	}()
	_, _ = Compile(nil)
}
