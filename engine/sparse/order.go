package sparse

import (
	"math"
	"slices"
)

// Order returns a fill-reducing permutation of the symmetric matrix a, with
// perm[new] = old, computed by approximate minimum degree on the quotient
// graph of a's structure (Amestoy, Davis and Duff, "An approximate minimum
// degree ordering algorithm", SIAM J. Matrix Anal. Appl. 17(4), 1996). Only
// the structure of a is read. The result depends on the structure alone, so
// the same pattern always yields the same permutation.
func Order(a *Matrix) []int {
	a.check()
	c := compress(a)
	return c.expand(c.minimumDegree())
}

// minimumDegree returns the minimum-degree order of c's groups: the
// quotient graph starts from the graph of the groups rather than from the
// variables (on a copy of it, which the elimination overwrites, so that
// the other ordering and the counts may read c at the same time).
func (c *compressed) minimumDegree() []int {
	return newQuotientGraph(c.ptr, slices.Clone(c.adj), c.gptr).eliminate()
}

// compressedAdjacency returns the graph of the groups of compressGraph: g
// and h are adjacent when a member of g is adjacent to a member of h.
// Members of a group share their neighbourhood, so one member stands for
// all.
func compressedAdjacency(group, gptr, gmem, ptr, adj []int) (cptr, cadj []int) {
	ng := len(gptr) - 1
	cptr = make([]int, ng+1)
	cadj = make([]int, 0, len(adj)/max(1, len(gmem)/max(ng, 1)))
	mark := make([]int, ng)
	for g := 0; g < ng; g++ {
		rep := gmem[gptr[g]]
		mark[g] = g + 1
		for _, u := range adj[ptr[rep]:ptr[rep+1]] {
			if h := group[u]; mark[h] != g+1 {
				mark[h] = g + 1
				cadj = append(cadj, h)
			}
		}
		cptr[g+1] = len(cadj)
	}
	return cptr, cadj
}

// Node states in the quotient graph.
const (
	stVariable     = iota // an uneliminated principal variable
	stElement             // an eliminated node that is still an element
	stAbsorbed            // an element absorbed into a later one
	stNonPrincipal        // a variable merged into a supervariable or into a pivot
	stDense               // a variable set aside as dense, numbered last
)

// quotientGraph holds the state of minimum-degree elimination. Every node is
// a variable (principal or merged into another) or an element (an eliminated
// pivot that stands for the clique its elimination created).
type quotientGraph struct {
	n      int
	state  []int8
	weight []int   // number of original variables a principal variable stands for; 0 once merged
	degree []int   // approximate external degree of a principal variable
	vars   [][]int // adjacent variables of a variable; the member variables of an element
	elems  [][]int // adjacent elements of a variable
	elemSz []int   // |Le|: total weight of the principal variables of element e

	// Degree buckets: doubly linked lists of principal variables by degree.
	head, next, prev []int
	minDegree        int // at most the least degree in the buckets
	listedCount      int // principal variables in the buckets

	// Member lists: the original variables each principal variable stands
	// for, in the order they will be numbered.
	first, last, link []int

	// Scratch, reused across stages with stamps to avoid clearing.
	lpMark      []int // == stage when the node belongs to the current Lp
	extMark     []int // == stage when ext[e] is valid
	ext         []int // |Le \ Lp| for elements met during the current stage
	bound       []int // |A_i| + Σ|Le \ Lp| for i in Lp
	hashOf      []int
	hashHead    []int
	hashNext    []int
	cmpMark     []int
	cmpStamp    int
	stage       int
	lp          []int
	eliminated  int   // original variables eliminated
	total       int   // original variables
	dense       []int // variables set aside as dense, numbered last
	denseWeight int   // original variables among them

	// Constraint sets (constrained.go); set is nil when unconstrained.
	set            []int // set of each variable: all of set s are eliminated before any of set s+1
	current        int   // the set whose variables the degree buckets hold
	setPtr, setMem []int // the variables of set s are setMem[setPtr[s]:setPtr[s+1]]
}

// newQuotientGraph starts minimum-degree elimination on the graph of n
// principal variables whose neighbours are adj[ptr[i]:ptr[i+1]], variable
// g standing for gptr[g+1]−gptr[g] original variables with identical
// closed neighbourhoods. The elimination overwrites adj.
func newQuotientGraph(ptr, adj, gptr []int) *quotientGraph {
	n := len(ptr) - 1
	g := &quotientGraph{
		n:        n,
		state:    make([]int8, n),
		weight:   make([]int, n),
		degree:   make([]int, n),
		vars:     make([][]int, n),
		elems:    make([][]int, n),
		elemSz:   make([]int, n),
		head:     make([]int, gptr[n]+1),
		next:     make([]int, n),
		prev:     make([]int, n),
		first:    make([]int, n),
		last:     make([]int, n),
		link:     make([]int, n),
		lpMark:   make([]int, n),
		extMark:  make([]int, n),
		ext:      make([]int, n),
		bound:    make([]int, n),
		hashOf:   make([]int, n),
		hashHead: make([]int, n),
		hashNext: make([]int, n),
		cmpMark:  make([]int, n),
		total:    gptr[n],
	}
	for i := 0; i < n; i++ {
		g.vars[i] = adj[ptr[i]:ptr[i+1]:ptr[i+1]]
		g.weight[i] = gptr[i+1] - gptr[i]
		g.first[i], g.last[i], g.link[i] = i, i, -1
		g.hashHead[i] = -1
		g.lpMark[i], g.extMark[i], g.cmpMark[i] = -1, -1, -1
	}
	// Variables adjacent to a large share of the graph would be touched at
	// almost every stage; the paper sets rows of degree above 10√n aside and
	// numbers them last, which costs little fill. The degree counts original
	// variables, the group's own members included.
	denseLimit := max(16, int(10*math.Sqrt(float64(g.total))))
	for i := 0; i < n; i++ {
		d := g.weight[i] - 1
		for _, j := range g.vars[i] {
			d += g.weight[j]
		}
		if d > denseLimit {
			g.state[i] = stDense
			g.denseWeight += g.weight[i]
			g.vars[i] = nil
			g.dense = append(g.dense, i)
		}
	}
	for _, i := range g.dense {
		g.weight[i] = 0
	}
	for i := range g.head {
		g.head[i] = -1
	}
	g.minDegree = len(g.head) - 1
	for i := 0; i < n; i++ {
		if g.weight[i] == 0 {
			continue
		}
		d := 0
		for _, j := range g.vars[i] {
			d += g.weight[j]
		}
		g.degree[i] = d
		g.insert(i)
	}
	return g
}

// absorbVariable merges principal variable t into principal variable s.
func (g *quotientGraph) absorbVariable(s, t int) {
	g.weight[s] += g.weight[t]
	g.weight[t] = 0
	g.state[t] = stNonPrincipal
	g.vars[t], g.elems[t] = nil, nil
	g.link[g.last[s]] = g.first[t]
	g.last[s] = g.last[t]
}

func (g *quotientGraph) insert(i int) {
	d := g.degree[i]
	g.prev[i] = -1
	g.next[i] = g.head[d]
	if g.head[d] >= 0 {
		g.prev[g.head[d]] = i
	}
	g.head[d] = i
	g.minDegree = min(g.minDegree, d)
	g.listedCount++
}

func (g *quotientGraph) remove(i int) {
	if g.prev[i] >= 0 {
		g.next[g.prev[i]] = g.next[i]
	} else {
		g.head[g.degree[i]] = g.next[i]
	}
	if g.next[i] >= 0 {
		g.prev[g.next[i]] = g.prev[i]
	}
	g.listedCount--
}

// eliminate runs the elimination and returns perm[new] = old.
func (g *quotientGraph) eliminate() []int {
	n := g.n - len(g.dense)
	perm := make([]int, 0, g.n) // principal variables of the graph, not original ones
	for len(perm) < n {
		p := g.nextPivot()
		g.remove(p)
		g.stage++
		g.buildPivotElement(p)
		g.computeExternal()
		g.updateVariables(p)
		g.detectSupervariables()
		g.finishStage(p)
		for v := g.first[p]; v >= 0; v = g.link[v] {
			perm = append(perm, v)
		}
	}
	return append(perm, g.dense...)
}

// buildPivotElement turns pivot p into element p with member list
// Lp = (A_p ∪ ⋃_{e∈E_p} L_e) \ {p}, absorbing the elements of E_p.
func (g *quotientGraph) buildPivotElement(p int) {
	stage := g.stage
	lp := g.lp[:0]
	g.lpMark[p] = stage
	add := func(j int) {
		if g.state[j] == stVariable && g.weight[j] > 0 && g.lpMark[j] != stage {
			g.lpMark[j] = stage
			lp = append(lp, j)
		}
	}
	for _, j := range g.vars[p] {
		add(j)
	}
	for _, e := range g.elems[p] {
		if g.state[e] != stElement {
			continue
		}
		for _, j := range g.vars[e] {
			add(j)
		}
		g.state[e] = stAbsorbed
		g.vars[e] = nil
	}
	g.state[p] = stElement
	g.elems[p] = nil
	g.eliminated += g.weight[p]
	for _, i := range lp {
		if g.listed(i) {
			g.remove(i)
		}
	}
	g.lp = lp
}

// computeExternal sets ext[e] = |Le \ Lp| for every live element e adjacent
// to a variable of Lp, by subtracting the weights of Lp's members from |Le|.
func (g *quotientGraph) computeExternal() {
	stage := g.stage
	for _, i := range g.lp {
		wi := g.weight[i]
		for _, e := range g.elems[i] {
			if g.state[e] != stElement {
				continue
			}
			if g.extMark[e] != stage {
				g.extMark[e] = stage
				g.ext[e] = g.elemSz[e]
			}
			g.ext[e] -= wi
		}
	}
}

// updateVariables prunes the lists of every variable in Lp, absorbs
// elements whose members all lie in Lp (aggressive absorption), adds p to
// their element lists, computes the degree bound and the hash for
// supervariable detection, and eliminates along with p every variable whose
// only neighbour left is element p (mass elimination).
func (g *quotientGraph) updateVariables(p int) {
	stage := g.stage
	n := g.n
	for _, i := range g.lp {
		extDeg, h := 0, 0
		keep := g.elems[i][:0]
		for _, e := range g.elems[i] {
			if g.state[e] != stElement {
				continue
			}
			d := g.ext[e]
			if d == 0 {
				g.state[e] = stAbsorbed
				g.vars[e] = nil
				continue
			}
			extDeg += d
			h += e
			keep = append(keep, e)
		}
		vkeep := g.vars[i][:0]
		for _, j := range g.vars[i] {
			if g.state[j] != stVariable || g.weight[j] == 0 || g.lpMark[j] == stage {
				continue
			}
			extDeg += g.weight[j]
			h += j
			vkeep = append(vkeep, j)
		}
		g.vars[i] = vkeep
		if len(keep) == 0 && len(vkeep) == 0 && g.sameSet(i, p) {
			// i's neighbourhood is exactly Lp: number it with p.
			g.eliminated += g.weight[i]
			g.link[g.last[p]] = g.first[i]
			g.last[p] = g.last[i]
			g.weight[i] = 0
			g.state[i] = stNonPrincipal
			g.vars[i], g.elems[i] = nil, nil
			continue
		}
		g.elems[i] = append(keep, p)
		g.bound[i] = extDeg
		hb := (h + p) % n
		g.hashOf[i] = hb
		g.hashNext[i] = g.hashHead[hb]
		g.hashHead[hb] = i
	}
}

// detectSupervariables merges variables of Lp with identical element and
// variable lists, found through the hash buckets filled by updateVariables.
func (g *quotientGraph) detectSupervariables() {
	for _, i := range g.lp {
		if g.weight[i] == 0 {
			continue
		}
		hb := g.hashOf[i]
		list := g.hashHead[hb]
		if list < 0 {
			continue
		}
		g.hashHead[hb] = -1
		if g.hashNext[list] < 0 {
			continue
		}
		for s := list; s >= 0; s = g.hashNext[s] {
			if g.weight[s] == 0 {
				continue
			}
			g.cmpStamp++
			stamp := g.cmpStamp
			for _, e := range g.elems[s] {
				g.cmpMark[e] = stamp
			}
			for _, j := range g.vars[s] {
				g.cmpMark[j] = stamp
			}
			for t := g.hashNext[s]; t >= 0; t = g.hashNext[t] {
				if g.weight[t] == 0 || len(g.elems[t]) != len(g.elems[s]) || len(g.vars[t]) != len(g.vars[s]) || !g.sameSet(s, t) {
					continue
				}
				same := true
				for _, e := range g.elems[t] {
					if g.cmpMark[e] != stamp {
						same = false
						break
					}
				}
				if same {
					for _, j := range g.vars[t] {
						if g.cmpMark[j] != stamp {
							same = false
							break
						}
					}
				}
				if same {
					g.absorbVariable(s, t)
				}
			}
		}
	}
}

// finishStage computes the approximate degrees of Lp's variables, puts them
// back in the degree buckets and stores Lp as element p.
func (g *quotientGraph) finishStage(p int) {
	lpSize := 0
	kept := g.lp[:0]
	for _, i := range g.lp {
		if g.weight[i] > 0 {
			lpSize += g.weight[i]
			kept = append(kept, i)
		}
	}
	remaining := g.total - g.denseWeight - g.eliminated
	for _, i := range kept {
		wi := g.weight[i]
		others := lpSize - wi
		d := min(g.degree[i]+others, g.bound[i]+others, remaining-wi)
		g.degree[i] = max(d, 0)
		if g.listed(i) {
			g.insert(i)
		}
	}
	g.vars[p] = append([]int(nil), kept...)
	g.elemSz[p] = lpSize
	g.lp = kept
}

// Adjacency returns the graph of a's off-diagonal structure, both
// triangles: the neighbours of i are adj[ptr[i]:ptr[i+1]]. The orderings
// start from it, and so can a caller's own.
func (a *Matrix) Adjacency() (ptr, adj []int) {
	n := a.N
	ptr = make([]int, n+1)
	for j := 0; j < n; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			if i := a.RowIdx[p]; i != j {
				ptr[i+1]++
				ptr[j+1]++
			}
		}
	}
	for i := 0; i < n; i++ {
		ptr[i+1] += ptr[i]
	}
	adj = make([]int, ptr[n])
	fill := make([]int, n)
	copy(fill, ptr[:n])
	for j := 0; j < n; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			if i := a.RowIdx[p]; i != j {
				adj[fill[i]] = j
				fill[i]++
				adj[fill[j]] = i
				fill[j]++
			}
		}
	}
	return ptr, adj
}
