package model_test

import (
	"fmt"
	"math"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// BenchmarkCompile compiles braced grid trusses of about 1k, 10k and 100k
// members (GridTruss2D has 3·nx·ny + nx + ny members).
func BenchmarkCompile(b *testing.B) {
	for _, size := range []struct{ nx, ny int }{{18, 18}, {58, 57}, {183, 182}} {
		spec := modelgen.GridTruss2D(size.nx, size.ny)
		b.Run(fmt.Sprintf("members=%d", len(spec.Members)), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := model.Compile(spec); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
	spec := modelgen.SpaceTruss3D(112, 112)
	b.Run(fmt.Sprintf("space/members=%d", len(spec.Members)), func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			if _, err := model.Compile(spec); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkWithParameters re-evaluates about 50 expressions of a model of
// about 20k members: a camber of the top row of nodes and the loads there.
func BenchmarkWithParameters(b *testing.B) {
	const nx, ny = 82, 81
	spec := modelgen.GridTruss2D(nx, ny)
	spec.Parameters = []model.ParameterSpec{{Name: "camber", Value: 0.5}, {Name: "q", Value: 10}}
	exprs := 0
	for i := 0; i <= nx && exprs < 40; i += 2 {
		node := &spec.Nodes[ny*(nx+1)+i]
		node.At[1] = model.Expr(fmt.Sprintf("%d + camber*sin(pi*%d/%d)", ny, i, nx))
		exprs++
	}
	for j := range spec.LoadCases[0].Loads[:10] {
		spec.LoadCases[0].Loads[j].Force[1] = model.Expr("-q*(1 + camber/10)")
		exprs++
	}
	m, err := model.Compile(spec)
	if err != nil {
		b.Fatal(err)
	}
	b.Logf("%d members, %d expressions", len(m.Members), exprs)
	values := map[string]float64{"camber": 0.8, "q": 12}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; b.Loop(); i++ {
		values["camber"] = 0.5 + math.Mod(float64(i), 10)/20
		if _, err := m.WithParameters(values); err != nil {
			b.Fatal(err)
		}
	}
}
