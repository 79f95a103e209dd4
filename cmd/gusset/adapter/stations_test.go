package adapter

import (
	"context"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/engine/stiffness"
)

// TestWireMembersShareTheEngineArrays: the results along the members
// exist once (issue 14: a 100k-member frame's results hold one copy of the
// station arrays). Every station array of solve's wire result is the
// engine's own array, not a copy (same first element, same length), for
// every beam of every case and combination of a 2D and a 3D frame; bars
// have no entry.
func TestWireMembersShareTheEngineArrays(t *testing.T) {
	mixed := modelgen.Frame2D(3, 2)
	mixed.Members[0].Type = "bar"
	for _, spec := range []*model.Spec{modelgen.Frame3D(2, 2, 2), mixed} {
		m := modelgen.Must(spec)
		res, err := stiffness.Solve(context.Background(), m, stiffness.Options{})
		if err != nil {
			t.Fatal(err)
		}
		out := solveResult(m, res)
		beams := 0
		for i := range res.Cases {
			for e := range res.Cases[i].MemberCount() {
				eng, wire := res.Cases[i].Member(e, nil), out.Cases[i].Members[e]
				if m.Members[e].Kind != model.Beam {
					if wire != nil {
						t.Errorf("%dD case %d member %d: a bar has results along it", m.Dim, i, e)
					}
					continue
				}
				beams++
				pairs := [][2][]float64{{eng.Stations, wire.Stations}, {eng.Axial, wire.Axial}, {eng.ShearY, wire.ShearY},
					{eng.ShearZ, wire.ShearZ}, {eng.Torsion, wire.Torsion}, {eng.MomentY, wire.MomentY}, {eng.MomentZ, wire.MomentZ}}
				for k := range eng.Displacements {
					pairs = append(pairs, [2][]float64{eng.Displacements[k], wire.Displacements[k]})
				}
				if len(eng.Stations) != stiffness.DefaultStations || len(wire.Displacements) != len(eng.Displacements) {
					t.Fatalf("%dD case %d member %d: %d stations, %d and %d displacements", m.Dim, i, e,
						len(eng.Stations), len(eng.Displacements), len(wire.Displacements))
				}
				for k, p := range pairs {
					if len(p[0]) != len(p[1]) || len(p[0]) > 0 && &p[0][0] != &p[1][0] {
						t.Errorf("%dD case %d member %d: array %d is a copy or differs (lengths %d, %d)", m.Dim, i, e, k, len(p[0]), len(p[1]))
					}
				}
			}
		}
		if beams == 0 {
			t.Fatalf("%dD: no beams checked", m.Dim)
		}
	}
}
