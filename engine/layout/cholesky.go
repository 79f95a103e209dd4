package layout

import (
	"math"
	"sort"
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
// symbolic factorisation are computed once.
type normalEquations struct {
	n        int
	perm     []int // perm[new] = old row
	inverse  []int // inverse[old] = new row
	upperCol []int // upper triangle of the permuted A D Aᵀ, by columns
	upperRow []int32
	upperVal []float64
	// Each column of A adds d_j·a_p·a_q at upperVal[contribPos[k]] for its
	// entries in contribStart[j]:contribStart[j+1].
	contribStart []int
	contribPos   []int32
	contribCoef  []float64

	parent   []int
	lowerCol []int // L by columns, the diagonal first in each column
	lowerRow []int32
	lowerVal []float64

	work, scratch []float64
	mark          []int
	stack, path   []int
	next          []int // fill position of each column of L during factorisation
	// rowPattern[rowStart[k]:rowStart[k+1]] is the pattern of row k of L
	// without the diagonal, in elimination-tree order.
	rowStart   []int
	rowPattern []int32
	// skipped counts the pivots replaced in the last factorisation because
	// they had cancelled to round-off (dependent rows of A).
	skipped int
}

// newNormalEquations analyses the pattern of A·Aᵀ. rowCoord gives a point
// for each row (nodal coordinates) from which a nested-dissection order is
// built; nil keeps the natural order.
func newNormalEquations(a *sparseColumns, rowCoord [][2]float64) *normalEquations {
	m := a.rows
	// Every pair of entries in a column couples two rows.
	type pair struct{ col, row int32 }
	var pairs []pair
	for j := 0; j < a.cols; j++ {
		for p := a.colStart[j]; p < a.colStart[j+1]; p++ {
			for q := a.colStart[j]; q < a.colStart[j+1]; q++ {
				r, c := a.rowIndex[p], a.rowIndex[q]
				if r != c {
					pairs = append(pairs, pair{c, r})
				}
			}
		}
	}
	sort.Slice(pairs, func(i, j int) bool {
		if pairs[i].col != pairs[j].col {
			return pairs[i].col < pairs[j].col
		}
		return pairs[i].row < pairs[j].row
	})
	adjStart := make([]int, m+1)
	adj := make([]int32, 0, len(pairs))
	for i, p := range pairs {
		if i > 0 && p == pairs[i-1] {
			continue
		}
		adj = append(adj, p.row)
		adjStart[p.col+1]++
	}
	for i := 0; i < m; i++ {
		adjStart[i+1] += adjStart[i]
	}

	ne := &normalEquations{n: m}
	if rowCoord != nil {
		ne.perm = nestedDissection(m, adjStart, adj, rowCoord)
	} else {
		ne.perm = make([]int, m)
		for i := range ne.perm {
			ne.perm[i] = i
		}
	}
	ne.inverse = make([]int, m)
	for k, old := range ne.perm {
		ne.inverse[old] = k
	}

	// Upper triangle of the permuted matrix: column k holds rows ≤ k.
	counts := make([]int, m+1)
	for old := 0; old < m; old++ {
		k := ne.inverse[old]
		counts[k+1]++ // diagonal
		for _, nb := range adj[adjStart[old]:adjStart[old+1]] {
			if ne.inverse[nb] < k {
				counts[k+1]++
			}
		}
	}
	for k := 0; k < m; k++ {
		counts[k+1] += counts[k]
	}
	ne.upperCol = counts
	ne.upperRow = make([]int32, counts[m])
	fill := append([]int(nil), counts[:m]...)
	for old := 0; old < m; old++ {
		k := ne.inverse[old]
		ne.upperRow[fill[k]] = int32(k)
		fill[k]++
		for _, nb := range adj[adjStart[old]:adjStart[old+1]] {
			if i := ne.inverse[nb]; i < k {
				ne.upperRow[fill[k]] = int32(i)
				fill[k]++
			}
		}
	}
	for k := 0; k < m; k++ {
		rows := ne.upperRow[counts[k]:counts[k+1]]
		sort.Slice(rows, func(i, j int) bool { return rows[i] < rows[j] })
	}
	ne.upperVal = make([]float64, counts[m])

	position := func(i, k int) int32 {
		rows := ne.upperRow[counts[k]:counts[k+1]]
		at := sort.Search(len(rows), func(t int) bool { return int(rows[t]) >= i })
		return int32(counts[k] + at)
	}
	ne.contribStart = make([]int, a.cols+1)
	for j := 0; j < a.cols; j++ {
		for p := a.colStart[j]; p < a.colStart[j+1]; p++ {
			for q := p; q < a.colStart[j+1]; q++ {
				r, c := ne.inverse[a.rowIndex[p]], ne.inverse[a.rowIndex[q]]
				if r > c {
					r, c = c, r
				}
				coef := a.value[p] * a.value[q]
				ne.contribPos = append(ne.contribPos, position(r, c))
				ne.contribCoef = append(ne.contribCoef, coef)
			}
		}
		ne.contribStart[j+1] = len(ne.contribPos)
	}
	ne.symbolic()
	return ne
}

// symbolic computes the elimination tree and the pattern sizes of L.
func (ne *normalEquations) symbolic() {
	n := ne.n
	ne.parent = make([]int, n)
	ancestor := make([]int, n)
	for k := 0; k < n; k++ {
		ne.parent[k] = -1
		ancestor[k] = -1
		for p := ne.upperCol[k]; p < ne.upperCol[k+1]; p++ {
			i := int(ne.upperRow[p])
			for i != -1 && i < k {
				next := ancestor[i]
				ancestor[i] = k
				if next == -1 {
					ne.parent[i] = k
				}
				i = next
			}
		}
	}
	ne.mark = make([]int, n)
	ne.stack = make([]int, n)
	ne.path = make([]int, n)
	for i := range ne.mark {
		ne.mark[i] = -1
	}
	colCount := make([]int, n+1)
	ne.rowStart = make([]int, n+1)
	for k := 0; k < n; k++ {
		pattern := ne.reach(k)
		for _, i := range pattern {
			colCount[i+1]++
			ne.rowPattern = append(ne.rowPattern, int32(i))
		}
		ne.rowStart[k+1] = len(ne.rowPattern)
		colCount[k+1]++
	}
	for k := 0; k < n; k++ {
		colCount[k+1] += colCount[k]
	}
	ne.lowerCol = colCount
	ne.lowerRow = make([]int32, colCount[n])
	ne.lowerVal = make([]float64, colCount[n])
	ne.work = make([]float64, n)
	ne.scratch = make([]float64, n)
	ne.next = make([]int, n+1)
}

// reach returns the pattern of row k of L (excluding the diagonal) in an
// order where every row comes before its ancestors in the elimination tree.
func (ne *normalEquations) reach(k int) []int {
	top := ne.n
	ne.mark[k] = k
	for p := ne.upperCol[k]; p < ne.upperCol[k+1]; p++ {
		i := int(ne.upperRow[p])
		if i >= k {
			continue
		}
		length := 0
		for ; ne.mark[i] != k; i = ne.parent[i] {
			ne.path[length] = i
			length++
			ne.mark[i] = k
		}
		for length > 0 {
			top--
			length--
			ne.stack[top] = ne.path[length]
		}
	}
	return ne.stack[top:]
}

// factorize forms A D Aᵀ and factorises it. Pivots that cancel to round-off
// relative to their diagonal entry belong to dependent rows; they are
// replaced by a huge value so that the corresponding solution component is
// zero (Wright 1997, ch. 11).
func (ne *normalEquations) factorize(d []float64) {
	for i := range ne.upperVal {
		ne.upperVal[i] = 0
	}
	for j := 0; j+1 < len(ne.contribStart); j++ {
		dj := d[j]
		for p := ne.contribStart[j]; p < ne.contribStart[j+1]; p++ {
			ne.upperVal[ne.contribPos[p]] += dj * ne.contribCoef[p]
		}
	}
	n := ne.n
	next := ne.next
	copy(next, ne.lowerCol)
	x := ne.work
	ne.skipped = 0
	for k := 0; k < n; k++ {
		pattern := ne.rowPattern[ne.rowStart[k]:ne.rowStart[k+1]]
		for p := ne.upperCol[k]; p < ne.upperCol[k+1]; p++ {
			x[ne.upperRow[p]] = ne.upperVal[p]
		}
		diagonal := x[k]
		dk := diagonal
		x[k] = 0
		for _, i32 := range pattern {
			i := int(i32)
			lki := x[i] / ne.lowerVal[ne.lowerCol[i]]
			x[i] = 0
			rows := ne.lowerRow[ne.lowerCol[i]+1 : next[i]]
			values := ne.lowerVal[ne.lowerCol[i]+1 : next[i]]
			for t, r := range rows {
				x[r] -= values[t] * lki
			}
			dk -= lki * lki
			p := next[i]
			next[i]++
			ne.lowerRow[p] = int32(k)
			ne.lowerVal[p] = lki
		}
		p := next[k]
		next[k]++
		ne.lowerRow[p] = int32(k)
		if !(dk > 1e-13*math.Abs(diagonal)) || !(dk > 1e-300) {
			ne.lowerVal[p] = 1e64
			ne.skipped++
		} else {
			ne.lowerVal[p] = math.Sqrt(dk)
		}
	}
}

// solve overwrites r (in the original row order) with (A D Aᵀ)⁻¹ r.
func (ne *normalEquations) solve(r []float64) {
	z := ne.scratch
	for old, v := range r {
		z[ne.inverse[old]] = v
	}
	for j := 0; j < ne.n; j++ {
		zj := z[j] / ne.lowerVal[ne.lowerCol[j]]
		z[j] = zj
		for p := ne.lowerCol[j] + 1; p < ne.lowerCol[j+1]; p++ {
			z[ne.lowerRow[p]] -= ne.lowerVal[p] * zj
		}
	}
	for j := ne.n - 1; j >= 0; j-- {
		sum := z[j]
		for p := ne.lowerCol[j] + 1; p < ne.lowerCol[j+1]; p++ {
			sum -= ne.lowerVal[p] * z[ne.lowerRow[p]]
		}
		z[j] = sum / ne.lowerVal[ne.lowerCol[j]]
	}
	for old := range r {
		r[old] = z[ne.inverse[old]]
	}
}
