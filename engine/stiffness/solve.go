package stiffness

import (
	"context"
	"errors"
	"fmt"
	"runtime"
	"sync"
	"time"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/progress"
	"gusset/engine/statics"
)

// request is one case or combination to report.
type request struct {
	id          string
	combination bool
	terms       []model.Term
}

// Solve analyses m for the requested load cases and combinations. It
// returns a *fault.Error of kind UnknownCase for an id in opt.Cases that
// names neither a case nor a combination, InvalidModel for data the
// analysis cannot use (a moment at a node without rotational freedom,
// non-positive stiffness, a 3D beam's orientation along its axis, a point
// load off its member), Unstable for a mechanism (its Detail is a
// *Mechanism) or a part that no support holds, and ctx.Err() when ctx is
// cancelled. Warnings report ill-conditioning, member stiffness ratios of
// 1e12 and more, and disconnected parts.
func Solve(ctx context.Context, m *model.Model, opt Options) (*Result, error) {
	return solve(ctx, m, opt.withDefaults(), nil)
}

// withDefaults replaces the zero values of opt by the defaults.
func (opt Options) withDefaults() Options {
	if opt.DenseLimit <= 0 {
		opt.DenseLimit = DefaultDenseLimit
	}
	if opt.StabilityLimit == 0 {
		opt.StabilityLimit = DefaultStabilityLimit
	}
	if opt.PivotTolerance <= 0 {
		opt.PivotTolerance = DefaultPivotTolerance
	}
	return opt
}

// solve is Solve with opt's defaults filled in and, when an is not nil,
// the numbering's structure, the pattern of K and its symbolic
// factorisation taken from an (m must then have an's topology). Its phases
// are the methods of run: check the model, count its stability, assemble,
// factorise (or explain a mechanism), solve the cases, recover the
// results, finish with the condition estimate and warnings.
func solve(ctx context.Context, m *model.Model, opt Options, an *Analysis) (*Result, error) {
	r := &run{ctx: ctx, m: m, opt: opt, an: an, rep: progress.Or(opt.Reporter), res: &Result{}}
	if err := r.check(); err != nil {
		return nil, err
	}
	if err := r.countStability(); err != nil {
		return nil, err
	}
	if r.iterated() {
		return r.solveIterated()
	}
	if err := r.assemble(); err != nil {
		return nil, err
	}
	err := r.factorise()
	var deficient *errDeficient
	if errors.As(err, &deficient) {
		return r.deficient(deficient)
	}
	if err != nil {
		return nil, err
	}
	r.markStable()
	condition := r.startCondition()
	start := time.Now()
	solutions, err := solveCases(ctx, m, r.nb, r.sys, r.requests, opt.Workers, r.rep)
	if err != nil {
		return nil, err
	}
	r.res.Stats.Solve = time.Since(start)
	r.releaseSystem(condition)
	if err := r.recoverAll(solutions); err != nil {
		return nil, err
	}
	return r.finish(condition)
}

// run is one solve in progress: its inputs and what the phases have built.
type run struct {
	ctx       context.Context
	m         *model.Model
	opt       Options
	an        *Analysis
	rep       progress.Reporter
	res       *Result
	requests  []request
	nb        *numbering
	stability *statics.Report
	svd       bool // the model has springs: the stability report needs the SVD
	sys       *system
	path      Path
	fold      *caseFold // see keep; nil until a case is folded
	foldOnce  sync.Once
}

// check resolves the requested cases, numbers the freedoms, validates the
// model and warns of disconnected parts and extreme stiffness ratios.
func (r *run) check() error {
	var err error
	if r.requests, err = requested(r.m, r.opt.Cases); err != nil {
		return err
	}
	if r.an != nil {
		r.nb = r.an.numbering(r.m)
	} else {
		r.nb = newNumbering(r.m)
	}
	if err := validate(r.m, r.nb); err != nil {
		return err
	}
	warning, err := checkParts(r.m, r.nb)
	if err != nil {
		return err
	}
	if warning != "" {
		r.res.Warnings = append(r.res.Warnings, warning)
	}
	r.res.Warnings = append(r.res.Warnings, stiffnessRatio(r.m)...)
	return nil
}

// countStability makes the stability report. The counts come first without
// the rank: when K factorises and no spring stiffens it, the equilibrium
// matrix has full row rank and the SVD (cubic in the model's size) is
// needed only for a mechanism or a model with springs.
func (r *run) countStability() error {
	start := time.Now()
	r.svd = hasSprings(r.m)
	limit := -1
	if r.svd {
		limit = r.opt.StabilityLimit
	}
	r.stability = r.an.stabilityCounts()
	if r.svd || r.stability == nil {
		var err error
		if r.stability, err = statics.Analyse(r.ctx, r.m, statics.Options{DenseLimit: limit}); err != nil {
			return err
		}
	}
	r.res.Stability = r.stability
	r.res.Stats.Stability = time.Since(start)
	return nil
}

// fullStability replaces the counts by the full SVD report within the
// limit.
func (r *run) fullStability() error {
	if r.svd || r.opt.StabilityLimit < 0 {
		return nil
	}
	start := time.Now()
	full, err := statics.Analyse(r.ctx, r.m, statics.Options{DenseLimit: r.opt.StabilityLimit})
	if err != nil {
		return err
	}
	r.stability, r.res.Stability = full, full
	r.res.Stats.Stability += time.Since(start)
	return nil
}

// assemble builds K (pattern from an when given) and chooses the solver.
func (r *run) assemble() error {
	start := time.Now()
	var pat *pattern
	if r.an != nil {
		pat = r.an.pattern()
	} else {
		pat = newPattern(r.m, r.nb)
	}
	var err error
	if r.sys, err = assemble(r.ctx, r.m, r.nb, pat, r.opt.Workers, r.rep); err != nil {
		return err
	}
	st := &r.res.Stats
	st.Assemble = time.Since(start)
	st.Freedoms, st.Equations, st.NonzerosK = r.nb.total, r.nb.equations, r.sys.k.Nonzeros()
	r.path = r.opt.Path
	if r.path == Auto {
		r.path = Sparse
		if r.nb.equations <= r.opt.DenseLimit {
			r.path = Dense
		}
	}
	st.Path = r.path
	return nil
}

// factorise orders and factorises K.
func (r *run) factorise() error {
	var err error
	r.res.Stats.Order, r.res.Stats.Factor, err = r.sys.factorise(r.ctx, r.path, r.opt, r.an, r.rep)
	return err
}

// deficient answers a K that failed the pivot test: an ill-conditioned
// but stable geometry is solved accepting every positive pivot; a
// mechanism that its loads do not set moving is solved as held; any other
// is the mechanism error with its modes.
func (r *run) deficient(d *errDeficient) (*Result, error) {
	if err := r.fullStability(); err != nil {
		return nil, err
	}
	if r.opt.PivotTolerance != acceptAnyPivot {
		if stable, err := geometryStable(r.ctx, r.m, r.nb, r.opt); err != nil {
			return nil, err
		} else if stable {
			return solveIllConditioned(r.ctx, r.m, r.opt, r.an)
		}
	}
	if held, ok := solveHeld(r.ctx, r.m, r.nb, d.equations, r.opt, r.stability, r.res.Warnings); ok {
		return held, nil
	}
	if r.nb.equations <= r.opt.StabilityLimit {
		return nil, mechanismError(r.m, r.nb, d.equations, denseModes(r.sys.dense(), r.sys.scale, len(d.equations)))
	}
	modes := sparseModes(r.ctx, r.sys, r.opt)
	if err := r.ctx.Err(); err != nil {
		return nil, err
	}
	return nil, mechanismError(r.m, r.nb, d.equations, modes)
}

// markStable completes the counts: a positive definite K = A·D·Aᵀ means
// the equilibrium matrix has full row rank, which fixes the count without
// an SVD.
func (r *run) markStable() {
	if s := r.stability; !s.Computed && !hasSprings(r.m) {
		s.Computed = true
		s.CountedBy = "stiffness"
		s.Rank = s.Freedoms
		s.SelfStress = s.Columns - s.Rank
	}
	r.res.Stats.NonzerosFactor = r.sys.fac.nonzeros()
}

// startCondition starts the condition estimate, which costs a dozen
// solves: with a second core it runs beside the load cases, and its
// warning still comes last.
func (r *run) startCondition() chan estimate {
	condition := make(chan estimate, 1)
	switch {
	case r.opt.SkipCondition:
		condition <- estimate{}
	case workers(r.opt.Workers) > 1 && r.path == Sparse:
		go func() {
			defer func() {
				if v := recover(); v != nil {
					condition <- estimate{crash: &panicValue{v}}
				}
			}()
			condition <- estimate{value: r.sys.fac.condition()}
		}()
	default:
		condition <- estimate{value: r.sys.fac.condition()}
	}
	return condition
}

// releaseSystem waits for the condition estimate and then, unless an
// Analysis keeps them for its next solve, drops the factor and K, which
// recovery does not read, so that the results of a large model are laid
// out in their memory instead of beside it. The collector would find them
// dead only when the heap had doubled since its last run, after the
// results had taken fresh pages, so for a factor of 4M entries (32 MiB)
// and more a collection is forced here: on the 2D grid of 270,600 bars
// (a factor of 141 MiB, results about as large) the whole request's peak
// fell from 698 to 513 MB, with fewer page faults. The estimate stays in
// condition for finish.
func (r *run) releaseSystem(condition chan estimate) {
	est := <-condition
	condition <- est
	if r.an != nil {
		return
	}
	big := r.res.Stats.NonzerosFactor >= 1<<22
	r.sys.fac, r.sys.k = nil, nil
	if big {
		runtime.GC()
	}
}

// recoverAll turns each request's displacements into its results, the
// cases side by side and the workers left over inside each case.
func (r *run) recoverAll(solutions *solutions) error {
	start := time.Now()
	requests, nb := r.requests, r.nb
	r.res.Cases = make([]CaseResult, len(requests))
	r.rep.Progress("recovering", 0, len(requests), nil)
	inner := max(1, workers(r.opt.Workers)/max(1, len(requests)))
	err := parallel(r.opt.Workers, len(requests), func(i int) error {
		if err := r.ctx.Err(); err != nil {
			return err
		}
		rq := requests[i]
		u := make([]float64, nb.total)
		for f := range u {
			if eq := nb.equation[f]; eq >= 0 {
				u[f] = solutions.settle(eq)
				for _, t := range rq.terms {
					u[f] += t.Factor * solutions.cases[t.Case][eq]
				}
			} else {
				u[f] = nb.prescribed[f]
			}
		}
		cr, err := recoverCase(r.m, nb, r.sys, newLoadSet(r.m, nb, rq.terms), u, inner, r.opt.recovery())
		if err != nil {
			return err
		}
		cr.ID, cr.Combination = rq.id, rq.combination
		r.keep(i, cr)
		return nil
	}, func(done int) { r.rep.Progress("recovering", done, len(requests), nil) })
	if err != nil {
		return err
	}
	r.rep.Progress("recovering", len(requests), len(requests), nil)
	r.res.Stats.Recover = time.Since(start)
	r.caseNotes()
	return nil
}

// finish waits for the condition estimate and adds the closing warnings.
func (r *run) finish(condition chan estimate) (*Result, error) {
	res := r.res
	est := <-condition
	if est.crash != nil {
		panic(est.crash.v)
	}
	res.Stats.ConditionNumber = est.value
	if err := r.ctx.Err(); err != nil {
		return nil, err
	}
	if c := res.Stats.ConditionNumber; c >= illConditioned {
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"the stiffness matrix is ill-conditioned (condition estimate %.2g after scaling to unit diagonal): about %d of 16 significant digits may be lost",
			c, digitsLost(c)))
	}
	if r.an != nil {
		r.an.release(r.sys)
	}
	res.Warnings = append(res.Warnings, residualWarnings(res)...)
	noteSelfWeight(r.m, r.requests, res)
	return res, nil
}

// workers resolves Options.Workers: 0 or less means GOMAXPROCS.
func workers(n int) int {
	if n <= 0 {
		return runtime.GOMAXPROCS(0)
	}
	return n
}

// illConditioned is the condition estimate from which Solve warns: beyond
// it fewer than four significant digits are safe (common practice).
const illConditioned = 1e12

func digitsLost(c float64) int {
	d := 0
	for ; c >= 10 && d < 16; c /= 10 {
		d++
	}
	return d
}

// requested resolves the ids in cases, or lists every case and then every
// combination.
func requested(m *model.Model, cases []string) ([]request, error) {
	var out []request
	if cases == nil {
		for i, lc := range m.Cases {
			out = append(out, request{id: lc.ID, terms: []model.Term{{Case: i, Factor: 1}}})
		}
		for _, c := range m.Combinations {
			out = append(out, request{id: c.ID, combination: true, terms: c.Terms})
		}
		return out, nil
	}
	for _, id := range cases {
		if i := m.CaseIndex(id); i >= 0 {
			out = append(out, request{id: id, terms: []model.Term{{Case: i, Factor: 1}}})
			continue
		}
		if i := m.CombinationIndex(id); i >= 0 {
			out = append(out, request{id: id, combination: true, terms: m.Combinations[i].Terms})
			continue
		}
		return nil, fault.New(fault.UnknownCase, "no load case or combination is called %q", id)
	}
	return out, nil
}

// solutions holds the displacements of the unconstrained freedoms for each
// load case needed (nil for the others) and for the settlement.
type solutions struct {
	cases       [][]float64
	settlements []float64 // nil when nothing is prescribed
}

func (s *solutions) settle(eq int) float64 {
	if s.settlements == nil {
		return 0
	}
	return s.settlements[eq]
}

// solveCases solves for every case that a request needs, once each, and for
// the prescribed displacements, spreading the cases over the workers (each
// solution is the same whatever the worker that computes it).
func solveCases(ctx context.Context, m *model.Model, nb *numbering, sys *system, requests []request, workers int, rep progress.Reporter) (*solutions, error) {
	sol := &solutions{cases: make([][]float64, len(m.Cases))}
	var needed []int
	for _, rq := range requests {
		for _, t := range rq.terms {
			if sol.cases[t.Case] == nil {
				sol.cases[t.Case] = []float64{}
				needed = append(needed, t.Case)
			}
		}
	}
	total := len(needed)
	if nb.anyPrescribed {
		total++
		sol.settlements = make([]float64, nb.equations)
	}
	rep.Progress("solving", 0, total, nil)
	err := parallel(workers, total, func(i int) error {
		if err := ctx.Err(); err != nil {
			return err
		}
		if i == len(needed) {
			sys.solve(sol.settlements, sys.settle)
			return nil
		}
		c := needed[i]
		ls := newLoadSet(m, nb, []model.Term{{Case: c, Factor: 1}})
		u := make([]float64, nb.equations)
		sys.solve(u, ls.rightHandSide(m, nb))
		sol.cases[c] = u
		return nil
	}, func(done int) { rep.Progress("solving", done, total, nil) })
	if err != nil {
		return nil, err
	}
	rep.Progress("solving", total, total, nil)
	return sol, nil
}

func hasSprings(m *model.Model) bool {
	for _, s := range m.Supports {
		if s.Spring != ([6]float64{}) {
			return true
		}
	}
	return false
}

// stiffnessRatio warns when the axial stiffnesses EA/L of the members span
// twelve orders of magnitude or more, where the smaller ones are lost in
// round-off (common practice).
func stiffnessRatio(m *model.Model) []string {
	lo, hi := -1, -1
	var kLo, kHi float64
	for e, mem := range m.Members {
		k := m.Materials[mem.Material].ElasticModulus * m.Sections[mem.Section].Area / m.Length(e)
		if lo < 0 || k < kLo {
			lo, kLo = e, k
		}
		if hi < 0 || k > kHi {
			hi, kHi = e, k
		}
	}
	if lo < 0 || !(kLo > 0) || kHi/kLo < 1e12 {
		return nil
	}
	return []string{fmt.Sprintf("member stiffnesses EA/L span a ratio of %.2g (member %q %.3g, member %q %.3g): member forces may be inaccurate, the stiffer members' most (see the equilibrium residual)",
		kHi/kLo, m.Members[hi].ID, kHi, m.Members[lo].ID, kLo)}
}

// estimate carries the condition estimate from its goroutine, or the panic
// that stopped it, to be raised again in the caller.
type estimate struct {
	value float64
	crash *panicValue
}
