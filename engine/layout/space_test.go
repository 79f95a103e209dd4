package layout

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

var fixAll = [3]bool{true, true, true}

// TestEmbeddedPlane solves the three-point problem on an 8 × 4 grid in the
// plane and again in space, from the same grid's nodes at z = 0 with
// supports fixing x, y and z: the space program has only empty rows
// besides the plane's (every candidate lies in the plane), so the optimum
// is the plane's (common practice), to 1e-9.
func TestEmbeddedPlane(t *testing.T) {
	plane := threePoint(8)
	flat, err := Optimise(context.Background(), plane, Options{Tolerance: 1e-11}, nil)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, flat)
	space := plane
	space.Dim = 3
	space.Domain = Domain{}
	space.Divisions = [3]int{}
	for j := 0; j <= 4; j++ {
		for i := 0; i <= 8; i++ {
			space.Nodes = append(space.Nodes, vec{float64(i) / 4, float64(j) / 4, 0})
		}
	}
	space.Supports = []Support{{Node: -1, At: vec{0, 0, 0}, Fix: fixAll}, {Node: -1, At: vec{2, 0, 0}, Fix: fixAll}}
	l, err := Optimise(context.Background(), space, Options{Tolerance: 1e-11}, nil)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, l)
	if l.Dim != 3 || l.Stats.Candidates != flat.Stats.Candidates {
		t.Errorf("dimension %d with %d candidates, want 3 and the plane's %d", l.Dim, l.Stats.Candidates, flat.Stats.Candidates)
	}
	if !scalar.EqualWithinAbsOrRel(l.Volume, flat.Volume, 1e-9, 1e-9) {
		t.Errorf("space volume %.12g, plane volume %.12g", l.Volume, flat.Volume)
	}
}

// TestTripod hangs a load P below three supports on a circle of radius R,
// a height h above it: the three bars from the load to the supports carry
// N = P L/(3h) each (L = √(R² + h²), vertical equilibrium 3N h/L = P), so
// the volume is V = 3 N L/σ = P L²/(h σ).
//
// That no layout over the test's nodes needs less follows from the dual
// of the layout program (Dorn, Gomory & Greenberg 1964): a virtual
// displacement u with u = 0 at the supports and |(u_j − u_i)·e_ij| ≤
// L_ij/σ for every pair of nodes bounds every volume from below by
// P·u(load)/σ. Take the dilation u(x) = (x − c)/σ away from the supports,
// with c = (0, 0, L²/h) above the load: between two free nodes it
// stretches every line by exactly 1/σ, and its work on the load is
// P c_z/σ = P L²/(hσ) = V. Between a support s and a node x the bound
// needs −|x − s|² ≤ (x − c)·(x − s) ≤ |x − s|², which the load meets with
// equality (c·s = L²) and which the test checks for every node it adds
// (derived here; the argument is Michell's, Phil. Mag. 8, 1904).
func TestTripod(t *testing.T) {
	const R, h, P, sigma = 1.0, 1.0, 3.0, 2.0
	L := math.Hypot(R, h)
	c := vec{0, 0, L * L / h}
	var supports []vec
	for k := 0; k < 3; k++ {
		phi := math.Pi/2 + 2*math.Pi*float64(k)/3
		supports = append(supports, vec{R * math.Cos(phi), R * math.Sin(phi), h})
	}
	p := Problem{Dim: 3, TensionLimit: sigma, CompressionLimit: sigma,
		Cases: []Case{{ID: "P", Loads: []Load{{Node: 0, Force: vec{0, 0, -P}}}}}}
	p.Nodes = append(p.Nodes, vec{0, 0, 0})
	for k, s := range supports {
		p.Nodes = append(p.Nodes, s)
		p.Supports = append(p.Supports, Support{Node: 1 + k, Fix: fixAll})
	}
	admissible := func(x vec) bool {
		for _, s := range supports {
			w := sub(x, s)
			g := dot(sub(x, c), w)
			if g > dot(w, w)+1e-12 || g < -dot(w, w)-1e-12 {
				return false
			}
		}
		return true
	}
	for i := -4; i <= 4; i++ {
		for j := -4; j <= 4; j++ {
			for k := 1; k <= 4; k++ {
				x := vec{float64(i) / 4, float64(j) / 4, float64(k) / 4}
				if admissible(x) && norm(sub(x, supports[0])) > 1e-9 && norm(sub(x, supports[1])) > 1e-9 && norm(sub(x, supports[2])) > 1e-9 {
					p.Nodes = append(p.Nodes, x)
				}
			}
		}
	}
	if len(p.Nodes) < 20 {
		t.Fatalf("only %d nodes pass the dual check", len(p.Nodes))
	}
	l, err := Optimise(context.Background(), p, Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, l)
	want := P * L * L / (h * sigma)
	if !scalar.EqualWithinAbsOrRel(l.Volume, want, 1e-8, 1e-8) {
		t.Errorf("volume %.10g over %d nodes, want P L²/(hσ) = %.10g", l.Volume, len(p.Nodes), want)
	}
	if len(l.Members) != 3 {
		t.Fatalf("%d members, want the 3 bars", len(l.Members))
	}
	for _, m := range l.Members {
		if !scalar.EqualWithinAbsOrRel(m.Forces[0], P*L/(3*h), 1e-8, 1e-8) || !scalar.EqualWithinAbsOrRel(m.Length, L, 1e-12, 1e-12) {
			t.Errorf("member force %g length %g, want %g and %g", m.Forces[0], m.Length, P*L/(3*h), L)
		}
	}
}

// wallBox is a space grid over [0, 1] × [−1/2, 1/2] × [−1/2, 1/2] pinned at
// every node of the wall x = 0, with a load P = 1 along −z at (1, 0, 0).
func wallBox(n int) Problem {
	p := Problem{Dim: 3, Solid: Solid{Vertices: Box(vec{0, -0.5, -0.5}, vec{1, 0.5, 0.5})}, Divisions: [3]int{n, n, n},
		TensionLimit: 1, CompressionLimit: 1, Cases: []Case{{ID: "P", Loads: []Load{{Node: -1, At: vec{1, 0, 0}, Force: vec{0, 0, -1}}}}}}
	for j := 0; j <= n; j++ {
		for k := 0; k <= n; k++ {
			p.Supports = append(p.Supports, Support{Node: -1, At: vec{0, -0.5 + float64(j)/float64(n), -0.5 + float64(k)/float64(n)}, Fix: fixAll})
		}
	}
	return p
}

// TestWallPlaneBound checks a cantilever from a wall plane under a
// transverse load against the plane problem in the plane y = 0 through
// the load: projecting any space layout orthogonally onto that plane
// gives a plane layout that carries the same load (it lies in the plane)
// to supports on the wall's trace, with each member's force and length
// scaled by the cosine of its angle to the plane, so its volume is at most
// the space layout's; and the grid's nodes and members project onto the
// plane grid's. So the space volume is bounded below by the plane
// optimum (derived here, after the projection argument of Hemp, Optimum
// Structures, 1973, from memory). With a wall as tall as the load's
// distance a, Michell's two bars at 45° (volume 2Pa/σ, Michell 1904) fit
// in the plane, and the bound is attained.
func TestWallPlaneBound(t *testing.T) {
	for _, tc := range []struct {
		name  string
		n     int
		tall  bool
		exact float64
	}{
		{"short wall 4", 4, false, 0},
		{"tall wall 2", 2, true, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := wallBox(tc.n)
			plane := Problem{Domain: Rectangle(0, -0.5, 1, 0.5), Divisions: [3]int{tc.n, tc.n}, TensionLimit: 1, CompressionLimit: 1,
				Cases: []Case{{ID: "P", Loads: []Load{{Node: -1, At: vec{1, 0}, Force: vec{0, -1}}}}}}
			if tc.tall {
				p.Solid.Vertices = Box(vec{0, -1, -1}, vec{1, 1, 1})
				p.Supports = nil
				for j := 0; j <= 2*tc.n; j++ {
					for k := 0; k <= 2*tc.n; k++ {
						p.Supports = append(p.Supports, Support{Node: -1, At: vec{0, -1 + float64(j)/float64(tc.n), -1 + float64(k)/float64(tc.n)}, Fix: fixAll})
					}
				}
				p.Divisions = [3]int{tc.n, 2 * tc.n, 2 * tc.n}
				plane.Domain = Rectangle(0, -1, 1, 1)
				plane.Divisions = [3]int{tc.n, 2 * tc.n}
			}
			lo, _ := plane.Domain.Outline[0], 0
			for k := 0; k <= plane.Divisions[1]; k++ {
				plane.Supports = append(plane.Supports, pin(0, lo[1]+float64(k)/float64(tc.n)))
			}
			l, err := Optimise(context.Background(), p, Options{}, nil)
			if err != nil {
				t.Fatal(err)
			}
			checkResult(t, l)
			flat, err := Optimise(context.Background(), plane, Options{}, nil)
			if err != nil {
				t.Fatal(err)
			}
			if l.Volume < flat.Volume*(1-1e-9) {
				t.Errorf("space volume %.10g below the plane bound %.10g", l.Volume, flat.Volume)
			}
			if tc.exact > 0 && !scalar.EqualWithinAbsOrRel(l.Volume, tc.exact, 1e-7, 1e-7) {
				t.Errorf("space volume %.10g, want Michell's 2Pa/σ = %g", l.Volume, tc.exact)
			}
			t.Logf("space %.6g, plane bound %.6g", l.Volume, flat.Volume)
		})
	}
}

// TestSpaceMethodsAgree solves small space ground structures with gonum's
// dense simplex method (gonum.org/v1/gonum/optimize/convex/lp), one
// interior-point program over every candidate, and member adding: the
// optimal value of a linear program is unique, so the volumes agree.
func TestSpaceMethodsAgree(t *testing.T) {
	general := func() Problem {
		p := Problem{Dim: 3, Solid: Solid{Vertices: Box(vec{0, 0, 0}, vec{2, 2, 2})}, Divisions: [3]int{2, 2, 2},
			TensionLimit: 2, CompressionLimit: 1,
			Cases: []Case{{ID: "P", Loads: []Load{{Node: -1, At: vec{2, 1, 2}, Force: vec{0.3, -0.4, -1}}}}}}
		for _, s := range []vec{{0, 0, 0}, {0, 2, 0}, {0, 1, 2}} {
			p.Supports = append(p.Supports, Support{Node: -1, At: s, Fix: fixAll})
		}
		return p
	}
	twoCases := general()
	twoCases.Cases = append(twoCases.Cases, Case{ID: "Q", Loads: []Load{{Node: -1, At: vec{2, 2, 1}, Force: vec{0, 1, 0.5}}}})
	holed := spaceBridge(4)
	holed.Solid.Holes = [][][3]float64{Box(vec{0.75, 0.25, 0.25}, vec{1.25, 0.75, 0.75})}
	for _, tc := range []struct {
		name    string
		p       Problem
		methods []Method
	}{
		{"box 2×2×2 unequal limits", general(), []Method{DenseSimplex, AllCandidates, MemberAdding}},
		{"bridge 4×2×2 with a hole", holed, []Method{DenseSimplex, AllCandidates, MemberAdding}},
		{"two alternative cases", twoCases, []Method{AllCandidates, MemberAdding}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var volumes []float64
			for _, method := range tc.methods {
				l, err := Optimise(context.Background(), tc.p, Options{Method: method}, nil)
				if err != nil {
					t.Fatalf("method %d: %v", method, err)
				}
				checkResult(t, l)
				volumes = append(volumes, l.Volume)
			}
			for i := 1; i < len(volumes); i++ {
				if !scalar.EqualWithinAbsOrRel(volumes[i], volumes[0], 1e-7, 1e-7) {
					t.Errorf("volumes %v differ", volumes)
				}
			}
		})
	}
}

// TestMirroredLoads checks uniqueness of the optimal value on a problem
// symmetric about the plane y = 1/2: a load and its mirror image need the
// same volume, to 1e-9 (common practice: the optimal value of a linear
// program is unique, and mirroring maps the feasible sets onto each other).
func TestMirroredLoads(t *testing.T) {
	var volumes []float64
	for _, sign := range []float64{1, -1} {
		p := spaceBridge(8)
		p.Cases[0].Loads[0] = Load{Node: -1, At: vec{1.25, 0.5 + sign*0.25, 0.25}, Force: vec{0.3, sign * 0.2, -1}}
		l, err := Optimise(context.Background(), p, Options{Tolerance: 1e-11}, nil)
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, l)
		volumes = append(volumes, l.Volume)
	}
	if !scalar.EqualWithinAbsOrRel(volumes[0], volumes[1], 1e-9, 1e-9) {
		t.Errorf("volume %.12g and mirrored %.12g", volumes[0], volumes[1])
	}
}

// TestSpaceModes checks the three modes of several cases in space: by
// Hemp's identity max(|q⁺+q⁻|, |q⁺−q⁻|) = |q⁺| + |q⁻| (Optimum
// Structures, 1973; from memory) the single-case equivalent gives the
// multiple-load-case volume; the cases together need no more than the
// alternatives (common practice: the summed load's own optimum is at most
// the envelope's).
func TestSpaceModes(t *testing.T) {
	volumes := map[Mode]float64{}
	for _, mode := range []Mode{Alternatives, SingleEquivalent, Together} {
		p := spaceBridge(4)
		p.Cases = append(p.Cases, Case{ID: "side", Loads: []Load{{Node: -1, At: vec{1, 0.5, 0.5}, Force: vec{0, 0.5, 0}}}})
		p.Mode = mode
		l, err := Optimise(context.Background(), p, Options{}, nil)
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, l)
		volumes[mode] = l.Volume
	}
	if !scalar.EqualWithinAbsOrRel(volumes[Alternatives], volumes[SingleEquivalent], 1e-6, 1e-6) {
		t.Errorf("alternatives %.10g, single-case equivalent %.10g", volumes[Alternatives], volumes[SingleEquivalent])
	}
	if volumes[Together] > volumes[Alternatives]*(1+1e-7) {
		t.Errorf("together %.10g exceeds alternatives %.10g", volumes[Together], volumes[Alternatives])
	}
}

// TestSpaceHole checks that no member of a space layout enters a hole
// (brute-force sampling along each member) and that a hole can only cost
// material (common practice).
func TestSpaceHole(t *testing.T) {
	p := spaceBridge(8)
	p.Solid.Holes = [][][3]float64{Box(vec{0.6, 0.2, 0.1}, vec{1.4, 0.8, 0.6})}
	l, err := Optimise(context.Background(), p, Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, l)
	for _, m := range l.Members {
		a, b := l.Nodes[m.Ends[0]], l.Nodes[m.Ends[1]]
		for s := 1; s < 400; s++ {
			x := add(a, scaled(sub(b, a), float64(s)/400))
			if x[0] > 0.6+1e-9 && x[0] < 1.4-1e-9 && x[1] > 0.2+1e-9 && x[1] < 0.8-1e-9 && x[2] > 0.1+1e-9 && x[2] < 0.6-1e-9 {
				t.Fatalf("member %v–%v enters the hole at %v", a, b, x)
			}
		}
	}
	free, err := Optimise(context.Background(), spaceBridge(8), Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if l.Volume < free.Volume*(1-1e-9) {
		t.Errorf("volume with hole %g below volume without %g", l.Volume, free.Volume)
	}
	if len(l.DomainEdges) != 12 || len(l.HoleEdges) != 12 {
		t.Errorf("%d domain and %d hole edges, want 12 and 12", len(l.DomainEdges), len(l.HoleEdges))
	}
}

func add(p, q vec) vec { return vec{p[0] + q[0], p[1] + q[1], p[2] + q[2]} }

// TestSpaceCandidates counts the candidates of the 20 × 10 × 10 grid:
// 21·11·11 = 2,541 nodes and 2541·2540/2 = 3,227,070 pairs, of which
// those whose integer steps (dx, dy, dz) have gcd 1 pass through no other
// node. The count of such pairs is Σ over steps with gcd 1 of
// (21 − |dx|)(11 − |dy|)(11 − |dz|) over half the steps, computed here
// directly from that sum (common practice: a lattice pair passes through
// gcd − 1 lattice points).
func TestSpaceCandidates(t *testing.T) {
	if testing.Short() {
		t.Skip("counts 2.7 million candidates")
	}
	p := spaceBridge(20)
	dom, err := newSolid(p.Solid)
	if err != nil {
		t.Fatal(err)
	}
	g, err := buildGround(context.Background(), &p, 3, dom, Options{}.withDefaults(3))
	if err != nil {
		t.Fatal(err)
	}
	want, pairs := 0, 0
	for dx := -20; dx <= 20; dx++ {
		for dy := -10; dy <= 10; dy++ {
			for dz := -10; dz <= 10; dz++ {
				if dx == 0 && dy == 0 && dz == 0 {
					continue
				}
				n := (21 - abs(dx)) * (11 - abs(dy)) * (11 - abs(dz))
				pairs += n
				if gcd(gcd(abs(dx), abs(dy)), abs(dz)) == 1 {
					want += n
				}
			}
		}
	}
	want, pairs = want/2, pairs/2
	if len(g.nodes) != 2541 || pairs != 3227070 || g.count != want {
		t.Errorf("%d nodes, %d pairs, %d candidates; want 2541, 3227070, %d", len(g.nodes), pairs, g.count, want)
	}
	t.Logf("%d candidates of %d pairs", g.count, pairs)
}

// TestSpaceBadInput checks the refusals that name their cause.
func TestSpaceBadInput(t *testing.T) {
	for _, tc := range []struct {
		name   string
		change func(p *Problem)
		kind   fault.Kind
		path   string
		text   string
	}{
		{"load in a hole", func(p *Problem) {
			p.Solid.Holes = [][][3]float64{Box(vec{0.5, 0.25, 0.25}, vec{1.5, 0.75, 0.75})}
			p.Cases[0].Loads[0].At = vec{1, 0.5, 0.5}
		}, fault.InvalidModel, "/cases/0/loads/0/at", "inside hole 0"},
		{"support off the grid", func(p *Problem) { p.Supports[0].At = vec{0.1, 0, 0} }, fault.InvalidModel, "/supports/0/at", "the nearest node, at (0, 0, 0), is 0.1 away"},
		{"flat domain", func(p *Problem) { p.Solid.Vertices = Box(vec{0, 0, 0}, vec{2, 1, 0}) }, fault.InvalidModel, "/domain/outline", "one plane"},
		{"too many vertices", func(p *Problem) {
			for i := 0; i < 70; i++ {
				p.Solid.Vertices = append(p.Solid.Vertices, vec{1, 0.5, 0.5})
			}
		}, fault.InvalidModel, "/domain/outline", "at most 64"},
		{"dimension", func(p *Problem) { p.Dim = 4 }, fault.InvalidModel, "/dimension", "2 (a plane layout) or 3"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := spaceBridge(4)
			tc.change(&p)
			_, err := Optimise(context.Background(), p, Options{}, nil)
			fe, ok := fault.As(err)
			if !ok || fe.Kind != tc.kind {
				t.Fatalf("error %v, want kind %v", err, tc.kind)
			}
			if !strings.Contains(fe.Error(), tc.text) || len(fe.Problems) == 0 || fe.Problems[0].Path != tc.path {
				t.Errorf("error %q (%+v), want %q at %s", fe.Error(), fe.Problems, tc.text, tc.path)
			}
		})
	}
}

// TestSpaceProgressAndCancel checks that a space layout reports each
// member-adding round (the last adding nothing) and stops with the
// context's error when cancelled at the first round.
func TestSpaceProgressAndCancel(t *testing.T) {
	rec := &recorder{stages: map[string]int{}}
	l, err := Optimise(context.Background(), spaceBridge(4), Options{Rounds: rec}, rec)
	if err != nil {
		t.Fatal(err)
	}
	if len(rec.rounds) != l.Stats.Iterations || rec.rounds[len(rec.rounds)-1].Added != 0 {
		t.Errorf("%d rounds reported for %d iterations: %+v", len(rec.rounds), l.Stats.Iterations, rec.rounds)
	}
	ctx, cancel := context.WithCancel(context.Background())
	rec = &recorder{stages: map[string]int{}, cancel: cancel}
	if _, err := Optimise(ctx, spaceBridge(8), Options{Rounds: rec}, rec); !errors.Is(err, context.Canceled) {
		t.Errorf("error %v, want cancellation", err)
	}
}
