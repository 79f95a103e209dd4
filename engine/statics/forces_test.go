package statics

import (
	"context"
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// TestForcesKingPost checks a triangle (span 2a, rise h) on a pin and a
// roller with a load P down at the apex. Method of joints (any statics
// text, e.g. Hibbeler, Engineering Mechanics: Statics, ch. 6, from memory):
// each rafter carries −P/(2 sin θ), the tie +P/(2 tan θ), and each support
// P/2 upwards, where tan θ = h/a.
func TestForcesKingPost(t *testing.T) {
	const a, h, p = 3.0, 2.0, 10.0
	m := frame(2, []float64{0, 0, 2 * a, 0, a, h}, [][2]int{{0, 1}, {1, 2}, {2, 0}}, model.Bar, map[int][]int{0: pin, 1: rollerY})
	loads := []float64{0, 0, 0, 0, 0, -p}
	eq, err := Forces(context.Background(), m, loads)
	if err != nil {
		t.Fatal(err)
	}
	theta := math.Atan2(h, a)
	want := []float64{p / (2 * math.Tan(theta)), -p / (2 * math.Sin(theta)), -p / (2 * math.Sin(theta))}
	for i, w := range want {
		if !scalar.EqualWithinAbsOrRel(eq.Axial[i], w, 1e-12, 1e-12) {
			t.Errorf("member %d: %v, want %v", i, eq.Axial[i], w)
		}
	}
	wantR := [][]float64{{0, p / 2}, {0, p / 2}}
	for s := range wantR {
		for c := range 2 {
			if !scalar.EqualWithinAbsOrRel(eq.Reactions[s][c], wantR[s][c], 1e-12, 1e-12) {
				t.Errorf("support %d component %d: %v, want %v", s, c, eq.Reactions[s][c], wantR[s][c])
			}
		}
	}
}

// TestForcesRefusals checks the failure modes: a mechanism loaded along
// its sway, a self-stressed frame, and a frame of beams.
func TestForcesRefusals(t *testing.T) {
	square := []float64{0, 0, 1, 0, 1, 1, 0, 1}
	sides := [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}}
	tests := []struct {
		name string
		m    *model.Model
		kind fault.Kind
	}{
		{"sway", frame(2, square, sides, model.Bar, map[int][]int{0: pin, 1: rollerY}), fault.NotInEquilibrium},
		{"braced twice", frame(2, square, append(sides[:4:4], [2]int{0, 2}, [2]int{1, 3}), model.Bar, map[int][]int{0: pin, 1: rollerY}), fault.InvalidModel},
		{"beams", frame(2, square, sides, model.Beam, map[int][]int{0: pin, 1: rollerY}), fault.InvalidModel},
	}
	for _, tc := range tests {
		loads := []float64{0, 0, 0, 0, 0, 0, 1, 0}
		_, err := Forces(context.Background(), tc.m, loads)
		if !errors.Is(err, &fault.Error{Kind: tc.kind}) {
			t.Errorf("%s: error %v, want kind %v", tc.name, err, tc.kind)
		}
	}
}
