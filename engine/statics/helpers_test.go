package statics

import (
	"fmt"

	"gusset/engine/model"
)

// frame builds a test model directly (the compiler is tested elsewhere):
// coords are Dim numbers per node, members join node pairs, fixed lists
// per-node fixed components.
func frame(dim int, coords []float64, members [][2]int, kind model.MemberKind, fixed map[int][]int) *model.Model {
	m := &model.Model{
		Dim:       dim,
		Coords:    coords,
		Materials: []model.Material{{ID: "steel", ElasticModulus: 2e8, ShearModulus: 8e7}},
		Sections:  []model.Section{{ID: "s", Area: 1e-3, SecondMoment: 1e-6, SecondMomentY: 1e-6, TorsionConstant: 2e-6}},
	}
	for i := range len(coords) / dim {
		m.NodeIDs = append(m.NodeIDs, fmt.Sprintf("n%d", i))
	}
	for i, e := range members {
		m.Members = append(m.Members, model.Member{ID: fmt.Sprintf("m%d", i), Ends: e, Kind: kind, BucklingFactor: 1})
	}
	for n := range len(coords) / dim {
		comps, ok := fixed[n]
		if !ok {
			continue
		}
		s := model.Support{Node: n}
		for _, c := range comps {
			s.Fixed[c] = true
		}
		m.Supports = append(m.Supports, s)
	}
	return m
}

var (
	pin     = []int{model.X, model.Y}
	rollerY = []int{model.Y}
)
