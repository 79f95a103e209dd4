package stiffness

import (
	"context"
	"sync"

	"gusset/engine/model"
	"gusset/engine/progress"
	"gusset/engine/sparse"
)

// freeList keeps the storage of finished solves for later ones. Unlike a
// sync.Pool it is not emptied by garbage collection: it holds at most as
// many items as were ever in use at once, and they go with the Analysis.
type freeList[T any] struct {
	mu    sync.Mutex
	items []T
}

// take returns a kept item, if any, and gives up the list's hold on it.
func (l *freeList[T]) take() (T, bool) {
	l.mu.Lock()
	defer l.mu.Unlock()
	var zero T
	if len(l.items) == 0 {
		return zero, false
	}
	v := l.items[len(l.items)-1]
	l.items[len(l.items)-1] = zero
	l.items = l.items[:len(l.items)-1]
	return v, true
}

// put keeps v for a later take.
func (l *freeList[T]) put(v T) {
	l.mu.Lock()
	l.items = append(l.items, v)
	l.mu.Unlock()
}

// With returns an analysis of the same topology for other options (other
// cases, say), sharing a's numbering, pattern, order and symbolic
// factorisation (read-only) but not its storage. The order is computed
// once more only when opt chooses the sparse path and a's did not.
func (a *Analysis) With(opt Options) *Analysis {
	opt = opt.withDefaults()
	b := &Analysis{opt: opt, dim: a.dim, nodes: a.nodes, ends: a.ends, kinds: a.kinds,
		nb: a.nb, pat: a.pat, sym: a.sym, counts: a.counts, ordered: a.ordered}
	if b.sym == nil && a.nb.equations > 0 && resolvePath(opt, a.nb.equations) == Sparse {
		b.sym = sparse.Analyse(a.pat.k, sparse.Options{Workers: opt.Workers, Reporter: opt.Reporter})
	}
	return b
}

// lazyOrder is an order computed on first use.
type lazyOrder struct {
	once sync.Once
	sym  *sparse.Analysis
}

// resolvePath returns the path opt chooses for a system of the given
// number of equations.
func resolvePath(opt Options, equations int) Path {
	if opt.Path != Auto {
		return opt.Path
	}
	if equations <= opt.DenseLimit {
		return Dense
	}
	return Sparse
}

// Matrices returns what Assemble returns for m, which must have the
// analysed topology, reusing a's numbering and pattern and, on the sparse
// path, its order and symbolic factorisation (on the dense path they are
// computed here, as Assemble computes them). The matrix values are the
// ones Assemble gives, bit for bit, and so is the order, which depends on
// the structure alone; so an eigenvalue analysis after a static solve of
// the same model orders the matrix once. It fails as Assemble does and
// panics as Solve does for another topology.
func (a *Analysis) Matrices(ctx context.Context, m *model.Model) (*Matrices, error) {
	a.checkTopology(m)
	nb := a.numbering(m)
	if err := validate(m, nb); err != nil {
		return nil, err
	}
	pat := a.pattern()
	sys, err := assemble(ctx, m, nb, pat, a.opt.Workers, progress.Or(a.opt.Reporter))
	if err != nil {
		return nil, err
	}
	mx := &Matrices{K: sys.k, Scale: sys.scale, Unrestrained: sys.zero, nb: nb, pat: pat}
	mx.Node = make([]int, nb.equations)
	mx.Component = make([]int, nb.equations)
	for eq, f := range nb.freedomOf {
		mx.Node[eq], mx.Component[eq] = nb.node[f], nb.component[f]
	}
	mx.Symbolic = a.sym
	if mx.Symbolic == nil && nb.equations > 0 {
		// The order depends on the pattern alone: one for every step.
		a.ordered.once.Do(func() { a.ordered.sym = sparse.Analyse(sys.k, sparse.Options{Workers: a.opt.Workers}) })
		mx.Symbolic = a.ordered.sym
	}
	return mx, nil
}
