package stiffness

import "gusset/engine/model"

// Partial loads.
//
// A uniform or linear load bounded to a stretch [x1, x2] of its member
// (model.MemberLoad.Partial; area loads spread to members make them) has
// the equivalent nodal loads of the shape functions integrated over the
// stretch alone (three-point Gauss on the stretch: exact, the integrand a
// cubic times a linear), and in the field along the member it is the
// line q(x) = a′ + b′·x switched on at x1 and off at x2, two breakpoints
// that change the distributed load where the field passes them.

// stretchOf returns where a uniform or linear load acts along a member of
// length l: [Start, End] for a partial load, else [0, l].
func stretchOf(ml *model.MemberLoad, l float64) (x1, x2 float64) {
	if ml.Partial {
		return ml.Start, ml.End
	}
	return 0, l
}

// addPartial adds a partial load with local intensities q1 at Start and q2
// at End, times factor, to ld: on from Start (into a and b directly when
// Start is the first end) and off at End (nothing when End is the second
// end). The points are sorted by gather afterwards.
func (ld *memberLoading) addPartial(ml *model.MemberLoad, q1, q2 [3]float64, factor, l float64) {
	x1, x2 := ml.Start, ml.End
	var a, b [3]float64
	for c := range 3 {
		b[c] = factor * (q2[c] - q1[c]) / (x2 - x1)
		a[c] = factor*q1[c] - b[c]*x1
	}
	if x1 <= 0 {
		for c := range 3 {
			ld.a[c] += a[c]
			ld.b[c] += b[c]
		}
	} else {
		ld.points = append(ld.points, pointLoad{at: x1, da: a, db: b})
	}
	if x2 < l {
		var na, nb [3]float64
		for c := range 3 {
			na[c], nb[c] = -a[c], -b[c]
		}
		ld.points = append(ld.points, pointLoad{at: x2, da: na, db: nb})
	}
}
