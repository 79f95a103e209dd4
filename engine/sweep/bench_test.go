package sweep

import (
	"context"
	"fmt"
	"math"
	"testing"

	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// prattEvaluator sizes a Pratt truss of the given panel count (4N + 1
// members) at each depth, forces by the method of sections.
func prattEvaluator(panels int) Evaluator {
	steel := model.Material{ID: "steel", ElasticModulus: 2.1e8, TensionLimit: 2.35e5, CompressionLimit: 2.35e5, WeightDensity: 77}
	return func(_ context.Context, x []float64) (map[string]float64, error) {
		coords, ends, forces := prattForces(panels, 2, x[0], 10)
		m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"}, Materials: []model.Material{steel}}
		m.NodeIDs = make([]string, len(coords))
		for _, p := range coords {
			m.Coords = append(m.Coords, p...)
		}
		m.Members = make([]model.Member, len(ends))
		for e := range ends {
			m.Members[e].Ends = ends[e]
		}
		res, err := loadpath.Compute(m, []loadpath.Case{{ID: "live", AxialForce: forces}}, loadpath.Options{Size: true,
			Section: loadpath.SectionFamily{Shape: loadpath.ShapeTube, DiameterToThickness: 30}})
		if err != nil {
			return nil, err
		}
		return map[string]float64{"volume": res.Totals.All.Volume, "mass": res.Totals.All.Mass}, nil
	}
}

// BenchmarkRun sweeps 1,000 depths of a 497-member Pratt truss (model
// built, forces by sections, sized with buckling) with one and two
// workers; the ratio of the two times is the parallel speed-up.
func BenchmarkRun(b *testing.B) {
	depths, _ := Range(1, 10, 1000)
	eval := prattEvaluator(124)
	for _, workers := range []int{1, 2} {
		b.Run(fmt.Sprintf("steps=1000/members=497/workers=%d", workers), func(b *testing.B) {
			plan := Plan{Axes: []Axis{{"depth", depths}}, Workers: workers}
			b.ResetTimer()
			for b.Loop() {
				if _, err := Run(context.Background(), plan, eval, nil); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkRefine reports the evaluations Brent's method needs to refine
// the Pratt truss's volume-optimal depth from a coarse sweep to the
// default tolerance, and Nelder–Mead's on Rosenbrock's function.
func BenchmarkRefine(b *testing.B) {
	b.Run("brent/pratt", func(b *testing.B) {
		depths, _ := Range(1, 10, 10)
		plan := Plan{Axes: []Axis{{"depth", depths}}, Workers: 1, Objective: "volume"}
		eval := prattEvaluator(8)
		var evals int
		b.ResetTimer()
		for b.Loop() {
			res, err := Run(context.Background(), plan, eval, nil)
			if err != nil {
				b.Fatal(err)
			}
			evals = res.Refinement.Evaluations
		}
		b.ReportMetric(float64(evals), "evals/op")
	})
	b.Run("nelder-mead/rosenbrock", func(b *testing.B) {
		xs, _ := Range(-2, 2, 8)
		ys, _ := Range(-1, 3, 8)
		plan := Plan{Axes: []Axis{{"x", xs}, {"y", ys}}, Workers: 1, Objective: "f", MaxEvaluations: 2000}
		eval := metric(func(x []float64) float64 { return math.Pow(1-x[0], 2) + 100*math.Pow(x[1]-x[0]*x[0], 2) })
		var evals int
		b.ResetTimer()
		for b.Loop() {
			res, err := Run(context.Background(), plan, eval, nil)
			if err != nil {
				b.Fatal(err)
			}
			evals = res.Refinement.Evaluations
		}
		b.ReportMetric(float64(evals), "evals/op")
	})
}
