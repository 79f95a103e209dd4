package sparse

// Constrained minimum degree: the variables are split into sets numbered
// 0, 1, ..., and every variable of set s is eliminated before any of set
// s+1, each set in minimum-degree order with degrees counted in the whole
// graph. Nested dissection uses it to number each piece and separator in
// the order the dissection gives them while the degrees see the rest of
// the graph, so that a piece's variables on the boundary with a separator
// (whose elimination joins the separator to the piece) go last within
// the piece. The constraint is the one of T. A. Davis's constrained
// approximate minimum degree, as described for nested dissection in
// Y. Chen, T. A. Davis, W. W. Hager and S. Rajamanickam, "Algorithm 887:
// CHOLMOD", ACM Trans. Math. Softw. 35(3), 2008, §4 (from memory); the
// code is ours, on our quotient graph (order.go).

// constrain limits elimination to the sets given: set[i] is the set of
// principal variable i, and nsets the number of sets. Only the variables of
// the current set stay in the degree buckets.
func (g *quotientGraph) constrain(set []int, nsets int) {
	g.set = set
	g.setPtr = make([]int, nsets+1)
	for _, s := range set {
		g.setPtr[s+1]++
	}
	for s := 0; s < nsets; s++ {
		g.setPtr[s+1] += g.setPtr[s]
	}
	g.setMem = make([]int, len(set))
	fill := append([]int(nil), g.setPtr[:nsets]...)
	for i, s := range set {
		g.setMem[fill[s]] = i
		fill[s]++
	}
	g.current = 0
	for i := 0; i < g.n; i++ {
		if g.state[i] == stVariable && g.weight[i] > 0 && set[i] != 0 {
			g.remove(i)
		}
	}
}

// listed reports whether principal variable i is in the degree buckets
// (every live one when unconstrained, those of the current set otherwise).
func (g *quotientGraph) listed(i int) bool {
	return g.set == nil || g.set[i] == g.current
}

// sameSet reports whether variables i and j may merge or be eliminated
// together: always when unconstrained, otherwise when they share a set.
func (g *quotientGraph) sameSet(i, j int) bool {
	return g.set == nil || g.set[i] == g.set[j]
}

// nextPivot returns a principal variable of least approximate degree in
// the current set, moving on to the next set when the current one is
// exhausted. eliminate calls it only while variables remain, so a set
// with a live variable is always found. The count of listed variables
// tells an exhausted set at once: scanning the empty buckets up to the
// largest possible degree at each of the dissection's thousands of sets
// cost more than the rest of the elimination on a large plane grid.
func (g *quotientGraph) nextPivot() int {
	for g.listedCount == 0 {
		g.current++
		g.minDegree = len(g.head) - 1
		for _, i := range g.setMem[g.setPtr[g.current]:g.setPtr[g.current+1]] {
			if g.state[i] == stVariable && g.weight[i] > 0 {
				g.insert(i)
			}
		}
	}
	for g.head[g.minDegree] < 0 {
		g.minDegree++
	}
	return g.head[g.minDegree]
}
