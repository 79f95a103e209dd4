package sweep

import "math"

// goldenSection is (3 − √5)/2, the fraction of an interval that golden-
// section search steps into its larger part.
var goldenSection = (3 - math.Sqrt(5)) / 2

// minimum1D is the outcome of a one-dimensional minimisation.
type minimum1D struct {
	x, fx       float64
	evaluations int
	converged   bool
}

// brent minimises f over [lo, hi] from the point x0, whose value f0 is
// known, by Brent's method: golden-section search, accelerated by a
// parabola through the three best points whenever that parabola's vertex
// lies well inside the bracket and the step is shrinking (R. P. Brent,
// Algorithms for Minimization without Derivatives, 1973, ch. 5). tol(x) is
// the absolute accuracy wanted near x; the search stops when the bracket
// around the best point is within about 2·tol of it, or after maxEval
// evaluations of f, or when f reports stop. f may return +Inf for a point
// it cannot evaluate; parabolic steps are then skipped until the three
// points are finite again.
//
// The loop is kept whole, as Brent wrote it: its eight state variables
// (bracket, three best points, last two steps) change together in every
// branch, and splitting it would pass them all around.
func brent(f func(x float64) (fx float64, stop bool), lo, hi, x0, f0 float64, tol func(x float64) float64, maxEval int) minimum1D {
	a, b := lo, hi
	x, w, v := x0, x0, x0
	fx, fw, fv := f0, f0, f0
	var d, e float64 // the last step and the one before it
	evals := 0
	for {
		m := (a + b) / 2
		tol1 := tol(x)
		tol2 := 2 * tol1
		if math.Abs(x-m) <= tol2-(b-a)/2 {
			return minimum1D{x: x, fx: fx, evaluations: evals, converged: true}
		}
		if evals >= maxEval {
			return minimum1D{x: x, fx: fx, evaluations: evals}
		}
		golden := true
		if math.Abs(e) > tol1 && !math.IsInf(fx, 0) && !math.IsInf(fw, 0) && !math.IsInf(fv, 0) {
			previous := e
			e = d
			if step, ok := parabolicStep(x, w, v, fx, fw, fv, a, b, previous); ok {
				d = step
				if u := x + d; u-a < tol2 || b-u < tol2 {
					d = tol1
					if x >= m {
						d = -tol1
					}
				}
				golden = false
			}
		}
		if golden {
			if x >= m {
				e = a - x
			} else {
				e = b - x
			}
			d = goldenSection * e
		}
		// Never evaluate closer than tol1 to x: the difference would be
		// lost in round-off.
		u := x + d
		if math.Abs(d) < tol1 {
			if d >= 0 {
				u = x + tol1
			} else {
				u = x - tol1
			}
		}
		u = math.Max(lo, math.Min(hi, u))
		fu, stop := f(u)
		evals++
		if stop {
			return minimum1D{x: x, fx: fx, evaluations: evals}
		}
		if fu <= fx {
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv = w, fw
			w, fw = x, fx
			x, fx = u, fu
			continue
		}
		if u < x {
			a = u
		} else {
			b = u
		}
		switch {
		case fu <= fw || w == x:
			v, fv = w, fw
			w, fw = u, fu
		case fu <= fv || v == x || v == w:
			v, fv = u, fu
		}
	}
}

// parabolicStep returns the step from x to the vertex of the parabola
// through (v, fv), (w, fw), (x, fx), and whether Brent's method accepts
// it: only if it stays inside the bracket [a, b] and is less than half
// the step before last (previous), which guarantees convergence at least
// as fast as bisection.
func parabolicStep(x, w, v, fx, fw, fv, a, b, previous float64) (float64, bool) {
	r := (x - w) * (fx - fv)
	q := (x - v) * (fx - fw)
	p := (x-v)*q - (x-w)*r
	q = 2 * (q - r)
	if q > 0 {
		p = -p
	} else {
		q = -q
	}
	if math.Abs(p) < math.Abs(q*previous/2) && p > q*(a-x) && p < q*(b-x) {
		return p / q, true
	}
	return 0, false
}
