package stiffness

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/model"
)

func near(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, tol, tol) {
		t.Errorf("%s = %.12g, want %.12g", what, got, want)
	}
}

// TestThreeBarTruss checks the symmetric three-bar truss, statically
// indeterminate: a vertical bar of length L and two bars at θ either side
// meet at a joint loaded by P. Compatibility gives the vertical bar's force
// P/(1 + 2cos³θ), the inclined bars' P·cos²θ/(1 + 2cos³θ) and the
// deflection P·L/(E·A·(1 + 2cos³θ)) (Timoshenko & Gere, Mechanics of
// Materials, section on statically indeterminate structures, from memory;
// the same result appears in Hibbeler, Mechanics of Materials, ch. 4).
func TestThreeBarTruss(t *testing.T) {
	const e, a, l, p = 2e8, 1e-3, 3.0, 50.0
	for _, path := range []Path{Dense, Sparse} {
		for _, theta := range []float64{math.Pi / 6, math.Pi / 4, 1.1} {
			b := newBuilder(2, e, 0, a, 0, 0, 0)
			joint := b.node(0, 0)
			mid := b.node(0, l)
			left := b.node(-l*math.Tan(theta), l)
			right := b.node(l*math.Tan(theta), l)
			b.bar(mid, joint)
			b.bar(left, joint)
			b.bar(right, joint)
			for _, n := range []int{mid, left, right} {
				b.fix(n, pinned2...)
			}
			b.force(joint, [3]float64{0, -p}, [3]float64{})
			r := solve1(t, b.m, Options{Path: path})
			c3 := 1 + 2*math.Pow(math.Cos(theta), 3)
			near(t, "vertical bar force", r.AxialForce[0], p/c3, 1e-10)
			near(t, "inclined bar force", r.AxialForce[1], p*math.Cos(theta)*math.Cos(theta)/c3, 1e-10)
			near(t, "inclined bar force", r.AxialForce[2], p*math.Cos(theta)*math.Cos(theta)/c3, 1e-10)
			near(t, "deflection", r.Displacements[joint][1], -p*l/(e*a*c3), 1e-10)
			near(t, "sideways deflection", r.Displacements[joint][0], 0, 1e-14)
		}
	}
}

// TestTwoBarVirtualWork checks a two-bar bracket: a horizontal bar A–C
// (length 4) and a bar B–C from 3 above A, loaded by P down at C. By
// statics N_BC = 5P/3 and N_AC = −4P/3; by virtual work with unit loads at
// C (Hibbeler, Structural Analysis, chapter on deflections by energy
// methods, from memory), δv = Σ N·n·L/(EA) = (125/9 + 64/9)·P/(EA) = 21P/(EA)
// downwards and δh = (−4P/3)(1)(4)/(EA) = −16P/(3EA).
func TestTwoBarVirtualWork(t *testing.T) {
	const e, a, p = 2e8, 5e-4, 12.0
	b := newBuilder(2, e, 0, a, 0, 0, 0)
	na := b.node(0, 0)
	nb := b.node(0, 3)
	nc := b.node(4, 0)
	b.bar(na, nc)
	b.bar(nb, nc)
	b.fix(na, pinned2...)
	b.fix(nb, pinned2...)
	b.force(nc, [3]float64{0, -p}, [3]float64{})
	r := solve1(t, b.m, Options{})
	near(t, "N_AC", r.AxialForce[0], -4*p/3, 1e-12)
	near(t, "N_BC", r.AxialForce[1], 5*p/3, 1e-12)
	near(t, "δv", r.Displacements[nc][1], -21*p/(e*a), 1e-12)
	near(t, "δh", r.Displacements[nc][0], -16*p/(3*e*a), 1e-12)
	// Reactions by statics: B holds the tie's pull, A the strut's push.
	near(t, "R_Bx", r.Reactions[1].Force[0], -4*p/3, 1e-12)
	near(t, "R_By", r.Reactions[1].Force[1], p, 1e-12)
	near(t, "R_Ax", r.Reactions[0].Force[0], 4*p/3, 1e-12)
}

// TestPrattSections checks a six-panel Pratt truss (panel a, depth h, loads
// P at the five inner bottom joints, reactions 5P/2) by the method of
// sections (Hibbeler, Structural Analysis, ch. 3, from memory): bottom
// chord in panel 3 N = M(2a)/h = 4Pa/h (moments about the top joint at 2a);
// top chord in panel 3 N = −M(3a)/h = −4.5Pa/h; the diagonal of panel 3
// carries the panel shear R − 2P = P/2, so N = (P/2)·d/h in tension. The
// truss is statically determinate, so the forces do not depend on EA.
func TestPrattSections(t *testing.T) {
	const a, h, p = 4.0, 3.0, 20.0
	b := newBuilder(2, 2e8, 0, 2e-3, 0, 0, 0)
	var bottom, top [7]int
	for i := range 7 {
		bottom[i] = b.node(float64(i)*a, 0)
	}
	for i := 1; i <= 5; i++ {
		top[i] = b.node(float64(i)*a, h)
	}
	chord := make([]int, 6)
	for i := range 6 {
		chord[i] = b.bar(bottom[i], bottom[i+1])
	}
	topChord := make(map[int]int)
	for i := 1; i < 5; i++ {
		topChord[i] = b.bar(top[i], top[i+1])
	}
	for i := 1; i <= 5; i++ {
		b.bar(bottom[i], top[i])
	}
	b.bar(bottom[0], top[1])
	b.bar(bottom[6], top[5])
	diagonal := b.bar(top[2], bottom[3])
	b.bar(top[1], bottom[2])
	b.bar(top[5], bottom[4])
	b.bar(top[4], bottom[3])
	b.fix(bottom[0], pinned2...)
	b.fix(bottom[6], model.Y)
	for i := 1; i <= 5; i++ {
		b.force(bottom[i], [3]float64{0, -p}, [3]float64{})
	}
	r := solve1(t, b.m, Options{})
	d := math.Hypot(a, h)
	near(t, "bottom chord, panel 3", r.AxialForce[chord[2]], 4*p*a/h, 1e-10)
	near(t, "top chord, panel 3", r.AxialForce[topChord[2]], -4.5*p*a/h, 1e-10)
	near(t, "diagonal, panel 3", r.AxialForce[diagonal], 0.5*p*d/h, 1e-10)
	near(t, "left reaction", r.Reactions[0].Force[1], 2.5*p, 1e-10)
}

// TestTripod checks a 3D tripod: apex at height h above the centre of three
// pinned feet on a circle of radius ρ, 120° apart, loaded by P downwards.
// By symmetry and vertical equilibrium each leg carries −P·ℓ/(3h) with
// ℓ = √(ρ² + h²), and each foot P/3 upwards (statics, derived by hand).
func TestTripod(t *testing.T) {
	const rho, h, p = 2.0, 3.0, 90.0
	b := newBuilder(3, 2e8, 8e7, 1e-3, 0, 0, 0)
	apex := b.node(0, 0, h)
	for k := range 3 {
		phi := 2 * math.Pi * float64(k) / 3
		foot := b.node(rho*math.Cos(phi), rho*math.Sin(phi), 0)
		b.bar(foot, apex)
		b.fix(foot, model.X, model.Y, model.Z)
	}
	b.force(apex, [3]float64{0, 0, -p}, [3]float64{})
	r := solve1(t, b.m, Options{})
	l := math.Hypot(rho, h)
	for k := range 3 {
		near(t, "leg force", r.AxialForce[k], -p*l/(3*h), 1e-12)
		near(t, "foot reaction", r.Reactions[k].Force[2], p/3, 1e-12)
	}
}

// TestThermalRestraint checks a bar between two fixed supports heated by
// ΔT: it cannot expand, so N = −E·A·α·ΔT (Gere & Timoshenko, Mechanics of
// Materials, thermal effects, from memory) and its supports push with
// ±E·A·α·ΔT. Two bars of different lengths meet at a free joint, which
// must not move.
func TestThermalRestraint(t *testing.T) {
	const e, a, alpha, dT = 2e8, 2e-3, 1.2e-5, 40.0
	b := newBuilder(2, e, 0, a, 0, 0, 0)
	n0 := b.node(0, 0)
	n1 := b.node(1, 0)
	n2 := b.node(3, 0)
	b.bar(n0, n1)
	b.bar(n1, n2)
	b.fix(n0, pinned2...)
	b.fix(n1, model.Y) // the collinear middle joint is otherwise a mechanism
	b.fix(n2, pinned2...)
	for member := range 2 {
		b.memberLoad(model.MemberLoad{Member: member, Kind: model.Thermal, Strain: alpha * dT})
	}
	r := solve1(t, b.m, Options{})
	want := -e * a * alpha * dT
	near(t, "axial force", r.AxialForce[0], want, 1e-12)
	near(t, "axial force", r.AxialForce[1], want, 1e-12)
	near(t, "middle joint", math.Hypot(r.Displacements[n1][0], r.Displacements[n1][1]), 0, 1e-15)
}
