package stiffness

import (
	"context"
	"math"
	"testing"

	"gusset/engine/sparse"
)

// TestLoadsTwoBar solves the exported system of a symmetric two-bar
// truss with engine/sparse and checks the joint's deflection by hand: bars
// from (0,0) and (8,0) to (4,3), length 5, sin θ = 3/5, a load P down at the
// joint gives N = P/(2 sin θ) in each bar (statics of a two-force joint), a
// shortening N·L/(EA) and a vertical deflection N·L/(EA·sin θ) (the
// Williot construction of a symmetric joint; common practice).
func TestLoadsTwoBar(t *testing.T) {
	const e, a, p = 2.1e8, 0.002, 10.0
	b := newBuilder(2, e, 0, a, 0, 0, 0)
	left := b.node(0, 0)
	right := b.node(8, 0)
	joint := b.node(4, 3)
	b.bar(left, joint)
	b.bar(right, joint)
	b.fix(left, pinned2...)
	b.fix(right, pinned2...)
	b.force(joint, [3]float64{0, -p}, [3]float64{})
	mx, err := Assemble(context.Background(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	s := mx.K
	g, err := mx.Loads(b.m, b.m.Cases[0].ID)
	if err != nil {
		t.Fatal(err)
	}
	if s.N != 2 || len(g) != 2 {
		t.Fatalf("%d equations and %d loads, want 2 and 2", s.N, len(g))
	}
	for j := range s.N {
		if d := s.Val[s.Find(j, j)]; math.Abs(d-1) > 1e-15 {
			t.Errorf("diagonal %d = %g, want 1", j, d)
		}
	}
	c, err := sparse.Factorize(context.Background(), s, sparse.Options{})
	if err != nil {
		t.Fatal(err)
	}
	y := make([]float64, 2)
	c.Solve(y, g)
	// Unscale with the diagonal of K: for this joint K is diagonal,
	// Kxx = 2·EA·cos²θ/L and Kyy = 2·EA·sin²θ/L.
	const l, sin = 5.0, 0.6
	kyy := 2 * e * a * sin * sin / l
	v := y[1] / math.Sqrt(kyy)
	want := -(p / (2 * sin)) * l / (e * a * sin)
	near(t, "vertical deflection", v, want, 1e-12)
	near(t, "horizontal deflection", y[0], 0, 1e-15)
}

func TestLoadsUnknownCase(t *testing.T) {
	b := newBuilder(2, 2.1e8, 0, 0.002, 0, 0, 0)
	n0, n1 := b.node(0, 0), b.node(1, 0)
	b.bar(n0, n1)
	b.fix(n0, pinned2...)
	mx, err := Assemble(context.Background(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := mx.Loads(b.m, "no-such-case"); err == nil {
		t.Fatal("an unknown case was accepted")
	}
}
