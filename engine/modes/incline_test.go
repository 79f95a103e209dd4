package modes

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/model"
)

// incline makes support s of b's model one with axes whose rows are x and
// its quarter turn anticlockwise (a plane model).
func (b *testModel) incline(s int, x [2]float64) {
	b.m.Supports[s].Inclined = true
	b.m.Supports[s].Axes = [3][3]float64{{x[0], x[1], 0}, {-x[1], x[0], 0}, {0, 0, 1}}
}

func nearly(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, tol, tol) {
		t.Errorf("%s = %.12g, want %.12g", what, got, want)
	}
}

// TestInclinedVibration checks one degree of freedom: a mass M at B on a
// massless horizontal bar AB (A pinned) and on a support at θ that holds
// B normal to d = (cosθ, sinθ). B moves along d only, where the bar's
// stiffness is (EA/L)·cos²θ, so ω² = (EA/L)·cos²θ/M; the mass-normalised
// shape is d/√M in global axes, and the participation of global x and y
// is √M·cosθ and √M·sinθ (the single-degree-of-freedom oscillator,
// derived in the test).
func TestInclinedVibration(t *testing.T) {
	const l, mass = 3.0, 2.0
	theta := 35 * math.Pi / 180
	c, s := math.Cos(theta), math.Sin(theta)
	b := newTestModel(2)
	b.m.Materials[0].HasMassDensity = false
	a, bn := b.node(0, 0), b.node(l, 0)
	b.member(model.Bar, a, bn)
	b.fix(a, model.X, model.Y)
	b.fix(bn, model.Y)
	b.incline(1, [2]float64{c, s})
	b.m.NodeMasses = []float64{0, mass}
	res, err := Vibration(context.Background(), b.m, Options{Count: 1})
	if err != nil {
		t.Fatal(err)
	}
	md := res.Modes[0]
	nearly(t, "ω²", md.Angular*md.Angular, testE*testA/l*c*c/mass, 1e-9)
	nearly(t, "shape x", md.Displacements[bn][0], c/math.Sqrt(mass), 1e-9)
	nearly(t, "shape y", md.Displacements[bn][1], s/math.Sqrt(mass), 1e-9)
	nearly(t, "participation x", math.Abs(md.Participation[0]), math.Sqrt(mass)*c, 1e-9)
	nearly(t, "participation y", math.Abs(md.Participation[1]), math.Sqrt(mass)*s, 1e-9)
}

// TestInclinedBuckling checks a pinned column of length L whose top is
// held sideways by a support turned a quarter turn (local x vertical and
// free, local y = −global x, fixed): Euler's π²EI/L² (Timoshenko & Gere,
// Theory of Elastic Stability, 1961, §2.1, from memory) with 16 cubic
// elements (within 5e-5, as TestEulerColumns), its shape in global axes
// (the top at rest, the middle moving along x).
func TestInclinedBuckling(t *testing.T) {
	const L = 5.0
	b := newTestModel(2)
	nodes := b.line([]float64{0, 0}, []float64{0, L}, 16, model.Beam)
	top := nodes[len(nodes)-1]
	b.fix(nodes[0], model.X, model.Y)
	b.fix(top, model.Y)
	b.incline(1, [2]float64{0, 1})
	b.load(top, 0, -1)
	res, err := Buckling(context.Background(), b.m, Options{Count: 1})
	if err != nil {
		t.Fatal(err)
	}
	euler := math.Pi * math.Pi * testE * testI / (L * L)
	if rel := (res.Critical - euler) / euler; rel < -1e-12 || rel > 5e-5 {
		t.Errorf("critical %g, Euler %g (%.3g)", res.Critical, euler, rel)
	}
	shape := res.Modes[0].Displacements
	if math.Abs(shape[top][0]) > 1e-9 || math.Abs(shape[nodes[8]][0]) < 0.99 {
		t.Errorf("top moves %v, middle %v", shape[top], shape[nodes[8]])
	}
}
