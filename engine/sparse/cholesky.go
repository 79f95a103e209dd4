package sparse

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"

	"gusset/engine/progress"
)

// Options controls Factorize. The zero value is ready to use.
type Options struct {
	// Perm is the fill-reducing order, perm[new] = old; nil means Order(a),
	// or OrderNested(a) when a has at least 4000 rows and that order needs
	// fewer flops.
	Perm []int
	// Workers is the number of goroutines that factorise independent
	// subtrees of the elimination tree and share the dense operations of the
	// large supernodes above them; 0 means runtime.GOMAXPROCS(0). The factor
	// is bit-identical for every value. (gonum's Gemm may add goroutines of
	// its own for large products, up to GOMAXPROCS.)
	Workers int
	// Reporter receives the stages "ordering", "symbolic" and "factorising"
	// (done and total count supernodes); nil reports nothing.
	Reporter progress.Reporter
	// PivotTolerance is the smallest accepted pivot relative to the largest
	// absolute diagonal entry of A; 0 means 1e-13.
	PivotTolerance float64
	// Regularize makes Factorize succeed on deficient pivots: they are
	// listed by Cholesky.Deficient instead of returned as a *PivotError.
	Regularize bool
	// OwnDiagonal measures each pivot against its own column's diagonal
	// entry of A instead of the largest one: a pivot that cancels to
	// PivotTolerance times A_kk is deficient. Systems whose diagonal spans
	// many orders of magnitude need it, as the normal equations A·D·Aᵀ of
	// an interior-point method do, where such a pivot marks a row
	// dependent on others (S. J. Wright, "Primal-Dual Interior-Point
	// Methods", SIAM 1997, ch. 11; from memory).
	OwnDiagonal bool
	// DeficientPivot is the value that replaces a deficient pivot (its
	// column of L below the diagonal is zeroed); 0 means 1. A huge value
	// such as 1e64 makes the solution's component there zero, as the
	// interior-point method wants.
	DeficientPivot float64
}

// PivotError reports the columns whose pivots were non-positive, NaN or at
// most PivotTolerance times the largest diagonal entry: the freedoms that the
// rest of the matrix does not restrain. Columns are original (unpermuted)
// indices in ascending order; Pivots holds the pivot found for each, that is
// the diagonal of the Schur complement when the column was reached.
type PivotError struct {
	Columns []int
	Pivots  []float64
}

// Error lists the first deficient columns.
func (e *PivotError) Error() string {
	var b strings.Builder
	fmt.Fprintf(&b, "sparse: matrix not positive definite: %d deficient pivot(s) at column(s)", len(e.Columns))
	for k, c := range e.Columns {
		if k == 8 {
			b.WriteString(" ...")
			break
		}
		fmt.Fprintf(&b, " %d (%.3g)", c, e.Pivots[k])
	}
	return b.String()
}

// Stats describes a factorisation.
type Stats struct {
	N          int           // order of the matrix
	NonzerosA  int           // stored entries of A (lower triangle and diagonal)
	NonzerosL  int           // entries of L (lower triangle and diagonal) implied by the structure of A
	StoredL    int           // entries of L as stored, including the explicit zeros of merged supernodes
	Supernodes int           // number of supernodes
	Flops      float64       // floating-point operations of the numeric factorisation
	Ordering   time.Duration // wall time of the ordering (zero with Options.Perm)
	Symbolic   time.Duration // wall time of the symbolic analysis
	Numeric    time.Duration // wall time of the last numeric factorisation
}

// Cholesky is the sparse factorisation P·A·Pᵀ = L·Lᵀ of a symmetric positive
// definite matrix A. It is safe for concurrent use by several solves.
type Cholesky struct {
	sym            *symbolic
	pattern        uint64
	workers        int
	threshold      float64 // relative pivot tolerance
	regularize     bool
	ownDiag        bool
	deficientPivot float64 // the value of a replaced pivot
	rep            progress.Reporter

	ok        bool // the last numeric factorisation succeeded
	val       []float64
	normA     float64 // ‖A‖₁ = ‖A‖∞
	deficient []int
	pivots    []float64
	stats     Stats
	condMu    sync.Mutex
	condDone  bool
	condition float64
}

// nestedMinSize is the order from which Factorize also tries nested
// dissection.
const nestedMinSize = 4000

// chooseOrder returns the minimum-degree order of a or, on large matrices,
// the nested-dissection order when it predicts less fill (fewer nonzeros in
// L, from the column counts; fewer flops on a tie), with the elimination
// tree and column counts of the order returned: minimum degree is hard to
// beat on thin structures but falls behind nested dissection on large
// plane grids and well behind on solid 3D ones. The prediction is exact
// and cheap (the column counts, from the graph of the groups of
// indistinguishable variables that both orderings share, take a small
// fraction of either ordering's time). With two workers or more the
// candidates are computed side by side; the choice does not depend on the
// workers.
func chooseOrder(a *Matrix, workers int) (perm, parent, count []int) {
	c := compress(a)
	if a.N < nestedMinSize {
		order := c.minimumDegree()
		parent, count = c.counts(order)
		return c.expand(order), parent, count
	}
	var amd, nested candidate
	parallelFor(min(workers, 2), 2, func(k int) {
		if k == 0 {
			amd = newCandidate(c, c.minimumDegree())
		} else {
			nested = newCandidate(c, c.nested())
		}
	})
	if nested.better(amd) {
		return c.expand(nested.order), nested.parent, nested.count
	}
	return c.expand(amd.order), amd.parent, amd.count
}

// candidate is a fill-reducing order of the groups of indistinguishable
// variables with the elimination tree, column counts, nonzeros in L and
// flops of its order of the variables, kept so that the analysis of the
// winner does not count again.
type candidate struct {
	order, parent, count []int
	nonzeros             int
	flops                float64
}

func newCandidate(c *compressed, order []int) candidate {
	parent, count := c.counts(order)
	nnz, flops := nonzerosAndFlops(count)
	return candidate{order: order, parent: parent, count: count, nonzeros: nnz, flops: flops}
}

// better reports whether c predicts less fill than o: fewer nonzeros in L,
// or as many and fewer flops.
func (c candidate) better(o candidate) bool {
	if c.nonzeros != o.nonzeros {
		return c.nonzeros < o.nonzeros
	}
	return c.flops < o.flops
}

// countsFor returns the elimination tree and column counts of P·A·Pᵀ for
// perm[new] = old.
func countsFor(a *Matrix, perm []int) (parent, count []int) {
	iperm := make([]int, a.N)
	for k, old := range perm {
		iperm[old] = k
	}
	return columnCounts(a, iperm)
}

// defect records one deficient pivot.
type defect struct {
	column int // permuted index
	pivot  float64
}

// Factorize computes the Cholesky factorisation of the symmetric matrix a.
// It returns ctx.Err() when ctx is cancelled, which it checks between
// supernodes, and a *PivotError naming every deficient column unless
// opt.Regularize is set. Factorize panics if a is malformed or opt.Perm is
// not a permutation.
func Factorize(ctx context.Context, a *Matrix, opt Options) (*Cholesky, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	an := Analyse(a, opt)
	c, err := FactorizeWith(ctx, a, an, opt)
	if err != nil {
		return nil, err
	}
	c.stats.Ordering, c.stats.Symbolic = an.ordering, an.symbolic
	return c, nil
}

// Refactorize recomputes the factorisation for new values of a matrix with
// exactly the structure first factorised (as when an assembler fills a
// NewPattern matrix again), reusing the ordering, the symbolic analysis and
// the factor's storage, with the Options given to Factorize. It fails like
// Factorize; after a failure c must not be used until a Refactorize
// succeeds. It panics if a's structure differs. Refactorize must not run
// concurrently with other methods of c.
func (c *Cholesky) Refactorize(ctx context.Context, a *Matrix) error {
	a.check()
	if a.N != c.sym.n || patternHash(a) != c.pattern {
		panic("sparse: Refactorize with a different structure")
	}
	return c.numeric(ctx, a)
}

// patternHash fingerprints a matrix structure (FNV-1a over the column
// pointers and row indices).
func patternHash(a *Matrix) uint64 {
	h := uint64(14695981039346656037)
	mix := func(v int) {
		h ^= uint64(v)
		h *= 1099511628211
	}
	mix(a.N)
	for _, p := range a.ColPtr {
		mix(p)
	}
	for _, i := range a.RowIdx[:a.Nonzeros()] {
		mix(i)
	}
	return h
}

// numeric runs the numeric factorisation of a into c.
func (c *Cholesky) numeric(ctx context.Context, a *Matrix) error {
	c.ok = false
	c.condDone = false
	if err := ctx.Err(); err != nil {
		return err
	}
	start := time.Now()
	sym := c.sym
	c.normA = a.NormInf()
	maxDiag := 0.0
	for j := 0; j < a.N; j++ {
		if p := a.ColPtr[j]; p < a.ColPtr[j+1] && a.RowIdx[p] == j {
			if v := abs(a.Val[p]); v > maxDiag && !math.IsInf(v, 0) {
				maxDiag = v // NaN fails the comparison and is skipped
			}
		}
	}
	// Each supernode clears its block (when reused) and assembles its
	// columns of A itself, so that the first touch of the factor's memory
	// (page faults included) is spread over the workers.
	reused := c.val != nil
	if !reused {
		c.val = make([]float64, sym.valPtr[sym.nsuper])
		adviseHugePages(c.val)
	}
	f := &numeric{
		sym:       sym,
		val:       c.val,
		aVal:      a.Val,
		reused:    reused,
		threshold: c.threshold * maxDiag,
		pivotFor:  c.deficientPivot,
		updates:   make([][]float64, sym.nsuper),
		defects:   make([][]defect, sym.nsuper),
		rep:       c.rep,
		done:      ctx.Done(),
	}
	if c.ownDiag {
		f.floors = make([]float64, a.N)
		for k, old := range sym.perm {
			if p := a.ColPtr[old]; p < a.ColPtr[old+1] && a.RowIdx[p] == old {
				f.floors[k] = c.threshold * abs(a.Val[p])
			}
		}
	}
	if err := f.run(c.workers); err != nil {
		return ctx.Err()
	}
	c.deficient, c.pivots = nil, nil
	for _, ds := range f.defects {
		for _, d := range ds {
			c.deficient = append(c.deficient, sym.perm[d.column])
			c.pivots = append(c.pivots, d.pivot)
		}
	}
	sortDefects(c.deficient, c.pivots)
	c.stats.N = a.N
	c.stats.NonzerosA = a.Nonzeros()
	c.stats.NonzerosL = sym.nnzL
	c.stats.StoredL = sym.nnzStored
	c.stats.Supernodes = sym.nsuper
	c.stats.Flops = sym.flops
	c.stats.Numeric = time.Since(start)
	if len(c.deficient) > 0 && !c.regularize {
		return &PivotError{Columns: slices.Clone(c.deficient), Pivots: slices.Clone(c.pivots)}
	}
	c.ok = true
	return nil
}

func sortDefects(cols []int, pivots []float64) {
	idx := make([]int, len(cols))
	for i := range idx {
		idx[i] = i
	}
	sort.Slice(idx, func(x, y int) bool { return cols[idx[x]] < cols[idx[y]] })
	c2, p2 := slices.Clone(cols), slices.Clone(pivots)
	for k, i := range idx {
		cols[k], pivots[k] = c2[i], p2[i]
	}
}

// Deficient returns the original indices, ascending, of the columns whose
// pivots were replaced (by Options.DeficientPivot) with their off-diagonal
// entries in L zeroed (the freedoms treated as constrained); it is empty
// for a positive definite A.
func (c *Cholesky) Deficient() []int { return slices.Clone(c.deficient) }

// Stats returns the sizes, work and timings of the factorisation.
func (c *Cholesky) Stats() Stats { return c.stats }

// errCancelled is internal: Factorize turns it into ctx.Err().
var errCancelled = errors.New("sparse: cancelled")

// numeric is the state of one multifrontal numeric factorisation. Each
// supernode s assembles A's columns and its children's update matrices into
// its block of L, factorises the diagonal block, solves for the rows below
// it and leaves the update matrix U_s = −L21·L21ᵀ plus its children's
// contributions for its parent. Children are assembled in ascending order,
// so the operations on every entry are the same whatever the scheduling.
type numeric struct {
	sym       *symbolic
	val       []float64
	aVal      []float64 // values of A
	reused    bool      // val holds an earlier factor and must be cleared
	threshold float64
	// floors, when set, holds each permuted column's own pivot floor
	// instead of threshold (Options.OwnDiagonal).
	floors   []float64
	pivotFor float64     // the value of a replaced pivot
	updates  [][]float64 // update matrix of each supernode, row-major upper, until its parent consumes it
	defects  [][]defect
	rep      progress.Reporter
	done     <-chan struct{}
	finished atomic.Int64
	pool     bufferPool
}

// workspace is one worker's scratch space.
type workspace struct {
	local []int // local position of each permuted row in the current supernode
	rel   []int
	lower []float64 // a lower-triangular copy of the diagonal block
}

func newWorkspace(n int) *workspace {
	return &workspace{local: make([]int, n)}
}

func (f *numeric) cancelled() bool {
	select {
	case <-f.done:
		return true
	default:
		return false
	}
}

func (f *numeric) report() {
	total := f.sym.nsuper
	k := int(f.finished.Add(1))
	step := max(total/100, 1)
	if k%step == 0 || k == total {
		f.rep.Progress("factorising", k, total, nil)
	}
}

// run factorises all supernodes with the given number of workers.
func (f *numeric) run(workers int) error {
	sym := f.sym
	ns := sym.nsuper
	f.rep.Progress("factorising", 0, ns, nil)
	if workers == 1 || ns < 2 {
		w := newWorkspace(sym.n)
		for s := 0; s < ns; s++ {
			if f.cancelled() {
				return errCancelled
			}
			f.supernode(w, s, 1)
			f.report()
		}
		return nil
	}

	pl := planTasks(sym, workers)
	isTask, firstDesc, tasks, top, pending := pl.isTask, pl.firstDesc, pl.tasks, pl.top, pl.pending
	ready := make(chan int, ns)
	for _, t := range tasks {
		ready <- t
	}
	remaining := atomic.Int64{}
	remaining.Store(int64(len(tasks) - countLeaves(sym, top) + len(top)))
	quit := make(chan struct{})
	var quitOnce sync.Once
	stop := func() { quitOnce.Do(func() { close(quit) }) }
	var failed atomic.Bool
	var crash panicSlot
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer crash.catch(stop)
			w := newWorkspace(sym.n)
			for {
				var t int
				select {
				case <-quit:
					return
				case t = <-ready:
				}
				// A supernode above the subtrees often runs alone: its dense
				// operations are then shared among the workers.
				lo, wide := t, workers
				if isTask[t] {
					lo, wide = firstDesc[t], 1
				}
				for s := lo; s <= t; s++ {
					if f.cancelled() {
						failed.Store(true)
						stop()
						return
					}
					f.supernode(w, s, wide)
					f.report()
				}
				if p := sym.superParent[t]; p >= 0 && pending[p].Add(-1) == 0 {
					ready <- p
				}
				if remaining.Add(-1) == 0 {
					stop()
					return
				}
			}
		}()
	}
	wg.Wait()
	crash.rethrow()
	if failed.Load() {
		return errCancelled
	}
	return nil
}

// taskPlan is how run shares the supernodes among workers: subtree tasks
// (isTask, each running firstDesc[t]..t in postorder), the top supernodes
// above them with their counts of unfinished children (pending), and the
// initially ready tasks, largest first.
type taskPlan struct {
	firstDesc []int
	isTask    []bool
	tasks     []int
	top       []int
	pending   []atomic.Int32
}

// planTasks builds run's task plan for the given number of workers. It is
// sequential and reads only the symbolic factorisation.
func planTasks(sym *symbolic, workers int) taskPlan {
	ns := sym.nsuper
	// Subtrees whose work is below a share of the total go to one worker
	// each, in postorder; the supernodes above them are single tasks that
	// become ready when their last child finishes.
	subtree := slices.Clone(sym.cost)
	firstDesc := make([]int, ns)
	for s := range firstDesc {
		firstDesc[s] = s
	}
	for s := 0; s < ns; s++ {
		for _, c := range sym.childList[sym.childPtr[s]:sym.childPtr[s+1]] {
			firstDesc[s] = min(firstDesc[s], firstDesc[c])
			subtree[s] += subtree[c]
		}
	}
	total := 0.0
	for s := 0; s < ns; s++ {
		if sym.superParent[s] < 0 {
			total += subtree[s]
		}
	}
	limit := total / float64(4*workers)
	isTask := make([]bool, ns) // a subtree task rooted here
	var tasks []int
	pending := make([]atomic.Int32, ns)
	for s := 0; s < ns; s++ {
		p := sym.superParent[s]
		if subtree[s] <= limit && (p < 0 || subtree[p] > limit) {
			isTask[s] = true
			tasks = append(tasks, s)
		}
	}
	var top []int
	for s := 0; s < ns; s++ {
		if subtree[s] > limit {
			top = append(top, s)
			pending[s].Store(int32(sym.childPtr[s+1] - sym.childPtr[s]))
			if sym.childPtr[s+1] == sym.childPtr[s] {
				tasks = append(tasks, s)
			}
		}
	}
	// Largest first, for balance; ties by index keep it reproducible.
	sort.SliceStable(tasks, func(x, y int) bool { return subtree[tasks[x]] > subtree[tasks[y]] })
	return taskPlan{firstDesc: firstDesc, isTask: isTask, tasks: tasks, top: top, pending: pending}
}

// countLeaves counts the top supernodes without children, which are already
// among the initial tasks.
func countLeaves(sym *symbolic, top []int) int {
	k := 0
	for _, s := range top {
		if sym.childPtr[s+1] == sym.childPtr[s] {
			k++
		}
	}
	return k
}

// supernode factorises supernode s; its children must be finished. Its
// dense operations on the off-diagonal block use up to wide goroutines.
// It stays whole (numerical kernel): its phases share the local row map
// w.local, the scratch w.rel and the children's pooled update blocks.
func (f *numeric) supernode(w *workspace, s int, wide int) {
	sym := f.sym
	first := sym.superFirst[s]
	ns := sym.superFirst[s+1] - first
	rows := sym.rows[sym.rowPtr[s]:sym.rowPtr[s+1]]
	rs := len(rows)
	m := ns + rs
	block := f.val[sym.valPtr[s]:sym.valPtr[s+1]]
	if f.reused {
		clear(block)
	}
	// Row k of the block is column first+k of L; A goes in first and the
	// children's updates are added to it.
	for t := sym.lowPtr[first]; t < sym.lowPtr[first+ns]; t++ {
		block[sym.aDst[t]] = f.aVal[sym.aSrc[t]]
	}
	local := w.local
	for k := 0; k < ns; k++ {
		local[first+k] = k
	}
	for t, r := range rows {
		local[r] = ns + t
	}

	children := sym.childList[sym.childPtr[s]:sym.childPtr[s+1]]
	// Children's update entries in this supernode's columns.
	for _, c := range children {
		crows := sym.rows[sym.rowPtr[c]:sym.rowPtr[c+1]]
		rc := len(crows)
		u := f.updates[c]
		rel := w.rel[:0]
		for _, r := range crows {
			rel = append(rel, local[r])
		}
		w.rel = rel
		for b := 0; b < rc && rel[b] < ns; b++ {
			dst := block[rel[b]*m : (rel[b]+1)*m]
			src := u[b*rc : (b+1)*rc]
			for a := b; a < rc; a++ {
				dst[rel[a]] += src[a]
			}
		}
	}

	f.factorDiagonal(w, s, block, ns, m)

	if rs > 0 {
		lower := blas64.General{Rows: ns, Cols: rs, Stride: m, Data: block[ns:]}
		solveBelow(blas64.Triangular{Uplo: blas.Upper, Diag: blas.NonUnit, N: ns, Stride: m, Data: block},
			lower, wide)
		for _, d := range f.defects[s] {
			clear(block[(d.column-first)*m+ns : (d.column-first+1)*m])
		}
		u := f.pool.get(rs * rs)
		scratch := f.pool.get(rs * ns)
		updateMatrix(lower, u, scratch, wide)
		f.pool.put(scratch)
		for _, c := range children {
			crows := sym.rows[sym.rowPtr[c]:sym.rowPtr[c+1]]
			rc := len(crows)
			uc := f.updates[c]
			rel := w.rel[:0]
			for _, r := range crows {
				rel = append(rel, local[r]-ns)
			}
			w.rel = rel
			b := 0
			for b < rc && rel[b] < 0 {
				b++
			}
			for ; b < rc; b++ {
				dst := u[rel[b]*rs : (rel[b]+1)*rs]
				src := uc[b*rc : (b+1)*rc]
				for a := b; a < rc; a++ {
					dst[rel[a]] += src[a]
				}
			}
		}
		f.updates[s] = u
	}
	for _, c := range children {
		f.pool.put(f.updates[c])
		f.updates[c] = nil
	}
}

// floor is the smallest acceptable pivot of permuted column k (before its
// square root).
func (f *numeric) floor(k int) float64 {
	if f.floors != nil {
		return f.floors[k]
	}
	return f.threshold
}

// factorDiagonal factorises the ns×ns diagonal block in place (upper
// triangle of the row-major block = L11ᵀ). The dense kernel does the work
// when every pivot is acceptable; otherwise the block is redone column by
// column from A, replacing each deficient pivot by Options.DeficientPivot
// (1 by default) and zeroing the rest of its column of L, so that all
// deficient columns are found.
func (f *numeric) factorDiagonal(w *workspace, s int, block []float64, ns, m int) {
	// The dense kernel works on a lower-triangular copy: gonum's Potrf on
	// a lower triangle runs its updates as Gemm(NoTrans, Trans), several
	// times faster than the Gemm(Trans, NoTrans) of the upper form on a
	// strided block (measured here), which matters for the large root
	// separators of solid 3D structures. The block keeps A until the copy
	// is accepted, so the column-by-column path below starts from it.
	first := f.sym.superFirst[s]
	if cap(w.lower) < ns*ns {
		w.lower = make([]float64, ns*ns)
	}
	lower := w.lower[:ns*ns]
	for j := 0; j < ns; j++ {
		for t, v := range block[j*m+j : j*m+ns] {
			lower[(j+t)*ns+j] = v
		}
	}
	_, ok := lapack64.Potrf(blas64.Symmetric{Uplo: blas.Lower, N: ns, Stride: ns, Data: lower})
	if ok {
		for k := 0; k < ns; k++ {
			d := lower[k*ns+k]
			if !(d*d > f.floor(first+k)) || math.IsInf(d, 1) {
				ok = false
				break
			}
		}
	}
	if ok {
		for j := 0; j < ns; j++ {
			row := block[j*m+j : j*m+ns]
			for t := range row {
				row[t] = lower[(j+t)*ns+j]
			}
		}
		return
	}
	for k := 0; k < ns; k++ {
		row := block[k*m : k*m+ns]
		d := row[k]
		if !(d > f.floor(first+k)) || math.IsInf(d, 1) {
			f.defects[s] = append(f.defects[s], defect{column: first + k, pivot: d})
			row[k] = f.pivotFor
			clear(row[k+1:])
			continue
		}
		r := math.Sqrt(d)
		row[k] = r
		for l := k + 1; l < ns; l++ {
			row[l] /= r
		}
		for i := k + 1; i < ns; i++ {
			lki := row[i]
			if lki == 0 {
				continue
			}
			dst := block[i*m : i*m+ns]
			for l := i; l < ns; l++ {
				dst[l] -= lki * row[l]
			}
		}
	}
}
