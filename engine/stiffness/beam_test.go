package stiffness

import (
	"math"
	"testing"

	"gusset/engine/model"
)

// Beam formulas below are the standard cases of the beam tables in Gere &
// Timoshenko, Mechanics of Materials (appendix of deflections and slopes
// of beams; fixed-end moments in the chapter on statically indeterminate
// beams), quoted from memory; the same values appear in every structural
// analysis text (e.g. Hibbeler, Structural Analysis, inside back cover).

const (
	beamE = 2.1e8
	beamA = 4e-3
	beamI = 8e-6
)

// horizontalBeam builds a 2D beam of length l along x split into parts
// elements, returning the builder and the node indices.
func horizontalBeam(l float64, parts int) (*builder, []int) {
	b := newBuilder(2, beamE, 0, beamA, beamI, 0, 0)
	nodes := make([]int, parts+1)
	for i := range nodes {
		nodes[i] = b.node(l*float64(i)/float64(parts), 0)
	}
	for i := range parts {
		b.beam(nodes[i], nodes[i+1])
	}
	return b, nodes
}

// TestCantilever checks tip deflection PL³/3EI and rotation PL²/2EI under a
// tip load, and wL⁴/8EI, wL³/6EI under a uniform load, on both solver
// paths and with one or several elements (exact for cubic elements).
func TestCantilever(t *testing.T) {
	const l, p, w = 5.0, 12.0, 3.0
	ei := beamE * beamI
	for _, path := range []Path{Dense, Sparse} {
		for _, parts := range []int{1, 4} {
			b, nodes := horizontalBeam(l, parts)
			b.fix(nodes[0], fixed2...)
			tip := nodes[parts]
			b.force(tip, [3]float64{0, -p}, [3]float64{})
			r := solve1(t, b.m, Options{Path: path})
			near(t, "tip deflection", r.Displacements[tip][1], -p*l*l*l/(3*ei), 1e-10)
			near(t, "tip rotation", r.Rotations[tip][0], -p*l*l/(2*ei), 1e-10)
			near(t, "fixed-end moment", r.Reactions[0].Moment[0], p*l, 1e-10)

			b, nodes = horizontalBeam(l, parts)
			b.fix(nodes[0], fixed2...)
			for e := range parts {
				b.memberLoad(model.MemberLoad{Member: e, Kind: model.Uniform, Value: [3]float64{0, -w}})
			}
			r = solve1(t, b.m, Options{Path: path})
			near(t, "tip deflection, uniform", r.Displacements[tip][1], -w*l*l*l*l/(8*ei), 1e-10)
			near(t, "tip rotation, uniform", r.Rotations[tip][0], -w*l*l*l/(6*ei), 1e-10)
			near(t, "fixed-end moment, uniform", r.Reactions[0].Moment[0], w*l*l/2, 1e-10)
			near(t, "vertical reaction, uniform", r.Reactions[0].Force[1], w*l, 1e-10)
		}
	}
}

// TestProppedCantilever checks the prop reaction of a cantilever propped at
// its free end: 3wL/8 under a uniform load and 5P/16 under a central point
// load, with fixed-end moments wL²/8 and 3PL/16.
func TestProppedCantilever(t *testing.T) {
	const l, p, w = 6.0, 16.0, 2.0
	b, nodes := horizontalBeam(l, 1)
	b.fix(nodes[0], fixed2...)
	b.fix(nodes[1], model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}})
	r := solve1(t, b.m, Options{})
	near(t, "prop, uniform", r.Reactions[1].Force[1], 3*w*l/8, 1e-12)
	near(t, "fixed end, uniform", r.Reactions[0].Moment[0], w*l*l/8, 1e-12)

	b, nodes = horizontalBeam(l, 1)
	b.fix(nodes[0], fixed2...)
	b.fix(nodes[1], model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Point, Value: [3]float64{0, -p}, Distance: l / 2})
	r = solve1(t, b.m, Options{})
	near(t, "prop, central point", r.Reactions[1].Force[1], 5*p/16, 1e-12)
	near(t, "fixed end, central point", r.Reactions[0].Moment[0], 3*p*l/16, 1e-12)
}

// TestFixedEndMoments checks a beam fixed at both ends: wL²/12 at each end
// and wL⁴/384EI at mid-span under a uniform load; Pab²/L² and Pa²b/L² under
// a point load at a from the left (b = L − a); wL²/30 at the unloaded end
// and wL²/20 at the loaded end under a load rising linearly from 0 to w.
// Support moments are anticlockwise-positive: the left support hogs with
// +M, the right with −M.
func TestFixedEndMoments(t *testing.T) {
	const l, w, p, a = 8.0, 5.0, 30.0, 2.0
	bb := l - a
	ei := beamE * beamI
	tests := []struct {
		name        string
		parts       int
		load        func(b *builder)
		left, right float64
		midspan     float64 // NaN when not checked
	}{
		{"uniform", 2, func(b *builder) {
			for e := range 2 {
				b.memberLoad(model.MemberLoad{Member: e, Kind: model.Uniform, Value: [3]float64{0, -w}})
			}
		}, w * l * l / 12, -w * l * l / 12, -w * l * l * l * l / (384 * ei)},
		{"point", 1, func(b *builder) {
			b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Point, Value: [3]float64{0, -p}, Distance: a})
		}, p * a * bb * bb / (l * l), -p * a * a * bb / (l * l), math.NaN()},
		{"point in local axes", 1, func(b *builder) {
			b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Point, Local: true, Value: [3]float64{0, -p}, Distance: a})
		}, p * a * bb * bb / (l * l), -p * a * a * bb / (l * l), math.NaN()},
		{"linear", 1, func(b *builder) {
			b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Linear, Value: [3]float64{0, 0}, EndValue: [3]float64{0, -w}})
		}, w * l * l / 30, -w * l * l / 20, math.NaN()},
	}
	for _, tc := range tests {
		b, nodes := horizontalBeam(l, tc.parts)
		b.fix(nodes[0], fixed2...)
		b.fix(nodes[tc.parts], fixed2...)
		tc.load(b)
		r := solve1(t, b.m, Options{})
		near(t, tc.name+": left moment", r.Reactions[0].Moment[0], tc.left, 1e-12)
		near(t, tc.name+": right moment", r.Reactions[1].Moment[0], tc.right, 1e-12)
		// The end forces of the first member agree with the support.
		near(t, tc.name+": member end moment", r.EndForces[0][2], tc.left, 1e-12)
		if !math.IsNaN(tc.midspan) {
			near(t, tc.name+": mid-span deflection", r.Displacements[nodes[1]][1], tc.midspan, 1e-12)
		}
		if r.BalanceError > 1e-13 || r.Residual > 1e-13 {
			t.Errorf("%s: balance %g residual %g", tc.name, r.BalanceError, r.Residual)
		}
	}
}

// TestInclinedLocalLoad checks local axes on an inclined fixed–fixed beam:
// a uniform load w normal to the member gives end moments wL²/12 with L
// the member's true length, whatever its slope.
func TestInclinedLocalLoad(t *testing.T) {
	const w = 4.0
	b := newBuilder(2, beamE, 0, beamA, beamI, 0, 0)
	n0 := b.node(0, 0)
	n1 := b.node(3, 4)
	b.beam(n0, n1)
	b.fix(n0, fixed2...)
	b.fix(n1, fixed2...)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Local: true, Value: [3]float64{0, -w}})
	r := solve1(t, b.m, Options{})
	near(t, "left moment", r.Reactions[0].Moment[0], w*25.0/12, 1e-12)
	near(t, "local shear at end 1", r.EndForces[0][1], w*5/2, 1e-12)
	near(t, "axial force", r.AxialForce[0], 0, 1e-12)
}

// TestPortalSway checks a fixed-base portal frame (columns of height h and
// second moment Ic, beam of span L and Ib) under a horizontal load H at
// beam level. The slope-deflection method (Hibbeler, Structural Analysis,
// chapter on frames with sidesway, worked from memory; the closed form is
// the standard frame-table result) gives, with k = Ib·h/(Ic·L) and axial
// deformation neglected, column base moments H·h·(3k+1)/(2(6k+1)), column
// top moments H·h·3k/(2(6k+1)) and horizontal reactions H/2. Its limits are
// the two free cantilevers (k → 0: Hh/2 at the base) and the rigid beam
// (k → ∞: Hh/4 at both ends). The areas are made large so that axial
// deformation is negligible (relative effect near 1e-8).
func TestPortalSway(t *testing.T) {
	const h, l, hLoad, ic = 4.0, 6.0, 10.0, 1e-4
	for _, ib := range []float64{5e-5, 1e-4, 4e-4} {
		b := newBuilder(2, beamE, 0, 1e3, ic, 0, 0)
		b.m.Sections = append(b.m.Sections, b.m.Sections[0])
		b.m.Sections[1].SecondMoment = ib
		n0 := b.node(0, 0)
		n1 := b.node(0, h)
		n2 := b.node(l, h)
		n3 := b.node(l, 0)
		b.beam(n0, n1)
		girder := b.beam(n1, n2)
		b.m.Members[girder].Section = 1
		b.beam(n3, n2)
		b.fix(n0, fixed2...)
		b.fix(n3, fixed2...)
		b.force(n1, [3]float64{hLoad, 0}, [3]float64{})
		r := solve1(t, b.m, Options{})
		k := ib * h / (ic * l)
		base := hLoad * h * (3*k + 1) / (2 * (6*k + 1))
		top := hLoad * h * 3 * k / (2 * (6*k + 1))
		near(t, "left base moment", r.Reactions[0].Moment[0], base, 1e-6)
		near(t, "right base moment", r.Reactions[1].Moment[0], base, 1e-6)
		near(t, "left horizontal reaction", r.Reactions[0].Force[0], -hLoad/2, 1e-6)
		// The column's end moment at its top (end 2), as the node exerts it.
		near(t, "left column top moment", r.EndForces[0][5], top, 1e-6)
	}
}

// TestCantilever3D checks a 3D cantilever along x with different second
// moments about its two axes, loaded at the tip by Fy, Fz and a torque T:
// δz = Fz·L³/(3E·Iz) (local y is global z by default, so SecondMoment
// governs vertical bending), δy = Fy·L³/(3E·Iy), θx = T·L/(G·J),
// θy = −Fz·L²/(2E·Iz), θz = Fy·L²/(2E·Iy) (beam tables as above; torsion:
// Gere & Timoshenko, chapter on torsion, from memory). The same checks on a
// vertical cantilever exercise the default orientation for vertical
// members (local y = global y).
func TestCantilever3D(t *testing.T) {
	const l, e, g, iz, iy, j = 3.0, 2.1e8, 8.1e7, 6e-6, 2e-6, 4e-6
	const fy, fz, torque = 2.0, -3.0, 1.5
	for _, path := range []Path{Dense, Sparse} {
		b := newBuilder(3, e, g, 1e-2, iz, iy, j)
		n0 := b.node(0, 0, 0)
		n1 := b.node(l, 0, 0)
		b.beam(n0, n1)
		b.fix(n0, fixed3...)
		b.force(n1, [3]float64{0, fy, fz}, [3]float64{torque, 0, 0})
		r := solve1(t, b.m, Options{Path: path})
		near(t, "δy", r.Displacements[n1][1], fy*l*l*l/(3*e*iy), 1e-10)
		near(t, "δz", r.Displacements[n1][2], fz*l*l*l/(3*e*iz), 1e-10)
		near(t, "θx", r.Rotations[n1][0], torque*l/(g*j), 1e-10)
		near(t, "θy", r.Rotations[n1][1], -fz*l*l/(2*e*iz), 1e-10)
		near(t, "θz", r.Rotations[n1][2], fy*l*l/(2*e*iy), 1e-10)

		b = newBuilder(3, e, g, 1e-2, iz, iy, j)
		n0 = b.node(0, 0, 0)
		n1 = b.node(0, 0, l)
		b.beam(n0, n1)
		b.fix(n0, fixed3...)
		// local x = z, local y = global y, local z = x × y = −global x.
		b.force(n1, [3]float64{fy, fz, 0}, [3]float64{0, 0, torque})
		r = solve1(t, b.m, Options{Path: path})
		near(t, "vertical: δy", r.Displacements[n1][1], fz*l*l*l/(3*e*iz), 1e-10)
		near(t, "vertical: δx", r.Displacements[n1][0], fy*l*l*l/(3*e*iy), 1e-10)
		near(t, "vertical: twist", r.Rotations[n1][2], torque*l/(g*j), 1e-10)
	}
}
