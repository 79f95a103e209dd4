package stiffness

// The internal forces whose range along a member MemberResult.Ranges
// holds, in the member's local axes with the sign conventions of
// MemberResult (tension positive; moments as right-handed vectors).
const (
	RangeAxial   = iota // axial force N
	RangeShearY         // shear force V_y (in 2D the shear in the plane)
	RangeShearZ         // shear force V_z (3D)
	RangeTorsion        // torque T (3D)
	RangeMomentY        // bending moment M_y (3D)
	RangeMomentZ        // bending moment M_z (in 2D the moment in the plane)
	RangeCount          // the number of internal forces
)

// Range is the largest and the smallest value of one internal force along
// a member, each with its distance from the first end. For a beam both are
// exact: the ends of every stretch between point loads and the zeros of
// the polynomial's derivative are scanned (at a point load the values on
// both sides count). A bar has only its axial force; its other ranges are
// zero.
type Range struct {
	Max, Min Extreme
}

// rangeScan tracks the range of every internal force along one beam.
type rangeScan [RangeCount]struct{ max, min peak }

// see counts value v of internal force q at distance x.
func (rs *rangeScan) see(q int, v, x float64) {
	rs[q].max.largest(v, x)
	rs[q].min.smallest(v, x)
}

// stretch scans the shear forces (quadratics, V′ = −q) and the torque
// (constant: no distributed torques) over the current stretch of f,
// [x0, x0 + h].
func (rs *rangeScan) stretch(f *field, h float64) {
	shear := func(p *plane, q int) {
		q0 := p.a + p.b*f.x0
		c := [3]float64{p.shear, -q0, -p.b / 2}
		scan(c[:], f.x0, h, func(v, x float64) { rs.see(q, v, x) })
	}
	shear(&f.y, RangeShearY)
	if f.dim3 {
		shear(&f.z, RangeShearZ)
		rs.see(RangeTorsion, f.torsion, f.x0)
		rs.see(RangeTorsion, f.torsion, f.x0+h)
	}
}

// ranges returns the tracked ranges; a force never seen (the 3D ones of a
// 2D beam) has a zero range.
func (rs *rangeScan) ranges() [RangeCount]Range {
	var out [RangeCount]Range
	for q := range rs {
		out[q] = Range{Max: rs[q].max.Extreme, Min: rs[q].min.Extreme}
	}
	return out
}
