package reciprocal

import (
	"context"
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/progress"
)

// Input is what Build needs: a 2D model, its members' axial forces and the
// external forces at its nodes, all in the model's units.
type Input struct {
	// Model supplies the node coordinates and the members; only its
	// geometry and topology are read. Beams are treated as bars: only
	// their axial forces enter the diagram.
	Model *model.Model
	// AxialForce holds one axial force per member, tension positive.
	AxialForce []float64
	// External holds, per node, the resultant of the applied loads and
	// reactions acting on the node (nil means none). A zero vector draws
	// nothing.
	External [][2]float64
	// Separate holds further external forces drawn as lines of their own,
	// for a node where a load and a reaction should each appear, for
	// example. Several forces at one node are ordered by angle with the
	// members round it.
	Separate []ExternalForce
	// Perpendicular draws each segment of the force diagram perpendicular
	// to its member (turned a quarter turn counter-clockwise) instead of
	// parallel to it.
	Perpendicular bool
	// Tolerance is the largest closure error (force units) allowed at a
	// node, and the magnitude below which a force counts as zero. Zero
	// means 1e-6 times the largest force in the input.
	Tolerance float64
	// Progress receives stage reports; nil means none.
	Progress progress.Reporter
}

// ExternalForce is a force acting on a node, in force units.
type ExternalForce struct {
	Node  int
	Force [2]float64
}

// Sense tells tension from compression.
type Sense int8

// Senses of an axial force.
const (
	Zero        Sense = 0
	Tension     Sense = 1
	Compression Sense = -1
)

// String returns "tension", "compression" or "zero".
func (s Sense) String() string {
	switch s {
	case Tension:
		return "tension"
	case Compression:
		return "compression"
	}
	return "zero"
}

// Space is a face of the form diagram: a lettered space of the outer region
// between two external forces, or a numbered inner face.
type Space struct {
	// Label is the Bow's-notation name: "A", "B", ... for spaces, "1",
	// "2", ... for inner faces.
	Label string
	// Outer is true for the lettered spaces.
	Outer bool
	// Anchor is a point in the space, in the form's coordinates, where its
	// label may be drawn.
	Anchor [2]float64
	// Boundary lists an inner face's nodes counter-clockwise; nil for
	// spaces.
	Boundary []int
}

// Segment is one line of the force diagram: a member or an external force.
// The two spaces it separates are Left and Right of the member directed
// from its node (Ends[0] for a member) outwards; Points[Right] −
// Points[Left] is the force on that node, turned a quarter turn
// counter-clockwise when the diagram is perpendicular.
type Segment struct {
	// Label is the Bow's-notation name of the two spaces: for a member,
	// letters before numbers, each in increasing order ("B-2", "3-4");
	// for an external force, the space before it and the space after it
	// clockwise ("A-B", "E-A").
	Label       string
	Left, Right int
	// Node is the node the force acts on: Ends[0] for a member.
	Node int
	// Force is the axial force (tension positive) of a member, or the
	// magnitude of an external force.
	Force float64
	// Vector is the force on Node as given, in force units.
	Vector [2]float64
	// Direction is, for an external force, the unit direction of its line
	// drawn from the node outwards in the form diagram.
	Direction [2]float64
	// Index is the member index, or the external force's index: nodes with
	// a non-zero External in node order first, then Separate in order.
	Index int
	// Sense is read from the diagram for members (see Build): Zero for a
	// point-length segment, and for external forces.
	Sense Sense
	// Zero is true when |Force| is within the tolerance: the segment has
	// no length and Left and Right share one point.
	Zero bool
	// Misfit is ‖Points[Right] − Points[Left] − force‖ after the least
	// squares placement.
	Misfit float64
}

// Diagram is a reciprocal force diagram with its Airy stress function.
type Diagram struct {
	// Perpendicular is true when segments are perpendicular to members.
	Perpendicular bool
	// Spaces lists the lettered spaces first (index = letter order), then
	// the inner faces (index − SpaceCount + 1 = number).
	Spaces     []Space
	SpaceCount int
	// Points is the force diagram: one point per space, in force units.
	// Points[0] (space A) is at the origin.
	Points [][2]float64
	// Members is aligned with the model's members.
	Members []Segment
	// Forces holds the external forces in clockwise order round the
	// network, starting with the one at the leftmost loaded node; force k
	// runs from space k−1 to space k.
	Forces []Segment
	// LoadLine lists the spaces of the load line in order: the closed
	// polygon Points[LoadLine[0]], Points[LoadLine[1]], ... whose sides are
	// the external forces in boundary order.
	LoadLine []int
	// NodeClosure is, per node, ‖Σ forces on the node‖: members' axial
	// forces plus external forces (force units).
	NodeClosure []float64
	// TotalClosure is the root sum of squares of NodeClosure; MaxClosure
	// its largest entry.
	TotalClosure, MaxClosure float64
	// MaxMisfit is the largest segment misfit.
	MaxMisfit float64
	// Disagreements lists members whose sense read from the diagram
	// differs from the sign of the given axial force.
	Disagreements []int
	// Tolerance is the tolerance used (force units).
	Tolerance float64
	// Iterations counts the conjugate-gradient iterations of the placement.
	Iterations int
	// Lift is the polyhedral Airy stress function of the form.
	Lift *Lift
}

// Build computes the reciprocal force diagram of a planar network in
// equilibrium, labels it in Bow's notation and lifts the form to its Airy
// stress function.
//
// The external forces are drawn as half-lines to infinity in the outer face
// and split it into the lettered spaces; space A is the one clockwise after
// the external force at the leftmost loaded node, and the letters run
// clockwise round the network. Inner faces are numbered left to right by
// centroid.
//
// Each segment satisfies Points[Right] − Points[Left] = force on its node.
// Hence Bow's reading: going clockwise round a joint, the segment of each
// member read from the space before it to the space after it is the force
// the member exerts on the joint (R. H. Bow, Economics of Construction in
// Relation to Framed Structures, 1873; the same reading is taught in the
// graphic-statics texts, from memory), so it points away from the joint
// along the member for tension and towards it for compression. Build reads
// each member's sense this way from the placed points and lists in
// Disagreements the members whose reading differs from the given sign.
//
// The points are the least-squares fit of all segment equations with space
// A at the origin, so a closure error within the tolerance spreads evenly.
//
// Build fails with a *fault.Error of kind WrongDimension for a 3D model,
// NotPlanar for members that cross, touch or overlap away from shared
// nodes (or a load inside the network), InvalidModel for a disconnected
// network, zero-length members or non-finite forces, and NotInEquilibrium
// when a node's closure error exceeds the tolerance (Problems lists the
// first 50 such nodes, Detail is a ClosureDetail with every node's
// error). A network that is a mechanism under its loads reaches Build with
// forces that cannot balance and fails this way. Build panics if slices
// are misaligned.
func Build(ctx context.Context, in Input) (*Diagram, error) {
	m := in.Model
	if m == nil {
		panic("reciprocal: nil model")
	}
	if m.Dim != 2 {
		return nil, fault.New(fault.WrongDimension, "a reciprocal diagram is drawn for a plane (2D) network; this model is %dD", m.Dim)
	}
	n := m.NodeCount()
	if len(in.AxialForce) != len(m.Members) {
		panic(fmt.Sprintf("reciprocal: %d axial forces for %d members", len(in.AxialForce), len(m.Members)))
	}
	if in.External != nil && len(in.External) != n {
		panic(fmt.Sprintf("reciprocal: %d external forces for %d nodes", len(in.External), n))
	}
	if len(m.Members) == 0 {
		return nil, fault.New(fault.InvalidModel, "the network has no members")
	}
	rep := progress.Or(in.Progress)
	xy, ends, err := geometry(m)
	if err != nil {
		return nil, err
	}
	var forces []extForce
	for v, f := range in.External {
		if f != [2]float64{} {
			forces = append(forces, extForce{node: v, force: f, index: len(forces)})
		}
	}
	for k, f := range in.Separate {
		if f.Node < 0 || f.Node >= n {
			panic(fmt.Sprintf("reciprocal: separate force %d at node %d of %d", k, f.Node, n))
		}
		if f.Force != [2]float64{} {
			forces = append(forces, extForce{node: f.Node, force: f.Force, index: len(forces)})
		}
	}
	scale := 0.0
	for e, t := range in.AxialForce {
		if math.IsNaN(t) || math.IsInf(t, 0) {
			return nil, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d", e), "the axial force of member %q is not a finite number", m.Members[e].ID)
		}
		scale = math.Max(scale, math.Abs(t))
	}
	for _, f := range forces {
		l := math.Hypot(f.force[0], f.force[1])
		if math.IsNaN(l) || math.IsInf(l, 0) {
			return nil, fault.At(fault.InvalidModel, fmt.Sprintf("/nodes/%d", f.node), "an external force at node %q is not finite", m.NodeIDs[f.node])
		}
		scale = math.Max(scale, l)
	}
	tol := in.Tolerance
	if tol <= 0 {
		tol = 1e-6 * scale
	}

	rep.Progress("checking planarity", 0, 4, nil)
	if err := checkPlanar(xy, ends, memberIDs(m)); err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	rep.Progress("embedding", 1, 4, nil)
	g, err := embed(xy, ends, forces, m.NodeIDs)
	if err != nil {
		return nil, err
	}

	d := &Diagram{Perpendicular: in.Perpendicular, SpaceCount: g.spaces, Tolerance: tol}
	unit := make([][2]float64, len(ends))
	closure := make([][2]float64, n)
	for e, en := range ends {
		p, q := xy[en[0]], xy[en[1]]
		l := math.Hypot(q[0]-p[0], q[1]-p[1])
		unit[e] = [2]float64{(q[0] - p[0]) / l, (q[1] - p[1]) / l}
		t := in.AxialForce[e]
		closure[en[0]][0] += t * unit[e][0]
		closure[en[0]][1] += t * unit[e][1]
		closure[en[1]][0] -= t * unit[e][0]
		closure[en[1]][1] -= t * unit[e][1]
	}
	for _, f := range forces {
		closure[f.node][0] += f.force[0]
		closure[f.node][1] += f.force[1]
	}
	d.NodeClosure = make([]float64, n)
	var bad []fault.Problem
	unbalanced := 0
	for v, c := range closure {
		d.NodeClosure[v] = math.Hypot(c[0], c[1])
		d.TotalClosure += d.NodeClosure[v] * d.NodeClosure[v]
		d.MaxClosure = math.Max(d.MaxClosure, d.NodeClosure[v])
		if d.NodeClosure[v] > tol {
			unbalanced++
			if len(bad) == maxClosureProblems {
				continue
			}
			bad = append(bad, fault.Problem{Path: fmt.Sprintf("/nodes/%d", v),
				Message: fmt.Sprintf("the forces on node %q do not balance: closure error %.6g %s", m.NodeIDs[v], d.NodeClosure[v], forceUnit(m))})
		}
	}
	d.TotalClosure = math.Sqrt(d.TotalClosure)
	if len(bad) > 0 {
		return nil, &fault.Error{
			Kind: fault.NotInEquilibrium,
			Message: fmt.Sprintf("the forces are not in equilibrium at %d nodes (largest closure error %.6g %s, total %.6g, tolerance %.3g): the force polygons cannot close; check the loads, reactions and axial forces, or whether the network is a mechanism",
				unbalanced, d.MaxClosure, forceUnit(m), d.TotalClosure, tol),
			Problems: bad,
			Detail:   ClosureDetail{NodeClosure: d.NodeClosure, Total: d.TotalClosure},
		}
	}

	if err := ctx.Err(); err != nil {
		return nil, err
	}
	rep.Progress("placing points", 2, 4, nil)
	edges := len(ends) + len(g.rays)
	left, right := make([]int32, edges), make([]int32, edges)
	vec := make([][2]float64, edges)
	for e := range ends {
		left[e], right[e] = g.faceOf[2*e], g.faceOf[2*e+1]
		t := in.AxialForce[e]
		vec[e] = turn(in.Perpendicular, [2]float64{t * unit[e][0], t * unit[e][1]})
	}
	for k, r := range g.rays {
		left[len(ends)+k], right[len(ends)+k] = int32(r.left), int32(r.right)
		vec[len(ends)+k] = turn(in.Perpendicular, r.force)
	}
	dl := newDual(g.faces, left, right)
	points, iters, err := dl.place(ctx, vec)
	if err != nil {
		return nil, err
	}
	d.Points = points
	d.Iterations = iters

	lab := &labeller{spaces: g.spaces}
	for f := range g.faces {
		lab.name(f)
	}
	for e := range ends {
		lab.pair(int(min(left[e], right[e])), int(max(left[e], right[e])))
	}
	for _, r := range g.rays {
		lab.pair(r.left, r.right)
	}
	labels := lab.strings()
	d.Spaces = make([]Space, g.faces)
	for f := range d.Spaces {
		d.Spaces[f] = Space{Label: labels[f], Outer: f < g.spaces, Anchor: g.anchor[f], Boundary: g.boundary[f]}
	}
	misfit := func(e int) float64 {
		p, q := points[left[e]], points[right[e]]
		return math.Hypot(q[0]-p[0]-vec[e][0], q[1]-p[1]-vec[e][1])
	}
	d.Members = make([]Segment, len(ends))
	for e, en := range ends {
		t := in.AxialForce[e]
		s := Segment{
			Label: labels[g.faces+e],
			Left:  int(left[e]), Right: int(right[e]),
			Node: en[0], Force: t, Index: e,
			Vector: [2]float64{t * unit[e][0], t * unit[e][1]},
			Zero:   math.Abs(t) <= tol,
			Misfit: misfit(e),
		}
		// Bow's reading: from the space before to the space after,
		// clockwise round node Ends[0], i.e. from Left to Right.
		p, q := points[s.Left], points[s.Right]
		read := unturn(in.Perpendicular, [2]float64{q[0] - p[0], q[1] - p[1]})
		along := read[0]*unit[e][0] + read[1]*unit[e][1]
		switch {
		case math.Hypot(read[0], read[1]) <= tol:
			s.Sense = Zero
		case along > 0:
			s.Sense = Tension
		default:
			s.Sense = Compression
		}
		if !s.Zero && s.Sense != Zero && (s.Sense == Tension) != (t > 0) {
			d.Disagreements = append(d.Disagreements, e)
		}
		d.MaxMisfit = math.Max(d.MaxMisfit, s.Misfit)
		d.Members[e] = s
	}
	d.Forces = make([]Segment, len(g.rays))
	for k, r := range g.rays {
		e := len(ends) + k
		d.Forces[k] = Segment{
			Label: labels[g.faces+len(ends)+k],
			Left:  r.left, Right: r.right, Node: r.node,
			Force: math.Hypot(r.force[0], r.force[1]), Vector: r.force,
			Direction: r.dir, Index: r.index,
			Misfit: misfit(e),
		}
		d.MaxMisfit = math.Max(d.MaxMisfit, d.Forces[k].Misfit)
		d.LoadLine = append(d.LoadLine, r.left)
	}
	if len(d.LoadLine) > 0 {
		// Start the load line at A: force k runs from space k−1 to k.
		d.LoadLine = append(d.LoadLine[1:], d.LoadLine[0])
	}

	rep.Progress("lifting", 3, 4, nil)
	d.Lift = newLift(xy, ends, unit, d, dl, left, right)
	rep.Progress("done", 4, 4, nil)
	return d, nil
}

// maxClosureProblems caps the nodes listed in a NotInEquilibrium error;
// its Detail still holds every node's closure error.
const maxClosureProblems = 50

// ClosureDetail is the Detail of a NotInEquilibrium error: the closure
// error per node and their root sum of squares, in force units.
type ClosureDetail struct {
	NodeClosure []float64
	Total       float64
}

// turn returns v turned a quarter turn counter-clockwise when perpendicular
// is set, else v.
func turn(perpendicular bool, v [2]float64) [2]float64 {
	if perpendicular {
		return [2]float64{-v[1], v[0]}
	}
	return v
}

// unturn undoes turn.
func unturn(perpendicular bool, v [2]float64) [2]float64 {
	if perpendicular {
		return [2]float64{v[1], -v[0]}
	}
	return v
}

// geometry returns the node coordinates and member ends of a 2D model,
// failing on a zero-length member.
func geometry(m *model.Model) ([][2]float64, [][2]int, error) {
	xy := make([][2]float64, m.NodeCount())
	for v := range xy {
		xy[v] = [2]float64{m.Coords[2*v], m.Coords[2*v+1]}
		if math.IsNaN(xy[v][0]+xy[v][1]) || math.IsInf(xy[v][0]+xy[v][1], 0) {
			return nil, nil, fault.At(fault.InvalidModel, fmt.Sprintf("/nodes/%d", v), "node %q has non-finite coordinates", m.NodeIDs[v])
		}
	}
	ends := make([][2]int, len(m.Members))
	for e, mb := range m.Members {
		ends[e] = mb.Ends
		if xy[mb.Ends[0]] == xy[mb.Ends[1]] {
			return nil, nil, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d", e), "member %q has zero length", mb.ID)
		}
	}
	return xy, ends, nil
}

func memberIDs(m *model.Model) []string {
	ids := make([]string, len(m.Members))
	for e := range m.Members {
		ids[e] = m.Members[e].ID
	}
	return ids
}

// forceUnit returns the model's force unit name (kN when unset).
func forceUnit(m *model.Model) string {
	if m.Units.Force == "" {
		return "kN"
	}
	return m.Units.Force
}
