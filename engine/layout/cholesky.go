package layout

import (
	"context"
	"fmt"

	"gusset/engine/sparse"
)

// sparseColumns is a sparse matrix stored by columns (compressed sparse
// column form): the entries of column j are rowIndex[colStart[j]:colStart[j+1]]
// with values value[...].
type sparseColumns struct {
	rows, cols int
	colStart   []int
	rowIndex   []int32
	value      []float64
}

// mulVec sets dst = A·x.
func (a *sparseColumns) mulVec(dst, x []float64) {
	for i := range dst[:a.rows] {
		dst[i] = 0
	}
	for j := 0; j < a.cols; j++ {
		xj := x[j]
		if xj == 0 {
			continue
		}
		for p := a.colStart[j]; p < a.colStart[j+1]; p++ {
			dst[a.rowIndex[p]] += a.value[p] * xj
		}
	}
}

// mulTransVec sets dst = Aᵀ·y.
func (a *sparseColumns) mulTransVec(dst, y []float64) {
	for j := 0; j < a.cols; j++ {
		var sum float64
		for p := a.colStart[j]; p < a.colStart[j+1]; p++ {
			sum += a.value[p] * y[a.rowIndex[p]]
		}
		dst[j] = sum
	}
}

// normalEquations holds the sparse Cholesky factorisation of A D Aᵀ for a
// fixed A and changing positive diagonal D, as an interior-point method
// needs once per iteration. The pattern, the fill-reducing order and the
// symbolic factorisation are computed once; each factorisation runs through
// the supernodal solver of engine/sparse.
type normalEquations struct {
	matrix *sparse.Matrix
	order  *sparse.Analysis
	chol   *sparse.Cholesky
	// Each column j of A adds d_j·contribCoef[k] at
	// matrix.Val[contribPos[k]] for k in contribStart[j]:contribStart[j+1].
	contribStart []int
	contribPos   []int32
	contribCoef  []float64
	// skipped counts the pivots replaced in the last factorisation because
	// they had cancelled to round-off (dependent rows of A).
	skipped int
}

// normalOptions are the solver's settings for the normal equations: a
// pivot that cancels to 1e-13 of its own diagonal entry belongs to a row
// dependent on others and is replaced by a huge value, so that the
// solution's component there is zero (Wright 1997, ch. 11).
var normalOptions = sparse.Options{OwnDiagonal: true, DeficientPivot: 1e64, Regularize: true, PivotTolerance: 1e-13}

// newNormalEquations analyses the pattern of A·Aᵀ. rowCoord gives a point
// for each row (nodal coordinates) from which a nested-dissection order is
// built; nil lets engine/sparse choose its order.
func newNormalEquations(a *sparseColumns, rowCoord []vec) *normalEquations {
	m := a.rows
	matrix := sparse.NewPattern(m, func(visit func(i, j int)) {
		for j := 0; j < a.cols; j++ {
			for p := a.colStart[j]; p < a.colStart[j+1]; p++ {
				for q := a.colStart[j]; q < p; q++ {
					visit(int(a.rowIndex[p]), int(a.rowIndex[q]))
				}
			}
		}
	})
	ne := &normalEquations{matrix: matrix}
	var perm []int
	if rowCoord != nil {
		adjStart, adj := matrix.Adjacency()
		perm = nestedDissection(m, adjStart, adj, rowCoord)
	}
	opt := normalOptions
	opt.Perm = perm
	ne.order = sparse.Analyse(matrix, opt)

	ne.contribStart = make([]int, a.cols+1)
	for j := 0; j < a.cols; j++ {
		for p := a.colStart[j]; p < a.colStart[j+1]; p++ {
			for q := p; q < a.colStart[j+1]; q++ {
				coef := a.value[p] * a.value[q] // N_rc, stored once for (r, c) and (c, r)
				ne.contribPos = append(ne.contribPos, int32(matrix.Find(int(a.rowIndex[p]), int(a.rowIndex[q]))))
				ne.contribCoef = append(ne.contribCoef, coef)
			}
		}
		ne.contribStart[j+1] = len(ne.contribPos)
	}
	return ne
}

// factorize forms A D Aᵀ and factorises it. Pivots that cancel to round-off
// relative to their diagonal entry belong to dependent rows; they are
// replaced by a huge value so that the corresponding solution component is
// zero (Wright 1997, ch. 11).
func (ne *normalEquations) factorize(d []float64) {
	val := ne.matrix.Val
	clear(val)
	for j := 0; j+1 < len(ne.contribStart); j++ {
		dj := d[j]
		for p := ne.contribStart[j]; p < ne.contribStart[j+1]; p++ {
			val[ne.contribPos[p]] += dj * ne.contribCoef[p]
		}
	}
	var err error
	if ne.chol == nil {
		ne.chol, err = sparse.FactorizeWith(context.Background(), ne.matrix, ne.order, normalOptions)
	} else {
		err = ne.chol.Refactorize(context.Background(), ne.matrix)
	}
	if err != nil {
		// With Regularize and no context to cancel, the factorisation
		// cannot fail.
		panic(fmt.Sprintf("layout: normal equations: %v", err))
	}
	ne.skipped = len(ne.chol.Deficient())
}

// solve overwrites r (in the original row order) with (A D Aᵀ)⁻¹ r.
func (ne *normalEquations) solve(r []float64) {
	ne.chol.Solve(r, r)
}
