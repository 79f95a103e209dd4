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
	keep := make([]bool, n)
	copy(keep, fixed)
	for _, s := range m.Supports {
		keep[s.Node] = true
	}
	used := make([]bool, n)
	for _, mb := range m.Members {
		used[mb.Ends[0]], used[mb.Ends[1]] = true, true
	}
	col := make([]int, n)
	free := 0
	for v := range col {
		col[v] = -1
		if used[v] && !keep[v] {
			col[v] = free
			free++
		}
	}
	diagScale := 0.0
	for _, p := range points {
		diagScale = math.Max(diagScale, math.Hypot(p[0], p[1]))
	}
	var rows []int // member per constraint row
	var normals [][2]float64
	for e, s := range d.Members {
		p, q := points[s.Left], points[s.Right]
		dir := unturn(d.Perpendicular, [2]float64{q[0] - p[0], q[1] - p[1]})
		l := math.Hypot(dir[0], dir[1])
		if l <= 1e-12*diagScale || l == 0 {
			continue
		}
		rows = append(rows, e)
		normals = append(normals, [2]float64{dir[1] / l, -dir[0] / l})
	}
	x0 := slices.Clone(m.Coords)
	offset := func(x []float64, k int) float64 {
		en := m.Members[rows[k]].Ends
		nv := normals[k]
		return (x[2*en[1]]-x[2*en[0]])*nv[0] + (x[2*en[1]+1]-x[2*en[0]+1])*nv[1]
	}
	x := slices.Clone(x0)
	if len(rows) > 0 && free > 0 {
		// Constraint k reads Σ sign·n_k·δ over the member's free ends
		// = −offset(x0, k).
		cons := make([]constraint, len(rows))
		for k, e := range rows {
			cons[k] = constraint{rhs: -offset(x0, k), cols: [2]int{-1, -1}}
			for side, v := range m.Members[e].Ends {
				if col[v] >= 0 {
					sign := 2*float64(side) - 1
					cons[k].cols[side] = 2 * col[v]
					cons[k].coef[side] = [2]float64{sign * normals[k][0], sign * normals[k][1]}
				}
			}
		}
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		var delta []float64
		var err error
		if 2*free <= denseRedrawColumns {
			delta, err = minNormDense(cons, 2*free)
		} else {
			delta, err = minNormSparse(ctx, cons, 2*free)
		}
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
	size := 0.0
	for v := range n {
		size = math.Max(size, math.Hypot(x0[2*v], x0[2*v+1]))
	}
	for v := range n {
		size = math.Max(size, math.Hypot(x0[2*v]-x0[0], x0[2*v+1]-x0[1]))
	}
	tol := 1e-9 * math.Max(size, 1e-300)
	var bad []fault.Problem
	for k, e := range rows {
		off := math.Abs(offset(x, k))
		out.Residual = math.Max(out.Residual, off)
		if off > tol {
			bad = append(bad, fault.Problem{Path: fmt.Sprintf("/members/%d", e),
				Message: fmt.Sprintf("member %q cannot be made parallel to its segment %s: its end stays %.3g %s off the line", m.Members[e].ID, d.Members[e].Label, off, lengthUnit(m))})
		}
	}
	if len(bad) > 0 {
		return nil, &fault.Error{
			Kind: fault.NoSolution,
			Message: fmt.Sprintf("no form with the fixed nodes in place has every member parallel to the edited force diagram: %d members stay off by up to %.3g %s; free more nodes or change the edit",
				len(bad), out.Residual, lengthUnit(m)),
			Problems: bad,
			Detail:   NoSolutionDetail{Nearest: out},
		}
	}
	// A form can be parallel to the diagram only by shrinking members to
	// nothing (both ends pulled onto one fixed node): that is not a
	// structure.
	for e, mem := range m.Members {
		a, b := mem.Ends[0], mem.Ends[1]
		if math.Hypot(x[2*b]-x[2*a], x[2*b+1]-x[2*a+1]) <= 1e-6*m.Length(e) {
			bad = append(bad, fault.Problem{Path: fmt.Sprintf("/members/%d", e),
				Message: fmt.Sprintf("member %q would shrink to zero length", mem.ID)})
		}
	}
	if len(bad) > 0 {
		return nil, &fault.Error{
			Kind: fault.NoSolution,
			Message: fmt.Sprintf("the only form parallel to the edited force diagram collapses %d members to nothing (the first: %s); move the point along a direction the fixed nodes allow, or fix fewer nodes",
				len(bad), bad[0].Message),
			Problems: bad,
			Detail:   NoSolutionDetail{Nearest: out},
		}
	}
	return out, nil
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
