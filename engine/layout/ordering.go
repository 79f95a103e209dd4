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
	perm := make([]int, 0, n)
	side := make([]int8, n)
	all := make([]int32, n)
	for i := range all {
		all[i] = int32(i)
	}
	const leafSize = 48
	var dissect func(set []int32)
	dissect = func(set []int32) {
		if len(set) <= leafSize {
			for _, v := range set {
				perm = append(perm, int(v))
			}
			return
		}
		lo, hi := coord[set[0]], coord[set[0]]
		for _, v := range set {
			c := coord[v]
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
			ci, cj := coord[set[i]][axis], coord[set[j]][axis]
			if ci != cj {
				return ci < cj
			}
			return set[i] < set[j]
		})
		half := len(set) / 2
		left, right := set[:half], set[half:]
		for _, v := range left {
			side[v] = 1
		}
		for _, v := range right {
			side[v] = 2
		}
		boundary := func(part []int32, other int8) (inner, sep []int32) {
			for _, v := range part {
				coupled := false
				for _, w := range adj[adjStart[v]:adjStart[v+1]] {
					if side[w] == other {
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
		leftInner, leftSep := boundary(left, 2)
		rightInner, rightSep := boundary(right, 1)
		for _, v := range set {
			side[v] = 0
		}
		var first, second, separator []int32
		if len(leftSep) <= len(rightSep) {
			first, second, separator = leftInner, append([]int32(nil), right...), leftSep
		} else {
			first, second, separator = append([]int32(nil), left...), rightInner, rightSep
		}
		dissect(first)
		dissect(second)
		for _, v := range separator {
			perm = append(perm, int(v))
		}
	}
	dissect(all)
	return perm
}
