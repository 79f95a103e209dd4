package reciprocal

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/engine/statics"
	"gusset/engine/stiffness"
)

// checkDiagram checks the properties every diagram of forces in
// equilibrium must have, each against a fact outside the code:
//   - forces read off the diagram (segment length, sense by Bow's clockwise
//     reading) balance at every joint: each joint's polygon closes (Bow
//     1873; Maxwell 1864; common practice);
//   - segments are parallel to their members with length |force| (Maxwell
//     1864, the definition of the reciprocal figure);
//   - labels name the two spaces each segment separates, letters A, B, ...
//     run clockwise round the boundary from the leftmost loaded node, and
//     force k joins spaces k−1 and k (Bow's notation);
//   - the lift's slope jumps equal the forces and its polar is the force
//     diagram lifted (Maxwell 1864).
func checkDiagram(t *testing.T, d *Diagram, m *model.Model, axial []float64, ext [][2]float64, convex bool, tol float64) {
	t.Helper()
	n := m.NodeCount()
	xy := make([][2]float64, n)
	for v := range xy {
		xy[v] = [2]float64{m.Coords[2*v], m.Coords[2*v+1]}
	}
	ends := make([][2]int, len(m.Members))
	for e := range ends {
		ends[e] = m.Members[e].Ends
	}
	scale := 0.0
	for _, f := range axial {
		scale = math.Max(scale, math.Abs(f))
	}
	sum := make([][2]float64, n)
	for e, s := range d.Members {
		p, q := d.Points[s.Left], d.Points[s.Right]
		length := math.Hypot(q[0]-p[0], q[1]-p[1])
		if math.Abs(length-math.Abs(axial[e])) > tol*scale {
			t.Errorf("member %d: segment %g, force %g", e, length, axial[e])
		}
		u := [2]float64{xy[ends[e][1]][0] - xy[ends[e][0]][0], xy[ends[e][1]][1] - xy[ends[e][0]][1]}
		lu := math.Hypot(u[0], u[1])
		u = [2]float64{u[0] / lu, u[1] / lu}
		if cross := (q[0]-p[0])*u[1] - (q[1]-p[1])*u[0]; math.Abs(cross) > tol*scale {
			t.Errorf("member %d: segment not parallel (%g)", e, cross)
		}
		force := length * float64(s.Sense)
		for k, v := range ends[e] {
			sign := 1.0 - 2*float64(k)
			sum[v][0] += sign * force * u[0]
			sum[v][1] += sign * force * u[1]
		}
		want := spaceName(min(s.Left, s.Right), d.SpaceCount) + "-" + spaceName(max(s.Left, s.Right), d.SpaceCount)
		if s.Label != want {
			t.Errorf("member %d label %q, want %q", e, s.Label, want)
		}
	}
	for v, f := range ext {
		sum[v][0] += f[0]
		sum[v][1] += f[1]
	}
	for v, s := range sum {
		if math.Hypot(s[0], s[1]) > tol*scale*float64(1+len(m.Members)) {
			t.Errorf("node %d: forces read off the diagram leave %v", v, s)
		}
	}
	if len(d.Disagreements) > 0 {
		t.Errorf("sense disagreements at members %v", d.Disagreements)
	}
	mf := len(d.Forces)
	if mf > 0 {
		// Clockwise: for a convex network, the node angles round its
		// centre decrease along the sequence, one turn in all.
		cx, cy := 0.0, 0.0
		for _, p := range xy {
			cx += p[0] / float64(n)
			cy += p[1] / float64(n)
		}
		turn := 0.0
		for k := range d.Forces {
			a, b := d.Forces[k], d.Forces[(k+1)%mf]
			if a.Left != (k+mf-1)%mf || a.Right != k%max(mf, 1) && mf > 1 {
				t.Errorf("force %d joins spaces %d and %d", k, a.Left, a.Right)
			}
			if !strings.HasPrefix(a.Label, SpaceLetters((k+mf-1)%mf)+"-") {
				t.Errorf("force %d label %q", k, a.Label)
			}
			pa, pb := xy[a.Node], xy[b.Node]
			step := math.Atan2(pa[1]-cy, pa[0]-cx) - math.Atan2(pb[1]-cy, pb[0]-cx)
			for step < 0 {
				step += 2 * math.Pi
			}
			turn += step
		}
		if convex && mf > 1 && math.Abs(turn-2*math.Pi) > 1e-9 {
			t.Errorf("external forces turn %g round the centre, want one clockwise turn", turn)
		}
		first := xy[d.Forces[0].Node]
		for _, f := range d.Forces {
			p := xy[f.Node]
			if p[0] < first[0] || p[0] == first[0] && p[1] < first[1] {
				t.Errorf("force at %v is left of the first at %v", p, first)
			}
		}
	}
	checkLift(t, d, xy, ends, axial, tol*float64(1+len(m.Members)))
	checkPolar(t, d, xy, ends, tol*float64(1+len(m.Members)))
}

// boundaryLoads returns random loads on the boundary nodes of a grid.
func boundaryLoads(rng *rand.Rand, rows, cols int) [][2]float64 {
	loads := make([][2]float64, rows*cols)
	for r := 0; r < rows; r++ {
		for c := 0; c < cols; c++ {
			if (r == 0 || c == 0 || r == rows-1 || c == cols-1) && rng.IntN(2) == 0 {
				loads[r*cols+c] = [2]float64{20*rng.Float64() - 10, 20*rng.Float64() - 10}
			}
		}
	}
	return loads
}

// TestRandomTriangulations builds diagrams of random planar triangulations
// under random boundary loads, their equilibrium found by the independent
// joint-equilibrium solve, and of random self-stresses made from lifts.
func TestRandomTriangulations(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for trial := range 20 {
		rows, cols := 2+rng.IntN(5), 2+rng.IntN(6)
		xy, ends := gridTruss(rows, cols, 0.5, rng)
		m := newModel(xy, ends)
		loads := boundaryLoads(rng, rows, cols)
		loads[rows*cols-1] = [2]float64{1, -2} // at least one load
		sup := []support{{0, true, true}, {cols - 1, rng.IntN(2) == 0, true}}
		axial, reactions, res := jointEquilibrium(t, m, loads, sup)
		if res > 1e-10 {
			t.Fatalf("trial %d: reference residual %g", trial, res)
		}
		ext := external(loads, reactions)
		d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: ext})
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		checkDiagram(t, d, m, axial, ext, true, 1e-12)
		again, _ := Build(context.Background(), Input{Model: m, AxialForce: axial, External: ext})
		if !reflect.DeepEqual(d, again) {
			t.Errorf("trial %d: Build is not deterministic", trial)
		}

		heights := make([]float64, rows*cols)
		for r := 1; r < rows-1; r++ {
			for c := 1; c < cols-1; c++ {
				heights[r*cols+c] = rng.Float64()*4 - 1
			}
		}
		state := airySelfStress(xy, ends, rows, cols, heights)
		ds, err := Build(context.Background(), SelfStressInput(m, state))
		if err != nil {
			t.Fatalf("trial %d self-stress: %v", trial, err)
		}
		checkDiagram(t, ds, m, state, nil, true, 1e-12)
		// The lift recovers the heights it was made from (Maxwell 1864:
		// the lift is unique once the outer plane is fixed).
		for v, h := range heights {
			if math.Abs(ds.Lift.Heights[v]-h) > 1e-10 {
				t.Errorf("trial %d: height %d = %g, made from %g", trial, v, ds.Lift.Heights[v], h)
			}
		}
	}
}

// TestLeastSquaresSpreads perturbs the forces of a random triangulation by
// about 1e-7 of their size, within a looser tolerance, and checks the
// optimality condition of the least-squares placement: at every point but
// the fixed one, the misfits of its segments sum to zero (the normal
// equations; common practice), and no misfit exceeds the perturbation.
func TestLeastSquaresSpreads(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	rows, cols := 7, 9
	xy, ends := gridTruss(rows, cols, 0.5, rng)
	m := newModel(xy, ends)
	loads := boundaryLoads(rng, rows, cols)
	axial, reactions, _ := jointEquilibrium(t, m, loads, []support{{0, true, true}, {cols - 1, false, true}})
	for e := range axial {
		axial[e] += 1e-6 * (rng.Float64() - 0.5)
	}
	d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions), Tolerance: 1e-4})
	if err != nil {
		t.Fatal(err)
	}
	grad := make([][2]float64, len(d.Points))
	add := func(s Segment, v [2]float64) {
		p, q := d.Points[s.Left], d.Points[s.Right]
		r := [2]float64{q[0] - p[0] - v[0], q[1] - p[1] - v[1]}
		if s.Left == s.Right {
			return
		}
		grad[s.Right][0] += r[0]
		grad[s.Right][1] += r[1]
		grad[s.Left][0] -= r[0]
		grad[s.Left][1] -= r[1]
	}
	for _, s := range d.Members {
		add(s, s.Vector)
	}
	for _, s := range d.Forces {
		add(s, s.Vector)
	}
	for f := 1; f < len(grad); f++ {
		// The tree placement leaves gradients of the size of the
		// perturbation (1e-6); the solve must bring them to round-off of
		// the conjugate-gradient stopping rule (1e-12 of ‖b‖).
		if math.Hypot(grad[f][0], grad[f][1]) > 1e-9 {
			t.Errorf("point %d: misfits sum to %v", f, grad[f])
		}
	}
	if d.MaxMisfit > 3e-6 || d.MaxMisfit == 0 {
		t.Errorf("largest misfit %g", d.MaxMisfit)
	}
}

// TestWithSolver reciprocates generated random planar trusses with the
// axial forces and reactions of the stiffness solve (loads kept to the
// boundary nodes), and checks that a load inside the network is refused.
func TestWithSolver(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 1))
	built, refused := 0, 0
	defer func() {
		if built == 0 || refused == 0 {
			t.Errorf("built %d diagrams, refused %d inner loads: the cases did not exercise both", built, refused)
		}
	}()
	for trial := range 8 {
		spec := modelgen.RandomPlanarTruss(rng, 20+rng.IntN(40))
		m := modelgen.Must(spec)
		onBoundary := boundaryNodes(t, m)
		var kept, inner []model.NodalLoadSpec
		index := map[string]int{}
		for v, id := range m.NodeIDs {
			index[id] = v
		}
		for _, l := range spec.LoadCases[0].Loads {
			if onBoundary[index[l.Node]] {
				kept = append(kept, l)
			} else {
				inner = append(inner, l)
			}
		}
		if len(inner) > 0 {
			// The generated model as it is: a load at an inner node.
			full, err := reciprocate(t, m)
			if full != nil || !errors.Is(err, &fault.Error{Kind: fault.NotPlanar}) {
				t.Errorf("trial %d: load inside the network gave %v", trial, err)
			}
			refused++
		}
		if len(kept) == 0 {
			continue
		}
		spec.LoadCases[0].Loads = kept
		m = modelgen.Must(spec)
		if _, err := reciprocate(t, m); err != nil {
			t.Errorf("trial %d: %v", trial, err)
		}
		built++
	}
}

// reciprocate solves m by the stiffness method and builds its diagram,
// checking it when it builds.
func reciprocate(t *testing.T, m *model.Model) (*Diagram, error) {
	t.Helper()
	res, err := stiffness.Solve(context.Background(), m, stiffness.Options{})
	if err != nil {
		t.Fatal(err)
	}
	c := res.Cases[0]
	ext := make([][2]float64, m.NodeCount())
	for _, l := range m.Cases[0].Nodal {
		ext[l.Node][0] += l.Force[0]
		ext[l.Node][1] += l.Force[1]
	}
	for k, s := range m.Supports {
		ext[s.Node][0] += c.Reactions[k].Force[0]
		ext[s.Node][1] += c.Reactions[k].Force[1]
	}
	d, err := Build(context.Background(), Input{Model: m, AxialForce: c.AxialForce, External: ext})
	if err == nil {
		checkDiagram(t, d, m, c.AxialForce, ext, false, 1e-9)
	}
	return d, err
}

// boundaryNodes marks the nodes on the convex hull's rows and columns of a
// generated grid truss: those with fewer than six members or on the first
// or last row or column (found from the grid's ids, n{j·(cols+1)+i}).
func boundaryNodes(t *testing.T, m *model.Model) []bool {
	t.Helper()
	// The grid's columns: nodes whose rounded y is 0 form the first row.
	cols := 0
	for v := range m.NodeIDs {
		if math.Round(m.Coords[2*v+1]) == 0 {
			cols++
		}
	}
	rows := m.NodeCount() / cols
	out := make([]bool, m.NodeCount())
	for v := range out {
		i, j := v%cols, v/cols
		out[v] = i == 0 || j == 0 || i == cols-1 || j == rows-1
	}
	return out
}

// TestStaticsSelfStress reciprocates every state of self-stress that the
// equilibrium-matrix analysis of a free triangulated grid finds: each is a
// self-equilibrated set of axial forces (the null space of the equilibrium
// matrix; Pellegrino 1993, from memory), so its diagram
// closes and its lift's slope jumps are its forces.
func TestStaticsSelfStress(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 9))
	xy, ends := gridTruss(4, 5, 0.5, rng)
	m := newModel(xy, ends)
	rep, err := statics.Analyse(context.Background(), m, statics.Options{})
	if err != nil {
		t.Fatal(err)
	}
	// A free triangulation with 6 interior nodes: s = b − (2j − 3) = 6
	// (Maxwell's rule with no mechanisms beyond the rigid motions).
	if len(rep.SelfStressStates) != 6 {
		t.Fatalf("%d states of self-stress, want 6", len(rep.SelfStressStates))
	}
	for k, state := range rep.SelfStressStates {
		d, err := Build(context.Background(), SelfStressInput(m, state))
		if err != nil {
			t.Fatalf("state %d: %v", k, err)
		}
		checkDiagram(t, d, m, state, nil, true, 1e-12)
	}
}
