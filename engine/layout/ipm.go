package layout

import (
	"context"
	"errors"
	"math"

	"gusset/engine/progress"
)

// lpResult is the solution of a linear program in standard form
// min cᵀx subject to A x = b, x ≥ 0, with its dual y, s (Aᵀy + s = c, s ≥ 0).
type lpResult struct {
	x, y, s    []float64
	objective  float64
	iterations int
	// primalResidual, dualResidual and gap are the relative measures at exit:
	// ‖Ax−b‖/(1+‖b‖), ‖Aᵀy+s−c‖/(1+‖c‖), |cᵀx−bᵀy|/(1+|cᵀx|).
	primalResidual, dualResidual, gap float64
}

// errNoConvergence reports that the interior-point iterations stopped
// without meeting the tolerances (an infeasible or unbounded program, or
// severe ill-conditioning).
var errNoConvergence = errors.New("layout: interior-point method did not converge")

// interiorPoint solves min cᵀx s.t. A x = b, x ≥ 0 by the primal–dual
// interior-point method with Mehrotra's predictor–corrector (Wright,
// Primal-Dual Interior-Point Methods, SIAM 1997, ch. 10 and 11), from
// Mehrotra's starting point. rowCoord (may be nil) orders the normal
// equations by nested dissection. tol is the relative tolerance on the
// primal and dual residuals and the duality gap. Progress is reported per
// iteration under the stage "interior point"; ctx is checked per iteration.
func interiorPoint(ctx context.Context, a *sparseColumns, b, c []float64, rowCoord []vec, tol float64, rep progress.Reporter) (*lpResult, error) {
	m, n := a.rows, a.cols
	if len(b) != m || len(c) != n {
		panic("layout: interiorPoint dimension mismatch")
	}
	rep = progress.Or(rep)
	// Scale b and c to unit size so the tolerances are relative and the
	// starting point is well placed; undone at the end.
	bScale, cScale := maxAbs(b), maxAbs(c)
	if bScale == 0 {
		bScale = 1
	}
	if cScale == 0 {
		cScale = 1
	}
	bs, cs := make([]float64, m), make([]float64, n)
	for i := range b {
		bs[i] = b[i] / bScale
	}
	for j := range c {
		cs[j] = c[j] / cScale
	}
	ne := newNormalEquations(a, rowCoord)

	x, s, y := make([]float64, n), make([]float64, n), make([]float64, m)
	d := make([]float64, n)
	work := make([]float64, m)
	colWork := make([]float64, n)

	// Mehrotra's starting point: least-norm x and least-squares y, shifted
	// into the positive orthant (Wright 1997, sec. 10.2).
	for j := range d {
		d[j] = 1
	}
	ne.factorize(d)
	copy(work, bs)
	ne.solve(work)
	a.mulTransVec(x, work)
	a.mulVec(work, cs)
	ne.solve(work)
	copy(y, work)
	a.mulTransVec(colWork, y)
	for j := range s {
		s[j] = cs[j] - colWork[j]
	}
	shift := func(v []float64) {
		lowest := math.Inf(1)
		for _, t := range v {
			lowest = min(lowest, t)
		}
		delta := max(-1.5*lowest, 0)
		for j := range v {
			v[j] += delta
		}
	}
	shift(x)
	shift(s)
	var xs, sumX, sumS float64
	for j := range x {
		xs += x[j] * s[j]
		sumX += x[j]
		sumS += s[j]
	}
	dx, ds := 0.5*xs/math.Max(sumS, 1e-300), 0.5*xs/math.Max(sumX, 1e-300)
	for j := range x {
		x[j] += dx
		s[j] += ds
		if !(x[j] > 0) {
			x[j] = 1
		}
		if !(s[j] > 0) {
			s[j] = 1
		}
	}

	rb, rc := make([]float64, m), make([]float64, n)
	dxAff, dsAff, dy := make([]float64, n), make([]float64, n), make([]float64, m)
	rxs := make([]float64, n)
	rhs, refine := make([]float64, m), make([]float64, m)
	// best keeps the iterate with the smallest worst measure, returned when
	// round-off stops progress before the tolerance is met.
	best := struct {
		x, y, s []float64
		worst   float64
		res     lpResult
	}{worst: math.Inf(1)}
	normB, normC := norm2(bs), norm2(cs)
	res := &lpResult{}
	const maxIterations = 200
	for iter := 0; ; iter++ {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		a.mulVec(rb, x)
		for i := range rb {
			rb[i] -= bs[i]
		}
		a.mulTransVec(rc, y)
		var primalObj, dualObj, mu float64
		for j := range rc {
			rc[j] += s[j] - cs[j]
			primalObj += cs[j] * x[j]
			mu += x[j] * s[j]
		}
		for i := range y {
			dualObj += bs[i] * y[i]
		}
		mu /= float64(n)
		res.primalResidual = norm2(rb) / (1 + normB)
		res.dualResidual = norm2(rc) / (1 + normC)
		res.gap = math.Abs(primalObj-dualObj) / (1 + math.Abs(primalObj))
		res.iterations = iter
		rep.Progress("interior point", iter, maxIterations, nil)
		if res.primalResidual < tol && res.dualResidual < tol && res.gap < tol {
			break
		}
		if worst := max(res.primalResidual, res.dualResidual, res.gap); worst < best.worst {
			best.worst = worst
			best.x = append(best.x[:0], x...)
			best.y = append(best.y[:0], y...)
			best.s = append(best.s[:0], s...)
			best.res = *res
		}
		if iter == maxIterations || math.IsNaN(mu) || maxAbs(x) > 1e14 || maxAbs(y) > 1e14 || max(res.primalResidual, res.dualResidual, res.gap) > 1e3*best.worst {
			if best.worst > looseTolerance {
				return nil, errNoConvergence
			}
			copy(x, best.x)
			copy(y, best.y)
			copy(s, best.s)
			*res = best.res
			break
		}
		for j := range d {
			d[j] = x[j] / s[j]
		}
		ne.factorize(d)

		// solveDirection solves A Δx = −r_b, AᵀΔy + Δs = −r_c,
		// S Δx + X Δs = rxs.
		solveDirection := func(dxOut, dsOut []float64) {
			for j := range colWork {
				colWork[j] = (rxs[j] + x[j]*rc[j]) / s[j]
			}
			a.mulVec(work, colWork)
			for i := range work {
				work[i] = -rb[i] - work[i]
			}
			copy(rhs, work)
			ne.solve(work)
			// One step of iterative refinement: near the optimum D spans
			// many orders of magnitude and the factor loses accuracy.
			a.mulTransVec(colWork, work)
			for j := range colWork {
				colWork[j] *= d[j]
			}
			a.mulVec(refine, colWork)
			for i := range refine {
				refine[i] = rhs[i] - refine[i]
			}
			ne.solve(refine)
			for i := range work {
				work[i] += refine[i]
			}
			copy(dy, work)
			a.mulTransVec(colWork, dy)
			for j := range dxOut {
				dsOut[j] = -rc[j] - colWork[j]
				dxOut[j] = (rxs[j] - x[j]*dsOut[j]) / s[j]
			}
		}
		for j := range rxs {
			rxs[j] = -x[j] * s[j]
		}
		solveDirection(dxAff, dsAff)
		alphaP, alphaD := min(1, stepToBoundary(x, dxAff)), min(1, stepToBoundary(s, dsAff))
		var muAff float64
		for j := range x {
			muAff += (x[j] + alphaP*dxAff[j]) * (s[j] + alphaD*dsAff[j])
		}
		muAff /= float64(n)
		sigma := math.Pow(muAff/mu, 3)
		for j := range rxs {
			rxs[j] = -x[j]*s[j] - dxAff[j]*dsAff[j] + sigma*mu
		}
		// The corrector direction overwrites the affine one.
		solveDirection(dxAff, dsAff)
		eta := max(0.9, 1-10*mu)
		alphaP = min(1, eta*stepToBoundary(x, dxAff))
		alphaD = min(1, eta*stepToBoundary(s, dsAff))
		for j := range x {
			x[j] += alphaP * dxAff[j]
			s[j] += alphaD * dsAff[j]
		}
		for i := range y {
			y[i] += alphaD * dy[i]
		}
	}
	res.x, res.y, res.s = x, y, s
	for j := range x {
		x[j] *= bScale
		s[j] *= cScale
		res.objective += c[j] * x[j]
	}
	for i := range y {
		y[i] *= cScale
	}
	return res, nil
}

// looseTolerance is the accuracy accepted when round-off stops the
// iterations short of the requested tolerance; the member forces are
// brought into equilibrium afterwards anyway.
const looseTolerance = 1e-6

// stepToBoundary returns the largest α (capped at a large value) with
// v + α·dv ≥ 0.
func stepToBoundary(v, dv []float64) float64 {
	alpha := math.Inf(1)
	for j, t := range dv {
		if t < 0 {
			alpha = min(alpha, -v[j]/t)
		}
	}
	return min(alpha, 1e30)
}

func maxAbs(v []float64) float64 {
	var m float64
	for _, t := range v {
		m = max(m, math.Abs(t))
	}
	return m
}

func norm2(v []float64) float64 {
	var sum float64
	for _, t := range v {
		sum += t * t
	}
	return math.Sqrt(sum)
}
