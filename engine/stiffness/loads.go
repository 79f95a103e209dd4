package stiffness

import (
	"math"

	"gusset/engine/model"
)

// gauss3 is the three-point Gauss–Legendre rule on [0, 1], exact for
// polynomials up to degree 5: a cubic shape function times a linear load.
var gauss3 = [3][2]float64{
	{0.5 - 0.5*0.7745966692414834, 5.0 / 18},
	{0.5, 8.0 / 18},
	{0.5 + 0.5*0.7745966692414834, 5.0 / 18},
}

// addShape adds to the local load vector f the work-equivalent nodal loads
// of the force q (local axes) applied at ξ = x/L, scaled by weight: linear
// shape functions for axial loads and for every load on a bar, cubic
// Hermite functions for transverse loads on a beam.
func (el *element) addShape(f []float64, xi float64, q [3]float64, weight float64) {
	p := el.perNode
	n1, n2 := 1-xi, xi
	f[0] += weight * n1 * q[0]
	f[p] += weight * n2 * q[0]
	transverse := 2
	if p == 3 && el.beam || p == 2 {
		transverse = 1 // 2D: local y only
	}
	if !el.beam {
		for c := 1; c <= transverse; c++ {
			f[c] += weight * n1 * q[c]
			f[p+c] += weight * n2 * q[c]
		}
		return
	}
	L := el.length
	h1 := 1 - 3*xi*xi + 2*xi*xi*xi
	h2 := L * (xi - 2*xi*xi + xi*xi*xi)
	h3 := 3*xi*xi - 2*xi*xi*xi
	h4 := L * (xi*xi*xi - xi*xi)
	rz := 2
	if p == 6 {
		rz = 5
	}
	f[1] += weight * h1 * q[1]
	f[rz] += weight * h2 * q[1]
	f[p+1] += weight * h3 * q[1]
	f[p+rz] += weight * h4 * q[1]
	if p == 6 {
		// w' = −θy, so the moments about y change sign.
		f[2] += weight * h1 * q[2]
		f[4] -= weight * h2 * q[2]
		f[p+2] += weight * h3 * q[2]
		f[p+4] -= weight * h4 * q[2]
	}
}

// localVector returns v in local axes (v in global axes when local is
// false).
func (el *element) localVector(v [3]float64, local bool) [3]float64 {
	if local {
		return v
	}
	var out [3]float64
	for i := range 3 {
		out[i] = el.axes[i][0]*v[0] + el.axes[i][1]*v[1] + el.axes[i][2]*v[2]
	}
	return out
}

// intensities returns a uniform or linear load's intensities at the
// member's first and second ends, in local axes.
func (el *element) intensities(ml *model.MemberLoad) (q1, q2 [3]float64) {
	q1 = el.localVector(ml.Value, ml.Local)
	q2 = q1
	if ml.Kind == model.Linear {
		q2 = el.localVector(ml.EndValue, ml.Local)
	}
	return q1, q2
}

// addMemberLoad adds to f (local, el.size entries) the equivalent nodal
// loads of ml times factor. The load is valid (checked by validate).
func (el *element) addMemberLoad(f []float64, ml *model.MemberLoad, factor float64) {
	L := el.length
	switch ml.Kind {
	case model.Uniform, model.Linear:
		q1, q2 := el.intensities(ml)
		x1, x2 := stretchOf(ml, L)
		for _, g := range gauss3 {
			xi := g[0]
			var q [3]float64
			for c := range 3 {
				q[c] = q1[c] + (q2[c]-q1[c])*xi
			}
			el.addShape(f, (x1+(x2-x1)*xi)/L, q, factor*g[1]*(x2-x1))
		}
	case model.Point:
		el.addShape(f, ml.Distance/L, el.localVector(ml.Value, ml.Local), factor)
	case model.Thermal:
		// A restrained member that wants to grow by εL pushes its ends
		// apart with E·A·ε.
		force := factor * el.ea * ml.Strain
		f[0] -= force
		f[el.perNode] += force
	}
}

// addSelfWeight adds the equivalent nodal loads of the member's own weight
// (weight density × area per unit length, along −y in 2D and −z in 3D)
// times factor.
func (el *element) addSelfWeight(f []float64, m *model.Model, e int, factor float64) {
	mem := m.Members[e]
	w := m.Materials[mem.Material].WeightDensity * m.Sections[mem.Section].Area
	if w == 0 {
		return
	}
	var g [3]float64
	g[m.Dim-1] = -w
	q := el.localVector(g, false)
	for _, gp := range gauss3 {
		el.addShape(f, gp[0], q, factor*gp[1]*el.length)
	}
}

// finite reports whether every entry of v is finite.
func finite(v []float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}
