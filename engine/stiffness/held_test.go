package stiffness

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"gusset/engine/fault"
)

// funicular returns a three-bar pinned arch through (0,0), (1,1), (2,1),
// (3,0): a mechanism (b − 2j + k = 3 − 8 + 4 = −1, m = 1), loaded by P at
// each crown node when symmetric, or at the left crown node only.
func funicular(symmetric bool) *builder {
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	for _, p := range [][2]float64{{0, 0}, {1, 1}, {2, 1}, {3, 0}} {
		b.node(p[0], p[1])
	}
	b.bar(0, 1)
	b.bar(1, 2)
	b.bar(2, 3)
	b.fix(0, pinned2...)
	b.fix(3, pinned2...)
	b.force(1, [3]float64{0, -10}, [3]float64{})
	if symmetric {
		b.force(2, [3]float64{0, -10}, [3]float64{})
	}
	return b
}

// TestMechanismCarryingItsLoads checks a funicular arch: the polygon
// (0,0)–(1,1)–(2,1)–(3,0) is the funicular of two equal crown loads P, so
// the members carry them although the arch is a mechanism. By joint
// equilibrium at (1,1): the 45° bar's force C has vertical part C/√2 = P
// and horizontal part C/√2 = H, the crown bar's thrust, so the inclined
// bars carry −P√2 and the crown bar −P (any graphic-statics text on the
// funicular polygon, from memory). Under one crown load alone the
// mechanism moves and Solve refuses the model.
func TestMechanismCarryingItsLoads(t *testing.T) {
	for _, path := range []Path{Dense, Sparse} {
		r, err := Solve(context.Background(), funicular(true).m, Options{Path: path})
		if err != nil {
			t.Fatalf("%s: symmetric loads: %v", path, err)
		}
		want := []float64{-10 * math.Sqrt2, -10, -10 * math.Sqrt2}
		for e, n := range r.Cases[0].AxialForce {
			if math.Abs(n-want[e]) > 1e-9*10 {
				t.Errorf("%s: member %d: %v, want %v", path, e, n, want[e])
			}
		}
		if len(r.Cases[0].Reactions) != 2 || r.Stability.Mechanisms != 1 {
			t.Errorf("%s: reactions %d, mechanisms %d", path, len(r.Cases[0].Reactions), r.Stability.Mechanisms)
		}
		if len(r.Warnings) == 0 || !strings.Contains(r.Warnings[len(r.Warnings)-1], "stable for these loads only") {
			t.Errorf("%s: warnings %q", path, r.Warnings)
		}
		_, err = Solve(context.Background(), funicular(false).m, Options{Path: path})
		if !errors.Is(err, &fault.Error{Kind: fault.Unstable}) {
			t.Errorf("%s: one crown load: got %v, want an unstable-structure error", path, err)
		}
	}
}
