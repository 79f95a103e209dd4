package reciprocal

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
	"gusset/engine/statics"
)

// selfStress returns the state of self-stress of a free framework with
// exactly one, from the null space of its equilibrium matrix (the right
// singular vector of the smallest singular value, gonum SVD), scaled so
// its largest entry is 1 in magnitude. It also returns that singular value
// relative to the largest, which is zero up to round-off when the state
// exists (S. Pellegrino, "Structural computations with the singular value
// decomposition of the equilibrium matrix", Int. J. Solids Struct. 30,
// 1993, from memory).
func selfStress(t *testing.T, m *model.Model) ([]float64, float64) {
	t.Helper()
	n, ne := m.NodeCount(), len(m.Members)
	a := mat.NewDense(2*n, ne, nil)
	for e, mb := range m.Members {
		i, j := mb.Ends[0], mb.Ends[1]
		dx, dy := m.Coords[2*j]-m.Coords[2*i], m.Coords[2*j+1]-m.Coords[2*i+1]
		l := math.Hypot(dx, dy)
		a.Set(2*i, e, dx/l)
		a.Set(2*i+1, e, dy/l)
		a.Set(2*j, e, -dx/l)
		a.Set(2*j+1, e, -dy/l)
	}
	var svd mat.SVD
	if !svd.Factorize(a, mat.SVDFull) {
		t.Fatal("SVD failed")
	}
	var v mat.Dense
	svd.VTo(&v)
	s := svd.Values(nil)
	state := make([]float64, ne)
	big := 0.0
	for e := range state {
		state[e] = v.At(e, ne-1)
		if math.Abs(state[e]) > math.Abs(big) {
			big = state[e]
		}
	}
	for e := range state {
		state[e] /= big
	}
	return state, s[ne-1] / s[0]
}

// frameworks are self-stressed plane frameworks.
func frameworks() map[string]struct {
	xy   [][2]float64
	ends [][2]int
} {
	// The prism: an outer triangle, an inner one scaled about the point
	// (2.5, 1.5), and three bars on the lines through that point. The
	// projection of a truncated pyramid, it has one state of self-stress
	// because the three lines meet (Maxwell 1864; W. Whiteley, "Motions
	// and stresses of projected polyhedra", 1982, from memory).
	c := [2]float64{2.5, 1.5}
	outer := [][2]float64{{0, 0}, {6, 0}, {2, 5}}
	prism := append([][2]float64{}, outer...)
	for _, p := range outer {
		prism = append(prism, [2]float64{c[0] + 0.35*(p[0]-c[0]), c[1] + 0.35*(p[1]-c[1])})
	}
	return map[string]struct {
		xy   [][2]float64
		ends [][2]int
	}{
		// A triangle with an inner node tied to its corners: a plane K4,
		// 6 bars on 4 joints, 2j − 3 = 5, so one state of self-stress
		// (Maxwell's rule, J. C. Maxwell, Phil. Mag. 1864).
		"wheel": {[][2]float64{{0, 0}, {5, 0}, {1.5, 4}, {2, 1.2}},
			[][2]int{{0, 1}, {1, 2}, {2, 0}, {0, 3}, {1, 3}, {2, 3}}},
		"prism": {prism, [][2]int{{0, 1}, {1, 2}, {2, 0}, {3, 4}, {4, 5}, {5, 3}, {0, 3}, {1, 4}, {2, 5}}},
	}
}

// TestSelfStressLift checks, for self-stressed frameworks, that the slope
// jumps of the Airy lift equal the forces to round-off, with the gradient
// difference normal to each member (Maxwell 1864: the reciprocal of a
// self-stress is the projection of a polyhedral lift), that valleys are
// tension, and that the lift's polar is the force diagram lifted.
func TestSelfStressLift(t *testing.T) {
	for name, fw := range frameworks() {
		t.Run(name, func(t *testing.T) {
			m := newModel(fw.xy, fw.ends)
			state, sigma := selfStress(t, m)
			if sigma > 1e-13 {
				t.Fatalf("no self-stress: smallest singular value %g", sigma)
			}
			d, err := Build(context.Background(), SelfStressInput(m, state))
			if err != nil {
				t.Fatal(err)
			}
			if d.SpaceCount != 1 || len(d.Forces) != 0 {
				t.Errorf("spaces %d forces %d", d.SpaceCount, len(d.Forces))
			}
			checkLift(t, d, fw.xy, fw.ends, state, 1e-12)
			checkPolar(t, d, fw.xy, fw.ends, 1e-12)
		})
	}
}

// checkLift checks the slope jumps of the lift against the forces.
func checkLift(t *testing.T, d *Diagram, xy [][2]float64, ends [][2]int, force []float64, tol float64) {
	t.Helper()
	scale := 0.0
	for _, f := range force {
		scale = math.Max(scale, math.Abs(f))
	}
	for e, en := range ends {
		l, r := d.Lift.Planes[d.Members[e].Left], d.Lift.Planes[d.Members[e].Right]
		jx, jy := l[0]-r[0], l[1]-r[1]
		u := [2]float64{xy[en[1]][0] - xy[en[0]][0], xy[en[1]][1] - xy[en[0]][1]}
		lu := math.Hypot(u[0], u[1])
		if along := (jx*u[0] + jy*u[1]) / lu; math.Abs(along) > tol*scale {
			t.Errorf("member %d: gradient jump has %g along the member", e, along)
		}
		if !scalar.EqualWithinAbsOrRel(math.Hypot(jx, jy), math.Abs(force[e]), tol*scale, tol) {
			t.Errorf("member %d: slope jump %g, force %g", e, math.Hypot(jx, jy), force[e])
		}
		want := Flat
		if force[e] > d.Tolerance {
			want = Valley
		} else if force[e] < -d.Tolerance {
			want = Ridge
		}
		if d.Lift.Folds[e] != want {
			t.Errorf("member %d (force %g): fold %v, want %v", e, force[e], d.Lift.Folds[e], want)
		}
		// Continuity: both planes meet at both ends.
		for _, v := range en {
			zl := l[0]*xy[v][0] + l[1]*xy[v][1] + l[2]
			zr := r[0]*xy[v][0] + r[1]*xy[v][1] + r[2]
			if math.Abs(zl-zr) > tol*scale*(1+math.Hypot(xy[v][0], xy[v][1])) {
				t.Errorf("member %d: planes differ by %g at node %d", e, zl-zr, v)
			}
		}
	}
}

// checkPolar checks that the polar of the lift with respect to the
// paraboloid z = (x²+y²)/2 is the force diagram lifted: its vertices project
// onto the force diagram turned a quarter turn clockwise, and for every
// member the poles of the two faces lie on the polar planes of both end
// nodes (pole–polar incidence is symmetric for this paraboloid; Maxwell
// 1864, Crapo and Whiteley, "Plane self stresses and projected polyhedra
// I", Structural Topology 20, 1993, from memory).
func checkPolar(t *testing.T, d *Diagram, xy [][2]float64, ends [][2]int, tol float64) {
	t.Helper()
	pl := d.Lift.Polar
	scale := 1.0
	for _, p := range d.Points {
		scale = math.Max(scale, math.Hypot(p[0], p[1]))
	}
	for f, v := range pl.Vertices {
		g := gradient(d.Perpendicular, d.Points[f])
		if math.Abs(v[0]-g[0]) > tol*scale || math.Abs(v[1]-g[1]) > tol*scale {
			t.Errorf("polar vertex %d projects to (%g, %g), want %v", f, v[0], v[1], g)
		}
	}
	size := 1.0
	for _, p := range xy {
		size = math.Max(size, math.Hypot(p[0], p[1]))
	}
	for e, en := range ends {
		for _, f := range []int{d.Members[e].Left, d.Members[e].Right} {
			v := pl.Vertices[f]
			for _, node := range en {
				p := pl.Planes[node]
				if z := p[0]*v[0] + p[1]*v[1] + p[2]; math.Abs(z-v[2]) > tol*scale*size*10 {
					t.Errorf("member %d: pole of face %d off the polar plane of node %d by %g", e, f, node, z-v[2])
				}
			}
		}
	}
}

// TestTriangleLift checks the lift of the 3-4-5 roof truss against planes
// worked by hand from the stated convention: gradient = force-diagram point
// turned clockwise, space A at height 0, continuity across members at their
// midpoints. Points (TestTextbookTrusses): A (0,0), B (0,−12), C (0,−6),
// 1 (−8,−6), so planes A: z = 0; 1: z = −6x + 8y; B: z = −12x + 48;
// C: z = −6x; heights 0, −48, 0 (by hand from the convention).
func TestTriangleLift(t *testing.T) {
	xy, ends, loads, sup := triangleTruss()
	m := newModel(xy, ends)
	axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
	d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
	if err != nil {
		t.Fatal(err)
	}
	want := map[string][3]float64{"A": {0, 0, 0}, "1": {-6, 8, 0}, "B": {-12, 0, 48}, "C": {-6, 0, 0}}
	for label, w := range want {
		p := d.Lift.Planes[labelIndex(t, d, label)]
		for k := range 3 {
			if !scalar.EqualWithinAbsOrRel(p[k], w[k], 1e-12, 1e-12) {
				t.Errorf("plane %s = %v, want %v", label, p, w)
				break
			}
		}
	}
	for v, w := range []float64{0, -48, 0} {
		if !scalar.EqualWithinAbsOrRel(d.Lift.Heights[v], w, 1e-12, 1e-12) {
			t.Errorf("height %d = %g, want %g", v, d.Lift.Heights[v], w)
		}
	}
	checkLift(t, d, xy, ends, axial, 1e-12)
	checkPolar(t, d, xy, ends, 1e-12)
}

// TestSupportedSelfStress reciprocates the states of self-stress that the
// equilibrium-matrix analysis finds for the plane K4 pinned at two
// corners: with the supports, each state may load them, and SelfStressInput
// supplies those reactions, so every state's diagram closes at round-off
// and its lift's slope jumps are its forces (Pellegrino 1993; Maxwell
// 1864, from memory).
func TestSupportedSelfStress(t *testing.T) {
	fw := frameworks()["wheel"]
	m := newModel(fw.xy, fw.ends)
	m.Supports = []model.Support{{Node: 0, Fixed: [6]bool{true, true}}, {Node: 1, Fixed: [6]bool{true, true}}}
	rep, err := statics.Analyse(context.Background(), m, statics.Options{})
	if err != nil {
		t.Fatal(err)
	}
	// s = b − r = 6 − 4: two states (Maxwell's rule with four unknown
	// displacements).
	if len(rep.SelfStressStates) != 2 {
		t.Fatalf("%d states, want 2", len(rep.SelfStressStates))
	}
	for k, state := range rep.SelfStressStates {
		in := SelfStressInput(m, state)
		d, err := Build(context.Background(), in)
		if err != nil {
			t.Fatalf("state %d: %v", k, err)
		}
		checkDiagram(t, d, m, state, in.External, true, 1e-12)
	}
}
