package layout

import "sort"

// nestedDissection orders the rows of a symmetric pattern (adjacency lists
// adj[adjStart[i]:adjStart[i+1]], no diagonal) for a sparse Cholesky
// factorisation by recursive coordinate bisection: each set of rows is split
// at the median of its longer extent, the rows of the smaller side that are
// coupled to the other side form the separator, the two remaining parts are
// ordered first and the separator last, so no fill crosses between parts
// (George, "Nested dissection of a regular finite element mesh", SIAM J.
// Numer. Anal. 10, 1973). It returns perm with perm[new] = old.
func nestedDissection(n int, adjStart, adj []int, coord []vec) []int {
	nd := &dissection{adjStart: adjStart, adj: adj, coord: coord, perm: make([]int, 0, n), side: make([]int8, n)}
	all := make([]int32, n)
	for i := range all {
		all[i] = int32(i)
	}
	nd.dissect(all)
	return nd.perm
}

// dissection is the state of nestedDissection.
type dissection struct {
	adjStart, adj []int
	coord         []vec
	perm          []int
	side          []int8 // 1 or 2 while a set is split, else 0
}

// leafSize is the set size below which rows are ordered as they come.
const leafSize = 48

// dissect orders set: its two parts first, then the separator between them.
func (nd *dissection) dissect(set []int32) {
	if len(set) <= leafSize {
		for _, v := range set {
			nd.perm = append(nd.perm, int(v))
		}
		return
	}
	first, second, separator := nd.split(set)
	nd.dissect(first)
	nd.dissect(second)
	for _, v := range separator {
		nd.perm = append(nd.perm, int(v))
	}
}

// split halves set at the median of its longest extent and takes as
// separator the rows of the smaller boundary: those of one half coupled to
// the other.
func (nd *dissection) split(set []int32) (first, second, separator []int32) {
	lo, hi := nd.coord[set[0]], nd.coord[set[0]]
	for _, v := range set {
		c := nd.coord[v]
		for a := 0; a < 3; a++ {
			lo[a] = min(lo[a], c[a])
			hi[a] = max(hi[a], c[a])
		}
	}
	axis := 0
	for a := 1; a < 3; a++ {
		if hi[a]-lo[a] > hi[axis]-lo[axis] {
			axis = a
		}
	}
	sort.Slice(set, func(i, j int) bool {
		ci, cj := nd.coord[set[i]][axis], nd.coord[set[j]][axis]
		if ci != cj {
			return ci < cj
		}
		return set[i] < set[j]
	})
	half := len(set) / 2
	left, right := set[:half], set[half:]
	for _, v := range left {
		nd.side[v] = 1
	}
	for _, v := range right {
		nd.side[v] = 2
	}
	leftInner, leftSep := nd.boundary(left, 2)
	rightInner, rightSep := nd.boundary(right, 1)
	for _, v := range set {
		nd.side[v] = 0
	}
	if len(leftSep) <= len(rightSep) {
		return leftInner, append([]int32(nil), right...), leftSep
	}
	return append([]int32(nil), left...), rightInner, rightSep
}

// boundary splits part into the rows coupled to the side other and the
// rest.
func (nd *dissection) boundary(part []int32, other int8) (inner, sep []int32) {
	for _, v := range part {
		coupled := false
		for _, w := range nd.adj[nd.adjStart[v]:nd.adjStart[v+1]] {
			if nd.side[w] == other {
				coupled = true
				break
			}
		}
		if coupled {
			sep = append(sep, v)
		} else {
			inner = append(inner, v)
		}
	}
	return inner, sep
}
