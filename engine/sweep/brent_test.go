package sweep

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestBrent checks Brent's minimiser on functions whose minima follow from
// calculus (f′ = 0, f″ > 0): (x − 2)² + 1 has its minimum 1 at 2;
// x⁴ − 3x³ + 2 has f′ = x²(4x − 9), so its minimum is at 9/4 with value
// 2 − 2187/256 (x = 0 is a flat inflection); cosh(x − 0.3) has minimum 1 at
// 0.3; x·ln x has minimum −1/e at 1/e; |x − 1.2| has minimum 0 at 1.2
// (no parabola fits, golden section must carry it); and x on [1, 3] has its
// minimum at the end 1. At a kink or an end the value is only as accurate
// as the location, so those get the location's tolerance.
func TestBrent(t *testing.T) {
	for _, tc := range []struct {
		name         string
		f            func(float64) float64
		lo, hi, x0   float64
		xMin, fMin   float64
		xTol, fTol   float64
		maxEvaluated int
	}{
		{"(x−2)²+1", func(x float64) float64 { return (x-2)*(x-2) + 1 }, 0, 5, 0.5, 2, 1, 1e-6, 1e-12, 12},
		{"x⁴−3x³+2", func(x float64) float64 { return x*x*x*x - 3*x*x*x + 2 }, 1, 4, 3, 2.25, 2 - 2187.0/256, 1e-6, 1e-12, 20},
		{"cosh(x−0.3)", func(x float64) float64 { return math.Cosh(x - 0.3) }, -2, 2, -1, 0.3, 1, 1e-6, 1e-12, 20},
		{"x ln x", func(x float64) float64 { return x * math.Log(x) }, 0.1, 1, 0.5, 1 / math.E, -1 / math.E, 1e-6, 1e-12, 20},
		{"|x−1.2|", func(x float64) float64 { return math.Abs(x - 1.2) }, 0, 2, 0.1, 1.2, 0, 1e-6, 1e-6, 60},
		{"x on [1,3]", func(x float64) float64 { return x }, 1, 3, 2, 1, 1, 1e-6, 1e-6, 60},
	} {
		const tau = 1e-7
		tol := func(x float64) float64 { return tau * (math.Abs(x) + 1e-3*(tc.hi-tc.lo)) }
		evals := 0
		r := brent(func(x float64) (float64, bool) {
			evals++
			if x < tc.lo || x > tc.hi {
				t.Errorf("%s: evaluated outside the bracket at %g", tc.name, x)
			}
			return tc.f(x), false
		}, tc.lo, tc.hi, tc.x0, tc.f(tc.x0), tol, 200)
		if !r.converged || !scalar.EqualWithinAbsOrRel(r.x, tc.xMin, tc.xTol, tc.xTol) ||
			!scalar.EqualWithinAbsOrRel(r.fx, tc.fMin, tc.fTol, tc.fTol) {
			t.Errorf("%s: x=%.10g f=%.12g converged=%v, want x=%g f=%g", tc.name, r.x, r.fx, r.converged, tc.xMin, tc.fMin)
		}
		if r.evaluations != evals || evals > tc.maxEvaluated {
			t.Errorf("%s: %d evaluations (reported %d), expected at most %d", tc.name, evals, r.evaluations, tc.maxEvaluated)
		}
	}
}

// TestBrentLimits checks that the evaluation cap and a stop request end
// the search with converged = false.
func TestBrentLimits(t *testing.T) {
	f := func(x float64) (float64, bool) { return math.Abs(x - 1.2), false }
	tol := func(float64) float64 { return 1e-12 }
	if r := brent(f, 0, 2, 0.1, 1.1, tol, 5); r.converged || r.evaluations != 5 {
		t.Errorf("cap: %+v", r)
	}
	calls := 0
	stop := func(x float64) (float64, bool) { calls++; return x, calls == 3 }
	if r := brent(stop, 0, 2, 1, 1, tol, 100); r.converged || r.evaluations != 3 {
		t.Errorf("stop: %+v", r)
	}
}
