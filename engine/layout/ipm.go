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
	state                             *ipm // the solve's state, for refine
	// centred is the first iterate whose measures were all below
	// centredTolerance, in the caller's scale: a point still well inside
	// the positive orthant, from which a program with more columns can be
	// started (warmStart).
	centred *warmPoint
}

// warmPoint is a starting point for interiorPoint in the caller's scale.
// A column whose x is NaN is new: it is given the dual slack
// max(c_j − a_jᵀy, √μ) and x_j = μ/s_j, μ the point's mean x_j s_j
// over the other columns (Gondzio, "Warm start of the primal-dual method
// applied in the cutting-plane scheme", Mathematical Programming 83, 1998,
// stores such a point for the same purpose; the choice for new columns
// here is ours).
type warmPoint struct {
	x, y, s []float64
}

// centredTolerance is the measure below which an iterate is kept as a
// warm start for the next program: looser than the intermediate programs'
// tolerance, so that the point is still well inside the orthant. Measured
// (interior-point iterations of the last program of the 12 × 6 × 6 and
// 16 × 8 × 8 BenchmarkSpaceBridge): 1e-3 3 and 8, 1e-2 12 and 11 (the
// point is too far from the optimum), 3e-4 about as 1e-3 but more rounds.
const centredTolerance = 1e-3

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
// The result's refine continues the same program to a tighter tolerance
// from where it stopped.
func interiorPoint(ctx context.Context, a *sparseColumns, b, c []float64, rowCoord []vec, tol float64, warm *warmPoint, rep progress.Reporter) (*lpResult, error) {
	if len(b) != a.rows || len(c) != a.cols {
		panic("layout: interiorPoint dimension mismatch")
	}
	it := newIPM(a, b, c, rowCoord, rep)
	if warm != nil {
		it.warmStart(warm)
	} else {
		it.startPoint()
	}
	return it.solve(ctx, tol)
}

// warmStart sets the iterate from w (see warmPoint).
func (it *ipm) warmStart(w *warmPoint) {
	if len(w.x) != len(it.x) || len(w.s) != len(it.s) || len(w.y) != len(it.y) {
		panic("layout: warm start dimension mismatch")
	}
	for i := range it.y {
		it.y[i] = w.y[i] / it.cScale
	}
	var mu float64
	old := 0
	for j := range it.x {
		if !math.IsNaN(w.x[j]) {
			it.x[j], it.s[j] = w.x[j]/it.bScale, w.s[j]/it.cScale
			mu += it.x[j] * it.s[j]
			old++
		}
	}
	mu /= float64(max(old, 1))
	if !(mu > 0) {
		mu = 1
	}
	it.a.mulTransVec(it.colWork, it.y)
	for j := range it.x {
		if math.IsNaN(w.x[j]) {
			it.s[j] = max(it.cs[j]-it.colWork[j], math.Sqrt(mu))
			it.x[j] = mu / it.s[j]
		}
		if !(it.x[j] > 0) || !(it.s[j] > 0) {
			it.x[j], it.s[j] = max(it.x[j], mu), max(it.s[j], mu)
		}
	}
}

// ipm is the state of one interior-point solve, in the scaled program.
type ipm struct {
	a              *sparseColumns
	b, c           []float64 // the caller's data
	bs, cs         []float64 // scaled to unit size
	bScale, cScale float64
	normB, normC   float64
	ne             *normalEquations
	rep            progress.Reporter
	x, y, s        []float64
	// work vectors of the iteration
	d, colWork, rc, dxAff, dsAff, rxs []float64 // one per column
	rb, work, dy, rhs, refine         []float64 // one per row
	mu                                float64
	res                               lpResult
	centred                           *warmPoint // see lpResult.centred
	// best keeps the iterate with the smallest worst measure, returned
	// when round-off stops progress before the tolerance is met.
	best struct {
		x, y, s []float64
		worst   float64
		res     lpResult
	}
}

// newIPM scales b and c to unit size, so the tolerances are relative and
// the starting point is well placed (undone in the result), and analyses
// the normal equations.
func newIPM(a *sparseColumns, b, c []float64, rowCoord []vec, rep progress.Reporter) *ipm {
	m, n := a.rows, a.cols
	it := &ipm{a: a, b: b, c: c, rep: progress.Or(rep), bScale: maxAbs(b), cScale: maxAbs(c)}
	if it.bScale == 0 {
		it.bScale = 1
	}
	if it.cScale == 0 {
		it.cScale = 1
	}
	it.bs, it.cs = make([]float64, m), make([]float64, n)
	for i := range b {
		it.bs[i] = b[i] / it.bScale
	}
	for j := range c {
		it.cs[j] = c[j] / it.cScale
	}
	it.normB, it.normC = norm2(it.bs), norm2(it.cs)
	it.ne = newNormalEquations(a, rowCoord)
	for _, v := range []*[]float64{&it.x, &it.s, &it.d, &it.colWork, &it.rc, &it.dxAff, &it.dsAff, &it.rxs} {
		*v = make([]float64, n)
	}
	for _, v := range []*[]float64{&it.y, &it.rb, &it.work, &it.dy, &it.rhs, &it.refine} {
		*v = make([]float64, m)
	}
	it.best.worst = math.Inf(1)
	return it
}

// startPoint sets Mehrotra's starting point: least-norm x and
// least-squares y, shifted into the positive orthant (Wright 1997, sec.
// 10.2).
func (it *ipm) startPoint() {
	a, x, y, s := it.a, it.x, it.y, it.s
	for j := range it.d {
		it.d[j] = 1
	}
	it.ne.factorize(it.d)
	copy(it.work, it.bs)
	it.ne.solve(it.work)
	a.mulTransVec(x, it.work)
	a.mulVec(it.work, it.cs)
	it.ne.solve(it.work)
	copy(y, it.work)
	a.mulTransVec(it.colWork, y)
	for j := range s {
		s[j] = it.cs[j] - it.colWork[j]
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
}

// maxIterations caps the interior-point iterations of one solve.
const maxIterations = 200

// solve iterates from the current point until the tolerance is met, or
// round-off stops progress with the best iterate within looseTolerance.
// On errNoConvergence the result holds only the iterations spent.
func (it *ipm) solve(ctx context.Context, tol float64) (*lpResult, error) {
	for iter := it.res.iterations; ; iter++ {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		it.measure(iter)
		res := &it.res
		worst := max(res.primalResidual, res.dualResidual, res.gap)
		if it.centred == nil && worst < centredTolerance {
			it.centred = it.point()
		}
		if res.primalResidual < tol && res.dualResidual < tol && res.gap < tol {
			break
		}
		if worst < it.best.worst {
			it.best.worst = worst
			it.best.x = append(it.best.x[:0], it.x...)
			it.best.y = append(it.best.y[:0], it.y...)
			it.best.s = append(it.best.s[:0], it.s...)
			it.best.res = *res
		}
		if iter >= maxIterations || math.IsNaN(it.mu) || maxAbs(it.x) > 1e14 || maxAbs(it.y) > 1e14 || worst > 1e3*it.best.worst {
			if it.best.worst > looseTolerance {
				// The result carries only the iterations spent.
				return &lpResult{iterations: iter}, errNoConvergence
			}
			copy(it.x, it.best.x)
			copy(it.y, it.best.y)
			copy(it.s, it.best.s)
			it.res = it.best.res
			break
		}
		it.step()
	}
	return it.result(), nil
}

// measure computes the residuals r_b = Ax − b, r_c = Aᵀy + s − c, the
// duality measure μ and the relative measures of the iterate.
func (it *ipm) measure(iter int) {
	it.a.mulVec(it.rb, it.x)
	for i := range it.rb {
		it.rb[i] -= it.bs[i]
	}
	it.a.mulTransVec(it.rc, it.y)
	var primalObj, dualObj, mu float64
	for j := range it.rc {
		it.rc[j] += it.s[j] - it.cs[j]
		primalObj += it.cs[j] * it.x[j]
		mu += it.x[j] * it.s[j]
	}
	for i := range it.y {
		dualObj += it.bs[i] * it.y[i]
	}
	it.mu = mu / float64(len(it.x))
	res := &it.res
	res.primalResidual = norm2(it.rb) / (1 + it.normB)
	res.dualResidual = norm2(it.rc) / (1 + it.normC)
	res.gap = math.Abs(primalObj-dualObj) / (1 + math.Abs(primalObj))
	res.iterations = iter
	it.rep.Progress("interior point", iter, maxIterations, nil)
}

// step factorises the normal equations at the current point and takes
// Mehrotra's predictor and corrector steps.
func (it *ipm) step() {
	x, s := it.x, it.s
	for j := range it.d {
		it.d[j] = x[j] / s[j]
	}
	it.ne.factorize(it.d)
	for j := range it.rxs {
		it.rxs[j] = -x[j] * s[j]
	}
	it.direction(it.dxAff, it.dsAff)
	alphaP, alphaD := min(1, stepToBoundary(x, it.dxAff)), min(1, stepToBoundary(s, it.dsAff))
	var muAff float64
	for j := range x {
		muAff += (x[j] + alphaP*it.dxAff[j]) * (s[j] + alphaD*it.dsAff[j])
	}
	muAff /= float64(len(x))
	sigma := math.Pow(muAff/it.mu, 3)
	for j := range it.rxs {
		it.rxs[j] = -x[j]*s[j] - it.dxAff[j]*it.dsAff[j] + sigma*it.mu
	}
	// The corrector direction overwrites the affine one.
	it.direction(it.dxAff, it.dsAff)
	eta := max(0.9, 1-10*it.mu)
	alphaP = min(1, eta*stepToBoundary(x, it.dxAff))
	alphaD = min(1, eta*stepToBoundary(s, it.dsAff))
	for j := range x {
		x[j] += alphaP * it.dxAff[j]
		s[j] += alphaD * it.dsAff[j]
	}
	for i := range it.y {
		it.y[i] += alphaD * it.dy[i]
	}
}

// direction solves A Δx = −r_b, AᵀΔy + Δs = −r_c, S Δx + X Δs = rxs through
// the normal equations, with one step of iterative refinement: near the
// optimum D spans many orders of magnitude and the factor loses accuracy.
func (it *ipm) direction(dxOut, dsOut []float64) {
	a, x, s, d := it.a, it.x, it.s, it.d
	for j := range it.colWork {
		it.colWork[j] = (it.rxs[j] + x[j]*it.rc[j]) / s[j]
	}
	a.mulVec(it.work, it.colWork)
	for i := range it.work {
		it.work[i] = -it.rb[i] - it.work[i]
	}
	copy(it.rhs, it.work)
	it.ne.solve(it.work)
	a.mulTransVec(it.colWork, it.work)
	for j := range it.colWork {
		it.colWork[j] *= d[j]
	}
	a.mulVec(it.refine, it.colWork)
	for i := range it.refine {
		it.refine[i] = it.rhs[i] - it.refine[i]
	}
	it.ne.solve(it.refine)
	for i := range it.work {
		it.work[i] += it.refine[i]
	}
	copy(it.dy, it.work)
	a.mulTransVec(it.colWork, it.dy)
	for j := range dxOut {
		dsOut[j] = -it.rc[j] - it.colWork[j]
		dxOut[j] = (it.rxs[j] - x[j]*dsOut[j]) / s[j]
	}
}

// result returns the solution in the caller's scale; the iterate stays, so
// that refine can continue from it.
func (it *ipm) result() *lpResult {
	res := it.res
	res.x, res.y, res.s = make([]float64, len(it.x)), make([]float64, len(it.y)), make([]float64, len(it.s))
	res.objective = 0
	for j := range it.x {
		res.x[j] = it.x[j] * it.bScale
		res.s[j] = it.s[j] * it.cScale
		res.objective += it.c[j] * res.x[j]
	}
	for i := range it.y {
		res.y[i] = it.y[i] * it.cScale
	}
	res.state = it
	res.centred = it.centred
	return &res
}

// point returns the iterate in the caller's scale.
func (it *ipm) point() *warmPoint {
	w := &warmPoint{x: make([]float64, len(it.x)), y: make([]float64, len(it.y)), s: make([]float64, len(it.s))}
	for j := range it.x {
		w.x[j], w.s[j] = it.x[j]*it.bScale, it.s[j]*it.cScale
	}
	for i := range it.y {
		w.y[i] = it.y[i] * it.cScale
	}
	return w
}

// refine continues the solve that gave r to the tighter tolerance tol;
// the iterations add up in the result.
func (r *lpResult) refine(ctx context.Context, tol float64) (*lpResult, error) {
	return r.state.solve(ctx, tol)
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
