package sweep

import (
	"math"
	"sort"
)

// minimumND is the outcome of a multi-dimensional minimisation.
type minimumND struct {
	x           []float64
	fx          float64
	evaluations int
	converged   bool
}

// Coefficients of the simplex moves: reflection, expansion, contraction
// and shrinkage, the standard choice of Nelder and Mead (1965) as restated
// by J. C. Lagarias, J. A. Reeds, M. H. Wright and P. E. Wright,
// "Convergence properties of the Nelder–Mead simplex method in low
// dimensions", SIAM J. Optim. 9, 1998.
// epsilon is the float64 machine precision, 2⁻⁵².
const epsilon = 0x1p-52

const (
	nmReflect  = 1.0
	nmExpand   = 2.0
	nmContract = 0.5
	nmShrink   = 0.5
)

// This package keeps its own Nelder–Mead rather than gonum's
// optimize.NelderMead (issue 13 item 9), for two measured reasons. First,
// gonum.org/v1/gonum/optimize imports gonum/stat/distmv (for CMA-ES),
// which imports golang.org/x/tools/container/intsets: `go list -deps
// gonum.org/v1/gonum/optimize` here fails for the missing module, so using
// it would add a module outside gonum and the standard library to the
// engine's graph, which the layering rule forbids. Second, gonum's method
// stops by a Converger on function values, sees no bounds and never
// restarts, where a refinement must stop when the optimum's location is
// known to a tolerance along each axis, stay within the bounds (points
// projected onto them) and restart a collapsed simplex once.
//
// nelderMead minimises f within the box [lower, upper] from x0 (value f0
// known) with an initial simplex of x0 and x0 + step_i·e_i, each point
// projected onto the box, by the Nelder–Mead simplex method (Nelder & Mead,
// Computer Journal 7, 1965, in the form of Lagarias et al. 1998). It stops
// when every vertex lies within tol(i, x_i) of the best one along every
// axis i, after maxEval evaluations, or when f reports stop. A converged
// run is restarted once from its best point with the initial step sizes,
// a common guard against a simplex that has collapsed before reaching the
// minimum; the better of the two ends is returned.
func nelderMead(f func(x []float64) (float64, bool), x0 []float64, f0 float64, step, lower, upper []float64,
	tol func(i int, x float64) float64, maxEval int) minimumND {
	best := minimumND{x: append([]float64(nil), x0...), fx: f0}
	for attempt := 0; attempt < 2; attempt++ {
		run := nelderMeadOnce(f, best.x, best.fx, step, lower, upper, tol, maxEval-best.evaluations)
		run.evaluations += best.evaluations
		improved := run.fx < best.fx
		if improved || attempt == 0 {
			best.x, best.fx = run.x, run.fx
		}
		best.evaluations, best.converged = run.evaluations, run.converged
		if !run.converged || !improved {
			break
		}
	}
	return best
}

// vertex is a point of the simplex with its value.
type vertex struct {
	x []float64
	f float64
}

// simplexRun is the state of one Nelder–Mead run within a box.
type simplexRun struct {
	f            func(x []float64) (float64, bool)
	lower, upper []float64
	tol          func(i int, x float64) float64
	maxEval      int
	evals        int
	stopped      bool
	simplex      []vertex // n + 1 vertices, best first after sort
	centroid     []float64
}

func (r *simplexRun) eval(x []float64) float64 {
	fx, stop := r.f(x)
	r.evals++
	r.stopped = r.stopped || stop
	return fx
}

// exhausted reports that the run may evaluate no more.
func (r *simplexRun) exhausted() bool { return r.stopped || r.evals >= r.maxEval }

func (r *simplexRun) project(x []float64) {
	for i := range x {
		x[i] = math.Max(r.lower[i], math.Min(r.upper[i], x[i]))
	}
}

func (r *simplexRun) sort() {
	sort.SliceStable(r.simplex, func(a, b int) bool { return r.simplex[a].f < r.simplex[b].f })
}

// result returns the best vertex; converged only when the simplex was
// built.
func (r *simplexRun) result(converged bool) minimumND {
	r.sort()
	n := len(r.simplex) - 1
	best := r.simplex[0]
	return minimumND{x: best.x, fx: best.f, evaluations: r.evals, converged: converged && r.simplex[n].x != nil}
}

// converged reports that every vertex lies within the tolerance of the
// best along every axis, or that all have the same value to round-off:
// then no move can tell them apart (the function is flat at this scale,
// as near a minimum once |Δx| is below about sqrt(ε)·|x|).
func (r *simplexRun) converged() bool {
	best := r.simplex[0]
	small, flat := true, true
	for _, v := range r.simplex[1:] {
		for i := range v.x {
			if math.Abs(v.x[i]-best.x[i]) > r.tol(i, best.x[i]) {
				small = false
			}
		}
		if math.Abs(v.f-best.f) > 2*epsilon*math.Abs(best.f) {
			flat = false
		}
	}
	return small || flat
}

// along returns centroid + t·(centroid − worst), projected onto the box.
func (r *simplexRun) along(t float64) []float64 {
	n := len(r.centroid)
	x := make([]float64, n)
	for i := range x {
		x[i] = r.centroid[i] + t*(r.centroid[i]-r.simplex[n].x[i])
	}
	r.project(x)
	return x
}

// move makes one Nelder–Mead step on the sorted simplex: reflect the
// worst vertex through the centroid of the others, expand a reflection
// that beats the best, contract outside or inside when it does not beat
// the second worst, and shrink towards the best when that fails too.
func (r *simplexRun) move() {
	n := len(r.centroid)
	for i := range r.centroid {
		r.centroid[i] = 0
		for _, v := range r.simplex[:n] {
			r.centroid[i] += v.x[i]
		}
		r.centroid[i] /= float64(n)
	}
	xr := r.along(nmReflect)
	fr := r.eval(xr)
	switch {
	case fr < r.simplex[0].f:
		if r.exhausted() {
			r.simplex[n] = vertex{xr, fr}
			return
		}
		xe := r.along(nmReflect * nmExpand)
		if fe := r.eval(xe); fe < fr {
			r.simplex[n] = vertex{xe, fe}
		} else {
			r.simplex[n] = vertex{xr, fr}
		}
		return
	case fr < r.simplex[n-1].f:
		r.simplex[n] = vertex{xr, fr}
		return
	}
	t, limit := -nmContract, r.simplex[n].f
	if fr < r.simplex[n].f {
		t, limit = nmReflect*nmContract, fr
	}
	if r.exhausted() {
		return
	}
	xc := r.along(t)
	if fc := r.eval(xc); fc <= limit {
		r.simplex[n] = vertex{xc, fc}
		return
	}
	for k := 1; k <= n && !r.exhausted(); k++ {
		for i := range r.simplex[k].x {
			r.simplex[k].x[i] = r.simplex[0].x[i] + nmShrink*(r.simplex[k].x[i]-r.simplex[0].x[i])
		}
		r.simplex[k].f = r.eval(r.simplex[k].x)
	}
}

// nelderMeadOnce runs the simplex method from x0 (value f0) with the
// initial simplex of x0 and x0 + step_i·e_i (−step_i where that leaves the
// box), each point projected onto the box.
func nelderMeadOnce(f func(x []float64) (float64, bool), x0 []float64, f0 float64, step, lower, upper []float64,
	tol func(i int, x float64) float64, maxEval int) minimumND {
	n := len(x0)
	r := &simplexRun{f: f, lower: lower, upper: upper, tol: tol, maxEval: maxEval,
		simplex: make([]vertex, n+1), centroid: make([]float64, n)}
	r.simplex[0] = vertex{append([]float64(nil), x0...), f0}
	for i := 0; i < n && !r.exhausted(); i++ {
		x := append([]float64(nil), x0...)
		x[i] += step[i]
		if x[i] > upper[i] {
			x[i] = x0[i] - step[i]
		}
		r.project(x)
		r.simplex[i+1] = vertex{x, r.eval(x)}
	}
	if r.exhausted() {
		return r.result(false)
	}
	for {
		r.sort()
		if r.converged() {
			return r.result(true)
		}
		if r.exhausted() {
			return r.result(false)
		}
		r.move()
	}
}
