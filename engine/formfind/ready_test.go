package formfind

import (
	"context"
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/loadpath"
	"gusset/engine/model"
	"gusset/engine/stiffness"
	"gusset/engine/sweep"
)

// externals returns, per node, the load plus the reaction of a found form.
func externals(r *Result) [][]float64 {
	out := make([][]float64, len(r.Loads))
	for i := range out {
		out[i] = make([]float64, r.Dim)
		for k := range out[i] {
			out[i][k] = r.Loads[i][k] + r.Reactions[i][k]
		}
	}
	return out
}

// TestReadyModelMaxwell checks Maxwell's load-path theorem, Σ N·L = Σ F·r
// over loads and reactions (J. C. Maxwell, "On reciprocal figures, frames,
// and diagrams of forces", Trans. Royal Society of Edinburgh 26, 1870), to
// round-off on the ready model of a found 3D net with self-weight, a tension
// chain and a thrust line, through engine/loadpath on the compiled ready
// model.
func TestReadyModelMaxwell(t *testing.T) {
	net := grid(8, 2)
	density := model.Num(500.0)
	net.s.Materials[0].WeightDensity = &density
	net.s.LoadCases[0].SelfWeight = true
	for _, tc := range []struct {
		name string
		b    *specBuilder
		p    Problem
	}{
		{"net", net, Problem{ForceDensity: one(3)}},
		{"chain", chain(12, 0.7, 3), Problem{ForceDensity: one(2)}},
		{"arch", chain(12, 0.7, 3), Problem{ForceDensity: one(1), Through: &Through{Node: "c6", At: []float64{4.2, 3}}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := tc.b.compile(t)
			r := find(t, m, tc.p)
			ready := r.Ready(tc.b.s)
			rm, err := model.Compile(ready.Spec)
			if err != nil {
				t.Fatal(err)
			}
			lp, err := loadpath.Compute(rm, []loadpath.Case{{ID: ready.Case, AxialForce: r.Force, External: externals(r)}}, loadpath.Options{})
			if err != nil {
				t.Fatal(err)
			}
			if c := lp.Cases[0]; c.RelativeResidual > 1e-13 {
				t.Errorf("Maxwell residual %.3g (Z_T %g, Z_C %g, M %g)", c.RelativeResidual, c.TensionLoadPath, c.CompressionLoadPath, c.Constant)
			}
			for e := range r.Length {
				if !scalar.EqualWithinAbsOrRel(rm.Length(e), r.Length[e], 1e-14, 1e-13) {
					t.Fatalf("member %d: ready length %g, found %g", e, rm.Length(e), r.Length[e])
				}
			}
		})
	}
}

// TestReadyModelSolves solves the ready model of a thrust line with the
// direct stiffness method (engine/stiffness) with members as beams of very
// large axial stiffness. A funicular arch whose members do not shorten
// carries its loads by axial force alone: the funicular forces with zero
// moments satisfy equilibrium and compatibility, so the elastic solution
// tends to them as EA/(EI/L²) grows (J. Heyman, "The Stone Skeleton", 1995,
// ch. 2, from memory; the error is of order EI/(EA·L²)).
func TestReadyModelSolves(t *testing.T) {
	b := chain(8, 1, 10)
	for i := range b.s.Members {
		b.s.Members[i].Type = "beam"
	}
	second := model.Num(1e-6)
	b.s.Sections[0].SecondMoment = &second
	b.s.Materials[0].ElasticModulus = model.Num(1e13)
	b.s.Sections[0].Area = model.Num(1)
	m := b.compile(t)
	r := find(t, m, Problem{ForceDensity: one(1), Through: &Through{Node: "c4", At: []float64{4, 2.5}}})
	ready := r.Ready(b.s)
	rm, err := model.Compile(ready.Spec)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := stiffness.Solve(context.Background(), rm, stiffness.Options{Cases: []string{ready.Case}})
	if err != nil {
		t.Fatal(err)
	}
	for e, n := range sol.Cases[0].AxialForce {
		if !scalar.EqualWithinAbsOrRel(n, r.Force[e], 1e-9, 1e-6) {
			t.Errorf("member %d: stiffness %g, form finding %g", e, n, r.Force[e])
		}
	}
}

// TestLeastMaterialRise sweeps the crown height f of a thrust line of n
// panels of width d under loads P (engine/sweep, refined by Brent's method)
// with the load path of the found form as the objective, and checks the
// optimum against its closed form, derived here. The arch has heights
// yᵢ = 4f·i(n − i)/n² and horizontal thrust H = Pn²d/(8f) (TestThroughCrown
// with |q| = Pn²/(8f), H = |q|·d); every member is in compression, so by
// Maxwell's theorem the load path is Z = −M = P·Σyᵢ + H·n·d, the loads
// contributing −P·yᵢ and the far support's horizontal reaction −H at
// x = n·d. With Σᵢ i(n − i) = n(n² − 1)/6, Z(f) = 2Pf(n² − 1)/(3n) + Pn³d²/(8f),
// least at f* = (n²d/4)·√(3/(n² − 1)), which tends to √3/4 of the span.
func TestLeastMaterialRise(t *testing.T) {
	const n, d, P = 10, 1.5, 4.0
	b := chain(n, d, P)
	m := b.compile(t)
	crown := fmt.Sprintf("c%d", n/2)
	eval := func(ctx context.Context, values []float64) (map[string]float64, error) {
		r, err := Find(ctx, m, Problem{ForceDensity: one(-1), Through: &Through{Node: crown, At: []float64{n / 2 * d, values[0]}}}, Options{})
		if err != nil {
			return nil, err
		}
		ready := r.Ready(b.s)
		rm, err := model.Compile(ready.Spec)
		if err != nil {
			return nil, err
		}
		lp, err := loadpath.Compute(rm, []loadpath.Case{{ID: ready.Case, AxialForce: r.Force, External: externals(r)}}, loadpath.Options{})
		if err != nil {
			return nil, err
		}
		return map[string]float64{"load_path": lp.Cases[0].LoadPath}, nil
	}
	values, _ := sweep.Range(1, 12, 12)
	res, err := sweep.Run(context.Background(), sweep.Plan{Axes: []sweep.Axis{{Name: "rise", Values: values}}, Objective: "load_path", Tolerance: 1e-9}, eval, nil)
	if err != nil {
		t.Fatal(err)
	}
	want := n * n * d / 4 * math.Sqrt(3.0/(n*n-1))
	got := res.Refinement.Values[0]
	if !scalar.EqualWithinAbsOrRel(got, want, 1e-6, 1e-6) {
		t.Errorf("least-material rise %.9g, want (n²d/4)·√(3/(n²−1)) = %.9g", got, want)
	}
	zWant := 2*P*want*(n*n-1)/(3*n) + P*n*n*n*d*d/(8*want)
	if !scalar.EqualWithinAbsOrRel(res.Refinement.Objective, zWant, 1e-9, 1e-9) {
		t.Errorf("least load path %.12g, want %.12g", res.Refinement.Objective, zWant)
	}
	t.Logf("least-material rise %.6f (span %g, f/l = %.4f), load path %.6f", got, n*d, got/(n*d), res.Refinement.Objective)
}

// TestReadySizing checks the sizing of the ready model, A = |N|/limit
// (stress design; common practice), and that a material without the limit
// its members need is reported, not sized.
func TestReadySizing(t *testing.T) {
	b := chain(6, 1, 5)
	limit := model.Num(2.5e5)
	b.s.Materials[0].TensionLimit = &limit
	m := b.compile(t)
	r := find(t, m, Problem{ForceDensity: one(4)})
	ready := r.Ready(b.s)
	rm, err := model.Compile(ready.Spec)
	if err != nil {
		t.Fatal(err)
	}
	if ready.Sized != len(m.Members) {
		t.Errorf("%d members sized, want %d", ready.Sized, len(m.Members))
	}
	for e, mem := range rm.Members {
		if a := rm.Sections[mem.Section].Area; !scalar.EqualWithinAbsOrRel(a, r.Force[e]/2.5e5, 1e-15, 1e-14) {
			t.Errorf("member %d: area %g, want %g", e, a, r.Force[e]/2.5e5)
		}
	}
	arch := find(t, m, Problem{ForceDensity: one(-4)}).Ready(b.s)
	if arch.Sized != 0 || len(arch.Warnings) != 1 || arch.Warnings[0].Path != "/model/materials/0/compression_limit" {
		t.Errorf("arch without a compression limit: sized %d, warnings %v", arch.Sized, arch.Warnings)
	}
}

// TestRiseParameter checks the parameter the ready model of a thrust line
// carries: set to another height, it must give the form that Find puts
// through that height (Schek's solution for force densities q/t is
// h + t·l, linear in t), here against the closed form of TestThroughCrown,
// yᵢ = 4f·i(n − i)/n².
func TestRiseParameter(t *testing.T) {
	const n, d, P = 6, 1.0, 2.0
	b := chain(n, d, P)
	m := b.compile(t)
	r := find(t, m, Problem{ForceDensity: one(-1), Through: &Through{Node: "c3", At: []float64{3, 1.5}}})
	ready := r.Ready(b.s)
	if ready.Parameter != "rise" {
		t.Fatalf("parameter %q", ready.Parameter)
	}
	rm, err := model.Compile(ready.Spec)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range []float64{1.5, 0.7, 4} {
		moved, err := rm.WithParameters(map[string]float64{"rise": f})
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i <= n; i++ {
			want := 4 * f * float64(i*(n-i)) / (n * n)
			if got := moved.Coords[2*i+1]; !scalar.EqualWithinAbsOrRel(got, want, 1e-13, 1e-13) || !scalar.EqualWithinAbsOrRel(moved.Coords[2*i], float64(i)*d, 1e-13, 1e-13) {
				t.Errorf("rise %g: node %d at (%g, %g), want (%g, %g)", f, i, moved.Coords[2*i], got, float64(i)*d, want)
			}
		}
	}
}
