package stiffness

import (
	"errors"
	"math"
	"sync/atomic"
	"time"

	"gusset/engine/progress"
	"gusset/engine/sparse"
)

// SecondOrder configures the second-order (P-Δ) analysis of Solve: each
// case is solved with K + K_G(N), the geometric stiffness of the axial
// forces N of the previous solve (first the pretension alone), until the
// largest change of a displacement between two solves is at most
// Tolerance times the largest displacement. The zero value is ready to
// use.
type SecondOrder struct {
	// Tolerance is the relative change of the displacements at which the
	// iteration stops; 0 means DefaultSecondOrderTolerance.
	Tolerance float64
	// MaxIterations bounds the solves per case; 0 means
	// DefaultMaxIterations.
	MaxIterations int
}

// Defaults of SecondOrder, and the bound on the solves of an active-set
// iteration without second order.
const (
	DefaultSecondOrderTolerance = 1e-6
	DefaultMaxIterations        = 50
)

// Iteration reports how one case of an iterated solve converged: a model
// with tension-only or compression-only members (cables among them), or a
// second-order analysis, solves each case on its own, since neither
// superposes.
type Iteration struct {
	// Iterations is the number of solves made (each one assembly and one
	// numeric factorisation).
	Iterations int
	// Factorisations counts the numeric factorisations, all on the one
	// symbolic analysis of the stiffness pattern (on the sparse path).
	Factorisations int
	// LowRankSolves counts the solves made on the last factorisation
	// updated by the switched members' rank-one terms (see lowRank)
	// instead of a new one: Iterations = Factorisations + LowRankSolves.
	LowRankSolves int
	// Slack lists (ascending member indices) the one-sided members out of
	// the structure at the end: tension-only members the loads would
	// compress, compression-only members they would stretch.
	Slack []int
	// SecondOrder is true for a P-Δ analysis; the fields below are set
	// only then.
	SecondOrder bool
	// Amplification is the largest nodal translation of the converged
	// solve over that of the first solve (first order, with the geometric
	// stiffness of the pretension alone); HasAmplification is false when
	// the first solve moved nothing.
	Amplification    float64
	HasAmplification bool
	// CriticalFactor bounds from above the elastic critical load factor
	// of the case's axial forces (the factor on them at which K + λ·K_G
	// turns singular), by Rayleigh's quotient uᵀK·u / (−uᵀK_G·u) of the
	// converged displacements: the true factor is at most this. It is 0
	// when the displacements do not engage the compression (no estimate).
	CriticalFactor float64
}

func (so *SecondOrder) withDefaults() *SecondOrder {
	if so == nil {
		return nil
	}
	out := *so
	if !(out.Tolerance > 0) {
		out.Tolerance = DefaultSecondOrderTolerance
	}
	if out.MaxIterations <= 0 {
		out.MaxIterations = DefaultMaxIterations
	}
	return &out
}

// iterated reports whether the run must solve each request on its own:
// one-sided members or a second-order analysis.
func (r *run) iterated() bool { return r.opt.SecondOrder != nil || r.m.NonLinear() }

// iteration is the state an iterated solve keeps across its requests:
// the pattern whose values each assembly refills, the one symbolic
// analysis, and the factor refactorised in place.
type iteration struct {
	r              *run
	so             *SecondOrder // nil for first order
	pat            *pattern
	sym            *sparse.Analysis
	chol           *sparse.Cholesky
	factorisations int
	lowRankSolves  int
	lr             lowRank // the last factorisation, for low-rank passes
	// condition receives the condition estimate of the last request's
	// final factorisation, started (on a second core when there is one)
	// before that request's recovery.
	condition chan estimate
}

// symbolicAnalyses counts the symbolic analyses made by iterated solves
// (for the tests: one per Solve, none with an Analysis).
var symbolicAnalyses atomic.Int64

// solveIterated solves every request on its own by iteration (see
// iteration.request), one after another, each starting with every member
// active so that a case's answer does not depend on the other cases
// requested.
func (r *run) solveIterated() (*Result, error) {
	it := &iteration{r: r, so: r.opt.SecondOrder.withDefaults()}
	if r.an != nil {
		it.pat = r.an.pattern()
	} else {
		it.pat = newPattern(r.m, r.nb)
	}
	r.path = r.opt.Path
	if r.path == Auto {
		r.path = Sparse
		if r.nb.equations <= r.opt.DenseLimit {
			r.path = Dense
		}
	}
	st := &r.res.Stats
	st.Path, st.Freedoms, st.Equations, st.NonzerosK = r.path, r.nb.total, r.nb.equations, it.pat.k.Nonzeros()
	if r.path == Sparse && r.nb.equations > 0 {
		if r.an != nil && r.an.sym != nil {
			it.sym = r.an.sym
		} else {
			start := time.Now()
			it.sym = sparse.Analyse(it.pat.k, sparse.Options{Workers: r.opt.Workers})
			symbolicAnalyses.Add(1)
			st.Order = time.Since(start)
		}
	}
	r.res.Cases = make([]CaseResult, len(r.requests))
	r.rep.Progress("iterating", 0, len(r.requests), nil)
	for i, rq := range r.requests {
		cr, err := it.request(rq, i == len(r.requests)-1)
		if err != nil {
			return nil, err
		}
		r.keep(i, cr)
		r.rep.Progress("iterating", i+1, len(r.requests), nil)
	}
	r.caseNotes()
	if r.sys == nil || it.condition == nil {
		// No request: nothing was factorised, nothing is estimated.
		return r.res, nil
	}
	st.NonzerosFactor = r.sys.fac.nonzeros()
	return r.finish(it.condition)
}

// factorise assembles K (changed by st) into the pattern and factorises
// it numerically, on the symbolic analysis made once. It returns the
// system, whose factor is valid until the next call, and an
// *errDeficient when a pivot vanishes or turns negative.
func (it *iteration) factorise(st *memberState) (*system, error) {
	r := it.r
	clear(it.pat.k.Val)
	start := time.Now()
	sys, err := assembleState(r.ctx, r.m, r.nb, it.pat, r.opt.Workers, progress.Or(nil), st)
	if err != nil {
		return nil, err
	}
	r.res.Stats.Assemble += time.Since(start)
	r.sys = sys
	if len(sys.zero) > 0 {
		return sys, &errDeficient{sys.zero}
	}
	if sys.k.N == 0 {
		sys.fac = denseFactor{}
		return sys, nil
	}
	start = time.Now()
	defer func() { r.res.Stats.Factor += time.Since(start) }()
	it.factorisations++
	if r.path == Dense {
		f, deficient := newDenseFactor(sys.dense(), r.opt.PivotTolerance)
		if deficient != nil {
			return sys, &errDeficient{deficient}
		}
		sys.fac = f
		return sys, nil
	}
	if it.chol == nil {
		it.chol, err = sparse.FactorizeWith(r.ctx, sys.k, it.sym, sparse.Options{Workers: r.opt.Workers, PivotTolerance: r.opt.PivotTolerance})
	} else {
		err = it.chol.Refactorize(r.ctx, sys.k)
	}
	var pe *sparse.PivotError
	if errors.As(err, &pe) {
		return sys, &errDeficient{pe.Columns}
	}
	if err != nil {
		return nil, err
	}
	sys.fac = sparseFactor{it.chol}
	return sys, nil
}

// pass solves K(st)·u = f (see solveState): by a low-rank update of the
// last factorisation when few one-sided members switched (see lowRank),
// otherwise by assembling and factorising K(st) afresh. It returns the
// displacements, the factorised system, and the error of factorise.
func (it *iteration) pass(st *memberState, loads []float64) ([]float64, *system, error) {
	if members, ok := it.lr.switched(it, st); ok {
		if len(members) == 0 {
			it.lowRankSolves++
			return it.solveState(it.lr.sys, loads, st), it.lr.sys, nil
		}
		nb := it.r.nb
		rhs := append([]float64(nil), loads...)
		pretensionLoads(it.r.m, nb, st, rhs)
		ueq := make([]float64, nb.equations)
		if it.lr.solve(it, st, members, rhs, ueq) {
			it.lowRankSolves++
			return it.full(ueq), it.lr.sys, nil
		}
	}
	sys, err := it.factorise(st)
	if err != nil {
		return nil, sys, err
	}
	it.lr.reset(sys, st)
	return it.solveState(sys, loads, st), sys, nil
}

// full returns the displacements of the equations ueq over every freedom,
// with the prescribed values.
func (it *iteration) full(ueq []float64) []float64 {
	nb := it.r.nb
	u := make([]float64, nb.total)
	for f := range u {
		if eq := nb.equation[f]; eq >= 0 {
			u[f] = ueq[eq]
		} else {
			u[f] = nb.prescribed[f]
		}
	}
	return u
}

// solveState solves K(st)·u = f for the load set's loads, the
// settlements and the active members' pretension, and returns u over
// every freedom (prescribed values included; an inclined support's node
// in its axes, as recoverCase takes it).
func (it *iteration) solveState(sys *system, loads []float64, st *memberState) []float64 {
	nb := it.r.nb
	rhs := make([]float64, nb.equations)
	for eq := range rhs {
		rhs[eq] = loads[eq] + sys.settle[eq]
	}
	pretensionLoads(it.r.m, nb, st, rhs)
	ueq := make([]float64, nb.equations)
	sys.solve(ueq, rhs)
	return it.full(ueq)
}

// peakTranslation returns the largest nodal translation magnitude of u
// (the same in any node's axes).
func (it *iteration) peakTranslation(u []float64) float64 {
	m, nb := it.r.m, it.r.nb
	var peak float64
	for n := range m.NodeCount() {
		var s float64
		for c := range m.Dim {
			s += sq(u[nb.first[n]+c])
		}
		peak = max(peak, math.Sqrt(s))
	}
	return peak
}
