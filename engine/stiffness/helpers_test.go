package stiffness

import (
	"context"
	"fmt"
	"testing"

	"gusset/engine/model"
)

// builder assembles test models by hand, so that the tests do not depend
// on the compiler.
type builder struct{ m *model.Model }

// newBuilder starts a model with one material (E, G) and one section
// (A, Iz, Iy, J).
func newBuilder(dim int, e, g, a, iz, iy, j float64) *builder {
	return &builder{&model.Model{
		Dim:       dim,
		Materials: []model.Material{{ID: "mat", ElasticModulus: e, ShearModulus: g}},
		Sections:  []model.Section{{ID: "sec", Area: a, SecondMoment: iz, SecondMomentY: iy, TorsionConstant: j}},
		Cases:     []model.LoadCase{{ID: "case"}},
	}}
}

func (b *builder) node(at ...float64) int {
	n := b.m.NodeCount()
	b.m.NodeIDs = append(b.m.NodeIDs, fmt.Sprintf("n%d", n))
	b.m.Coords = append(b.m.Coords, at...)
	return n
}

func (b *builder) member(kind model.MemberKind, a, c int) int {
	e := len(b.m.Members)
	b.m.Members = append(b.m.Members, model.Member{ID: fmt.Sprintf("m%d", e), Ends: [2]int{a, c}, Kind: kind, BucklingFactor: 1})
	return e
}

func (b *builder) bar(a, c int) int  { return b.member(model.Bar, a, c) }
func (b *builder) beam(a, c int) int { return b.member(model.Beam, a, c) }

func (b *builder) fix(n int, comps ...int) int {
	s := model.Support{Node: n}
	for _, c := range comps {
		s.Fixed[c] = true
	}
	b.m.Supports = append(b.m.Supports, s)
	return len(b.m.Supports) - 1
}

// force adds a nodal force (and moment) to case 0.
func (b *builder) force(n int, f, mo [3]float64) {
	b.m.Cases[0].Nodal = append(b.m.Cases[0].Nodal, model.NodalLoad{Node: n, Force: f, Moment: mo})
}

func (b *builder) memberLoad(ml model.MemberLoad) {
	b.m.Cases[0].MemberLoads = append(b.m.Cases[0].MemberLoads, ml)
}

var (
	pinned2 = []int{model.X, model.Y}
	fixed2  = []int{model.X, model.Y, model.RZ}
	fixed3  = []int{model.X, model.Y, model.Z, model.RX, model.RY, model.RZ}
)

// solve1 solves case 0 and fails the test on error.
func solve1(t *testing.T, m *model.Model, opt Options) *CaseResult {
	t.Helper()
	res, err := Solve(context.Background(), m, opt)
	if err != nil {
		t.Fatal(err)
	}
	return &res.Cases[0]
}
