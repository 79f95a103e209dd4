package stiffness

import (
	"fmt"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/statics"
)

// condensation is what a beam's end releases leave of its element: the
// released rotations are condensed out of the local stiffness (static
// condensation, McGuire, Gallagher & Ziemian, Matrix Structural Analysis,
// 2nd ed. 2000, §4.7 and §13.2):
//
//	K* = K_cc − K_cr·K_rr⁻¹·K_rc,   f* = f_c − K_cr·K_rr⁻¹·f_r,
//
// with f the equivalent nodal loads of the member's loads (minus the
// fixed-end forces), and after the solve each released end rotation is
//
//	θ_r = K_rr⁻¹·(f_r − K_rc·u_c),
//
// the rotation at which the released end carries no moment. A torsion
// release at either end removes the torque altogether (a torque is
// constant along the member); the twist is then undetermined and is
// reported as that of the unreleased end (the mean of the ends' when both
// are released).
type condensation struct {
	n     int             // released bending rotations
	r     [4]int          // their local freedoms
	g     [4 * 12]float64 // K_rr⁻¹·K_r· (n rows of el.size), from the full k
	h     [4 * 4]float64  // K_rr⁻¹
	theta [4]float64      // K_rr⁻¹·f_r of the last loads condensed
	twist [2]bool         // torsion released at the first, second end
}

// release condenses member mem's released rotations out of el.k; el.k
// holds the full local stiffness and el.perNode is set.
func (el *element) release(mem *model.Member, dim int) {
	el.rel.n = 0
	el.rel.twist = [2]bool{}
	if !el.beam || !mem.HasReleases() {
		return
	}
	p, size := el.perNode, el.size
	if dim == 3 && statics.Released(mem, statics.Torsion) {
		el.rel.twist = [2]bool{mem.Released(0, model.RX), mem.Released(1, model.RX)}
		for _, i := range [2]int{3, p + 3} {
			for j := range size {
				el.k[i*size+j], el.k[j*size+i] = 0, 0
			}
		}
	}
	for side := range 2 {
		for _, c := range [2]int{model.RY, model.RZ} {
			if mem.Released(side, c) && (dim == 3 || c == model.RZ) { // a plane beam bends about z alone
				el.rel.r[el.rel.n] = side*p + componentOffset(dim, c)
				el.rel.n++
			}
		}
	}
	rc := &el.rel
	nr := rc.n
	clear(rc.theta[:])
	if nr == 0 {
		return
	}
	var krr [16]float64
	for a := range nr {
		for b := range nr {
			krr[a*nr+b] = el.k[rc.r[a]*size+rc.r[b]]
		}
	}
	invertSmall(rc.h[:nr*nr], krr[:nr*nr], nr)
	for a := range nr {
		for j := range size {
			var s float64
			for b := range nr {
				s += rc.h[a*nr+b] * el.k[rc.r[b]*size+j]
			}
			rc.g[a*size+j] = s
		}
	}
	// k ← k − K_·r·g, then exact zeros at the released freedoms and the
	// symmetric part (the product is symmetric up to round-off).
	var kr [12 * 4]float64
	for i := range size {
		for a := range nr {
			kr[i*nr+a] = el.k[i*size+rc.r[a]]
		}
	}
	for i := range size {
		for j := range size {
			var s float64
			for a := range nr {
				s += kr[i*nr+a] * rc.g[a*size+j]
			}
			el.k[i*size+j] -= s
		}
	}
	for _, i := range rc.r[:nr] {
		for j := range size {
			el.k[i*size+j], el.k[j*size+i] = 0, 0
		}
	}
	for i := range size {
		for j := range i {
			v := 0.5 * (el.k[i*size+j] + el.k[j*size+i])
			el.k[i*size+j], el.k[j*size+i] = v, v
		}
	}
}

// condenseLoads turns f (local equivalent nodal loads, el.size entries)
// into the released element's f* = f_c − gᵀ·f_r (gᵀ = K_cr·K_rr⁻¹ by
// symmetry) with zeros at the released freedoms, keeping K_rr⁻¹·f_r for
// restoreReleased.
func (el *element) condenseLoads(f []float64) {
	rc := &el.rel
	nr, size := rc.n, el.size
	if nr == 0 {
		return
	}
	var fr [4]float64
	for a := range nr {
		fr[a] = f[rc.r[a]]
	}
	for a := range nr {
		var s float64
		for b := range nr {
			s += rc.h[a*nr+b] * fr[b]
		}
		rc.theta[a] = s
	}
	for j := range size {
		var s float64
		for a := range nr {
			s += rc.g[a*size+j] * fr[a]
		}
		f[j] -= s
	}
	for _, i := range rc.r[:nr] {
		f[i] = 0
	}
}

// restoreReleased replaces, in the local displacements ul, each released
// rotation (which holds the node's rotation) by the member end's own:
// θ_r = K_rr⁻¹·f_r − Σ_c g_rc·u_c over the unreleased freedoms c, and a
// released twist by the other end's (see condensation). The member's
// forces are unchanged (its condensed k has no column there).
func (el *element) restoreReleased(ul []float64) {
	rc := &el.rel
	p, size := el.perNode, el.size
	switch rc.twist {
	case [2]bool{true, false}:
		ul[3] = ul[p+3]
	case [2]bool{false, true}:
		ul[p+3] = ul[3]
	case [2]bool{true, true}:
		mean := 0.5 * (ul[3] + ul[p+3])
		ul[3], ul[p+3] = mean, mean
	}
	nr := rc.n
	if nr == 0 {
		return
	}
	var released [12]bool
	for _, i := range rc.r[:nr] {
		released[i] = true
	}
	var theta [4]float64
	for a := range nr {
		s := rc.theta[a]
		for j := range size {
			if !released[j] {
				s -= rc.g[a*size+j] * ul[j]
			}
		}
		theta[a] = s
	}
	for a := range nr {
		ul[rc.r[a]] = theta[a]
	}
}

// invertSmall writes the inverse of the n×n symmetric positive definite
// matrix a (n ≤ 4: a beam's released bending rotations, whose K_rr is
// positive definite: 4EI/L on the diagonal, 2EI/L coupling the ends of one
// plane) into dst by Gauss–Jordan elimination; a is overwritten.
func invertSmall(dst, a []float64, n int) {
	clear(dst)
	for i := range n {
		dst[i*n+i] = 1
	}
	for col := range n {
		d := a[col*n+col]
		for j := range n {
			a[col*n+j] /= d
			dst[col*n+j] /= d
		}
		for i := range n {
			if i == col {
				continue
			}
			f := a[i*n+col]
			for j := range n {
				a[i*n+j] -= f * a[col*n+j]
				dst[i*n+j] -= f * dst[col*n+j]
			}
		}
	}
}

// holdFreeRotations marks fixed (held at zero, with no support and so no
// reaction) the rotations that no member end resists (see
// statics.FreeRotations); a skew free rotation is left to validate.
func (nb *numbering) holdFreeRotations(m *model.Model, fixed []bool) {
	free, err := statics.FreeRotations(m)
	if err != nil || free == nil {
		return
	}
	for n, bits := range free {
		for c := model.RX; c <= model.RZ; c++ {
			if bits&model.ReleaseBit(c) == 0 {
				continue
			}
			if f := nb.freedom(n, c); f >= 0 {
				fixed[f] = true
			}
		}
	}
}

// validateReleases reports a skew free rotation (statics.FreeRotations)
// and a nodal moment about a rotation that no member resists and no
// support holds: nothing could carry it.
func validateReleases(m *model.Model, add func(path, format string, args ...any)) {
	free, err := statics.FreeRotations(m)
	if err != nil {
		if fe, ok := fault.As(err); ok {
			for _, p := range fe.Problems {
				add(p.Path, "%s", p.Message)
			}
		}
		return
	}
	if free == nil {
		return
	}
	fixed := statics.FixedComponents(m)
	for ci, lc := range m.Cases {
		for li, nl := range lc.Nodal {
			for c := model.RX; c <= model.RZ; c++ {
				moment := nl.Moment[c-model.RX]
				if moment == 0 || free[nl.Node]&model.ReleaseBit(c) == 0 || fixed[nl.Node][c] {
					continue
				}
				add(fmt.Sprintf("/load_cases/%d/loads/%d/moment", ci, li),
					"node %q is a hinge for rotation %s: every beam there is released about it, so nothing can carry a moment about it; apply the moment to a member end that is not released, or fix the rotation in a support",
					m.NodeIDs[nl.Node], model.ComponentNames[c])
			}
		}
	}
}

// condenseMatrix turns local (el.size square, row-major, local axes), a
// matrix of the full element such as a geometric stiffness or a
// consistent mass, into Tᵀ·local·T for a released element, where T
// carries the unreleased freedoms to all of them as the condensed
// stiffness does: a released bending rotation follows as θ_r = −Σ_c
// g_rc·u_c (the static shape of the released beam: Guyan's reduction at
// the element, R. J. Guyan, "Reduction of stiffness and mass matrices",
// AIAA Journal 3(2), 1965), a twist released at one end follows the other
// end's, and a twist released at both ends (the member's own spin, which
// nothing resists) is left out. T is zero in the released columns, so
// the result has no entries there. It does nothing for an element
// without releases.
func (el *element) condenseMatrix(local []float64) {
	rc := &el.rel
	if rc.n == 0 && rc.twist == [2]bool{} {
		return
	}
	n, p := el.size, el.perNode
	var tm [144]float64 // T, n×n
	for i := range n {
		tm[i*n+i] = 1
	}
	switch rc.twist {
	case [2]bool{true, false}:
		tm[3*n+3], tm[3*n+p+3] = 0, 1
	case [2]bool{false, true}:
		tm[(p+3)*n+p+3], tm[(p+3)*n+3] = 0, 1
	case [2]bool{true, true}:
		tm[3*n+3], tm[(p+3)*n+p+3] = 0, 0
	}
	var released [12]bool
	for _, i := range rc.r[:rc.n] {
		released[i] = true
	}
	for a, i := range rc.r[:rc.n] {
		for j := range n {
			tm[i*n+j] = 0
			if !released[j] {
				tm[i*n+j] = -rc.g[a*n+j]
			}
		}
	}
	var at, out [144]float64
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += local[i*n+l] * tm[l*n+j]
			}
			at[i*n+j] = s
		}
	}
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += tm[l*n+i] * at[l*n+j]
			}
			out[i*n+j] = s
		}
	}
	copy(local[:n*n], out[:n*n])
}
