package stiffness

import (
	"context"
	"reflect"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// TestPlainBarResults: the results of bars that no load touches, which a
// case works out again when asked for (caseMembers), on a braced grid of
// 11,000 bars under nodal loads (large enough for the parallel recovery).
// Each bar's axial force is constant, so its extremes are N at both ends
// and its strain energy N²L/2EA (Timoshenko & Gere, Mechanics of
// Materials, 1997, §2.7, from memory); over the whole truss the strain
// energy equals half the work of the loads, Clapeyron's theorem
// (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., 1970, §91). The
// results are the same with one worker and two, with scratch space and
// without.
func TestPlainBarResults(t *testing.T) {
	m, err := model.Compile(modelgen.GridTruss2D(60, 60))
	if err != nil {
		t.Fatal(err)
	}
	one := solveWorkers(t, m, 1)
	two := solveWorkers(t, m, 2)
	var energy float64
	var scratch MemberResult
	for e := range two.MemberCount() {
		r := two.Member(e, &scratch)
		n := two.AxialForce[e]
		l := m.Length(e)
		ea := m.Materials[m.Members[e].Material].ElasticModulus * m.Sections[m.Members[e].Section].Area
		near(t, "largest axial force", r.MaxAxial.Value, n, 1e-12)
		near(t, "smallest axial force", r.MinAxial.Value, n, 1e-12)
		near(t, "axial energy", r.AxialEnergy, n*n*l/(2*ea), 1e-12)
		energy += r.AxialEnergy
		if !reflect.DeepEqual(r, one.Member(e, nil)) {
			t.Fatalf("member %d: results differ between one worker and two", e)
		}
		if r.Unchecked&noSpanInertia != 0 || r.LoadedAcross {
			t.Fatalf("member %d: a bar no load touches reported as loaded across", e)
		}
	}
	var work float64
	for _, nl := range m.Cases[0].Nodal {
		for c := range m.Dim {
			work += nl.Force[c] * two.Displacements[nl.Node][c]
		}
	}
	near(t, "Clapeyron: strain energy = half the work of the loads", energy, work/2, 1e-9)
}

func solveWorkers(t *testing.T, m *model.Model, workers int) *CaseResult {
	t.Helper()
	res, err := Solve(context.Background(), m, Options{Workers: workers})
	if err != nil {
		t.Fatal(err)
	}
	return &res.Cases[0]
}
