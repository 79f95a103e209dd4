package sparse

// compressed is the graph of a matrix's structure with its indistinguishable
// variables (identical closed neighbourhoods: the freedoms of one node,
// usually) merged into groups. Both orderings work on it, and chooseOrder
// builds it once for the two. A group's members are always numbered
// consecutively, so the elimination tree and column counts of an order
// follow from the groups' own (groupCounts).
type compressed struct {
	n                 int   // variables
	group, gptr, gmem []int // group of each variable; members of group g: gmem[gptr[g]:gptr[g+1]], ascending
	ptr, adj          []int // neighbours of group g: adj[ptr[g]:ptr[g+1]]
}

// compress returns the compressed graph of a's structure.
func compress(a *Matrix) *compressed {
	vptr, vadj := a.Adjacency()
	group, gptr, gmem := compressGraph(a.N, vptr, vadj)
	cptr, cadj := compressedAdjacency(group, gptr, gmem, vptr, vadj)
	return &compressed{n: a.N, group: group, gptr: gptr, gmem: gmem, ptr: cptr, adj: cadj}
}

// groups returns the number of groups.
func (c *compressed) groups() int { return len(c.gptr) - 1 }

// weight returns the number of variables in group g.
func (c *compressed) weight(g int) int { return c.gptr[g+1] - c.gptr[g] }

// expand returns the order of the variables, perm[new] = old, for the order
// of the groups given, each group's members consecutively and ascending.
func (c *compressed) expand(groupOrder []int) []int {
	perm := make([]int, 0, c.n)
	for _, g := range groupOrder {
		perm = append(perm, c.gmem[c.gptr[g]:c.gptr[g+1]]...)
	}
	return perm
}

// counts returns the elimination tree and column counts of P·A·Pᵀ, in the
// permuted numbering, for the order c.expand(groupOrder), as columnCounts
// does from the matrix, but from the smaller graph of the groups.
// Indistinguishable variables stay indistinguishable under elimination
// (A. George and J. W. H. Liu, "The evolution of the minimum degree
// ordering algorithm", SIAM Review 31(1), 1989, §4, from memory), so a
// group numbered consecutively is a chain in the elimination tree whose
// columns share one structure below it: its first column's count is the
// weight of the groups in its compressed column (its own included), each
// next member's one less, and its last member's parent is the first member
// of its parent group.
func (c *compressed) counts(groupOrder []int) (parent, count []int) {
	ng := c.groups()
	igroup := make([]int, ng)
	for k, g := range groupOrder {
		igroup[g] = k
	}
	weight := make([]int, ng) // by position in groupOrder
	start := make([]int, ng+1)
	for k, g := range groupOrder {
		weight[k] = c.weight(g)
		start[k+1] = start[k] + weight[k]
	}
	ptr := make([]int, ng+1)
	for g := 0; g < ng; g++ {
		k := igroup[g]
		for _, h := range c.adj[c.ptr[g]:c.ptr[g+1]] {
			if igroup[h] < k {
				ptr[k+1]++
			}
		}
	}
	for k := 0; k < ng; k++ {
		ptr[k+1] += ptr[k]
	}
	idx := make([]int, ptr[ng])
	next := append([]int(nil), ptr[:ng]...)
	for g := 0; g < ng; g++ {
		k := igroup[g]
		for _, h := range c.adj[c.ptr[g]:c.ptr[g+1]] {
			if i := igroup[h]; i < k {
				idx[next[k]] = i
				next[k]++
			}
		}
	}
	gparent, gcount := weightedCounts(ng, ptr, idx, weight)
	parent = make([]int, c.n)
	count = make([]int, c.n)
	for k := 0; k < ng; k++ {
		for t := 0; t < weight[k]; t++ {
			col := start[k] + t
			count[col] = gcount[k] - t
			parent[col] = col + 1
		}
		last := start[k+1] - 1
		parent[last] = -1
		if p := gparent[k]; p >= 0 {
			parent[last] = start[p]
		}
	}
	return parent, count
}

// nonzerosAndFlops returns nnz(L) = Σ_j c_j and Σ_j c_j² for column counts c.
func nonzerosAndFlops(count []int) (nonzeros int, flops float64) {
	squares := 0
	for _, c := range count {
		nonzeros += c
		squares += c * c
	}
	return nonzeros, float64(squares)
}
