package reciprocal

import (
	"fmt"
	"math"
	"slices"

	"gusset/engine/fault"
)

// orientEps is the relative size below which an orientation (twice a
// triangle's signed area) counts as zero: points that close to a line are
// treated as on it, so near-touching members are reported rather than
// embedded into sliver faces.
const orientEps = 1e-10

// maxCrossingProblems caps the crossing pairs listed in an error.
const maxCrossingProblems = 10

// orient returns the orientation of c relative to the directed line a→b:
// +1 left, −1 right, 0 on the line within orientEps.
func orient(a, b, c [2]float64) int {
	bx, by := b[0]-a[0], b[1]-a[1]
	cx, cy := c[0]-a[0], c[1]-a[1]
	o := bx*cy - by*cx
	if o*o <= orientEps*orientEps*(bx*bx+by*by)*(cx*cx+cy*cy) {
		return 0
	}
	if o > 0 {
		return 1
	}
	return -1
}

// onSegment reports whether c, known to be on the line through a and b,
// lies within the closed segment ab.
func onSegment(a, b, c [2]float64) bool {
	bx, by := b[0]-a[0], b[1]-a[1]
	t := ((c[0]-a[0])*bx + (c[1]-a[1])*by) / (bx*bx + by*by)
	return t >= -orientEps && t <= 1+orientEps
}

// conflict reports whether members i and j, with end points p and q, cross,
// touch or overlap anywhere other than at a shared end node.
func conflict(pi, pj [2]int, xy [][2]float64) bool {
	a, b := xy[pi[0]], xy[pi[1]]
	c, d := xy[pj[0]], xy[pj[1]]
	shared := 0
	var s, p, q int
	for _, u := range pi {
		for _, v := range pj {
			if u == v {
				shared++
				s = u
			}
		}
	}
	switch shared {
	case 2:
		return true // two members on the same pair of nodes overlap
	case 1:
		p, q = pi[0]+pi[1]-s, pj[0]+pj[1]-s
		sp, pp, qp := xy[s], xy[p], xy[q]
		if orient(sp, pp, qp) != 0 {
			return false
		}
		// Collinear through the shared node: they overlap when both run
		// the same way from it.
		return (pp[0]-sp[0])*(qp[0]-sp[0])+(pp[1]-sp[1])*(qp[1]-sp[1]) > 0
	}
	o1, o2 := orient(c, d, a), orient(c, d, b)
	o3, o4 := orient(a, b, c), orient(a, b, d)
	if o1*o2 < 0 && o3*o4 < 0 {
		return true
	}
	return (o3 == 0 && onSegment(a, b, c)) || (o4 == 0 && onSegment(a, b, d)) ||
		(o1 == 0 && onSegment(c, d, a)) || (o2 == 0 && onSegment(c, d, b))
}

// checkPlanar returns a NotPlanar error naming the crossing, touching or
// overlapping member pairs, or nil when the drawing is a plane embedding.
// Members are bucketed into a uniform grid of about one cell per member, so
// the cost is near linear for networks whose members are of similar length.
func checkPlanar(xy [][2]float64, ends [][2]int, ids []string) error {
	if len(ends) < 2 {
		return nil
	}
	pairs := newMemberGrid(xy, ends).conflictingPairs(xy, ends)
	if len(pairs) == 0 {
		return nil
	}
	return crossingError(pairs, ids)
}

// cellBox is the inclusive range of grid cells a member's bounding box covers.
type cellBox struct{ x0, y0, x1, y1 int }

// memberGrid buckets members by the uniform grid cells their bounding boxes
// cover, so only members sharing a cell are tested against each other.
type memberGrid struct {
	nx, ny int
	boxes  []cellBox
	extent [][4]float64 // min x, min y, max x, max y, in the model's length unit
	count  []int32      // cell c's members are items[count[c]:count[c+1]]
	items  []int32
}

// newMemberGrid sizes the cells from the network's extent and mean member
// length and fills them with the members' bounding boxes.
func newMemberGrid(xy [][2]float64, ends [][2]int) *memberGrid {
	n := len(ends)
	minX, minY := math.Inf(1), math.Inf(1)
	maxX, maxY := math.Inf(-1), math.Inf(-1)
	meanLen := 0.0
	for _, e := range ends {
		for _, v := range e {
			minX, maxX = math.Min(minX, xy[v][0]), math.Max(maxX, xy[v][0])
			minY, maxY = math.Min(minY, xy[v][1]), math.Max(maxY, xy[v][1])
		}
		meanLen += math.Hypot(xy[e[1]][0]-xy[e[0]][0], xy[e[1]][1]-xy[e[0]][1])
	}
	meanLen /= float64(n)
	w, h := maxX-minX, maxY-minY
	cell := math.Max(math.Sqrt(w*h/float64(n)), meanLen)
	if cell <= 0 {
		cell = 1
	}
	nx := min(int(w/cell)+1, 4*n)
	ny := min(int(h/cell)+1, 4*n/nx+1)
	cellOf := func(x, y float64) (int, int) {
		ix := min(max(int((x-minX)/cell), 0), nx-1)
		iy := min(max(int((y-minY)/cell), 0), ny-1)
		return ix, iy
	}
	g := &memberGrid{nx: nx, ny: ny, boxes: make([]cellBox, n), extent: make([][4]float64, n), count: make([]int32, nx*ny+1)}
	for e, en := range ends {
		a, b := xy[en[0]], xy[en[1]]
		x0, y0 := cellOf(math.Min(a[0], b[0]), math.Min(a[1], b[1]))
		x1, y1 := cellOf(math.Max(a[0], b[0]), math.Max(a[1], b[1]))
		g.boxes[e] = cellBox{x0, y0, x1, y1}
		g.extent[e] = [4]float64{math.Min(a[0], b[0]), math.Min(a[1], b[1]), math.Max(a[0], b[0]), math.Max(a[1], b[1])}
		for iy := y0; iy <= y1; iy++ {
			for ix := x0; ix <= x1; ix++ {
				g.count[iy*nx+ix+1]++
			}
		}
	}
	g.fill()
	return g
}

// fill turns the per-cell counts into offsets and lists each cell's members.
func (g *memberGrid) fill() {
	count := g.count
	for c := 1; c < len(count); c++ {
		count[c] += count[c-1]
	}
	g.items = make([]int32, count[len(count)-1])
	fill := slices.Clone(count[:len(count)-1])
	for e, bx := range g.boxes {
		for iy := bx.y0; iy <= bx.y1; iy++ {
			for ix := bx.x0; ix <= bx.x1; ix++ {
				c := iy*g.nx + ix
				g.items[fill[c]] = int32(e)
				fill[c]++
			}
		}
	}
}

// conflictingPairs returns the member pairs (lower index first) that cross,
// touch or overlap away from a shared node, in the order found.
func (g *memberGrid) conflictingPairs(xy [][2]float64, ends [][2]int) [][2]int {
	boxes, extent := g.boxes, g.extent
	var pairs [][2]int
	for iy := 0; iy < g.ny; iy++ {
		for ix := 0; ix < g.nx; ix++ {
			c := iy*g.nx + ix
			list := g.items[g.count[c]:g.count[c+1]]
			for a := 0; a < len(list); a++ {
				i := int(list[a])
				for b := a + 1; b < len(list); b++ {
					j := int(list[b])
					// Test each pair once: in the first cell its two boxes share.
					if max(boxes[i].x0, boxes[j].x0) != ix || max(boxes[i].y0, boxes[j].y0) != iy {
						continue
					}
					p, q := &extent[i], &extent[j]
					if p[0] > q[2] || q[0] > p[2] || p[1] > q[3] || q[1] > p[3] {
						continue
					}
					if conflict(ends[i], ends[j], xy) {
						pairs = append(pairs, [2]int{min(i, j), max(i, j)})
					}
				}
			}
		}
	}
	return pairs
}

// crossingError sorts the conflicting pairs and reports the first
// maxCrossingProblems of them, each with the pointers of both members.
func crossingError(pairs [][2]int, ids []string) error {
	slices.SortFunc(pairs, func(p, q [2]int) int {
		if p[0] != q[0] {
			return p[0] - q[0]
		}
		return p[1] - q[1]
	})
	first := pairs[0]
	err := &fault.Error{
		Kind: fault.NotPlanar,
		Message: fmt.Sprintf("the network is not planar: members %q and %q cross, touch or overlap away from a shared node (%d such pairs); a reciprocal diagram needs a plane drawing, so add a node where they meet or move one",
			ids[first[0]], ids[first[1]], len(pairs)),
		Detail: pairs[:min(len(pairs), maxCrossingProblems)],
	}
	for _, p := range pairs[:min(len(pairs), maxCrossingProblems)] {
		msg := fmt.Sprintf("members %q and %q cross, touch or overlap away from a shared node", ids[p[0]], ids[p[1]])
		err.Problems = append(err.Problems,
			fault.Problem{Path: fmt.Sprintf("/members/%d", p[0]), Message: msg},
			fault.Problem{Path: fmt.Sprintf("/members/%d", p[1]), Message: msg})
	}
	return err
}
