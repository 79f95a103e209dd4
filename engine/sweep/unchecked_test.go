package sweep

import (
	"context"
	"math"
	"strings"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// TestMaxUtilisationNeverFlatters: the two-bar truss's bars are in
// compression and its section gives no second moment, so their buckling
// cannot be checked; max_utilisation then fails with MissingData naming a
// bar instead of reporting the squash check alone. With a second moment
// the metric is N/(χ·A·f) with χ on curve d (the default), from EN
// 1993-1-1 eq. 6.49 written out here, N = P·L/(2h) by joint equilibrium.
func TestMaxUtilisationNeverFlatters(t *testing.T) {
	const a, h, P, E, A, f, I = 2.0, 1.5, 10.0, 2.1e8, 1e-3, 2.35e5, 2e-7
	m, err := model.Compile(twoBarSpec(a, false))
	if err != nil {
		t.Fatal(err)
	}
	eval, err := ModelEvaluator(m, []string{"depth"}, []string{MetricMaxUtilisation}, StiffnessSolver(m, nil), loadpath.Options{})
	if err != nil {
		t.Fatal(err)
	}
	_, err = eval(context.Background(), []float64{h})
	if fe, ok := fault.As(err); !ok || fe.Kind != fault.MissingData || !strings.Contains(fe.Message, `member "l"`) {
		t.Fatalf("err = %v, want MissingData naming member l", err)
	}

	spec := twoBarSpec(a, false)
	second := model.Num(I)
	spec.Sections[0].SecondMoment = &second
	if m, err = model.Compile(spec); err != nil {
		t.Fatal(err)
	}
	eval, err = ModelEvaluator(m, []string{"depth"}, []string{MetricMaxUtilisation}, StiffnessSolver(m, nil), loadpath.Options{})
	if err != nil {
		t.Fatal(err)
	}
	got, err := eval(context.Background(), []float64{h})
	if err != nil {
		t.Fatal(err)
	}
	L := math.Hypot(a, h)
	lambda := math.Sqrt(A * f / (math.Pi * math.Pi * E * I / (L * L)))
	phi := 0.5 * (1 + 0.76*(lambda-0.2) + lambda*lambda)
	chi := 1 / (phi + math.Sqrt(phi*phi-lambda*lambda))
	if want := P * L / (2 * h) / (chi * A * f); math.Abs(got[MetricMaxUtilisation]-want) > 1e-9*want {
		t.Errorf("max_utilisation %g, want %g", got[MetricMaxUtilisation], want)
	}
}
