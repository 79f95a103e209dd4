package formfind

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// TestHangingChain checks the chain of n equal horizontal panels of width d
// under equal loads P at its n − 1 inner nodes, supports at equal height.
// Closed form (derived here; statics of a funicular polygon, e.g. J.
// Heyman, "The Stone Skeleton", Cambridge 1995, ch. 2, from memory): with
// the same force density q in every member, the horizontal equilibrium
// q(xᵢ₊₁ − 2xᵢ + xᵢ₋₁) = 0 keeps the nodes at xᵢ = i·d, and the vertical one
// q(yᵢ₊₁ − 2yᵢ + yᵢ₋₁) = P, whose second difference is constant, has with
// y₀ = yₙ = 0 the solution yᵢ = (P/2q)·i·(i − n) (its second difference is
// (P/2q)·2 = P/q). The sag at midspan (i = n/2) is Pn²/(8q), the horizontal
// force q·d. With q < 0 the same formula gives the arch above the supports
// (the negative definite case).
func TestHangingChain(t *testing.T) {
	for _, tc := range []struct {
		n     int
		d, P  float64
		q     float64
		sag   float64
		label string
	}{
		{n: 2, d: 1, P: 10, q: 5},
		{n: 8, d: 1.5, P: 3, q: 2},
		{n: 16, d: 0.5, P: 1, q: 0.25},
		{n: 8, d: 1.5, P: 3, q: -2},
		{n: 64, d: 0.25, P: 2, q: 40},
	} {
		t.Run(fmt.Sprintf("n=%d,q=%g", tc.n, tc.q), func(t *testing.T) {
			m := chain(tc.n, tc.d, tc.P).compile(t)
			r := find(t, m, Problem{ForceDensity: one(tc.q)})
			for i := 0; i <= tc.n; i++ {
				x, y := r.Coords[2*i], r.Coords[2*i+1]
				wantY := tc.P / (2 * tc.q) * float64(i) * float64(i-tc.n)
				if !scalar.EqualWithinAbsOrRel(x, float64(i)*tc.d, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(y, wantY, 1e-12, 1e-11) {
					t.Errorf("node %d at (%.15g, %.15g), want (%g, %.15g)", i, x, y, float64(i)*tc.d, wantY)
				}
			}
			if tc.n%2 == 0 {
				sag := -r.Coords[2*(tc.n/2)+1]
				if want := tc.P * float64(tc.n*tc.n) / (8 * tc.q); !scalar.EqualWithinAbsOrRel(sag, want, 1e-12, 1e-11) {
					t.Errorf("sag %.15g, want Pn²/(8q) = %.15g", sag, want)
				}
			}
			if r.Sign != math.Copysign(1, tc.q) {
				t.Errorf("sign %g for q = %g", r.Sign, tc.q)
			}
			// The supports take the horizontal force q·d (inward for a
			// chain, outward for an arch) and half the load each.
			left := r.Reactions[0]
			if !scalar.EqualWithinAbsOrRel(left[0], -tc.q*tc.d, 1e-12, 1e-11) || !scalar.EqualWithinAbsOrRel(left[1], tc.P*float64(tc.n-1)/2, 1e-12, 1e-11) {
				t.Errorf("left reaction %v, want (%g, %g)", left, -tc.q*tc.d, tc.P*float64(tc.n-1)/2)
			}
			checkResidual(t, r)
		})
	}
}

func checkResidual(t *testing.T, r *Result) {
	t.Helper()
	// Round-off: a residual of a few ε per node.
	if r.Residual > 1e-12 {
		t.Errorf("equilibrium residual %.3g, want round-off", r.Residual)
	}
}

// TestThroughCrown checks the thrust line through three points: the chain
// of TestHangingChain with its middle node sent to the crown height f
// above the supports. From its closed form the crown is at −Pn²/(8q), so
// the force density that puts it at +f is q = −Pn²/(8f) (compression).
func TestThroughCrown(t *testing.T) {
	for _, n := range []int{2, 6, 20} {
		const d, P, f = 2.0, 5.0, 3.0
		m := chain(n, d, P).compile(t)
		crown := fmt.Sprintf("c%d", n/2)
		r := find(t, m, Problem{ForceDensity: one(1), Through: &Through{Node: crown, At: []float64{float64(n/2) * d, f}}})
		want := -P * float64(n*n) / (8 * f)
		for e, q := range r.ForceDensity {
			if !scalar.EqualWithinAbsOrRel(q, want, 1e-12, 1e-12) {
				t.Fatalf("n=%d: member %d has q = %.15g, want −Pn²/(8f) = %.15g", n, e, q, want)
			}
		}
		if !scalar.EqualWithinAbsOrRel(r.Scale, want, 1e-12, 1e-12) || r.ThroughMisfit > 1e-12 {
			t.Errorf("n=%d: scale %g misfit %g", n, r.Scale, r.ThroughMisfit)
		}
		if y := r.Coords[2*(n/2)+1]; !scalar.EqualWithinAbsOrRel(y, f, 1e-12, 1e-12) {
			t.Errorf("n=%d: crown at %.15g, want %g", n, y, f)
		}
		checkResidual(t, r)
	}
}

// TestSquareNet checks a square cable net of 5 × 5 nodes at unit spacing
// with its 16 border nodes fixed at z = 0 and equal loads P (down) at the
// 9 inner nodes, every member with force density q. By symmetry the inner
// nodes stay at their grid positions in plan and take three heights: a at
// the four nodes next to two border nodes, b at the four next to one, c at
// the centre. Vertical equilibrium, Σ q(zⱼ − zᵢ) = P at each (hand
// solution, this comment): 2b − 4a = P/q, 2a + c − 4b = P/q, 4b − 4c = P/q,
// whence b = −7P/(8q), a = −11P/(16q), c = −9P/(8q). Checked: −7/4 + 11/4 = 1,
// −11/8 − 9/8 + 28/8 = 1, −7/2 + 9/2 = 1.
func TestSquareNet(t *testing.T) {
	const P, q = 6.0, 1.5
	b := newSpec(3)
	id := func(i, j int) string { return fmt.Sprintf("n%d_%d", i, j) }
	for i := 0; i < 5; i++ {
		for j := 0; j < 5; j++ {
			b.node(id(i, j), float64(i), float64(j), 0.1*float64(i*j)) // a start away from the answer
			if i == 0 || j == 0 || i == 4 || j == 4 {
				b.s.Nodes[len(b.s.Nodes)-1].At[2] = model.Num(0)
				b.fix(id(i, j))
			} else {
				b.load(id(i, j), 0, 0, -P)
			}
			if i > 0 {
				b.member(id(i-1, j), id(i, j))
			}
			if j > 0 {
				b.member(id(i, j-1), id(i, j))
			}
		}
	}
	m := b.compile(t)
	r := find(t, m, Problem{ForceDensity: one(q)})
	a, bb, c := -11*P/(16*q), -7*P/(8*q), -9*P/(8*q)
	want := map[[2]int]float64{{1, 1}: a, {1, 3}: a, {3, 1}: a, {3, 3}: a, {2, 1}: bb, {1, 2}: bb, {3, 2}: bb, {2, 3}: bb, {2, 2}: c}
	for ij, z := range want {
		k := ij[0]*5 + ij[1]
		got := r.Coords[3*k : 3*k+3]
		if !scalar.EqualWithinAbsOrRel(got[0], float64(ij[0]), 1e-13, 1e-13) || !scalar.EqualWithinAbsOrRel(got[1], float64(ij[1]), 1e-13, 1e-13) ||
			!scalar.EqualWithinAbsOrRel(got[2], z, 1e-13, 1e-13) {
			t.Errorf("node %v at %v, want z = %g", ij, got, z)
		}
	}
	checkResidual(t, r)
}

// TestBarrelVault checks a 3D compression vault against the 2D thrust line
// of its central section. Seven arches of n panels span x ∈ [0, n·d] at
// y = 0, s, …, 6s, joined by longitudinal members; the springing lines and
// the two gable arches are fixed, the gables at the closed-form thrust line
// of TestHangingChain (yᵢ = −(P/2q)·i·(n − i) with q < 0, here as heights
// z). Every inner arch carries the same loads, so the 3D network is
// satisfied by every arch on the 2D thrust line with the longitudinal
// members straight along y, and by uniqueness (−D is positive definite)
// that is the form. The central arch must then have the closed-form heights
// and its springing must take the 2D horizontal thrust H = |q|·d.
func TestBarrelVault(t *testing.T) {
	const n, d, s, P, q, qLong = 10, 1.2, 2.0, 4.0, -8.0, -3.0
	b := newSpec(3)
	id := func(i, j int) string { return fmt.Sprintf("v%d_%d", i, j) }
	height := func(i int) float64 { return P / (2 * q) * float64(i) * float64(i-n) }
	var densities []model.Value
	for j := 0; j <= 6; j++ {
		for i := 0; i <= n; i++ {
			gable := j == 0 || j == 6
			z := 0.0
			if gable {
				z = height(i)
			}
			b.node(id(i, j), float64(i)*d, float64(j)*s, z)
			switch {
			case i == 0 || i == n || gable:
				b.fix(id(i, j))
			default:
				b.load(id(i, j), 0, 0, -P)
			}
			if i > 0 {
				b.member(id(i-1, j), id(i, j))
				densities = append(densities, model.Num(q))
			}
			if j > 0 {
				b.member(id(i, j-1), id(i, j))
				densities = append(densities, model.Num(qLong))
			}
		}
	}
	m := b.compile(t)
	r := find(t, m, Problem{ForceDensities: densities})
	if r.Sign != -1 {
		t.Errorf("sign %g, want −1 (compression)", r.Sign)
	}
	for i := 0; i <= n; i++ {
		k := 3*(n+1) + i // the central arch, j = 3
		got := r.Coords[3*k : 3*k+3]
		if !scalar.EqualWithinAbsOrRel(got[0], float64(i)*d, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(got[1], 3*s, 1e-12, 1e-12) ||
			!scalar.EqualWithinAbsOrRel(got[2], height(i), 1e-12, 1e-12) {
			t.Errorf("central arch node %d at %v, want (%g, %g, %g)", i, got, float64(i)*d, 3*s, height(i))
		}
	}
	springing := r.Reactions[3*(n+1)]
	if H := -q * d; !scalar.EqualWithinAbsOrRel(springing[0], H, 1e-12, 1e-12) || math.Abs(springing[1]) > 1e-13*math.Abs(springing[2]) {
		t.Errorf("springing reaction %v, want the horizontal thrust %g (inward on the node) and none along y", springing, H)
	}
	checkResidual(t, r)
}

// TestMixedSigns checks the indefinite and singular cases: one free node
// between two members has D = q₁ + q₂, singular for q₂ = −q₁ and
// definite (positive) for q₁ = 2, q₂ = −1.
func TestMixedSigns(t *testing.T) {
	m := chain(2, 1, 1).compile(t)
	_, err := Find(t.Context(), m, Problem{ForceDensities: []model.Value{model.Num(1), model.Num(-1)}}, Options{})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.Unstable {
		t.Fatalf("got %v, want an unstable fault", err)
	}
	var node, member bool
	for _, p := range fe.Problems {
		node = node || p.Path == "/model/nodes/1"
		member = member || p.Path == "/force_densities/1"
	}
	if !node || !member {
		t.Errorf("problems %v, want /model/nodes/1 and /force_densities/1", fe.Problems)
	}
	// q₁ = 2, q₂ = −1, load (0, −1): Σ q(xⱼ − xᵢ) + p = 0 reads
	// 2(0 − x) − (2 − x) = 0 in x, so x = −2, and 2(0 − y) − (0 − y) − 1 = 0
	// in y, so y = −1.
	r := find(t, m, Problem{ForceDensities: []model.Value{model.Num(2), model.Num(-1)}})
	if !scalar.EqualWithinAbsOrRel(r.Coords[2], -2, 1e-14, 1e-14) || !scalar.EqualWithinAbsOrRel(r.Coords[3], -1, 1e-14, 1e-14) {
		t.Errorf("node at (%g, %g), want (−2, −1)", r.Coords[2], r.Coords[3])
	}
	checkResidual(t, r)
}

// TestBadInput checks that bad requests fail with a pointer to the cause.
func TestBadInput(t *testing.T) {
	m := chain(4, 1, 1).compile(t)
	length := 2.0
	for _, tc := range []struct {
		name string
		p    Problem
		kind fault.Kind
		path string
	}{
		{"no density", Problem{}, fault.MissingData, "/force_density"},
		{"short", Problem{ForceDensities: []model.Value{model.Num(1)}}, fault.InvalidModel, "/force_densities"},
		{"bad expression", Problem{ForceDensity: &model.Value{Expr: "nosuch*2", IsExpr: true}}, fault.Expression, "/force_density"},
		{"unknown case", Problem{ForceDensity: one(1), Case: "wind"}, fault.UnknownCase, "/case"},
		{"fixed through", Problem{ForceDensity: one(1), Through: &Through{Node: "c0", At: []float64{0, 1}}}, fault.InvalidModel, "/through/node"},
		{"both", Problem{ForceDensity: one(1), Through: &Through{Node: "c2", At: []float64{2, 1}}, Targets: []Target{{Member: "m0", Length: &length}}}, fault.InvalidModel, "/targets"},
		{"unknown member", Problem{ForceDensity: one(1), Targets: []Target{{Member: "zz", Length: &length}}}, fault.InvalidModel, "/targets/0/member"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Find(t.Context(), m, tc.p, Options{})
			fe, ok := fault.As(err)
			if !ok || fe.Kind != tc.kind || len(fe.Problems) == 0 || fe.Problems[0].Path != tc.path {
				t.Fatalf("got %v, want kind %v at %s", err, tc.kind, tc.path)
			}
		})
	}
}

// TestExpressionDensities gives per-member force densities as expressions
// over the model's parameters and checks them against the chain's closed
// form with the parameter's value: q = 2·k with k = 1.5 in every member
// gives yᵢ = (P/2q)·i·(i − n).
func TestExpressionDensities(t *testing.T) {
	const n, P = 6, 3.0
	b := chain(n, 1, P)
	b.s.Parameters = []model.ParameterSpec{{Name: "k", Value: 1.5}}
	var qs []model.Value
	for range n {
		qs = append(qs, model.Expr("2*k"))
	}
	m := b.compile(t)
	r := find(t, m, Problem{ForceDensities: qs})
	for i := 0; i <= n; i++ {
		if want := P / (2 * 3) * float64(i*(i-n)); !scalar.EqualWithinAbsOrRel(r.Coords[2*i+1], want, 1e-13, 1e-13) {
			t.Errorf("node %d at height %g, want %g", i, r.Coords[2*i+1], want)
		}
	}
}

// TestThroughUnreachable asks the chain's middle node to pass through a
// point off its vertical: with vertical loads the free nodes keep their
// abscissae (TestHangingChain), so only the height is met, and the
// horizontal distance left must be reported with a warning at /through/at.
func TestThroughUnreachable(t *testing.T) {
	m := chain(4, 1, 10).compile(t)
	r := find(t, m, Problem{ForceDensity: one(1), Through: &Through{Node: "c2", At: []float64{2.5, 2}}})
	if !scalar.EqualWithinAbsOrRel(r.ThroughMisfit, 0.5, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(r.Coords[5], 2, 1e-12, 1e-12) {
		t.Errorf("misfit %g, crown height %g; want 0.5 and 2", r.ThroughMisfit, r.Coords[5])
	}
	if len(r.Warnings) != 1 || r.Warnings[0].Path != "/through/at" {
		t.Errorf("warnings %v, want one at /through/at", r.Warnings)
	}
}
