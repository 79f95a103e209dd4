package stiffness

import (
	"math"
	"math/rand/v2"
	"testing"
)

// fromRoots returns the coefficients (increasing powers) of
// k·Π(s − ρᵢ)·(s² + b·s + c) over the roots ρ (the quadratic factor is left
// out when b and c are both 0).
func fromRoots(k float64, rho []float64, b, c float64) []float64 {
	p := []float64{k}
	mul := func(f []float64) {
		next := make([]float64, len(p)+len(f)-1)
		for i, pi := range p {
			for j, fj := range f {
				next[i+j] += pi * fj
			}
		}
		p = next
	}
	for _, r := range rho {
		mul([]float64{-r, 1})
	}
	if b != 0 || c != 0 {
		mul([]float64{c, b, 1})
	}
	return p
}

// TestClearOfRoots checks the exclusion test of realRoots against
// polynomials built from known roots (the factor theorem): a polynomial
// with a root of odd multiplicity inside the interval, or an even one (a
// touch), is never declared clear of roots; one whose real roots all lie
// outside, times a quadratic with none (b² < 4c), is declared clear often
// enough for the test to matter; and without a touch the roots realRoots
// reports are the known crossings, to 1e-6 of the interval (roots a
// few hundredths apart in degree 10 are that ill-conditioned).
func TestClearOfRoots(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 2))
	const lo, hi = 0.0, 3.0
	cleared, outsideOnly := 0, 0
	for trial := range 4000 {
		degree := 3 + trial%8 // 3 … 10 with the quadratic factor (and the touch)
		var rho []float64
		inside := 0
		touch := trial%7 == 0
		simple := degree - 2
		if touch {
			simple = max(0, simple-2)
		}
		for range simple {
			r := lo - 2 + (hi-lo+4)*rng.Float64()
			if r > lo-1e-3 && r < hi+1e-3 && (r < lo+1e-3 || r > hi-1e-3) {
				r += 0.01 // keep roots clear of the interval's ends
			}
			rho = append(rho, r)
			if r > lo && r < hi {
				inside++
			}
		}
		if touch {
			r := lo + (hi-lo)*rng.Float64()
			rho = append(rho, r, r) // a double root: a zero without a crossing
		}
		b := 2 * (rng.Float64() - 0.5)
		c := b*b/4 + 0.05 + rng.Float64() // no real roots
		scale := math.Pow(10, 6*(rng.Float64()-0.5))
		p := fromRoots(scale, rho, b, c)
		clear := clearOfRoots(p, lo, hi)
		if clear && (inside > 0 || touch) {
			t.Fatalf("trial %d: roots %v (%d inside [%g, %g], touch %v) declared clear", trial, rho, inside, lo, hi, touch)
		}
		if inside == 0 && !touch {
			outsideOnly++
			if clear {
				cleared++
			}
		}
		if touch {
			continue // round-off may split a double root into two crossings
		}
		// Crossings: the simple roots inside; realRoots must report each
		// and nothing else.
		var found roots
		realRoots(&found, p, lo, hi)
		want := 0
		for _, r := range rho[:simple] {
			if r > lo && r < hi {
				want++
				ok := false
				for _, g := range found.list() {
					ok = ok || math.Abs(g-r) < 1e-6*(hi-lo)
				}
				if !ok {
					t.Fatalf("trial %d: root %g not found among %v", trial, r, found.list())
				}
			}
		}
		if found.n != want {
			t.Fatalf("trial %d: %d roots found %v, want the %d crossings of %v", trial, found.n, found.list(), want, rho)
		}
	}
	if cleared < outsideOnly/4 {
		t.Errorf("only %d of %d polynomials without roots in the interval declared clear", cleared, outsideOnly)
	}
	t.Logf("%d of %d polynomials without roots inside declared clear", cleared, outsideOnly)
}
