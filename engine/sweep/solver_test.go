package sweep

import (
	"context"
	"math"
	"slices"
	"testing"

	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// TestStiffnessSolverTwoBar solves the two-bar truss of twoBarSpec by the
// stiffness method through StiffnessSolver at two depths and checks the
// closed forms of twoBarSolver: N = −P·L/(2h) in each bar and the apex
// deflection P·L³/(2h²EA) (unit-load method, Hibbeler, Structural
// Analysis, ch. 9, from memory), the external forces balancing the load,
// and through ModelEvaluator the load path Z = P(a² + h²)/h (Michell
// 1904).
func TestStiffnessSolverTwoBar(t *testing.T) {
	const a, P, E, A = 2.0, 10.0, 2.1e8, 1e-3
	m, err := model.Compile(twoBarSpec(a, false))
	if err != nil {
		t.Fatal(err)
	}
	solve := StiffnessSolver(m, nil)
	eval, err := ModelEvaluator(m, []string{"depth"}, []string{MetricLoadPath, MetricMaxDisplacement}, solve, loadpath.Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, h := range []float64{1, 3} {
		mm, err := m.WithParameters(map[string]float64{"depth": h})
		if err != nil {
			t.Fatal(err)
		}
		sol, err := solve(context.Background(), mm)
		if err != nil {
			t.Fatal(err)
		}
		L := math.Hypot(a, h)
		n := -P * L / (2 * h)
		for e, got := range sol.Cases[0].AxialForce {
			if math.Abs(got-n) > 1e-9 {
				t.Errorf("h=%g bar %d: N = %g, want %g", h, e, got, n)
			}
		}
		if apex := sol.Cases[0].External[2]; math.Abs(apex[1]+P) > 1e-9 {
			t.Errorf("h=%g: external force at the apex %v, want the load (0, −%g)", h, apex, P)
		}
		if want := P * L * L * L / (2 * h * h * E * A); math.Abs(sol.MaxDisplacement-want) > 1e-9*want {
			t.Errorf("h=%g: max displacement %g, want %g", h, sol.MaxDisplacement, want)
		}
		metrics, err := eval(context.Background(), []float64{h})
		if err != nil {
			t.Fatal(err)
		}
		if want := P * (a*a + h*h) / h; math.Abs(metrics[MetricLoadPath]-want) > 1e-9*want {
			t.Errorf("h=%g: load path %g, want %g", h, metrics[MetricLoadPath], want)
		}
	}
}

// TestMetricsDefaults checks the default metrics: the load path alone
// without strength limits or sizing, with the volume when every material
// has both limits or the members are sized, and the objective's metric
// added when missing.
func TestMetricsDefaults(t *testing.T) {
	limited, err := model.Compile(twoBarSpec(1, false))
	if err != nil {
		t.Fatal(err)
	}
	bare := *limited
	bare.Materials = []model.Material{{ID: "plain", ElasticModulus: 1}}
	cases := []struct {
		name      string
		m         *model.Model
		requested []string
		sized     bool
		objective string
		want      []string
	}{
		{"no limits", &bare, nil, false, "", []string{MetricLoadPath}},
		{"sized", &bare, nil, true, "", []string{MetricLoadPath, MetricVolume}},
		{"limits", limited, nil, false, "", []string{MetricLoadPath, MetricVolume}},
		{"objective added", &bare, []string{MetricMaxDisplacement}, false, MetricMass, []string{MetricMaxDisplacement, MetricMass}},
		{"objective present", &bare, []string{MetricMass}, false, MetricMass, []string{MetricMass}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := Metrics(c.m, c.requested, c.sized, c.objective); !slices.Equal(got, c.want) {
				t.Errorf("got %v, want %v", got, c.want)
			}
		})
	}
}
