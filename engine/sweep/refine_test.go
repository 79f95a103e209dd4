package sweep

import (
	"context"
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/loadpath"
	"gusset/engine/model"
)

// metric wraps a function of the parameters as an Evaluator reporting it
// as "f".
func metric(f func(x []float64) float64) Evaluator {
	return func(_ context.Context, x []float64) (map[string]float64, error) {
		return map[string]float64{"f": f(x)}, nil
	}
}

// TestRefineKnownMinima checks 1-D refinement from a coarse sweep: the
// optimum of (x − 2)² + 1 (at 2, value 1) and x⁴ − 3x³ + 2 (at 9/4, from
// f′ = x²(4x − 9) = 0), the maximum of 5 − (x − 2)² (at 2), and x over
// [1, 3], whose optimum sits at the range edge.
func TestRefineKnownMinima(t *testing.T) {
	for _, tc := range []struct {
		name      string
		f         func(x float64) float64
		from, to  float64
		count     int
		maximise  bool
		xOpt, fOp float64
		atEdge    bool
	}{
		{"(x−2)²+1", func(x float64) float64 { return (x-2)*(x-2) + 1 }, 0, 5, 7, false, 2, 1, false},
		{"x⁴−3x³+2", func(x float64) float64 { return x*x*x*x - 3*x*x*x + 2 }, -1, 4, 6, false, 2.25, 2 - 2187.0/256, false},
		{"max 5−(x−2)²", func(x float64) float64 { return 5 - (x-2)*(x-2) }, 0, 5, 7, true, 2, 5, false},
		{"x on [1,3]", func(x float64) float64 { return x }, 1, 3, 5, false, 1, 1, true},
	} {
		values, _ := Range(tc.from, tc.to, tc.count)
		rec := &recorder{}
		plan := Plan{Axes: []Axis{{"x", values}}, Workers: 2, Objective: "f", Maximise: tc.maximise, Tolerance: 1e-7}
		res, err := Run(context.Background(), plan, metric(func(x []float64) float64 { return tc.f(x[0]) }), rec)
		if err != nil {
			t.Fatal(err)
		}
		r := res.Refinement
		if r == nil || r.Method != MethodBrent || !r.Converged || r.AtEdge != tc.atEdge ||
			!scalar.EqualWithinAbsOrRel(r.Values[0], tc.xOpt, 1e-7, 1e-7) ||
			!scalar.EqualWithinAbsOrRel(r.Objective, tc.fOp, 1e-12, 1e-12) || r.Metrics["f"] != r.Objective {
			t.Errorf("%s: %+v, want x=%g f=%g edge=%v", tc.name, r, tc.xOpt, tc.fOp, tc.atEdge)
			continue
		}
		refining := 0
		for _, s := range rec.stages {
			if s == StageRefining {
				refining++
			}
		}
		if refining != r.Evaluations || r.Evaluations == 0 {
			t.Errorf("%s: %d refining reports for %d evaluations", tc.name, refining, r.Evaluations)
		}
	}
}

// twoBarLoadPath returns the load path of the symmetric two-bar truss of
// half-span a and depth h under a central load P by package loadpath, with
// the bar forces from closed-form statics: vertical equilibrium of the
// apex gives each bar N = −P·L/(2h), L = sqrt(a² + h²), and the supports
// react with (±P·a/(2h), P/2).
func twoBarLoadPath(a, h, P float64) (float64, error) {
	if h == 0 {
		return 0, errors.New("the bars are collinear: no depth to carry the load")
	}
	m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"},
		NodeIDs: []string{"l", "r", "apex"}, Coords: []float64{-a, 0, a, 0, 0, h},
		Materials: []model.Material{{ID: "s", ElasticModulus: 1}},
		Members:   []model.Member{{ID: "a", Ends: [2]int{0, 2}}, {ID: "b", Ends: [2]int{1, 2}}}}
	n := -P * math.Hypot(a, h) / (2 * h)
	c := loadpath.Case{AxialForce: []float64{n, n},
		External: [][]float64{{P * a / (2 * h), P / 2}, {-P * a / (2 * h), P / 2}, {0, -P}}}
	res, err := loadpath.Compute(m, []loadpath.Case{c}, loadpath.Options{})
	if err != nil {
		return 0, err
	}
	return res.Cases[0].LoadPath, nil
}

// TestTwoBarDepth finds the depth of least load path of the symmetric
// two-bar truss: Z(h) = P(a² + h²)/h has Z′ = P(1 − a²/h²) = 0 at h = a
// (bars at 45°) with Z = 2Pa, a classic of optimal-truss theory
// (A. G. M. Michell, "The limits of economy of material in
// frame-structures", Phil. Mag. 8, 1904). The sweep includes h = 0, where
// the truss degenerates: that step fails and the sweep goes on.
func TestTwoBarDepth(t *testing.T) {
	for _, tc := range []struct{ a, P, from, to float64 }{
		{1.3, 10, 0, 4}, {5, 250, 0.5, 12}, {0.2, 1, 0, 3},
	} {
		depths, _ := Range(tc.from, tc.to, 9)
		eval := func(_ context.Context, x []float64) (map[string]float64, error) {
			z, err := twoBarLoadPath(tc.a, x[0], tc.P)
			return map[string]float64{"load_path": z}, err
		}
		res, err := Run(context.Background(), Plan{Axes: []Axis{{"depth", depths}}, Workers: 2, Objective: "load_path"}, eval, nil)
		if err != nil {
			t.Fatal(err)
		}
		if tc.from == 0 && (res.Failed != 1 || !res.Steps[0].Failed()) {
			t.Errorf("a=%g: the flat truss should fail in place: %+v", tc.a, res.Steps[0])
		}
		r := res.Refinement
		if !r.Converged || r.AtEdge || !scalar.EqualWithinAbsOrRel(r.Values[0], tc.a, 0, 1e-6) ||
			!scalar.EqualWithinAbsOrRel(r.Objective, 2*tc.P*tc.a, 0, 1e-12) {
			t.Errorf("a=%g: h*=%.12g Z*=%.12g after %d evaluations, want %g and %g", tc.a, r.Values[0], r.Objective, r.Evaluations, tc.a, 2*tc.P*tc.a)
		}
	}
}

// prattForces returns the member forces of the rectangular Pratt truss of
// N panels (N even) of width d and depth h with a load P at each interior
// bottom node, by the method of sections, in the order: for each panel i,
// bottom chord, top chord, diagonal; then the N + 1 verticals. With
// R = (N − 1)P/2, the shear in left-half panel i is V_i = R − iP and the
// bending moment at panel point k is M_k = P·d·k(N − k)/2. Left half (i <
// N/2): bottom chord M_i/h (tension), top chord −M_{i+1}/h, diagonal (down
// towards mid-span) V_i·L_d/h (tension), vertical i −V_i; the mid-span
// vertical carries nothing; the right half mirrors the left.
func prattForces(N int, d, h, P float64) (coords [][]float64, ends [][2]int, forces []float64) {
	for i := 0; i <= N; i++ {
		coords = append(coords, []float64{float64(i) * d, 0})
	}
	for i := 0; i <= N; i++ {
		coords = append(coords, []float64{float64(i) * d, h})
	}
	R := float64(N-1) * P / 2
	moment := func(k int) float64 { return P * d * float64(k*(N-k)) / 2 }
	shear := func(i int) float64 { // in panel i, mirrored for the right half
		if i >= N/2 {
			i = N - 1 - i
		}
		return R - float64(i)*P
	}
	top := func(i int) int { return N + 1 + i }
	ld := math.Hypot(d, h)
	for i := 0; i < N; i++ {
		// The chord of a panel meets the diagonal at the panel point
		// nearer mid-span for the top chord and farther for the bottom.
		near, far := i+1, i
		if i >= N/2 {
			near, far = i, i+1
		}
		ends = append(ends, [2]int{i, i + 1}, [2]int{top(i), top(i + 1)})
		forces = append(forces, moment(far)/h, -moment(near)/h)
		if i < N/2 {
			ends = append(ends, [2]int{top(i), i + 1})
		} else {
			ends = append(ends, [2]int{i, top(i + 1)})
		}
		forces = append(forces, shear(i)*ld/h)
	}
	for i := 0; i <= N; i++ {
		ends = append(ends, [2]int{i, top(i)})
		switch {
		case i < N/2:
			forces = append(forces, -shear(i))
		case i > N/2:
			forces = append(forces, -shear(i-1))
		default:
			forces = append(forces, 0)
		}
	}
	return coords, ends, forces
}

// TestPrattDepth finds the volume-optimal depth of a Pratt truss. Derived
// by hand (see TestPrattBySections in package loadpath for the sums): with
// equal tension and compression limits σ and no buckling, every member is
// sized at |N|/σ, so V(h) = Z(h)/σ with
//
//	Z(h) = A/h + B·h,  A = P·d²·[(N³ − N)/6 + N²/4],  B = P·N²/2,
//
// the first term from the chords and the horizontal part of the
// diagonals, the second from the verticals and the vertical part of the
// diagonals. V′(h) = 0 gives h* = sqrt(A/B) = d·sqrt((N² − 1)/(3N) + 1/2)
// and V(h*) = 2·sqrt(A·B)/σ. For N = 8 that is h* = d·sqrt(3.125).
func TestPrattDepth(t *testing.T) {
	const sigma = 2.35e5
	for _, tc := range []struct {
		N    int
		d, P float64
	}{{8, 2, 30}, {4, 3, 12}, {12, 1.5, 5}} {
		n := float64(tc.N)
		A := tc.P * tc.d * tc.d * ((n*n*n-n)/6 + n*n/4)
		B := tc.P * n * n / 2
		hStar := math.Sqrt(A / B)
		if want := tc.d * math.Sqrt((n*n-1)/(3*n)+0.5); !scalar.EqualWithinAbsOrRel(hStar, want, 0, 1e-14) {
			t.Fatalf("closed forms disagree: %g vs %g", hStar, want)
		}
		steel := model.Material{ID: "steel", ElasticModulus: 2.1e8, TensionLimit: sigma, CompressionLimit: sigma, WeightDensity: 77}
		eval := func(_ context.Context, x []float64) (map[string]float64, error) {
			coords, ends, forces := prattForces(tc.N, tc.d, x[0], tc.P)
			m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"}, Materials: []model.Material{steel}}
			for i, p := range coords {
				m.NodeIDs = append(m.NodeIDs, string(rune('a'+i%26))+string(rune('0'+i/26)))
				m.Coords = append(m.Coords, p...)
			}
			for _, e := range ends {
				m.Members = append(m.Members, model.Member{Ends: e})
			}
			res, err := loadpath.Compute(m, []loadpath.Case{{ID: "live", AxialForce: forces}}, loadpath.Options{Size: true})
			if err != nil {
				return nil, err
			}
			return map[string]float64{"volume": res.Totals.All.Volume, "mass": res.Totals.All.Mass}, nil
		}
		depths, _ := Range(0.5*tc.d, 4*tc.d, 8)
		res, err := Run(context.Background(), Plan{Axes: []Axis{{"depth", depths}}, Workers: 2, Objective: "volume"}, eval, nil)
		if err != nil {
			t.Fatal(err)
		}
		r := res.Refinement
		if !r.Converged || !scalar.EqualWithinAbsOrRel(r.Values[0], hStar, 0, 1e-6) ||
			!scalar.EqualWithinAbsOrRel(r.Objective, 2*math.Sqrt(A*B)/sigma, 0, 1e-12) {
			t.Errorf("N=%d: h*=%.10g V*=%.10g, want %.10g and %.10g", tc.N, r.Values[0], r.Objective, hStar, 2*math.Sqrt(A*B)/sigma)
		}
	}
}

// TestRefineGrid checks 2-D refinement by Nelder–Mead from the best grid
// point: Rosenbrock's function (1 − x)² + 100(y − x²)² has its minimum 0
// at (1, 1) (H. H. Rosenbrock, "An automatic method for finding the
// greatest or least value of a function", Computer Journal 3, 1960); the
// grid misses (1, 1), so the simplex must follow the curved valley. The
// bowl (x − 3)² + (y + 1)² restricted to x ≤ 2 has its constrained minimum
// 1 at (2, −1), on the bound.
func TestRefineGrid(t *testing.T) {
	rosenbrock := func(x []float64) float64 { return math.Pow(1-x[0], 2) + 100*math.Pow(x[1]-x[0]*x[0], 2) }
	bowl := func(x []float64) float64 { return math.Pow(x[0]-3, 2) + math.Pow(x[1]+1, 2) }
	xs, _ := Range(-2, 2, 8)
	ys, _ := Range(-1, 3, 8)
	for _, tc := range []struct {
		name   string
		f      func([]float64) float64
		bounds []Bound
		want   []float64
		fWant  float64
		atEdge bool
	}{
		{"rosenbrock", rosenbrock, nil, []float64{1, 1}, 0, false},
		{"bowl on a bound", bowl, []Bound{{-2, 2}, {-3, 3}}, []float64{2, -1}, 1, true},
	} {
		plan := Plan{Axes: []Axis{{"x", xs}, {"y", ys}}, Workers: 2, Objective: "f", Tolerance: 1e-9, MaxEvaluations: 2000, Bounds: tc.bounds}
		res, err := Run(context.Background(), plan, metric(tc.f), nil)
		if err != nil {
			t.Fatal(err)
		}
		r := res.Refinement
		if r.Method != MethodNelderMead || !r.Converged || r.AtEdge != tc.atEdge ||
			!scalar.EqualWithinAbsOrRel(r.Values[0], tc.want[0], 1e-5, 0) ||
			!scalar.EqualWithinAbsOrRel(r.Values[1], tc.want[1], 1e-5, 0) ||
			!scalar.EqualWithinAbsOrRel(r.Objective, tc.fWant, 1e-9, 1e-9) {
			t.Errorf("%s: %+v", tc.name, r)
		}
	}
}

// TestRefineNothing checks that refinement reports, rather than fails,
// when no step reports the objective.
func TestRefineNothing(t *testing.T) {
	values, _ := Range(0, 1, 3)
	eval := func(context.Context, []float64) (map[string]float64, error) { return nil, errors.New("mechanism") }
	res, err := Run(context.Background(), Plan{Axes: []Axis{{"x", values}}, Objective: "volume"}, eval, nil)
	if err != nil {
		t.Fatal(err)
	}
	if r := res.Refinement; r == nil || r.Message == "" || r.Values != nil || r.StartIndex != -1 || res.Failed != 3 {
		t.Errorf("%+v", r)
	}
}
