package sparse

import (
	"cmp"
	"context"
	"runtime"
	"time"

	"gusset/engine/progress"
)

// Analysis is the fill-reducing order and symbolic factorisation of one
// matrix structure, without numeric values. It is read-only once built, so
// several goroutines may factorise matrices of that structure with it at
// the same time, each into its own Cholesky.
type Analysis struct {
	sym      *symbolic
	pattern  uint64
	ordering time.Duration
	symbolic time.Duration
}

// Analyse orders a and computes its symbolic factorisation as Factorize
// does with the same opt.Perm (the values of a are not read, and the order
// chosen does not depend on opt.Workers). It panics if a is malformed or
// opt.Perm is not a permutation.
func Analyse(a *Matrix, opt Options) *Analysis {
	a.check()
	rep := progress.Or(opt.Reporter)
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	start := time.Now()
	perm := opt.Perm
	var parent, count []int
	if perm == nil {
		rep.Progress("ordering", 0, 1, nil)
		perm, parent, count = chooseOrder(a, workers)
		rep.Progress("ordering", 1, 1, nil)
	} else {
		validPerm(perm, a.N)
		parent, count = countsFor(a, perm)
	}
	an := &Analysis{pattern: patternHash(a), ordering: time.Since(start)}
	start = time.Now()
	rep.Progress("symbolic", 0, 1, nil)
	an.sym = analyseCounted(a, perm, parent, count)
	rep.Progress("symbolic", 1, 1, nil)
	an.symbolic = time.Since(start)
	return an
}

// N returns the order of the analysed matrix.
func (an *Analysis) N() int { return an.sym.n }

// FactorizeWith computes the Cholesky factorisation of a, whose structure
// must be the one analysed by an, reusing an's order and symbolic analysis;
// opt.Perm is ignored. The factor is bit-identical to Factorize's with the
// order an holds, and it fails like Factorize. Its Stats report zero
// ordering and symbolic times, none having been spent. FactorizeWith panics
// if a is malformed or its structure differs from an's.
func FactorizeWith(ctx context.Context, a *Matrix, an *Analysis, opt Options) (*Cholesky, error) {
	a.check()
	if a.N != an.sym.n || patternHash(a) != an.pattern {
		panic("sparse: FactorizeWith with a different structure")
	}
	tol := opt.PivotTolerance
	if tol == 0 {
		tol = 1e-13
	}
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	c := &Cholesky{
		sym:            an.sym,
		pattern:        an.pattern,
		workers:        workers,
		threshold:      tol,
		regularize:     opt.Regularize,
		ownDiag:        opt.OwnDiagonal,
		deficientPivot: cmp.Or(opt.DeficientPivot, 1),
		rep:            progress.Or(opt.Reporter),
	}
	if err := c.numeric(ctx, a); err != nil {
		return nil, err
	}
	return c, nil
}
