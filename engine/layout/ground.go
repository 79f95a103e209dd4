package layout

import (
	"context"
	"fmt"
	"math"
	"sort"

	"gusset/engine/fault"
)

// candidate is a possible member between two nodes (indices, first < second).
type candidate struct{ a, b int32 }

// groundStructure is the set of nodes and candidate members of a problem.
type groundStructure struct {
	nodes      [][2]float64
	candidates []candidate
	// start lists the candidates of the first member-adding program: each
	// node's eight shortest candidates (on a square grid, the members to
	// the eight neighbouring nodes).
	start []int
	// spacing is the smallest distance between two nodes.
	spacing float64
}

func pointer(base string, i int) string { return fmt.Sprintf("%s/%d", base, i) }

func gcd(a, b int) int {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// buildGround makes the nodes and candidate members. reg may be nil for the
// caller's own nodes without a domain.
func buildGround(ctx context.Context, p *Problem, reg *region, opt Options) (*groundStructure, error) {
	g := &groundStructure{}
	var err error
	if len(p.Nodes) > 0 {
		err = g.ownNodes(ctx, p.Nodes, reg, opt, p.JointCost > 0)
	} else {
		err = g.grid(ctx, p, reg, opt)
	}
	if err != nil {
		return nil, err
	}
	g.pickStart()
	return g, nil
}

func (g *groundStructure) grid(ctx context.Context, p *Problem, reg *region, opt Options) error {
	if reg == nil {
		return fault.At(fault.InvalidModel, "/domain", "a grid needs a design domain")
	}
	width, height := reg.hi[0]-reg.lo[0], reg.hi[1]-reg.lo[1]
	nx, ny := p.Divisions[0], p.Divisions[1]
	if nx == 0 && ny == 0 {
		if !(p.Spacing > 0) || !finite(p.Spacing) {
			return fault.At(fault.InvalidModel, "/spacing", "give grid divisions, a positive spacing or the nodes")
		}
		nx = max(1, int(math.Round(width/p.Spacing)))
		ny = max(1, int(math.Round(height/p.Spacing)))
	}
	if nx < 1 || ny < 1 {
		return fault.At(fault.InvalidModel, "/divisions", "grid divisions must be at least 1 in x and y, got %d × %d", nx, ny)
	}
	if int64(nx+1)*int64(ny+1) > int64(opt.MaxCandidates) {
		return fault.At(fault.InvalidModel, "/divisions", "a %d × %d grid has %d nodes, more than the candidate limit of %d", nx, ny, (nx+1)*(ny+1), opt.MaxCandidates)
	}
	hx, hy := width/float64(nx), height/float64(ny)
	g.spacing = min(hx, hy)
	at := make([]int32, (nx+1)*(ny+1)) // node index of grid point (ix, iy), or −1
	for iy := 0; iy <= ny; iy++ {
		for ix := 0; ix <= nx; ix++ {
			pt := [2]float64{reg.lo[0] + float64(ix)*hx, reg.lo[1] + float64(iy)*hy}
			if ix == nx {
				pt[0] = reg.hi[0]
			}
			if iy == ny {
				pt[1] = reg.hi[1]
			}
			at[iy*(nx+1)+ix] = -1
			if reg.contains(pt) {
				at[iy*(nx+1)+ix] = int32(len(g.nodes))
				g.nodes = append(g.nodes, pt)
			}
		}
	}
	if len(g.nodes) < 2 {
		return fault.At(fault.InvalidModel, "/domain", "the grid has %d node(s) inside the design domain; refine it", len(g.nodes))
	}
	level := p.Level
	if level < 0 {
		return fault.At(fault.InvalidModel, "/level", "the connectivity level must be 0 (full) or positive, got %d", level)
	}
	maxX, maxY := nx, ny
	if level > 0 {
		maxX, maxY = min(nx, level), min(ny, level)
	}
	coprime := make([]bool, (maxX+1)*(maxY+1))
	for dx := 0; dx <= maxX; dx++ {
		for dy := 0; dy <= maxY; dy++ {
			// With a joint cost a long member is cheaper than the chain
			// of short ones along it, so overlapping members stay.
			coprime[dx*(maxY+1)+dy] = gcd(dx, dy) == 1 || (p.JointCost > 0 && (dx > 0 || dy > 0))
		}
	}
	count := 0
	for iy := 0; iy <= ny; iy++ {
		if err := ctx.Err(); err != nil {
			return err
		}
		for ix := 0; ix <= nx; ix++ {
			a := at[iy*(nx+1)+ix]
			if a < 0 {
				continue
			}
			for dx := 0; dx <= maxX && ix+dx <= nx; dx++ {
				for dy := -maxY; dy <= maxY; dy++ {
					if dx == 0 && dy <= 0 {
						continue
					}
					jy := iy + dy
					if jy < 0 || jy > ny || !coprime[dx*(maxY+1)+abs(dy)] {
						continue
					}
					b := at[jy*(nx+1)+ix+dx]
					if b < 0 {
						continue
					}
					count++
					if count > opt.MaxCandidates {
						continue
					}
					if !reg.admits(g.nodes[a], g.nodes[b]) {
						count--
						continue
					}
					g.candidates = append(g.candidates, candidate{min(a, b), max(a, b)})
				}
			}
		}
	}
	if count > opt.MaxCandidates {
		return fault.At(fault.InvalidModel, "/level", "connectivity level %d on a %d × %d grid (%d nodes) gives at least %d candidate members, more than the limit of %d; lower the level or coarsen the grid", level, nx, ny, len(g.nodes), count, opt.MaxCandidates)
	}
	return nil
}

func abs(i int) int {
	if i < 0 {
		return -i
	}
	return i
}

// ownNodes connects every pair of the caller's nodes that sees each other
// inside the domain, keeping of collinear overlapping pairs only the
// shortest (no member passes through a node) unless keepOverlaps: with a
// joint cost the long member costs less than the chain along it.
func (g *groundStructure) ownNodes(ctx context.Context, nodes [][2]float64, reg *region, opt Options, keepOverlaps bool) error {
	g.nodes = nodes
	n := len(nodes)
	if n < 2 {
		return fault.At(fault.InvalidModel, "/nodes", "at least 2 nodes are needed, got %d", n)
	}
	lo, hi := nodes[0], nodes[0]
	for i, p := range nodes {
		if !finite(p[0]) || !finite(p[1]) {
			return fault.At(fault.InvalidModel, pointer("/nodes", i), "node %d is not a finite point", i)
		}
		for a := 0; a < 2; a++ {
			lo[a] = min(lo[a], p[a])
			hi[a] = max(hi[a], p[a])
		}
		if reg != nil && !reg.contains(p) {
			return fault.At(fault.InvalidModel, pointer("/nodes", i), "node %d lies outside the design domain", i)
		}
	}
	if pairs := int64(n) * int64(n-1) / 2; pairs > int64(opt.MaxCandidates) {
		return fault.At(fault.InvalidModel, "/nodes", "%d nodes give up to %d candidate members, more than the limit of %d", n, pairs, opt.MaxCandidates)
	}
	eps := 1e-9 * math.Hypot(hi[0]-lo[0], hi[1]-lo[1])
	g.spacing = math.Inf(1)
	type ray struct {
		to       int
		angle    float64
		distance float64
		d        [2]float64
	}
	rays := make([]ray, 0, n)
	for i := 0; i < n; i++ {
		if err := ctx.Err(); err != nil {
			return err
		}
		rays = rays[:0]
		for j := 0; j < n; j++ {
			if j == i {
				continue
			}
			d := [2]float64{nodes[j][0] - nodes[i][0], nodes[j][1] - nodes[i][1]}
			dist := math.Hypot(d[0], d[1])
			if dist <= eps {
				return fault.At(fault.InvalidModel, pointer("/nodes", max(i, j)), "nodes %d and %d coincide", min(i, j), max(i, j))
			}
			g.spacing = min(g.spacing, dist)
			rays = append(rays, ray{j, math.Atan2(d[1], d[0]), dist, d})
		}
		sort.Slice(rays, func(s, t int) bool { return rays[s].angle < rays[t].angle })
		// Rays in one direction are neighbours in angle order (the cut at
		// ±π is joined below); only the nearest of each group is kept.
		collinear := func(r, s ray) bool {
			cross := r.d[0]*s.d[1] - r.d[1]*s.d[0]
			return r.d[0]*s.d[0]+r.d[1]*s.d[1] > 0 && math.Abs(cross) <= eps*max(r.distance, s.distance)
		}
		m := len(rays)
		for s := 0; s < m; s++ {
			r := rays[s]
			if r.to < i {
				continue
			}
			blocked := false
			for t := s - 1; t >= s-m+1; t-- {
				o := rays[(t+m)%m]
				if !collinear(r, o) {
					break
				}
				blocked = blocked || o.distance < r.distance
			}
			for t := s + 1; t < s+m; t++ {
				o := rays[t%m]
				if !collinear(r, o) {
					break
				}
				blocked = blocked || o.distance < r.distance
			}
			if (blocked && !keepOverlaps) || (reg != nil && !reg.admits(nodes[i], nodes[r.to])) {
				continue
			}
			g.candidates = append(g.candidates, candidate{int32(i), int32(r.to)})
		}
	}
	return nil
}

// pickStart chooses each node's eight shortest candidates.
func (g *groundStructure) pickStart() {
	const perNode = 8
	type near struct {
		length float64
		index  int
	}
	best := make([][]near, len(g.nodes))
	offer := func(node int32, nr near) {
		list := best[node]
		if len(list) == perNode && nr.length >= list[perNode-1].length {
			return
		}
		at := sort.Search(len(list), func(k int) bool { return list[k].length > nr.length })
		if len(list) < perNode {
			list = append(list, near{})
		}
		copy(list[at+1:], list[at:])
		list[at] = nr
		best[node] = list
	}
	for k, c := range g.candidates {
		nr := near{g.length(c), k}
		offer(c.a, nr)
		offer(c.b, nr)
	}
	chosen := make(map[int]bool)
	for _, list := range best {
		for _, nr := range list {
			if !chosen[nr.index] {
				chosen[nr.index] = true
				g.start = append(g.start, nr.index)
			}
		}
	}
	sort.Ints(g.start)
}

func (g *groundStructure) length(c candidate) float64 {
	p, q := g.nodes[c.a], g.nodes[c.b]
	return math.Hypot(q[0]-p[0], q[1]-p[1])
}
