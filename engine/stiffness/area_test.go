package stiffness

import (
	"context"
	"math"
	"testing"

	"gusset/engine/model"
)

// TestPartialTriangle checks a simply supported beam of span L under a
// load rising linearly from 0 at the ends to q at midspan, given as two
// partial linear loads (the shape a two-way panel gives its short edges):
// reactions qL/4, largest moment qL²/12 at midspan and deflection
// qL⁴/(120EI) there (W = qL/2: M = WL/6, δ = WL³/(60EI); Gere & Timoshenko,
// Mechanics of Materials, beam deflection tables, from memory). On both
// solver paths, with one element (the breakpoint inside it).
func TestPartialTriangle(t *testing.T) {
	const l, q = 6.0, 5.0
	ei := beamE * beamI
	for _, path := range []Path{Dense, Sparse} {
		b, nodes := horizontalBeam(l, 1)
		b.fix(nodes[0], pinned2...)
		b.fix(nodes[1], model.Y)
		b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Linear, Partial: true, Start: 0, End: l / 2, EndValue: [3]float64{0, -q}})
		b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Linear, Partial: true, Start: l / 2, End: l, Value: [3]float64{0, -q}})
		r := solve1(t, b.m, Options{Path: path})
		near(t, "reaction A", r.Reactions[0].Force[1], q*l/4, 1e-12)
		near(t, "reaction B", r.Reactions[1].Force[1], q*l/4, 1e-12)
		pk := r.Member(0, nil).PeakMomentZ
		near(t, "largest moment", math.Abs(pk.Value), q*l*l/12, 1e-10)
		near(t, "largest moment at", pk.At, l/2, 1e-8)
		near(t, "midspan deflection", math.Abs(r.Member(0, nil).PeakDeflectionY.Value), q*l*l*l*l/(120*ei), 1e-9)
	}
}

// TestPartialUniform checks a simply supported beam of span 4 with a
// uniform load q on [1, 3] only (statics derived in the test): each
// support takes q, and the moment at midspan is q·2 − q·1·½ = 1.5q, the
// largest. The load starts and ends inside the member.
func TestPartialUniform(t *testing.T) {
	const q = 8.0
	b, nodes := horizontalBeam(4, 1)
	b.fix(nodes[0], pinned2...)
	b.fix(nodes[1], model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Partial: true, Start: 1, End: 3, Value: [3]float64{0, -q}})
	r := solve1(t, b.m, Options{})
	near(t, "reaction A", r.Reactions[0].Force[1], q, 1e-12)
	near(t, "reaction B", r.Reactions[1].Force[1], q, 1e-12)
	near(t, "largest moment", math.Abs(r.Member(0, nil).PeakMomentZ.Value), 1.5*q, 1e-10)
	near(t, "largest moment at", r.Member(0, nil).PeakMomentZ.At, 2, 1e-8)
}

// TestAreaEquilibrium checks a 6 × 4 roof of four 3D beams on pinned
// corners under a pressure p spread to the nodes, two ways and one way to
// the beams: whatever the rule, the reactions sum to p·24 (the panel's
// total, statics) and, by the panel's double symmetry, each corner takes
// a quarter (derived in the test).
func TestAreaEquilibrium(t *testing.T) {
	const p = 2.5
	for _, load := range []model.AreaLoadSpec{
		{Nodes: []string{"A", "B", "C", "D"}, Pressure: &[]float64{p}[0]},
		{Nodes: []string{"A", "B", "C", "D"}, Pressure: &[]float64{p}[0], To: "members", Span: "two-way"},
		{Nodes: []string{"A", "B", "C", "D"}, Pressure: &[]float64{p}[0], To: "members", Span: "one-way", SpanDirection: []float64{0, 1, 0}},
	} {
		s := &model.Spec{
			Dimension: 3,
			Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(2.1e8)}},
			Sections:  []model.SectionSpec{{ID: "hollow", Area: model.Num(4e-3), SecondMoment: &[]model.Value{model.Num(2e-5)}[0]}},
			LoadCases: []model.LoadCaseSpec{{ID: "wind", AreaLoads: []model.AreaLoadSpec{load}}},
		}
		for i, at := range [][3]float64{{0, 0, 0}, {6, 0, 0}, {6, 4, 0}, {0, 4, 0}} {
			id := string(rune('A' + i))
			s.Nodes = append(s.Nodes, model.NodeSpec{ID: id, At: []model.Value{model.Num(at[0]), model.Num(at[1]), model.Num(at[2])}})
			s.Supports = append(s.Supports, model.SupportSpec{Node: id, Fix: []string{"x", "y", "z"}})
		}
		for i := range 4 {
			a, c := string(rune('A'+i)), string(rune('A'+(i+1)%4))
			s.Members = append(s.Members, model.MemberSpec{ID: a + c, Ends: [2]string{a, c}, Material: "steel", Section: "hollow", Type: "beam"})
		}
		m, err := model.Compile(s)
		if err != nil {
			t.Fatal(err)
		}
		res, err := Solve(context.Background(), m, Options{})
		if err != nil {
			t.Fatal(err)
		}
		r := res.Cases[0]
		near(t, "reaction sum", r.ReactionSum[2], p*24, 1e-12)
		near(t, "load sum", r.LoadSum[2], -p*24, 1e-12)
		for i := range 4 {
			near(t, "corner reaction", r.Reactions[i].Force[2], p*6, 1e-10)
		}
	}
}

// TestInclinedAreaSweep checks that a sweep's reused Analysis (numbering,
// pattern and symbolic factorisation kept across steps) gives, step by
// step, what a fresh Solve gives for a pitched roof panel of four beams on
// a pin, two rollers and an inclined support (C, held along its own
// horizontal y and z), under projected snow spread two ways to its edges,
// as its rise changes (WithParameters respreads the panel's shares); and
// that each step's reactions sum to the snow per plan area times the plan
// area, 0.8 × 24 (statics).
func TestInclinedAreaSweep(t *testing.T) {
	const snow = 0.8
	s := &model.Spec{
		Dimension:  3,
		Parameters: []model.ParameterSpec{{Name: "rise", Value: 1}},
		Materials:  []model.MaterialSpec{{ID: "steel", ElasticModulus: model.Num(2.1e8)}},
		Sections:   []model.SectionSpec{{ID: "hollow", Area: model.Num(4e-3), SecondMoment: &[]model.Value{model.Num(2e-5)}[0]}},
		LoadCases: []model.LoadCaseSpec{{ID: "snow", AreaLoads: []model.AreaLoadSpec{{Nodes: []string{"A", "B", "C", "D"},
			Value: []float64{0, 0, -snow}, Projected: true, To: "members", Span: "two-way"}}}},
		Supports: []model.SupportSpec{
			{Node: "A", Fix: []string{"x", "y", "z"}},
			{Node: "B", Fix: []string{"y", "z"}},
			{Node: "C", Fix: []string{"y", "z"}, Directions: [][]float64{{1, 1, 0}}},
			{Node: "D", Fix: []string{"z"}},
		},
	}
	for i, at := range [][3]model.Value{
		{model.Num(0), model.Num(0), model.Num(0)}, {model.Num(6), model.Num(0), model.Num(0)},
		{model.Num(6), model.Num(4), model.Expr("rise")}, {model.Num(0), model.Num(4), model.Expr("rise")},
	} {
		s.Nodes = append(s.Nodes, model.NodeSpec{ID: string(rune('A' + i)), At: at[:]})
	}
	for i := range 4 {
		a, c := string(rune('A'+i)), string(rune('A'+(i+1)%4))
		s.Members = append(s.Members, model.MemberSpec{ID: a + c, Ends: [2]string{a, c}, Material: "steel", Section: "hollow", Type: "beam"})
	}
	m, err := model.Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	an := NewAnalysis(m, Options{})
	for _, rise := range []float64{1, 2.5, 4} {
		mr, err := m.WithParameters(map[string]float64{"rise": rise})
		if err != nil {
			t.Fatal(err)
		}
		swept, err := an.Solve(context.Background(), mr)
		if err != nil {
			t.Fatal(err)
		}
		fresh, err := Solve(context.Background(), mr, Options{})
		if err != nil {
			t.Fatal(err)
		}
		a, b := swept.Cases[0], fresh.Cases[0]
		near(t, "reaction sum", a.ReactionSum[2], snow*24, 1e-10)
		for n := range a.Displacements {
			for k := range a.Displacements[n] {
				near(t, "displacement", a.Displacements[n][k], b.Displacements[n][k], 1e-9)
			}
		}
		for k := range a.Reactions[2].LocalForce {
			near(t, "inclined reaction", a.Reactions[2].LocalForce[k], b.Reactions[2].LocalForce[k], 1e-9)
		}
	}
}
