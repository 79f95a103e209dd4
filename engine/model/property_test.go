package model_test

import (
	"math/rand/v2"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// TestCompiledMatchesSpec checks, over generated models, that compilation
// keeps every coordinate and every member's end ids exactly as written.
func TestCompiledMatchesSpec(t *testing.T) {
	rng := rand.New(rand.NewPCG(42, 1))
	specs := []*model.Spec{
		modelgen.Pratt(8, 32, 4, 10),
		modelgen.GridTruss2D(7, 3),
		modelgen.SpaceTruss3D(4, 5),
		modelgen.Frame2D(3, 2),
		modelgen.Frame3D(2, 2, 3),
	}
	for range 10 {
		specs = append(specs, modelgen.RandomPlanarTruss(rng, 10+rng.IntN(200)))
	}
	for si, s := range specs {
		m, err := model.Compile(s)
		if err != nil {
			t.Fatalf("model %d: %v", si, err)
		}
		if m.NodeCount() != len(s.Nodes) || len(m.Members) != len(s.Members) {
			t.Fatalf("model %d: counts differ", si)
		}
		for i, n := range s.Nodes {
			for k, v := range n.At {
				if m.Coords[i*m.Dim+k] != v.Num {
					t.Fatalf("model %d: node %s coordinate %d: %v, spec %v", si, n.ID, k, m.Coords[i*m.Dim+k], v.Num)
				}
			}
		}
		for e, ms := range s.Members {
			got := m.Members[e]
			if m.NodeIDs[got.Ends[0]] != ms.Ends[0] || m.NodeIDs[got.Ends[1]] != ms.Ends[1] || got.ID != ms.ID {
				t.Fatalf("model %d: member %s resolves to %v", si, ms.ID, got.Ends)
			}
		}
	}
}
