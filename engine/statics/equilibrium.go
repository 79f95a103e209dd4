package statics

import (
	"fmt"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
)

// EquilibriumMatrix returns the equilibrium matrix A of m in the layout of
// NewLayout(m): A·t = f, where t holds the member forces (tension positive,
// moments in force × length) and f the loads on the unconstrained freedoms
// (forces, and moments at beam nodes). Column j of A is row j of the
// compatibility matrix Aᵀ that maps nodal displacements (and rotations) to
// member deformations: the extension of a bar, and for beams the twist and
// the end rotations relative to the chord. It returns nil when the matrix
// has no rows or no columns. It panics if a 3D beam's orientation is
// parallel to its axis (the compiler rejects such models).
func EquilibriumMatrix(m *model.Model) *mat.Dense {
	return equilibrium(m, NewLayout(m), 1)
}

// equilibrium builds A with moment and torque columns multiplied by
// lengthScale and rotational rows divided by it, so that all entries are of
// order one when lengthScale is a typical member length.
func equilibrium(m *model.Model, l *Layout, lengthScale float64) *mat.Dense {
	if len(l.Rows) == 0 || len(l.Columns) == 0 {
		return nil
	}
	rowOf := make([]int, 6*m.NodeCount())
	for i := range rowOf {
		rowOf[i] = -1
	}
	for i, f := range l.Rows {
		rowOf[6*f.Node+f.Component] = i
	}
	a := mat.NewDense(len(l.Rows), len(l.Columns), nil)
	nodeAxes := model.NodeAxes(m)
	add := func(node, comp, col int, v float64) {
		if nodeAxes != nil && nodeAxes[node] != nil {
			addInclined(a, rowOf, m.Dim, nodeAxes[node], node, comp, col, v)
			return
		}
		if r := rowOf[6*node+comp]; r >= 0 {
			a.Set(r, col, a.At(r, col)+v)
		}
	}
	// addTranslation adds coefficient·(d_b − d_a)·dir to column col.
	addTranslation := func(ends [2]int, dir [3]float64, coefficient float64, col int) {
		for c := range m.Dim {
			add(ends[0], c, col, -coefficient*dir[c])
			add(ends[1], c, col, coefficient*dir[c])
		}
	}
	// addRotation adds coefficient·(θ_node·dir) to column col.
	addRotation := func(node int, dir [3]float64, coefficient float64, col int) {
		if m.Dim == 2 {
			add(node, model.RZ, col, coefficient*dir[2])
			return
		}
		for c := range 3 {
			add(node, model.RX+c, col, coefficient*dir[c])
		}
	}
	for col, c := range l.Columns {
		mem := m.Members[c.Member]
		axes, ok := MemberAxes(m, c.Member)
		if !ok {
			panic(fmt.Sprintf("statics: member %d has no local axes", c.Member))
		}
		x, y, z := axes[0], axes[1], axes[2]
		length := m.Length(c.Member)
		rotScale := 1 / lengthScale
		momentCol := lengthScale
		a1, a2 := mem.Ends[0], mem.Ends[1]
		switch c.Quantity {
		case Axial:
			addTranslation(mem.Ends, x, 1, col)
		case Torsion:
			addRotation(a1, x, -momentCol*rotScale, col)
			addRotation(a2, x, momentCol*rotScale, col)
		case MomentZ1, MomentZ2:
			node := a1
			if c.Quantity == MomentZ2 {
				node = a2
			}
			addRotation(node, z, momentCol*rotScale, col)
			addTranslation(mem.Ends, y, -momentCol/length, col)
		case MomentY1, MomentY2:
			node := a1
			if c.Quantity == MomentY2 {
				node = a2
			}
			addRotation(node, y, momentCol*rotScale, col)
			addTranslation(mem.Ends, z, momentCol/length, col)
		}
	}
	return a
}
