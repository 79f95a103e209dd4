package formfind

import (
	"context"
	"fmt"
	"math"
	"slices"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/sparse"
)

// finder holds the state of one Find.
type finder struct {
	m         *model.Model
	p         *Problem
	opt       Options
	nw        *network
	load      *loading
	q         []float64 // force densities of the current factorisation
	coords    []float64
	lengths   []float64
	loads     []float64 // lumped loads of the last solve, Dim per node
	through   *throughTarget
	targets   []target
	rhs       [][]float64 // per axis: the full right-hand side
	fixedRHS  [][]float64 // per axis: the fixed nodes' part (through only)
	warnings  []fault.Problem
	size      float64
	converged bool
}

// Find finds the equilibrium form of m's network for problem p. The model's
// supports that hold every translation are the fixed nodes, which stay
// where they are; every other node is free and moves to where the force
// densities, the loads of the case and the iterations asked for put it.
//
// Find fails with a *fault.Error: InvalidModel for a support holding only
// some translations or a member load it cannot lump, MissingData without a
// force density, Expression for a force density that does not evaluate,
// UnknownCase for an unknown case, NoSolution for a Through point that no
// scaling reaches, and Unstable when the force density matrix is singular
// or (mixed signs) indefinite, with the nodes concerned. It returns
// ctx.Err() when cancelled. Find panics if m is nil.
func Find(ctx context.Context, m *model.Model, p Problem, opt Options) (*Result, error) {
	if m == nil {
		panic("formfind: Find with a nil model")
	}
	f, err := newFinder(m, &p, opt.withDefaults())
	if err != nil {
		return nil, err
	}
	if len(f.nw.freeNodes) == 0 {
		return nil, fault.At(fault.NoSolution, "/model/supports", "every node is fixed by a support, so there is no form to find; leave the nodes to be found free")
	}
	iterations, change, err := f.iterate(ctx)
	if err != nil {
		return nil, err
	}
	return f.result(iterations, change), nil
}

func newFinder(m *model.Model, p *Problem, opt Options) (*finder, error) {
	f := &finder{m: m, p: p, opt: opt, coords: slices.Clone(m.Coords)}
	q, err := forceDensities(m, p)
	if err != nil {
		return nil, err
	}
	f.q = q
	fixed, err := fixity(m, f.warn)
	if err != nil {
		return nil, err
	}
	if f.load, err = newLoading(m, p.Case, f.warn); err != nil {
		return nil, err
	}
	if err = f.prepareConstraints(fixed); err != nil {
		return nil, err
	}
	f.nw = newNetwork(m, fixed, sparse.Options{Workers: opt.Workers, Reporter: f.opt.Reporter})
	n := len(f.nw.freeNodes)
	f.rhs, f.fixedRHS = make([][]float64, m.Dim), make([][]float64, m.Dim)
	for k := range f.rhs {
		f.rhs[k] = make([]float64, n)
		f.fixedRHS[k] = make([]float64, n)
	}
	f.lengths = make([]float64, len(m.Members))
	f.measure()
	f.loads = make([]float64, len(f.coords))
	f.size = boundingDiagonal(m)
	return f, nil
}

func (f *finder) warn(path, format string, args ...any) {
	f.warnings = append(f.warnings, fault.Problem{Path: path, Message: fmt.Sprintf(format, args...)})
}

// measure recomputes the member lengths from the coordinates.
func (f *finder) measure() {
	d := f.m.Dim
	for e, mem := range f.m.Members {
		a, b := mem.Ends[0]*d, mem.Ends[1]*d
		var s float64
		for k := 0; k < d; k++ {
			dx := f.coords[b+k] - f.coords[a+k]
			s += dx * dx
		}
		f.lengths[e] = math.Sqrt(s)
	}
}

// iterate runs the linear method once or, with targets or loads that
// follow the form, until the form stops moving and the targets are met.
// It returns the iterations done and the last change of the coordinates.
func (f *finder) iterate(ctx context.Context) (int, float64, error) {
	iterative := f.load.follows || len(f.targets) > 0
	refactor := true
	var change float64
	for it := 1; ; it++ {
		if err := ctx.Err(); err != nil {
			return 0, 0, err
		}
		if refactor {
			if err := f.nw.factorise(ctx, f.q); err != nil {
				return 0, 0, err
			}
		}
		f.load.lump(f.loads, f.m, f.lengths)
		var err error
		if change, err = f.solve(); err != nil {
			return 0, 0, err
		}
		if math.IsNaN(change) || math.IsInf(change, 0) {
			return 0, 0, fault.New(fault.NoSolution, "the force densities give no finite form: their matrix is too near singular; join every free node firmly to a support")
		}
		f.measure()
		misfit := f.targetMisfit()
		if iterative {
			f.report(Iteration{Iteration: it, Change: change, Misfit: misfit})
		}
		settled := !f.load.follows || change <= f.opt.Tolerance*f.size
		if !iterative || settled && misfit <= f.opt.Tolerance {
			f.converged = true
			return it, change, nil
		}
		if it >= f.opt.MaxIterations {
			f.warn("", "form finding stopped after %d iterations without converging: last move %.3g (tolerance %.3g), largest target misfit %.3g; the form is in equilibrium for the force densities and loads it reports",
				it, change, f.opt.Tolerance*f.size, misfit)
			return it, change, nil
		}
		refactor = f.updateTargets()
	}
}

// solve finds the free coordinates for the current factorisation and
// loads, applying the through scaling when asked, and returns the largest
// move of a free node.
func (f *finder) solve() (float64, error) {
	nw, d := f.nw, f.m.Dim
	if f.through == nil {
		nw.rightHandSides(f.rhs, f.q, f.loads, f.coords, 1, true)
		nw.chol.SolveMany(f.rhs, f.rhs)
		return f.place(f.rhs, nil, 1), nil
	}
	// x = h + t·l: h from the fixed nodes alone, l from the loads alone,
	// t = 1/s for force densities s·q.
	nw.rightHandSides(f.fixedRHS, f.q, f.loads, f.coords, 0, true)
	nw.rightHandSides(f.rhs, f.q, f.loads, f.coords, 1, false)
	both := append(slices.Clone(f.fixedRHS), f.rhs...)
	nw.chol.SolveMany(both, both)
	fi := nw.free[f.through.node]
	var num, den float64
	for k := 0; k < d; k++ {
		h, l := f.fixedRHS[k][fi], f.rhs[k][fi]
		num += l * (f.through.at[k] - h)
		den += l * l
	}
	switch {
	case den == 0:
		return 0, fault.At(fault.NoSolution, "/through/node", "no scaling of the force densities moves node %q to the point: no load moves it", f.m.NodeIDs[f.through.node])
	case num == 0 || math.IsNaN(num/den):
		return 0, fault.At(fault.NoSolution, "/through/at", "node %q reaches the point only with infinite force densities (it lies where the unloaded network puts the node)", f.m.NodeIDs[f.through.node])
	}
	t := num / den
	f.through.scale = 1 / t
	return f.place(f.fixedRHS, f.rhs, t), nil
}

// place writes base + t·extra (extra may be nil) into the free nodes'
// coordinates and returns the largest move.
func (f *finder) place(base, extra [][]float64, t float64) float64 {
	d := f.m.Dim
	var change float64
	for fi, node := range f.nw.freeNodes {
		var move float64
		for k := 0; k < d; k++ {
			x := base[k][fi]
			if extra != nil {
				x += t * extra[k][fi]
			}
			dx := x - f.coords[node*d+k]
			move += dx * dx
			f.coords[node*d+k] = x
		}
		change = max(change, math.Sqrt(move))
	}
	return change
}

func boundingDiagonal(m *model.Model) float64 {
	d := m.Dim
	var s float64
	for k := 0; k < d; k++ {
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := k; i < len(m.Coords); i += d {
			lo, hi = min(lo, m.Coords[i]), max(hi, m.Coords[i])
		}
		s += (hi - lo) * (hi - lo)
	}
	return math.Sqrt(s)
}

// report passes one iteration to the Iterations recorder, or its count
// alone to the Reporter.
func (f *finder) report(it Iteration) {
	if f.opt.Iterations != nil {
		f.opt.Iterations.Record("iterating", it.Iteration, f.opt.MaxIterations, it)
		return
	}
	f.opt.Reporter.Progress("iterating", it.Iteration, f.opt.MaxIterations, nil)
}
