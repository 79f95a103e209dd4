package modes

import (
	"context"
	"math"
	"testing"

	"gusset/engine/model"
)

// column returns a vertical 2D beam column of length L in elements
// elements under a unit compressive load at its top, with the base and
// top held as the case says: "pinned" (pinned base, top guided in y),
// "cantilever" (fixed base, free top), "fixed-pinned", "fixed-fixed"
// (top guided: x and the rotation held).
func column(ends string, L float64, elements int) *model.Model {
	b := newTestModel(2)
	nodes := b.line([]float64{0, 0}, []float64{0, L}, elements, model.Beam)
	base, top := nodes[0], nodes[len(nodes)-1]
	switch ends {
	case "pinned":
		b.fix(base, model.X, model.Y)
		b.fix(top, model.X)
	case "cantilever":
		b.fix(base, model.X, model.Y, model.RZ)
	case "fixed-pinned":
		b.fix(base, model.X, model.Y, model.RZ)
		b.fix(top, model.X)
	case "fixed-fixed":
		b.fix(base, model.X, model.Y, model.RZ)
		b.fix(top, model.X, model.RZ)
	}
	b.load(top, 0, -1)
	return b.m
}

// TestEulerColumns checks the lowest critical load of the four classic
// columns against Euler's π²EI/(KL)² with the effective-length factors K
// = 1, 2, 0.6992 (π/4.4934, the root of tan x = x) and 0.5 (S. P.
// Timoshenko and J. M. Gere, "Theory of Elastic Stability", 2nd ed.,
// McGraw-Hill 1961, §2.1–2.5; from memory), and that the error of the
// cubic elements falls as h⁴ (the eigenvalue error of an element of
// degree 3 for a fourth-order problem, O(h^{2(p+1−m)}) with p = 3, m = 2:
// G. Strang and G. J. Fix, "An Analysis of the Finite Element Method",
// Prentice-Hall 1973, §6.3; from memory).
func TestEulerColumns(t *testing.T) {
	const L = 5.0
	cases := []struct {
		ends string
		k    float64
	}{
		{"pinned", 1},
		{"cantilever", 2},
		{"fixed-pinned", math.Pi / 4.493409457909064},
		{"fixed-fixed", 0.5},
	}
	for _, c := range cases {
		t.Run(c.ends, func(t *testing.T) {
			euler := math.Pi * math.Pi * testE * testI / (c.k * L * c.k * L)
			var errs []float64
			for _, n := range []int{2, 4, 8, 16} {
				res, err := Buckling(context.Background(), column(c.ends, L, n), Options{Count: 2})
				if err != nil {
					t.Fatal(err)
				}
				if !res.HasCritical {
					t.Fatalf("n=%d: no positive factor", n)
				}
				rel := (res.Critical - euler) / euler
				if rel < -1e-12 {
					t.Errorf("n=%d: %g below Euler's %g: the cubic element is an upper bound", n, res.Critical, euler)
				}
				errs = append(errs, rel)
				t.Logf("n=%d: %.10g (Euler %.10g, %.3g)", n, res.Critical, euler, rel)
				if res.Modes[0].Residual > 1e-8 {
					t.Errorf("n=%d: residual %g", n, res.Modes[0].Residual)
				}
			}
			if errs[3] > 5e-5 {
				t.Errorf("16 elements: %.3g relative error, want ≤ 5e-5", errs[3])
			}
			// From 4 elements on (with 2, the fixed-fixed column's full
			// wave is not yet resolved).
			for i := 1; i+1 < len(errs); i++ {
				if rate := errs[i] / errs[i+1]; rate < 12 || rate > 20 {
					t.Errorf("error ratio from %d to %d elements %.2f, want about 16 (h⁴)", 2<<i, 4<<i, rate)
				}
			}
		})
	}
}

// TestPortalSway checks the sway buckling of a portal frame with pinned
// bases, columns and beam of the same EI, height h and span b, under
// equal loads P on the column heads: the columns buckle when k·h·tan(k·h)
// = 6·(I_b/b)/(I_c/h), k = √(P/EI), the rotational restraint of the beam
// bent in double curvature being 6EI_b/b (Timoshenko and Gere 1961, §2.8,
// slope-deflection; from memory). The root is found here by bisection.
func TestPortalSway(t *testing.T) {
	const h, span, elements = 4.0, 6.0, 8
	b := newTestModel(2)
	// Members all but rigid in their axes, as slope-deflection assumes.
	b.m.Sections[0].Area = 1e4
	left := b.line([]float64{0, 0}, []float64{0, h}, elements, model.Beam)
	right := b.line([]float64{span, 0}, []float64{span, h}, elements, model.Beam)
	headL, headR := left[elements], right[elements]
	prev := headL
	for k := 1; k <= elements; k++ {
		next := headR
		if k < elements {
			next = b.node(span*float64(k)/elements, h)
		}
		b.member(model.Beam, prev, next)
		prev = next
	}
	b.fix(left[0], model.X, model.Y)
	b.fix(right[0], model.X, model.Y)
	b.load(headL, 0, -1)
	b.load(headR, 0, -1)
	res, err := Buckling(context.Background(), b.m, Options{Count: 3})
	if err != nil {
		t.Fatal(err)
	}
	target := 6 * h / span
	lo, hi := 0.0, math.Pi/2
	for range 200 {
		mid := (lo + hi) / 2
		if mid*math.Tan(mid) < target {
			lo = mid
		} else {
			hi = mid
		}
	}
	kh := (lo + hi) / 2
	want := kh * kh * testE * testI / (h * h)
	if rel := math.Abs(res.Critical-want) / want; rel > 2e-5 {
		t.Errorf("sway factor %.6g, slope-deflection %.6g (%.2g relative)", res.Critical, want, rel)
	}
	// The sway mode moves the heads sideways together.
	d := res.Modes[0].Displacements
	if d[headL][0]*d[headR][0] <= 0 {
		t.Errorf("first mode is not a sway: head motions %g, %g", d[headL][0], d[headR][0])
	}
}

// TestColumn3D checks a 3D pinned column whose section is twice as stiff
// about one axis: its first two factors are Euler's loads about the weak
// and the strong axis, π²EI/L² (Timoshenko and Gere 1961, §2.1; from
// memory), and a third, its torsional buckling load GJ·A/(Iy + Iz) of a
// doubly symmetric section with the twist held at its ends (ibid. §5.3,
// warping neglected; from memory) when that is lower still.
func TestColumn3D(t *testing.T) {
	const L, elements = 5.0, 16
	b := newTestModel(3)
	sec := &b.m.Sections[0]
	sec.SecondMoment, sec.SecondMomentY, sec.TorsionConstant = testI, 2*testI, 1e-7
	nodes := b.line([]float64{0, 0, 0}, []float64{0, 0, L}, elements, model.Beam)
	b.fix(nodes[0], model.X, model.Y, model.Z, model.RZ)
	b.fix(nodes[elements], model.X, model.Y, model.RZ)
	b.load(nodes[elements], 0, 0, -1)
	res, err := Buckling(context.Background(), b.m, Options{Count: 3})
	if err != nil {
		t.Fatal(err)
	}
	euler := math.Pi * math.Pi * testE * testI / (L * L)
	torsion := testE / 2.6 * 1e-7 * testA / (3 * testI)
	want := []float64{euler, min(2*euler, torsion), max(2*euler, torsion)}
	for k, w := range want {
		if rel := math.Abs(res.Modes[k].Factor-w) / w; rel > 1e-4 {
			t.Errorf("mode %d: %.6g, want %.6g (%.2g)", k+1, res.Modes[k].Factor, w, rel)
		}
	}
}

// TestLoadReversal checks that a column pulled by its load reports the
// Euler load with a negative factor, marked as a reversal.
func TestLoadReversal(t *testing.T) {
	m := column("pinned", 5, 8)
	m.Cases[0].Nodal[0].Force[1] = 1
	res, err := Buckling(context.Background(), m, Options{Count: 1})
	if err != nil {
		t.Fatal(err)
	}
	euler := math.Pi * math.Pi * testE * testI / 25
	md := res.Modes[0]
	if !md.LoadReversal || math.Abs(-md.Factor-euler)/euler > 1e-3 || res.HasCritical {
		t.Errorf("factor %g (reversal %v, critical %v), want −%g", md.Factor, md.LoadReversal, res.HasCritical, euler)
	}
}

// TestAboveShift checks that AboveShift finds the least positive factor
// where load reversals lie nearer zero: two separate pinned columns, a
// 5 m one pushed by the load (Euler load π²EI/25 as its factor) and a
// 20 m one pulled by it (reversals at −k²·π²EI/400, the first three
// nearer zero than π²EI/25) (S. P. Timoshenko and J. M. Gere, "Theory of
// Elastic Stability", 2nd ed., McGraw-Hill 1961, §2.1; from memory).
func TestAboveShift(t *testing.T) {
	b := newTestModel(2)
	short := b.line([]float64{0, 0}, []float64{0, 5}, 8, model.Beam)
	long := b.line([]float64{3, 0}, []float64{3, 20}, 24, model.Beam)
	for _, c := range [][]int{short, long} {
		b.fix(c[0], model.X, model.Y)
		b.fix(c[len(c)-1], model.X)
	}
	b.load(short[len(short)-1], 0, -1)
	b.load(long[len(long)-1], 0, 1)
	euler := math.Pi * math.Pi * testE * testI
	nearest, err := Buckling(context.Background(), b.m, Options{Count: 3})
	if err != nil {
		t.Fatal(err)
	}
	for k, md := range nearest.Modes {
		want := -float64((k+1)*(k+1)) * euler / 400
		if rel := math.Abs(md.Factor-want) / -want; rel > 1e-3 || nearest.HasCritical {
			t.Errorf("nearest zero, mode %d: %g (critical %v), want the reversal %g", k+1, md.Factor, nearest.HasCritical, want)
		}
	}
	above, err := Buckling(context.Background(), b.m, Options{Count: 1, AboveShift: true})
	if err != nil {
		t.Fatal(err)
	}
	if want := euler / 25; !above.HasCritical || math.Abs(above.Critical-want)/want > 1e-3 {
		t.Errorf("above the shift: critical %g (found %v), want Euler's %g", above.Critical, above.HasCritical, want)
	}
}
