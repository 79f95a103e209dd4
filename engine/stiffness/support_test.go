package stiffness

import (
	"context"
	"testing"

	"gusset/engine/model"
)

// TestSettlement checks a propped cantilever whose prop settles by Δ with
// no load: the prop must pull the tip down Δ, which takes the force
// 3EIΔ/L³ and leaves the moment 3EIΔ/L² at the fixed end (tip stiffness of
// a cantilever from the tip-load formula PL³/3EI, Gere & Timoshenko beam
// tables, from memory).
func TestSettlement(t *testing.T) {
	const l, delta = 4.0, 0.01
	ei := beamE * beamI
	b, nodes := horizontalBeam(l, 2)
	b.fix(nodes[0], fixed2...)
	prop := b.fix(nodes[2], model.Y)
	b.m.Supports[prop].Displacement[model.Y] = -delta
	r := solve1(t, b.m, Options{})
	near(t, "prop reaction", r.Reactions[1].Force[1], -3*ei*delta/(l*l*l), 1e-12)
	near(t, "fixed-end moment", r.Reactions[0].Moment[0], 3*ei*delta/(l*l), 1e-12)
	near(t, "tip", r.Displacements[nodes[2]][1], -delta, 1e-15)
	if r.BalanceError > 1e-12 {
		t.Errorf("balance %g", r.BalanceError)
	}
}

// TestSpring checks a cantilever whose tip rests on a spring k: the spring
// and the beam's tip stiffness 3EI/L³ act in parallel, so the tip deflects
// P/(k + 3EI/L³) and the spring pushes back with k times that (common
// practice).
func TestSpring(t *testing.T) {
	const l, p, k = 4.0, 10.0, 500.0
	ei := beamE * beamI
	b, nodes := horizontalBeam(l, 1)
	b.fix(nodes[0], fixed2...)
	b.m.Supports = append(b.m.Supports, model.Support{Node: nodes[1], Spring: [6]float64{model.Y: k}})
	b.force(nodes[1], [3]float64{0, -p}, [3]float64{})
	r := solve1(t, b.m, Options{})
	tip := -p / (k + 3*ei/(l*l*l))
	near(t, "tip deflection", r.Displacements[nodes[1]][1], tip, 1e-12)
	near(t, "spring reaction", r.Reactions[1].Force[1], -k*tip, 1e-12)
	if r.BalanceError > 1e-12 {
		t.Errorf("balance %g", r.BalanceError)
	}
}

// TestCombination checks that a combination is the factored sum of its
// cases (superposition, valid for linear elasticity) and that Cases picks
// and orders the results.
func TestCombination(t *testing.T) {
	const l, p, w = 5.0, 12.0, 3.0
	b, nodes := horizontalBeam(l, 2)
	b.fix(nodes[0], fixed2...)
	b.force(nodes[2], [3]float64{0, -p}, [3]float64{})
	b.m.Cases = append(b.m.Cases, model.LoadCase{ID: "udl", MemberLoads: []model.MemberLoad{
		{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}},
		{Member: 1, Kind: model.Uniform, Value: [3]float64{0, -w}},
	}})
	b.m.Combinations = []model.Combination{{ID: "both", Terms: []model.Term{{Case: 0, Factor: 1.35}, {Case: 1, Factor: 1.5}}}}
	res, err := Solve(context.Background(), b.m, Options{Cases: []string{"both", "case"}})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Cases) != 2 || res.Cases[0].ID != "both" || !res.Cases[0].Combination || res.Cases[1].ID != "case" {
		t.Fatalf("cases %+v", res.Cases)
	}
	ei := beamE * beamI
	// Tip deflection PL³/3EI and wL⁴/8EI (beam tables as in beam_test.go).
	want := -1.35*p*l*l*l/(3*ei) - 1.5*w*l*l*l*l/(8*ei)
	near(t, "combined tip deflection", res.Cases[0].Displacements[nodes[2]][1], want, 1e-12)
	near(t, "combined fixed-end moment", res.Cases[0].Reactions[0].Moment[0], 1.35*p*l+1.5*w*l*l/2, 1e-12)
}
