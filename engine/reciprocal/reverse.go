package reciprocal

import (
	"context"
	"fmt"
	"math"
	"slices"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// Redrawn is a form found from a force diagram by Reverse.
type Redrawn struct {
	// Coords holds the new node coordinates, x and y per node (length
	// units), in the layout of model.Model.Coords.
	Coords []float64
	// Moved holds, per node, the distance it moved.
	Moved []float64
	// Residual is the largest offset (length units) of a member's far end
	// from the line through its near end parallel to its segment: zero up
	// to round-off for an exact redrawing.
	Residual float64
}

// Reverse finds the form whose members are parallel to the segments of an
// edited force diagram (perpendicular to them when d is perpendicular),
// nearest in least squares to the model's present coordinates, with fixed
// nodes kept in place: design by forces.
//
// d supplies the topology (which two spaces each member separates) and
// points the edited position of each space's point (nil means d.Points).
// fixed marks the nodes the host keeps in place (nil means none); nodes
// with a support in the model are kept in place too. Members whose segment
// has no length (zero force) may take any direction.
//
// Each member gives one linear constraint, cross(x_j − x_i, ŝ) = 0 with ŝ
// its segment's unit direction; Reverse returns the smallest change of the
// free coordinates that satisfies them all (or, when they cannot all hold,
// the smallest change that satisfies them best in least squares). Up to
// denseRedrawColumns free coordinates that is a minimum-norm solve with the
// singular value decomposition; above, iterated Tikhonov regularisation on
// the sparse normal equations (see minNormSparse), which grows with the
// network like a stiffness solve of it. A diagram that
// closes gives the same figure back up to a similarity when no node is
// fixed (Maxwell 1864: reciprocal figures are mutual).
//
// When the constraints cannot all hold (too many fixed nodes, or an edit
// no form can follow), Reverse returns a *fault.Error of kind NoSolution
// whose Problems point at the members that cannot be made parallel and
// whose Detail is the NoSolutionDetail with the least-squares form. It
// fails with WrongDimension for a 3D model and panics if slices are
// misaligned.
func Reverse(ctx context.Context, m *model.Model, d *Diagram, points [][2]float64, fixed []bool) (*Redrawn, error) {
	if m.Dim != 2 {
		return nil, fault.New(fault.WrongDimension, "a form is redrawn from a force diagram only in the plane (2D); this model is %dD", m.Dim)
	}
	if points == nil {
		points = d.Points
	}
	n := m.NodeCount()
	if len(points) != len(d.Points) || len(d.Members) != len(m.Members) || (fixed != nil && len(fixed) != n) {
		panic("reciprocal: Reverse arguments do not match the diagram and model")
	}
	col, free := freeColumns(m, fixed)
	lines := memberDirections(d, points)
	x0 := slices.Clone(m.Coords)
	x := slices.Clone(x0)
	if len(lines.rows) > 0 && free > 0 {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		delta, err := lines.nearestMove(ctx, m, x0, col, free)
		if err != nil {
			return nil, err
		}
		for v := range n {
			if col[v] >= 0 {
				x[2*v] += delta[2*col[v]]
				x[2*v+1] += delta[2*col[v]+1]
			}
		}
	}
	out := &Redrawn{Coords: x, Moved: make([]float64, n)}
	for v := range n {
		out.Moved[v] = math.Hypot(x[2*v]-x0[2*v], x[2*v+1]-x0[2*v+1])
	}
	if err := lines.checkParallel(m, d, x0, out); err != nil {
		return nil, err
	}
	if err := checkNoCollapse(m, out); err != nil {
		return nil, err
	}
	return out, nil
}

// freeColumns numbers the nodes that may move (used by a member, neither
// fixed nor supported): col[v] is node v's column, −1 when it stays, and
// free is how many move.
func freeColumns(m *model.Model, fixed []bool) (col []int, free int) {
	n := m.NodeCount()
	keep := make([]bool, n)
	copy(keep, fixed)
	for _, s := range m.Supports {
		keep[s.Node] = true
	}
	used := make([]bool, n)
	for _, mb := range m.Members {
		used[mb.Ends[0]], used[mb.Ends[1]] = true, true
	}
	col = make([]int, n)
	for v := range col {
		col[v] = -1
		if used[v] && !keep[v] {
			col[v] = free
			free++
		}
	}
	return col, free
}

// directions holds, for each member whose segment in the edited diagram
// has a length (rows), the unit normal of that segment's direction
// (turned back when the diagram is perpendicular).
type directions struct {
	rows    []int // member per constraint row
	normals [][2]float64
}

// memberDirections reads the members' directions off the edited diagram;
// a segment shorter than 1e-12 of the diagram's extent sets none.
func memberDirections(d *Diagram, points [][2]float64) directions {
	diagScale := 0.0
	for _, p := range points {
		diagScale = math.Max(diagScale, math.Hypot(p[0], p[1]))
	}
	var lines directions
	for e, s := range d.Members {
		p, q := points[s.Left], points[s.Right]
		dir := unturn(d.Perpendicular, [2]float64{q[0] - p[0], q[1] - p[1]})
		l := math.Hypot(dir[0], dir[1])
		if l <= 1e-12*diagScale || l == 0 {
			continue
		}
		lines.rows = append(lines.rows, e)
		lines.normals = append(lines.normals, [2]float64{dir[1] / l, -dir[0] / l})
	}
	return lines
}

// offset is how far row k's member, at coordinates x, is from parallel to
// its direction: the component of its end-to-end vector along the normal.
func (lines directions) offset(m *model.Model, x []float64, k int) float64 {
	en := m.Members[lines.rows[k]].Ends
	nv := lines.normals[k]
	return (x[2*en[1]]-x[2*en[0]])*nv[0] + (x[2*en[1]+1]-x[2*en[0]+1])*nv[1]
}

// nearestMove returns the least-norm move δ of the free nodes (two
// entries per column) that makes every member parallel to its direction:
// constraint k reads Σ sign·n_k·δ over the member's free ends =
// −offset(x0, k).
func (lines directions) nearestMove(ctx context.Context, m *model.Model, x0 []float64, col []int, free int) ([]float64, error) {
	cons := make([]constraint, len(lines.rows))
	for k, e := range lines.rows {
		cons[k] = constraint{rhs: -lines.offset(m, x0, k), cols: [2]int{-1, -1}}
		for side, v := range m.Members[e].Ends {
			if col[v] >= 0 {
				sign := 2*float64(side) - 1
				cons[k].cols[side] = 2 * col[v]
				cons[k].coef[side] = [2]float64{sign * lines.normals[k][0], sign * lines.normals[k][1]}
			}
		}
	}
	if 2*free <= denseRedrawColumns {
		return minNormDense(cons, 2*free)
	}
	return minNormSparse(ctx, cons, 2*free)
}

// checkParallel sets out.Residual, the largest offset left, and fails
// with NoSolution naming each member still off its direction by more than
// 1e-9 of the form's size (the original form's extent from the origin and
// from its first node).
func (lines directions) checkParallel(m *model.Model, d *Diagram, x0 []float64, out *Redrawn) error {
	n := m.NodeCount()
	size := 0.0
	for v := range n {
		size = math.Max(size, math.Hypot(x0[2*v], x0[2*v+1]))
	}
	for v := range n {
		size = math.Max(size, math.Hypot(x0[2*v]-x0[0], x0[2*v+1]-x0[1]))
	}
	tol := 1e-9 * math.Max(size, 1e-300)
	var bad []fault.Problem
	for k, e := range lines.rows {
		off := math.Abs(lines.offset(m, out.Coords, k))
		out.Residual = math.Max(out.Residual, off)
		if off > tol {
			bad = append(bad, fault.Problem{Path: fmt.Sprintf("/members/%d", e),
				Message: fmt.Sprintf("member %q cannot be made parallel to its segment %s: its end stays %.3g %s off the line", m.Members[e].ID, d.Members[e].Label, off, lengthUnit(m))})
		}
	}
	if len(bad) == 0 {
		return nil
	}
	return &fault.Error{
		Kind: fault.NoSolution,
		Message: fmt.Sprintf("no form with the fixed nodes in place has every member parallel to the edited force diagram: %d members stay off by up to %.3g %s; free more nodes or change the edit",
			len(bad), out.Residual, lengthUnit(m)),
		Problems: bad,
		Detail:   NoSolutionDetail{Nearest: out},
	}
}

// checkNoCollapse fails when the form is parallel to the diagram only by
// shrinking members to nothing (both ends pulled onto one fixed node):
// that is not a structure.
func checkNoCollapse(m *model.Model, out *Redrawn) error {
	x := out.Coords
	var bad []fault.Problem
	for e, mem := range m.Members {
		a, b := mem.Ends[0], mem.Ends[1]
		if math.Hypot(x[2*b]-x[2*a], x[2*b+1]-x[2*a+1]) <= 1e-6*m.Length(e) {
			bad = append(bad, fault.Problem{Path: fmt.Sprintf("/members/%d", e),
				Message: fmt.Sprintf("member %q would shrink to zero length", mem.ID)})
		}
	}
	if len(bad) == 0 {
		return nil
	}
	return &fault.Error{
		Kind: fault.NoSolution,
		Message: fmt.Sprintf("the only form parallel to the edited force diagram collapses %d members to nothing (the first: %s); move the point along a direction the fixed nodes allow, or fix fewer nodes",
			len(bad), bad[0].Message),
		Problems: bad,
		Detail:   NoSolutionDetail{Nearest: out},
	}
}

// NoSolutionDetail is the Detail of Reverse's NoSolution error: the
// least-squares form, whose Residual says how far it is from parallel.
type NoSolutionDetail struct {
	Nearest *Redrawn
}

// lengthUnit returns the model's length unit name (m when unset).
func lengthUnit(m *model.Model) string {
	if m.Units.Length == "" {
		return "m"
	}
	return m.Units.Length
}
