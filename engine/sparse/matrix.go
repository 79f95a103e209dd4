package sparse

import (
	"fmt"
	"sort"
)

// Matrix is a sparse symmetric n×n matrix holding its lower triangle,
// diagonal included, compressed by column: the entries of column j are
// RowIdx[ColPtr[j]:ColPtr[j+1]] (row indices i ≥ j, sorted ascending, no
// duplicates) with values Val at the same positions. len(ColPtr) is N+1.
//
// The upper triangle is implied by symmetry: entry (i, j) with i < j is
// stored at (j, i).
type Matrix struct {
	N      int
	ColPtr []int
	RowIdx []int
	Val    []float64
}

// Nonzeros returns the number of stored entries (lower triangle and
// diagonal).
func (a *Matrix) Nonzeros() int { return a.ColPtr[a.N] }

// MulVec computes dst = A·x using the symmetric storage. dst and x must have
// length N and must not overlap; MulVec panics otherwise.
func (a *Matrix) MulVec(dst, x []float64) {
	if len(dst) != a.N || len(x) != a.N {
		panic("sparse: MulVec length mismatch")
	}
	if a.N > 0 && &dst[0] == &x[0] {
		panic("sparse: MulVec dst aliases x")
	}
	clear(dst)
	for j := 0; j < a.N; j++ {
		xj := x[j]
		sum := 0.0
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			i := a.RowIdx[p]
			v := a.Val[p]
			if i == j {
				sum += v * xj
				continue
			}
			dst[i] += v * xj
			sum += v * x[i]
		}
		dst[j] += sum
	}
}

// Find returns the position in RowIdx and Val of entry (i, j), or -1 when the
// entry is not stored. (i, j) and (j, i) name the same entry. Find costs a
// binary search in one column, so an assembler can add element blocks straight
// into Val: a.Val[a.Find(i, j)] += k.
func (a *Matrix) Find(i, j int) int {
	if i < 0 || j < 0 || i >= a.N || j >= a.N {
		panic(fmt.Sprintf("sparse: Find(%d, %d) out of range for N=%d", i, j, a.N))
	}
	if i < j {
		i, j = j, i
	}
	lo, hi := a.ColPtr[j], a.ColPtr[j+1]
	rows := a.RowIdx[lo:hi]
	k := sort.SearchInts(rows, i)
	if k < len(rows) && rows[k] == i {
		return lo + k
	}
	return -1
}

// NormInf returns the infinity norm (largest absolute row sum) of the full
// symmetric matrix, which equals its 1-norm.
func (a *Matrix) NormInf() float64 {
	sums := make([]float64, a.N)
	for j := 0; j < a.N; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			i := a.RowIdx[p]
			v := abs(a.Val[p])
			sums[j] += v
			if i != j {
				sums[i] += v
			}
		}
	}
	m := 0.0
	for _, s := range sums {
		m = max(m, s)
	}
	return m
}

// check panics unless a satisfies the storage contract of Matrix.
func (a *Matrix) check() {
	if a.N < 0 || len(a.ColPtr) != a.N+1 || a.ColPtr[0] != 0 {
		panic("sparse: malformed Matrix column pointers")
	}
	nnz := a.ColPtr[a.N]
	if len(a.RowIdx) < nnz || len(a.Val) < nnz {
		panic("sparse: Matrix RowIdx or Val shorter than ColPtr[N]")
	}
	for j := 0; j < a.N; j++ {
		lo, hi := a.ColPtr[j], a.ColPtr[j+1]
		if hi < lo {
			panic("sparse: Matrix column pointers decrease")
		}
		prev := j - 1
		for p := lo; p < hi; p++ {
			i := a.RowIdx[p]
			if i <= prev || i >= a.N {
				panic(fmt.Sprintf("sparse: Matrix column %d: row %d not in lower triangle, unsorted or duplicated", j, i))
			}
			prev = i
		}
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// NewPattern returns a matrix whose structure holds the full diagonal and
// every pair (i, j) that adjacency passes to visit, with all values zero.
// adjacency is called once; it may visit a pair in either order and more than
// once. Use it with Find to assemble repeatedly into a fixed pattern.
func NewPattern(n int, adjacency func(visit func(i, j int))) *Matrix {
	b := NewBuilder(n, 2*n)
	for i := 0; i < n; i++ {
		b.Add(i, i, 0)
	}
	adjacency(func(i, j int) { b.Add(i, j, 0) })
	return b.Matrix()
}
