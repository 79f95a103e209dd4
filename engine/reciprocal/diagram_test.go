package reciprocal

import (
	"context"
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

// triangleTruss is a symmetric roof truss of span 8 m and rise 3 m (a
// 3-4-5 triangle) with 12 kN at the apex, pinned at the left and on a
// roller at the right.
func triangleTruss() (xy [][2]float64, ends [][2]int, loads [][2]float64, sup []support) {
	xy = [][2]float64{{0, 0}, {8, 0}, {4, 3}}
	ends = [][2]int{{0, 1}, {0, 2}, {1, 2}}
	loads = [][2]float64{{}, {}, {0, -12}}
	sup = []support{{0, true, true}, {1, false, true}}
	return
}

// prattTruss is a four-panel Pratt truss with inclined end posts: panels
// 4 m, depth 3 m, 10 kN at each interior bottom node. Nodes: L0..L4 at
// (0..16, 0) are 0..4, U1..U3 at (4..12, 3) are 5..7.
func prattTruss() (xy [][2]float64, ends [][2]int, loads [][2]float64, sup []support) {
	xy = [][2]float64{{0, 0}, {4, 0}, {8, 0}, {12, 0}, {16, 0}, {4, 3}, {8, 3}, {12, 3}}
	ends = [][2]int{
		{0, 1}, {1, 2}, {2, 3}, {3, 4}, // bottom chord L0L1..L3L4
		{5, 6}, {6, 7}, // top chord U1U2, U2U3
		{0, 5}, {4, 7}, // end posts L0U1, L4U3
		{5, 1}, {6, 2}, {7, 3}, // verticals U1L1, U2L2, U3L3
		{5, 2}, {7, 2}, // diagonals U1L2, U3L2
	}
	loads = make([][2]float64, 8)
	for _, v := range []int{1, 2, 3} {
		loads[v] = [2]float64{0, -10}
	}
	sup = []support{{0, true, true}, {4, false, true}}
	return
}

// TestTextbookTrusses checks the force diagrams of two statically
// determinate trusses against their member forces by the method of joints
// and the force diagrams worked by hand in Bow's notation.
//
// The triangle: rafters −P/(2 sin α) = −10 kN, tie P/(2 tan α) = 8 kN for
// P = 12 kN, sin α = 0.6 (method of joints, common practice; the 3-4-5 roof
// truss is the first worked force diagram in many graphic-statics texts,
// e.g. W. S. Wolfe, Graphical Analysis, McGraw-Hill 1921, ch. on roof
// trusses, from memory). The Pratt truss: end posts −25, bottom chords 20,
// hangers 10, diagonals 25/3, top chords −80/3 (moment 80 kN·m at midspan
// over depth 3), centre vertical 0 (method of joints and sections, common
// practice; Pratt force diagrams are worked in the same texts, from memory).
// In both diagrams the load line is the vertical polygon of the loads and
// reactions, and the point of the space between the reactions splits it
// into the two reactions (common practice).
func TestTextbookTrusses(t *testing.T) {
	type want struct {
		label string
		force float64
		sense Sense
	}
	cases := []struct {
		name    string
		build   func() ([][2]float64, [][2]int, [][2]float64, []support)
		members []want
		forces  []string // external-force labels in load-line order
		points  map[string][2]float64
		tol     float64
	}{
		{
			name:  "triangle",
			build: triangleTruss,
			members: []want{
				{"C-1", 8, Tension},
				{"A-1", -10, Compression},
				{"B-1", -10, Compression},
			},
			// Reaction at the left support first, then the apex load, then
			// the right reaction.
			forces: []string{"C-A", "A-B", "B-C"},
			points: map[string][2]float64{"A": {0, 0}, "B": {0, -12}, "C": {0, -6}, "1": {-8, -6}},
			tol:    1e-12,
		},
		{
			name:  "pratt",
			build: prattTruss,
			members: []want{
				{"E-1", 20, Tension}, {"D-2", 20, Tension}, {"C-5", 20, Tension}, {"B-6", 20, Tension},
				{"A-3", -80.0 / 3, Compression}, {"A-4", -80.0 / 3, Compression},
				{"A-1", -25, Compression}, {"A-6", -25, Compression},
				{"1-2", 10, Tension}, {"3-4", 0, Zero}, {"5-6", 10, Tension},
				{"2-3", 25.0 / 3, Tension}, {"4-5", 25.0 / 3, Tension},
			},
			forces: []string{"E-A", "A-B", "B-C", "C-D", "D-E"},
			// Load line by hand from A = (0, 0): a 15 kN reaction up to
			// B, the three 10 kN loads down to C, D and E, and the other
			// 15 kN reaction back up to A; the triangle's points follow the
			// same way (12 kN down, two 6 kN reactions; point 1 is
			// A + 10·(−0.8, −0.6) along the left rafter).
			points: map[string][2]float64{"A": {0, 0}, "B": {0, 15}, "C": {0, 5}, "D": {0, -5}, "E": {0, -15}},
			tol:    1e-12,
		},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			xy, ends, loads, sup := tc.build()
			m := newModel(xy, ends)
			axial, reactions, res := jointEquilibrium(t, m, loads, sup)
			if res > 1e-12 {
				t.Fatalf("reference equilibrium residual %g", res)
			}
			d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
			if err != nil {
				t.Fatal(err)
			}
			if len(d.Members) != len(tc.members) {
				t.Fatalf("members %d, want %d", len(d.Members), len(tc.members))
			}
			for e, w := range tc.members {
				s := d.Members[e]
				if s.Label != w.label {
					t.Errorf("member %d label %q, want %q", e, s.Label, w.label)
				}
				if !scalar.EqualWithinAbsOrRel(axial[e], w.force, tc.tol, tc.tol) {
					t.Errorf("member %d reference force %g, want %g", e, axial[e], w.force)
				}
				p, q := d.Points[s.Left], d.Points[s.Right]
				if l := math.Hypot(q[0]-p[0], q[1]-p[1]); !scalar.EqualWithinAbsOrRel(l, math.Abs(w.force), tc.tol, tc.tol) {
					t.Errorf("member %s segment length %g, want %g", w.label, l, math.Abs(w.force))
				}
				if s.Sense != w.sense {
					t.Errorf("member %s reads %v, want %v", w.label, s.Sense, w.sense)
				}
				if s.Zero != (w.force == 0) {
					t.Errorf("member %s Zero = %v", w.label, s.Zero)
				}
			}
			if len(d.Disagreements) != 0 {
				t.Errorf("disagreements %v", d.Disagreements)
			}
			if len(d.Forces) != len(tc.forces) {
				t.Fatalf("external forces %d, want %d", len(d.Forces), len(tc.forces))
			}
			for k, f := range d.Forces {
				if f.Label != tc.forces[k] {
					t.Errorf("external force %d label %q, want %q", k, f.Label, tc.forces[k])
				}
			}
			for _, sp := range d.Spaces {
				w, ok := tc.points[sp.Label]
				if !ok {
					continue
				}
				p := d.Points[labelIndex(t, d, sp.Label)]
				if !scalar.EqualWithinAbsOrRel(p[0], w[0], tc.tol, tc.tol) || !scalar.EqualWithinAbsOrRel(p[1], w[1], tc.tol, tc.tol) {
					t.Errorf("point %s at %v, want %v", sp.Label, p, w)
				}
			}
			if d.MaxClosure > 1e-12 || d.MaxMisfit > 1e-12 {
				t.Errorf("closure %g misfit %g", d.MaxClosure, d.MaxMisfit)
			}
		})
	}
}

func labelIndex(t *testing.T, d *Diagram, label string) int {
	t.Helper()
	for f, s := range d.Spaces {
		if s.Label == label {
			return f
		}
	}
	t.Fatalf("no space %q", label)
	return -1
}

// TestPerpendicular checks that the perpendicular diagram is the parallel
// one turned a quarter turn (Maxwell 1864 allows either; common practice)
// and reads the same senses.
func TestPerpendicular(t *testing.T) {
	xy, ends, loads, sup := prattTruss()
	m := newModel(xy, ends)
	axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
	par, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
	if err != nil {
		t.Fatal(err)
	}
	perp, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions), Perpendicular: true})
	if err != nil {
		t.Fatal(err)
	}
	for e, s := range perp.Members {
		p, q := perp.Points[s.Left], perp.Points[s.Right]
		u := [2]float64{xy[ends[e][1]][0] - xy[ends[e][0]][0], xy[ends[e][1]][1] - xy[ends[e][0]][1]}
		if dot := (q[0]-p[0])*u[0] + (q[1]-p[1])*u[1]; math.Abs(dot) > 1e-12 {
			t.Errorf("member %d: segment not perpendicular, dot %g", e, dot)
		}
		if s.Sense != par.Members[e].Sense {
			t.Errorf("member %d: sense %v, parallel %v", e, s.Sense, par.Members[e].Sense)
		}
	}
	for f, p := range perp.Points {
		want := [2]float64{-par.Points[f][1], par.Points[f][0]}
		if math.Abs(p[0]-want[0]) > 1e-12 || math.Abs(p[1]-want[1]) > 1e-12 {
			t.Errorf("point %d: %v, want %v", f, p, want)
		}
	}
}

// TestBadInput checks the failures: a 3D model, crossing and overlapping
// members, a load inside the network, and forces out of equilibrium.
func TestBadInput(t *testing.T) {
	ctx := context.Background()
	t.Run("3D", func(t *testing.T) {
		m := newModel([][2]float64{{0, 0}, {1, 0}}, [][2]int{{0, 1}})
		m.Dim = 3
		m.Coords = []float64{0, 0, 0, 1, 0, 0}
		_, err := Build(ctx, Input{Model: m, AxialForce: []float64{0}})
		if !errors.Is(err, &fault.Error{Kind: fault.WrongDimension}) {
			t.Fatalf("got %v", err)
		}
	})
	planarCases := []struct {
		name  string
		xy    [][2]float64
		ends  [][2]int
		pairs []string // expected problem paths
	}{
		{"crossing diagonals", [][2]float64{{0, 0}, {1, 0}, {1, 1}, {0, 1}},
			[][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}, {0, 2}, {1, 3}}, []string{"/members/4", "/members/5"}},
		{"collinear overlap", [][2]float64{{0, 0}, {2, 0}, {1, 0}, {1, 1}},
			[][2]int{{0, 1}, {0, 2}, {2, 3}, {3, 1}}, []string{"/members/0", "/members/1"}},
		{"node on member", [][2]float64{{0, 0}, {2, 0}, {1, 0}, {1, 1}},
			[][2]int{{0, 1}, {2, 3}, {3, 0}}, []string{"/members/0", "/members/1"}},
		{"duplicate member", [][2]float64{{0, 0}, {1, 0}, {0, 1}},
			[][2]int{{0, 1}, {1, 2}, {2, 0}, {1, 0}}, []string{"/members/0", "/members/3"}},
	}
	for _, tc := range planarCases {
		t.Run(tc.name, func(t *testing.T) {
			m := newModel(tc.xy, tc.ends)
			_, err := Build(ctx, Input{Model: m, AxialForce: make([]float64, len(tc.ends))})
			fe, ok := fault.As(err)
			if !ok || fe.Kind != fault.NotPlanar {
				t.Fatalf("got %v", err)
			}
			if len(fe.Problems) < 2 || fe.Problems[0].Path != tc.pairs[0] || fe.Problems[1].Path != tc.pairs[1] {
				t.Errorf("problems %v, want paths %v", fe.Problems, tc.pairs)
			}
		})
	}
	t.Run("load inside", func(t *testing.T) {
		// A triangle with a centre node tied to the corners (a planar K4);
		// a load at the centre cannot reach the outside.
		xy := [][2]float64{{0, 0}, {4, 0}, {2, 3}, {2, 1}}
		ends := [][2]int{{0, 1}, {1, 2}, {2, 0}, {0, 3}, {1, 3}, {2, 3}}
		m := newModel(xy, ends)
		loads := [][2]float64{{}, {}, {}, {0, -1}}
		axial, reactions, _ := jointEquilibrium(t, m, loads, []support{{0, true, true}, {1, false, true}})
		_, err := Build(ctx, Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.NotPlanar || fe.Problems[0].Path != "/nodes/3" {
			t.Fatalf("got %v", err)
		}
	})
	t.Run("not in equilibrium", func(t *testing.T) {
		xy, ends, loads, sup := triangleTruss()
		m := newModel(xy, ends)
		axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
		axial[0] += 0.5 // the tie: nodes 0 and 1 go out of balance by 0.5 kN
		_, err := Build(ctx, Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.NotInEquilibrium {
			t.Fatalf("got %v", err)
		}
		if len(fe.Problems) != 2 || fe.Problems[0].Path != "/nodes/0" || fe.Problems[1].Path != "/nodes/1" {
			t.Errorf("problems %v", fe.Problems)
		}
		det := fe.Detail.(ClosureDetail)
		if !scalar.EqualWithinAbsOrRel(det.NodeClosure[0], 0.5, 1e-12, 1e-12) || det.NodeClosure[2] > 1e-12 {
			t.Errorf("closure %v", det.NodeClosure)
		}
	})
	t.Run("mechanism", func(t *testing.T) {
		// A square without a diagonal under a side load is a mechanism:
		// no axial forces balance the load, so whatever forces the caller
		// passes, the polygons cannot close (common practice).
		xy := [][2]float64{{0, 0}, {1, 0}, {1, 1}, {0, 1}}
		ends := [][2]int{{0, 1}, {1, 2}, {2, 3}}
		m := newModel(xy, ends)
		loads := [][2]float64{{}, {}, {}, {1, 0}}
		axial, reactions, res := jointEquilibrium(t, m, loads, []support{{0, true, true}, {1, false, true}})
		if res < 0.1 {
			t.Fatalf("expected the mechanism to leave a residual, got %g", res)
		}
		_, err := Build(ctx, Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
		if !errors.Is(err, &fault.Error{Kind: fault.NotInEquilibrium}) {
			t.Fatalf("got %v", err)
		}
	})
}

// TestSmallCases checks dangling members, zero forces and several external
// forces at one node.
func TestSmallCases(t *testing.T) {
	ctx := context.Background()
	t.Run("single bar", func(t *testing.T) {
		// A bar in tension between two opposite pulls: the two spaces are
		// A and B, and the segment has the length of the force (common
		// practice).
		m := newModel([][2]float64{{0, 0}, {3, 4}}, [][2]int{{0, 1}})
		d, err := Build(ctx, Input{Model: m, AxialForce: []float64{5}, External: [][2]float64{{-3, -4}, {3, 4}}})
		if err != nil {
			t.Fatal(err)
		}
		s := d.Members[0]
		p, q := d.Points[s.Left], d.Points[s.Right]
		if l := math.Hypot(q[0]-p[0], q[1]-p[1]); !scalar.EqualWithinAbsOrRel(l, 5, 1e-12, 1e-12) || s.Sense != Tension || s.Label != "A-B" {
			t.Errorf("segment %+v length %g", s, l)
		}
	})
	t.Run("dangling zero member", func(t *testing.T) {
		// The triangle truss with an unloaded bar hanging off the apex
		// carries nothing in it: a point-length segment (common practice).
		xy, ends, loads, sup := triangleTruss()
		xy = append(xy, [2]float64{4, 5})
		ends = append(ends, [2]int{2, 3})
		loads = append(loads, [2]float64{})
		m := newModel(xy, ends)
		axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
		d, err := Build(ctx, Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
		if err != nil {
			t.Fatal(err)
		}
		s := d.Members[3]
		if !s.Zero || s.Sense != Zero || d.Points[s.Left] != d.Points[s.Right] {
			t.Errorf("dangling member %+v", s)
		}
	})
	t.Run("load and reaction apart", func(t *testing.T) {
		// The triangle truss with a 4 kN load also at the left support,
		// drawn as its own line beside the reaction: the load line gains a
		// side and the reaction grows by 4 kN (common practice).
		xy, ends, loads, sup := triangleTruss()
		m := newModel(xy, ends)
		loads[0] = [2]float64{0, -4}
		axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
		ext := external(make([][2]float64, 3), reactions)
		d, err := Build(ctx, Input{Model: m, AxialForce: axial, External: ext,
			Separate: []ExternalForce{{Node: 2, Force: loads[2]}, {Node: 0, Force: loads[0]}}})
		if err != nil {
			t.Fatal(err)
		}
		if len(d.Forces) != 4 {
			t.Fatalf("forces %d", len(d.Forces))
		}
		// Clockwise round the left support from the tie: the reaction's
		// line (drawn downwards) comes before the load's (drawn upwards),
		// so the load at the support is the first force after the
		// reaction: D-A, A-B, then the apex load and the right reaction.
		wantOrder := []struct {
			label       string
			node, index int
		}{{"D-A", 0, 0}, {"A-B", 0, 3}, {"B-C", 2, 2}, {"C-D", 1, 1}}
		for k, w := range wantOrder {
			f := d.Forces[k]
			if f.Label != w.label || f.Node != w.node || f.Index != w.index {
				t.Errorf("force %d: %s at node %d (index %d), want %s at %d (%d)", k, f.Label, f.Node, f.Index, w.label, w.node, w.index)
			}
		}
		if !scalar.EqualWithinAbsOrRel(reactions[0][1], 10, 1e-12, 1e-12) {
			t.Errorf("left reaction %g, want 10", reactions[0][1])
		}
		total := 0.0
		for _, f := range d.Forces {
			total += f.Force
			if f.Misfit > 1e-12 {
				t.Errorf("force %s misfit %g", f.Label, f.Misfit)
			}
		}
		if !scalar.EqualWithinAbsOrRel(total, 32, 1e-12, 1e-12) {
			t.Errorf("load line length %g, want 32", total)
		}
	})
}

// TestCancelled checks that a cancelled context stops Build with the
// context's error (common practice for Go engines).
func TestCancelled(t *testing.T) {
	xy, ends, loads, sup := prattTruss()
	m := newModel(xy, ends)
	axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Build(ctx, Input{Model: m, AxialForce: axial, External: external(loads, reactions)}); !errors.Is(err, context.Canceled) {
		t.Errorf("got %v, want context.Canceled", err)
	}
}
