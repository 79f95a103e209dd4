package model

import (
	"math"
	"strings"
	"sync"
	"testing"

	"gusset/engine/fault"
)

func TestWithParameters(t *testing.T) {
	m, err := Compile(triangle())
	if err != nil {
		t.Fatal(err)
	}
	n, err := m.WithParameters(map[string]float64{"depth": 5, "w": 20})
	if err != nil {
		t.Fatal(err)
	}
	// The new values follow from the expressions by hand: B = (span/2,
	// depth) = (4, 5), load = −w = −20; AB = hypot(4, 5).
	checks := []struct {
		name      string
		got, want float64
	}{
		{"new B.y", n.Coords[3], 5},
		{"new load", n.Cases[0].Nodal[0].Force[1], -20},
		{"new AB length", n.Length(0), math.Sqrt(41)},
		{"new parameter value", n.ParamValues[n.ParamIndex("depth")], 5},
		{"unchanged span", n.ParamValues[n.ParamIndex("span")], 8},
		{"original B.y", m.Coords[3], 3},
		{"original load", m.Cases[0].Nodal[0].Force[1], -10},
		{"original parameter", m.ParamValues[0], 3},
	}
	for _, c := range checks {
		if c.got != c.want {
			t.Errorf("%s: got %v, want %v", c.name, c.got, c.want)
		}
	}
	if &n.Members[0] != &m.Members[0] || &n.Supports[0] != &m.Supports[0] {
		t.Error("members and supports were copied; only bound slices should be")
	}
	if &n.Coords[0] == &m.Coords[0] || &n.Cases[0].Nodal[0] == &m.Cases[0].Nodal[0] {
		t.Error("bound slices are shared with the original")
	}

	// Chained calls keep working from the new model.
	k, err := n.WithParameters(map[string]float64{"span": 6})
	if err != nil {
		t.Fatal(err)
	}
	if k.Coords[2] != 3 || k.Coords[3] != 5 || k.Coords[4] != 6 {
		t.Errorf("after span = 6: B = (%v, %v), C.x = %v; want (3, 5), 6", k.Coords[2], k.Coords[3], k.Coords[4])
	}
}

func TestWithParametersDerivedValues(t *testing.T) {
	s := triangle()
	s.Materials[0].ElasticModulus = Expr("2.1e7*w")
	s.Materials[0].ThermalExpansion = ex("1.2e-6*depth")
	s.LoadCases[0].MemberLoads = []MemberLoadSpec{{Member: "AC", Kind: "thermal", TemperatureChange: ex("w")}}
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	n, err := m.WithParameters(map[string]float64{"w": 20, "depth": 2})
	if err != nil {
		t.Fatal(err)
	}
	// G = E/(2(1+ν)) follows E (isotropic elasticity, ν = 0.3 common
	// practice); the free strain is α·ΔT (Timoshenko and Goodier, Theory of
	// Elasticity, 1970, §150).
	const tol = 1e-12
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"E", n.Materials[0].ElasticModulus, 4.2e8},
		{"G", n.Materials[0].ShearModulus, 4.2e8 / 2.6},
		{"strain", n.Cases[0].MemberLoads[0].Strain, 1.2e-6 * 2 * 20},
		{"original strain", m.Cases[0].MemberLoads[0].Strain, 1.2e-6 * 3 * 10},
		{"original G", m.Materials[0].ShearModulus, 2.1e8 / 2.6},
	} {
		if math.Abs(c.got-c.want) > tol*math.Abs(c.want) {
			t.Errorf("%s: got %v, want %v", c.name, c.got, c.want)
		}
	}
}

func TestWithParametersErrors(t *testing.T) {
	for _, tc := range []struct {
		name   string
		mutate func(*Spec)
		values map[string]float64
		path   string
		text   string
	}{
		{"unknown name", func(*Spec) {}, map[string]float64{"dpth": 1}, "parameters/dpth", `unknown parameter "dpth"; parameters are: depth, span, w`},
		{"non-finite value", func(*Spec) {}, map[string]float64{"w": math.Inf(1)}, "parameters/w", "finite"},
		{"division by zero", func(s *Spec) { s.LoadCases[0].Loads[0].Force[1] = Expr("w/(span-4)") },
			map[string]float64{"span": 4}, "load_cases/0/loads/0/force/1", "division by zero"},
		{"area no longer positive", func(s *Spec) { s.Sections[0].Area = Expr("depth*1e-3") },
			map[string]float64{"depth": -1}, "sections/0/area", "must be positive"},
		{"member shrinks to nothing", func(*Spec) {}, map[string]float64{"span": 0, "depth": 0}, "nodes/1/at/0", `member "AB" has zero length`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := triangle()
			tc.mutate(s)
			m, err := Compile(s)
			if err != nil {
				t.Fatal(err)
			}
			_, err = m.WithParameters(tc.values)
			fe, ok := fault.As(err)
			if !ok || fe.Kind != fault.Expression {
				t.Fatalf("got %v, want an expression error", err)
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

// TestWithParametersConcurrent runs many sweeps at once from one model, as
// the sweep method does; run with -race to check for shared writes.
func TestWithParametersConcurrent(t *testing.T) {
	m, err := Compile(triangle())
	if err != nil {
		t.Fatal(err)
	}
	var wg sync.WaitGroup
	for g := range 8 {
		wg.Go(func() {
			for i := range 50 {
				depth := 1 + float64(g) + float64(i)/100
				n, err := m.WithParameters(map[string]float64{"depth": depth})
				if err != nil || n.Coords[3] != depth {
					t.Errorf("depth %v: got %v, %v", depth, n, err)
					return
				}
			}
		})
	}
	wg.Wait()
	if m.Coords[3] != 3 {
		t.Errorf("original changed: B.y = %v", m.Coords[3])
	}
}
