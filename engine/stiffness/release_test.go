package stiffness

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/statics"
)

// release sets member e's released rotations (model.RX .. model.RZ) at end
// side.
func (b *builder) release(e, side int, comps ...int) {
	for _, c := range comps {
		b.m.Members[e].Releases[side] |= model.ReleaseBit(c)
	}
}

// TestCondensedBeamStiffness checks the condensed 2D element of a beam
// released in rz at one end against the textbook fixed–pinned element:
// 3EI/L³ for the transverse freedoms, 3EI/L² coupling them to the fixed
// end's rotation, 3EI/L for that rotation and nothing at the pinned end
// (McGuire, Gallagher & Ziemian, Matrix Structural Analysis, 2nd ed.
// 2000, §13.2, from memory; Przemieniecki, Theory of Matrix Structural
// Analysis, 1968, gives the same pinned-end element). Released at both
// ends the beam is the bar EA/L and nothing else.
func TestCondensedBeamStiffness(t *testing.T) {
	const l = 5.0
	ei, ea := beamE*beamI, beamE*beamA
	k3, k2, k1 := 3*ei/(l*l*l), 3*ei/(l*l), 3*ei/l
	for _, tc := range []struct {
		name  string
		sides []int
		want  [6][6]float64 // local u1 v1 θ1 u2 v2 θ2
	}{
		{"pinned second end", []int{1}, [6][6]float64{
			{ea / l, 0, 0, -ea / l, 0, 0},
			{0, k3, k2, 0, -k3, 0},
			{0, k2, k1, 0, -k2, 0},
			{-ea / l, 0, 0, ea / l, 0, 0},
			{0, -k3, -k2, 0, k3, 0},
			{0, 0, 0, 0, 0, 0},
		}},
		{"pinned first end", []int{0}, [6][6]float64{
			{ea / l, 0, 0, -ea / l, 0, 0},
			{0, k3, 0, 0, -k3, k2},
			{0, 0, 0, 0, 0, 0},
			{-ea / l, 0, 0, ea / l, 0, 0},
			{0, -k3, 0, 0, k3, -k2},
			{0, k2, 0, 0, -k2, k1},
		}},
		{"both ends", []int{0, 1}, [6][6]float64{
			{ea / l, 0, 0, -ea / l, 0, 0},
			{}, {},
			{-ea / l, 0, 0, ea / l, 0, 0},
			{}, {},
		}},
	} {
		b, _ := horizontalBeam(l, 1)
		for _, s := range tc.sides {
			b.release(0, s, model.RZ)
		}
		var el element
		el.build(b.m, newNumbering(b.m), 0)
		for i := range 6 {
			for j := range 6 {
				if got := el.k[i*6+j]; math.Abs(got-tc.want[i][j]) > 1e-9*ea/l {
					t.Errorf("%s: k[%d][%d] = %g, want %g", tc.name, i, j, got, tc.want[i][j])
				}
			}
		}
	}
}

// TestCondensed3D checks the condensed 3D element, for random sets of
// bending releases, against K_cc − K_cr·K_rr⁻¹·K_rc computed with gonum's
// dense LU solver from the full element (the definition of static
// condensation: McGuire, Gallagher & Ziemian 2000, §4.7).
func TestCondensed3D(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 7))
	for trial := range 20 {
		b := newBuilder(3, beamE, 8e7, beamA, beamI, 3e-6, 5e-6)
		n0 := b.node(0, 0, 0)
		n1 := b.node(3, 2, 1)
		b.beam(n0, n1)
		nb := newNumbering(b.m)
		var full element
		full.build(b.m, nb, 0)
		var released []int
		for side := range 2 {
			for _, c := range []int{model.RY, model.RZ} {
				if rng.IntN(2) == 1 {
					b.release(0, side, c)
					released = append(released, 6*side+c)
				}
			}
		}
		if len(released) == 0 {
			continue
		}
		var el element
		el.build(b.m, nb, 0)
		isR := map[int]bool{}
		for _, r := range released {
			isR[r] = true
		}
		var kept []int
		for i := range 12 {
			if !isR[i] {
				kept = append(kept, i)
			}
		}
		sub := func(rows, cols []int) *mat.Dense {
			d := mat.NewDense(len(rows), len(cols), nil)
			for i, r := range rows {
				for j, c := range cols {
					d.Set(i, j, full.k[r*12+c])
				}
			}
			return d
		}
		var x, corr, want mat.Dense
		if err := x.Solve(sub(released, released), sub(released, kept)); err != nil {
			t.Fatal(err)
		}
		corr.Mul(sub(kept, released), &x)
		want.Sub(sub(kept, kept), &corr)
		scale := mat.Norm(sub(kept, kept), math.Inf(1))
		for i, r := range kept {
			for j, c := range kept {
				if got := el.k[r*12+c]; math.Abs(got-want.At(i, j)) > 1e-12*scale {
					t.Errorf("trial %d: k[%d][%d] = %g, want %g", trial, r, c, got, want.At(i, j))
				}
			}
		}
		for _, r := range released {
			for c := range 12 {
				if el.k[r*12+c] != 0 || el.k[c*12+r] != 0 {
					t.Errorf("trial %d: released freedom %d keeps stiffness", trial, r)
				}
			}
		}
	}
}

// TestProppedCantileverWithHinge checks a cantilever AB (fixed at A)
// carrying, through a hinge at B, a span BC propped at C, all under a
// uniform load w. By statics the span BC is simply supported: the prop
// and the hinge each take w·b/2 and BC's largest moment is w·b²/8 at its
// middle; the cantilever carries w over a and w·b/2 at its tip, so the
// fixed end takes w·a + w·b/2 and the moment w·a²/2 + w·b·a/2. The hinge
// deflects as the cantilever's tip, P·a³/3EI + w·a⁴/8EI with P = w·b/2,
// and turns P·a²/2EI + w·a³/6EI there, while BC's end turns by its chord
// rotation plus w·b³/24EI (Gere & Timoshenko, Mechanics of Materials,
// table of beam deflections and slopes, from memory).
func TestProppedCantileverWithHinge(t *testing.T) {
	const a, bl, w = 4.0, 6.0, 3.0
	ei := beamE * beamI
	for _, both := range []bool{false, true} {
		b := newBuilder(2, beamE, 0, beamA, beamI, 0, 0)
		na, nbn, nc := b.node(0, 0), b.node(a, 0), b.node(a+bl, 0)
		ab, bc := b.beam(na, nbn), b.beam(nbn, nc)
		b.release(ab, 1, model.RZ)
		if both {
			b.release(bc, 0, model.RZ) // a hinge made of two releases: the node's rotation is held
		}
		b.fix(na, fixed2...)
		b.fix(nc, model.Y)
		for _, e := range []int{ab, bc} {
			b.memberLoad(model.MemberLoad{Member: e, Kind: model.Uniform, Value: [3]float64{0, -w}})
		}
		res, err := Solve(context.Background(), b.m, Options{})
		if err != nil {
			t.Fatal(err)
		}
		r := &res.Cases[0]
		p := w * bl / 2
		near(t, "prop", r.Reactions[1].Force[1], w*bl/2, 1e-10)
		near(t, "fixed end force", r.Reactions[0].Force[1], w*a+w*bl/2, 1e-10)
		near(t, "fixed end moment", r.Reactions[0].Moment[0], w*a*a/2+w*bl*a/2, 1e-10)
		near(t, "moment at the hinge (AB)", r.EndForces[ab][5], 0, 1e-9)
		near(t, "moment at the hinge (BC)", r.EndForces[bc][2], 0, 1e-9)
		near(t, "BC largest moment", math.Abs(r.Member(bc, nil).PeakMomentZ.Value), w*bl*bl/8, 1e-10)
		near(t, "BC largest moment at", r.Member(bc, nil).PeakMomentZ.At, bl/2, 1e-8)
		delta := -(p*a*a*a/(3*ei) + w*a*a*a*a/(8*ei))
		near(t, "hinge deflection", r.Displacements[nbn][1], delta, 1e-10)
		// The cantilever's own end rotation is the field's slope at x = a.
		near(t, "AB largest deflection", r.Member(ab, nil).PeakDeflectionY.Value, delta, 1e-10)
		bcTurn := -delta/bl - w*bl*bl*bl/(24*ei)
		if !both {
			near(t, "node rotation = BC's end rotation", r.Rotations[nbn][0], bcTurn, 1e-10)
		} else if r.Rotations[nbn][0] != 0 {
			t.Errorf("free rotation of a hinge node = %g, want 0 (held)", r.Rotations[nbn][0])
		}
		if r.Residual > 1e-12 || r.BalanceError > 1e-12 {
			t.Errorf("residual %g, balance %g", r.Residual, r.BalanceError)
		}
		if s := res.Stability; s.MaxwellNumber != 0 || (s.Computed && (s.SelfStress != 0 || s.Mechanisms != 0)) {
			t.Errorf("stability: Maxwell %d, self-stress %d, mechanisms %d; a determinate structure has 0, 0, 0",
				s.MaxwellNumber, s.SelfStress, s.Mechanisms)
		}
	}
}

// threeHingedPortal builds columns A–B and D–E of height h on pins at A
// and E, joined by a flat top B–C–D of span l with a hinge at C, loaded
// by H along +x at B and P down at C.
func threeHingedPortal(l, h, hz, p float64, hinge bool) (*builder, [5]int, [4]int) {
	b := newBuilder(2, beamE, 0, beamA, beamI, 0, 0)
	n := [5]int{b.node(0, 0), b.node(0, h), b.node(l/2, h), b.node(l, h), b.node(l, 0)}
	e := [4]int{b.beam(n[0], n[1]), b.beam(n[1], n[2]), b.beam(n[2], n[3]), b.beam(n[3], n[4])}
	if hinge {
		b.release(e[1], 1, model.RZ)
		b.release(e[2], 0, model.RZ)
	}
	b.fix(n[0], pinned2...)
	b.fix(n[4], pinned2...)
	b.force(n[1], [3]float64{hz, 0}, [3]float64{})
	b.force(n[2], [3]float64{0, -p}, [3]float64{})
	return b, n, e
}

// TestThreeHingedPortal checks a three-hinged portal frame against statics
// by hand (Hibbeler, Structural Analysis, chapter on three-hinged frames
// and arches, from memory): moments about A give E_y = P/2 + H·h/l, the
// vertical balance A_y = P − E_y, the zero moment at the crown hinge
// about C gives E_x = −l·E_y/(2h), and the horizontal balance A_x = −H −
// E_x. The knee moments are |A_x|·h at B and |E_x|·h at D. It also checks
// Maxwell's count: the rigid portal on two pins is once indeterminate and
// the hinge removes that one constraint.
func TestThreeHingedPortal(t *testing.T) {
	const l, h, hz, p = 8.0, 4.0, 10.0, 40.0
	ey := p/2 + hz*h/l
	ay := p - ey
	ex := -l * ey / (2 * h)
	ax := -hz - ex
	b, _, e := threeHingedPortal(l, h, hz, p, true)
	res, err := Solve(context.Background(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	r := &res.Cases[0]
	near(t, "A_x", r.Reactions[0].Force[0], ax, 1e-10)
	near(t, "A_y", r.Reactions[0].Force[1], ay, 1e-10)
	near(t, "E_x", r.Reactions[1].Force[0], ex, 1e-10)
	near(t, "E_y", r.Reactions[1].Force[1], ey, 1e-10)
	near(t, "crown moment (BC)", r.EndForces[e[1]][5]/(p*l), 0, 1e-12)
	near(t, "crown moment (CD)", r.EndForces[e[2]][2]/(p*l), 0, 1e-12)
	near(t, "knee B", math.Abs(r.EndForces[e[0]][5]), math.Abs(ax)*h, 1e-10)
	near(t, "knee D", math.Abs(r.EndForces[e[3]][2]), math.Abs(ex)*h, 1e-10)
	s := res.Stability
	if s.MaxwellNumber != 0 || !s.Computed || s.SelfStress != 0 || s.Mechanisms != 0 {
		t.Errorf("three-hinged: Maxwell %d, self-stress %d, mechanisms %d; want 0, 0, 0", s.MaxwellNumber, s.SelfStress, s.Mechanisms)
	}
	b, _, _ = threeHingedPortal(l, h, hz, p, false)
	res, err = Solve(context.Background(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if s := res.Stability; s.MaxwellNumber != 1 || s.SelfStress != 1 || s.Mechanisms != 0 {
		t.Errorf("two-hinged: Maxwell %d, self-stress %d, mechanisms %d; want 1, 1, 0", s.MaxwellNumber, s.SelfStress, s.Mechanisms)
	}
}

// TestGerberBeam checks a two-span beam on supports A (pin), B and C
// (rollers), spans 6 m, with a hinge G 1.5 m into the second span, under
// a uniform load w: statics by hand (Hibbeler, Structural Analysis, on
// compound beams, from memory) gives the suspended part GC simply
// supported, so R_C and the hinge shear are w·4.5/2; moments of the
// overhanging part about A give R_B = 7.5w and R_A = 2.25w; the hogging
// moment at B is w·1.5²/2 + (w·4.5/2)·1.5 = 4.5w; the sagging peaks are
// w·4.5²/8 in GC (at its middle) and R_A²/2w in AB (at R_A/w from A).
func TestGerberBeam(t *testing.T) {
	const w = 10.0
	b := newBuilder(2, beamE, 0, beamA, beamI, 0, 0)
	na, nb, ng, nc := b.node(0, 0), b.node(6, 0), b.node(7.5, 0), b.node(12, 0)
	ab, bg, gc := b.beam(na, nb), b.beam(nb, ng), b.beam(ng, nc)
	b.release(bg, 1, model.RZ)
	b.fix(na, pinned2...)
	b.fix(nb, model.Y)
	b.fix(nc, model.Y)
	for _, e := range []int{ab, bg, gc} {
		b.memberLoad(model.MemberLoad{Member: e, Kind: model.Uniform, Value: [3]float64{0, -w}})
	}
	r := solve1(t, b.m, Options{})
	near(t, "R_A", r.Reactions[0].Force[1], 2.25*w, 1e-10)
	near(t, "R_B", r.Reactions[1].Force[1], 7.5*w, 1e-10)
	near(t, "R_C", r.Reactions[2].Force[1], 2.25*w, 1e-10)
	near(t, "moment at B", math.Abs(r.EndForces[ab][5]), 4.5*w, 1e-10)
	near(t, "moment at the hinge", r.EndForces[bg][5]/w, 0, 1e-10)
	near(t, "GC sagging", r.Member(gc, nil).PeakMomentZ.Value, 4.5*4.5*w/8, 1e-10)
	near(t, "GC sagging at", r.Member(gc, nil).PeakMomentZ.At, 2.25, 1e-8)
	near(t, "AB peak is the support moment", math.Abs(r.Member(ab, nil).PeakMomentZ.Value), 4.5*w, 1e-10)
	// The sagging peak of AB: the moment at x = R_A/w, which the member's
	// stations sample exactly when one falls there; compare the end
	// moments' closed form instead: M(x) = R_A·x − w·x²/2 at x = 6 is −4.5w.
	near(t, "AB moment at B by statics", 2.25*w*6-w*36/2, -4.5*w, 1e-12)
}

// TestBeamReleasedBothEnds checks a simply supported beam released in rz
// at both ends: it carries an axial load as a bar (N = the load), its span
// moment wL²/8 at mid-span, its ends' moments zero, and deflects
// 5wL⁴/384EI at mid-span (Gere & Timoshenko, table of beam deflections,
// from memory): the deflection needs the released end rotations ∓wL³/24EI,
// which the nodes (held, with no other member) do not have.
func TestBeamReleasedBothEnds(t *testing.T) {
	const l, w, n = 6.0, 4.0, 25.0
	ei := beamE * beamI
	b, nodes := horizontalBeam(l, 1)
	b.release(0, 0, model.RZ)
	b.release(0, 1, model.RZ)
	b.fix(nodes[0], pinned2...)
	b.fix(nodes[1], model.Y)
	b.force(nodes[1], [3]float64{n, 0}, [3]float64{})
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}})
	r := solve1(t, b.m, Options{})
	near(t, "axial force", r.AxialForce[0], n, 1e-12)
	near(t, "extension", r.Displacements[nodes[1]][0], n*l/(beamE*beamA), 1e-12)
	near(t, "span moment", r.Member(0, nil).PeakMomentZ.Value, w*l*l/8, 1e-12)
	near(t, "span moment at", r.Member(0, nil).PeakMomentZ.At, l/2, 1e-9)
	near(t, "mid-span deflection", r.Member(0, nil).PeakDeflectionY.Value, -5*w*l*l*l*l/(384*ei), 1e-10)
	near(t, "end moment 1", r.EndForces[0][2], 0, 1e-12)
	near(t, "end moment 2", r.EndForces[0][5], 0, 1e-12)
}

// TestTorsionRelease3D checks a torque M about global x applied at a node
// B held in translation, where beam AB along x (torsion) meets beam BD
// along y (bending about x), both fixed at their far ends. Rigidly joined,
// B turns by M/(GJ/L₁ + 4EI/L₂) and AB takes the torque GJ/L₁ of it;
// with AB's torsion released at B the beam BD alone resists: B turns by
// M·L₂/4EI and the fixed end D takes M/2, the carry-over factor of a
// prismatic member (Hibbeler, Structural Analysis, moment distribution,
// from memory).
func TestTorsionRelease3D(t *testing.T) {
	const l1, l2, m0 = 3.0, 4.0, 12.0
	const g, j, iz = 8e7, 5e-6, 8e-6
	for _, released := range []bool{false, true} {
		b := newBuilder(3, beamE, g, beamA, iz, iz, j)
		na, nb, nd := b.node(0, 0, 0), b.node(l1, 0, 0), b.node(l1, l2, 0)
		ab := b.beam(na, nb)
		b.beam(nb, nd)
		if released {
			b.release(ab, 1, model.RX)
		}
		b.fix(na, fixed3...)
		b.fix(nd, fixed3...)
		b.fix(nb, model.X, model.Y, model.Z)
		b.force(nb, [3]float64{}, [3]float64{m0, 0, 0})
		r := solve1(t, b.m, Options{})
		kt, kb := g*j/l1, 4*beamE*iz/l2
		if !released {
			theta := m0 / (kt + kb)
			near(t, "rotation, rigid", r.Rotations[nb][0], theta, 1e-10)
			near(t, "torque, rigid", math.Abs(r.EndForces[ab][3]), kt*theta, 1e-10)
			continue
		}
		near(t, "rotation, released", r.Rotations[nb][0], m0*l2/(4*beamE*iz), 1e-10)
		near(t, "torque, released", r.EndForces[ab][3]/m0, 0, 1e-12)
		near(t, "torque at the released end", r.EndForces[ab][9]/m0, 0, 1e-12)
		near(t, "carry-over to D", math.Abs(r.Reactions[1].Moment[0]), m0/2, 1e-10)
		near(t, "A takes no torque", r.Reactions[0].Moment[0]/m0, 0, 1e-12)
	}
}

// TestReleaseMechanism checks that a hinge between two collinear beams on
// pins is reported as the mechanism it is (the hinge can move across the
// line), with Maxwell's count: 2·3 − 2 columns, 4 freedoms (the hinge's
// rotation is no freedom), one self-stress (the axial tie) and one
// mechanism.
func TestReleaseMechanism(t *testing.T) {
	b, nodes := horizontalBeam(8, 2)
	b.release(0, 1, model.RZ)
	b.release(1, 0, model.RZ)
	b.fix(nodes[0], pinned2...)
	b.fix(nodes[2], pinned2...)
	b.force(nodes[1], [3]float64{0, -5}, [3]float64{})
	_, err := Solve(context.Background(), b.m, Options{})
	var fe *fault.Error
	if !errors.As(err, &fe) || fe.Kind != fault.Unstable {
		t.Fatalf("err = %v, want an Unstable fault", err)
	}
	s, err := statics.Analyse(context.Background(), b.m, statics.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if s.MaxwellNumber != 0 || s.SelfStress != 1 || s.Mechanisms != 1 {
		t.Errorf("Maxwell %d, self-stress %d, mechanisms %d; want 0, 1, 1", s.MaxwellNumber, s.SelfStress, s.Mechanisms)
	}
	if len(s.MechanismModes) != 1 || math.Abs(s.MechanismModes[0][2*nodes[1]+1]) < 0.5 {
		t.Errorf("mechanism modes %v: want the hinge moving across the line", s.MechanismModes)
	}
}

// TestReleaseFaults checks the faults of releases the analysis cannot
// use: a moment on a hinge node about its free rotation, and a skew 3D
// beam released in bending alone at a node no other beam reaches.
func TestReleaseFaults(t *testing.T) {
	b, nodes := horizontalBeam(8, 2)
	b.release(0, 1, model.RZ)
	b.release(1, 0, model.RZ)
	b.fix(nodes[0], fixed2...)
	b.fix(nodes[2], fixed2...)
	b.force(nodes[1], [3]float64{}, [3]float64{0, 0, 3})
	_, err := Solve(context.Background(), b.m, Options{})
	var fe *fault.Error
	if !errors.As(err, &fe) || fe.Kind != fault.InvalidModel || len(fe.Problems) == 0 ||
		fe.Problems[0].Path != "/load_cases/0/loads/0/moment" {
		t.Errorf("moment at a hinge: err = %v", err)
	}

	b = newBuilder(3, beamE, 8e7, beamA, beamI, beamI, 2*beamI)
	na, nb := b.node(0, 0, 0), b.node(3, 4, 0)
	e := b.beam(na, nb)
	b.release(e, 1, model.RY, model.RZ)
	b.fix(na, fixed3...)
	b.fix(nb, model.X, model.Y, model.Z)
	_, err = Solve(context.Background(), b.m, Options{})
	if !errors.As(err, &fe) || fe.Kind != fault.InvalidModel || len(fe.Problems) == 0 ||
		fe.Problems[0].Path != "/members/0/releases" || !strings.Contains(fe.Message, "torsion") {
		t.Errorf("skew free rotation: err = %v", err)
	}
	// At a support with axes of its own, a partial set of free rotations
	// (global axes) would not match the node's freedoms (the support's).
	b2 := newBuilder(3, beamE, 8e7, beamA, beamI, beamI, 2*beamI)
	n0, n1 := b2.node(0, 0, 0), b2.node(4, 0, 0)
	e2 := b2.beam(n0, n1)
	b2.release(e2, 1, model.RY, model.RZ)
	b2.fix(n0, fixed3...)
	s := b2.fix(n1, model.X, model.Y, model.Z)
	b2.m.Supports[s].Inclined = true
	b2.m.Supports[s].Axes = [3][3]float64{{0.6, 0.8, 0}, {-0.8, 0.6, 0}, {0, 0, 1}}
	_, err = Solve(context.Background(), b2.m, Options{})
	if !errors.As(err, &fe) || fe.Kind != fault.InvalidModel || len(fe.Problems) == 0 || fe.Problems[0].Path != "/members/0/releases" {
		t.Errorf("partial free rotations at an inclined support: err = %v", err)
	}
	// Releasing the torsion too makes the end a ball joint: it solves.
	b.release(e, 1, model.RX)
	b.force(nb, [3]float64{0, 0, -1}, [3]float64{})
	if _, err := Solve(context.Background(), b.m, Options{}); err != nil {
		t.Errorf("ball joint: %v", err)
	}
}

// TestReleasesThroughAnalysis checks that a sweep's Analysis (numbering
// and pattern kept across steps) solves a released model: the three-hinged
// portal at a second height gives the reactions of statics (see
// TestThreeHingedPortal) and the result of a fresh Solve.
func TestReleasesThroughAnalysis(t *testing.T) {
	const l, hz, p = 8.0, 10.0, 40.0
	b, _, _ := threeHingedPortal(l, 4, hz, p, true)
	a := NewAnalysis(b.m, Options{})
	for _, h := range []float64{4, 6} {
		step, _, _ := threeHingedPortal(l, h, hz, p, true)
		got, err := a.Solve(context.Background(), step.m)
		if err != nil {
			t.Fatal(err)
		}
		ey := p/2 + hz*h/l
		ex := -l * ey / (2 * h)
		r := &got.Cases[0]
		near(t, "E_x", r.Reactions[1].Force[0], ex, 1e-10)
		near(t, "E_y", r.Reactions[1].Force[1], ey, 1e-10)
		near(t, "A_x", r.Reactions[0].Force[0], -hz-ex, 1e-10)
	}
}
