package stiffness

import (
	"math"
	"slices"
	"testing"

	"gusset/engine/model"
)

// TestOneSidedAtInclinedRoller checks that the iteration reads the
// displacements of a node whose support has axes of its own: the node of
// TestCompressionOnlyStrut, held by a compression-only strut below, a bar
// above and a bar to the side (all of stiffness k = E·A/h), sits on a
// roller that rolls along 45° (c = s = 1/√2) and holds it across. With a
// motion δ along the roller the strut stretches δ·s, the bar above
// shortens δ·s and the side bar stretches δ·c; equilibrium along the
// roller (derived here) gives, under P down, δ = −P·s/(k·(2s² + c²)), so
// the strut carries −P/3 and the bar above +P/3; under P up the strut
// would stretch, drops out, and δ = P·s/k: the bar above −P/2, the side
// bar +P/2.
func TestOneSidedAtInclinedRoller(t *testing.T) {
	const h, P, ea = 2.0, 30.0, 2e5
	c := math.Sqrt(0.5)
	for _, path := range []Path{Dense, Sparse} {
		for _, sense := range []float64{-1, 1} {
			bl := newBuilder(2, ea, 0, 1, 0, 0, 0)
			n := bl.node(0, 0)
			base, head, side := bl.node(0, -h), bl.node(0, h), bl.node(-h, 0)
			strut, above, across := bl.bar(base, n), bl.bar(n, head), bl.bar(side, n)
			bl.m.Members[strut].Behaviour = model.CompressionOnly
			for _, s := range []int{base, head, side} {
				bl.fix(s, pinned2...)
			}
			roller := bl.fix(n, model.Y)
			bl.m.Supports[roller].Inclined = true
			bl.m.Supports[roller].Axes = [3][3]float64{{c, c, 0}, {-c, c, 0}, {0, 0, 1}}
			bl.force(n, [3]float64{0, sense * P}, [3]float64{})
			r := solve1(t, bl.m, Options{Path: path})
			if sense < 0 {
				near(t, "strut", r.AxialForce[strut], -P/3, 1e-9)
				near(t, "bar above", r.AxialForce[above], P/3, 1e-9)
				continue
			}
			near(t, "strut (out)", r.AxialForce[strut], 0, 1e-12)
			near(t, "bar above", r.AxialForce[above], -P/2, 1e-9)
			near(t, "side bar", r.AxialForce[across], P/2, 1e-9)
			if !slices.Equal(r.Iteration.Slack, []int{strut}) {
				t.Errorf("slack %v, want [%d]", r.Iteration.Slack, strut)
			}
		}
	}
}
