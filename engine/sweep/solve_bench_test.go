package sweep

import (
	"context"
	"fmt"
	"math"
	"runtime/debug"
	"testing"

	"gusset/engine/loadpath"
	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/engine/stiffness"
)

// deepened returns a generated Pratt truss whose top-chord nodes sit at the
// expression "depth", so a sweep re-evaluates expressions and re-solves.
func deepened(panels int) *model.Model {
	spec := modelgen.Pratt(panels, 4*float64(panels), 3, 10)
	for i := range spec.Nodes {
		if spec.Nodes[i].At[1].Num > 0 {
			spec.Nodes[i].At[1] = model.Expr("depth")
		}
	}
	spec.Parameters = []model.ParameterSpec{{Name: "depth", Value: 3}}
	return modelgen.Must(spec)
}

// stiffnessSolver returns a solver of m's re-parametrised models that
// hands their forces to the load path, as the server's sweep does: the
// topology never changes, so one stiffness.Analysis of m serves every step
// and every worker.
func stiffnessSolver(m *model.Model) Solver {
	an := stiffness.NewAnalysis(m, stiffness.Options{Workers: 1, StabilityLimit: -1, SkipCondition: true})
	return func(ctx context.Context, m *model.Model) (*Solution, error) {
		r, err := an.Solve(ctx, m)
		if err != nil {
			return nil, err
		}
		sol := &Solution{}
		for _, c := range r.Cases {
			sol.Cases = append(sol.Cases, loadpath.Case{ID: c.ID, AxialForce: c.AxialForce, External: c.External})
			for _, u := range c.Utilisation {
				sol.MaxUtilisation = math.Max(sol.MaxUtilisation, u)
			}
		}
		return sol, nil
	}
}

// BenchmarkStructuralSweep runs real sweeps (expressions re-evaluated, the
// stiffness solve, load path and sizing at every step): 1,000 steps of a
// 497-member truss and 100 steps of a 20k-member truss, with one and two
// workers; the ratio of the times is the parallel speed-up (goal 1.8×).
//
// It runs with the garbage collector set as the server sets it (GOGC=400;
// see cmd/gusset's tuneMemory): with Go's default, collection of the small,
// short-lived heaps of the 497-member steps keeps two workers to about 1.1×.
func BenchmarkStructuralSweep(b *testing.B) {
	defer debug.SetGCPercent(debug.SetGCPercent(400))
	for _, c := range []struct{ panels, steps int }{{125, 1000}, {5000, 100}} {
		m := deepened(c.panels)
		depths, _ := Range(1, 8, c.steps)
		eval, err := ModelEvaluator(m, []string{"depth"}, []string{MetricVolume}, stiffnessSolver(m),
			loadpath.Options{Section: loadpath.SectionFamily{Shape: loadpath.ShapeTube, DiameterToThickness: 30}})
		if err != nil {
			b.Fatal(err)
		}
		for _, workers := range []int{1, 2} {
			b.Run(fmt.Sprintf("steps=%d/members=%d/workers=%d", c.steps, len(m.Members), workers), func(b *testing.B) {
				plan := Plan{Axes: []Axis{{"depth", depths}}, Workers: workers}
				for b.Loop() {
					res, err := Run(context.Background(), plan, eval, nil)
					if err != nil || res.Failed > 0 {
						b.Fatalf("%v, %d failed", err, res.Failed)
					}
				}
			})
		}
	}
}

// BenchmarkReparametrise measures the expression re-evaluation alone
// (WithParameters) on the 20k-member truss, to compare with a step's time.
func BenchmarkReparametrise(b *testing.B) {
	m := deepened(5000)
	for b.Loop() {
		if _, err := m.WithParameters(map[string]float64{"depth": 4}); err != nil {
			b.Fatal(err)
		}
	}
}
