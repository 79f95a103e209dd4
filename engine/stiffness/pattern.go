package stiffness

import (
	"slices"

	"gusset/engine/model"
	"gusset/engine/sparse"
)

// pattern is the structure of the stiffness matrix of the unconstrained
// freedoms, built from the member connectivity node by node, with what
// assembly needs to find the position of an entry in Val by arithmetic
// instead of a search.
//
// A node's equations are consecutive (freedoms are numbered node by node,
// translations first), so column j of a node a holds a run of a's own
// equations from j down, followed, for each neighbour b > a in ascending
// order, by a run of b's equations: all of them when a beam joins a and b,
// its translations when only bars do (and nothing in a rotational column).
// The pattern is exactly the union of the members' freedom pairs.
type pattern struct {
	k        *sparse.Matrix
	eqStart  []int // node n's equations are eqStart[n] .. eqStart[n+1]-1
	trans    []int // per node: how many of its equations are translations
	nbrPtr   []int // upper neighbours of node a: nbr[nbrPtr[a]:nbrPtr[a+1]], ascending
	nbr      []int
	offTrans []int // per neighbour entry: offset of its run in a translational column, after the own run
	offRot   []int // the same in a rotational column
	ownFull  []bool
	ownTrans []bool
}

// Link kinds between two nodes.
const (
	linkBar  = 1 // only bars: translations × translations
	linkBeam = 2 // a beam: every freedom × every freedom
)

// newPattern builds the pattern of K for m's members and numbering nb, in
// phases: the equations of each node, the upper neighbours of each node
// with the kind of their link, the column lengths, and the row indices.
func newPattern(m *model.Model, nb *numbering) *pattern {
	nn := m.NodeCount()
	p := &pattern{
		eqStart:  make([]int, nn+1),
		trans:    make([]int, nn),
		ownFull:  make([]bool, nn),
		ownTrans: make([]bool, nn),
	}
	p.countEquations(m, nb)
	links := p.neighbours(m)
	colPtr := p.columnPointers(nb.equations, links)
	rowIdx := p.rowIndices(colPtr, links)
	p.k = &sparse.Matrix{N: nb.equations, ColPtr: colPtr, RowIdx: rowIdx, Val: make([]float64, len(rowIdx))}
	return p
}

// countEquations sets each node's first equation and its count of
// translational equations.
func (p *pattern) countEquations(m *model.Model, nb *numbering) {
	nn := m.NodeCount()
	for n := range nn {
		last := nb.total
		if n+1 < nn {
			last = nb.first[n+1]
		}
		eqs, tr := 0, 0
		for f := nb.first[n]; f < last; f++ {
			if nb.equation[f] < 0 {
				continue
			}
			eqs++
			if nb.component[f] < m.Dim {
				tr++
			}
		}
		p.trans[n] = tr
		p.eqStart[n+1] = p.eqStart[n] + eqs
	}

}

// neighbours sets the upper neighbour lists and returns the link kind of
// each entry. Entries are packed as 4·node + link so that one integer sort
// orders them by node and merges duplicates next to each other.
func (p *pattern) neighbours(m *model.Model) []int {
	nn := m.NodeCount()
	count := make([]int, nn+1)
	for _, mem := range m.Members {
		a, b := mem.Ends[0], mem.Ends[1]
		if mem.Kind == model.Beam {
			p.ownFull[a], p.ownFull[b] = true, true
		} else {
			p.ownTrans[a], p.ownTrans[b] = true, true
		}
		if a != b {
			count[min(a, b)+1]++
		}
	}
	for n := range nn {
		count[n+1] += count[n]
	}
	packed := make([]int, count[nn])
	next := slices.Clone(count[:nn])
	for _, mem := range m.Members {
		a, b := mem.Ends[0], mem.Ends[1]
		if a == b {
			continue
		}
		link := linkBar
		if mem.Kind == model.Beam {
			link = linkBeam
		}
		lo := min(a, b)
		packed[next[lo]] = 4*max(a, b) + link
		next[lo]++
	}
	p.nbrPtr = make([]int, nn+1)
	p.nbr = make([]int, 0, len(packed))
	links := make([]int, 0, len(packed))
	for a := range nn {
		seg := packed[count[a]:count[a+1]]
		slices.Sort(seg)
		for _, v := range seg {
			b, link := v/4, v%4
			if k := len(p.nbr); k > p.nbrPtr[a] && p.nbr[k-1] == b {
				links[k-1] = max(links[k-1], link)
				continue
			}
			p.nbr = append(p.nbr, b)
			links = append(links, link)
		}
		p.nbrPtr[a+1] = len(p.nbr)
	}
	p.offTrans = make([]int, len(p.nbr))
	p.offRot = make([]int, len(p.nbr))

	return links
}

// columnPointers returns the column pointers of K: each column holds its
// node's own run and a run per upper neighbour (all of a beam neighbour's
// equations, a bar neighbour's translations in translational columns).
func (p *pattern) columnPointers(neq int, links []int) []int {
	nn := len(p.trans)
	colPtr := make([]int, neq+1)
	for a := range nn {
		ta, tr := 0, 0 // run lengths of the neighbours in translational and rotational columns
		for k := p.nbrPtr[a]; k < p.nbrPtr[a+1]; k++ {
			b := p.nbr[k]
			p.offTrans[k], p.offRot[k] = ta, tr
			if links[k] == linkBeam {
				nbEq := p.eqStart[b+1] - p.eqStart[b]
				ta += nbEq
				tr += nbEq
			} else {
				ta += p.trans[b]
			}
		}
		for j := p.eqStart[a]; j < p.eqStart[a+1]; j++ {
			c := j - p.eqStart[a]
			size := p.own(a, c)
			if c < p.trans[a] {
				size += ta
			} else {
				size += tr
			}
			colPtr[j+1] = colPtr[j] + size
		}
	}
	return colPtr
}

// rowIndices fills the row indices of every column in the order of
// columnPointers.
func (p *pattern) rowIndices(colPtr, links []int) []int {
	nn := len(p.trans)
	rowIdx := make([]int, colPtr[len(colPtr)-1])
	for a := range nn {
		for j := p.eqStart[a]; j < p.eqStart[a+1]; j++ {
			c := j - p.eqStart[a]
			q := colPtr[j]
			for i := j; i < j+p.own(a, c); i++ {
				rowIdx[q] = i
				q++
			}
			for k := p.nbrPtr[a]; k < p.nbrPtr[a+1]; k++ {
				b := p.nbr[k]
				hi := p.eqStart[b] + p.trans[b]
				switch {
				case links[k] == linkBeam:
					hi = p.eqStart[b+1]
				case c >= p.trans[a]:
					continue
				}
				for i := p.eqStart[b]; i < hi; i++ {
					rowIdx[q] = i
					q++
				}
			}
		}
	}
	return rowIdx
}

// own returns the length of the run of node a's own equations in the
// column of its local equation c: the rest of the node's equations when a
// beam touches it, the rest of its translations when only bars do (for a
// translational column), and the diagonal alone otherwise.
func (p *pattern) own(a, c int) int {
	switch {
	case p.ownFull[a]:
		return p.eqStart[a+1] - p.eqStart[a] - c
	case p.ownTrans[a] && c < p.trans[a]:
		return p.trans[a] - c
	}
	return 1
}

// neighbour returns the index in p.nbr of node b among the upper
// neighbours of node a < b; the pattern holds the pair.
func (p *pattern) neighbour(a, b int) int {
	lo, hi := p.nbrPtr[a], p.nbrPtr[a+1]
	k, _ := slices.BinarySearch(p.nbr[lo:hi], b)
	return lo + k
}

// position returns the index in Val of entry (ei, ej), ei ≥ ej, where ej is
// an equation of node a and ei one of node b ≥ a; k is p.neighbour(a, b)
// when b > a.
func (p *pattern) position(ei, ej, a, b, k int) int {
	if a == b {
		return p.k.ColPtr[ej] + ei - ej
	}
	c := ej - p.eqStart[a]
	q := p.k.ColPtr[ej] + p.own(a, c) + ei - p.eqStart[b]
	if c < p.trans[a] {
		return q + p.offTrans[k]
	}
	return q + p.offRot[k]
}
