package formfind

import (
	"context"
	"fmt"
	"testing"

	"gusset/engine/model"
)

// specBuilder builds test models: nodes, members on one material and
// section, fixed supports and one load case "loads".
type specBuilder struct{ s *model.Spec }

func newSpec(dim int) *specBuilder {
	area := model.Num(1)
	_ = area
	return &specBuilder{s: &model.Spec{Dimension: dim,
		Materials: []model.MaterialSpec{{ID: "mat", ElasticModulus: model.Num(2e8)}},
		Sections:  []model.SectionSpec{{ID: "sec", Area: model.Num(1e-3)}},
		LoadCases: []model.LoadCaseSpec{{ID: "loads"}}}}
}

func (b *specBuilder) node(id string, at ...float64) {
	vs := make([]model.Value, len(at))
	for k, x := range at {
		vs[k] = model.Num(x)
	}
	b.s.Nodes = append(b.s.Nodes, model.NodeSpec{ID: id, At: vs})
}

func (b *specBuilder) member(a, c string) {
	b.s.Members = append(b.s.Members, model.MemberSpec{ID: fmt.Sprintf("m%d", len(b.s.Members)), Ends: [2]string{a, c}, Material: "mat", Section: "sec"})
}

func (b *specBuilder) fix(id string) {
	fix := []string{"x", "y"}
	if b.s.Dimension == 3 {
		fix = append(fix, "z")
	}
	b.s.Supports = append(b.s.Supports, model.SupportSpec{Node: id, Fix: fix})
}

func (b *specBuilder) load(id string, force ...float64) {
	vs := make([]model.Value, len(force))
	for k, x := range force {
		vs[k] = model.Num(x)
	}
	b.s.LoadCases[0].Loads = append(b.s.LoadCases[0].Loads, model.NodalLoadSpec{Node: id, Force: vs})
}

func (b *specBuilder) compile(t testing.TB) *model.Model {
	t.Helper()
	m, err := model.Compile(b.s)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// chain is a 2D chain of n panels of width d between fixed nodes c0 and
// cn at height 0, free nodes c1..c(n−1) first placed at height 0, each
// loaded with P downward.
func chain(n int, d, P float64) *specBuilder {
	b := newSpec(2)
	for i := 0; i <= n; i++ {
		b.node(fmt.Sprintf("c%d", i), float64(i)*d, 0)
		if i > 0 {
			b.member(fmt.Sprintf("c%d", i-1), fmt.Sprintf("c%d", i))
		}
		if i == 0 || i == n {
			b.fix(fmt.Sprintf("c%d", i))
		} else if P != 0 {
			b.load(fmt.Sprintf("c%d", i), 0, -P)
		}
	}
	return b
}

func find(t testing.TB, m *model.Model, p Problem) *Result {
	t.Helper()
	r, err := Find(context.Background(), m, p, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func one(q float64) *model.Value { v := model.Num(q); return &v }

func compileSpec(b *specBuilder) (*model.Model, error) { return model.Compile(b.s) }
