package statics

import (
	"math"

	"gusset/engine/model"
)

// Freedom is one nodal freedom: a node index and a component (model.X ..
// model.RZ).
type Freedom struct {
	Node      int
	Component int
}

// Quantity names one independent member force.
type Quantity string

// The member force quantities. Moments are about the member's local axes
// (see MemberAxes), positive by the right-hand rule, acting on the member at
// the named end.
const (
	Axial    Quantity = "axial"     // axial force, tension positive
	Torsion  Quantity = "torsion"   // torque about the member axis (3D beams)
	MomentZ1 Quantity = "moment_z1" // bending moment about local z at end 1
	MomentZ2 Quantity = "moment_z2" // bending moment about local z at end 2
	MomentY1 Quantity = "moment_y1" // bending moment about local y at end 1 (3D)
	MomentY2 Quantity = "moment_y2" // bending moment about local y at end 2 (3D)
)

// Column is one column of the equilibrium matrix: a member and the force
// quantity it carries.
type Column struct {
	Member   int
	Quantity Quantity
}

// Layout describes the rows and columns of a model's equilibrium matrix.
type Layout struct {
	// Rows are the unconstrained freedoms, node by node, components in the
	// order X, Y, (Z), then rotations at nodes that a beam touches, less
	// the rotations that no member end resists (FreeRotations).
	Rows []Freedom
	// Columns are the member forces, member by member, less those that
	// end releases make zero (Released).
	Columns []Column
	// Constraints counts the fixed components at nodes where the component
	// exists (translations everywhere, rotations only at beam nodes).
	Constraints int
	// HasBeams reports whether any member is a beam.
	HasBeams bool
}

// RotationalNodes reports, per node, whether a beam touches it (and so
// whether the node has rotational freedoms).
func RotationalNodes(m *model.Model) []bool {
	rot := make([]bool, m.NodeCount())
	for _, mem := range m.Members {
		if mem.Kind == model.Beam {
			rot[mem.Ends[0]] = true
			rot[mem.Ends[1]] = true
		}
	}
	return rot
}

// FixedComponents returns, per node, the union of the components fixed by
// the model's supports.
func FixedComponents(m *model.Model) [][6]bool {
	fixed := make([][6]bool, m.NodeCount())
	for _, s := range m.Supports {
		for c := range 6 {
			if s.Fixed[c] {
				fixed[s.Node][c] = true
			}
		}
	}
	return fixed
}

// NodeComponents returns the components a node has in a model of dimension
// dim: the translations, then the rotations when rotational is true. The
// slice is shared: callers must not modify it.
func NodeComponents(dim int, rotational bool) []int {
	switch {
	case dim == 2 && rotational:
		return planeFrameComponents[:]
	case dim == 2:
		return planeComponents[:]
	case rotational:
		return spaceFrameComponents[:]
	}
	return spaceComponents[:]
}

// The components of a node, by dimension and rotational freedom, shared by
// every call of NodeComponents (one small allocation per node added up to
// megabytes on a large model).
var (
	planeComponents      = [...]int{model.X, model.Y}
	planeFrameComponents = [...]int{model.X, model.Y, model.RZ}
	spaceComponents      = [...]int{model.X, model.Y, model.Z}
	spaceFrameComponents = [...]int{model.X, model.Y, model.Z, model.RX, model.RY, model.RZ}
)

// barQuantities, beamQuantities and planeBeamQuantities are the force
// quantities of a bar, a 3D beam and a 2D beam, in column order.
var (
	barQuantities       = [...]Quantity{Axial}
	beamQuantities      = [...]Quantity{Axial, Torsion, MomentZ1, MomentZ2, MomentY1, MomentY2}
	planeBeamQuantities = [...]Quantity{Axial, MomentZ1, MomentZ2}
)

// NewLayout returns the layout of m's equilibrium matrix. Its rows and
// columns are counted first and allocated once: grown by append they cost
// about five times their size on a large model.
func NewLayout(m *model.Model) *Layout {
	rot := RotationalNodes(m)
	fixed := FixedComponents(m)
	free, _ := FreeRotations(m) // a skew free rotation is reported by Analyse
	l := &Layout{}
	hasRow := func(n, c int) bool {
		return !fixed[n][c] && (free == nil || c < model.RX || free[n]&model.ReleaseBit(c) == 0)
	}
	rows := 0
	for n := range m.NodeCount() {
		for _, c := range NodeComponents(m.Dim, rot[n]) {
			if hasRow(n, c) {
				rows++
			} else if fixed[n][c] {
				l.Constraints++
			}
		}
	}
	l.Rows = make([]Freedom, 0, rows)
	for n := range m.NodeCount() {
		for _, c := range NodeComponents(m.Dim, rot[n]) {
			if hasRow(n, c) {
				l.Rows = append(l.Rows, Freedom{Node: n, Component: c})
			}
		}
	}
	qs := beamQuantities[:]
	if m.Dim == 2 {
		qs = planeBeamQuantities[:]
	}
	columns := 0
	for e := range m.Members {
		columns += memberColumns(&m.Members[e], qs, nil)
	}
	l.Columns = make([]Column, 0, columns)
	for e, mem := range m.Members {
		l.HasBeams = l.HasBeams || mem.Kind != model.Bar
		memberColumns(&m.Members[e], qs, func(q Quantity) { l.Columns = append(l.Columns, Column{e, q}) })
	}
	return l
}

// memberColumns returns how many force quantities member mem carries (a
// bar its axial force, a beam those of qs that no release makes zero) and
// passes each to add when add is not nil.
func memberColumns(mem *model.Member, qs []Quantity, add func(Quantity)) int {
	if mem.Kind == model.Bar {
		qs = barQuantities[:]
	}
	count := 0
	for _, q := range qs {
		if mem.Kind == model.Bar || !Released(mem, q) {
			count++
			if add != nil {
				add(q)
			}
		}
	}
	return count
}

// MemberAxes returns the local axes of member e as the rows of a 3×3
// matrix: x along the member from its first end to its second, y the part
// of the member's Orientation normal to x (default: global z, or global y
// when the member is vertical, that is within 1e-6 rad of global z), and
// z = x × y. In a 2D model y is x turned a quarter turn anticlockwise and
// z is global z. ok is false when the given orientation is parallel to the
// member (or the member has zero length).
func MemberAxes(m *model.Model, e int) (axes [3][3]float64, ok bool) {
	mem := m.Members[e]
	a, b := m.Node(mem.Ends[0]), m.Node(mem.Ends[1])
	x := [3]float64{b[0] - a[0], b[1] - a[1], b[2] - a[2]}
	length := math.Sqrt(dot(x, x))
	if length == 0 {
		return axes, false
	}
	for i := range x {
		x[i] /= length
	}
	if m.Dim == 2 {
		return [3][3]float64{x, {-x[1], x[0], 0}, {0, 0, 1}}, true
	}
	o := mem.Orientation
	if o == ([3]float64{}) {
		o = [3]float64{0, 0, 1}
		if math.Abs(x[2]) > 1-1e-12 || math.Hypot(x[0], x[1]) < 1e-6 {
			o = [3]float64{0, 1, 0}
		}
	}
	// Gram–Schmidt: y is o less its component along x.
	ox := dot(o, x)
	y := [3]float64{o[0] - ox*x[0], o[1] - ox*x[1], o[2] - ox*x[2]}
	ny := math.Sqrt(dot(y, y))
	if ny <= 1e-9*math.Sqrt(dot(o, o)) {
		return axes, false
	}
	for i := range y {
		y[i] /= ny
	}
	z := [3]float64{x[1]*y[2] - x[2]*y[1], x[2]*y[0] - x[0]*y[2], x[0]*y[1] - x[1]*y[0]}
	return [3][3]float64{x, y, z}, true
}

func dot(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }
