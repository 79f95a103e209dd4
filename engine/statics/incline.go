package statics

import (
	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
)

// addInclined adds v, an entry of the equilibrium matrix at global
// component comp of node, to the node's rows, which are components along
// the axes of its inclined support (model.Support.Axes): the row of local
// component k takes axes[k][comp]·v. A fixed local component has no row,
// so an inclined fixed component counts as one constraint along its
// direction. A plane model's rotation about z is the same in any axes
// turned about z.
func addInclined(a *mat.Dense, rowOf []int, dim int, axes *[3][3]float64, node, comp, col int, v float64) {
	base, j := model.X, comp
	if comp >= model.RX {
		if dim == 2 {
			if r := rowOf[6*node+comp]; r >= 0 {
				a.Set(r, col, a.At(r, col)+v)
			}
			return
		}
		base, j = model.RX, comp-model.RX
	}
	for k := range dim {
		if r := rowOf[6*node+base+k]; r >= 0 {
			a.Set(r, col, a.At(r, col)+axes[k][j]*v)
		}
	}
}

// turnModes turns the report's mechanism modes at inclined nodes (whose
// rows are components along their supports' axes) to global axes.
func (r *Report) turnModes(m *model.Model) {
	nodeAxes := model.NodeAxes(m)
	if nodeAxes == nil {
		return
	}
	for i, mode := range r.MechanismModes {
		for n, axes := range nodeAxes {
			if axes == nil {
				continue
			}
			model.FromAxes(axes, mode[n*m.Dim:(n+1)*m.Dim])
			if m.Dim == 3 && i < len(r.MechanismRotations) {
				model.FromAxes(axes, r.MechanismRotations[i][3*n:3*n+3])
			}
		}
	}
}
