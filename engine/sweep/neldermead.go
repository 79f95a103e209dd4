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

func nelderMeadOnce(f func(x []float64) (float64, bool), x0 []float64, f0 float64, step, lower, upper []float64,
	tol func(i int, x float64) float64, maxEval int) minimumND {
	n := len(x0)
	project := func(x []float64) {
		for i := range x {
			x[i] = math.Max(lower[i], math.Min(upper[i], x[i]))
		}
	}
	type vertex struct {
		x []float64
		f float64
	}
	evals := 0
	stopped := false
	eval := func(x []float64) float64 {
		fx, stop := f(x)
		evals++
		stopped = stopped || stop
		return fx
	}
	simplex := make([]vertex, n+1)
	simplex[0] = vertex{append([]float64(nil), x0...), f0}
	for i := 0; i < n && evals < maxEval && !stopped; i++ {
		x := append([]float64(nil), x0...)
		x[i] += step[i]
		if x[i] > upper[i] {
			x[i] = x0[i] - step[i]
		}
		project(x)
		simplex[i+1] = vertex{x, eval(x)}
	}
	result := func(converged bool) minimumND {
		sort.SliceStable(simplex, func(a, b int) bool { return simplex[a].f < simplex[b].f })
		if simplex[n].x == nil { // stopped before the simplex was built
			return minimumND{x: simplex[0].x, fx: simplex[0].f, evaluations: evals}
		}
		return minimumND{x: simplex[0].x, fx: simplex[0].f, evaluations: evals, converged: converged}
	}
	if stopped || evals >= maxEval {
		return result(false)
	}
	centroid := make([]float64, n)
	along := func(t float64) []float64 { // centroid + t·(centroid − worst)
		x := make([]float64, n)
		for i := range x {
			x[i] = centroid[i] + t*(centroid[i]-simplex[n].x[i])
		}
		project(x)
		return x
	}
	for {
		sort.SliceStable(simplex, func(a, b int) bool { return simplex[a].f < simplex[b].f })
		small := true
		for _, v := range simplex[1:] {
			for i := range v.x {
				if math.Abs(v.x[i]-simplex[0].x[i]) > tol(i, simplex[0].x[i]) {
					small = false
				}
			}
		}
		// When every vertex has the same value to round-off, no move can
		// tell them apart (the function is flat at this scale, as near a
		// minimum once |Δx| is below about sqrt(ε)·|x|), so stop there too.
		flat := true
		for _, v := range simplex[1:] {
			if math.Abs(v.f-simplex[0].f) > 2*epsilon*math.Abs(simplex[0].f) {
				flat = false
			}
		}
		if small || flat {
			return result(true)
		}
		if stopped || evals >= maxEval {
			return result(false)
		}
		for i := range centroid {
			centroid[i] = 0
			for _, v := range simplex[:n] {
				centroid[i] += v.x[i]
			}
			centroid[i] /= float64(n)
		}
		xr := along(nmReflect)
		fr := eval(xr)
		switch {
		case fr < simplex[0].f:
			if evals >= maxEval || stopped {
				simplex[n] = vertex{xr, fr}
				continue
			}
			xe := along(nmReflect * nmExpand)
			if fe := eval(xe); fe < fr {
				simplex[n] = vertex{xe, fe}
			} else {
				simplex[n] = vertex{xr, fr}
			}
			continue
		case fr < simplex[n-1].f:
			simplex[n] = vertex{xr, fr}
			continue
		}
		// Contract outside when the reflected point beats the worst,
		// inside otherwise; shrink towards the best if that fails too.
		t, limit := -nmContract, simplex[n].f
		if fr < simplex[n].f {
			t, limit = nmReflect*nmContract, fr
		}
		if evals >= maxEval || stopped {
			continue
		}
		xc := along(t)
		if fc := eval(xc); fc <= limit {
			simplex[n] = vertex{xc, fc}
			continue
		}
		for k := 1; k <= n && evals < maxEval && !stopped; k++ {
			for i := range simplex[k].x {
				simplex[k].x[i] = simplex[0].x[i] + nmShrink*(simplex[k].x[i]-simplex[0].x[i])
			}
			simplex[k].f = eval(simplex[k].x)
		}
	}
}
