package reciprocal

import "math"

// Fold tells how the Airy stress function bends across a member.
type Fold int8

// Folds of the stress function.
const (
	Flat   Fold = 0  // no slope jump: a zero-force member
	Valley Fold = 1  // convex crease: tension
	Ridge  Fold = -1 // concave crease: compression
)

// String returns "flat", "valley" or "ridge".
func (f Fold) String() string {
	switch f {
	case Valley:
		return "valley"
	case Ridge:
		return "ridge"
	}
	return "flat"
}

// Lift is the polyhedral Airy stress function of a form diagram: one plane
// over each space and inner face, continuous across members and external
// force lines, creased along the members.
//
// Convention. Face f's plane is z = a·x + b·y + c whose gradient (a, b) is
// the face's parallel force-diagram point (p, q) turned a quarter turn
// clockwise: (a, b) = (q, −p); for a perpendicular diagram that is the
// point negated. Space A's plane has c = 0, and the constants of the others
// follow by continuity across members (at their midpoints) and external
// force lines (at their nodes). With the diagram's orientation (see Build)
// the gradients on either side of a member differ by its axial force times
// the unit normal: a_left − a_right = t·n̂, n̂ the member's direction from
// Ends[0] to Ends[1] turned counter-clockwise, pointing into the left
// face. So the slope across the member rises by t: a tension member is a
// valley (convex crease) and a compression member a ridge. This matches
// the continuum Airy function φ, whose stresses are σxx = ∂²φ/∂y²,
// σyy = ∂²φ/∂x², σxy = −∂²φ/∂x∂y (G. B. Airy, Phil. Trans. R. Soc. 153,
// 1863, from memory): a bar in tension along x is a positive jump of
// ∂φ/∂y across it. Maxwell showed the reciprocal figure is the projection
// of the polar of this lift (J. C. Maxwell, "On reciprocal figures and
// diagrams of forces", Phil. Mag. 27, 1864, from memory).
type Lift struct {
	// Planes holds (a, b, c) per space, indexed as Diagram.Spaces.
	Planes [][3]float64
	// Heights holds the stress function at each node (force × length);
	// 0 at nodes without members.
	Heights []float64
	// Jumps holds per member the slope rise (a_left − a_right)·n̂ across
	// it, which equals the axial force.
	Jumps []float64
	// Folds classifies each member by the sign of its jump within the
	// diagram's tolerance.
	Folds []Fold
	// Mismatch is the largest spread of the planes' heights at a node:
	// zero up to round-off when the diagram closes exactly.
	Mismatch float64
	// Polar is the lift's polar reciprocal.
	Polar Polar
}

// Polar is the polar reciprocal of a lift with respect to the paraboloid
// z = (x² + y²)/2, under which the point (p, q, r) and the plane
// z = p·x + q·y − r are pole and polar. Each face plane z = a·x + b·y + c
// of the lift has pole (a, b, −c), a vertex of the polar; each lifted node
// (x, y, z) has polar plane z = x·X + y·Y − z, a face of the polar. The
// polar's vertices project onto the force diagram turned a quarter turn
// clockwise: it is the force diagram lifted, whose face planes have the
// form's node positions as gradients.
type Polar struct {
	// Vertices holds (a, b, −c) per space, indexed as Diagram.Spaces.
	Vertices [][3]float64
	// Planes holds (x, y, −z) per node: the plane z = x·X + y·Y − z.
	Planes [][3]float64
}

// gradient returns the stress-function gradient of a force-diagram point.
func gradient(perpendicular bool, p [2]float64) [2]float64 {
	if perpendicular {
		return [2]float64{-p[0], -p[1]}
	}
	return [2]float64{p[1], -p[0]}
}

// newLift builds the Airy stress function of a placed diagram.
func newLift(xy [][2]float64, ends [][2]int, unit [][2]float64, d *Diagram, dl *dual, left, right []int32) *Lift {
	faces := len(d.Points)
	lf := &Lift{Planes: make([][3]float64, faces)}
	for f, p := range d.Points {
		g := gradient(d.Perpendicular, p)
		lf.Planes[f] = [3]float64{g[0], g[1], 0}
	}
	at := func(e int32) [2]float64 {
		if int(e) < len(ends) {
			p, q := xy[ends[e][0]], xy[ends[e][1]]
			return [2]float64{(p[0] + q[0]) / 2, (p[1] + q[1]) / 2}
		}
		return xy[d.Forces[int(e)-len(ends)].Node]
	}
	dl.bfs(func(f, h, e int32) {
		x := at(e)
		l, r := lf.Planes[left[e]], lf.Planes[right[e]]
		jump := (r[0]-l[0])*x[0] + (r[1]-l[1])*x[1]
		if right[e] == h {
			lf.Planes[h][2] = lf.Planes[f][2] - jump
		} else {
			lf.Planes[h][2] = lf.Planes[f][2] + jump
		}
	})
	n := len(xy)
	lf.Heights = make([]float64, n)
	lo, hi := make([]float64, n), make([]float64, n)
	count := make([]int, n)
	for v := range lo {
		lo[v], hi[v] = math.Inf(1), math.Inf(-1)
	}
	lf.Jumps = make([]float64, len(ends))
	lf.Folds = make([]Fold, len(ends))
	for e, en := range ends {
		for _, v := range en {
			for _, f := range [2]int32{left[e], right[e]} {
				pl := lf.Planes[f]
				z := pl[0]*xy[v][0] + pl[1]*xy[v][1] + pl[2]
				lf.Heights[v] += z
				count[v]++
				lo[v], hi[v] = math.Min(lo[v], z), math.Max(hi[v], z)
			}
		}
		l, r := lf.Planes[left[e]], lf.Planes[right[e]]
		jump := -(l[0]-r[0])*unit[e][1] + (l[1]-r[1])*unit[e][0]
		lf.Jumps[e] = jump
		switch {
		case jump > d.Tolerance:
			lf.Folds[e] = Valley
		case jump < -d.Tolerance:
			lf.Folds[e] = Ridge
		}
	}
	for v := range lf.Heights {
		if count[v] > 0 {
			lf.Heights[v] /= float64(count[v])
			lf.Mismatch = math.Max(lf.Mismatch, hi[v]-lo[v])
		}
	}
	lf.Polar.Vertices = make([][3]float64, faces)
	for f, pl := range lf.Planes {
		lf.Polar.Vertices[f] = [3]float64{pl[0], pl[1], -pl[2]}
	}
	lf.Polar.Planes = make([][3]float64, n)
	for v := range xy {
		lf.Polar.Planes[v] = [3]float64{xy[v][0], xy[v][1], -lf.Heights[v]}
	}
	return lf
}
