package reciprocal

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// The phases of Build, in order: the input checks, the external forces,
// the tolerance, the closure of every node's forces, the segment
// equations, the labels, and the reading of member and force segments.

// checkInput checks what Build can check before the geometry: a 2D model
// with members, and slices aligned with it (a programming error, which
// panics).
func checkInput(in Input) error {
	m := in.Model
	if m == nil {
		panic("reciprocal: nil model")
	}
	if m.Dim != 2 {
		return fault.New(fault.WrongDimension, "a reciprocal diagram is drawn for a plane (2D) network; this model is %dD", m.Dim)
	}
	n := m.NodeCount()
	if len(in.AxialForce) != len(m.Members) {
		panic(fmt.Sprintf("reciprocal: %d axial forces for %d members", len(in.AxialForce), len(m.Members)))
	}
	if in.External != nil && len(in.External) != n {
		panic(fmt.Sprintf("reciprocal: %d external forces for %d nodes", len(in.External), n))
	}
	if len(m.Members) == 0 {
		return fault.New(fault.InvalidModel, "the network has no members")
	}
	return nil
}

// externalForces lists the nonzero external forces: the resultants of
// in.External by node, then in.Separate in order.
func externalForces(in Input) []extForce {
	n := in.Model.NodeCount()
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
	return forces
}

// tolerance checks that every force is finite and returns in.Tolerance,
// or by default 1e-6 times the largest force.
func tolerance(in Input, forces []extForce) (float64, error) {
	m := in.Model
	scale := 0.0
	for e, t := range in.AxialForce {
		if math.IsNaN(t) || math.IsInf(t, 0) {
			return 0, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d", e), "the axial force of member %q is not a finite number", m.Members[e].ID)
		}
		scale = math.Max(scale, math.Abs(t))
	}
	for _, f := range forces {
		l := math.Hypot(f.force[0], f.force[1])
		if math.IsNaN(l) || math.IsInf(l, 0) {
			return 0, fault.At(fault.InvalidModel, fmt.Sprintf("/nodes/%d", f.node), "an external force at node %q is not finite", m.NodeIDs[f.node])
		}
		scale = math.Max(scale, l)
	}
	if in.Tolerance > 0 {
		return in.Tolerance, nil
	}
	return 1e-6 * scale, nil
}

// unitVectors returns each member's unit vector from its first end to its
// second.
func unitVectors(xy [][2]float64, ends [][2]int) [][2]float64 {
	unit := make([][2]float64, len(ends))
	for e, en := range ends {
		p, q := xy[en[0]], xy[en[1]]
		l := math.Hypot(q[0]-p[0], q[1]-p[1])
		unit[e] = [2]float64{(q[0] - p[0]) / l, (q[1] - p[1]) / l}
	}
	return unit
}

// close sums the forces on every node (member forces pulling along their
// unit vectors, external forces as given) into d's closure figures and
// fails with NotInEquilibrium when a node's error passes d.Tolerance.
// When beams meet at the nodes that do not balance, the error says that
// beams carry shear and bending, which a diagram of axial forces cannot
// hold.
func (d *Diagram) close(m *model.Model, axial []float64, ends [][2]int, unit [][2]float64, forces []extForce) error {
	n := m.NodeCount()
	closure := make([][2]float64, n)
	for e, en := range ends {
		t := axial[e]
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
	count := 0
	for v, c := range closure {
		d.NodeClosure[v] = math.Hypot(c[0], c[1])
		d.TotalClosure += d.NodeClosure[v] * d.NodeClosure[v]
		d.MaxClosure = math.Max(d.MaxClosure, d.NodeClosure[v])
		if d.NodeClosure[v] > d.Tolerance {
			count++
			if len(bad) == maxClosureProblems {
				continue
			}
			bad = append(bad, fault.Problem{Path: fmt.Sprintf("/nodes/%d", v),
				Message: fmt.Sprintf("the forces on node %q do not balance: closure error %.6g %s", m.NodeIDs[v], d.NodeClosure[v], forceUnit(m))})
		}
	}
	d.TotalClosure = math.Sqrt(d.TotalClosure)
	if count == 0 {
		return nil
	}
	if err := beamsAtFault(m, d.NodeClosure, d.Tolerance); err != nil {
		return err
	}
	return &fault.Error{
		Kind: fault.NotInEquilibrium,
		Message: fmt.Sprintf("the forces are not in equilibrium at %d nodes (largest closure error %.6g %s, total %.6g, tolerance %.3g): the force polygons cannot close; check the loads, reactions and axial forces, or whether the network is a mechanism",
			count, d.MaxClosure, forceUnit(m), d.TotalClosure, d.Tolerance),
		Problems: bad,
		Detail:   ClosureDetail{NodeClosure: d.NodeClosure, Total: d.TotalClosure},
	}
}

// beamsAtFault returns, when beams meet at nodes whose closure error
// passes tol, an error naming them: a beam carries shear and bending besides
// its axial force, so the axial forces alone cannot balance the loads and
// no reciprocal diagram of them exists (a reciprocal figure pairs one
// straight segment with each pin-jointed member: Maxwell, "On reciprocal
// figures and diagrams of forces", Phil. Mag. 27, 1864). The problems
// point at the beams' types.
func beamsAtFault(m *model.Model, closure []float64, tol float64) error {
	var problems []fault.Problem
	var ids []string
	for e, mem := range m.Members {
		if mem.Kind == model.Beam && (closure[mem.Ends[0]] > tol || closure[mem.Ends[1]] > tol) {
			ids = append(ids, fmt.Sprintf("%q", mem.ID))
			problems = append(problems, fault.Problem{Path: fmt.Sprintf("/members/%d/type", e),
				Message: fmt.Sprintf("member %q is a beam: it carries shear and bending as well as its axial force", mem.ID)})
		}
	}
	if problems == nil {
		return nil
	}
	listed := ids[:min(len(ids), 5)]
	more := ""
	if len(ids) > len(listed) {
		more = fmt.Sprintf(" and %d more", len(ids)-len(listed))
	}
	return &fault.Error{Kind: fault.NotInEquilibrium, Problems: slices.Clip(problems),
		Message: fmt.Sprintf("the network's beams (%s%s) carry shear and bending, so their axial forces alone do not balance the loads and no reciprocal diagram of them exists; a reciprocal diagram is drawn for pin-jointed bars (make the members bars, adding bracing where the frame relied on bending)",
			strings.Join(listed, ", "), more)}
}

// equations are the segment equations of the force diagram: one per member
// and per external force, point[right] − point[left] = vec.
type equations struct {
	left, right []int32
	vec         [][2]float64
}

// segmentEquations sets up the force diagram's segment equations: member
// e joins its two faces with its force along (or across) its unit vector;
// each external force joins the spaces on either side of its ray.
func segmentEquations(in Input, g *embedding, ends [][2]int, unit [][2]float64) equations {
	edges := len(ends) + len(g.rays)
	eq := equations{left: make([]int32, edges), right: make([]int32, edges), vec: make([][2]float64, edges)}
	for e := range ends {
		eq.left[e], eq.right[e] = g.faceOf[2*e], g.faceOf[2*e+1]
		t := in.AxialForce[e]
		eq.vec[e] = turn(in.Perpendicular, [2]float64{t * unit[e][0], t * unit[e][1]})
	}
	for k, r := range g.rays {
		eq.left[len(ends)+k], eq.right[len(ends)+k] = int32(r.left), int32(r.right)
		eq.vec[len(ends)+k] = turn(in.Perpendicular, r.force)
	}
	return eq
}

// misfit is how far segment e of the placed points is from its equation.
func (d *Diagram) misfit(eq equations, e int) float64 {
	p, q := d.Points[eq.left[e]], d.Points[eq.right[e]]
	return math.Hypot(q[0]-p[0]-eq.vec[e][0], q[1]-p[1]-eq.vec[e][1])
}

// label names the spaces in Bow's notation, fills d.Spaces and returns
// every label: the faces', then the members', then the forces'.
func (d *Diagram) label(g *embedding, ends [][2]int, eq equations) []string {
	lab := &labeller{spaces: g.spaces}
	for f := range g.faces {
		lab.name(f)
	}
	for e := range ends {
		lab.pair(int(min(eq.left[e], eq.right[e])), int(max(eq.left[e], eq.right[e])))
	}
	for _, r := range g.rays {
		lab.pair(r.left, r.right)
	}
	labels := lab.strings()
	d.Spaces = make([]Space, g.faces)
	for f := range d.Spaces {
		d.Spaces[f] = Space{Label: labels[f], Outer: f < g.spaces, Anchor: g.anchor[f], Boundary: g.boundary[f]}
	}
	return labels
}

// readMembers fills d.Members: each member's segment, its misfit, and its
// sense read from the diagram (Bow's reading: from the space before to the
// space after, clockwise round node Ends[0], i.e. from Left to Right),
// noting where the reading disagrees with the given sign.
func (d *Diagram) readMembers(in Input, ends [][2]int, unit [][2]float64, labels []string, eq equations) {
	tol := d.Tolerance
	d.Members = make([]Segment, len(ends))
	for e, en := range ends {
		t := in.AxialForce[e]
		s := Segment{
			Label: labels[e],
			Left:  int(eq.left[e]), Right: int(eq.right[e]),
			Node: en[0], Force: t, Index: e,
			Vector: [2]float64{t * unit[e][0], t * unit[e][1]},
			Zero:   math.Abs(t) <= tol,
			Misfit: d.misfit(eq, e),
		}
		p, q := d.Points[s.Left], d.Points[s.Right]
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
}

// readForces fills d.Forces with the external forces' segments and the
// load line, which starts at space A: force k runs from space k−1 to k.
func (d *Diagram) readForces(g *embedding, labels []string, eq equations, members int) {
	d.Forces = make([]Segment, len(g.rays))
	for k, r := range g.rays {
		d.Forces[k] = Segment{
			Label: labels[k],
			Left:  r.left, Right: r.right, Node: r.node,
			Force: math.Hypot(r.force[0], r.force[1]), Vector: r.force,
			Direction: r.dir, Index: r.index,
			Misfit: d.misfit(eq, members+k),
		}
		d.MaxMisfit = math.Max(d.MaxMisfit, d.Forces[k].Misfit)
		d.LoadLine = append(d.LoadLine, r.left)
	}
	if len(d.LoadLine) > 0 {
		d.LoadLine = append(d.LoadLine[1:], d.LoadLine[0])
	}
}
