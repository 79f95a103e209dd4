package layout

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// hangingProblem is a load P = 1 hanging at C = (0, 0) below three pins:
// A = (−1, 1), B = (1, 1) and D = (0, 2.5) straight above C.
func hangingProblem(jointCost float64) Problem {
	pinned := [3]bool{true, true}
	return Problem{
		Nodes:        [][3]float64{{0, 0}, {-1, 1}, {1, 1}, {0, 2.5}},
		Supports:     []Support{{Node: 1, Fix: pinned}, {Node: 2, Fix: pinned}, {Node: 3, Fix: pinned}},
		Cases:        []Case{{ID: "P", Loads: []Load{{Node: 0, Force: [3]float64{0, -1}}}}},
		TensionLimit: 1, CompressionLimit: 1, JointCost: jointCost,
	}
}

// TestJointCostChoosesFewerMembers checks the joint cost against a hand
// result, from equilibrium at C alone. With a joint cost s added to every
// member's length (Parkes, "Joints in optimum frameworks", Int. J. Solids
// Struct. 11, 1975; the formulation from memory) a layout costs
// Σ (L + s)|N|/σ. The two ties CA and CB at 45° each carry P/√2 over √2:
// volume 2P/σ, cost (2 + √2·s)P/σ. The vertical tie CD carries P over 2.5:
// volume 2.5P/σ, cost (2.5 + s)P/σ. Any other way to carry P at C is a
// mix of these two (CA or CB alone cannot balance a vertical force), so the
// cost is linear in the mix and the optimum is the cheaper of the two: the
// pair for s < 0.5/(√2 − 1) ≈ 1.207, the single tie above.
func TestJointCostChoosesFewerMembers(t *testing.T) {
	for _, tc := range []struct {
		s                 float64
		members           int
		volume, objective float64
	}{
		{0, 2, 2, 2},
		{0.5, 2, 2, 2 + math.Sqrt2*0.5},
		{1.1, 2, 2, 2 + math.Sqrt2*1.1},
		{1.3, 1, 2.5, 2.5 + 1.3},
		{2, 1, 2.5, 4.5},
	} {
		l, err := Optimise(context.Background(), hangingProblem(tc.s), Options{}, nil)
		if err != nil {
			t.Fatalf("s = %g: %v", tc.s, err)
		}
		checkResult(t, l)
		if len(l.Members) != tc.members || !scalar.EqualWithinAbsOrRel(l.Volume, tc.volume, 1e-7, 1e-7) ||
			!scalar.EqualWithinAbsOrRel(l.Objective, tc.objective, 1e-7, 1e-7) {
			t.Errorf("s = %g: %d members, volume %.9g, cost %.9g; want %d, %.9g, %.9g",
				tc.s, len(l.Members), l.Volume, l.Objective, tc.members, tc.volume, tc.objective)
		}
	}
}

// TestJointCostKeepsLongMembers: on a 3 × 1 grid over [0, 3] × [0, 1] the
// plain ground structure leaves out the 3 pairs in each row of four nodes
// that pass through another node (28 − 6 = 22 candidates); with a joint
// cost they stay, since one member is cheaper than the chain along it. A
// force P = 1 along the bottom row, pulling at (3, 0) away from a pin at
// (0, 0) held also by a pin at (0, 1), is carried by one straight tie:
// volume 3P/σ and cost (3 + s)P/σ, where a chain of three would cost
// (3 + 3s)P/σ (hand result).
func TestJointCostKeepsLongMembers(t *testing.T) {
	pinned := [3]bool{true, true}
	for _, tc := range []struct {
		s          float64
		candidates int
	}{{0, 22}, {1, 28}} {
		p := Problem{
			Domain: Rectangle(0, 0, 3, 1), Divisions: [3]int{3, 1},
			Supports:     []Support{{Node: -1, At: [3]float64{0, 0}, Fix: pinned}, {Node: -1, At: [3]float64{0, 1}, Fix: pinned}},
			Cases:        []Case{{ID: "P", Loads: []Load{{Node: -1, At: [3]float64{3, 0}, Force: [3]float64{1, 0}}}}},
			TensionLimit: 1, CompressionLimit: 1, JointCost: tc.s,
		}
		l, err := Optimise(context.Background(), p, Options{}, nil)
		if err != nil {
			t.Fatalf("s = %g: %v", tc.s, err)
		}
		checkResult(t, l)
		if l.Stats.Candidates != tc.candidates {
			t.Errorf("s = %g: %d candidates, want %d", tc.s, l.Stats.Candidates, tc.candidates)
		}
		if len(l.Members) != 1 || !scalar.EqualWithinAbsOrRel(l.Volume, 3, 1e-7, 1e-7) ||
			!scalar.EqualWithinAbsOrRel(l.Objective, 3+tc.s, 1e-7, 1e-7) {
			t.Errorf("s = %g: %d members, volume %.9g, cost %.9g; want 1, 3, %g", tc.s, len(l.Members), l.Volume, l.Objective, 3+tc.s)
		}
	}
}
