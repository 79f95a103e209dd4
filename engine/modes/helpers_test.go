package modes

import (
	"fmt"

	"gusset/engine/model"
)

// Section and material of the test members: steel, E = 2.1e8 kN/m²,
// mass density 7.85 t/m³, A = 1e-2 m², I = 1e-5 m⁴ (common practice).
const (
	testE   = 2.1e8
	testRho = 7.85
	testA   = 1e-2
	testI   = 1e-5
)

// testModel builds compiled models by hand.
type testModel struct{ m *model.Model }

func newTestModel(dim int) *testModel {
	return &testModel{&model.Model{
		Dim: dim,
		Materials: []model.Material{{ID: "steel", ElasticModulus: testE, ShearModulus: testE / 2.6,
			MassDensity: testRho, HasMassDensity: true}},
		Sections: []model.Section{{ID: "s", Area: testA, SecondMoment: testI, SecondMomentY: testI, TorsionConstant: 2 * testI}},
		Cases:    []model.LoadCase{{ID: "load"}},
	}}
}

func (b *testModel) node(at ...float64) int {
	n := b.m.NodeCount()
	b.m.NodeIDs = append(b.m.NodeIDs, fmt.Sprintf("n%d", n))
	b.m.Coords = append(b.m.Coords, at...)
	return n
}

func (b *testModel) member(kind model.MemberKind, a, c int) {
	b.m.Members = append(b.m.Members, model.Member{ID: fmt.Sprintf("m%d", len(b.m.Members)), Ends: [2]int{a, c}, Kind: kind, BucklingFactor: 1})
}

func (b *testModel) fix(n int, comps ...int) {
	s := model.Support{Node: n}
	for _, c := range comps {
		s.Fixed[c] = true
	}
	b.m.Supports = append(b.m.Supports, s)
}

func (b *testModel) load(n int, force ...float64) {
	var f [3]float64
	copy(f[:], force)
	b.m.Cases[0].Nodal = append(b.m.Cases[0].Nodal, model.NodalLoad{Node: n, Force: f})
}

// line divides the segment from p to q into elements members of the
// given kind and returns its node indices, first to last.
func (b *testModel) line(p, q []float64, elements int, kind model.MemberKind) []int {
	nodes := []int{b.node(p...)}
	for k := 1; k <= elements; k++ {
		at := make([]float64, len(p))
		for i := range p {
			at[i] = p[i] + (q[i]-p[i])*float64(k)/float64(elements)
		}
		nodes = append(nodes, b.node(at...))
		b.member(kind, nodes[k-1], nodes[k])
	}
	return nodes
}

// frame2D is a plane frame of beams, bays of 6 m and storeys of 3.5 m,
// fixed at its bases, gravity loads on the floors.
func frame2D(bays, storeys int) *model.Model {
	b := newTestModel(2)
	id := func(i, s int) int { return s*(bays+1) + i }
	for s := 0; s <= storeys; s++ {
		for i := 0; i <= bays; i++ {
			b.node(6*float64(i), 3.5*float64(s))
		}
	}
	for s := range storeys {
		for i := 0; i <= bays; i++ {
			b.member(model.Beam, id(i, s), id(i, s+1))
		}
	}
	for s := 1; s <= storeys; s++ {
		for i := range bays {
			b.member(model.Beam, id(i, s), id(i+1, s))
			b.load(id(i, s), 0, -20)
		}
		b.load(id(bays, s), 0, -20)
	}
	for i := 0; i <= bays; i++ {
		b.fix(id(i, 0), model.X, model.Y, model.RZ)
	}
	return b.m
}

// frame3D is a one-bay, two-storey space frame of beams with unequal
// second moments, fixed at its bases.
func frame3D() *model.Model {
	b := newTestModel(3)
	b.m.Sections[0].SecondMomentY = 2.5 * testI
	b.m.Sections[0].TorsionConstant = 0.5 * testI
	corners := [4][2]float64{{0, 0}, {6, 0}, {6, 4}, {0, 4}}
	for s := range 3 {
		for _, c := range corners {
			b.node(c[0], c[1], 3.5*float64(s))
		}
	}
	for s := range 2 {
		for k := range 4 {
			b.member(model.Beam, 4*s+k, 4*(s+1)+k)
			b.member(model.Beam, 4*(s+1)+k, 4*(s+1)+(k+1)%4)
			b.load(4*(s+1)+k, 0, 0, -30)
		}
	}
	for k := range 4 {
		b.fix(k, model.X, model.Y, model.Z, model.RX, model.RY, model.RZ)
	}
	return b.m
}
