package modes

import (
	"math"

	"gusset/engine/model"
)

// Inclined supports: stiffness.Matrices numbers a node held by a support
// with directions of its own in that support's axes (its element blocks,
// the geometric stiffness and the consistent mass turned by AddMember; a
// lumped node mass is the same in any axes). So the eigenvectors come out
// in those axes at such nodes, and turnShape turns them back to global
// axes; the participation of a global direction uses the turned unit
// vector (see influence).

// turnShape turns a mode shape's translations (and 3D rotations) at nodes
// in a support's axes to global axes and, when unit is set, scales it
// again to a largest global translation of 1 (shape's rule, read in
// global axes), the largest entry positive.
func turnShape(m *model.Model, disp, rotation [][]float64, unit bool) {
	axes := model.NodeAxes(m)
	if axes == nil {
		return
	}
	for n, a := range axes {
		if a == nil {
			continue
		}
		model.FromAxes(a, disp[n])
		if m.Dim == 3 && rotation[n] != nil {
			model.FromAxes(a, rotation[n])
		}
	}
	big, bigTrans, sign := 0.0, 0.0, 1.0
	see := func(v float64, translation bool) {
		if a := math.Abs(v); a > big {
			big, sign = a, math.Copysign(1, v)
		}
		if translation {
			bigTrans = max(bigTrans, math.Abs(v))
		}
	}
	for n := range disp {
		for _, v := range disp[n] {
			see(v, true)
		}
		for _, v := range rotation[n] {
			see(v, false)
		}
	}
	c := sign
	if unit && bigTrans > 0 {
		c /= bigTrans
	}
	for n := range disp {
		for k := range disp[n] {
			disp[n][k] *= c
		}
		for k := range rotation[n] {
			rotation[n][k] *= c
		}
	}
}
