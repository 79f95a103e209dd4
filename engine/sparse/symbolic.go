package sparse

import (
	"fmt"
	"slices"
)

// symbolic is the structure of a supernodal Cholesky factor L of P·A·Pᵀ:
// the permutation, the supernodes (runs of consecutive columns sharing one
// row structure below their diagonal block) and their elimination tree.
type symbolic struct {
	n     int
	perm  []int // perm[new] = old, fill-reducing order followed by the etree postorder
	iperm []int // iperm[old] = new

	// The lower triangle of P·A·Pᵀ by column: rows lowRow[lowPtr[j]:lowPtr[j+1]]
	// (unsorted) with values a.Val[lowSrc[...]]; lowRow and lowSrc only
	// while analysing, lowPtr kept for assembling A into the factor.
	lowPtr, lowRow, lowSrc []int
	// The entries of A in supernode s are a.Val[aSrc[t]] for t in
	// lowPtr[superFirst[s]] .. lowPtr[superFirst[s+1]]-1, going to
	// aDst[t] within s's block: each supernode assembles its own columns of
	// A, on the worker that factorises it.
	aSrc, aDst []int

	nsuper      int
	superFirst  []int // supernode s holds columns superFirst[s] .. superFirst[s+1]-1
	superParent []int // parent supernode, -1 for a root
	childPtr    []int // children of s: childList[childPtr[s]:childPtr[s+1]], ascending
	childList   []int
	rowPtr      []int // rows below the diagonal block of s: rows[rowPtr[s]:rowPtr[s+1]], ascending
	rows        []int
	valPtr      []int // s's block of L: ns×(ns+rs) row-major at val[valPtr[s]:valPtr[s+1]]
	cost        []float64
	nnzL        int // entries of L, column counts summed
	nnzStored   int // entries of L as stored, with the explicit zeros of merged supernodes
	flops       float64
}

// validPerm panics unless perm is a permutation of 0..n-1.
func validPerm(perm []int, n int) {
	if len(perm) != n {
		panic(fmt.Sprintf("sparse: permutation has length %d, want %d", len(perm), n))
	}
	seen := make([]bool, n)
	for _, p := range perm {
		if p < 0 || p >= n || seen[p] {
			panic("sparse: Options.Perm is not a permutation")
		}
		seen[p] = true
	}
}

// upperLists returns, for each column k of P·A·Pᵀ (iperm[old] = new), the
// rows i < k of its strict upper part, i.e. the strict lower part of row k.
func upperLists(a *Matrix, iperm []int) (ptr, idx []int) {
	n := a.N
	ptr = make([]int, n+1)
	for j := 0; j < n; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			i := a.RowIdx[p]
			if i != j {
				ptr[max(iperm[i], iperm[j])+1]++
			}
		}
	}
	for k := 0; k < n; k++ {
		ptr[k+1] += ptr[k]
	}
	idx = make([]int, ptr[n])
	next := slices.Clone(ptr[:n])
	for j := 0; j < n; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			i := a.RowIdx[p]
			if i != j {
				ni, nj := iperm[i], iperm[j]
				hi, lo := max(ni, nj), min(ni, nj)
				idx[next[hi]] = lo
				next[hi]++
			}
		}
	}
	return ptr, idx
}

// eliminationTree returns the parent of each column in the elimination tree
// of the matrix whose strict lower rows are given by upperLists, using Liu's
// algorithm with path compression through virtual ancestors (J. W. H. Liu,
// "The role of elimination trees in sparse factorization", SIAM J. Matrix
// Anal. Appl. 11(1), 1990).
func eliminationTree(n int, ptr, idx []int) []int {
	parent := make([]int, n)
	ancestor := make([]int, n)
	for k := 0; k < n; k++ {
		parent[k], ancestor[k] = -1, -1
		for _, i := range idx[ptr[k]:ptr[k+1]] {
			for r := i; r != -1 && r < k; {
				next := ancestor[r]
				ancestor[r] = k
				if next == -1 {
					parent[r] = k
				}
				r = next
			}
		}
	}
	return parent
}

// postorder returns a depth-first postorder of the forest given by parent,
// visiting children in ascending order: post[new] = old.
func postorder(parent []int) []int {
	n := len(parent)
	head := make([]int, n)
	next := make([]int, n)
	for i := range head {
		head[i] = -1
	}
	// Push in descending order so each child list ends up ascending.
	for j := n - 1; j >= 0; j-- {
		if p := parent[j]; p >= 0 {
			next[j] = head[p]
			head[p] = j
		}
	}
	post := make([]int, 0, n)
	stack := make([]int, 0, 64)
	for root := 0; root < n; root++ {
		if parent[root] != -1 {
			continue
		}
		stack = append(stack, root)
		for len(stack) > 0 {
			top := stack[len(stack)-1]
			if c := head[top]; c >= 0 {
				head[top] = next[c]
				stack = append(stack, c)
				continue
			}
			stack = stack[:len(stack)-1]
			post = append(post, top)
		}
	}
	return post
}

// analyse computes the symbolic factorisation of P·A·Pᵀ for the given
// fill-reducing order perm0 (perm0[new] = old).
func analyse(a *Matrix, perm0 []int) *symbolic {
	parent0, count0 := countsFor(a, perm0)
	return analyseCounted(a, perm0, parent0, count0)
}

// analyseCounted is analyse given the elimination tree and the column
// counts of P·A·Pᵀ in the numbering of perm0.
func analyseCounted(a *Matrix, perm0, parent0, count0 []int) *symbolic {
	n := a.N
	iperm := make([]int, n)

	// Renumber by the postorder: it leaves the fill unchanged and makes every
	// subtree a contiguous range of columns.
	post := postorder(parent0)
	ipost := make([]int, n)
	for k, p := range post {
		ipost[p] = k
	}
	perm := make([]int, n)
	parent := make([]int, n)
	colCount := make([]int, n)
	for k, p := range post {
		perm[k] = perm0[p]
		parent[k] = -1
		if q := parent0[p]; q >= 0 {
			parent[k] = ipost[q]
		}
		colCount[k] = count0[p]
	}
	for k, old := range perm {
		iperm[old] = k
	}

	sym := &symbolic{n: n, perm: perm, iperm: iperm}
	for _, c := range colCount {
		sym.nnzL += c
	}
	sym.buildLower(a)
	sym.findSupernodes(parent, colCount)
	sym.buildStructure(parent)
	sym.buildScatter()
	return sym
}

// buildScatter computes where each stored entry of A lands in its
// supernode's block and drops the rows of the permuted copy of A.
func (sym *symbolic) buildScatter() {
	sym.aSrc = sym.lowSrc
	sym.aDst = make([]int, len(sym.lowSrc))
	local := make([]int, sym.n)
	for s := 0; s < sym.nsuper; s++ {
		first := sym.superFirst[s]
		ns := sym.superFirst[s+1] - first
		rows := sym.rows[sym.rowPtr[s]:sym.rowPtr[s+1]]
		m := ns + len(rows)
		for k := 0; k < ns; k++ {
			local[first+k] = k
		}
		for t, r := range rows {
			local[r] = ns + t
		}
		for k := 0; k < ns; k++ {
			j := first + k
			for q := sym.lowPtr[j]; q < sym.lowPtr[j+1]; q++ {
				sym.aDst[q] = k*m + local[sym.lowRow[q]]
			}
		}
	}
	sym.lowRow, sym.lowSrc = nil, nil
}

// buildLower stores the lower triangle of P·A·Pᵀ by column with pointers
// back into a.Val, for assembling values into the factor.
func (sym *symbolic) buildLower(a *Matrix) {
	n := a.N
	iperm := sym.iperm
	ptr := make([]int, n+1)
	for j := 0; j < n; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			ptr[min(iperm[a.RowIdx[p]], iperm[j])+1]++
		}
	}
	for k := 0; k < n; k++ {
		ptr[k+1] += ptr[k]
	}
	row := make([]int, ptr[n])
	src := make([]int, ptr[n])
	next := slices.Clone(ptr[:n])
	for j := 0; j < n; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			ni, nj := iperm[a.RowIdx[p]], iperm[j]
			c := min(ni, nj)
			row[next[c]] = max(ni, nj)
			src[next[c]] = p
			next[c]++
		}
	}
	sym.lowPtr, sym.lowRow, sym.lowSrc = ptr, row, src
}

// findSupernodes groups columns into fundamental supernodes (a column joins
// its predecessor when it is that column's only child in the elimination
// tree and its count is one less) and then merges small supernodes into
// their parents when the explicit zeros this adds stay few (relaxed
// amalgamation), which buys dense-kernel speed for a little extra storage.
func (sym *symbolic) findSupernodes(parent, colCount []int) {
	n := sym.n
	children := make([]int, n)
	for _, p := range parent {
		if p >= 0 {
			children[p]++
		}
	}
	var first []int
	for j := 0; j < n; j++ {
		if j == 0 || parent[j-1] != j || children[j] != 1 || colCount[j-1] != colCount[j]+1 {
			first = append(first, j)
		}
	}
	nf := len(first)
	first = append(first, n)
	colSuper := make([]int, n)
	for s := 0; s < nf; s++ {
		for j := first[s]; j < first[s+1]; j++ {
			colSuper[j] = s
		}
	}
	ncols := make([]int, nf)
	below := make([]int, nf)
	zeros := make([]int, nf)
	sparent := make([]int, nf)
	rep := make([]int, nf)
	for s := 0; s < nf; s++ {
		ncols[s] = first[s+1] - first[s]
		below[s] = colCount[first[s]] - ncols[s]
		last := first[s+1] - 1
		sparent[s] = -1
		if p := parent[last]; p >= 0 {
			sparent[s] = colSuper[p]
		}
		rep[s] = s
	}
	for s := nf - 1; s >= 0; s-- {
		if rep[s] != s {
			continue
		}
		// The supernode just before s in postorder is its last child; merging
		// keeps the columns contiguous.
		for c := s - 1; c >= 0; c-- {
			if p := sparent[c]; p < 0 || rep[p] != s {
				break
			}
			nc, ns := ncols[c], ncols[s]
			z := zeros[c] + zeros[s] + nc*(ns+below[s]-below[c])
			nt := nc + ns
			entries := nt*(nt+1)/2 + nt*below[s]
			if !relaxedMerge(nt, z, entries) {
				break
			}
			ncols[s] = nt
			zeros[s] = z
			rep[c] = s
		}
	}
	sym.superFirst = sym.superFirst[:0]
	newIndex := make([]int, nf)
	for s := 0; s < nf; s++ {
		if rep[s] == s {
			newIndex[s] = len(sym.superFirst)
			sym.superFirst = append(sym.superFirst, first[s+1]-ncols[s])
		}
	}
	sym.nsuper = len(sym.superFirst)
	sym.superFirst = append(sym.superFirst, n)
	sym.superParent = make([]int, sym.nsuper)
	for s := 0; s < sym.nsuper; s++ {
		last := sym.superFirst[s+1] - 1
		sym.superParent[s] = -1
		if p := parent[last]; p >= 0 {
			sym.superParent[s] = newIndex[rep[colSuper[p]]]
		}
	}
}

// relaxedMerge decides whether a merged supernode of nt columns holding
// zeros explicit zeros among entries stored entries is worth it: tiny
// supernodes always (a call into a dense kernel costs more than the zeros),
// larger ones only with a small share of zeros. The thresholds are common
// practice, tuned on the benchmarks of this package.
func relaxedMerge(nt, zeros, entries int) bool {
	share := float64(zeros) / float64(entries)
	switch {
	case nt <= 4:
		return true
	case nt <= 16:
		return share < 0.5
	case nt <= 48:
		return share < 0.1
	}
	return share < 0.05
}

// buildStructure computes the children lists, the row structure of every
// supernode (the union of its columns' rows in A and its children's rows
// below it), the storage offsets and the work per supernode.
func (sym *symbolic) buildStructure(parent []int) {
	ns := sym.nsuper
	sym.childPtr = make([]int, ns+1)
	for _, p := range sym.superParent {
		if p >= 0 {
			sym.childPtr[p+1]++
		}
	}
	for s := 0; s < ns; s++ {
		sym.childPtr[s+1] += sym.childPtr[s]
	}
	sym.childList = make([]int, sym.childPtr[ns])
	next := slices.Clone(sym.childPtr[:ns])
	for c, p := range sym.superParent {
		if p >= 0 {
			sym.childList[next[p]] = c
			next[p]++
		}
	}

	mark := make([]int, sym.n)
	for i := range mark {
		mark[i] = -1
	}
	sym.rowPtr = make([]int, ns+1)
	sym.valPtr = make([]int, ns+1)
	sym.cost = make([]float64, ns)
	sym.rows = make([]int, 0, 4*sym.n)
	for s := 0; s < ns; s++ {
		f, l := sym.superFirst[s], sym.superFirst[s+1]
		start := len(sym.rows)
		for j := f; j < l; j++ {
			for _, i := range sym.lowRow[sym.lowPtr[j]:sym.lowPtr[j+1]] {
				if i >= l && mark[i] != s {
					mark[i] = s
					sym.rows = append(sym.rows, i)
				}
			}
		}
		for _, c := range sym.childList[sym.childPtr[s]:sym.childPtr[s+1]] {
			for _, i := range sym.rows[sym.rowPtr[c]:sym.rowPtr[c+1]] {
				if i >= l && mark[i] != s {
					mark[i] = s
					sym.rows = append(sym.rows, i)
				}
			}
		}
		slices.Sort(sym.rows[start:])
		sym.rowPtr[s+1] = len(sym.rows)
		nc := l - f
		rs := len(sym.rows) - start
		sym.valPtr[s+1] = sym.valPtr[s] + nc*(nc+rs)
		sym.nnzStored += nc*(nc+1)/2 + nc*rs
		fn, fr := float64(nc), float64(rs)
		flops := fn*fn*fn/3 + fr*fn*fn + fr*fr*fn
		sym.flops += flops
		sym.cost[s] = flops + fr*fr + fn*(fn+fr)
	}
}

// columnCounts returns the elimination tree and the column counts of the
// Cholesky factor of P·A·Pᵀ (iperm[old] = new) in the permuted numbering,
// in time nearly linear in the entries of A, by the skeleton-matrix method
// of J. R. Gilbert, E. G. Ng and B. W. Peyton ("An efficient algorithm to
// compute row and column counts for sparse Cholesky factorization", SIAM
// J. Matrix Anal. Appl. 15(4), 1994). Row i of L is the union of the tree
// paths from the columns j < i with A(i,j) ≠ 0 up to i; walking the columns
// in postorder, an entry A(i,j) adds a new path only when j is a leaf of
// row i's subtree (its first descendant comes after the previous leaf's),
// and the overlap with the previous leaf's path ends at their least common
// ancestor, found by path-compressed union–find. Adding +1 at each leaf and
// −1 at each such ancestor and at each parent, then summing the tree from
// the leaves up, leaves every column's count.
func columnCounts(a *Matrix, iperm []int) (parent, count []int) {
	ptr, idx := upperLists(a, iperm)
	return weightedCounts(a.N, ptr, idx, nil)
}

// weightedCounts is columnCounts given the strict lower part of each row k
// of the permuted matrix, idx[ptr[k]:ptr[k+1]] (as upperLists returns it).
// With weights, row i stands for weight[i] rows and a count sums the
// weights of its column's rows (compressed.counts); nil weights are all 1.
func weightedCounts(n int, ptr, idx, weight []int) (parent, count []int) {
	w := func(i int) int {
		if weight == nil {
			return 1
		}
		return weight[i]
	}
	parent = eliminationTree(n, ptr, idx)
	post := postorder(parent)

	// Rows i > j of each column j: the transpose of the row lists.
	lptr := make([]int, n+1)
	for _, i := range idx {
		lptr[i+1]++
	}
	for j := 0; j < n; j++ {
		lptr[j+1] += lptr[j]
	}
	lrow := make([]int, len(idx))
	next := slices.Clone(lptr[:n])
	for k := 0; k < n; k++ {
		for _, i := range idx[ptr[k]:ptr[k+1]] {
			lrow[next[i]] = k
			next[i]++
		}
	}

	count = make([]int, n)     // the deltas until the final sum
	first := make([]int, n)    // postorder index of the first descendant
	maxFirst := make([]int, n) // largest first[j] over the leaves j met in row i's subtree
	prevLeaf := make([]int, n) // previous leaf met in row i's subtree
	ancestor := make([]int, n) // union–find over the finished columns
	for k := range n {
		first[k], maxFirst[k], prevLeaf[k], ancestor[k] = -1, -1, -1, k
	}
	for k, j := range post {
		if first[j] == -1 {
			count[j] = w(j) // a leaf of the elimination tree
		}
		for ; j != -1 && first[j] == -1; j = parent[j] {
			first[j] = k
		}
	}
	for _, j := range post {
		if p := parent[j]; p != -1 {
			count[p] -= w(j)
		}
		for _, i := range lrow[lptr[j]:lptr[j+1]] {
			if first[j] <= maxFirst[i] {
				continue // j is not a leaf of row i's subtree
			}
			maxFirst[i] = first[j]
			prev := prevLeaf[i]
			prevLeaf[i] = j
			count[j] += w(i)
			if prev == -1 {
				continue
			}
			q := prev
			for q != ancestor[q] {
				q = ancestor[q]
			}
			for v := prev; v != q; {
				up := ancestor[v]
				ancestor[v] = q
				v = up
			}
			count[q] -= w(i)
		}
		if p := parent[j]; p != -1 {
			ancestor[j] = p
		}
	}
	for j := 0; j < n; j++ {
		if p := parent[j]; p != -1 {
			count[p] += count[j]
		}
	}
	return parent, count
}

// columnCountsByRows is the direct method, walking every row subtree of L
// once (time proportional to the entries of L): the reference for
// columnCounts in the tests.
func columnCountsByRows(a *Matrix, iperm []int) (parent, count []int) {
	n := a.N
	ptr, idx := upperLists(a, iperm)
	parent = eliminationTree(n, ptr, idx)
	count = make([]int, n)
	mark := make([]int, n)
	for k := 0; k < n; k++ {
		mark[k] = k
		count[k]++
		for _, i := range idx[ptr[k]:ptr[k+1]] {
			for j := i; mark[j] != k; j = parent[j] {
				count[j]++
				mark[j] = k
			}
		}
	}
	return parent, count
}

// factorFlops returns the operation count of the Cholesky factorisation of
// P·A·Pᵀ for the order perm (perm[new] = old), Σ_j c_j², where c_j is the
// count of column j: the measure by which orders are compared.
func factorFlops(a *Matrix, perm []int) float64 {
	_, count := countsFor(a, perm)
	return countFlops(count)
}

// countFlops returns Σ_j c_j² for the column counts c.
func countFlops(count []int) float64 {
	f := 0.0
	for _, c := range count {
		f += float64(c) * float64(c)
	}
	return f
}
