package statics

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/model"
)

// TestCountingRule checks s and m against the extended Maxwell rule on
// classic frameworks. The expected counts are standard textbook cases of
// the rule b − d·j + k = s − m (S. Pellegrino, "Structural computations
// with the singular value decomposition of the equilibrium matrix", Int. J.
// Solids Struct. 30, 1993, from memory), with s and m read off by
// inspection as stated per case.
func TestCountingRule(t *testing.T) {
	square := []float64{0, 0, 1, 0, 1, 1, 0, 1}
	sides := [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}}
	supported := map[int][]int{0: pin, 1: rollerY}
	threeD := []int{model.X, model.Y, model.Z}
	tests := []struct {
		name       string
		m          *model.Model
		s, mech    int
		maxwell    int
		constraint int
	}{
		// A triangle on a pin and a roller is the simplest stiff frame:
		// 3 − 6 + 3 = 0 with s = m = 0.
		{"triangle", frame(2, []float64{0, 0, 2, 0, 1, 1}, [][2]int{{0, 1}, {1, 2}, {2, 0}}, model.Bar, supported), 0, 0, 0, 3},
		// The same triangle with no supports keeps its three plane
		// rigid-body motions (our convention counts them in m).
		{"free triangle", frame(2, []float64{0, 0, 2, 0, 1, 1}, [][2]int{{0, 1}, {1, 2}, {2, 0}}, model.Bar, nil), 0, 3, -3, 0},
		// A square without a diagonal sways: 4 − 8 + 3 = −1, m = 1.
		{"square", frame(2, square, sides, model.Bar, supported), 0, 1, -1, 3},
		// One diagonal makes it stiff and determinate.
		{"square, one diagonal", frame(2, square, append(sides[:4:4], [2]int{0, 2}), model.Bar, supported), 0, 0, 0, 3},
		// Both diagonals: one state of self-stress, 6 − 8 + 3 = 1.
		{"square, both diagonals", frame(2, square, append(sides[:4:4], [2]int{0, 2}, [2]int{1, 3}), model.Bar, supported), 1, 0, 1, 3},
		// Two collinear bars between two pins: the count is 2 − 6 + 4 = 0,
		// yet s = 1 (the bars can be equally tensioned) and m = 1 (the
		// middle joint moves sideways to first order) — the example that
		// motivates the extended rule (Pellegrino 1993, from memory).
		{"collinear pair", frame(2, []float64{0, 0, 1, 0, 2, 0}, [][2]int{{0, 1}, {1, 2}}, model.Bar, map[int][]int{0: pin, 2: pin}), 1, 1, 0, 4},
		// A tetrahedron on 6 constraints is the 3D stiff frame: 6 − 12 + 6.
		{"tetrahedron", frame(3, []float64{0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1}, [][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}}, model.Bar,
			map[int][]int{0: threeD, 1: {model.Y, model.Z}, 2: {model.Z}}), 0, 0, 0, 6},
		// A portal frame of beams with fixed bases is three times
		// statically indeterminate and a two-pinned one once (common
		// textbook result, e.g. Hibbeler, Structural Analysis, ch. 2 on
		// determinacy of frames, from memory).
		{"fixed portal", frame(2, []float64{0, 0, 0, 3, 4, 3, 4, 0}, [][2]int{{0, 1}, {1, 2}, {2, 3}}, model.Beam,
			map[int][]int{0: {model.X, model.Y, model.RZ}, 3: {model.X, model.Y, model.RZ}}), 3, 0, 3, 6},
		{"pinned portal", frame(2, []float64{0, 0, 0, 3, 4, 3, 4, 0}, [][2]int{{0, 1}, {1, 2}, {2, 3}}, model.Beam,
			map[int][]int{0: pin, 3: pin}), 1, 0, 1, 4},
		// A 3D cantilever of beams is determinate and stiff: 6 − 12 + 6.
		{"3D cantilever", frame(3, []float64{0, 0, 0, 2, 1, 0.5}, [][2]int{{0, 1}}, model.Beam,
			map[int][]int{0: {model.X, model.Y, model.Z, model.RX, model.RY, model.RZ}}), 0, 0, 0, 6},
	}
	for _, tc := range tests {
		r, err := Analyse(context.Background(), tc.m, Options{})
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if !r.Computed || r.SelfStress != tc.s || r.Mechanisms != tc.mech || r.MaxwellNumber != tc.maxwell || r.Constraints != tc.constraint {
			t.Errorf("%s: computed %v s=%d m=%d maxwell=%d k=%d, want s=%d m=%d maxwell=%d k=%d", tc.name,
				r.Computed, r.SelfStress, r.Mechanisms, r.MaxwellNumber, r.Constraints, tc.s, tc.mech, tc.maxwell, tc.constraint)
		}
		if r.SelfStress-r.Mechanisms != r.MaxwellNumber {
			t.Errorf("%s: s − m = %d, Maxwell number %d", tc.name, r.SelfStress-r.Mechanisms, r.MaxwellNumber)
		}
		if len(r.SelfStressStates) != r.SelfStress || len(r.MechanismModes) != r.Mechanisms {
			t.Errorf("%s: %d states, %d modes", tc.name, len(r.SelfStressStates), len(r.MechanismModes))
		}
	}
}

// TestBracedSquareSelfStress checks the state of self-stress of a square
// with both diagonals. Joint equilibrium at any corner, where two sides
// meet at a right angle and the diagonal bisects them, gives side force t
// and diagonal force −√2·t (derived by hand, resolving along the sides), so
// the state is proportional to (1, 1, 1, 1, −√2, −√2).
func TestBracedSquareSelfStress(t *testing.T) {
	m := frame(2, []float64{0, 0, 1, 0, 1, 1, 0, 1}, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}, {0, 2}, {1, 3}}, model.Bar,
		map[int][]int{0: pin, 1: rollerY})
	r, err := Analyse(context.Background(), m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.SelfStressStates) != 1 {
		t.Fatalf("%d states, want 1", len(r.SelfStressStates))
	}
	want := []float64{1, 1, 1, 1, -math.Sqrt2, -math.Sqrt2}
	norm := math.Sqrt(8)
	// The basis is normalised with its largest entry positive: the
	// diagonals are the largest, so the sign of want flips.
	for i, w := range want {
		if got := r.SelfStressStates[0][i]; !scalar.EqualWithinAbsOrRel(got, -w/norm, 1e-12, 1e-12) {
			t.Errorf("member %d: force %v, want %v", i, got, -w/norm)
		}
	}
}

// TestSquareMechanism checks the sway of a square on a pin and a roller:
// by inextensibility of the bars (first order), the bottom joints cannot
// move and both top joints move equally sideways, so the unit mode has
// x = 1/√2 at nodes 2 and 3 and zero elsewhere.
func TestSquareMechanism(t *testing.T) {
	m := frame(2, []float64{0, 0, 1, 0, 1, 1, 0, 1}, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}}, model.Bar,
		map[int][]int{0: pin, 1: rollerY})
	r, err := Analyse(context.Background(), m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	want := []float64{0, 0, 0, 0, 1 / math.Sqrt2, 0, 1 / math.Sqrt2, 0}
	for i, w := range want {
		if got := r.MechanismModes[0][i]; !scalar.EqualWithinAbsOrRel(got, w, 1e-12, 1e-12) {
			t.Errorf("entry %d: %v, want %v", i, got, w)
		}
	}
	if r.MechanismRotations != nil {
		t.Errorf("rotations for a pin-jointed model")
	}
}

// TestDenseLimit checks that a model above the limit is counted but not
// analysed: a square with both diagonals on a pin and a roller has Maxwell
// number b − 2j + k = 6 − 8 + 3 = 1 (Maxwell 1864), known without the rank,
// while s and m are left uncomputed.
func TestDenseLimit(t *testing.T) {
	m := frame(2, []float64{0, 0, 1, 0, 1, 1, 0, 1}, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}, {0, 2}, {1, 3}}, model.Bar, map[int][]int{0: pin, 1: rollerY})
	r, err := Analyse(context.Background(), m, Options{DenseLimit: 2})
	if err != nil {
		t.Fatal(err)
	}
	if r.Computed || r.MaxwellNumber != 1 || r.SelfStress != 0 || r.SelfStressStates != nil {
		t.Errorf("got %+v, want an uncomputed report with Maxwell number 1", r)
	}
}

// TestCancelled checks that a cancelled context stops the analysis.
func TestCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	m := frame(2, []float64{0, 0, 2, 0, 1, 1}, [][2]int{{0, 1}, {1, 2}, {2, 0}}, model.Bar, nil)
	if _, err := Analyse(ctx, m, Options{}); err == nil {
		t.Error("no error from a cancelled context")
	}
}
