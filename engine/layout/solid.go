package layout

import (
	"math"

	"gusset/engine/fault"
)

// MaxPolyhedronVertices is the most vertices a convex polyhedron of a Solid
// may list: its faces are found by testing every triple of vertices, which
// costs the cube of their number.
const MaxPolyhedronVertices = 64

// polyhedron is a convex polyhedron: the points x with n·x ≤ d for each
// face plane (unit normal n, offset d).
type polyhedron struct {
	normals  []vec
	offsets  []float64
	vertices []vec // the given vertices
	lo, hi   vec
}

func sub(p, q vec) vec     { return vec{p[0] - q[0], p[1] - q[1], p[2] - q[2]} }
func dot(p, q vec) float64 { return p[0]*q[0] + p[1]*q[1] + p[2]*q[2] }
func norm(p vec) float64   { return math.Sqrt(dot(p, p)) }
func cross(p, q vec) vec {
	return vec{p[1]*q[2] - p[2]*q[1], p[2]*q[0] - p[0]*q[2], p[0]*q[1] - p[1]*q[0]}
}
func scaled(p vec, s float64) vec { return vec{p[0] * s, p[1] * s, p[2] * s} }

// newPolyhedron finds the face planes of the convex hull of points: a plane
// through three of them with every point on one side (within eps) bounds
// the hull, and every face of the hull is such a plane (common practice for
// small point sets). path locates the points in the problem for errors.
func newPolyhedron(points []vec, path string) (*polyhedron, error) {
	if len(points) < 4 {
		return nil, fault.At(fault.InvalidModel, path, "a convex polyhedron needs at least 4 vertices, got %d", len(points))
	}
	if len(points) > MaxPolyhedronVertices {
		return nil, fault.At(fault.InvalidModel, path, "a convex polyhedron may list at most %d vertices, got %d", MaxPolyhedronVertices, len(points))
	}
	ph := &polyhedron{vertices: points, lo: points[0], hi: points[0]}
	for i, p := range points {
		for a := 0; a < 3; a++ {
			if !finite(p[a]) {
				return nil, fault.At(fault.InvalidModel, pointer(path, i), "vertex %d is not a finite point", i)
			}
			ph.lo[a], ph.hi[a] = min(ph.lo[a], p[a]), max(ph.hi[a], p[a])
		}
	}
	diameter := norm(sub(ph.hi, ph.lo))
	eps := 1e-9 * diameter
	for i := range points {
		for j := i + 1; j < len(points); j++ {
			for k := j + 1; k < len(points); k++ {
				n := cross(sub(points[j], points[i]), sub(points[k], points[i]))
				size := norm(n)
				if size <= 1e-12*diameter*diameter {
					continue
				}
				n = scaled(n, 1/size)
				d := dot(n, points[i])
				above, below := false, false
				for _, p := range points {
					s := dot(n, p) - d
					above = above || s > eps
					below = below || s < -eps
				}
				switch {
				case !above && !below:
					return nil, fault.At(fault.InvalidModel, path, "the vertices lie in one plane: the polyhedron has no volume")
				case !above:
					ph.addFace(n, d, eps)
				case !below:
					ph.addFace(scaled(n, -1), -d, eps)
				}
			}
		}
	}
	if len(ph.normals) < 4 {
		return nil, fault.At(fault.InvalidModel, path, "the vertices span no volume")
	}
	return ph, nil
}

// addFace records a face plane unless it is already known.
func (ph *polyhedron) addFace(n vec, d, eps float64) {
	for f, m := range ph.normals {
		if norm(sub(m, n)) <= 1e-9 && math.Abs(ph.offsets[f]-d) <= eps {
			return
		}
	}
	ph.normals = append(ph.normals, n)
	ph.offsets = append(ph.offsets, d)
}

// inside reports whether p satisfies every face plane with margin slack
// (positive: a little outside counts; negative: strictly inside).
func (ph *polyhedron) inside(p vec, slack float64) bool {
	for f, n := range ph.normals {
		if dot(n, p)-ph.offsets[f] > slack {
			return false
		}
	}
	return true
}

// crosses reports whether the segment pq enters the polyhedron's interior
// shrunk by eps (so touching a face, an edge or a vertex is allowed), by
// clipping the segment's parameter interval against each face plane
// (Cyrus & Beck, "Generalized two- and three-dimensional clipping",
// Computers & Graphics 3, 1978; from memory).
func (ph *polyhedron) crosses(p, q vec, eps float64) bool {
	for a := 0; a < 3; a++ {
		if max(p[a], q[a]) <= ph.lo[a]+eps || min(p[a], q[a]) >= ph.hi[a]-eps {
			return false
		}
	}
	d := sub(q, p)
	t0, t1 := 0.0, 1.0
	for f, n := range ph.normals {
		a := dot(n, p) - (ph.offsets[f] - eps)
		b := dot(n, d)
		switch {
		case b == 0:
			if a >= 0 {
				return false
			}
		case b > 0:
			t1 = min(t1, -a/b)
		default:
			t0 = max(t0, -a/b)
		}
		if t0 >= t1 {
			return false
		}
	}
	return true
}

// edges returns the polyhedron's edges: pairs of vertices that lie on two
// common faces.
func (ph *polyhedron) edges(eps float64) [][2]vec {
	on := make([][]int, len(ph.vertices))
	for i, p := range ph.vertices {
		for f, n := range ph.normals {
			if math.Abs(dot(n, p)-ph.offsets[f]) <= eps {
				on[i] = append(on[i], f)
			}
		}
	}
	var out [][2]vec
	for i := range ph.vertices {
		for j := i + 1; j < len(ph.vertices); j++ {
			shared := 0
			for _, f := range on[i] {
				for _, g := range on[j] {
					if f == g {
						shared++
					}
				}
			}
			if shared >= 2 && norm(sub(ph.vertices[i], ph.vertices[j])) > eps {
				out = append(out, [2]vec{ph.vertices[i], ph.vertices[j]})
			}
		}
	}
	return out
}

// solid is a checked design domain in space.
type solid struct {
	hull  *polyhedron
	holes []*polyhedron
	eps   float64
}

// newSolid checks a Solid. Failures are *fault.Error of kind InvalidModel
// with pointers relative to the problem ("/domain/outline",
// "/domain/holes/1").
func newSolid(s Solid) (*solid, error) {
	hull, err := newPolyhedron(s.Vertices, "/domain/outline")
	if err != nil {
		return nil, err
	}
	sd := &solid{hull: hull, eps: 1e-9 * norm(sub(hull.hi, hull.lo))}
	for h, hole := range s.Holes {
		ph, err := newPolyhedron(hole, pointer("/domain/holes", h))
		if err != nil {
			return nil, err
		}
		sd.holes = append(sd.holes, ph)
	}
	return sd, nil
}

func (s *solid) contains(p vec) bool {
	return s.hull.inside(p, s.eps) && s.holeAt(p) < 0
}

// admits needs only the holes: both ends lie in the convex hull, so the
// whole segment does.
func (s *solid) admits(p, q vec) bool {
	for _, h := range s.holes {
		if h.crosses(p, q, s.eps) {
			return false
		}
	}
	return true
}

func (s *solid) bounds() (lo, hi vec) { return s.hull.lo, s.hull.hi }

func (s *solid) holeAt(p vec) int {
	for h, ph := range s.holes {
		if ph.inside(p, -s.eps) {
			return h
		}
	}
	return -1
}

func (s *solid) edges() (outline, holes [][2]vec) {
	outline = s.hull.edges(s.eps)
	for _, h := range s.holes {
		holes = append(holes, h.edges(s.eps)...)
	}
	return outline, holes
}
