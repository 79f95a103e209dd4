package model

import (
	"math"
	"strconv"
)

// directionTolerance is the sine of the smallest angle two support
// directions may make: below it they count as parallel.
const directionTolerance = 1e-6

// supportDirections compiles supports/i/directions into the support's
// axes (see supportAxes), reporting each bad vector at its pointer.
func (c *compiler) supportDirections(i int) {
	ss, sup := &c.spec.Supports[i], &c.m.Supports[i]
	if ss.Directions == nil {
		return
	}
	base := "supports/" + strconv.Itoa(i) + "/directions"
	most := c.dim - 1
	if len(ss.Directions) == 0 || len(ss.Directions) > most {
		if c.dim == 2 {
			c.problem(base, "a plane support takes one direction (its local x; local y follows a quarter turn anticlockwise), got %d", len(ss.Directions))
		} else {
			c.problem(base, "a space support takes one or two directions (its local x, and optionally a vector fixing local y), got %d", len(ss.Directions))
		}
		return
	}
	var vs [2][3]float64
	for k, d := range ss.Directions {
		path := base + "/" + strconv.Itoa(k)
		if len(d) != c.dim {
			c.problem(path, "a direction has %d entries; a %dD model needs %d", len(d), c.dim, c.dim)
			return
		}
		for j, x := range d {
			if !finite(x) {
				c.problem(path+"/"+strconv.Itoa(j), "must be a finite number, got %v", x)
				return
			}
			vs[k][j] = x
		}
		if norm3(vs[k]) == 0 {
			c.problem(path, "a direction must not be the zero vector")
			return
		}
	}
	axes, ok := supportAxes(c.dim, vs[:len(ss.Directions)])
	if !ok {
		c.problem(base+"/1", "the second direction is parallel to the first; give a vector that fixes local y across local x")
		return
	}
	sup.Inclined, sup.Axes = true, axes
}

// supportAxes returns a support's local axes (rows: x, y, z as unit
// vectors in global components) from its directions (dim entries each,
// nonzero):
//
//   - in 2D, one direction: x along it, y a quarter turn anticlockwise
//     from x, z global z;
//   - in 3D, two directions: x along the first, y the part of the second
//     normal to x (Gram–Schmidt), z = x × y;
//   - in 3D, one direction: x along it, y = ẑ × x normalised (horizontal,
//     so a direction along global x gives the global axes), or global y
//     when x lies within 1e-6 rad of global z; z = x × y.
//
// ok is false when the second direction is parallel to the first (the sine
// of their angle below 1e-6).
func supportAxes(dim int, dirs [][3]float64) (axes [3][3]float64, ok bool) {
	x := unit(dirs[0])
	var y [3]float64
	switch {
	case dim == 2:
		y = [3]float64{-x[1], x[0], 0}
	case len(dirs) == 2:
		d := dirs[1]
		s := dot3(d, x)
		for k := range y {
			y[k] = d[k] - s*x[k]
		}
		if norm3(y) <= directionTolerance*norm3(d) {
			return axes, false
		}
		y = unit(y)
	default:
		y = cross3([3]float64{0, 0, 1}, x)
		if norm3(y) <= directionTolerance {
			y = [3]float64{0, 1, 0}
		}
		y = unit(y)
	}
	return [3][3]float64{x, y, cross3(x, y)}, true
}

// NodeAxes returns, per node, the axes of the inclined support at that
// node (nil where there is none), or nil when no support is inclined. The
// compiler allows one support per node; a support added later at the same
// node (as a held freedom) refers to the same axes.
func NodeAxes(m *Model) []*[3][3]float64 {
	var out []*[3][3]float64
	for i := range m.Supports {
		s := &m.Supports[i]
		if !s.Inclined {
			continue
		}
		if out == nil {
			out = make([]*[3][3]float64, m.NodeCount())
		}
		if out[s.Node] == nil {
			out[s.Node] = &s.Axes
		}
	}
	return out
}

// ToAxes writes into v (global components: two in a plane model, three
// in space) its components along axes (rows): v ← axes·v. A plane
// model's axes turn about z only, so their upper 2×2 block is the whole
// turn.
func ToAxes(axes *[3][3]float64, v []float64) {
	var w [3]float64
	for i := range v {
		for j := range v {
			w[i] += axes[i][j] * v[j]
		}
	}
	copy(v, w[:len(v)])
}

// FromAxes writes into v (components along axes, two or three) its global
// components: v ← axesᵀ·v.
func FromAxes(axes *[3][3]float64, v []float64) {
	var w [3]float64
	for i := range v {
		for j := range v {
			w[i] += axes[j][i] * v[j]
		}
	}
	copy(v, w[:len(v)])
}

func dot3(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }

func norm3(a [3]float64) float64 { return math.Sqrt(dot3(a, a)) }

func unit(a [3]float64) [3]float64 {
	n := norm3(a)
	return [3]float64{a[0] / n, a[1] / n, a[2] / n}
}

func cross3(a, b [3]float64) [3]float64 {
	return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}
