package reciprocal

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"gusset/engine/fault"
)

// extForce is one external force line at a node: an applied load, a
// reaction, or their sum.
type extForce struct {
	node  int
	force [2]float64
	index int // position in the caller's order of external forces
}

// ray is an external force drawn as a half-line from its node to infinity,
// placed in the outer face. Its left side is the space before it and its
// right side the space after it, reading clockwise round the network.
type ray struct {
	extForce
	dir         [2]float64 // unit direction of the half-line, from the node outwards
	left, right int        // spaces on either side
}

// embedding is the plane embedding of a form diagram: half-edges sorted by
// angle round each node, faces traced, the outer face split by the external
// forces into spaces. Member e has half-edges 2e (from Ends[0] to Ends[1])
// and 2e+1 (back); half-edge h's twin is h^1.
type embedding struct {
	xy   [][2]float64
	ends [][2]int

	start []int32   // per node: first entry in around; len nodes+1
	round []int32   // outgoing half-edges per node, counter-clockwise by angle
	pos   []int32   // per half-edge: its index in round
	angle []float64 // per half-edge: direction angle in radians

	faceOf []int32 // per half-edge: the space or face on its left

	rays     []ray // in clockwise order round the boundary, rays[0] first
	spaces   int   // lettered spaces (the outer face split by rays); at least 1
	faces    int   // spaces plus inner faces
	boundary [][]int
	anchor   [][2]float64 // a point inside each face or space, for labels
	diag     float64      // diagonal of the nodes' bounding box
}

func (g *embedding) origin(h int32) int { return g.ends[h/2][h%2] }
func (g *embedding) target(h int32) int { return g.ends[h/2][1-h%2] }

// next returns the half-edge after h round the face on h's left: the edge
// just clockwise of h's twin round h's target.
func (g *embedding) next(h int32) int32 {
	t := g.target(h)
	s, e := g.start[t], g.start[t+1]
	p := g.pos[h^1]
	if p == s {
		p = e
	}
	return g.round[p-1]
}

// cwAngle returns the clockwise angle from direction from to direction to,
// in [0, 2π).
func cwAngle(from, to float64) float64 {
	a := math.Mod(from-to, 2*math.Pi)
	if a < 0 {
		a += 2 * math.Pi
	}
	return a
}

// embed builds the embedding of a planar, connected network. It assumes
// checkPlanar passed and every member has positive length.
func embed(xy [][2]float64, ends [][2]int, forces []extForce, nodeIDs []string) (*embedding, error) {
	g := &embedding{xy: xy, ends: ends}
	g.buildRotation()
	if err := g.checkConnected(forces, nodeIDs); err != nil {
		return nil, err
	}
	g.diag = g.size()
	first, area, outer := g.traceRawFaces()
	walk := g.outerWalk(first[outer])
	cornerRays, err := g.placeRays(walk, forces, nodeIDs)
	if err != nil {
		return nil, err
	}
	g.assignSpaces(walk, cornerRays)
	g.numberInnerFaces(first, area, outer, len(walk))
	return g, nil
}

// buildRotation fills the half-edge tables: start (the first half-edge slot
// of each node), round (each node's outgoing half-edges sorted by angle,
// counter-clockwise from −π), angle (radians) and pos (a half-edge's slot in
// round).
func (g *embedding) buildRotation() {
	n, m := len(g.xy), len(g.ends)
	xy := g.xy
	g.start = make([]int32, n+1)
	for _, e := range g.ends {
		g.start[e[0]+1]++
		g.start[e[1]+1]++
	}
	for i := 1; i <= n; i++ {
		g.start[i] += g.start[i-1]
	}
	g.round = make([]int32, 2*m)
	g.angle = make([]float64, 2*m)
	fill := slices.Clone(g.start[:n])
	for h := int32(0); h < int32(2*m); h++ {
		o, t := g.origin(h), g.target(h)
		g.angle[h] = math.Atan2(xy[t][1]-xy[o][1], xy[t][0]-xy[o][0])
		g.round[fill[o]] = h
		fill[o]++
	}
	g.pos = make([]int32, 2*m)
	for v := 0; v < n; v++ {
		list := g.round[g.start[v]:g.start[v+1]]
		slices.SortFunc(list, func(a, b int32) int { return cmp.Compare(g.angle[a], g.angle[b]) })
		for k, h := range list {
			g.pos[h] = g.start[v] + int32(k)
		}
	}
}

// traceRawFaces traces the faces of the members alone and returns each
// face's first half-edge, its signed area (counter-clockwise positive, in the
// square of the model's length unit) and the outer face: the only face traced
// clockwise (negative area), the most negative one.
func (g *embedding) traceRawFaces() (first []int32, area []float64, outer int32) {
	xy := g.xy
	raw := make([]int32, 2*len(g.ends))
	for i := range raw {
		raw[i] = -1
	}
	for h0 := int32(0); h0 < int32(len(raw)); h0++ {
		if raw[h0] >= 0 {
			continue
		}
		f := int32(len(first))
		first = append(first, h0)
		a := 0.0
		for h := h0; raw[h] < 0; h = g.next(h) {
			raw[h] = f
			p, q := xy[g.origin(h)], xy[g.target(h)]
			a += p[0]*q[1] - p[1]*q[0]
		}
		area = append(area, a/2)
	}
	for f := range area {
		if area[f] < area[outer] {
			outer = int32(f)
		}
	}
	return first, area, outer
}

// outerWalk lists the half-edges of the face that begins at h0, in order.
func (g *embedding) outerWalk(h0 int32) []int32 {
	var walk []int32
	for h := h0; ; {
		walk = append(walk, h)
		h = g.next(h)
		if h == h0 {
			break
		}
	}
	return walk
}

// numberInnerFaces numbers the inner faces after the outer spaces, left to
// right by centroid (then bottom to top), as panels are in the textbooks, and
// fills their anchors, boundaries and faceOf entries. walkLen is the number
// of half-edges on the outer face.
func (g *embedding) numberInnerFaces(first []int32, area []float64, outer int32, walkLen int) {
	type inner struct {
		raw      int32
		centroid [2]float64
	}
	var inners []inner
	for f := range first {
		if int32(f) == outer {
			continue
		}
		inners = append(inners, inner{int32(f), g.centroidOf(first[f], area[f])})
	}
	slices.SortFunc(inners, func(a, b inner) int {
		if c := cmp.Compare(a.centroid[0], b.centroid[0]); c != 0 {
			return c
		}
		if c := cmp.Compare(a.centroid[1], b.centroid[1]); c != 0 {
			return c
		}
		return cmp.Compare(a.raw, b.raw)
	})
	g.faces = g.spaces + len(inners)
	g.boundary = make([][]int, g.faces)
	anchors := g.anchor
	g.anchor = make([][2]float64, g.faces)
	copy(g.anchor, anchors)
	// One backing array for all the boundaries.
	flat := make([]int, 0, 2*len(g.ends)-walkLen)
	for k, in := range inners {
		id := int32(g.spaces + k)
		g.anchor[id] = in.centroid
		h := first[in.raw]
		begin := len(flat)
		for {
			g.faceOf[h] = id
			flat = append(flat, g.origin(h))
			h = g.next(h)
			if h == first[in.raw] {
				break
			}
		}
		g.boundary[id] = flat[begin:len(flat):len(flat)]
	}
}

// checkConnected fails when the members do not form one connected network,
// or when an external force acts at a node no member reaches.
func (g *embedding) checkConnected(forces []extForce, nodeIDs []string) error {
	n := len(g.xy)
	seen := make([]bool, n)
	root := g.ends[0][0]
	seen[root] = true
	queue := []int{root}
	for len(queue) > 0 {
		v := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		for _, h := range g.round[g.start[v]:g.start[v+1]] {
			if t := g.target(h); !seen[t] {
				seen[t] = true
				queue = append(queue, t)
			}
		}
	}
	for v := 0; v < n; v++ {
		if g.start[v+1] > g.start[v] && !seen[v] {
			return fault.At(fault.InvalidModel, fmt.Sprintf("/nodes/%d", v),
				"node %q is not connected to node %q through members; a reciprocal diagram is built for one connected network", nodeIDs[v], nodeIDs[root])
		}
	}
	for _, f := range forces {
		if g.start[f.node+1] == g.start[f.node] {
			return fault.At(fault.InvalidModel, fmt.Sprintf("/nodes/%d", f.node),
				"an external force acts at node %q, which no member reaches", nodeIDs[f.node])
		}
	}
	return nil
}

// placeRays puts every external force into a corner of the outer face at
// its node and returns the rays of each corner of the walk, sorted in
// clockwise order. Corner k lies at the target of walk[k], swept clockwise
// from the twin of walk[k] to walk[k+1]. A force is drawn along its line of
// action on the side it pushes from (−F) when that side is outside, else on
// the side it pulls to (+F), else along the bisector of the first outer
// corner at its node.
func (g *embedding) placeRays(walk []int32, forces []extForce, nodeIDs []string) ([][]ray, error) {
	cornersAt := make(map[int][]int)
	loaded := make(map[int]bool, len(forces))
	for _, f := range forces {
		loaded[f.node] = true
	}
	for k, h := range walk {
		if v := g.target(h); loaded[v] {
			cornersAt[v] = append(cornersAt[v], k)
		}
	}
	corner := func(k int) (from, width float64) {
		h, nx := walk[k], walk[(k+1)%len(walk)]
		from = g.angle[h^1]
		if nx == h^1 {
			return from, 2 * math.Pi
		}
		return from, cwAngle(from, g.angle[nx])
	}
	type keyed struct {
		ray
		key float64
	}
	byCorner := make(map[int][]keyed)
	for _, f := range forces {
		ks := cornersAt[f.node]
		if len(ks) == 0 {
			return nil, fault.At(fault.NotPlanar, fmt.Sprintf("/nodes/%d", f.node),
				"an external force acts at node %q inside the network: it cannot be drawn to the outside without crossing members, so the network with its loads is not planar", nodeIDs[f.node])
		}
		theta := math.Atan2(-f.force[1], -f.force[0])
		chosen, key := -1, 0.0
		for _, th := range []float64{theta, theta + math.Pi} {
			for _, k := range ks {
				from, width := corner(k)
				if c := cwAngle(from, th); c > 0 && c < width {
					chosen, key = k, c
					break
				}
			}
			if chosen >= 0 {
				theta = th
				break
			}
		}
		if chosen < 0 {
			from, width := corner(ks[0])
			chosen, key, theta = ks[0], width/2, from-width/2
		}
		byCorner[chosen] = append(byCorner[chosen], keyed{ray{extForce: f, dir: [2]float64{math.Cos(theta), math.Sin(theta)}}, key})
	}
	out := make([][]ray, len(walk))
	for k, list := range byCorner {
		slices.SortStableFunc(list, func(a, b keyed) int {
			if c := cmp.Compare(a.key, b.key); c != 0 {
				return c
			}
			return cmp.Compare(a.index, b.index)
		})
		for _, r := range list {
			out[k] = append(out[k], r.ray)
		}
	}
	return out, nil
}

// assignSpaces splits the outer face into spaces by the rays, numbers the
// spaces clockwise from the first ray, and sets the left face of every
// half-edge of the outer walk. The first ray is the one at the leftmost
// loaded node (smallest x, then smallest y, then first in the caller's
// order); space 0 is the one clockwise after it.
func (g *embedding) assignSpaces(walk []int32, cornerRays [][]ray) {
	g.faceOf = make([]int32, 2*len(g.ends))
	type event struct {
		half   int32 // member half-edge, or −1
		corner int
		slot   int
	}
	var events []event
	start := -1
	for k, h := range walk {
		events = append(events, event{half: h, corner: k, slot: -1})
		for s, r := range cornerRays[k] {
			events = append(events, event{half: -1, corner: k, slot: s})
			if start < 0 {
				start = len(events) - 1
				continue
			}
			best := cornerRays[events[start].corner][events[start].slot]
			p, q := g.xy[r.node], g.xy[best.node]
			if p[0] < q[0] || (p[0] == q[0] && (p[1] < q[1] || (p[1] == q[1] && r.index < best.index))) {
				start = len(events) - 1
			}
		}
	}
	spaceEdges := [][]int32{nil}
	if start < 0 {
		g.spaces = 1
		for _, h := range walk {
			g.faceOf[h] = 0
			spaceEdges[0] = append(spaceEdges[0], h)
		}
	} else {
		cur := int32(0)
		for i := 1; i <= len(events); i++ {
			ev := events[(start+i)%len(events)]
			if ev.half >= 0 {
				g.faceOf[ev.half] = cur
				spaceEdges[cur] = append(spaceEdges[cur], ev.half)
				continue
			}
			r := cornerRays[ev.corner][ev.slot]
			r.left = int(cur)
			if i < len(events) {
				cur++
				spaceEdges = append(spaceEdges, nil)
			} else {
				cur = 0
			}
			r.right = int(cur)
			g.rays = append(g.rays, r)
		}
		// The first ray was met last; put it first.
		g.rays = append(g.rays[len(g.rays)-1:], g.rays[:len(g.rays)-1]...)
		g.spaces = len(spaceEdges)
	}
	g.anchor = make([][2]float64, g.spaces)
	for s, hs := range spaceEdges {
		g.anchor[s] = g.spaceAnchor(s, hs, g.diag)
	}
}

// size returns the diagonal of the nodes' bounding box.
func (g *embedding) size() float64 {
	minX, minY := math.Inf(1), math.Inf(1)
	maxX, maxY := math.Inf(-1), math.Inf(-1)
	for _, e := range g.ends {
		for _, v := range e {
			minX, maxX = math.Min(minX, g.xy[v][0]), math.Max(maxX, g.xy[v][0])
			minY, maxY = math.Min(minY, g.xy[v][1]), math.Max(maxY, g.xy[v][1])
		}
	}
	return math.Hypot(maxX-minX, maxY-minY)
}

// spaceAnchor returns a point inside space s for its label: just outside
// the middle member of its stretch of boundary, or on the bisector between
// its two rays when they leave the same node with no member between.
func (g *embedding) spaceAnchor(s int, hs []int32, size float64) [2]float64 {
	off := 0.08 * size
	if len(hs) == 0 {
		var before, after ray
		for _, r := range g.rays {
			if r.right == s {
				before = r
			}
			if r.left == s {
				after = r
			}
		}
		a0 := math.Atan2(before.dir[1], before.dir[0])
		w := cwAngle(a0, math.Atan2(after.dir[1], after.dir[0]))
		bis := a0 - w/2
		p := g.xy[before.node]
		return [2]float64{p[0] + 2*off*math.Cos(bis), p[1] + 2*off*math.Sin(bis)}
	}
	h := hs[len(hs)/2]
	if g.spaces == 1 {
		// One space all round: label it beside the topmost member.
		best := -math.MaxFloat64
		for _, c := range hs {
			if y := g.xy[g.origin(c)][1] + g.xy[g.target(c)][1]; y > best {
				best, h = y, c
			}
		}
	}
	p, q := g.xy[g.origin(h)], g.xy[g.target(h)]
	dx, dy := q[0]-p[0], q[1]-p[1]
	l := math.Hypot(dx, dy)
	return [2]float64{(p[0]+q[0])/2 - off*dy/l, (p[1]+q[1])/2 + off*dx/l}
}

// centroidOf returns the area centroid of the face traced from h0, or the
// mean of its corners when the area is negligible.
func (g *embedding) centroidOf(h0 int32, area float64) [2]float64 {
	var cx, cy, mx, my float64
	k := 0
	for h := h0; ; {
		p, q := g.xy[g.origin(h)], g.xy[g.target(h)]
		c := p[0]*q[1] - p[1]*q[0]
		cx += (p[0] + q[0]) * c
		cy += (p[1] + q[1]) * c
		mx += p[0]
		my += p[1]
		k++
		h = g.next(h)
		if h == h0 {
			break
		}
	}
	if math.Abs(area) > 1e-12*g.diag*g.diag {
		return [2]float64{cx / (6 * area), cy / (6 * area)}
	}
	return [2]float64{mx / float64(k), my / float64(k)}
}
