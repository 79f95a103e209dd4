package stiffness

import (
	"gusset/engine/model"
	"gusset/engine/statics"
)

// element is one member's stiffness in local axes and its transformation.
// Local freedoms run node by node: for bars the Dim translations; for 2D
// beams u, v, θz; for 3D beams u, v, w, θx, θy, θz.
type element struct {
	size    int // local freedoms (2·perNode)
	perNode int
	beam    bool
	dofs    [12]int
	k       [144]float64 // local stiffness, size×size, row-major
	t       [144]float64 // local = t·global, size×size, row-major
	axes    [3][3]float64
	length  float64
	ea      float64
	rel     condensation // the end releases (release.go)
}

// build fills el for member e. The model has been validated, so axes exist.
func (el *element) build(m *model.Model, nb *numbering, e int) {
	mem := m.Members[e]
	mat := m.Materials[mem.Material]
	sec := m.Sections[mem.Section]
	el.beam = mem.Kind == model.Beam
	el.axes, _ = statics.MemberAxes(m, e)
	el.length = m.Length(e)
	el.ea = mat.ElasticModulus * sec.Area
	switch {
	case !el.beam:
		el.perNode = m.Dim
	case m.Dim == 2:
		el.perNode = 3
	default:
		el.perNode = 6
	}
	el.size = 2 * el.perNode
	for side, n := range mem.Ends {
		for c := range el.perNode {
			comp := c
			if m.Dim == 2 && c == 2 {
				comp = model.RZ
			}
			el.dofs[side*el.perNode+c] = nb.freedom(n, comp)
		}
	}
	n := el.size
	// Only the leading size×size entries are used.
	clear(el.k[:n*n])
	clear(el.t[:n*n])
	set := func(i, j int, v float64) {
		el.k[i*n+j] += v
		if i != j {
			el.k[j*n+i] += v
		}
	}
	L := el.length
	a := el.ea / L
	p := el.perNode
	set(0, 0, a)
	set(p, p, a)
	set(0, p, -a)
	if el.beam {
		ei := mat.ElasticModulus * sec.SecondMoment
		// Bending in the local x–y plane: v and θz, the classical
		// Euler–Bernoulli beam stiffness.
		v1, r1, v2, r2 := 1, 2, p+1, p+2
		if m.Dim == 3 {
			r1, r2 = 5, p+5
		}
		bend(set, v1, r1, v2, r2, ei, L, 1)
		if m.Dim == 3 {
			eiy := mat.ElasticModulus * sec.SecondMomentY
			// Bending in the local x–z plane: w and θy, where w' = −θy
			// flips the sign of the coupling terms.
			bend(set, 2, 4, p+2, p+4, eiy, L, -1)
			gj := mat.ShearModulus * sec.TorsionConstant / L
			set(3, 3, gj)
			set(p+3, p+3, gj)
			set(3, p+3, -gj)
		}
	}
	el.release(&mem, m.Dim)
	el.fillTransform(m.Dim, p, n)
}

// fillTransform writes t, which is block diagonal with the rotation λ
// (rows: local axes in global components) on each group of three (or Dim)
// components; p is the freedoms per node and n the element's size.
func (el *element) fillTransform(dim, p, n int) {
	for side := range 2 {
		base := side * p
		for g := 0; g < p; g += 3 {
			width := min(3, p-g)
			if dim == 2 && g == 0 {
				width = 2
			}
			for i := range width {
				for j := range width {
					el.t[(base+g+i)*n+base+g+j] = el.axes[i][j]
				}
			}
			if dim == 2 && p == 3 {
				el.t[(base+2)*n+base+2] = 1
				break
			}
		}
	}
}

// bend adds the Euler–Bernoulli bending stiffness of flexural rigidity ei
// and length L for transverse freedoms v1, v2 and rotations r1, r2; sign is
// −1 when the rotation is −dv/dx.
func bend(set func(i, j int, v float64), v1, r1, v2, r2 int, ei, L, sign float64) {
	k12 := 12 * ei / (L * L * L)
	k6 := sign * 6 * ei / (L * L)
	set(v1, v1, k12)
	set(v2, v2, k12)
	set(v1, v2, -k12)
	set(v1, r1, k6)
	set(v1, r2, k6)
	set(v2, r1, -k6)
	set(v2, r2, -k6)
	set(r1, r1, 4*ei/L)
	set(r2, r2, 4*ei/L)
	set(r1, r2, 2*ei/L)
}

// globalStiffness writes tᵀ·k·t into dst (size×size, row-major).
func (el *element) globalStiffness(dst []float64) {
	n := el.size
	if !el.beam {
		// A bar's k has four entries, at the axial freedoms 0 and p, and
		// row 0 of each block of t is the member axis c, so tᵀ·k·t reduces
		// to the blocks ±(EA/L)·c·cᵀ. The products are the only nonzero
		// terms of the general sums below, taken in the same order, so
		// the values are the same.
		p := el.perNode
		c := el.axes[0]
		for i := range n {
			si, ci := 0, c[i%p]
			if i >= p {
				si = p
			}
			for j := range n {
				sj, cj := 0, c[j%p]
				if j >= p {
					sj = p
				}
				dst[i*n+j] = ci * (el.k[si*n+sj] * cj)
			}
		}
		return
	}
	var kt [144]float64
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += el.k[i*n+l] * el.t[l*n+j]
			}
			kt[i*n+j] = s
		}
	}
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += el.t[l*n+i] * kt[l*n+j]
			}
			dst[i*n+j] = s
		}
	}
}

// toLocal writes t·g into dst.
func (el *element) toLocal(dst, g []float64) { mulSquare(dst, el.t[:], g, el.size) }

// localDisplacements sets ul to the element's end displacements in its
// local axes, read from the nodal displacements u (global axes, by
// freedom), and returns the element's size.
func (el *element) localDisplacements(ul, u []float64) int {
	var ug [12]float64
	for i := range el.size {
		ug[i] = u[el.dofs[i]]
	}
	el.toLocal(ul, ug[:])
	return el.size
}

// toGlobal writes tᵀ·l into dst.
func (el *element) toGlobal(dst, l []float64) {
	n := el.size
	for j := range n {
		var s float64
		for i := range n {
			s += el.t[i*n+j] * l[i]
		}
		dst[j] = s
	}
}

// localForces writes k·ul into dst.
func (el *element) localForces(dst, ul []float64) { mulSquare(dst, el.k[:], ul, el.size) }

// mulSquare writes a·x into dst for the n×n row-major matrix a.
func mulSquare(dst, a, x []float64, n int) {
	for i := range n {
		var s float64
		for j := range n {
			s += a[i*n+j] * x[j]
		}
		dst[i] = s
	}
}
