package sparse

import (
	"context"
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// TestOwnDiagonal factorises A = S·T·S, T the 1D Laplacian plus 2I
// (well conditioned) and S a diagonal scaling from 1e-6 to 1e6, as the
// normal equations of an interior-point method look near the end. Against
// the largest diagonal entry the small pivots look deficient; against
// their own diagonal they are sound, and the solution agrees with
// x = S⁻¹·T⁻¹·S⁻¹·b by gonum's dense Cholesky of T (reference library) to a
// relative 1e-9.
func TestOwnDiagonal(t *testing.T) {
	const n = 60
	scale := make([]float64, n)
	for i := range scale {
		scale[i] = math.Pow(10, -6+12*float64((i*37)%n)/float64(n-1))
	}
	b := NewBuilder(n, 2*n)
	ref := mat.NewSymDense(n, nil)
	for i := range n {
		b.Add(i, i, 4*scale[i]*scale[i])
		ref.SetSym(i, i, 4)
		if i > 0 {
			b.Add(i, i-1, -scale[i]*scale[i-1])
			ref.SetSym(i, i-1, -1)
		}
	}
	a := b.Matrix()
	var pe *PivotError
	if _, err := Factorize(context.Background(), a, Options{}); !errors.As(err, &pe) {
		t.Fatalf("against the largest diagonal: got %v, want small pivots taken as deficient", err)
	}
	c, err := Factorize(context.Background(), a, Options{OwnDiagonal: true})
	if err != nil {
		t.Fatal(err)
	}
	rhs := randomVec(n, 4)
	x := nanVec(n)
	c.Solve(x, rhs)
	var chol mat.Cholesky
	if !chol.Factorize(ref) {
		t.Fatal("gonum Cholesky failed")
	}
	scaled := make([]float64, n)
	for i := range n {
		scaled[i] = rhs[i] / scale[i]
	}
	var want mat.VecDense
	if err := chol.SolveVecTo(&want, mat.NewVecDense(n, scaled)); err != nil {
		t.Fatal(err)
	}
	for i := range n {
		if w := want.AtVec(i) / scale[i]; math.Abs(x[i]-w) > 1e-9*math.Abs(w) {
			t.Errorf("x[%d] = %.12g, gonum %.12g", i, x[i], w)
		}
	}
}

// TestDependentRows factorises N = B·Bᵀ for a B whose third row is the sum
// of the first two, so N is singular. With OwnDiagonal and a huge
// DeficientPivot one pivot cancels, its component of the solution is zero,
// and the others solve the system of the independent rows, as gonum's
// dense solve of that 2×2 system gives (reference library).
func TestDependentRows(t *testing.T) {
	rows := [][]float64{{1, 2, 0, 1}, {0, 1, 3, -1}}
	rows = append(rows, []float64{1, 3, 3, 0})
	bld := NewBuilder(3, 6)
	for i := range 3 {
		for j := range i + 1 {
			bld.Add(i, j, floats.Dot(rows[i], rows[j]))
		}
	}
	c, err := Factorize(context.Background(), bld.Matrix(), Options{Perm: []int{0, 1, 2}, OwnDiagonal: true, DeficientPivot: 1e64, Regularize: true})
	if err != nil {
		t.Fatal(err)
	}
	if d := c.Deficient(); len(d) != 1 || d[0] != 2 {
		t.Fatalf("deficient %v, want [2]", d)
	}
	rhs := []float64{1, -2, 5}
	x := nanVec(3)
	c.Solve(x, rhs)
	if math.Abs(x[2]) > 1e-50 {
		t.Errorf("x[2] = %g, want 0", x[2])
	}
	reduced := mat.NewSymDense(2, []float64{floats.Dot(rows[0], rows[0]), floats.Dot(rows[0], rows[1]), floats.Dot(rows[1], rows[0]), floats.Dot(rows[1], rows[1])})
	var want mat.VecDense
	if err := want.SolveVec(reduced, mat.NewVecDense(2, rhs[:2])); err != nil {
		t.Fatal(err)
	}
	for i := range 2 {
		if math.Abs(x[i]-want.AtVec(i)) > 1e-12*math.Abs(want.AtVec(i)) {
			t.Errorf("x[%d] = %.15g, gonum %.15g", i, x[i], want.AtVec(i))
		}
	}
}
