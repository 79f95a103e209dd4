package model

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

// roof returns a space model of nodes at the given points, bars along
// the given node pairs, pinned at every node, and one empty load case.
func roof(points [][3]float64, bars [][2]int) *Spec {
	s := &Spec{
		Dimension: 3,
		Materials: []MaterialSpec{{ID: "steel", ElasticModulus: Num(2.1e8)}},
		Sections:  []SectionSpec{{ID: "tube", Area: Num(2e-3), SecondMoment: num(3e-6)}},
		LoadCases: []LoadCaseSpec{{ID: "snow"}},
	}
	for i, p := range points {
		id := string(rune('A' + i))
		s.Nodes = append(s.Nodes, NodeSpec{ID: id, At: []Value{Num(p[0]), Num(p[1]), Num(p[2])}})
		s.Supports = append(s.Supports, SupportSpec{Node: id, Fix: []string{"x", "y", "z"}})
	}
	for _, b := range bars {
		a, c := string(rune('A'+b[0])), string(rune('A'+b[1]))
		s.Members = append(s.Members, MemberSpec{ID: a + c, Ends: [2]string{a, c}, Material: "steel", Section: "tube"})
	}
	return s
}

var ring4 = [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}}

// nodalShares sums the compiled nodal forces of case 0 per node.
func nodalShares(t *testing.T, s *Spec) (*Model, [][3]float64) {
	t.Helper()
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	out := make([][3]float64, m.NodeCount())
	for _, nl := range m.Cases[0].Nodal {
		for d := range 3 {
			out[nl.Node][d] += nl.Force[d]
		}
	}
	return m, out
}

func within(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, tol, tol) {
		t.Errorf("%s = %.12g, want %.12g", what, got, want)
	}
}

// TestAreaTwoTriangles checks a 4 × 4 square roof given as two triangular
// panels A–B–C and A–C–D under a pressure p: each triangle (area 8)
// sends p·8/3 to each of its corners (the consistent load vector of the
// linear triangle, ∫N_i dA = A/3: Zienkiewicz & Taylor, The Finite
// Element Method, vol. 1, the linear triangle's equivalent nodal forces,
// from memory), so A and C on the diagonal take 2·8p/3 and B and D 8p/3;
// the total is p·16 exactly. The nodes run anticlockwise seen from above,
// so the normal is +z and a positive pressure presses down.
func TestAreaTwoTriangles(t *testing.T) {
	const p = 1.5
	s := roof([][3]float64{{0, 0, 0}, {4, 0, 0}, {4, 4, 0}, {0, 4, 0}}, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}, {0, 2}})
	s.LoadCases[0].AreaLoads = []AreaLoadSpec{
		{Nodes: []string{"A", "B", "C"}, Pressure: fptr(p)},
		{Nodes: []string{"A", "C", "D"}, Pressure: fptr(p)},
	}
	_, f := nodalShares(t, s)
	want := []float64{-16 * p / 3, -8 * p / 3, -16 * p / 3, -8 * p / 3}
	var total float64
	for n := range f {
		within(t, "share z", f[n][2], want[n], 1e-14)
		within(t, "share x", f[n][0], 0, 1e-14)
		total += f[n][2]
	}
	within(t, "total", total, -16*p, 1e-14)
}

// TestAreaProjectedSnow checks a panel pitched at atan(3/4): plan 6 × 4
// (24), true area 6 × 5 (30). Snow of s per plan area ("projected") totals
// s·24, the same value per true area s·30 (the definition of the
// projected area: EN 1991-1-3 gives snow loads per plan area, from
// memory). A rectangle's mean-node fan gives each corner a quarter.
func TestAreaProjectedSnow(t *testing.T) {
	const snow = 0.8
	for _, tc := range []struct {
		projected bool
		total     float64
	}{{true, -snow * 24}, {false, -snow * 30}} {
		s := roof([][3]float64{{0, 0, 0}, {6, 0, 0}, {6, 4, 3}, {0, 4, 3}}, ring4)
		s.LoadCases[0].AreaLoads = []AreaLoadSpec{{Nodes: []string{"A", "B", "C", "D"}, Value: []float64{0, 0, -snow}, Projected: tc.projected}}
		_, f := nodalShares(t, s)
		for n := range f {
			within(t, "quarter share", f[n][2], tc.total/4, 1e-14)
		}
	}
}

// TestAreaMoment checks an irregular convex pentagon in the plane z = 2
// under a pressure: the shares' resultant is p·A and its line of action
// passes through the area centroid, both from the shoelace formulas
// (A = ½Σ(x_i y_{i+1} − x_{i+1} y_i), C_x = Σ(x_i + x_{i+1})(x_i y_{i+1} −
// x_{i+1} y_i)/(6A), likewise C_y: Bourke, Calculating the area and
// centroid of a polygon, 1988, from memory).
func TestAreaMoment(t *testing.T) {
	const p = 2.0
	pts := [][3]float64{{0, 0, 2}, {5, -1, 2}, {7, 3, 2}, {3, 6, 2}, {-1, 4, 2}}
	s := roof(pts, nil)
	s.Members = []MemberSpec{{ID: "AB", Ends: [2]string{"A", "B"}, Material: "steel", Section: "tube"}}
	s.LoadCases[0].AreaLoads = []AreaLoadSpec{{Nodes: []string{"A", "B", "C", "D", "E"}, Pressure: fptr(p)}}
	_, f := nodalShares(t, s)
	var a, cx, cy float64
	for i := range pts {
		j := (i + 1) % len(pts)
		cr := pts[i][0]*pts[j][1] - pts[j][0]*pts[i][1]
		a += cr / 2
		cx += (pts[i][0] + pts[j][0]) * cr
		cy += (pts[i][1] + pts[j][1]) * cr
	}
	cx, cy = cx/(6*a), cy/(6*a)
	var fz, mx, my float64
	for n, fn := range f {
		fz += fn[2]
		mx += pts[n][1] * fn[2]
		my += pts[n][0] * fn[2]
		if fn[2] >= 0 {
			t.Errorf("node %d share %g is not downward", n, fn[2])
		}
	}
	within(t, "resultant", fz, -p*a, 1e-13)
	within(t, "line of action x", my/fz, cx, 1e-13)
	within(t, "line of action y", mx/fz, cy, 1e-13)
}

// memberTotals integrates case 0's member loads per member (z).
func memberTotals(t *testing.T, s *Spec) (*Model, []float64) {
	t.Helper()
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	out := make([]float64, len(m.Members))
	for _, ml := range m.Cases[0].MemberLoads {
		switch {
		case ml.Partial:
			out[ml.Member] += (ml.End - ml.Start) * (ml.Value[2] + ml.EndValue[2]) / 2
		default:
			out[ml.Member] += m.Length(ml.Member) * ml.Value[2]
		}
	}
	return m, out
}

// TestAreaTwoWay checks a 6 × 4 panel spread two ways to its four edge
// members by the 45° rule (common practice for slabs supported on four
// sides; e.g. Mosley, Bungey & Hulse, Reinforced Concrete Design, the
// load distribution to supporting beams, from memory): the short edges
// (a = 4) take triangles of area a²/4 = 4, the long edges (b = 6)
// trapezoids of a(2b − a)/4 = 8, times the pressure; total a·b = 24. The
// edge C–D's member runs D→C, so its share is mirrored.
func TestAreaTwoWay(t *testing.T) {
	const p = 3.0
	s := roof([][3]float64{{0, 0, 0}, {6, 0, 0}, {6, 4, 0}, {0, 4, 0}}, [][2]int{{0, 1}, {1, 2}, {3, 2}, {3, 0}})
	s.LoadCases[0].AreaLoads = []AreaLoadSpec{{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(p), To: "members", Span: "two-way"}}
	m, tot := memberTotals(t, s)
	want := []float64{-8 * p, -4 * p, -8 * p, -4 * p}
	for e := range tot {
		within(t, "member "+m.Members[e].ID, tot[e], want[e], 1e-14)
	}
	for _, ml := range m.Cases[0].MemberLoads {
		if ml.Member == 2 && ml.Start == 0 && ml.Value[2] != 0 {
			t.Errorf("the mirrored trapezoid does not start at zero: %+v", ml)
		}
	}
	// One way along x: the deck spans 6 between B–C and D–A, each taking
	// the uniform line load p·6/2 over its length 4: 12p each.
	s.LoadCases[0].AreaLoads[0].Span, s.LoadCases[0].AreaLoads[0].SpanDirection = "one-way", []float64{1, 0, 0}
	m, tot = memberTotals(t, s)
	want = []float64{0, -12 * p, 0, -12 * p}
	for e := range tot {
		within(t, "one way, member "+m.Members[e].ID, tot[e], want[e], 1e-14)
	}
}

// TestAreaFollowsParameters checks that a sweep's new geometry spreads the
// load again: a 4 × w panel under a pressure totals 4·w·p.
func TestAreaFollowsParameters(t *testing.T) {
	const p = 2.0
	s := roof([][3]float64{{0, 0, 0}, {4, 0, 0}, {4, 3, 0}, {0, 3, 0}}, ring4)
	s.Parameters = []ParameterSpec{{Name: "w", Value: 3}}
	s.Nodes[2].At[1], s.Nodes[3].At[1] = Expr("w"), Expr("w")
	s.LoadCases[0].Loads = []NodalLoadSpec{{Node: "A", Force: []Value{Num(0), Num(0), Expr("-w")}}}
	s.LoadCases[0].AreaLoads = []AreaLoadSpec{{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(p)}}
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range []float64{3, 5} {
		mw, err := m.WithParameters(map[string]float64{"w": w})
		if err != nil {
			t.Fatal(err)
		}
		var total float64
		for _, nl := range mw.Cases[0].Nodal[1:] {
			total += nl.Force[2]
		}
		within(t, "total", total, -4*w*p, 1e-14)
		within(t, "the user's load", mw.Cases[0].Nodal[0].Force[2], -w, 0)
		if len(mw.Cases[0].Nodal) != 5 {
			t.Errorf("%d nodal loads, want 1 + 4", len(mw.Cases[0].Nodal))
		}
	}
	if len(m.Cases[0].Nodal) != 5 || m.Cases[0].Nodal[1].Force[2] != -p*3 {
		t.Errorf("the compiled model changed: %+v", m.Cases[0].Nodal)
	}
}

// TestAreaRefused checks each bad area load is refused at its pointer.
func TestAreaRefused(t *testing.T) {
	flat := [][3]float64{{0, 0, 0}, {4, 0, 0}, {4, 4, 0}, {0, 4, 0}}
	for _, tc := range []struct {
		name, path, message string
		points              [][3]float64
		load                AreaLoadSpec
	}{
		{"warped", "load_cases/0/area_loads/0/nodes/2", "not planar", [][3]float64{{0, 0, 0}, {4, 0, 0}, {4, 4, 0.1}, {0, 4, 0}},
			AreaLoadSpec{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(1)}},
		{"collinear", "load_cases/0/area_loads/0/nodes", "degenerate", [][3]float64{{0, 0, 0}, {1, 0, 0}, {3, 0, 0}, {0, 4, 0}},
			AreaLoadSpec{Nodes: []string{"A", "B", "C"}, Pressure: fptr(1)}},
		{"not convex", "load_cases/0/area_loads/0/nodes/2", "not convex", [][3]float64{{0, 0, 0}, {4, 0, 0}, {2, 1, 0}, {2, 4, 0}},
			AreaLoadSpec{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(1)}},
		{"two nodes", "load_cases/0/area_loads/0/nodes", "at least 3 nodes", flat, AreaLoadSpec{Nodes: []string{"A", "B"}, Pressure: fptr(1)}},
		{"repeated", "load_cases/0/area_loads/0/nodes/2", "listed twice", flat, AreaLoadSpec{Nodes: []string{"A", "B", "A"}, Pressure: fptr(1)}},
		{"unknown node", "load_cases/0/area_loads/0/nodes/1", "does not exist", flat, AreaLoadSpec{Nodes: []string{"A", "Q", "C"}, Pressure: fptr(1)}},
		{"both", "load_cases/0/area_loads/0", "exactly one of", flat, AreaLoadSpec{Nodes: []string{"A", "B", "C"}, Pressure: fptr(1), Value: []float64{0, 0, -1}}},
		{"projected pressure", "load_cases/0/area_loads/0/projected", "not to a pressure", flat, AreaLoadSpec{Nodes: []string{"A", "B", "C"}, Pressure: fptr(1), Projected: true}},
		{"short value", "load_cases/0/area_loads/0/value", "has 2 entries", flat, AreaLoadSpec{Nodes: []string{"A", "B", "C"}, Value: []float64{0, -1}}},
		{"members need span", "load_cases/0/area_loads/0/span", "needs span", flat, AreaLoadSpec{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(1), To: "members"}},
		{"members need rectangle", "load_cases/0/area_loads/0/nodes", "rectangular panel of 4 nodes", flat,
			AreaLoadSpec{Nodes: []string{"A", "B", "C"}, Pressure: fptr(1), To: "members", Span: "two-way"}},
		{"not square", "load_cases/0/area_loads/0/nodes/1", "not square", [][3]float64{{0, 0, 0}, {4, 0, 0}, {5, 4, 0}, {0, 4, 0}},
			AreaLoadSpec{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(1), To: "members", Span: "two-way"}},
		{"skew span", "load_cases/0/area_loads/0/span_direction", "along one pair", flat,
			AreaLoadSpec{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(1), To: "members", Span: "one-way", SpanDirection: []float64{1, 1, 0}}},
		{"bad to", "load_cases/0/area_loads/0/to", "is not", flat, AreaLoadSpec{Nodes: []string{"A", "B", "C"}, Pressure: fptr(1), To: "edges"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := roof(tc.points, ring4)
			s.LoadCases[0].AreaLoads = []AreaLoadSpec{tc.load}
			_, err := Compile(s)
			fe, ok := fault.As(err)
			if !ok || fe.Kind != fault.InvalidModel {
				t.Fatalf("got %v, want an invalid model", err)
			}
			if fe.Problems[0].Path != tc.path || !strings.Contains(fe.Problems[0].Message, tc.message) {
				t.Errorf("got %s: %s; want %s: …%s…", fe.Problems[0].Path, fe.Problems[0].Message, tc.path, tc.message)
			}
		})
	}
	// An edge without a member, and a plane model.
	s := roof(flat, [][2]int{{0, 1}, {1, 2}, {2, 3}})
	s.LoadCases[0].AreaLoads = []AreaLoadSpec{{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(1), To: "members", Span: "two-way"}}
	if _, err := Compile(s); err == nil || !strings.Contains(err.Error(), "load_cases/0/area_loads/0/nodes/3") {
		t.Errorf("missing edge member: %v", err)
	}
	s2 := triangle()
	s2.LoadCases[0].AreaLoads = []AreaLoadSpec{{Nodes: []string{"A", "B", "C"}, Pressure: fptr(1)}}
	if _, err := Compile(s2); err == nil || !strings.Contains(err.Error(), "plane model has no panels") {
		t.Errorf("plane model: %v", err)
	}
}

// FuzzAreaLoad moves the corners of a four-node panel through the
// fuzzer's values and checks that Compile never panics, refuses with
// located problems, and otherwise conserves the panel's total and its
// moment: the shares add up to −p·A·n̂ and their moment about the origin
// to that of the load spread over the two triangles (p0, p1, p2) and (p0,
// p2, p3), each at its centroid (a different split from the compiler's,
// so the check is independent of it; the moment is exact on a flat
// panel, the total on any).
func FuzzAreaLoad(f *testing.F) {
	f.Add(0.0, 0.0, 0.0, 0.0, 1.0)
	f.Add(0.5, -0.3, 0.2, 0.001, -2.0)
	f.Add(3.0, 3.0, 0.0, 1.0, 1e6)
	f.Fuzz(func(t *testing.T, dx, dy, dz, warp, p float64) {
		// A plane z = dz·x, with D lifted off it by warp.
		pts := [][3]float64{{0, 0, 0}, {4 + dx, 0, dz * (4 + dx)}, {4, 3 + dy, 4 * dz}, {0, 3, warp}}
		s := roof(pts, ring4)
		for i := range pts {
			for d := range 3 {
				s.Nodes[i].At[d] = Num(pts[i][d])
			}
		}
		s.LoadCases[0].AreaLoads = []AreaLoadSpec{{Nodes: []string{"A", "B", "C", "D"}, Pressure: fptr(p)}}
		m, err := Compile(s)
		if err != nil {
			fe, ok := fault.As(err)
			if !ok || len(fe.Problems) == 0 || fe.Problems[0].Path == "" || strings.HasPrefix(fe.Problems[0].Path, "/") {
				t.Fatalf("error %v is not a located *fault.Error", err)
			}
			return
		}
		var total, moment, wantTotal, wantMoment [3]float64
		for _, nl := range m.Cases[0].Nodal {
			at := m.Node(nl.Node)
			c := cross3(at, nl.Force)
			for d := range 3 {
				total[d] += nl.Force[d]
				moment[d] += c[d]
			}
		}
		for _, tri := range [][3]int{{0, 1, 2}, {0, 2, 3}} {
			a, b, c := pts[tri[0]], pts[tri[1]], pts[tri[2]]
			v := cross3(sub3(b, a), sub3(c, a)) // twice the vector area
			force := scale3(v, -p/2)
			centroid := scale3([3]float64{a[0] + b[0] + c[0], a[1] + b[1] + c[1], a[2] + b[2] + c[2]}, 1.0/3)
			mc := cross3(centroid, force)
			for d := range 3 {
				wantTotal[d] += force[d]
				wantMoment[d] += mc[d]
			}
		}
		// The total is exact on any panel (a closed polygon's vector area
		// does not depend on its split); the moment on a flat one.
		size := 10 + math.Abs(dx) + math.Abs(dy) + 5*math.Abs(dz)
		scale := math.Abs(p) * size * size
		for d := range 3 {
			if math.Abs(total[d]-wantTotal[d]) > 1e-12*scale || (warp == 0 && math.Abs(moment[d]-wantMoment[d]) > 1e-12*scale*size) {
				t.Fatalf("total %v moment %v; want %v and %v", total, moment, wantTotal, wantMoment)
			}
		}
	})
}
