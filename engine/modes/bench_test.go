package modes

import (
	"context"
	"fmt"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/engine/stiffness"
)

// withMass gives the generated models' steel its mass density, 7.85 t/m³
// (common practice).
func withMass(m *model.Model) *model.Model {
	m.Materials[0].MassDensity, m.Materials[0].HasMassDensity = 7.85, true
	return m
}

// BenchmarkBuckling times the 6 lowest buckling factors of the
// double-layer grid family (SpaceTruss3D: 8·nx·ny bars) beside one
// stiffness solve of the same model (the target: at most 4× the solve).
func BenchmarkBuckling(b *testing.B) {
	for _, n := range []int{35, 100} {
		m := modelgen.Must(modelgen.SpaceTruss3D(n, n))
		b.Run(fmt.Sprintf("members=%d/solve", len(m.Members)), func(b *testing.B) {
			for b.Loop() {
				if _, err := stiffness.Solve(context.Background(), m, stiffness.Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(fmt.Sprintf("members=%d/modes", len(m.Members)), func(b *testing.B) {
			var res *Result
			for b.Loop() {
				var err error
				if res, err = Buckling(context.Background(), m, Options{Count: 6}); err != nil {
					b.Fatal(err)
				}
			}
			report(b, res)
		})
	}
}

// BenchmarkVibration times the 10 lowest natural frequencies of building
// frames of about 1k and 10k beams (Frame2D, Frame3D).
func BenchmarkVibration(b *testing.B) {
	for _, tc := range []struct {
		name string
		spec *model.Spec
	}{
		{"frame2D", modelgen.Frame2D(20, 24)},
		{"frame2D", modelgen.Frame2D(50, 100)},
		{"frame3D", modelgen.Frame3D(5, 5, 10)},
		{"frame3D", modelgen.Frame3D(10, 10, 30)},
	} {
		m := withMass(modelgen.Must(tc.spec))
		b.Run(fmt.Sprintf("%s/members=%d", tc.name, len(m.Members)), func(b *testing.B) {
			var res *Result
			for b.Loop() {
				var err error
				if res, err = Vibration(context.Background(), m, Options{Count: 10}); err != nil {
					b.Fatal(err)
				}
			}
			report(b, res)
		})
	}
}

func report(b *testing.B, res *Result) {
	st := res.Stats
	b.ReportMetric(float64(st.Equations), "equations")
	b.ReportMetric(float64(st.Iterations), "iterations")
	b.ReportMetric(float64(st.Solves), "solves")
	b.ReportMetric(float64(st.Factorisations), "factorisations")
	b.ReportMetric(float64(st.Restarts), "restarts")
	b.ReportMetric(float64(st.Assemble.Milliseconds()), "assemble-ms")
	b.ReportMetric(float64(st.Factor.Milliseconds()), "factor-ms")
	b.ReportMetric(float64(st.Lanczos.Milliseconds()), "lanczos-ms")
	if !st.Converged {
		b.Errorf("not converged: %+v", st)
	}
}
