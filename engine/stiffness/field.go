package stiffness

import (
	"math"
	"slices"

	"gusset/engine/model"
)

// memberScratch is the per-worker scratch space of the results along
// members.
type memberScratch struct {
	loading memberLoading
	field   field
}

// pointLoad is a concentrated force along a member, local axes.
type pointLoad struct {
	at    float64
	force [3]float64
	// da and db change the distributed load a + b·x from here on (a
	// partial load starting or ending here, see partial.go).
	da, db [3]float64
}

// memberLoading is the loading of one member in local axes: a distributed
// force q(x) = a + b·x per unit length (x from the first end; uniform,
// linear and self-weight loads add up to one such line), point forces in
// order of distance, and the free axial strain of thermal loads.
type memberLoading struct {
	a, b   [3]float64
	points []pointLoad
	strain float64
}

// gather fills ld with member e's loads in the set (scaled by their
// factors; none when loaded is false), reusing ld.points.
func (ld *memberLoading) gather(ls *loadSet, m *model.Model, el *element, e int, loaded bool) {
	ld.a, ld.b, ld.points, ld.strain = [3]float64{}, [3]float64{}, ld.points[:0], 0
	if !loaded {
		return
	}
	if ls.selfWeight != 0 {
		mem := m.Members[e]
		var g [3]float64
		g[m.Dim-1] = -ls.selfWeight * m.Materials[mem.Material].WeightDensity * m.Sections[mem.Section].Area
		q := el.localVector(g, false)
		for c := range 3 {
			ld.a[c] += q[c]
		}
	}
	if ls.byMember == nil {
		return
	}
	L := el.length
	for _, wl := range ls.byMember[e] {
		ml := wl.load
		switch ml.Kind {
		case model.Uniform, model.Linear:
			q1, q2 := el.intensities(ml)
			if ml.Partial {
				ld.addPartial(ml, q1, q2, wl.factor, L)
				continue
			}
			for c := range 3 {
				ld.a[c] += wl.factor * q1[c]
				ld.b[c] += wl.factor * (q2[c] - q1[c]) / L
			}
		case model.Point:
			q := el.localVector(ml.Value, ml.Local)
			for c := range 3 {
				q[c] *= wl.factor
			}
			ld.points = append(ld.points, pointLoad{at: ml.Distance, force: q})
		case model.Thermal:
			ld.strain += wl.factor * ml.Strain
		}
	}
	if len(ld.points) > 1 {
		slices.SortStableFunc(ld.points, func(p, q pointLoad) int {
			switch {
			case p.at < q.at:
				return -1
			case p.at > q.at:
				return 1
			}
			return 0
		})
	}
	if m.Dim == 2 {
		// The 2D element has no local z: loads out of the plane do not
		// exist there.
		ld.a[2], ld.b[2] = 0, 0
		for i := range ld.points {
			ld.points[i].force[2], ld.points[i].da[2], ld.points[i].db[2] = 0, 0, 0
		}
	}
}

// plane is the state of bending in one principal plane at the start x0 of
// a stretch of member free of point loads: shear V, moment M, deflection w
// and slope w′, with EI·w″ = M, M′ = −V and V′ = −q for the transverse
// load q(x) = a + b·x. In the local x–y plane these are Vy, Mz, v and θz;
// in the local x–z plane Vz, −My, w and −θy, which obey the same
// equations (Timoshenko & Gere, Mechanics of Materials, 1997, §9.2: the
// differential equations of the deflection curve).
type plane struct {
	shear, moment, deflection, slope float64
	a, b, ei                         float64
}

// polynomials writes, for a stretch starting at x0, the moment (cubic) and
// deflection (quintic) as polynomials in s = x − x0: the exact solution of
// the equations above, Taylor's expansion terminating at the load's degree.
func (p *plane) polynomials(x0 float64, moment *[4]float64, deflection *[6]float64) {
	q0 := p.a + p.b*x0
	*moment = [4]float64{p.moment, -p.shear, q0 / 2, p.b / 6}
	*deflection = [6]float64{p.deflection, p.slope, p.moment / (2 * p.ei), -p.shear / (6 * p.ei), q0 / (24 * p.ei), p.b / (120 * p.ei)}
}

// advance moves the state from x0 to x0 + s.
func (p *plane) advance(x0, s float64) {
	q0 := p.a + p.b*x0
	s2, s3 := s*s, s*s*s
	p.deflection += p.slope*s + (p.moment*s2/2-p.shear*s3/6+q0*s2*s2/24+p.b*s2*s3/120)/p.ei
	p.slope += (p.moment*s - p.shear*s2/2 + q0*s3/6 + p.b*s2*s2/24) / p.ei
	p.moment += -p.shear*s + q0*s2/2 + p.b*s3/6
	p.shear -= q0*s + p.b*s2/2
}

// field is the exact solution along one beam: the state at the start x0
// of the current stretch free of point loads, advanced along the member.
// Axial: N′ = −qx, u′ = N/EA + ε. Torsion is constant between the ends
// (there are no distributed torques).
type field struct {
	length, x0     float64
	axial, stretch float64 // N and u at x0
	qa, qb, ea     float64 // axial load a + b·x and EA
	strain         float64
	torsion        float64
	y, z           plane
	dim3           bool
	points         []pointLoad
	next           int // the first point load not yet passed
}

// start sets f to the member's state at its first end from its local end
// forces p (what the nodes exert on it), local end displacements ul and
// its loading.
func (f *field) start(el *element, ei, eiy float64, p, ul []float64, ld *memberLoading) {
	*f = field{length: el.length, ea: el.ea, qa: ld.a[0], qb: ld.b[0], strain: ld.strain, points: ld.points}
	f.axial, f.stretch = -p[0], ul[0]
	f.y = plane{shear: -p[1], a: ld.a[1], b: ld.b[1], ei: ei, deflection: ul[1]}
	if el.perNode == 3 {
		f.y.moment, f.y.slope = -p[2], ul[2]
		return
	}
	f.dim3 = true
	f.y.moment, f.y.slope = -p[5], ul[5]
	// In the x–z plane the moment variable is −My = p[4] at the first end
	// and the slope is w′ = −θy.
	f.z = plane{shear: -p[2], moment: p[4], deflection: ul[2], slope: -ul[4], a: ld.a[2], b: ld.b[2], ei: eiy}
	f.torsion = -p[3]
}

// advance moves the state by s along a stretch free of point loads.
func (f *field) advance(s float64) {
	q0 := f.qa + f.qb*f.x0
	f.stretch += f.strain*s + (f.axial*s-q0*s*s/2-f.qb*s*s*s/6)/f.ea
	f.axial -= q0*s + f.qb*s*s/2
	f.y.advance(f.x0, s)
	if f.dim3 {
		f.z.advance(f.x0, s)
	}
	f.x0 += s
}

// moveTo advances the state to x, passing (and applying) the point loads
// at distances below x, or at most x when inclusive.
func (f *field) moveTo(x float64, inclusive bool) {
	for f.next < len(f.points) {
		pl := f.points[f.next]
		if pl.at > x || (pl.at == x && !inclusive) {
			break
		}
		f.advance(pl.at - f.x0)
		f.axial -= pl.force[0]
		f.y.shear -= pl.force[1]
		f.z.shear -= pl.force[2]
		f.qa, f.qb = f.qa+pl.da[0], f.qb+pl.db[0]
		f.y.a, f.y.b = f.y.a+pl.da[1], f.y.b+pl.db[1]
		f.z.a, f.z.b = f.z.a+pl.da[2], f.z.b+pl.db[2]
		f.next++
	}
	f.advance(x - f.x0)
}

// stretchEnd returns the end of the current stretch: the next point load
// or the member's second end.
func (f *field) stretchEnd() float64 {
	if f.next < len(f.points) {
		return f.points[f.next].at
	}
	return f.length
}

// axialPolynomials writes N (quadratic) and u (cubic) in s = x − x0.
func (f *field) axialPolynomials(force *[3]float64, stretch *[4]float64) {
	q0 := f.qa + f.qb*f.x0
	*force = [3]float64{f.axial, -q0, -f.qb / 2}
	*stretch = [4]float64{f.stretch, f.strain + f.axial/f.ea, -q0 / (2 * f.ea), -f.qb / (6 * f.ea)}
}

// peak tracks the value of largest magnitude, or the largest or smallest.
type peak struct {
	Extreme
	set bool
}

func (pk *peak) magnitude(v, x float64) {
	if !pk.set || math.Abs(v) > math.Abs(pk.Value) {
		pk.Value, pk.At, pk.set = v, x, true
	}
}

func (pk *peak) largest(v, x float64) {
	if !pk.set || v > pk.Value {
		pk.Value, pk.At, pk.set = v, x, true
	}
}

func (pk *peak) smallest(v, x float64) {
	if !pk.set || v < pk.Value {
		pk.Value, pk.At, pk.set = v, x, true
	}
}

// scan updates pk over the stretch [x0, x0 + h] of the polynomial c (in
// s = x − x0) with its ends and the zeros of its derivative: the exact
// extremes of a polynomial on an interval.
func scan(c []float64, x0, h float64, update func(v, x float64)) {
	update(polyEval(c, 0), x0)
	update(polyEval(c, h), x0+h)
	var d [maxDegree + 1]float64
	var r roots
	realRoots(&r, polyDerivative(&d, c), 0, h)
	for _, s := range r.list() {
		update(polyEval(c, s), x0+s)
	}
}

// transverse reports whether the loading has any force across the member.
func (ld *memberLoading) transverse() bool {
	if ld.a[1] != 0 || ld.a[2] != 0 || ld.b[1] != 0 || ld.b[2] != 0 {
		return true
	}
	for _, p := range ld.points {
		if p.force[1] != 0 || p.force[2] != 0 || p.da[1] != 0 || p.da[2] != 0 || p.db[1] != 0 || p.db[2] != 0 {
			return true
		}
	}
	return false
}
