package stiffness

import (
	"context"
	"errors"
	"fmt"
	"runtime"
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
// factorisation taken from an (m must then have an's topology).
func solve(ctx context.Context, m *model.Model, opt Options, an *Analysis) (*Result, error) {
	rep := progress.Or(opt.Reporter)
	requests, err := requested(m, opt.Cases)
	if err != nil {
		return nil, err
	}
	var nb *numbering
	if an != nil {
		nb = an.numbering(m)
	} else {
		nb = newNumbering(m)
	}
	if err := validate(m, nb); err != nil {
		return nil, err
	}
	res := &Result{}
	warning, err := checkParts(m, nb)
	if err != nil {
		return nil, err
	}
	if warning != "" {
		res.Warnings = append(res.Warnings, warning)
	}
	res.Warnings = append(res.Warnings, stiffnessRatio(m)...)

	// The counts come first without the rank: when K factorises and no
	// spring stiffens it, the equilibrium matrix has full row rank and the
	// SVD (cubic in the model's size) is needed only for a mechanism or a
	// model with springs.
	start := time.Now()
	svd := hasSprings(m)
	limit := -1
	if svd {
		limit = opt.StabilityLimit
	}
	stability := an.stabilityCounts()
	if svd || stability == nil {
		var err error
		if stability, err = statics.Analyse(ctx, m, statics.Options{DenseLimit: limit}); err != nil {
			return nil, err
		}
	}
	res.Stability = stability
	res.Stats.Stability = time.Since(start)
	// analyse replaces the counts by the full SVD report within the limit.
	analyse := func() error {
		if svd || opt.StabilityLimit < 0 {
			return nil
		}
		start := time.Now()
		full, err := statics.Analyse(ctx, m, statics.Options{DenseLimit: opt.StabilityLimit})
		if err != nil {
			return err
		}
		stability, res.Stability = full, full
		res.Stats.Stability += time.Since(start)
		return nil
	}

	start = time.Now()
	var pat *pattern
	if an != nil {
		pat = an.pattern()
	} else {
		pat = newPattern(m, nb)
	}
	sys, err := assemble(ctx, m, nb, pat, opt.Workers, rep)
	if err != nil {
		return nil, err
	}
	res.Stats.Assemble = time.Since(start)
	res.Stats.Freedoms = nb.total
	res.Stats.Equations = nb.equations
	res.Stats.NonzerosK = sys.k.Nonzeros()
	path := opt.Path
	if path == Auto {
		path = Sparse
		if nb.equations <= opt.DenseLimit {
			path = Dense
		}
	}
	res.Stats.Path = path
	res.Stats.Order, res.Stats.Factor, err = sys.factorise(ctx, path, opt, an, rep)
	var deficient *errDeficient
	if errors.As(err, &deficient) {
		if err := analyse(); err != nil {
			return nil, err
		}
		if opt.PivotTolerance != acceptAnyPivot {
			if stable, err := geometryStable(ctx, m, nb, opt); err != nil {
				return nil, err
			} else if stable {
				return solveIllConditioned(ctx, m, opt, an)
			}
		}
		if held, ok := solveHeld(ctx, m, nb, deficient.equations, opt, stability, res.Warnings); ok {
			return held, nil
		}
		if nb.equations <= opt.StabilityLimit {
			return nil, mechanismError(m, nb, deficient.equations, denseModes(sys.dense(), sys.scale, len(deficient.equations)))
		}
		modes := sparseModes(ctx, sys, opt)
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		return nil, mechanismError(m, nb, deficient.equations, modes)
	}
	if err != nil {
		return nil, err
	}
	if !stability.Computed && !hasSprings(m) {
		// A positive definite K = A·D·Aᵀ means the equilibrium matrix
		// has full row rank, which fixes the count without an SVD.
		stability.Computed = true
		stability.CountedBy = "stiffness"
		stability.Rank = stability.Freedoms
		stability.SelfStress = stability.Columns - stability.Rank
	}
	res.Stats.NonzerosFactor = sys.fac.nonzeros()
	// The condition estimate costs a dozen solves; with a second core it
	// runs beside the load cases, and its warning still comes last.
	condition := make(chan estimate, 1)
	if opt.SkipCondition {
		condition <- estimate{}
	} else if workers(opt.Workers) > 1 && path == Sparse {
		go func() {
			defer func() {
				if r := recover(); r != nil {
					condition <- estimate{crash: &panicValue{r}}
				}
			}()
			condition <- estimate{value: sys.fac.condition()}
		}()
	} else {
		condition <- estimate{value: sys.fac.condition()}
	}

	start = time.Now()
	solutions, err := solveCases(ctx, m, nb, sys, requests, opt.Workers, rep)
	if err != nil {
		return nil, err
	}
	res.Stats.Solve = time.Since(start)

	start = time.Now()
	res.Cases = make([]CaseResult, len(requests))
	rep.Progress("recovering", 0, len(requests), nil)
	// Cases run side by side; workers left over go inside each case.
	inner := max(1, workers(opt.Workers)/max(1, len(requests)))
	err = parallel(opt.Workers, len(requests), func(i int) error {
		if err := ctx.Err(); err != nil {
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
		cr, err := recoverCase(m, nb, sys, newLoadSet(m, nb, rq.terms), u, inner, stationCount(opt.Stations))
		if err != nil {
			return err
		}
		cr.ID, cr.Combination = rq.id, rq.combination
		res.Cases[i] = *cr
		return nil
	}, func(done int) { rep.Progress("recovering", done, len(requests), nil) })
	if err != nil {
		return nil, err
	}
	rep.Progress("recovering", len(requests), len(requests), nil)
	res.Stats.Recover = time.Since(start)
	res.Unchecked = uncheckedNotes(m, res.Cases, maxUncheckedNotes)
	res.Warnings = append(res.Warnings, bendingCaveat(m, res.Cases)...)

	est := <-condition
	if est.crash != nil {
		panic(est.crash.v)
	}
	res.Stats.ConditionNumber = est.value
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if c := res.Stats.ConditionNumber; c >= illConditioned {
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"the stiffness matrix is ill-conditioned (condition estimate %.2g after scaling to unit diagonal): about %d of 16 significant digits may be lost",
			c, digitsLost(c)))
	}
	if an != nil {
		an.release(sys)
	}
	res.Warnings = append(res.Warnings, residualWarnings(res)...)
	noteSelfWeight(m, requests, res)
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
