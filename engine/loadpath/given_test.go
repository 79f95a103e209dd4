package loadpath

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gusset/engine/model"
)

// TestGivenForcesTriangle: a triangle truss A(0,0) pinned, B(4,0) on a
// roller, C(2,2) loaded by 10 downward. By the method of joints at C, the
// two 45° members each carry −10/(2·sin 45°) = −7.0711 and the tie AB +5;
// the supports react with 5 upward each (hand calculation, any statics
// text). Given those forces, the external forces are the reactions at A
// and B and the load at C.
func TestGivenForcesTriangle(t *testing.T) {
	m := newModel(2, [][]float64{{0, 0}, {4, 0}, {2, 2}}, [][2]int{{0, 2}, {1, 2}, {0, 1}})
	m.Supports = []model.Support{{Node: 0, Fixed: [6]bool{true, true}}, {Node: 1, Fixed: [6]bool{false, true}}}
	m.Cases = []model.LoadCase{{ID: "P", Nodal: []model.NodalLoad{{Node: 2, Force: [3]float64{0, -10}}}}}
	n := -10 / (2 * math.Sin(math.Pi/4))
	c, err := GivenForces(m, []float64{n, n, 5}, 0)
	if err != nil {
		t.Fatal(err)
	}
	want := [][]float64{{0, 5}, {0, 5}, {0, -10}}
	for i, w := range want {
		for k := range w {
			if math.Abs(c.External[i][k]-w[k]) > 1e-12 {
				t.Errorf("external force at node %d: %v, want %v", i, c.External[i], w)
			}
		}
	}
	if c.ID != "P" {
		t.Errorf("case id %q, want P", c.ID)
	}
	// Maxwell's load path theorem holds for the balanced case: the load
	// path's tension minus compression parts equal Σ P·r (Maxwell 1864).
	r, err := Compute(m, []Case{c}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if got := r.Cases[0]; math.Abs(got.LoadPath-60) > 1e-9 || math.Abs(got.Residual) > 1e-9 {
		t.Errorf("load path %g (want 2·7.0711·2.8284 + 5·4 = 60), residual %g (want 0)", got.LoadPath, got.Residual)
	}
}

// TestGivenForcesRandom checks the balance at supports on random
// indeterminate trusses against a least-squares equilibrium solved with
// gonum's SVD (equilibrium in helpers_test.go): with the equilibrium's
// member forces given, the external force at each supported node is its
// load plus its reaction, and at a free node its load.
func TestGivenForcesRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for _, dim := range []int{2, 3} {
		m, fixed, loads := randomTruss(rng, dim, 12, 5)
		want := equilibrium(t, m, fixed, loads)
		lc := model.LoadCase{ID: "random"}
		for i, p := range loads {
			var f [3]float64
			copy(f[:], p)
			lc.Nodal = append(lc.Nodal, model.NodalLoad{Node: i, Force: f})
		}
		m.Cases = []model.LoadCase{lc}
		seen := map[int]bool{}
		for _, f := range fixed {
			if !seen[f.node] {
				seen[f.node] = true
				m.Supports = append(m.Supports, model.Support{Node: f.node})
			}
		}
		got, err := GivenForces(m, want.AxialForce, 0)
		if err != nil {
			t.Fatal(err)
		}
		for i := range want.External {
			for k := 0; k < dim; k++ {
				if d := math.Abs(got.External[i][k] - want.External[i][k]); d > 1e-9 {
					t.Errorf("dim %d node %d: external %v, want %v", dim, i, got.External[i], want.External[i])
					break
				}
			}
		}
	}
}

func TestGivenForcesWrongLength(t *testing.T) {
	m := newModel(2, [][]float64{{0, 0}, {1, 0}}, [][2]int{{0, 1}})
	_, err := GivenForces(m, []float64{1, 2}, -1)
	var ie *InputError
	if !errors.As(err, &ie) || ie.Path != "/forces" {
		t.Fatalf("got %v, want an InputError at /forces", err)
	}
}
