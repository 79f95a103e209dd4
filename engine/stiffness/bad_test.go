package stiffness

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// square returns a unit square of bars on a pin (n0) and a roller (n1),
// loaded sideways at n3, with extra members between the listed corners.
func square(extra ...[2]int) *builder {
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	for _, p := range [][2]float64{{0, 0}, {1, 0}, {1, 1}, {0, 1}} {
		b.node(p[0], p[1])
	}
	for _, e := range append([][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}}, extra...) {
		b.bar(e[0], e[1])
	}
	b.fix(0, pinned2...)
	b.fix(1, model.Y)
	b.force(3, [3]float64{1, 0}, [3]float64{})
	return b
}

// TestMechanismSquare checks that a square without a diagonal is refused
// as a mechanism naming the freedoms that move: by inextensibility of the
// bars (first order) only the top joints move, both sideways equally, so
// the unit mode is x = 1/√2 at n2 and n3 (the sway of a four-bar linkage,
// Pellegrino 1993, from memory).
func TestMechanismSquare(t *testing.T) {
	for _, path := range []Path{Dense, Sparse} {
		_, err := Solve(context.Background(), square().m, Options{Path: path})
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.Unstable {
			t.Fatalf("%s: error %v, want an unstable structure", path, err)
		}
		for _, name := range []string{`node "n2" x`, `node "n3" x`} {
			if !strings.Contains(fe.Message, name) {
				t.Errorf("%s: message %q does not name %s", path, fe.Message, name)
			}
		}
		if len(fe.Problems) != 2 || fe.Problems[0].Path != "/nodes/2" || fe.Problems[1].Path != "/nodes/3" {
			t.Errorf("%s: problems %+v, want /nodes/2 and /nodes/3", path, fe.Problems)
		}
		mech, ok := fe.Detail.(*Mechanism)
		if !ok || !mech.FromNullSpace || len(mech.Modes) != 1 {
			t.Fatalf("%s: detail %+v", path, fe.Detail)
		}
		mode := mech.Modes[0].Translations
		near(t, "n2 x", mode[2][0], 1/math.Sqrt2, 1e-9)
		near(t, "n3 x", mode[3][0], 1/math.Sqrt2, 1e-9)
		near(t, "n2 y", mode[2][1], 0, 1e-9)
	}
	// Above the stability limit the mode comes from the sparse
	// factorisation, and it is the same sway.
	_, err := Solve(context.Background(), square().m, Options{Path: Sparse, StabilityLimit: -1})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.Unstable {
		t.Fatalf("large-model mechanism: %v", err)
	}
	mech := fe.Detail.(*Mechanism)
	if !mech.FromNullSpace || len(mech.Modes) != 1 || len(mech.Freedoms) != 2 {
		t.Fatalf("large-model mechanism: %+v", mech)
	}
	near(t, "sparse n2 x", mech.Modes[0].Translations[2][0], 1/math.Sqrt2, 1e-9)
	near(t, "sparse n3 x", mech.Modes[0].Translations[3][0], 1/math.Sqrt2, 1e-9)
	near(t, "sparse n2 y", mech.Modes[0].Translations[2][1], 0, 1e-9)
	// One diagonal makes it stable.
	if _, err := Solve(context.Background(), square([2]int{0, 2}).m, Options{}); err != nil {
		t.Errorf("braced square: %v", err)
	}
}

// TestSparseModesSpanTheNullSpace builds a strip of eight unit squares on
// a pin and a roller with the diagonals of squares 2 and 5 left out: two
// sway mechanisms. The modes found from the sparse factorisation (above
// the stability limit) must span the same space as the eigenvectors of the
// stiffness matrix's two smallest eigenvalues (gonum's EigenSym, the
// reference library, on the dense path): each set projects onto the other
// with a residual at round-off.
func TestSparseModesSpanTheNullSpace(t *testing.T) {
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	const squares = 8
	for i := range squares + 1 {
		b.node(float64(i), 0)
		b.node(float64(i), 1)
	}
	for i := range squares {
		bl, tl, br, tr := 2*i, 2*i+1, 2*i+2, 2*i+3
		b.bar(bl, br)
		b.bar(tl, tr)
		if i != 2 && i != 5 {
			b.bar(bl, tr)
		}
	}
	for i := range squares + 1 {
		b.bar(2*i, 2*i+1)
	}
	b.fix(0, pinned2...)
	b.fix(2*squares, model.Y)
	b.force(1, [3]float64{1, 0}, [3]float64{})
	modes := func(limit int) [][]float64 {
		_, err := Solve(context.Background(), b.m, Options{StabilityLimit: limit})
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.Unstable {
			t.Fatalf("limit %d: %v, want a mechanism", limit, err)
		}
		mech := fe.Detail.(*Mechanism)
		if !mech.FromNullSpace {
			t.Fatalf("limit %d: modes not from the null space", limit)
		}
		var out [][]float64
		for _, md := range mech.Modes {
			var v []float64
			for _, tr := range md.Translations {
				v = append(v, tr...)
			}
			out = append(out, v)
		}
		return out
	}
	dense, sparse := modes(10000), modes(-1)
	if len(dense) != 2 || len(sparse) != 2 {
		t.Fatalf("%d dense and %d sparse modes, want 2 each", len(dense), len(sparse))
	}
	residual := func(v []float64, basis [][]float64) float64 {
		r := append([]float64(nil), v...)
		// basis is orthonormal up to the scaling back to displacements:
		// project by least squares through Gram–Schmidt.
		var q [][]float64
		for _, bv := range basis {
			w := append([]float64(nil), bv...)
			for _, u := range q {
				d := floats.Dot(u, w)
				for i := range w {
					w[i] -= d * u[i]
				}
			}
			n := math.Sqrt(floats.Dot(w, w))
			for i := range w {
				w[i] /= n
			}
			q = append(q, w)
		}
		for _, u := range q {
			d := floats.Dot(u, r)
			for i := range r {
				r[i] -= d * u[i]
			}
		}
		return math.Sqrt(floats.Dot(r, r))
	}
	for k := range 2 {
		if r := residual(sparse[k], dense); r > 1e-8 {
			t.Errorf("sparse mode %d leaves the dense null space by %g", k, r)
		}
		if r := residual(dense[k], sparse); r > 1e-8 {
			t.Errorf("dense mode %d leaves the sparse null space by %g", k, r)
		}
	}
}

// TestDisconnected checks a second triangle that no support holds (an
// error naming its nodes) and two supported triangles (a warning).
func TestDisconnected(t *testing.T) {
	build := func(supportSecond bool) *builder {
		b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
		for part := range 2 {
			x := 5 * float64(part)
			a, c, d := b.node(x, 0), b.node(x+2, 0), b.node(x+1, 1)
			b.bar(a, c)
			b.bar(c, d)
			b.bar(d, a)
			if part == 0 || supportSecond {
				b.fix(a, pinned2...)
				b.fix(c, model.Y)
			}
			b.force(d, [3]float64{0, -1}, [3]float64{})
		}
		return b
	}
	_, err := Solve(context.Background(), build(false).m, Options{})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.Unstable || !strings.Contains(fe.Message, `"n3"`) || fe.Problems[0].Path != "/nodes/3" {
		t.Errorf("loose part: %v", err)
	}
	res, err := Solve(context.Background(), build(true).m, Options{})
	if err != nil || len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], "2 disconnected parts") {
		t.Errorf("two supported parts: %v %v", err, res)
	}
}

// TestInvalidInput checks the InvalidModel and UnknownCase errors and their
// JSON pointers.
func TestInvalidInput(t *testing.T) {
	moment := square([2]int{0, 2})
	moment.force(2, [3]float64{}, [3]float64{0, 0, 5})
	zeroArea := square([2]int{0, 2})
	zeroArea.m.Sections[0].Area = 0
	zeroModulus := square([2]int{0, 2})
	zeroModulus.m.Materials[0].ElasticModulus = 0
	offMember := square([2]int{0, 2})
	offMember.memberLoad(model.MemberLoad{Member: 0, Kind: model.Point, Value: [3]float64{0, 1}, Distance: 2})
	tests := []struct {
		name string
		m    *model.Model
		opt  Options
		kind fault.Kind
		path string
	}{
		{"moment at a pin", moment.m, Options{}, fault.InvalidModel, "/load_cases/0/loads/1/moment"},
		{"zero area", zeroArea.m, Options{}, fault.InvalidModel, "/sections/0/area"},
		{"zero modulus", zeroModulus.m, Options{}, fault.InvalidModel, "/materials/0/elastic_modulus"},
		{"point off member", offMember.m, Options{}, fault.InvalidModel, "/load_cases/0/member_loads/0/distance"},
		{"unknown case", square([2]int{0, 2}).m, Options{Cases: []string{"wind"}}, fault.UnknownCase, ""},
	}
	for _, tc := range tests {
		_, err := Solve(context.Background(), tc.m, tc.opt)
		fe, ok := fault.As(err)
		if !ok || fe.Kind != tc.kind {
			t.Errorf("%s: error %v, want kind %v", tc.name, err, tc.kind)
			continue
		}
		if tc.path != "" && (len(fe.Problems) == 0 || fe.Problems[0].Path != tc.path) {
			t.Errorf("%s: problems %+v, want path %s", tc.name, fe.Problems, tc.path)
		}
	}
}

// TestStiffnessRatio checks that a member 1e12 times stiffer than another
// draws warnings (the ratio, and the condition estimate), while the
// statically determinate forces of the two-bar bracket of
// TestTwoBarVirtualWork (−4P/3 and 5P/3) stay right to the accuracy that
// a condition number κ allows, a relative forward error of order κ·ε ≈ 1e-4
// for κ ≈ 1e12 (Higham, Accuracy and Stability of Numerical Algorithms,
// 2002, ch. 10, Cholesky forward error bound).
func TestStiffnessRatio(t *testing.T) {
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	b.m.Materials = append(b.m.Materials, model.Material{ID: "stiff", ElasticModulus: 2e21})
	na, nb, nc := b.node(0, 0), b.node(0, 3), b.node(4, 0)
	b.bar(na, nc)
	stiff := b.bar(nb, nc)
	b.m.Members[stiff].Material = 1
	b.fix(na, pinned2...)
	b.fix(nb, pinned2...)
	b.force(nc, [3]float64{0, -3}, [3]float64{})
	res, err := Solve(context.Background(), b.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Warnings) < 2 || !strings.Contains(res.Warnings[0], "ratio") || !strings.Contains(res.Warnings[1], "ill-conditioned") {
		t.Errorf("warnings %q, want a stiffness ratio and a condition warning", res.Warnings)
	}
	near(t, "N_AC", res.Cases[0].AxialForce[0], -4.0, 1e-3)
	near(t, "N_BC", res.Cases[0].AxialForce[1], 5.0, 1e-3)
}

// TestCancelled checks that a cancelled context ends the solve with the
// context's error.
func TestCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := Solve(ctx, square([2]int{0, 2}).m, Options{})
	if !errors.Is(err, context.Canceled) {
		t.Errorf("error %v, want context.Canceled", err)
	}
}

// TestModesCapped hangs twenty nodes each on one bar from its own pin, one
// pushed sideways: each can swing, twenty mechanisms (Maxwell's rule
// b − 2j + k = 20 − 80 + 40 = −20 = s − m, with s = 0 by inspection). The
// error counts all twenty while its detail carries at most sixteen modes,
// on both paths.
func TestModesCapped(t *testing.T) {
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	for i := range 20 {
		pin := b.node(float64(i), 1)
		hung := b.node(float64(i), 0)
		b.bar(pin, hung)
		b.fix(pin, pinned2...)
	}
	b.force(1, [3]float64{1, 0}, [3]float64{})
	for _, limit := range []int{10000, -1} {
		_, err := Solve(context.Background(), b.m, Options{StabilityLimit: limit})
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.Unstable {
			t.Fatalf("limit %d: %v, want a mechanism", limit, err)
		}
		if !strings.Contains(fe.Message, "20 mechanism(s)") {
			t.Errorf("limit %d: message %q does not count 20 mechanisms", limit, fe.Message)
		}
		mech := fe.Detail.(*Mechanism)
		if len(mech.Modes) != maxModes || len(mech.Freedoms) != 20 {
			t.Errorf("limit %d: %d modes and %d freedoms, want %d and 20", limit, len(mech.Modes), len(mech.Freedoms), maxModes)
		}
	}
}
