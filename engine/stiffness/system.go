package stiffness

import (
	"context"
	"errors"
	"math"
	"runtime"
	"sync"
	"time"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
	"gusset/engine/progress"
	"gusset/engine/sparse"
)

// factor solves with a factorised matrix.
type factor interface {
	solve(dst, b []float64)
	nonzeros() int
	condition() float64
}

// system is the stiffness matrix of the unconstrained freedoms, scaled to
// unit diagonal (S = D^(-1/2)·K·D^(-1/2)) so that pivots and condition
// numbers do not depend on the mix of units of forces and moments.
type system struct {
	k      *sparse.Matrix // scaled, lower triangle
	scale  []float64      // D^(-1/2)
	settle []float64      // right-hand side of the prescribed displacements (unscaled)
	fac    factor
	zero   []int // equations with no stiffness at all
}

// assembleParallel is the member count from which assembly splits the work
// among the workers; below it goroutines cost more than they save.
const assembleParallel = 8192

// assemble builds the system and the settlement right-hand side. The
// pattern pat (its values zero) comes from the connectivity, and each
// element's block is added straight into the matrix values at positions
// found by arithmetic. With
// several workers, each owns a range of nodes (and so of columns and of
// settlement rows) and adds, in member order, every entry that falls in
// its range: each value receives the same additions in the same order as
// with one worker, so the matrix is bit-identical for any worker count.
func assemble(ctx context.Context, m *model.Model, nb *numbering, pat *pattern, workers int, rep progress.Reporter) (*system, error) {
	return assembleState(ctx, m, nb, pat, workers, rep, nil)
}

// assembleState is assemble with each member's stiffness changed as st
// says (see memberState.modify; nil changes nothing).
func assembleState(ctx context.Context, m *model.Model, nb *numbering, pat *pattern, workers int, rep progress.Reporter, st *memberState) (*system, error) {
	a := pat.k
	sys := &system{k: a, settle: make([]float64, nb.equations)}
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	if len(m.Members) < assembleParallel {
		workers = 1
	}
	// Split the nodes into ranges of about equal numbers of entries.
	nn := m.NodeCount()
	bounds := make([]int, workers+1)
	bounds[workers] = nn
	for w, n := 1, 0; w < workers; w++ {
		target := a.Nonzeros() * w / workers
		for n < nn && a.ColPtr[pat.eqStart[n]] < target {
			n++
		}
		bounds[w] = n
	}
	errs := make([]error, workers)
	crashes := make([]*panicValue, workers)
	var wg sync.WaitGroup
	for w := 1; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer func() {
				if r := recover(); r != nil {
					crashes[w] = &panicValue{r}
				}
			}()
			errs[w] = assembleRange(ctx, m, nb, pat, sys, bounds[w], bounds[w+1], nil, st)
		}()
	}
	errs[0] = assembleRange(ctx, m, nb, pat, sys, bounds[0], bounds[1], rep, st)
	wg.Wait()
	for _, c := range crashes {
		if c != nil {
			panic(c.v) // raised again in the caller, where the server recovers it
		}
	}
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	for eq, f := range nb.freedomOf {
		// Every equation has a diagonal entry, so a freedom with no
		// stiffness shows up as a zero pivot rather than a malformed
		// matrix.
		a.Val[a.ColPtr[eq]] += nb.spring[f]
	}
	sys.scale = make([]float64, a.N)
	for j := range a.N {
		d := a.Val[a.ColPtr[j]] // the diagonal comes first in each column
		if d > 0 && !math.IsInf(d, 0) {
			sys.scale[j] = 1 / math.Sqrt(d)
		} else {
			sys.scale[j] = 1
			sys.zero = append(sys.zero, j)
		}
	}
	for j := range a.N {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			a.Val[p] *= sys.scale[j] * sys.scale[a.RowIdx[p]]
		}
	}
	return sys, nil
}

// assembleRange adds, in member order, the element entries whose column
// belongs to a node in [lo, hi) and the settlement terms whose row does.
// rep, when not nil, receives the progress; st, when not nil, changes
// the members' stiffness.
func assembleRange(ctx context.Context, m *model.Model, nb *numbering, pat *pattern, sys *system, lo, hi int, rep progress.Reporter, st *memberState) error {
	val := sys.k.Val
	var el element
	var kg [144]float64
	var eqs, nodes [12]int
	total := len(m.Members)
	mine := func(n int) bool { return n >= lo && n < hi }
	for e, mem := range m.Members {
		if e%4096 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
			if rep != nil {
				rep.Progress("assembling", e, total, nil)
			}
		}
		na, nb2 := mem.Ends[0], mem.Ends[1]
		if !mine(na) && !mine(nb2) {
			continue
		}
		el.build(m, nb, e)
		el.globalStiffness(kg[:])
		st.modify(&el, e, kg[:])
		nb.turnElement(&el, kg[:])
		n := el.size
		for i := range n {
			eqs[i] = nb.equation[el.dofs[i]]
			nodes[i] = mem.Ends[i/el.perNode]
		}
		k := -1
		if na != nb2 {
			k = pat.neighbour(min(na, nb2), max(na, nb2))
		}
		for i := range n {
			ei := eqs[i]
			if ei < 0 {
				continue
			}
			rowMine := mine(nodes[i])
			for j := range n {
				ej := eqs[j]
				if ej < 0 {
					if v := nb.prescribed[el.dofs[j]]; v != 0 && rowMine {
						sys.settle[ei] -= kg[i*n+j] * v
					}
					continue
				}
				if ej > ei || !mine(nodes[j]) {
					continue
				}
				val[pat.position(ei, ej, nodes[j], nodes[i], k)] += kg[i*n+j]
			}
		}
	}
	if rep != nil {
		rep.Progress("assembling", total, total, nil)
	}
	return nil
}

// dense returns the scaled matrix as a dense symmetric matrix.
func (sys *system) dense() *mat.SymDense {
	a := sys.k
	s := mat.NewSymDense(a.N, nil)
	for j := range a.N {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			s.SetSym(a.RowIdx[p], j, a.Val[p])
		}
	}
	return s
}

// errDeficient carries the equations whose pivots vanished.
type errDeficient struct{ equations []int }

func (e *errDeficient) Error() string { return "stiffness: deficient pivots" }

// factorise factorises the scaled matrix on the chosen path, returning an
// *errDeficient for a mechanism, and the ordering and factor times. On the
// sparse path, an, when not nil, provides the symbolic analysis of the
// matrix's structure (and storage) to reuse.
func (sys *system) factorise(ctx context.Context, path Path, opt Options, an *Analysis, rep progress.Reporter) (order, fact time.Duration, err error) {
	if len(sys.zero) > 0 {
		return 0, 0, &errDeficient{sys.zero}
	}
	if sys.k.N == 0 {
		sys.fac = denseFactor{}
		return 0, 0, nil
	}
	if path == Dense {
		start := time.Now()
		rep.Progress("factorising", 0, 1, nil)
		f, deficient := newDenseFactor(sys.dense(), opt.PivotTolerance)
		if deficient != nil {
			return 0, time.Since(start), &errDeficient{deficient}
		}
		rep.Progress("factorising", 1, 1, nil)
		sys.fac = f
		return 0, time.Since(start), nil
	}
	sopt := sparse.Options{Workers: opt.Workers, Reporter: rep, PivotTolerance: opt.PivotTolerance}
	var c *sparse.Cholesky
	if an != nil {
		c, err = an.factorize(ctx, sys.k, sopt)
	} else {
		c, err = sparse.Factorize(ctx, sys.k, sopt)
	}
	var pe *sparse.PivotError
	if errors.As(err, &pe) {
		return 0, 0, &errDeficient{pe.Columns}
	}
	if err != nil {
		return 0, 0, err
	}
	st := c.Stats()
	sys.fac = sparseFactor{c}
	return st.Ordering + st.Symbolic, st.Numeric, nil
}

// solve writes K⁻¹·f into u (unscaled, equations only), with iterative
// refinement on the scaled system while the residual stays above round-off
// level.
func (sys *system) solve(u, f []float64) {
	n := len(f)
	g := make([]float64, n)
	for i := range g {
		g[i] = f[i] * sys.scale[i]
	}
	y := make([]float64, n)
	sys.fac.solve(y, g)
	r := make([]float64, n)
	sy := make([]float64, n)
	normG := infNorm(g)
	const target = 64 * 0x1p-52
	residual := func() float64 {
		sys.k.MulVec(sy, y)
		for i := range r {
			r[i] = g[i] - sy[i]
		}
		den := normG + infNorm(y)
		if den == 0 {
			return 0
		}
		return infNorm(r) / den
	}
	rel := residual()
	d := make([]float64, n)
	for step := 0; step < 3 && rel > target; step++ {
		sys.fac.solve(d, r)
		prev := append([]float64(nil), y...)
		for i := range y {
			y[i] += d[i]
		}
		next := residual()
		if !(next < rel) {
			copy(y, prev)
			break
		}
		rel = next
	}
	for i := range u {
		u[i] = y[i] * sys.scale[i]
	}
}

func infNorm(x []float64) float64 {
	var m float64
	for _, v := range x {
		m = max(m, math.Abs(v))
	}
	return m
}

type sparseFactor struct{ c *sparse.Cholesky }

func (s sparseFactor) solve(dst, b []float64) { s.c.Solve(dst, b) }
func (s sparseFactor) nonzeros() int          { return s.c.Stats().NonzerosL }
func (s sparseFactor) condition() float64     { return s.c.ConditionEstimate() }

// denseFactor is gonum's dense Cholesky factorisation.
type denseFactor struct{ c *mat.Cholesky }

func (d denseFactor) solve(dst, b []float64) {
	if d.c == nil {
		return
	}
	var x mat.VecDense
	// The factorisation succeeded, so SolveVecTo fails only on a
	// condition number beyond float64, already reported as a mechanism.
	_ = d.c.SolveVecTo(&x, mat.NewVecDense(len(b), append([]float64(nil), b...)))
	copy(dst, x.RawVector().Data)
}

func (d denseFactor) nonzeros() int {
	if d.c == nil {
		return 0
	}
	n := d.c.SymmetricDim()
	return n * (n + 1) / 2
}

func (d denseFactor) condition() float64 {
	if d.c == nil {
		return 1
	}
	return d.c.Cond()
}

// newDenseFactor factorises s by gonum's Cholesky. When that fails, or its
// condition estimate says the pivots have lost all accuracy, a plain
// left-looking LDLᵀ sweep with the same pivot test as the sparse path
// (pivot ≤ tol on the unit-diagonal matrix) finds the deficient columns.
func newDenseFactor(s *mat.SymDense, tol float64) (denseFactor, []int) {
	var c mat.Cholesky
	ok := c.Factorize(s)
	if ok && c.Cond()*tol < 1 {
		return denseFactor{&c}, nil
	}
	n := s.SymmetricDim()
	l := mat.NewDense(n, n, nil)
	d := make([]float64, n)
	var deficient []int
	for j := range n {
		pivot := s.At(j, j)
		for k := range j {
			pivot -= l.At(j, k) * l.At(j, k) * d[k]
		}
		if !(pivot > tol) {
			// Hold the freedom fixed and carry on, to find every
			// deficient column in one sweep.
			deficient = append(deficient, j)
			d[j] = 1
			l.Set(j, j, 1)
			continue
		}
		d[j] = pivot
		l.Set(j, j, 1)
		for i := j + 1; i < n; i++ {
			v := s.At(i, j)
			for k := range j {
				v -= l.At(i, k) * l.At(j, k) * d[k]
			}
			l.Set(i, j, v/pivot)
		}
	}
	if deficient == nil && ok {
		return denseFactor{&c}, nil
	}
	if deficient == nil {
		// gonum refused a matrix whose pivots all pass: report the
		// smallest pivot's column rather than loop.
		deficient = []int{argmin(d)}
	}
	return denseFactor{}, deficient
}

func argmin(x []float64) int {
	best := 0
	for i := range x {
		if x[i] < x[best] {
			best = i
		}
	}
	return best
}
