package statics

import (
	"context"
	"testing"

	"gusset/engine/model"
)

// TestReleaseCounts checks Maxwell's count with end releases (the
// extended rule c − n + k = s − m, with c counting independent member
// forces: Maxwell's rule in its extended form, from memory): each released end removes a member force, and a rotation no
// member end resists is no freedom. Determinacy here is by hand: a
// cantilever with its tip released in bending, or released in all three
// rotations, is still determinate; a portal fixed at both feet is
// three times indeterminate, and each of its three hinges takes one away
// (a three-hinged portal is determinate, unless its hinges lie in a line).
func TestReleaseCounts(t *testing.T) {
	fixed3 := []int{model.X, model.Y, model.Z, model.RX, model.RY, model.RZ}
	fixed2 := []int{model.X, model.Y, model.RZ}
	cantilever := func(comps ...int) *model.Model {
		m := frame(3, []float64{0, 0, 0, 4, 0, 0}, [][2]int{{0, 1}}, model.Beam, map[int][]int{0: fixed3})
		for _, c := range comps {
			m.Members[0].Releases[1] |= model.ReleaseBit(c)
		}
		return m
	}
	portal := func(hinges int) *model.Model {
		coords := []float64{0, 0, 0, 4, 3, 5, 6, 4, 6, 0} // a pitched top: the three hinges are not in a line
		m := frame(2, coords, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 4}}, model.Beam, map[int][]int{0: fixed2, 4: fixed2})
		// Hinges at the crown, then the left knee, then the right knee.
		ends := [][2]int{{1, 1}, {0, 1}, {3, 0}}
		for _, h := range ends[:hinges] {
			m.Members[h[0]].Releases[h[1]] |= model.ReleaseBit(model.RZ)
		}
		return m
	}
	// With a flat top the three hinges lie in a line: the crown can move
	// across it to first order, a mechanism with its state of self-stress.
	flat := func() *model.Model {
		m := portal(3)
		m.Coords[5] = 4
		return m
	}
	for _, tc := range []struct {
		name                       string
		m                          *model.Model
		columns, freedoms, s, mech int
	}{
		{"cantilever", cantilever(), 6, 6, 0, 0},
		{"cantilever, tip released ry rz", cantilever(model.RY, model.RZ), 4, 4, 0, 0},
		{"cantilever, tip a ball joint", cantilever(model.RX, model.RY, model.RZ), 3, 3, 0, 0},
		{"fixed portal", portal(0), 12, 9, 3, 0},
		{"portal, crown hinge", portal(1), 11, 9, 2, 0},
		{"portal, two hinges", portal(2), 10, 9, 1, 0},
		{"portal, three hinges", portal(3), 9, 9, 0, 0},
		{"flat portal, three hinges in a line", flat(), 9, 9, 1, 1},
	} {
		r, err := Analyse(context.Background(), tc.m, Options{})
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if r.Columns != tc.columns || r.Freedoms != tc.freedoms || r.SelfStress != tc.s || r.Mechanisms != tc.mech ||
			r.MaxwellNumber != tc.s-tc.mech {
			t.Errorf("%s: columns %d, freedoms %d, s %d, m %d, Maxwell %d; want %d, %d, %d, %d",
				tc.name, r.Columns, r.Freedoms, r.SelfStress, r.Mechanisms, r.MaxwellNumber, tc.columns, tc.freedoms, tc.s, tc.mech)
		}
	}
	free, err := FreeRotations(cantilever(model.RY, model.RZ))
	if err != nil || free[1] != model.ReleaseBit(model.RY)|model.ReleaseBit(model.RZ) || free[0] != 0 {
		t.Errorf("free rotations %v, %v; want ry and rz at the tip", free, err)
	}
}
