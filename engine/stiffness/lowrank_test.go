package stiffness

import (
	"context"
	"math"
	"testing"

	"gusset/engine/model"
)

// TestLowRankPasses checks the active-set iteration with its low-rank
// passes on a braced roof (bracedRoof, 16 × 16 cells, two walls) against
// its defining property: the converged forces are those of the structure
// without the slack members, solved here by gonum's dense Cholesky (the
// Dense path) on a model from which they are removed; every active
// tension-only member is in tension and every slack one would be
// compressed (its trial force, from the converged displacements, is not
// positive). Some passes must be low-rank: fewer factorisations than
// solves.
func TestLowRankPasses(t *testing.T) {
	m := bracedRoof(16, 16, true, true)
	res, err := Solve(context.Background(), m, Options{Path: Sparse})
	if err != nil {
		t.Fatal(err)
	}
	r := &res.Cases[0]
	it := r.Iteration
	if it.Factorisations >= it.Iterations || it.Factorisations+it.LowRankSolves != it.Iterations {
		t.Errorf("%d factorisations in %d solves: no low-rank pass", it.Factorisations, it.Iterations)
	}
	slack := map[int]bool{}
	for _, e := range it.Slack {
		slack[e] = true
	}
	reduced := *m
	reduced.Members = nil
	var kept []int
	for e, mem := range m.Members {
		if !slack[e] {
			mem.Behaviour = model.Both
			reduced.Members = append(reduced.Members, mem)
			kept = append(kept, e)
		}
	}
	ref, err := Solve(context.Background(), &reduced, Options{Path: Dense})
	if err != nil {
		t.Fatal(err)
	}
	var peak float64
	for _, f := range ref.Cases[0].AxialForce {
		peak = max(peak, math.Abs(f))
	}
	for k, e := range kept {
		if d := math.Abs(r.AxialForce[e] - ref.Cases[0].AxialForce[k]); d > 1e-9*peak {
			t.Fatalf("member %d: N = %g, dense reference %g", e, r.AxialForce[e], ref.Cases[0].AxialForce[k])
		}
		if m.Members[e].Behaviour == model.TensionOnly && r.AxialForce[e] < -1e-9*peak {
			t.Errorf("active tension-only member %d is compressed: %g", e, r.AxialForce[e])
		}
	}
	for n := range r.Displacements {
		for c := range 2 {
			if d := math.Abs(r.Displacements[n][c] - ref.Cases[0].Displacements[n][c]); d > 1e-9 {
				t.Fatalf("node %d: displacement differs by %g", n, d)
			}
		}
	}
	for e := range slack {
		a, b := r.Displacements[m.Members[e].Ends[0]], r.Displacements[m.Members[e].Ends[1]]
		L := m.Length(e)
		p, q := m.Node(m.Members[e].Ends[0]), m.Node(m.Members[e].Ends[1])
		stretch := ((b[0]-a[0])*(q[0]-p[0]) + (b[1]-a[1])*(q[1]-p[1])) / L
		if stretch > 1e-12 {
			t.Errorf("slack member %d would stretch by %g", e, stretch)
		}
	}
	if r.Residual > 1e-10 {
		t.Errorf("residual %g", r.Residual)
	}
}
