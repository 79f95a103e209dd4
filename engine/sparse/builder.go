package sparse

import "fmt"

// Builder collects the entries of a sparse symmetric matrix as triplets and
// compresses them into a Matrix. Entries (i, j) and (j, i) name the same
// entry; duplicates are summed.
type Builder struct {
	n    int
	rows []int // the larger index of each triplet
	cols []int // the smaller index
	vals []float64
}

// NewBuilder returns a Builder for an n×n matrix with room for nnzHint
// triplets before it grows.
func NewBuilder(n, nnzHint int) *Builder {
	if n < 0 {
		panic("sparse: NewBuilder with negative size")
	}
	nnzHint = max(nnzHint, 0)
	return &Builder{
		n:    n,
		rows: make([]int, 0, nnzHint),
		cols: make([]int, 0, nnzHint),
		vals: make([]float64, 0, nnzHint),
	}
}

// Add adds v to entry (i, j), which is the same entry as (j, i). Add panics
// if i or j is outside [0, n).
func (b *Builder) Add(i, j int, v float64) {
	if uint(i) >= uint(b.n) || uint(j) >= uint(b.n) {
		panic(fmt.Sprintf("sparse: Builder.Add(%d, %d) out of range for n=%d", i, j, b.n))
	}
	if i < j {
		i, j = j, i
	}
	b.rows = append(b.rows, i)
	b.cols = append(b.cols, j)
	b.vals = append(b.vals, v)
}

// Matrix returns the compressed matrix of the entries added so far, with
// duplicates summed. Entries that were added, even with value zero, stay in
// the structure. The cost is O(n + triplets): two counting sorts, first by
// row and then stably by column, leave each column's rows sorted.
func (b *Builder) Matrix() *Matrix {
	n, nt := b.n, len(b.rows)
	// Counting sort by row.
	count := make([]int, n+1)
	for _, i := range b.rows {
		count[i+1]++
	}
	for i := 0; i < n; i++ {
		count[i+1] += count[i]
	}
	byRow := make([]int, nt)
	for t, i := range b.rows {
		byRow[count[i]] = t
		count[i]++
	}
	// Stable counting sort by column.
	colPtr := make([]int, n+1)
	for _, j := range b.cols {
		colPtr[j+1]++
	}
	for j := 0; j < n; j++ {
		colPtr[j+1] += colPtr[j]
	}
	next := make([]int, n)
	copy(next, colPtr[:n])
	order := make([]int, nt)
	for _, t := range byRow {
		j := b.cols[t]
		order[next[j]] = t
		next[j]++
	}
	// Sum duplicates, which are now adjacent.
	rowIdx := make([]int, 0, nt)
	val := make([]float64, 0, nt)
	out := make([]int, n+1)
	for j := 0; j < n; j++ {
		start := len(rowIdx)
		for p := colPtr[j]; p < colPtr[j+1]; p++ {
			t := order[p]
			i := b.rows[t]
			if len(rowIdx) > start && rowIdx[len(rowIdx)-1] == i {
				val[len(val)-1] += b.vals[t]
				continue
			}
			rowIdx = append(rowIdx, i)
			val = append(val, b.vals[t])
		}
		out[j+1] = len(rowIdx)
	}
	return &Matrix{N: n, ColPtr: out, RowIdx: rowIdx, Val: val}
}
