package modes

import (
	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// The local matrices below use the freedoms of stiffness.AddMember: per
// end, a bar's Dim translations; a 2D beam's u, v, θz; a 3D beam's u, v,
// w, θx, θy, θz, in the member's local axes. In the local x–z plane the
// rotation θy is −dw/dx, so the terms that couple w with θy change sign
// against those that couple v with θz (as in the stiffness package).

// cubicBlock is a 4×4 matrix over (v₁, θ₁, v₂, θ₂) of the cubic
// (Hermite) beam element.
type cubicBlock [4][4]float64

// addCubic adds c·block over the local freedoms (v1, r1, v2, r2) of an
// n×n row-major matrix; sign −1 flips the terms that couple a
// displacement with a rotation.
func addCubic(dst []float64, n int, idx [4]int, block *cubicBlock, c, sign float64) {
	for i := range 4 {
		for j := range 4 {
			v := c * block[i][j]
			if (i%2 == 1) != (j%2 == 1) {
				v *= sign
			}
			dst[idx[i]*n+idx[j]] += v
		}
	}
}

// addPair adds c·[[a, b], [b, a]] over local freedoms i and j.
func addPair(dst []float64, n, i, j int, c, a, b float64) {
	dst[i*n+i] += c * a
	dst[j*n+j] += c * a
	dst[i*n+j] += c * b
	dst[j*n+i] += c * b
}

// geometricCubic is the consistent geometric stiffness of the cubic
// Euler–Bernoulli element times 30·L/N (times L where shown), after
// R. D. Cook, D. S. Malkus, M. E. Plesha and R. J. Witt, "Concepts and
// Applications of Finite Element Analysis", 4th ed., Wiley 2002, §18.3
// (from memory): N/(30L)·[36, 3L, −36, 3L; 3L, 4L², −3L, −L²; ...].
func geometricCubic(L float64) cubicBlock {
	return cubicBlock{
		{36, 3 * L, -36, 3 * L},
		{3 * L, 4 * L * L, -3 * L, -L * L},
		{-36, -3 * L, 36, -3 * L},
		{3 * L, -L * L, -3 * L, 4 * L * L},
	}
}

// massCubic is the consistent mass of the cubic element times 420/(ρAL),
// from the same source (from memory): ρAL/420·[156, 22L, 54, −13L; ...].
func massCubic(L float64) cubicBlock {
	return cubicBlock{
		{156, 22 * L, 54, -13 * L},
		{22 * L, 4 * L * L, 13 * L, -3 * L * L},
		{54, 13 * L, 156, -22 * L},
		{-13 * L, -3 * L * L, -22 * L, 4 * L * L},
	}
}

// geometricLocal writes into dst (zeroed first) member e's geometric
// stiffness in local axes for the axial force N (tension positive), so
// that K + K_G is the tangent stiffness under N. A bar has the string
// term (N/L)·(I − x·xᵀ) per pair of ends; a beam has the consistent
// cubic term in each bending plane and, in 3D, the torsional term
// N·(Iy + Iz)/(A·L) (W. McGuire, R. H. Gallagher and R. D. Ziemian,
// "Matrix Structural Analysis", 2nd ed., Wiley 2000, §9.3, from memory),
// which gives a doubly symmetric column its torsional buckling load
// GJ·A/(Iy + Iz). Axial terms are left out, as in both sources.
func geometricLocal(dst []float64, m *model.Model, e int, N float64) int {
	p := stiffness.MemberFreedoms(m, e)
	n := 2 * p
	clear(dst[:n*n])
	L := m.Length(e)
	if m.Members[e].Kind != model.Beam {
		for c := 1; c < p; c++ {
			addPair(dst, n, c, p+c, N/L, 1, -1)
		}
		return n
	}
	g := geometricCubic(L)
	if m.Dim == 2 {
		addCubic(dst, n, [4]int{1, 2, 4, 5}, &g, N/(30*L), 1)
		return n
	}
	addCubic(dst, n, [4]int{1, 5, 7, 11}, &g, N/(30*L), 1)
	addCubic(dst, n, [4]int{2, 4, 8, 10}, &g, N/(30*L), -1)
	sec := m.Sections[m.Members[e].Section]
	addPair(dst, n, 3, 9, N*(sec.SecondMoment+sec.SecondMomentY)/(sec.Area*L), 1, -1)
	return n
}

// massLocal writes into dst (zeroed first) member e's consistent mass in
// local axes for mass density rho (mass per volume). A bar interpolates
// every translation linearly: ρAL/6·[2, 1; 1, 2] per component. A beam
// has the same axial term, the cubic term in each bending plane and, in
// 3D, the linear term for twist with the polar second moment Iy + Iz
// (Cook et al. 2002, §11.3, from memory). Rotary inertia of bending is
// left out, as Euler–Bernoulli theory does.
//
// The consistent mass is chosen over a lumped one because it is positive
// definite on the rotations of beams too (a lumped mass gives them none,
// and a singular mass matrix), and because with it the frequencies of a
// beam converge from above at a rate of h⁴ where a lumped mass converges
// at h²: two elements per half-wave suffice for 1%.
func massLocal(dst []float64, m *model.Model, e int, rho float64) int {
	p := stiffness.MemberFreedoms(m, e)
	n := 2 * p
	clear(dst[:n*n])
	L := m.Length(e)
	sec := m.Sections[m.Members[e].Section]
	total := rho * sec.Area * L
	if m.Members[e].Kind != model.Beam {
		for c := range p {
			addPair(dst, n, c, p+c, total/6, 2, 1)
		}
		return n
	}
	addPair(dst, n, 0, p, total/6, 2, 1)
	mc := massCubic(L)
	if m.Dim == 2 {
		addCubic(dst, n, [4]int{1, 2, 4, 5}, &mc, total/420, 1)
		return n
	}
	addCubic(dst, n, [4]int{1, 5, 7, 11}, &mc, total/420, 1)
	addCubic(dst, n, [4]int{2, 4, 8, 10}, &mc, total/420, -1)
	addPair(dst, n, 3, 9, rho*(sec.SecondMoment+sec.SecondMomentY)*L/6, 2, 1)
	return n
}
