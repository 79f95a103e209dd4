package layout

import (
	"context"
	"fmt"
	"math"
	"sort"

	"gusset/engine/fault"
)

// candidate is a possible member between two nodes (indices, a < b).
type candidate struct{ a, b int32 }

func (c candidate) key() uint64 { return uint64(c.a)<<32 | uint64(c.b) }

// groundStructure is the set of nodes of a problem and the rule that gives
// each node's candidate members. The candidates are generated node by node
// whenever they are needed and never stored all at once: a space grid has
// millions of them, and member adding only ever needs them one node at a
// time.
type groundStructure struct {
	dim   int
	nodes []vec
	dom   space // nil for the caller's own nodes without a domain
	// test says whether candidates must be checked against the domain (a
	// non-convex plane domain, or holes).
	test bool
	// keepOverlaps keeps candidates that pass through a node: with a
	// joint cost a long member costs less than the chain along it.
	keepOverlaps bool
	grid         *gridIndex // nil for the caller's own nodes
	eps          float64    // length below which points coincide
	// spacing is the smallest distance between two nodes.
	spacing float64
	// count is the number of candidates.
	count int
	// start lists the candidates of the first member-adding program: each
	// node's StartNeighbours shortest candidates.
	start []candidate
}

// gridIndex finds grid nodes by their integer grid position.
type gridIndex struct {
	steps [3]int     // divisions along x, y, z (z is 0 in the plane)
	at    []int32    // node at grid point (ix, iy, iz), or −1
	cell  [][3]int32 // grid point of each node
	// offsets are the integer steps (dx, dy, dz) to candidate partners,
	// lexicographically positive in (dz, dy, dx) so that each pair is met
	// once, with gcd(|dx|, |dy|, |dz|) = 1 unless overlaps are kept: a
	// step with a common divisor passes through a grid point, and the
	// member would overlap the shorter ones along it.
	offsets [][3]int32
}

func (gi *gridIndex) index(p [3]int) int {
	return (p[2]*(gi.steps[1]+1)+p[1])*(gi.steps[0]+1) + p[0]
}

func pointer(base string, i int) string { return fmt.Sprintf("%s/%d", base, i) }

func gcd(a, b int) int {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

func abs(i int) int {
	if i < 0 {
		return -i
	}
	return i
}

// buildGround makes the nodes, counts the candidate members (an error past
// opt.MaxCandidates) and picks the start. dom may be nil for the caller's
// own nodes without a domain.
func buildGround(ctx context.Context, p *Problem, dim int, dom space, opt Options) (*groundStructure, error) {
	g := &groundStructure{dim: dim, dom: dom, keepOverlaps: p.JointCost > 0}
	switch d := dom.(type) {
	case *region:
		g.test = !d.convex
	case *solid:
		g.test = len(d.holes) > 0
	}
	var err error
	if len(p.Nodes) > 0 {
		err = g.ownNodes(p.Nodes, opt)
	} else {
		err = g.makeGrid(p, opt)
	}
	if err != nil {
		return nil, err
	}
	if err := g.countCandidates(ctx, p, opt); err != nil {
		return nil, err
	}
	g.pickStart(ctx, opt.StartNeighbours)
	return g, ctx.Err()
}

// gridSteps returns the divisions along each axis of the domain's box.
func gridSteps(p *Problem, dim int, lo, hi vec) ([3]int, error) {
	steps := p.Divisions
	if dim == 2 {
		steps[2] = 0
	}
	if steps == [3]int{} {
		if !(p.Spacing > 0) || !finite(p.Spacing) {
			return steps, fault.At(fault.InvalidModel, "/spacing", "give grid divisions, a positive spacing or the nodes")
		}
		for a := 0; a < dim; a++ {
			steps[a] = max(1, int(math.Round((hi[a]-lo[a])/p.Spacing)))
		}
	}
	for a := 0; a < dim; a++ {
		if steps[a] < 1 {
			return steps, fault.At(fault.InvalidModel, "/divisions", "grid divisions must be at least 1 along each axis, got %v", steps[:dim])
		}
	}
	return steps, nil
}

// makeGrid places the grid nodes inside the domain and lists the steps to
// candidate partners.
func (g *groundStructure) makeGrid(p *Problem, opt Options) error {
	if g.dom == nil {
		return fault.At(fault.InvalidModel, "/domain", "a grid needs a design domain")
	}
	lo, hi := g.dom.bounds()
	steps, err := gridSteps(p, g.dim, lo, hi)
	if err != nil {
		return err
	}
	points := int64(steps[0]+1) * int64(steps[1]+1) * int64(steps[2]+1)
	if points > int64(opt.MaxCandidates) {
		return fault.At(fault.InvalidModel, "/divisions", "a grid of %v divisions has %d nodes, more than the candidate limit of %d", steps[:g.dim], points, opt.MaxCandidates)
	}
	gi := &gridIndex{steps: steps, at: make([]int32, points)}
	var h vec
	for a := 0; a < g.dim; a++ {
		h[a] = (hi[a] - lo[a]) / float64(steps[a])
	}
	g.spacing = math.Inf(1)
	for a := 0; a < g.dim; a++ {
		g.spacing = min(g.spacing, h[a])
	}
	g.eps = 1e-9 * norm(sub(hi, lo))
	var ip [3]int
	for ip[2] = 0; ip[2] <= steps[2]; ip[2]++ {
		for ip[1] = 0; ip[1] <= steps[1]; ip[1]++ {
			for ip[0] = 0; ip[0] <= steps[0]; ip[0]++ {
				var pt vec
				for a := 0; a < g.dim; a++ {
					pt[a] = lo[a] + float64(ip[a])*h[a]
					if ip[a] == steps[a] {
						pt[a] = hi[a]
					}
				}
				k := gi.index(ip)
				gi.at[k] = -1
				if g.dom.contains(pt) {
					gi.at[k] = int32(len(g.nodes))
					g.nodes = append(g.nodes, pt)
					gi.cell = append(gi.cell, [3]int32{int32(ip[0]), int32(ip[1]), int32(ip[2])})
				}
			}
		}
	}
	if len(g.nodes) < 2 {
		return fault.At(fault.InvalidModel, "/domain", "the grid has %d node(s) inside the design domain; refine it", len(g.nodes))
	}
	if p.Level < 0 {
		return fault.At(fault.InvalidModel, "/level", "the connectivity level must be 0 (full) or positive, got %d", p.Level)
	}
	var reach [3]int
	for a := 0; a < 3; a++ {
		reach[a] = steps[a]
		if p.Level > 0 {
			reach[a] = min(steps[a], p.Level)
		}
	}
	for dz := 0; dz <= reach[2]; dz++ {
		for dy := -reach[1]; dy <= reach[1]; dy++ {
			for dx := -reach[0]; dx <= reach[0]; dx++ {
				positive := dz > 0 || (dz == 0 && (dy > 0 || (dy == 0 && dx > 0)))
				if positive && (g.keepOverlaps || gcd(gcd(abs(dx), abs(dy)), dz) == 1) {
					gi.offsets = append(gi.offsets, [3]int32{int32(dx), int32(dy), int32(dz)})
				}
			}
		}
	}
	g.grid = gi
	return nil
}

// neighbours appends to buf the partners of node a: all of them, or with
// half only those with a higher index (so that each candidate is met once
// over all nodes).
func (g *groundStructure) neighbours(a int, half bool, buf []int32) []int32 {
	buf = buf[:0]
	if g.grid == nil {
		return g.ownNeighbours(a, half, buf)
	}
	gi := g.grid
	c := gi.cell[a]
	for _, o := range gi.offsets {
		for sign := int32(1); sign >= -1; sign -= 2 {
			if sign < 0 && half {
				break
			}
			var q [3]int
			inside := true
			for ax := 0; ax < 3; ax++ {
				q[ax] = int(c[ax] + sign*o[ax])
				inside = inside && q[ax] >= 0 && q[ax] <= gi.steps[ax]
			}
			if !inside {
				continue
			}
			b := gi.at[gi.index(q)]
			if b < 0 || (g.test && !g.dom.admits(g.nodes[a], g.nodes[b])) {
				continue
			}
			buf = append(buf, b)
		}
	}
	return buf
}

// ownNodes checks the caller's nodes.
func (g *groundStructure) ownNodes(nodes [][3]float64, opt Options) error {
	n := len(nodes)
	if n < 2 {
		return fault.At(fault.InvalidModel, "/nodes", "at least 2 nodes are needed, got %d", n)
	}
	g.nodes = make([]vec, n)
	lo, hi := nodes[0], nodes[0]
	for i, p := range nodes {
		if g.dim == 2 {
			p[2] = 0
		}
		g.nodes[i] = p
		for a := 0; a < 3; a++ {
			if !finite(p[a]) {
				return fault.At(fault.InvalidModel, pointer("/nodes", i), "node %d is not a finite point", i)
			}
			lo[a], hi[a] = min(lo[a], p[a]), max(hi[a], p[a])
		}
		if g.dom != nil && !g.dom.contains(p) {
			return fault.At(fault.InvalidModel, pointer("/nodes", i), "node %d lies outside the design domain", i)
		}
	}
	if pairs := int64(n) * int64(n-1) / 2; pairs > int64(opt.MaxCandidates) {
		return fault.At(fault.InvalidModel, "/nodes", "%d nodes give up to %d candidate members, more than the limit of %d", n, pairs, opt.MaxCandidates)
	}
	g.eps = 1e-9 * norm(sub(hi, lo))
	g.spacing = math.Inf(1)
	// The nearest pair by sorting along x and scanning while the x gap is
	// below the best distance (common practice).
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	sort.Slice(order, func(s, t int) bool { return g.nodes[order[s]][0] < g.nodes[order[t]][0] })
	for s := range order {
		for t := s + 1; t < n && g.nodes[order[t]][0]-g.nodes[order[s]][0] < g.spacing; t++ {
			d := norm(sub(g.nodes[order[t]], g.nodes[order[s]]))
			if d <= g.eps {
				i, j := order[s], order[t]
				return fault.At(fault.InvalidModel, pointer("/nodes", max(i, j)), "nodes %d and %d coincide", min(i, j), max(i, j))
			}
			g.spacing = min(g.spacing, d)
		}
	}
	return nil
}

// ray is the direction from one node to another.
type ray struct {
	to       int32
	distance float64
	unit     vec
}

// ownNeighbours connects node a to every node it sees inside the domain,
// leaving out a partner behind a nearer node in the same direction (the
// member would pass through it) unless overlaps are kept. Rays are sorted
// by their unit vector's x component; rays in one direction differ in it by
// at most the angle between them, so only a narrow window is compared.
func (g *groundStructure) ownNeighbours(a int, half bool, buf []int32) []int32 {
	rays := make([]ray, 0, len(g.nodes)-1)
	for j := range g.nodes {
		if j == a {
			continue
		}
		d := sub(g.nodes[j], g.nodes[a])
		dist := norm(d)
		rays = append(rays, ray{int32(j), dist, scaled(d, 1/dist)})
	}
	sort.Slice(rays, func(s, t int) bool { return rays[s].unit[0] < rays[t].unit[0] })
	// Two rays within angle eps/spacing count as one direction.
	angle := g.eps / g.spacing
	for s, r := range rays {
		if (half && int(r.to) < a) || (g.test && !g.dom.admits(g.nodes[a], g.nodes[r.to])) {
			continue
		}
		if !g.keepOverlaps && g.blocked(rays, s, angle) {
			continue
		}
		buf = append(buf, r.to)
	}
	return buf
}

// blocked reports whether a nearer ray lies in the direction of rays[s].
func (g *groundStructure) blocked(rays []ray, s int, angle float64) bool {
	r := rays[s]
	for _, step := range []int{-1, 1} {
		for t := s + step; t >= 0 && t < len(rays) && math.Abs(rays[t].unit[0]-r.unit[0]) <= 2*angle; t += step {
			o := rays[t]
			if o.distance < r.distance && norm(sub(o.unit, r.unit)) <= 2*angle {
				return true
			}
		}
	}
	return false
}

// countCandidates counts the candidates, stopping with an error past the
// limit.
func (g *groundStructure) countCandidates(ctx context.Context, p *Problem, opt Options) error {
	var buf []int32
	for a := range g.nodes {
		if a%64 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		buf = g.neighbours(a, true, buf)
		g.count += len(buf)
		if g.count > opt.MaxCandidates {
			if g.grid != nil {
				return fault.At(fault.InvalidModel, "/level", "connectivity level %d on a grid of %v divisions (%d nodes) gives more candidate members than the limit of %d; lower the level or coarsen the grid", p.Level, g.grid.steps[:g.dim], len(g.nodes), opt.MaxCandidates)
			}
			return fault.At(fault.InvalidModel, "/nodes", "%d nodes give more candidate members than the limit of %d", len(g.nodes), opt.MaxCandidates)
		}
	}
	return nil
}

// pickStart chooses each node's perNode shortest candidates (ties by node
// index, so the choice does not depend on the order of generation).
func (g *groundStructure) pickStart(ctx context.Context, perNode int) {
	type near struct {
		length float64
		to     int32
	}
	closer := func(x, y near) bool { return x.length < y.length || (x.length == y.length && x.to < y.to) }
	seen := make(map[uint64]bool)
	var buf []int32
	list := make([]near, 0, perNode+1)
	for a := range g.nodes {
		if a%64 == 0 && ctx.Err() != nil {
			return
		}
		buf = g.neighbours(a, false, buf)
		list = list[:0]
		for _, b := range buf {
			nr := near{norm(sub(g.nodes[b], g.nodes[a])), b}
			if len(list) == perNode && !closer(nr, list[perNode-1]) {
				continue
			}
			at := sort.Search(len(list), func(k int) bool { return closer(nr, list[k]) })
			if len(list) < perNode {
				list = append(list, near{})
			}
			copy(list[at+1:], list[at:])
			list[at] = nr
		}
		for _, nr := range list {
			c := candidate{int32(min(a, int(nr.to))), int32(max(a, int(nr.to)))}
			if !seen[c.key()] {
				seen[c.key()] = true
				g.start = append(g.start, c)
			}
		}
	}
	sort.Slice(g.start, func(i, j int) bool { return g.start[i].key() < g.start[j].key() })
}

func (g *groundStructure) length(c candidate) float64 {
	return norm(sub(g.nodes[c.b], g.nodes[c.a]))
}
