package stiffness

import (
	"math"

	"gusset/engine/model"
)

// alongLoadedBar sets the results of a bar that carries loads across its
// length (its own weight, member loads) from its local end forces p, its
// local end displacements ul and its loading ld; f is scratch space.
//
// A bar is pin-ended, so between its ends it is a simply supported span:
// the loads reach its ends as the span's reactions (addShape's linear
// shape functions give exactly those, so p already holds them), its end
// moments are zero, and its shear and moment follow from statics alone,
// exactly, whatever its section (Timoshenko & Gere, Mechanics of
// Materials, 1997, §4.4: shear-force and bending-moment diagrams of a
// simple beam). Its deflection between the ends needs EI: the elastic
// curve through both ends' displacements (§9.2), the end slopes being
// those that make it pass through the second end. Without a second moment
// of area (EI about both axes in 3D) the deflection between the ends is
// not known: the results keep the chord between the ends, the energy of
// bending is not counted, and r is flagged noSpanInertia.
func alongLoadedBar(r *MemberResult, el *element, sec *model.Section, mat *model.Material, p, ul []float64, ld *memberLoading, f *field) {
	dim := el.perNode
	saved := el.perNode
	el.perNode = 3 * (dim - 1) // the beam layout the field reads
	defer func() { el.perNode = saved }()
	var pb, ub [12]float64
	for side := range 2 {
		for c := range dim {
			pb[side*el.perNode+c] = p[side*dim+c]
			ub[side*el.perNode+c] = ul[side*dim+c]
		}
	}
	e := mat.ElasticModulus
	ei, eiy := e*sec.SecondMoment, e*sec.SecondMomentY
	known := ei > 0 && (dim == 2 || eiy > 0)
	if !known {
		// Moments do not depend on EI; an infinite one leaves the chord.
		ei, eiy = math.Inf(1), math.Inf(1)
		r.Unchecked |= noSpanInertia
	}
	spanSlopes(el, ei, eiy, pb[:], ub[:], ld, f)
	f.start(el, ei, eiy, pb[:], ub[:], ld)
	beamExtremes(r, f)
	r.LoadedAcross = true
}

// spanSlopes sets the first end's rotations in ub (beam layout) to the
// slopes of the simply supported span's elastic curve: starting from the
// chord's slope, the curve misses the second end by the loads' own
// deflection there, which a change of the first slope by −(miss)/L
// removes exactly (the deflection is linear in that slope).
func spanSlopes(el *element, ei, eiy float64, pb, ub []float64, ld *memberLoading, f *field) {
	n, L := el.perNode, el.length
	rz := 2
	if n == 6 {
		rz = 5
	}
	ub[rz] = (ub[n+1] - ub[1]) / L
	if n == 6 {
		ub[4] = -(ub[n+2] - ub[2]) / L // θy = −w′
	}
	f.start(el, ei, eiy, pb, ub, ld)
	f.moveTo(L, true)
	ub[rz] += (ub[n+1] - f.y.deflection) / L
	if n == 6 {
		ub[4] -= (ub[n+2] - f.z.deflection) / L
	}
}
