package stiffness

import (
	"context"
	"fmt"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// BenchmarkInclinedSupports solves a 3D frame whose base supports are in
// global axes ("plain") and the same frame with every base support given
// two directions of its own ("inclined"; fully fixed either way, so the
// answers agree): the cost of turning the base nodes' element blocks,
// loads and results. Sizes: 5 × 5 × 10 (960 members) and 10 × 10 × 30
// (10,230 members).
func BenchmarkInclinedSupports(b *testing.B) {
	for _, size := range [][3]int{{5, 5, 10}, {10, 10, 30}} {
		for _, kind := range []string{"plain", "inclined"} {
			spec := modelgen.Frame3D(size[0], size[1], size[2])
			if kind == "inclined" {
				for i := range spec.Supports {
					spec.Supports[i].Directions = [][]float64{{1, 1, 0.2}, {-1, 1, 0}}
				}
			}
			m := modelgen.Must(spec)
			b.Run(fmt.Sprintf("members=%d/%s", len(m.Members), kind), func(b *testing.B) {
				benchSolve(b, m)
			})
		}
	}
}

func benchSolve(b *testing.B, m *model.Model) {
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		if _, err := Solve(context.Background(), m, Options{SkipCondition: true}); err != nil {
			b.Fatal(err)
		}
	}
}
