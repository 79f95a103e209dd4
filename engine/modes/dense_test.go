package modes

import (
	"context"
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
	"gusset/engine/sparse"
	"gusset/engine/stiffness"
)

// denseOf returns the full symmetric matrix of a.
func denseOf(a *sparse.Matrix) *mat.SymDense {
	s := mat.NewSymDense(a.N, nil)
	for j := range a.N {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			s.SetSym(a.RowIdx[p], j, a.Val[p])
		}
	}
	return s
}

// generalised returns the eigenvalues μ of B·x = μ·A·x, A positive
// definite, by gonum's dense Cholesky A = L·Lᵀ and symmetric eigensolver
// on L⁻¹·B·L⁻ᵀ (the textbook reduction: G. H. Golub and C. F. Van Loan,
// "Matrix Computations", 3rd ed., 1996, §8.7.2).
func generalised(t *testing.T, a, b *mat.SymDense) []float64 {
	var chol mat.Cholesky
	if !chol.Factorize(a) {
		t.Fatal("reference: A is not positive definite")
	}
	var l mat.TriDense
	chol.LTo(&l)
	n := a.SymmetricDim()
	var x, y mat.Dense
	if err := x.Solve(&l, b); err != nil { // L⁻¹·B
		t.Fatal(err)
	}
	if err := y.Solve(&l, x.T()); err != nil { // L⁻¹·(L⁻¹·B)ᵀ
		t.Fatal(err)
	}
	c := mat.NewSymDense(n, nil)
	for i := range n {
		for j := i; j < n; j++ {
			c.SetSym(i, j, (y.At(i, j)+y.At(j, i))/2)
		}
	}
	var es mat.EigenSym
	if !es.Factorize(c, false) {
		t.Fatal("reference: eigen-decomposition failed")
	}
	return es.Values(nil)
}

// TestAgainstDense compares the lowest eigenvalues with gonum's dense
// solvers (a reference library) on small models: frequencies of a 2D and
// a 3D frame (ω² from M·x = (1/ω²)·K·x) and buckling factors of the 2D
// frame and of a small double-layer grid of bars (λ from −K_G·x =
// (1/λ)·K·x, both signs).
func TestAgainstDense(t *testing.T) {
	grid := gridModel(4, 4)
	for _, tc := range []struct {
		name string
		m    *model.Model
		kind Kind
	}{
		{"frame2D vibration", frame2D(2, 3), KindVibration},
		{"frame3D vibration", frame3D(), KindVibration},
		{"frame2D buckling", frame2D(2, 3), KindBuckling},
		{"frame3D buckling", frame3D(), KindBuckling},
		{"grid buckling", grid, KindBuckling},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ctx := context.Background()
			mx, err := stiffness.Assemble(ctx, tc.m, stiffness.Options{})
			if err != nil {
				t.Fatal(err)
			}
			var b *sparse.Matrix
			var got []float64
			const count = 6
			if tc.kind == KindVibration {
				b, _ = massMatrix(mx, tc.m, &Result{})
				res, err := Vibration(ctx, tc.m, Options{Count: count})
				if err != nil {
					t.Fatal(err)
				}
				for _, md := range res.Modes {
					got = append(got, md.Angular*md.Angular)
				}
			} else {
				sol, err := stiffness.Solve(ctx, tc.m, stiffness.Options{})
				if err != nil {
					t.Fatal(err)
				}
				b, _ = geometric(mx, tc.m, sol.Cases[0].EndForces)
				res, err := Buckling(ctx, tc.m, Options{Count: count})
				if err != nil {
					t.Fatal(err)
				}
				for _, md := range res.Modes {
					got = append(got, md.Factor)
				}
			}
			mu := generalised(t, denseOf(mx.K), denseOf(b))
			var want []float64
			for _, v := range mu {
				if math.Abs(v) > 1e-12*slices.Max(mu) {
					want = append(want, 1/v)
				}
			}
			slices.SortFunc(want, func(a, b float64) int { return cmpFloat(math.Abs(a), math.Abs(b)) })
			if len(got) != count {
				t.Fatalf("%d modes, want %d", len(got), count)
			}
			t.Logf("got %v\nwant %v", got, want[:count+2])
			for k := range count {
				if rel := math.Abs(got[k]-want[k]) / math.Abs(want[k]); rel > 1e-9 {
					t.Errorf("mode %d: %.15g, gonum %.15g (%.2g)", k, got[k], want[k], rel)
				}
			}
		})
	}
}

// gridModel is a double-layer grid of bars, nx×ny squares of 2 m on top,
// 1.5 m deep, pinned along the top perimeter, loaded downwards at the free
// top nodes.
func gridModel(nx, ny int) *model.Model {
	b := newTestModel(3)
	top := func(i, j int) int { return j*(nx+1) + i }
	bottom := func(i, j int) int { return (nx+1)*(ny+1) + j*nx + i }
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			b.node(2*float64(i), 2*float64(j), 1.5)
		}
	}
	for j := range ny {
		for i := range nx {
			b.node(2*float64(i)+1, 2*float64(j)+1, 0)
		}
	}
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			if i < nx {
				b.member(model.Bar, top(i, j), top(i+1, j))
			}
			if j < ny {
				b.member(model.Bar, top(i, j), top(i, j+1))
			}
			if i == 0 || j == 0 || i == nx || j == ny {
				b.fix(top(i, j), model.X, model.Y, model.Z)
			} else {
				b.load(top(i, j), 0, 0, -10)
			}
		}
	}
	for j := range ny {
		for i := range nx {
			if i+1 < nx {
				b.member(model.Bar, bottom(i, j), bottom(i+1, j))
			}
			if j+1 < ny {
				b.member(model.Bar, bottom(i, j), bottom(i, j+1))
			}
			for _, c := range [4][2]int{{0, 0}, {1, 0}, {1, 1}, {0, 1}} {
				b.member(model.Bar, bottom(i, j), top(i+c[0], j+c[1]))
			}
		}
	}
	return b.m
}
