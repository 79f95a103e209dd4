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
// 1904); the same through StiffnessSolverFor, which recovers the forces
// alone for these metrics of a bar model.
func TestStiffnessSolverTwoBar(t *testing.T) {
	m, err := model.Compile(twoBarSpec(2, false))
	if err != nil {
		t.Fatal(err)
	}
	metrics := []string{MetricLoadPath, MetricMaxDisplacement}
	checkTwoBar(t, m, StiffnessSolver(m, nil), metrics)
	checkTwoBar(t, m, StiffnessSolverFor(m, nil, metrics), metrics)
}

// checkTwoBar checks solve on the two-bar truss of twoBarSpec(2, false)
// (see TestStiffnessSolverTwoBar).
func checkTwoBar(t *testing.T, m *model.Model, solve Solver, metrics []string) {
	t.Helper()
	const a, P, E, A = 2.0, 10.0, 2.1e8, 1e-3
	eval, err := ModelEvaluator(m, []string{"depth"}, metrics, solve, loadpath.Options{})
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

// TestStiffnessSolverFor checks which metrics let StiffnessSolverFor
// recover the forces alone, that its solutions then equal StiffnessSolver's
// bit for bit (load-path cases and a bar model's largest displacement;
// the values themselves are checked against closed forms in
// TestStiffnessSolverTwoBar), and that ModelEvaluator refuses such a
// solver for metrics it cannot serve.
func TestStiffnessSolverFor(t *testing.T) {
	truss, err := model.Compile(twoBarSpec(2, false))
	if err != nil {
		t.Fatal(err)
	}
	frame := strut()
	for _, tc := range []struct {
		name       string
		m          *model.Model
		metrics    []string
		forcesOnly bool
	}{
		{"bars/load_path", truss, []string{MetricLoadPath, MetricVolume}, true},
		{"bars/max_displacement", truss, []string{MetricMaxDisplacement}, true},
		{"bars/max_utilisation", truss, []string{MetricLoadPath, MetricMaxUtilisation}, false},
		{"bars/every metric", truss, nil, false},
		{"beams/load_path", frame, []string{MetricLoadPath}, true},
		{"beams/max_displacement", frame, []string{MetricLoadPath, MetricMaxDisplacement}, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			param := tc.m.ParamNames[0]
			mm, err := tc.m.WithParameters(map[string]float64{param: 1.7})
			if err != nil {
				t.Fatal(err)
			}
			want, err := StiffnessSolver(tc.m, nil)(context.Background(), mm)
			if err != nil {
				t.Fatal(err)
			}
			got, err := StiffnessSolverFor(tc.m, nil, tc.metrics)(context.Background(), mm)
			if err != nil {
				t.Fatal(err)
			}
			if got.ForcesOnly != tc.forcesOnly {
				t.Fatalf("ForcesOnly = %v, want %v", got.ForcesOnly, tc.forcesOnly)
			}
			for i := range want.Cases {
				if !slices.Equal(got.Cases[i].AxialForce, want.Cases[i].AxialForce) {
					t.Errorf("case %d: axial forces differ", i)
				}
				for n := range want.Cases[i].External {
					if !slices.Equal(got.Cases[i].External[n], want.Cases[i].External[n]) {
						t.Errorf("case %d: external force at node %d differs", i, n)
					}
				}
			}
			if !tc.forcesOnly || tc.m == truss {
				if got.MaxDisplacement != want.MaxDisplacement {
					t.Errorf("MaxDisplacement %g, want %g", got.MaxDisplacement, want.MaxDisplacement)
				}
			}
		})
	}
	eval, err := ModelEvaluator(truss, []string{"depth"}, []string{MetricMaxUtilisation},
		StiffnessSolverFor(truss, nil, []string{MetricLoadPath}), loadpath.Options{})
	if err != nil {
		t.Fatal(err)
	}
	defer func() {
		if recover() == nil {
			t.Error("ModelEvaluator served max_utilisation from a forces-only solver")
		}
	}()
	_, _ = eval(context.Background(), []float64{1})
}
