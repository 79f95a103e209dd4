package sweep

import (
	"context"
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// twoBarSpec is the symmetric two-bar truss of half-span a with its depth
// as a parameter, in kN and m.
func twoBarSpec(a float64, carbon bool) *model.Spec {
	v := func(x float64) *model.Value { val := model.Num(x); return &val }
	mat := model.MaterialSpec{ID: "steel", ElasticModulus: model.Num(2.1e8), WeightDensity: v(77),
		TensionLimit: v(2.35e5), CompressionLimit: v(2.35e5)}
	if carbon {
		mat.CarbonFactor = v(1.5)
	}
	return &model.Spec{
		Dimension:  2,
		Units:      model.UnitsSpec{Length: "m", Force: "kN"},
		Parameters: []model.ParameterSpec{{Name: "depth", Value: 1}},
		Materials:  []model.MaterialSpec{mat},
		Sections:   []model.SectionSpec{{ID: "bar", Area: model.Num(1e-3)}},
		Nodes: []model.NodeSpec{
			{ID: "left", At: []model.Value{model.Num(-a), model.Num(0)}},
			{ID: "right", At: []model.Value{model.Num(a), model.Num(0)}},
			{ID: "apex", At: []model.Value{model.Num(0), model.Expr("depth")}},
		},
		Members: []model.MemberSpec{
			{ID: "l", Ends: [2]string{"left", "apex"}, Material: "steel", Section: "bar"},
			{ID: "r", Ends: [2]string{"right", "apex"}, Material: "steel", Section: "bar"},
		},
		Supports: []model.SupportSpec{{Node: "left", Fix: []string{"x", "y"}}, {Node: "right", Fix: []string{"x", "y"}}},
		LoadCases: []model.LoadCaseSpec{{ID: "P", Loads: []model.NodalLoadSpec{
			{Node: "apex", Force: []model.Value{model.Num(0), model.Num(-10)}}}}},
	}
}

// twoBarSolver stands in for the stiffness solver on the two-bar truss by
// closed forms: bar forces N = −P·L/(2h) from the apex's vertical
// equilibrium; the apex deflection P·L³/(2h²EA) by the unit-load method
// (δ = Σ N·n·L/(EA) with n = N/P; e.g. R. C. Hibbeler, Structural
// Analysis, ch. 9, from memory); utilisation |N|/(A·σ_c). A flat truss
// (h = 0) is a mechanism.
func twoBarSolver(ctx context.Context, m *model.Model) (*Solution, error) {
	a, h := m.Coords[2], m.Coords[5]
	if h == 0 {
		return nil, fault.New(fault.Unstable, "the apex can move vertically: the structure is a mechanism")
	}
	P := -m.Cases[0].Nodal[0].Force[1]
	L := math.Hypot(a, h)
	n := -P * L / (2 * h)
	E, A, sigma := m.Materials[0].ElasticModulus, m.Sections[0].Area, m.Materials[0].CompressionLimit
	return &Solution{
		Cases: []loadpath.Case{{ID: "P", AxialForce: []float64{n, n},
			External: [][]float64{{P * a / (2 * h), P / 2}, {-P * a / (2 * h), P / 2}, {0, -P}}}},
		MaxDisplacement: P * L * L * L / (2 * h * h * E * A),
		MaxUtilisation:  -n / (A * sigma),
	}, nil
}

// TestModelEvaluator sweeps the depth of a compiled two-bar truss through
// ModelEvaluator (expressions re-evaluated per step) and refines the
// volume: with equal limits and no buckling V = Z/σ, least at h = a with
// Z = 2Pa (Michell 1904), so V* = 2Pa/σ and the mass γV*/g₀ in kg (weight
// density in kN/m³ times 1000/9.80665). The flat step fails as a
// mechanism, in place.
func TestModelEvaluator(t *testing.T) {
	const a, P, sigma, gamma = 1.3, 10.0, 2.35e5, 77.0
	m, err := model.Compile(twoBarSpec(a, true))
	if err != nil {
		t.Fatalf("model compiler refused the two-bar truss: %v", err)
	}
	metrics := []string{MetricVolume, MetricMass, MetricCarbon, MetricLoadPath, MetricMaxDisplacement, MetricMaxUtilisation}
	eval, err := ModelEvaluator(m, []string{"depth"}, metrics, twoBarSolver, loadpath.Options{})
	if err != nil {
		t.Fatal(err)
	}
	depths, _ := Range(0, 3, 7)
	res, err := Run(context.Background(), Plan{Axes: []Axis{{"depth", depths}}, Workers: 2, Objective: MetricVolume}, eval, nil)
	if err != nil {
		t.Fatal(err)
	}
	if s := res.Steps[0]; !s.Failed() || !errors.Is(s.Err, &fault.Error{Kind: fault.Unstable}) || res.Failed != 1 {
		t.Errorf("flat step: %+v", s)
	}
	// Step 2 is h = 1: Z = P(a² + 1), δ = P·L³/(2EA).
	s := res.Steps[2]
	L := math.Hypot(a, 1)
	for name, want := range map[string]float64{
		MetricLoadPath:        P * (a*a + 1),
		MetricVolume:          P * (a*a + 1) / sigma,
		MetricMass:            gamma * P * (a*a + 1) / sigma * 1000 / 9.80665,
		MetricCarbon:          1.5 * gamma * P * (a*a + 1) / sigma * 1000 / 9.80665,
		MetricMaxDisplacement: P * L * L * L / (2 * 2.1e8 * 1e-3),
		MetricMaxUtilisation:  P * L / 2 / (1e-3 * sigma),
	} {
		if got, ok := s.Metrics[name]; !ok || !scalar.EqualWithinAbsOrRel(got, want, 0, 1e-12) {
			t.Errorf("h=1: %s = %g, want %g", name, got, want)
		}
	}
	r := res.Refinement
	if !r.Converged || !scalar.EqualWithinAbsOrRel(r.Values[0], a, 0, 1e-6) ||
		!scalar.EqualWithinAbsOrRel(r.Objective, 2*P*a/sigma, 0, 1e-12) {
		t.Errorf("refinement %+v, want h=%g V=%g", r, a, 2*P*a/sigma)
	}
}

// TestModelEvaluatorBadInput checks unknown names and missing carbon data.
func TestModelEvaluatorBadInput(t *testing.T) {
	m, err := model.Compile(twoBarSpec(1, false))
	if err != nil {
		t.Fatalf("model compiler refused the two-bar truss: %v", err)
	}
	for _, tc := range []struct {
		names, metrics []string
		path           string
		kind           fault.Kind
	}{
		{[]string{"rise"}, []string{MetricVolume}, "/axes/0/name", 0},
		{[]string{"depth"}, []string{MetricVolume, "cost"}, "/metrics/1", 0},
		{[]string{"depth"}, []string{MetricCarbon}, "/materials/0/carbon_factor", fault.MissingData},
	} {
		_, err := ModelEvaluator(m, tc.names, tc.metrics, twoBarSolver, loadpath.Options{})
		var pe *PlanError
		fe, isFault := fault.As(err)
		switch {
		case tc.kind == 0 && (!errors.As(err, &pe) || pe.Path != tc.path):
			t.Errorf("%v %v: got %v, want a plan error at %s", tc.names, tc.metrics, err, tc.path)
		case tc.kind != 0 && (!isFault || fe.Kind != tc.kind || fe.Problems[0].Path != tc.path):
			t.Errorf("%v %v: got %v, want %v at %s", tc.names, tc.metrics, err, tc.kind, tc.path)
		}
	}
}
