package stiffness

import (
	"bytes"
	"context"
	"encoding/json"
	"gusset/engine/statics"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// generated are the models of the property tests.
func generated() []struct {
	name string
	m    *model.Model
} {
	return []struct {
		name string
		m    *model.Model
	}{
		{"pratt", modelgen.Must(modelgen.Pratt(8, 24, 3, 10))},
		{"grid 2D", modelgen.Must(modelgen.GridTruss2D(6, 4))},
		{"space truss", modelgen.Must(modelgen.SpaceTruss3D(4, 3))},
		{"frame 2D", modelgen.Must(modelgen.Frame2D(3, 4))},
		{"frame 3D", modelgen.Must(modelgen.Frame3D(2, 2, 3))},
		{"random truss", modelgen.Must(modelgen.RandomPlanarTruss(rand.New(rand.NewPCG(7, 11)), 40))},
	}
}

func maxAbs(rows [][]float64) float64 {
	var m float64
	for _, r := range rows {
		for _, v := range r {
			m = max(m, math.Abs(v))
		}
	}
	return m
}

// agree reports whether a and b agree entry by entry within tol times the
// largest magnitude in a.
func agree(a, b [][]float64, tol float64) bool {
	scale := maxAbs(a)
	for i := range a {
		if len(a[i]) != len(b[i]) {
			return false
		}
		for j := range a[i] {
			if math.Abs(a[i][j]-b[i][j]) > tol*scale {
				return false
			}
		}
	}
	return true
}

func column(v []float64) [][]float64 {
	out := make([][]float64, len(v))
	for i := range v {
		out[i] = []float64{v[i]}
	}
	return out
}

// TestEquilibriumProperties checks on generated models that the scaled
// residual is at round-off level, that the reactions balance the loads
// (equilibrium of the whole structure, Newton's first law), that the dense
// and sparse paths agree, and that two runs give byte-identical output.
// Since the residual and balance figures are the solver's report on
// itself, the pin-jointed models are also checked joint by joint here from
// their geometry (checkJointEquilibrium).
func TestEquilibriumProperties(t *testing.T) {
	for _, g := range generated() {
		var first []byte
		var dense *Result
		for _, path := range []Path{Dense, Sparse, Sparse} {
			res, err := Solve(context.Background(), g.m, Options{Path: path})
			if err != nil {
				t.Fatalf("%s: %v", g.name, err)
			}
			checkJointEquilibrium(t, g.name, g.m, res)
			for _, c := range res.Cases {
				// ‖K·u − f‖/‖f‖ stays at round-off level times the
				// spread of the member stiffnesses (axial EA/L against
				// bending 12EI/L³, about 1e4 in the frames).
				if c.Residual > 1e-10 || c.BalanceError > 1e-10 {
					t.Errorf("%s %s %s: residual %g, balance %g", g.name, path, c.ID, c.Residual, c.BalanceError)
				}
			}
			if path == Dense {
				dense = res
				continue
			}
			for i, c := range res.Cases {
				d := dense.Cases[i]
				if !agree(d.Displacements, c.Displacements, 1e-9) || !agree(column(d.AxialForce), column(c.AxialForce), 1e-9) ||
					!agree(d.EndForces, c.EndForces, 1e-9) {
					t.Errorf("%s %s: the dense and sparse paths disagree", g.name, c.ID)
				}
			}
			out, err := json.Marshal(struct {
				Cases     []CaseResult
				Stability any
				Warnings  []string
			}{res.Cases, res.Stability, res.Warnings})
			if err != nil {
				t.Fatalf("%s: %v", g.name, err)
			}
			if first == nil {
				first = out
			} else if !bytes.Equal(first, out) {
				t.Errorf("%s: two runs differ", g.name)
			}
		}
	}
}

// cloneModel copies the parts of m that the tests change.
func cloneModel(m *model.Model) *model.Model {
	c := *m
	c.NodeIDs = slices.Clone(m.NodeIDs)
	c.Coords = slices.Clone(m.Coords)
	c.Members = slices.Clone(m.Members)
	c.Supports = slices.Clone(m.Supports)
	c.Cases = slices.Clone(m.Cases)
	for i := range c.Cases {
		c.Cases[i].Nodal = slices.Clone(m.Cases[i].Nodal)
		c.Cases[i].MemberLoads = slices.Clone(m.Cases[i].MemberLoads)
	}
	return &c
}

// TestRenumbering checks that reversing the order of the nodes and of the
// members changes no result (the physics does not know our numbering).
func TestRenumbering(t *testing.T) {
	for _, g := range generated() {
		m := g.m
		r := cloneModel(m)
		nn, ne := m.NodeCount(), len(m.Members)
		newIndex := func(n int) int { return nn - 1 - n }
		for n := range nn {
			r.NodeIDs[newIndex(n)] = m.NodeIDs[n]
			copy(r.Coords[newIndex(n)*m.Dim:], m.Coords[n*m.Dim:(n+1)*m.Dim])
		}
		for e := range ne {
			mem := m.Members[e]
			mem.Ends = [2]int{newIndex(mem.Ends[0]), newIndex(mem.Ends[1])}
			r.Members[ne-1-e] = mem
		}
		for i := range r.Supports {
			r.Supports[i].Node = newIndex(m.Supports[i].Node)
		}
		for c := range r.Cases {
			for i := range r.Cases[c].Nodal {
				r.Cases[c].Nodal[i].Node = newIndex(m.Cases[c].Nodal[i].Node)
			}
			for i := range r.Cases[c].MemberLoads {
				r.Cases[c].MemberLoads[i].Member = ne - 1 - m.Cases[c].MemberLoads[i].Member
			}
		}
		a, err := Solve(context.Background(), m, Options{})
		if err != nil {
			t.Fatalf("%s: %v", g.name, err)
		}
		b, err := Solve(context.Background(), r, Options{})
		if err != nil {
			t.Fatalf("%s renumbered: %v", g.name, err)
		}
		for ci := range a.Cases {
			ca, cb := a.Cases[ci], b.Cases[ci]
			disp := make([][]float64, nn)
			for n := range nn {
				disp[n] = cb.Displacements[newIndex(n)]
			}
			forces := make([]float64, ne)
			ends := make([][]float64, ne)
			for e := range ne {
				forces[e] = cb.AxialForce[ne-1-e]
				ends[e] = cb.EndForces[ne-1-e]
			}
			if !agree(ca.Displacements, disp, 1e-9) || !agree(column(ca.AxialForce), column(forces), 1e-9) || !agree(ca.EndForces, ends, 1e-9) {
				t.Errorf("%s %s: renumbering changed the results", g.name, ca.ID)
			}
		}
	}
}

// TestRigidRotation checks objectivity: turning a model with its loads as
// a rigid body turns the displacements the same way and leaves the member
// forces (axial, and end forces in local axes) unchanged. Models whose
// supports fix every translation are used, since a roller is tied to the
// global axes; a 3D beam's default orientation is tied to global z, so the
// 3D check uses the space truss.
func TestRigidRotation(t *testing.T) {
	const angle = 0.7
	c, s := math.Cos(angle), math.Sin(angle)
	// A rotation about the axis (1, 2, 2)/3 for 3D (Rodrigues' formula).
	k := [3]float64{1.0 / 3, 2.0 / 3, 2.0 / 3}
	var r3 [3][3]float64
	for i := range 3 {
		for j := range 3 {
			r3[i][j] = (1 - c) * k[i] * k[j]
			if i == j {
				r3[i][j] += c
			}
		}
	}
	r3[0][1] -= s * k[2]
	r3[1][0] += s * k[2]
	r3[0][2] += s * k[1]
	r3[2][0] -= s * k[1]
	r3[1][2] -= s * k[0]
	r3[2][1] += s * k[0]
	r2 := [3][3]float64{{c, -s, 0}, {s, c, 0}, {0, 0, 1}}
	rotate := func(r [3][3]float64, v []float64) []float64 {
		out := make([]float64, len(v))
		for i := range v {
			for j := range v {
				out[i] += r[i][j] * v[j]
			}
		}
		return out
	}
	for _, g := range []struct {
		name string
		m    *model.Model
		r    [3][3]float64
	}{
		{"frame 2D", modelgen.Must(modelgen.Frame2D(3, 4)), r2},
		{"grid 2D", modelgen.Must(modelgen.GridTruss2D(6, 4)), r2},
		{"space truss", modelgen.Must(modelgen.SpaceTruss3D(4, 3)), r3},
	} {
		m := g.m
		d := m.Dim
		rm := cloneModel(m)
		for n := range m.NodeCount() {
			copy(rm.Coords[n*d:], rotate(g.r, m.Coords[n*d:(n+1)*d]))
		}
		for ci := range rm.Cases {
			if rm.Cases[ci].SelfWeight || len(rm.Cases[ci].MemberLoads) > 0 {
				t.Fatalf("%s: the test expects nodal loads only", g.name)
			}
			for i := range rm.Cases[ci].Nodal {
				nl := &rm.Cases[ci].Nodal[i]
				copy(nl.Force[:], rotate(g.r, m.Cases[ci].Nodal[i].Force[:d]))
				if d == 3 {
					copy(nl.Moment[:], rotate(g.r, m.Cases[ci].Nodal[i].Moment[:]))
				}
			}
		}
		a, err := Solve(context.Background(), m, Options{})
		if err != nil {
			t.Fatalf("%s: %v", g.name, err)
		}
		b, err := Solve(context.Background(), rm, Options{})
		if err != nil {
			t.Fatalf("%s rotated: %v", g.name, err)
		}
		for ci := range a.Cases {
			ca, cb := a.Cases[ci], b.Cases[ci]
			turned := make([][]float64, len(ca.Displacements))
			for n, u := range ca.Displacements {
				turned[n] = rotate(g.r, u)
			}
			if !agree(turned, cb.Displacements, 1e-9) {
				t.Errorf("%s %s: displacements do not rotate with the model", g.name, ca.ID)
			}
			if !agree(column(ca.AxialForce), column(cb.AxialForce), 1e-9) || !agree(ca.EndForces, cb.EndForces, 1e-9) {
				t.Errorf("%s %s: member forces change under a rigid rotation", g.name, ca.ID)
			}
		}
	}
}

// TestStabilityCount checks that the count Solve takes from a successful
// factorisation (no SVD) agrees with the rank of the equilibrium matrix by
// dense SVD (package statics) on generated models.
func TestStabilityCount(t *testing.T) {
	for _, g := range generated() {
		a, err := statics.Analyse(context.Background(), g.m, statics.Options{DenseLimit: 5000})
		if err != nil {
			t.Fatal(err)
		}
		fast, err := Solve(context.Background(), g.m, Options{})
		if err != nil {
			t.Fatal(err)
		}
		b := fast.Stability
		if a.CountedBy != "svd" || b.CountedBy != "stiffness" || a.SelfStress != b.SelfStress || a.Mechanisms != 0 || b.Mechanisms != 0 {
			t.Errorf("%s: svd %s s=%d m=%d, factor %s s=%d m=%d", g.name, a.CountedBy, a.SelfStress, a.Mechanisms, b.CountedBy, b.SelfStress, b.Mechanisms)
		}
	}
}

// checkJointEquilibrium checks, for models of bars under nodal loads only,
// that at every node the bars' pulls (N along the unit vector towards the
// far end, tension positive), the loads and the support reactions sum to
// zero: the method of joints (any statics text, common practice), computed
// from the model's geometry independently of the solver's own residual.
// Models with beams, member loads, self weight, springs or settlements are
// left to the residual checks.
func checkJointEquilibrium(t *testing.T, name string, m *model.Model, res *Result) {
	t.Helper()
	for _, mem := range m.Members {
		if mem.Kind != model.Bar {
			return
		}
	}
	for _, s := range m.Supports {
		for k := range s.Fixed {
			if s.Spring[k] != 0 || s.Displacement[k] != 0 {
				return
			}
		}
	}
	dim := m.Dim
	for _, c := range res.Cases {
		if c.Combination {
			continue
		}
		lc := m.Cases[slices.IndexFunc(m.Cases, func(l model.LoadCase) bool { return l.ID == c.ID })]
		if lc.SelfWeight || len(lc.MemberLoads) > 0 {
			continue
		}
		sum := make([][3]float64, m.NodeCount())
		scale := 0.0
		add := func(node int, f []float64) {
			for k := 0; k < dim; k++ {
				sum[node][k] += f[k]
				scale = max(scale, math.Abs(f[k]))
			}
		}
		for e, mem := range m.Members {
			a, b := mem.Ends[0], mem.Ends[1]
			u := make([]float64, dim)
			l := 0.0
			for k := 0; k < dim; k++ {
				u[k] = m.Coords[dim*b+k] - m.Coords[dim*a+k]
				l += u[k] * u[k]
			}
			l = math.Sqrt(l)
			pull, push := make([]float64, dim), make([]float64, dim)
			for k := range u {
				pull[k] = c.AxialForce[e] * u[k] / l
				push[k] = -pull[k]
			}
			add(a, pull)
			add(b, push)
		}
		for _, p := range lc.Nodal {
			add(p.Node, p.Force[:dim])
		}
		for s, r := range c.Reactions {
			add(m.Supports[s].Node, r.Force)
		}
		if scale == 0 {
			t.Fatalf("%s %s: no forces at all", name, c.ID)
		}
		for v, f := range sum {
			if math.Hypot(f[0], math.Hypot(f[1], f[2])) > 1e-9*scale {
				t.Errorf("%s %s: node %d out of balance by %v (forces up to %g)", name, c.ID, v, f[:dim], scale)
				break
			}
		}
	}
}
