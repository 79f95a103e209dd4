package stiffness

import (
	"context"
	"fmt"
	"os"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// benchModels lists generated models of about 1k, 10k and 100k members.
var benchModels = []struct {
	family string
	sizes  []func() *model.Spec
}{
	{"truss2D", []func() *model.Spec{
		func() *model.Spec { return modelgen.GridTruss2D(18, 18) },
		func() *model.Spec { return modelgen.GridTruss2D(58, 57) },
		func() *model.Spec { return modelgen.GridTruss2D(183, 182) },
	}},
	{"truss3D", []func() *model.Spec{
		func() *model.Spec { return modelgen.SpaceTruss3D(11, 11) },
		func() *model.Spec { return modelgen.SpaceTruss3D(35, 36) },
		func() *model.Spec { return modelgen.SpaceTruss3D(112, 112) },
	}},
	{"frame2D", []func() *model.Spec{
		func() *model.Spec { return modelgen.Frame2D(20, 24) },
		func() *model.Spec { return modelgen.Frame2D(50, 100) },
		func() *model.Spec { return modelgen.Frame2D(200, 250) },
	}},
	// The double-layer grid with rigid joints: the space frame of roofs and
	// canopies, every member a 3D beam.
	{"spaceframe3D", []func() *model.Spec{
		func() *model.Spec { return rigidJoints(modelgen.SpaceTruss3D(11, 11)) },
		func() *model.Spec { return rigidJoints(modelgen.SpaceTruss3D(35, 36)) },
		func() *model.Spec { return rigidJoints(modelgen.SpaceTruss3D(112, 112)) },
	}},
	{"frame3D", []func() *model.Spec{
		func() *model.Spec { return modelgen.Frame3D(5, 5, 10) },
		func() *model.Spec { return modelgen.Frame3D(10, 10, 30) },
		// About 100k members in a solid block of 21 × 21 × 79 nodes:
		// 206k freedoms and 1.5e8 entries in the factor (58 s, 53 s of
		// it factorising, and a peak of 3.1 GiB on two cores, measured
		// 2026-12-02), so it runs only when GUSSET_BENCH_HUGE is set.
		func() *model.Spec {
			if os.Getenv("GUSSET_BENCH_HUGE") == "" {
				return nil
			}
			return modelgen.Frame3D(20, 20, 78)
		},
	}},
}

// rigidJoints makes every member of spec a beam.
func rigidJoints(spec *model.Spec) *model.Spec {
	for e := range spec.Members {
		spec.Members[e].Type = "beam"
	}
	return spec
}

func reportStats(b *testing.B, st Stats) {
	b.ReportMetric(float64(st.Equations), "freedoms")
	b.ReportMetric(float64(st.NonzerosFactor), "nnzL")
	b.ReportMetric(float64(st.Assemble.Microseconds())/1e3, "assemble-ms")
	b.ReportMetric(float64(st.Order.Microseconds())/1e3, "order-ms")
	b.ReportMetric(float64(st.Factor.Microseconds())/1e3, "factor-ms")
	b.ReportMetric(float64(st.Solve.Microseconds())/1e3, "solve-ms")
	b.ReportMetric(float64(st.Recover.Microseconds())/1e3, "recover-ms")
}

// BenchmarkSolve times Solve end to end (compiled model in, results out)
// on the generated families at about 1k, 10k and 100k members.
func BenchmarkSolve(b *testing.B) {
	for _, f := range benchModels {
		for _, size := range f.sizes {
			spec := size()
			if spec == nil {
				continue
			}
			m := modelgen.Must(spec)
			b.Run(fmt.Sprintf("%s/members=%d", f.family, len(m.Members)), func(b *testing.B) {
				var st Stats
				b.ResetTimer()
				for range b.N {
					res, err := Solve(context.Background(), m, Options{})
					if err != nil {
						b.Fatal(err)
					}
					st = res.Stats
				}
				reportStats(b, st)
			})
		}
	}
}

// BenchmarkCases compares one load case with ten on a 3D truss of about
// 10k members: the factor is reused, so ten cases should cost well under
// twice one.
func BenchmarkCases(b *testing.B) {
	for _, cases := range []int{1, 10} {
		m := modelgen.Must(modelgen.SpaceTruss3D(35, 36))
		base := m.Cases[0]
		m.Cases = nil
		m.Combinations = nil
		for k := range cases {
			lc := base
			lc.ID = fmt.Sprintf("case%d", k)
			lc.Nodal = append([]model.NodalLoad(nil), base.Nodal...)
			for i := range lc.Nodal {
				lc.Nodal[i].Force[0] = float64(k)
			}
			m.Cases = append(m.Cases, lc)
		}
		b.Run(fmt.Sprintf("cases=%d", cases), func(b *testing.B) {
			var st Stats
			b.ResetTimer()
			for range b.N {
				res, err := Solve(context.Background(), m, Options{})
				if err != nil {
					b.Fatal(err)
				}
				st = res.Stats
			}
			reportStats(b, st)
		})
	}
}
