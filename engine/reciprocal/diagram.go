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
	if err := checkInput(in); err != nil {
		return nil, err
	}
	m := in.Model
	rep := progress.Or(in.Progress)
	xy, ends, err := geometry(m)
	if err != nil {
		return nil, err
	}
	forces := externalForces(in)
	tol, err := tolerance(in, forces)
	if err != nil {
		return nil, err
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
	unit := unitVectors(xy, ends)
	if err := d.close(m, in.AxialForce, ends, unit, forces); err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	rep.Progress("placing points", 2, 4, nil)
	eq := segmentEquations(in, g, ends, unit)
	dl := newDual(g.faces, eq.left, eq.right)
	if d.Points, d.Iterations, err = dl.place(ctx, eq.vec); err != nil {
		return nil, err
	}
	labels := d.label(g, ends, eq)
	d.readMembers(in, ends, unit, labels[g.faces:], eq)
	d.readForces(g, labels[g.faces+len(ends):], eq, len(ends))

	rep.Progress("lifting", 3, 4, nil)
	d.Lift = newLift(xy, ends, unit, d, dl, eq.left, eq.right)
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
