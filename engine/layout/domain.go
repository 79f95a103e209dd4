package layout

import (
	"math"
	"sort"

	"gusset/engine/fault"
)

// region is a checked domain with the tolerances its tests use.
type region struct {
	outline [][2]float64
	holes   [][][2]float64
	convex  bool // outline convex and no holes: any chord stays inside
	lo, hi  [2]float64
	eps     float64 // length below which points coincide
}

// signedArea returns the polygon's area, positive when anticlockwise.
func signedArea(poly [][2]float64) float64 {
	var sum float64
	for i := range poly {
		p, q := poly[i], poly[(i+1)%len(poly)]
		sum += p[0]*q[1] - q[0]*p[1]
	}
	return sum / 2
}

// newRegion checks a domain: finite vertices, at least three per polygon,
// an outline and holes with area, and area left over once the holes are
// taken out. Failures are *fault.Error of kind InvalidModel with pointers
// relative to the problem ("/domain/outline", "/domain/holes/1").
func newRegion(d Domain) (*region, error) {
	r := &region{outline: d.Outline, holes: d.Holes}
	if len(d.Outline) < 3 {
		return nil, fault.At(fault.InvalidModel, "/domain/outline", "the design domain needs an outline of at least 3 vertices, got %d", len(d.Outline))
	}
	r.lo, r.hi = d.Outline[0], d.Outline[0]
	for i, p := range d.Outline {
		if !finite(p[0]) || !finite(p[1]) {
			return nil, fault.At(fault.InvalidModel, pointer("/domain/outline", i), "outline vertex %d is not a finite number", i)
		}
		for a := 0; a < 2; a++ {
			r.lo[a] = min(r.lo[a], p[a])
			r.hi[a] = max(r.hi[a], p[a])
		}
	}
	diameter := math.Hypot(r.hi[0]-r.lo[0], r.hi[1]-r.lo[1])
	r.eps = 1e-9 * diameter
	area := math.Abs(signedArea(d.Outline))
	if !(area > 1e-12*diameter*diameter) {
		return nil, fault.At(fault.InvalidModel, "/domain/outline", "the design domain has no interior (outline area %g)", area)
	}
	net := area
	for h, hole := range d.Holes {
		path := pointer("/domain/holes", h)
		if len(hole) < 3 {
			return nil, fault.At(fault.InvalidModel, path, "hole %d needs at least 3 vertices, got %d", h, len(hole))
		}
		for i, p := range hole {
			if !finite(p[0]) || !finite(p[1]) {
				return nil, fault.At(fault.InvalidModel, pointer(path, i), "hole %d vertex %d is not a finite number", h, i)
			}
		}
		holeArea := math.Abs(signedArea(hole))
		if !(holeArea > 1e-12*diameter*diameter) {
			return nil, fault.At(fault.InvalidModel, path, "hole %d has no area", h)
		}
		net -= holeArea
	}
	if !(net > 1e-9*area) {
		return nil, fault.At(fault.InvalidModel, "/domain", "the design domain has no interior once its holes are taken out")
	}
	r.convex = len(d.Holes) == 0 && isConvex(d.Outline)
	return r, nil
}

func isConvex(poly [][2]float64) bool {
	sign := 0.0
	for i := range poly {
		p, q, s := poly[i], poly[(i+1)%len(poly)], poly[(i+2)%len(poly)]
		turn := (q[0]-p[0])*(s[1]-q[1]) - (q[1]-p[1])*(s[0]-q[0])
		if turn == 0 {
			continue
		}
		if sign == 0 {
			sign = turn
		} else if sign*turn < 0 {
			return false
		}
	}
	return true
}

// onBoundary reports whether p lies within eps of the polygon's boundary.
func onBoundary(poly [][2]float64, p [2]float64, eps float64) bool {
	for i := range poly {
		if segmentDistance(p, poly[i], poly[(i+1)%len(poly)]) <= eps {
			return true
		}
	}
	return false
}

// strictlyInside reports whether p is inside the polygon by the even–odd
// ray rule; points on the boundary give either answer, so test onBoundary
// first.
func strictlyInside(poly [][2]float64, p [2]float64) bool {
	inside := false
	for i, j := 0, len(poly)-1; i < len(poly); j, i = i, i+1 {
		a, b := poly[i], poly[j]
		if (a[1] > p[1]) != (b[1] > p[1]) {
			x := a[0] + (p[1]-a[1])*(b[0]-a[0])/(b[1]-a[1])
			if p[0] < x {
				inside = !inside
			}
		}
	}
	return inside
}

// vec is a point or vector; in the plane the third component is 0.
type vec = [3]float64

func flat(p vec) [2]float64 { return [2]float64{p[0], p[1]} }

// space is a checked design domain in the plane (region) or in space
// (solid).
type space interface {
	// contains reports whether p is in the closed domain.
	contains(p vec) bool
	// admits reports whether the segment pq lies in the closed domain.
	admits(p, q vec) bool
	// bounds returns the bounding box.
	bounds() (lo, hi vec)
	// holeAt returns the index of the hole p lies strictly inside, or −1.
	holeAt(p vec) int
	// edges returns the boundary's edges and the holes' edges, for drawing.
	edges() (outline, holes [][2]vec)
}

func (r *region) contains(p vec) bool { return r.containsFlat(flat(p)) }

func (r *region) admits(p, q vec) bool { return r.admitsFlat(flat(p), flat(q)) }

func (r *region) bounds() (lo, hi vec) {
	return vec{r.lo[0], r.lo[1]}, vec{r.hi[0], r.hi[1]}
}

func (r *region) holeAt(p vec) int {
	for h, hole := range r.holes {
		if !onBoundary(hole, flat(p), r.eps) && strictlyInside(hole, flat(p)) {
			return h
		}
	}
	return -1
}

func (r *region) edges() (outline, holes [][2]vec) {
	ring := func(poly [][2]float64, out [][2]vec) [][2]vec {
		for i := range poly {
			p, q := poly[i], poly[(i+1)%len(poly)]
			out = append(out, [2]vec{{p[0], p[1]}, {q[0], q[1]}})
		}
		return out
	}
	outline = ring(r.outline, nil)
	for _, h := range r.holes {
		holes = ring(h, holes)
	}
	return outline, holes
}

// containsFlat reports whether p is in the closed domain: inside or on the
// outline and not strictly inside a hole.
func (r *region) containsFlat(p [2]float64) bool {
	if !onBoundary(r.outline, p, r.eps) && !strictlyInside(r.outline, p) {
		return false
	}
	for _, hole := range r.holes {
		if !onBoundary(hole, p, r.eps) && strictlyInside(hole, p) {
			return false
		}
	}
	return true
}

// admits reports whether the segment pq lies in the closed domain. Both
// ends must be in it; the segment is cut where it meets the boundary and
// the middle of each piece is tested, which also catches a segment that
// leaves through a vertex or runs along an edge.
func (r *region) admitsFlat(p, q [2]float64) bool {
	if r.convex {
		return true
	}
	var cuts []float64
	collect := func(poly [][2]float64) {
		for i := range poly {
			cuts = segmentCuts(cuts, p, q, poly[i], poly[(i+1)%len(poly)], r.eps)
		}
	}
	collect(r.outline)
	for _, hole := range r.holes {
		collect(hole)
	}
	cuts = append(cuts, 0, 1)
	sort.Float64s(cuts)
	length := math.Hypot(q[0]-p[0], q[1]-p[1])
	for k := 0; k+1 < len(cuts); k++ {
		if (cuts[k+1]-cuts[k])*length <= r.eps {
			continue
		}
		t := (cuts[k] + cuts[k+1]) / 2
		if !r.containsFlat([2]float64{p[0] + t*(q[0]-p[0]), p[1] + t*(q[1]-p[1])}) {
			return false
		}
	}
	return true
}

// segmentCuts appends the parameters t ∈ (0, 1) at which p + t(q − p) meets
// the edge uv (crossing, touching, or the ends of a collinear overlap).
func segmentCuts(cuts []float64, p, q, u, v [2]float64, eps float64) []float64 {
	d := [2]float64{q[0] - p[0], q[1] - p[1]}
	e := [2]float64{v[0] - u[0], v[1] - u[1]}
	w := [2]float64{u[0] - p[0], u[1] - p[1]}
	denom := d[0]*e[1] - d[1]*e[0]
	dd := d[0]*d[0] + d[1]*d[1]
	add := func(t float64) {
		if t > 0 && t < 1 {
			cuts = append(cuts, t)
		}
	}
	lengthD, lengthE := math.Sqrt(dd), math.Hypot(e[0], e[1])
	if math.Abs(denom) <= 1e-12*lengthD*lengthE {
		// Parallel: only a collinear edge matters; cut at its ends.
		if math.Abs(w[0]*d[1]-w[1]*d[0])/lengthD <= eps {
			add((w[0]*d[0] + w[1]*d[1]) / dd)
			add(((v[0]-p[0])*d[0] + (v[1]-p[1])*d[1]) / dd)
		}
		return cuts
	}
	t := (w[0]*e[1] - w[1]*e[0]) / denom
	s := (w[0]*d[1] - w[1]*d[0]) / denom
	tolS := eps / lengthE
	if s >= -tolS && s <= 1+tolS {
		add(t)
	}
	return cuts
}

// segmentDistance returns the distance from p to the segment ab.
func segmentDistance(p, a, b [2]float64) float64 {
	e := [2]float64{b[0] - a[0], b[1] - a[1]}
	ee := e[0]*e[0] + e[1]*e[1]
	t := 0.0
	if ee > 0 {
		t = ((p[0]-a[0])*e[0] + (p[1]-a[1])*e[1]) / ee
		t = max(0, min(1, t))
	}
	return math.Hypot(p[0]-a[0]-t*e[0], p[1]-a[1]-t*e[1])
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
