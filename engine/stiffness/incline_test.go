package stiffness

import (
	"context"
	"errors"
	"math"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// inclinedSupport adds a support at node n whose axes have rows x, y and
// x × y (unit vectors, built by the test itself), fixing comps along them.
func (b *builder) inclinedSupport(n int, x, y [3]float64, comps ...int) int {
	s := model.Support{Node: n, Inclined: true}
	z := [3]float64{x[1]*y[2] - x[2]*y[1], x[2]*y[0] - x[0]*y[2], x[0]*y[1] - x[1]*y[0]}
	s.Axes = [3][3]float64{x, y, z}
	for _, c := range comps {
		s.Fixed[c] = true
	}
	b.m.Supports = append(b.m.Supports, s)
	return len(b.m.Supports) - 1
}

// along30 is a roller on a 30° incline: local x up the slope, local y its
// outward normal.
var (
	c30, s30 = math.Cos(math.Pi / 6), math.Sin(math.Pi / 6)
	slope30  = [3]float64{c30, s30, 0}
	normal30 = [3]float64{-s30, c30, 0}
)

// TestInclinedRollerBeam checks a simply supported beam of span L, pinned
// at A and on a roller at B that rolls on a 30° incline, under P at
// midspan. Statics derived in the test (as in Hibbeler, Engineering
// Mechanics: Statics, the chapter on equilibrium of a rigid body, whose
// rocker and smooth-incline supports react normal to the surface): B
// reacts with N along the incline's normal n = (−sin30°, cos30°); moments
// about A give N·cos30°·L = P·L/2, so N = P/(2 cos30°), B's global
// reaction (−N sin30°, N cos30°) = (−P tan30°/2, P/2), and A takes
// (P tan30°/2, P/2). Both solver paths.
func TestInclinedRollerBeam(t *testing.T) {
	const l, p = 6.0, 10.0
	for _, path := range []Path{Dense, Sparse} {
		b, nodes := horizontalBeam(l, 2)
		b.fix(nodes[0], pinned2...)
		roller := b.inclinedSupport(nodes[2], slope30, normal30, model.Y)
		b.force(nodes[1], [3]float64{0, -p}, [3]float64{})
		r := solve1(t, b.m, Options{Path: path})
		n := p / (2 * c30)
		near(t, "roller local normal reaction", r.Reactions[roller].LocalForce[1], n, 1e-10)
		near(t, "roller local slope reaction", r.Reactions[roller].LocalForce[0], 0, 1e-10)
		near(t, "roller global x", r.Reactions[roller].Force[0], -p*math.Tan(math.Pi/6)/2, 1e-10)
		near(t, "roller global y", r.Reactions[roller].Force[1], p/2, 1e-10)
		near(t, "pin x", r.Reactions[0].Force[0], p*math.Tan(math.Pi/6)/2, 1e-10)
		near(t, "pin y", r.Reactions[0].Force[1], p/2, 1e-10)
		// The beam takes the roller's horizontal thrust as axial
		// compression: N_axial = −P tan30°/2 on both halves.
		near(t, "axial force", r.AxialForce[1], -p*math.Tan(math.Pi/6)/2, 1e-10)
		// B moves along the slope only: its displacement is normal to n.
		d := r.Displacements[nodes[2]]
		near(t, "roller motion along the normal", d[0]*normal30[0]+d[1]*normal30[1], 0, 1e-12)
		if r.BalanceError > 1e-12 || r.Residual > 1e-10 {
			t.Errorf("%v: balance %g, residual %g", path, r.BalanceError, r.Residual)
		}
		if r.Reactions[0].LocalForce != nil {
			t.Errorf("a support in global axes reports a local force %v", r.Reactions[0].LocalForce)
		}
	}
}

// TestInclinedRollerTruss checks a triangular truss A(0,0), B(4,0),
// C(2,2), pinned at A, B on a roller on a 30° incline, P down at C.
// Statics derived in the test: N = P/(2 cos30°) as for the beam; joint B,
// y: N_BC/√2 + N cos30° = 0, so N_BC = −P/√2; x: −N_AB − N_BC/√2 −
// N sin30° = 0, so N_AB = P/2 − (P/2)·tan30°; joint C by symmetry of
// the vertical load: N_AC = −P/√2.
func TestInclinedRollerTruss(t *testing.T) {
	const p = 12.0
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	a, bn, c := b.node(0, 0), b.node(4, 0), b.node(2, 2)
	ab, bc, ac := b.bar(a, bn), b.bar(bn, c), b.bar(a, c)
	b.fix(a, pinned2...)
	roller := b.inclinedSupport(bn, slope30, normal30, model.Y)
	b.force(c, [3]float64{0, -p}, [3]float64{})
	r := solve1(t, b.m, Options{})
	near(t, "N_AB", r.AxialForce[ab], p/2-p/2*math.Tan(math.Pi/6), 1e-10)
	near(t, "N_BC", r.AxialForce[bc], -p/math.Sqrt2, 1e-10)
	near(t, "N_AC", r.AxialForce[ac], -p/math.Sqrt2, 1e-10)
	near(t, "roller normal", r.Reactions[roller].LocalForce[1], p/(2*c30), 1e-10)
	near(t, "reaction sum x", r.ReactionSum[0], 0, 1e-10)
	near(t, "reaction sum y", r.ReactionSum[1], p, 1e-10)
	if r.BalanceError > 1e-12 {
		t.Errorf("balance %g", r.BalanceError)
	}
}

// TestInclinedAlongGlobalAxes checks that a support whose directions are
// the global axes is the ordinary support to round-off, on a 2D portal
// and a 3D frame (a consistency check beside the hand checks above).
func TestInclinedAlongGlobalAxes(t *testing.T) {
	for _, dim := range []int{2, 3} {
		build := func(inclined bool) *CaseResult {
			b := newBuilder(dim, beamE, beamE/2.6, beamA, beamI, beamI/2, 2*beamI)
			at := func(x, y float64) int {
				if dim == 2 {
					return b.node(x, y)
				}
				return b.node(x, y, 0)
			}
			n0, n1, n2, n3 := at(0, 0), at(0, 3), at(4, 3), at(4, 0)
			b.beam(n0, n1)
			b.beam(n1, n2)
			b.beam(n2, n3)
			all := fixed2
			if dim == 3 {
				all = fixed3
			}
			b.fix(n0, all...)
			if inclined {
				b.inclinedSupport(n3, [3]float64{1, 0, 0}, [3]float64{0, 1, 0}, all[1:]...)
			} else {
				b.fix(n3, all[1:]...)
			}
			b.force(n1, [3]float64{5, -3, 0}, [3]float64{})
			b.force(n2, [3]float64{0, -7, 0}, [3]float64{})
			return solve1(t, b.m, Options{})
		}
		plain, turned := build(false), build(true)
		for n := range plain.Displacements {
			for k, v := range plain.Displacements[n] {
				near(t, "displacement", turned.Displacements[n][k], v, 1e-12)
			}
		}
		for s := range plain.Reactions {
			for k, v := range plain.Reactions[s].Force {
				near(t, "reaction", turned.Reactions[s].Force[k], v, 1e-10)
			}
		}
		for k, v := range plain.Reactions[1].Force {
			near(t, "local reaction", turned.Reactions[1].LocalForce[k], v, 1e-10)
		}
	}
}

// TestInclinedSpring checks a bar A(0,0)–B(L,0), pinned at A, with B on
// a support at θ whose local y is fixed and whose local x is a spring k;
// a force P along global x at B. B can move only along d = (cosθ, sinθ),
// by s; the bar resists that motion with (EA/L)·cos²θ (its extension is
// s·cosθ, its force's component along d cosθ times that), in parallel
// with the spring, and the load's share along d is P·cosθ, so s = P·cosθ
// / (k + (EA/L)·cos²θ) and the spring reacts −k·s (derived in the test).
func TestInclinedSpring(t *testing.T) {
	const l, p, k, ea = 3.0, 20.0, 4000.0, 2e5
	theta := 35 * math.Pi / 180
	d := [3]float64{math.Cos(theta), math.Sin(theta), 0}
	nrm := [3]float64{-d[1], d[0], 0}
	b := newBuilder(2, ea, 0, 1, 0, 0, 0)
	a, bn := b.node(0, 0), b.node(l, 0)
	b.bar(a, bn)
	b.fix(a, pinned2...)
	si := b.inclinedSupport(bn, d, nrm, model.Y)
	b.m.Supports[si].Spring[model.X] = k
	b.force(bn, [3]float64{p, 0}, [3]float64{})
	r := solve1(t, b.m, Options{})
	c := math.Cos(theta)
	s := p * c / (k + ea/l*c*c)
	near(t, "B along d, x", r.Displacements[bn][0], s*d[0], 1e-12)
	near(t, "B along d, y", r.Displacements[bn][1], s*d[1], 1e-12)
	near(t, "spring reaction", r.Reactions[si].LocalForce[0], -k*s, 1e-12)
	near(t, "bar force", r.AxialForce[0], ea/l*s*c, 1e-12)
	if r.BalanceError > 1e-12 || r.Residual > 1e-12 {
		t.Errorf("balance %g, residual %g", r.BalanceError, r.Residual)
	}
}

// TestInclinedSettlement checks the truss of TestInclinedRollerTruss, no
// load, with its roller moved δ along the incline's normal: a statically
// determinate truss follows as a rigid body, turning about the pin by φ
// with φ·L·cos30° = δ (B's motion φ·(0, L) projected on n), so B rises
// δ/cos30° and no member is strained (derived in the test).
func TestInclinedSettlement(t *testing.T) {
	const delta = 0.004
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	a, bn, c := b.node(0, 0), b.node(4, 0), b.node(2, 2)
	b.bar(a, bn)
	b.bar(bn, c)
	b.bar(a, c)
	b.fix(a, pinned2...)
	roller := b.inclinedSupport(bn, slope30, normal30, model.Y)
	b.m.Supports[roller].Displacement[model.Y] = delta
	r := solve1(t, b.m, Options{})
	phi := delta / (4 * c30)
	near(t, "B x", r.Displacements[bn][0], 0, 1e-12)
	near(t, "B y", r.Displacements[bn][1], 4*phi, 1e-12)
	near(t, "C x", r.Displacements[c][0], -2*phi, 1e-12)
	near(t, "C y", r.Displacements[c][1], 2*phi, 1e-12)
	for e, n := range r.AxialForce {
		near(t, "force of member "+b.m.Members[e].ID, n, 0, 1e-9)
	}
}

// TestInclinedSpace checks a tetrahedron turned as a rigid body by Q,
// supported by supports given two directions (Q·x̂ and Q·ŷ): A pinned, B
// fixed along its local y and z, C along its local z, apex D loaded by
// P along −Q·ẑ. In the unturned frame (derived in the test): the feet sit
// on a circle of radius ρ, D at height h over its centre; the supports
// are statically determinate (3 + 2 + 1 = 6), so the vertical load gives
// no horizontal reaction, each foot takes P/3 along its local z by
// symmetry, each leg −(P/3)·ℓ/h (ℓ its length), and each base bar the
// ring tension (P/3)(ρ/h)/(2 cos30°). Objectivity makes these the local
// reactions and member forces of the turned model.
func TestInclinedSpace(t *testing.T) {
	const rho, h, p = 2.0, 3.0, 30.0
	q := turn(25*math.Pi/180, 40*math.Pi/180)
	b := newBuilder(3, 2e8, 0, 1e-3, 0, 0, 0)
	var feet [3]int
	for i := range feet {
		ang := 2 * math.Pi * float64(i) / 3
		at := q.apply([3]float64{rho * math.Cos(ang), rho * math.Sin(ang), 0})
		feet[i] = b.node(at[:]...)
	}
	top := q.apply([3]float64{0, 0, h})
	d := b.node(top[:]...)
	var legs, base [3]int
	for i := range feet {
		legs[i] = b.bar(feet[i], d)
		base[i] = b.bar(feet[i], feet[(i+1)%3])
	}
	xs, ys := q.apply([3]float64{1, 0, 0}), q.apply([3]float64{0, 1, 0})
	supports := [3]int{
		b.inclinedSupport(feet[0], xs, ys, model.X, model.Y, model.Z),
		b.inclinedSupport(feet[1], xs, ys, model.Y, model.Z),
		b.inclinedSupport(feet[2], xs, ys, model.Z),
	}
	load := q.apply([3]float64{0, 0, -p})
	b.force(d, load, [3]float64{})
	r := solve1(t, b.m, Options{})
	leg := math.Hypot(rho, h)
	for i := range feet {
		local := r.Reactions[supports[i]].LocalForce
		near(t, "local x reaction", local[0], 0, 1e-9)
		near(t, "local y reaction", local[1], 0, 1e-9)
		near(t, "local z reaction", local[2], p/3, 1e-10)
		near(t, "leg force", r.AxialForce[legs[i]], -p/3*leg/h, 1e-10)
		near(t, "base ring tension", r.AxialForce[base[i]], p/3*rho/h/(2*c30), 1e-10)
	}
	if r.BalanceError > 1e-12 {
		t.Errorf("balance %g", r.BalanceError)
	}
}

// rotation is a 3×3 rotation matrix (rows).
type rotation [3][3]float64

// turn returns Rz(b)·Rx(a).
func turn(a, b float64) rotation {
	ca, sa, cb, sb := math.Cos(a), math.Sin(a), math.Cos(b), math.Sin(b)
	rx := rotation{{1, 0, 0}, {0, ca, -sa}, {0, sa, ca}}
	rz := rotation{{cb, -sb, 0}, {sb, cb, 0}, {0, 0, 1}}
	var out rotation
	for i := range 3 {
		for j := range 3 {
			for k := range 3 {
				out[i][j] += rz[i][k] * rx[k][j]
			}
		}
	}
	return out
}

func (q rotation) apply(v [3]float64) [3]float64 {
	var w [3]float64
	for i := range 3 {
		w[i] = q[i][0]*v[0] + q[i][1]*v[1] + q[i][2]*v[2]
	}
	return w
}

// TestInclinedMechanism checks a triangle whose roller at B reacts along
// AB (a roller on a vertical wall): every support reaction passes through
// A, so the truss can turn about A, and B's motion in that mechanism is
// vertical in global axes (a rigid turn about A moves B normal to AB;
// Maxwell's counting: 6 freedoms − 3 constraints = 3 bars, but the
// constraints are concurrent, so rank 2 and one mechanism).
func TestInclinedMechanism(t *testing.T) {
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	a, bn, c := b.node(0, 0), b.node(4, 0), b.node(2, 2)
	b.bar(a, bn)
	b.bar(bn, c)
	b.bar(a, c)
	b.fix(a, pinned2...)
	// Local x vertical (free), local y = (−1, 0): the fixed component is
	// horizontal, along AB.
	b.inclinedSupport(bn, [3]float64{0, 1, 0}, [3]float64{-1, 0, 0}, model.Y)
	b.force(c, [3]float64{0, -1}, [3]float64{})
	_, err := Solve(context.Background(), b.m, Options{})
	var fe *fault.Error
	if !errors.As(err, &fe) || fe.Kind != fault.Unstable {
		t.Fatalf("got %v, want an unstable structure", err)
	}
	mech, ok := fe.Detail.(*Mechanism)
	if !ok || len(mech.Modes) == 0 {
		t.Fatalf("no mechanism modes in %#v", fe.Detail)
	}
	mode := mech.Modes[0].Translations
	if math.Abs(mode[bn][0]) > 1e-9*math.Abs(mode[bn][1]) || mode[bn][1] == 0 {
		t.Errorf("B moves %v in the mechanism, want a vertical motion", mode[bn])
	}
	// C turns with the triangle about A: its motion is normal to AC.
	if dot := mode[c][0]*2 + mode[c][1]*2; math.Abs(dot) > 1e-9 {
		t.Errorf("C moves %v, not normal to AC", mode[c])
	}
}

// TestInclinedFixedEnd checks a 3D cantilever of length L along x whose
// root is fixed in all six components along turned axes (Rz(40°)·Rx(25°)):
// a fixed end is fixed in any axes, so under a tip load (0, P/2, −P) the
// tip deflects PL³/(3EI) down and (P/2)L³/(3EI) sideways (Gere &
// Timoshenko beam tables, from memory), and the root reacts with −(r × F)
// = (0, −PL, −PL/2) (statics). The rotation blocks of the turn are
// exercised.
func TestInclinedFixedEnd(t *testing.T) {
	const l, p = 3.0, 4.0
	q := turn(25*math.Pi/180, 40*math.Pi/180)
	b := newBuilder(3, beamE, beamE/2.6, beamA, beamI, beamI, 2*beamI)
	root, tip := b.node(0, 0, 0), b.node(l, 0, 0)
	b.beam(root, tip)
	si := b.inclinedSupport(root, q.apply([3]float64{1, 0, 0}), q.apply([3]float64{0, 1, 0}), fixed3...)
	b.force(tip, [3]float64{0, p / 2, -p}, [3]float64{})
	r := solve1(t, b.m, Options{})
	ei := beamE * beamI
	near(t, "tip z", r.Displacements[tip][2], -p*l*l*l/(3*ei), 1e-10)
	near(t, "tip y", r.Displacements[tip][1], p/2*l*l*l/(3*ei), 1e-10)
	near(t, "root force z", r.Reactions[si].Force[2], p, 1e-10)
	near(t, "root moment about y", r.Reactions[si].Moment[1], -p*l, 1e-10)
	near(t, "root moment about z", r.Reactions[si].Moment[2], -p/2*l, 1e-10)
	// The local reaction is the global one in the turned axes.
	axes := b.m.Supports[si].Axes
	for k := range 3 {
		var f, mo float64
		for j := range 3 {
			f += axes[k][j] * r.Reactions[si].Force[j]
			mo += axes[k][j] * r.Reactions[si].Moment[j]
		}
		near(t, "local force", r.Reactions[si].LocalForce[k], f, 1e-10)
		near(t, "local moment", r.Reactions[si].LocalMoment[k], mo, 1e-10)
	}
}

// TestInclinedHeld checks the mechanism of TestInclinedMechanism under a
// load it does not set moving: 1 kN at C along CA passes through A, so it
// does no work in the turn about A, and the members carry it alone (the
// held-mechanism path): AC takes −1 kN, AB and BC nothing, A reacts with
// the load reversed and B with nothing (statics derived in the test).
func TestInclinedHeld(t *testing.T) {
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	a, bn, c := b.node(0, 0), b.node(4, 0), b.node(2, 2)
	ab, bc, ac := b.bar(a, bn), b.bar(bn, c), b.bar(a, c)
	b.fix(a, pinned2...)
	roller := b.inclinedSupport(bn, [3]float64{0, 1, 0}, [3]float64{-1, 0, 0}, model.Y)
	r1 := 1 / math.Sqrt2
	b.force(c, [3]float64{-r1, -r1}, [3]float64{})
	res, err := Solve(context.Background(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	r := res.Cases[0]
	near(t, "N_AC", r.AxialForce[ac], -1, 1e-9)
	near(t, "N_AB", r.AxialForce[ab], 0, 1e-9)
	near(t, "N_BC", r.AxialForce[bc], 0, 1e-9)
	near(t, "A x", r.Reactions[0].Force[0], r1, 1e-9)
	near(t, "A y", r.Reactions[0].Force[1], r1, 1e-9)
	near(t, "B local y", r.Reactions[roller].LocalForce[1], 0, 1e-9)
	if len(res.Warnings) == 0 {
		t.Error("no warning that the structure is a mechanism held by its loads")
	}
}
