package model

import (
	"math"
	"strings"
	"testing"

	"gusset/engine/fault"
)

// FuzzCompile varies one small model through the fuzzer's values (the
// dimension, a coordinate, an expression, ids and component names) and
// checks that Compile never panics, that a failure is a *fault.Error whose
// problems all have a path and a message, and that a success holds only
// finite numbers.
func FuzzCompile(f *testing.F) {
	f.Add(2, 4.0, "depth", "B", "A", "x", "bar", "dead", 1.35)
	f.Add(3, 0.0, "2*dpeth", "A", "A", "z", "beam", "ultimate", math.NaN())
	f.Add(2, math.Inf(1), "w/(span-8)", "", "Q", "rz", "cable", "", 1.0)
	f.Add(2, 1e-12, "2*(depth", "C", "C", "q", "", "dead", -1.0)
	f.Fuzz(func(t *testing.T, dim int, x float64, src, nodeID, end, comp, kind, combo string, factor float64) {
		s := triangle()
		s.Dimension = dim
		s.Nodes[1].ID = nodeID
		s.Nodes[2].At[1] = Num(x)
		s.Nodes[1].At[0] = Expr(src)
		s.Members[0].Ends[1] = end
		s.Members[1].Type = kind
		s.Supports[1].Fix = []string{comp}
		s.LoadCases[0].Loads[0].Force[0] = Expr(src)
		s.Combos[0].Factors = map[string]float64{combo: factor}
		m, err := Compile(s)
		if err != nil {
			fe, ok := fault.As(err)
			if !ok || len(fe.Problems) == 0 {
				t.Fatalf("error %v is not a *fault.Error with problems", err)
			}
			for _, p := range fe.Problems {
				if p.Path == "" || p.Message == "" || strings.HasPrefix(p.Path, "/") {
					t.Fatalf("bad problem %+v", p)
				}
			}
			return
		}
		for _, v := range m.Coords {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("compiled coordinate %v", v)
			}
		}
		for _, l := range m.Cases[0].Nodal {
			for _, v := range l.Force {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("compiled force %v", v)
				}
			}
		}
	})
}
