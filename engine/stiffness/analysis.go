package stiffness

import (
	"context"

	"gusset/engine/model"
	"gusset/engine/sparse"
	"gusset/engine/statics"
)

// Analysis holds what Solve derives from a model's topology alone: the
// numbering of the freedoms, the pattern of the stiffness matrix with the
// positions assembly writes to, and (on the sparse path) the fill-reducing
// order and symbolic factorisation. A sweep that changes only numbers
// (coordinates, section and material values, loads, spring stiffnesses,
// prescribed displacements) builds it once and solves every step with it.
//
// Several goroutines may call Solve at the same time: each call assembles
// and factorises into storage of its own, taken over from a finished call
// when there is one. The Analysis keeps the storage of finished calls (as
// many as ran at once, at most) for as long as it is referenced, so that
// a sweep's later steps refactorise in place rather than allocate and
// clear a factor each (a sync.Pool, emptied by every garbage collection,
// kept it for about one step in three on the 80,000-member grid).
type Analysis struct {
	opt   Options // with the defaults filled in
	dim   int
	nodes int
	ends  [][2]int
	kinds []model.MemberKind
	nb    *numbering // its support values are the analysed model's
	pat   *pattern
	sym   *sparse.Analysis // nil on the dense path
	// counts is the stability count without the rank (statics.Analyse
	// with no SVD), which depends on the topology alone; each solve takes
	// a copy.
	counts *statics.Report
	// ordered is the order Matrices computes on the dense path, once,
	// shared with the analyses With makes.
	ordered *lazyOrder

	// Storage of finished solves, taken up again by later ones: matrix
	// values and sparse factors, each owned by one solve at a time.
	values  freeList[[]float64]
	factors freeList[*sparse.Cholesky]
}

// NewAnalysis analyses the topology of m (node count, members' ends and
// kinds, the components its supports fix) for Solve with opt. It does not
// check m's data: Solve reports what Solve of the package would.
func NewAnalysis(m *model.Model, opt Options) *Analysis {
	opt = opt.withDefaults()
	nb := newNumbering(m)
	a := &Analysis{
		ordered: &lazyOrder{},
		opt:     opt,
		dim:     m.Dim,
		nodes:   m.NodeCount(),
		ends:    make([][2]int, len(m.Members)),
		kinds:   make([]model.MemberKind, len(m.Members)),
		nb:      nb,
		pat:     newPattern(m, nb),
	}
	for e, mem := range m.Members {
		a.ends[e], a.kinds[e] = mem.Ends, mem.Kind
	}
	path := opt.Path
	if path == Auto {
		path = Sparse
		if nb.equations <= opt.DenseLimit {
			path = Dense
		}
	}
	if path == Sparse && nb.equations > 0 {
		// The order depends on the structure alone, so it is the one
		// Factorize would choose for every step's matrix.
		a.sym = sparse.Analyse(a.pat.k, sparse.Options{Workers: opt.Workers, Reporter: opt.Reporter})
	}
	if counts, err := statics.Analyse(context.Background(), m, statics.Options{DenseLimit: -1}); err == nil {
		a.counts = counts
	}
	return a
}

// stabilityCounts returns a copy of the cached counts, or nil.
func (a *Analysis) stabilityCounts() *statics.Report {
	if a == nil || a.counts == nil {
		return nil
	}
	r := *a.counts
	return &r
}

// Solve analyses m, which must have the topology of the model given to
// NewAnalysis, with the Options given to NewAnalysis. Its results and
// errors are those of the package's Solve(ctx, m, opt), bit for bit, except
// the timings in Result.Stats (Stats.Order is zero: no ordering is done).
// Solve panics if m's topology differs.
func (a *Analysis) Solve(ctx context.Context, m *model.Model) (*Result, error) {
	a.checkTopology(m)
	return solve(ctx, m, a.opt, a)
}

// checkTopology panics unless m has the analysed topology.
func (a *Analysis) checkTopology(m *model.Model) {
	if m.Dim != a.dim || m.NodeCount() != a.nodes || len(m.Members) != len(a.ends) {
		panic("stiffness: Analysis used with a model of another topology")
	}
	for e, mem := range m.Members {
		if mem.Ends != a.ends[e] || mem.Kind != a.kinds[e] {
			panic("stiffness: Analysis used with a model of another topology")
		}
	}
}

// numbering returns the numbering of m's freedoms: the analysed one, with
// m's prescribed displacements and springs. It panics unless m's supports
// fix the components the analysed model's did.
func (a *Analysis) numbering(m *model.Model) *numbering {
	nb := *a.nb
	fixed := nb.setSupports(m)
	for f, eq := range nb.equation {
		if fixed[f] != (eq < 0) {
			panic("stiffness: Analysis.Solve with a model whose supports fix other components")
		}
	}
	return &nb
}

// pattern returns a copy of the analysed pattern sharing its structure,
// with values of its own, zero, for one assembly.
func (a *Analysis) pattern() *pattern {
	q := *a.pat
	val, ok := a.values.take()
	if ok {
		clear(val)
	} else {
		val = make([]float64, len(a.pat.k.Val))
	}
	q.k = &sparse.Matrix{N: a.pat.k.N, ColPtr: a.pat.k.ColPtr, RowIdx: a.pat.k.RowIdx, Val: val}
	return &q
}

// factorize factorises k, of the analysed structure, into a finished
// solve's factor when there is one.
func (a *Analysis) factorize(ctx context.Context, k *sparse.Matrix, opt sparse.Options) (*sparse.Cholesky, error) {
	if c, ok := a.factors.take(); ok {
		// A factor is pooled only after a success, and Refactorize
		// keeps the options it was made with, which are a's.
		return c, c.Refactorize(ctx, k)
	}
	return sparse.FactorizeWith(ctx, k, a.sym, opt)
}

// release hands the storage of a finished solve, which nothing returned to
// the caller refers to, to later solves.
func (a *Analysis) release(sys *system) {
	a.values.put(sys.k.Val)
	if f, ok := sys.fac.(sparseFactor); ok {
		a.factors.put(f.c)
	}
}
