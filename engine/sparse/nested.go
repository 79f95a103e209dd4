package sparse

import "slices"

// nestedLeaf is the size, in compressed nodes, below which nested
// dissection stops splitting a piece.
const nestedLeaf = 200

// The separator is sought among the levels that leave between
// separatorLow and separatorHigh percent of the piece before them. The
// band was chosen by measurement (common practice: a balance constraint
// on the parts; its width here is ours): on the plane braced grid of
// 180,600 equations 35–65 gives 5% less fill than 30–70, and 40–60 or
// narrower loses on the double-layer space grids.
const (
	separatorLow  = 35
	separatorHigh = 65
)

// OrderNested returns a fill-reducing permutation of the symmetric matrix a,
// perm[new] = old, by nested dissection with level-structure separators
// (A. George and J. W. H. Liu, "An automatic nested dissection algorithm for
// irregular finite element problems", SIAM J. Numer. Anal. 15(5), 1978): the
// graph, with indistinguishable variables merged, is split by a level of a
// breadth-first level structure rooted at a pseudo-peripheral node; both
// parts are numbered before the separator, recursively, and small pieces are
// numbered by constrained minimum degree (constrained.go): every piece and
// separator in the order the dissection gives them, each in minimum-degree
// order with the degrees counted in the whole graph. On solid 3D meshes it
// gives far less fill than minimum degree alone; Factorize tries both on
// large matrices and keeps the one with fewer nonzeros in L.
func OrderNested(a *Matrix) []int {
	a.check()
	c := compress(a)
	return c.expand(c.nested())
}

// nested returns the nested-dissection order of c's groups.
func (c *compressed) nested() []int {
	ng := c.groups()
	d := &dissector{
		ptr: c.ptr, adj: c.adj, gptr: c.gptr,
		tag: make([]int, ng), seen: make([]int, ng), done: make([]int, ng), level: make([]int, ng),
		set: make([]int, ng), order: make([]int, 0, ng),
	}
	nodes := make([]int, ng)
	for g := range nodes {
		nodes[g] = g
	}
	d.dissect(nodes)
	g := newQuotientGraph(c.ptr, slices.Clone(c.adj), c.gptr)
	g.constrain(d.set, d.nsets)
	return g.eliminate()
}

// compressGraph merges variables with identical closed neighbourhoods (the
// freedoms of one node, usually). It returns each variable's group and the
// members of each group, ascending.
func compressGraph(n int, ptr, adj []int) (group, gptr, gmem []int) {
	group = make([]int, n)
	head := make([]int, n)
	next := make([]int, n)
	hash := make([]int, n)
	mark := make([]int, n)
	for i := range head {
		head[i], group[i], mark[i] = -1, -1, -1
	}
	for i := 0; i < n; i++ {
		h := i
		for _, j := range adj[ptr[i]:ptr[i+1]] {
			h += j
		}
		hash[i] = h % n
		next[i] = head[hash[i]]
		head[hash[i]] = i
	}
	ng := 0
	for i := 0; i < n; i++ {
		if group[i] >= 0 {
			continue
		}
		group[i] = ng
		mark[i] = i
		for _, j := range adj[ptr[i]:ptr[i+1]] {
			mark[j] = i
		}
		deg := ptr[i+1] - ptr[i]
		for j := head[hash[i]]; j >= 0; j = next[j] {
			if group[j] >= 0 || ptr[j+1]-ptr[j] != deg || mark[j] != i {
				continue
			}
			same := true
			for _, k := range adj[ptr[j]:ptr[j+1]] {
				if mark[k] != i {
					same = false
					break
				}
			}
			if same {
				group[j] = ng
			}
		}
		ng++
	}
	gptr = make([]int, ng+1)
	for _, g := range group {
		gptr[g+1]++
	}
	for g := 0; g < ng; g++ {
		gptr[g+1] += gptr[g]
	}
	gmem = make([]int, n)
	fill := make([]int, ng)
	copy(fill, gptr[:ng])
	for i, g := range group {
		gmem[fill[g]] = i
		fill[g]++
	}
	return group, gptr, gmem
}

// dissector holds the state of nested dissection on the compressed graph.
type dissector struct {
	ptr, adj  []int // compressed graph
	gptr      []int // original variables of compressed node g: gptr[g+1]−gptr[g] of them
	tag       []int // == current stamp for the nodes of the piece being split
	seen      []int
	done      []int
	level     []int
	stamp     int
	order     []int // scratch of levelStructure, room for every node
	separator []int // scratch of split
	set       []int // constraint set of each compressed node: its piece or separator
	nsets     int   // sets numbered so far, in the order they are to be eliminated
}

// dissect numbers the constraint sets of the pieces and separators of
// nodes: both parts before their separator, recursively. It reorders
// nodes in place (first part, second part, separator), so the recursion
// allocates no pieces of its own.
func (d *dissector) dissect(nodes []int) {
	if len(nodes) == 0 {
		return
	}
	if len(nodes) <= nestedLeaf {
		d.leaf(nodes)
		return
	}
	d.stamp++
	t := d.stamp
	for _, v := range nodes {
		d.tag[v] = t
	}
	order, levels := d.levelStructure(nodes[0], t)
	if len(order) < len(nodes) {
		d.dissectComponents(nodes, order, t)
		return
	}
	order, levels = d.peripheral(order, levels, t)
	if len(levels)-1 < 3 {
		d.leaf(nodes)
		return
	}
	best := d.separatorLevel(order, levels, t)
	firstSize, secondSize := d.split(nodes, order, levels, best, t)
	d.dissect(nodes[:firstSize])
	d.dissect(nodes[firstSize : firstSize+secondSize])
	d.leaf(nodes[firstSize+secondSize:])
}

// dissectComponents dissects each connected component of a disconnected
// piece, the first being order (all at once: peeling one at a time would
// cost quadratic time on pieces with many components).
func (d *dissector) dissectComponents(nodes, order []int, t int) {
	for _, v := range order {
		d.done[v] = t
	}
	components := [][]int{slices.Clone(order)}
	for _, v := range nodes {
		if d.done[v] == t {
			continue
		}
		comp, _ := d.levelStructure(v, t)
		for _, u := range comp {
			d.done[u] = t
		}
		components = append(components, slices.Clone(comp))
	}
	for _, comp := range components {
		d.dissect(comp)
	}
}

// peripheral returns the level structure from a pseudo-peripheral root:
// it restarts from a node of least degree in the last level while the
// structure gets deeper (at most four times).
func (d *dissector) peripheral(order, levels []int, t int) ([]int, []int) {
	for range 4 {
		last := order[levels[len(levels)-2]:]
		root := last[0]
		for _, v := range last {
			if d.ptr[v+1]-d.ptr[v] < d.ptr[root+1]-d.ptr[root] {
				root = v
			}
		}
		depth := len(levels)
		order, levels = d.levelStructure(root, t)
		if len(levels) <= depth {
			break
		}
	}
	return order, levels
}

// separatorLevel returns the level whose part adjacent to the next level
// is the separator: among the levels splitting the piece between
// separatorLow and separatorHigh percent, the one with the fewest such
// variables; failing any, the level that halves the piece.
func (d *dissector) separatorLevel(order, levels []int, t int) int {
	nl := len(levels) - 1
	total := len(order)
	best, bestSize := -1, 0
	for i := 1; i < nl-1; i++ {
		if levels[i] < separatorLow*total/100 || levels[i] > separatorHigh*total/100 {
			continue
		}
		if size := d.separatorSize(order[levels[i]:levels[i+1]], i, t); best < 0 || size < bestSize {
			best, bestSize = i, size
		}
	}
	if best < 0 {
		best = 1
		for best < nl-2 && levels[best+1] <= total/2 {
			best++
		}
	}
	return best
}

// split writes into nodes the first part (the levels before best and the
// nodes of level best not adjacent to level best+1, in breadth-first
// order), then the second part (the levels after best) and then the
// separator, and returns the sizes of the two parts.
func (d *dissector) split(nodes, order, levels []int, best, t int) (firstSize, secondSize int) {
	pos := copy(nodes, order[:levels[best]])
	separator := d.separator[:0]
	for _, v := range order[levels[best]:levels[best+1]] {
		if d.touchesNext(v, best, t) {
			separator = append(separator, v)
		} else {
			nodes[pos] = v
			pos++
		}
	}
	firstSize = pos
	secondSize = copy(nodes[pos:], order[levels[best+1]:])
	copy(nodes[pos+secondSize:], separator)
	d.separator = separator
	return firstSize, secondSize
}

// levelStructure runs a breadth-first search from root over the nodes
// tagged t. Level i is order[levels[i]:levels[i+1]]; d.level holds each
// node's level. order lives in the dissector's scratch space, valid until
// the next call.
func (d *dissector) levelStructure(root, t int) (order, levels []int) {
	d.stamp++
	s := d.stamp
	// Tags of the piece are older stamps; keep them valid by stamping seen
	// separately.
	d.seen[root] = s
	d.level[root] = 0
	order = append(d.order[:0], root)
	levels = []int{0}
	for lo := 0; lo < len(order); {
		hi := len(order)
		lev := len(levels)
		for _, v := range order[lo:hi] {
			for _, u := range d.adj[d.ptr[v]:d.ptr[v+1]] {
				if d.tag[u] == t && d.seen[u] != s {
					d.seen[u] = s
					d.level[u] = lev
					order = append(order, u)
				}
			}
		}
		levels = append(levels, hi)
		lo = hi
	}
	return order, levels
}

// touchesNext reports whether node v of level i has a neighbour in level
// i+1 of the piece tagged t.
func (d *dissector) touchesNext(v, i, t int) bool {
	for _, u := range d.adj[d.ptr[v]:d.ptr[v+1]] {
		if d.tag[u] == t && d.level[u] == i+1 {
			return true
		}
	}
	return false
}

// separatorSize counts the variables of level i that touch level i+1.
func (d *dissector) separatorSize(level []int, i, t int) int {
	size := 0
	for _, v := range level {
		if d.touchesNext(v, i, t) {
			size += d.gptr[v+1] - d.gptr[v]
		}
	}
	return size
}

// leaf makes nodes one constraint set, the next to be eliminated.
func (d *dissector) leaf(nodes []int) {
	for _, g := range nodes {
		d.set[g] = d.nsets
	}
	d.nsets++
}
