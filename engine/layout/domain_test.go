package layout

import (
	"context"
	"testing"
)

// TestGridCandidates counts the candidates of a 3 × 3 grid of points by
// hand (common practice): 36 pairs, less the 8 that pass through a middle
// point (3 rows and 3 columns of length 2, and the 2 long diagonals).
func TestGridCandidates(t *testing.T) {
	for _, tc := range []struct {
		name  string
		level int
		want  int
	}{
		{"full", 0, 28},
		// Level 1 keeps the 12 grid edges and 8 cell diagonals.
		{"level 1", 1, 20},
		// Level 2 adds the 8 knight's-move pairs (slope ±1/2 or ±2) of the
		// 3 × 3 grid, 20 + 8 = 28, which is every candidate.
		{"level 2", 2, 28},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := Problem{Domain: Rectangle(0, 0, 2, 2), Divisions: [3]int{2, 2}, Level: tc.level}
			reg, err := newRegion(p.Domain)
			if err != nil {
				t.Fatal(err)
			}
			g, err := buildGround(context.Background(), &p, 2, reg, Options{}.withDefaults(2))
			if err != nil {
				t.Fatal(err)
			}
			if len(g.nodes) != 9 || g.count != tc.want || len(g.allCandidates()) != tc.want {
				t.Errorf("%d nodes, %d candidates; want 9 and %d", len(g.nodes), g.count, tc.want)
			}
		})
	}
}

// TestHoleAndNotch checks the visibility tests against brute force: no
// candidate may have a point strictly inside a hole or outside the outline,
// sampled finely along it, and named members are in or out as drawn by hand.
func TestHoleAndNotch(t *testing.T) {
	domain := Domain{
		// An L shape: the square [0, 4]² without the corner (3, 4] × (3, 4].
		Outline: [][2]float64{{0, 0}, {4, 0}, {4, 3}, {3, 3}, {3, 4}, {0, 4}},
		Holes:   [][][2]float64{{{1.5, 1.5}, {2.5, 1.5}, {2.5, 2.5}, {1.5, 2.5}}},
	}
	p := Problem{Domain: domain, Divisions: [3]int{4, 4}}
	reg, err := newRegion(domain)
	if err != nil {
		t.Fatal(err)
	}
	g, err := buildGround(context.Background(), &p, 2, reg, Options{}.withDefaults(2))
	if err != nil {
		t.Fatal(err)
	}
	// 25 grid points less (2, 2) in the hole and (4, 4) in the notch.
	if len(g.nodes) != 23 {
		t.Errorf("%d nodes, want 23", len(g.nodes))
	}
	inHole := func(q [2]float64) bool { return q[0] > 1.5 && q[0] < 2.5 && q[1] > 1.5 && q[1] < 2.5 }
	inNotch := func(q [2]float64) bool { return q[0] > 3 && q[1] > 3 }
	present := make(map[[4]float64]bool)
	for _, c := range g.allCandidates() {
		a, b := g.nodes[c.a], g.nodes[c.b]
		present[[4]float64{a[0], a[1], b[0], b[1]}] = true
		present[[4]float64{b[0], b[1], a[0], a[1]}] = true
		for s := 1; s < 400; s++ {
			tt := float64(s) / 400
			q := [2]float64{a[0] + tt*(b[0]-a[0]), a[1] + tt*(b[1]-a[1])}
			if inHole(q) || inNotch(q) {
				t.Errorf("candidate %v–%v passes through %v", a, b, q)
				break
			}
		}
	}
	for _, tc := range []struct {
		a, b [2]float64
		want bool
	}{
		{[2]float64{1, 2}, [2]float64{2, 1}, true},  // touches the hole's corner only
		{[2]float64{1, 1}, [2]float64{3, 2}, false}, // cuts the hole
		{[2]float64{1, 1}, [2]float64{2, 3}, false}, // cuts the hole
		{[2]float64{2, 4}, [2]float64{4, 3}, false}, // cuts the notch
		{[2]float64{3, 4}, [2]float64{4, 3}, false}, // cuts the notch corner
		{[2]float64{3, 3}, [2]float64{3, 4}, true},  // runs along the notch edge
		{[2]float64{2, 3}, [2]float64{4, 2}, true},  // passes below the notch
	} {
		if got := present[[4]float64{tc.a[0], tc.a[1], tc.b[0], tc.b[1]}]; got != tc.want {
			t.Errorf("member %v–%v present %v, want %v", tc.a, tc.b, got, tc.want)
		}
	}
}

// TestLayoutAroundHole solves a span whose best arch would pass through a
// hole: every member of the result must avoid the hole (brute-force
// sampling), and equilibrium and Maxwell's theorem must hold.
func TestLayoutAroundHole(t *testing.T) {
	p := threePoint(16)
	p.Domain.Holes = [][][2]float64{{{0.7, 0.3}, {1.3, 0.3}, {1.3, 0.8}, {0.7, 0.8}}}
	l, err := Optimise(context.Background(), p, Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, l)
	for _, m := range l.Members {
		a, b := l.Nodes[m.Ends[0]], l.Nodes[m.Ends[1]]
		for s := 1; s < 400; s++ {
			tt := float64(s) / 400
			x, y := a[0]+tt*(b[0]-a[0]), a[1]+tt*(b[1]-a[1])
			if x > 0.7 && x < 1.3 && y > 0.3 && y < 0.8 {
				t.Fatalf("member %v–%v crosses the hole at (%g, %g)", a, b, x, y)
			}
		}
	}
	// The hole can only cost material (common practice): compare with
	// the same grid without it.
	free, err := Optimise(context.Background(), threePoint(16), Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if l.Volume < free.Volume*(1-1e-9) {
		t.Errorf("volume with hole %g below volume without %g", l.Volume, free.Volume)
	}
}
