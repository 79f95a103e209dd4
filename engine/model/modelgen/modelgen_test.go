package modelgen

import (
	"fmt"
	"math/rand/v2"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
)

// mechanisms returns the number of independent mechanisms of a pin-jointed
// model: the free translational freedoms minus the rank of the equilibrium
// matrix A (A·t = f, one column per bar). S. Pellegrino, "Structural
// computations with the singular value decomposition of the equilibrium
// matrix", Int. J. Solids Struct. 30(21), 1993 (from memory):
// m = 3j − c − r(A), here counting the free freedoms directly.
func mechanisms(t *testing.T, m *model.Model) (mech, selfStress int) {
	t.Helper()
	dim := m.Dim
	free := make([]int, m.NodeCount()*dim)
	for _, s := range m.Supports {
		for k := range dim {
			if s.Fixed[k] {
				free[s.Node*dim+k] = -1
			}
		}
	}
	n := 0
	for i := range free {
		if free[i] == 0 {
			free[i] = n
			n++
		} else {
			free[i] = -1
		}
	}
	A := mat.NewDense(n, len(m.Members), nil)
	for e, mem := range m.Members {
		a, b := m.Node(mem.Ends[0]), m.Node(mem.Ends[1])
		L := m.Length(e)
		for k := range dim {
			d := (b[k] - a[k]) / L
			if r := free[mem.Ends[0]*dim+k]; r >= 0 {
				A.Set(r, e, -d)
			}
			if r := free[mem.Ends[1]*dim+k]; r >= 0 {
				A.Set(r, e, d)
			}
		}
	}
	var svd mat.SVD
	if !svd.Factorize(A, mat.SVDNone) {
		t.Fatal("SVD failed")
	}
	rank := svd.Rank(1e-10)
	return n - rank, len(m.Members) - rank
}

func TestTrussesHaveNoMechanism(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for _, tc := range []struct {
		name             string
		spec             *model.Spec
		nodes, members   int
		wantSelfStresses int // -1: not checked
	}{
		// A Pratt truss is statically determinate: m + r = 2j (Maxwell's
		// rule, 1864) and no self-stress.
		{"pratt 2", Pratt(2, 8, 2, 10), 4, 5, 0},
		{"pratt 6", Pratt(6, 24, 3, 10), 12, 21, 0},
		{"pratt 7", Pratt(7, 28, 3, 10), 14, 25, 0},
		// With no mechanism, the extended Maxwell rule (J. C. Maxwell, "On the
		// calculation of the equilibrium and stiffness of frames", Phil. Mag.
		// 27, 1864, extended with s and m in Pellegrino 1993, from memory)
		// gives s = b − (free freedoms). Braced grid: b = 3·nx·ny + nx + ny,
		// free = 2·nx·(ny+1), so s = nx·ny − nx + ny.
		{"grid 3x2", GridTruss2D(3, 2), 12, 23, 3*2 - 3 + 2},
		{"grid 1x1", GridTruss2D(1, 1), 4, 5, 1},
		// Space grid: b = 8·nx·ny, free = 3((nx−1)(ny−1) + nx·ny), so
		// s = 2·nx·ny + 3·nx + 3·ny − 3.
		{"space 1x1", SpaceTruss3D(1, 1), 5, 8, 2 + 3 + 3 - 3},
		{"space 3x2", SpaceTruss3D(3, 2), 18, 48, 12 + 9 + 6 - 3},
		{"space 5x4", SpaceTruss3D(5, 4), 50, 160, 40 + 15 + 12 - 3},
		{"random 30", RandomPlanarTruss(rng, 30), -1, -1, -1},
		{"random 60", RandomPlanarTruss(rng, 60), -1, -1, -1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := Must(tc.spec)
			if tc.nodes >= 0 && (m.NodeCount() != tc.nodes || len(m.Members) != tc.members) {
				t.Errorf("got %d nodes, %d members; want %d, %d", m.NodeCount(), len(m.Members), tc.nodes, tc.members)
			}
			mech, ss := mechanisms(t, m)
			if mech != 0 {
				t.Errorf("%d mechanisms, want none", mech)
			}
			if tc.wantSelfStresses >= 0 && ss != tc.wantSelfStresses {
				t.Errorf("%d states of self-stress, want %d", ss, tc.wantSelfStresses)
			}
		})
	}
}

// TestRandomPlanarTrussIsPlanar checks that no two members cross except at
// a shared node, with the orientation test for segment intersection
// (Cormen et al., Introduction to Algorithms, 3rd ed., 2009, §33.1).
func TestRandomPlanarTrussIsPlanar(t *testing.T) {
	for seed := range uint64(5) {
		m := Must(RandomPlanarTruss(rand.New(rand.NewPCG(seed, 1)), 40))
		orient := func(a, b, c [3]float64) float64 {
			return (b[0]-a[0])*(c[1]-a[1]) - (b[1]-a[1])*(c[0]-a[0])
		}
		for e := range m.Members {
			for f := e + 1; f < len(m.Members); f++ {
				me, mf := m.Members[e], m.Members[f]
				if me.Ends[0] == mf.Ends[0] || me.Ends[0] == mf.Ends[1] || me.Ends[1] == mf.Ends[0] || me.Ends[1] == mf.Ends[1] {
					continue
				}
				p1, p2 := m.Node(me.Ends[0]), m.Node(me.Ends[1])
				p3, p4 := m.Node(mf.Ends[0]), m.Node(mf.Ends[1])
				d1, d2 := orient(p3, p4, p1), orient(p3, p4, p2)
				d3, d4 := orient(p1, p2, p3), orient(p1, p2, p4)
				if d1*d2 < 0 && d3*d4 < 0 {
					t.Fatalf("seed %d: members %s and %s cross", seed, me.ID, mf.ID)
				}
			}
		}
	}
}

func TestDeterministic(t *testing.T) {
	a := RandomPlanarTruss(rand.New(rand.NewPCG(3, 4)), 100)
	b := RandomPlanarTruss(rand.New(rand.NewPCG(3, 4)), 100)
	if !reflect.DeepEqual(a, b) {
		t.Error("same seed gave different models")
	}
}

// TestFrameCounts counts the frames by hand: a 3-bay, 4-storey plane
// frame has 4 × 5 grid nodes, 4 columns and 3 beams per storey; a 2 × 3-bay,
// 4-storey space frame has 3 × 4 × 5 nodes, 3 × 4 columns per storey and
// per floor 2 × 4 beams along x plus 3 × 3 along y.
func TestFrameCounts(t *testing.T) {
	for _, tc := range []struct {
		spec           *model.Spec
		nodes, members int
	}{
		{Frame2D(3, 4), 4 * 5, 4*4 + 3*4},
		{Frame3D(2, 3, 4), 3 * 4 * 5, 3*4*4 + 4*(2*4+3*3)},
	} {
		m := Must(tc.spec)
		if m.NodeCount() != tc.nodes || len(m.Members) != tc.members {
			t.Errorf("got %d nodes, %d members; want %d, %d", m.NodeCount(), len(m.Members), tc.nodes, tc.members)
		}
		for _, mem := range m.Members {
			if mem.Kind != model.Beam {
				t.Fatalf("member %s is not a beam", mem.ID)
			}
		}
	}
}

// ExamplePratt builds a 4-panel Pratt truss: 5 bottom and 3 top nodes,
// members 4 bottom + 2 top chords + 2 end diagonals + 3 verticals + 2 inner
// diagonals = 13, which is 2j − 3 = 2·8 − 3 as a statically determinate
// plane truss on three constraints needs (Maxwell's rule, common
// practice), and one load at each of the 3 inner bottom nodes (counted by
// hand).
func ExamplePratt() {
	m := Must(Pratt(4, 16, 2, 10))
	fmt.Println(m.NodeCount(), "nodes,", len(m.Members), "members,", len(m.Cases[0].Nodal), "loads")
	// Output: 8 nodes, 13 members, 3 loads
}
