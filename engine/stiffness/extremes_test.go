package stiffness

import (
	"math"
	"testing"

	"gusset/engine/model"
)

// TestNodeExtremes checks the nodal extremes on hand values: a 3-4-5
// right triangle gives a translation of length 5 (Pythagoras); an
// unchecked member (−1) never wins and a case with no checked member
// reports −1, not 0.
func TestNodeExtremes(t *testing.T) {
	c := &CaseResult{Displacements: [][]float64{{1, 1}, {3, -4}, {0, 5}},
		Utilisation: []float64{-1, 0.5, 0.7, -1, 0.7}}
	if v, n := c.MaxNodeDisplacement(); v != 5 || n != 1 {
		t.Errorf("max displacement %g at %d, want 5 at node 1 (the first of two)", v, n)
	}
	if v, e := c.MaxUtilisation(); v != 0.7 || e != 2 {
		t.Errorf("max utilisation %g at %d, want 0.7 at member 2", v, e)
	}
	none := &CaseResult{Utilisation: []float64{-1, -1}}
	if v, e := none.MaxUtilisation(); v != -1 || e != -1 {
		t.Errorf("no checked member: %g at %d, want −1 at −1", v, e)
	}
	if v, n := (&CaseResult{}).MaxNodeDisplacement(); v != 0 || n != -1 {
		t.Errorf("no nodes: %g at %d", v, n)
	}
}

// TestMeanAxialForceHand reads the end values of each member layout: a
// 2D bar [Fx1, Fy1, Fx2, Fy2], a 2D beam [N1, V1, M1, N2, V2, M2] and a 3D
// beam [Fx, Fy, Fz, Mx, My, Mz] per end, where the force on end 1 is −N₁
// and on end 2 is N₂ (tension positive). A member with equal ends keeps
// its axial force.
func TestMeanAxialForceHand(t *testing.T) {
	c := &CaseResult{
		AxialForce: []float64{10, 3, 8, 4},
		EndForces: [][]float64{
			{-10, 0, 12, 0},
			{-3, 1, 2, 3, -1, 5},
			{-8, 0, 0, 0, 0, 0, 6, 0, 0, 0, 0, 0},
			{-4, 0, 4, 0},
		},
	}
	want := []float64{11, 3, 7, 4}
	got := c.MeanAxialForce()
	for e := range want {
		if math.Abs(got[e]-want[e]) > 1e-15 {
			t.Errorf("member %d: %g, want %g", e, got[e], want[e])
		}
	}
}

// TestMeanAxialForceSelfWeight: a bar from (0, 0) to (3, 4) (L = 5,
// sin θ = 4/5), pinned at the low end and on a horizontal roller at the
// top, under its own weight W = γ·A·L. By moments about the pin the
// roller carries W/2 upward, which balances the half weight lumped there,
// so the force between the nodes is zero, while the weight's component
// along the bar, W·sin θ, makes the end values ∓W·sin θ/2 (a bar under a
// uniform axial load between its ends; hand statics). The mean is 0.
func TestMeanAxialForceSelfWeight(t *testing.T) {
	b := newBuilder(2, 2.1e8, 8e7, 0.01, 0, 0, 0)
	lo, hi := b.node(0, 0), b.node(3, 4)
	b.bar(lo, hi)
	b.fix(lo, pinned2...)
	b.fix(hi, model.Y)
	b.m.Materials[0].WeightDensity = 78
	b.m.Cases[0].SelfWeight = true
	c := solve1(t, b.m, Options{})
	w := 78 * 0.01 * 5.0
	n1, n2 := -c.EndForces[0][0], c.EndForces[0][2]
	if math.Abs(math.Abs(n1)-w*0.4) > 1e-9 || math.Abs(math.Abs(n2)-w*0.4) > 1e-9 || n1*n2 >= 0 {
		t.Errorf("end values %g, %g; want ∓W·sin θ/2 = ∓%g", n1, n2, w*0.4)
	}
	if got := c.MeanAxialForce()[0]; math.Abs(got) > 1e-9 {
		t.Errorf("mean axial force %g, want 0", got)
	}
}
