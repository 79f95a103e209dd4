package stiffness

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// TestRealRootsBernsteinAgrees checks the Bernstein isolation against the
// polynomials' known roots on (0, h) and against derivativeRoots (the
// isolation by the roots of p′, which needs no rule of signs), on 5,000
// random polynomials of degree 3 to 8 built from known roots: roots 0.1
// or more apart, clustered pairs (1e-3 apart, each a crossing), double roots (a
// touch, no sign change: reported by neither) and complex pairs (a
// positive quadratic factor: no real root). Descartes' rule of signs in
// Bernstein form (Farouki & Rajan, Computer Aided Geometric Design 5,
// 1988, §4) is what makes the quick answers exact.
func TestRealRootsBernsteinAgrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 2))
	const h = 3.0
	for trial := range 5000 {
		degree := 3 + rng.IntN(6)
		var rs, crossing, touches, clustered []float64
		for len(rs) < degree {
			r := -0.5 + 4*rng.Float64()
			if hasNear(rs, r, 0.1) {
				continue // apart from the others but for the pairs below
			}
			switch k := rng.IntN(6); {
			case k == 0 && len(rs)+2 <= degree: // a double root: a touch
				rs = append(rs, r, r)
				touches = append(touches, r)
				continue
			case k == 1 && len(rs)+2 <= degree: // a cluster of two crossings
				rs = append(rs, r, r+1e-3)
				crossing = append(crossing, r, r+1e-3)
				clustered = append(clustered, r, r+1e-3)
				continue
			}
			rs = append(rs, r)
			crossing = append(crossing, r)
		}
		pair := 0.0
		if rng.IntN(4) == 0 {
			pair = 1 // a complex pair: times s² + 1, positive everywhere
		}
		c := fromRoots(0.5+rng.Float64(), rs, 0, pair)
		var want []float64
		for _, r := range crossing {
			if r > 1e-9 && r < h-1e-9 {
				want = append(want, r)
			}
		}
		slices.Sort(want)
		var fast, slow roots
		realRoots(&fast, c, 0, h)
		derivativeRoots(&slow, c, 0, h)
		got, ref := fast.list(), slow.list()
		if !slices.IsSorted(got) {
			t.Fatalf("trial %d: roots %v out of order", trial, got)
		}
		// Every crossing is found by both methods (a cluster's to 1e-4:
		// its places are ill-conditioned).
		for _, r := range want {
			tol := 1e-6
			if hasNear(clustered, r, 0) {
				tol = 1e-4
			}
			if !hasNear(got, r, tol) || !hasNear(ref, r, tol) {
				t.Fatalf("trial %d: roots %v by Bernstein, %v by the derivative miss %v (polynomial %v, roots %v)", trial, got, ref, r, c, rs)
			}
		}
		// Nothing else is found but, perhaps, at a touch: its value is
		// rounding noise, where either method may report two crossings a
		// hair apart. A touch's value is rounding noise, where either may report two
		// crossings a hair apart: harmless for an extreme search (one
		// more point to look at); a missed crossing is not.
		for _, pair := range [2][2][]float64{{got, ref}, {ref, got}} {
			for _, r := range pair[0] {
				if !hasNear(pair[1], r, 1e-4) && !hasNear(touches, r, 1e-4) {
					t.Fatalf("trial %d: root %v of %v not in %v (touches %v, polynomial %v)", trial, r, pair[0], pair[1], touches, c)
				}
			}
		}
	}
}

// hasNear reports whether some x of xs is within tol of v.
func hasNear(xs []float64, v, tol float64) bool {
	for _, x := range xs {
		if abs := x - v; abs <= tol && abs >= -tol {
			return true
		}
	}
	return false
}
