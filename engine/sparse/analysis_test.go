package sparse

import (
	"context"
	"errors"
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestFactorizeWith checks that factorising with a shared Analysis gives
// Factorize's solution bit for bit, for matrices of one structure with
// other values, and that it solves the 1D Laplacian tridiag(−1, 2, −1)
// with ones on the right, whose solution is x_i = (i+1)(n−i)/2 (the
// discrete Poisson problem with zero ends; common practice).
func TestFactorizeWith(t *testing.T) {
	const n = 50
	a := laplacian1D(n)
	an := Analyse(a, Options{})
	if an.N() != n {
		t.Fatalf("N = %d, want %d", an.N(), n)
	}
	for _, scale := range []float64{1, 3.5, 1e-3} {
		b := &Matrix{N: a.N, ColPtr: a.ColPtr, RowIdx: a.RowIdx, Val: slices.Clone(a.Val)}
		for p := range b.Val {
			b.Val[p] *= scale
		}
		ref, err := Factorize(context.Background(), b, Options{})
		if err != nil {
			t.Fatal(err)
		}
		c, err := FactorizeWith(context.Background(), b, an, Options{})
		if err != nil {
			t.Fatal(err)
		}
		rhs := make([]float64, n)
		for i := range rhs {
			rhs[i] = 1
		}
		want, got := make([]float64, n), make([]float64, n)
		for i := range got {
			got[i], want[i] = math.NaN(), math.NaN()
		}
		ref.Solve(want, rhs)
		c.Solve(got, rhs)
		if !slices.Equal(got, want) {
			t.Fatalf("scale %g: solution differs from Factorize's", scale)
		}
		for i, x := range got {
			exact := float64((i+1)*(n-i)) / 2 / scale
			if !scalar.EqualWithinAbsOrRel(x, exact, 1e-12, 1e-10) {
				t.Fatalf("scale %g: x[%d] = %g, want %g", scale, i, x, exact)
			}
		}
	}
	// A zero matrix of the same structure has no positive pivot.
	z := &Matrix{N: a.N, ColPtr: a.ColPtr, RowIdx: a.RowIdx, Val: make([]float64, len(a.Val))}
	_, err := FactorizeWith(context.Background(), z, an, Options{})
	var pe *PivotError
	if !errors.As(err, &pe) {
		t.Fatalf("zero matrix: error %v, want a *PivotError", err)
	}
}

// TestFactorizeWithOtherStructure checks the panic on a matrix of another
// structure.
func TestFactorizeWithOtherStructure(t *testing.T) {
	an := Analyse(laplacian1D(6), Options{})
	defer func() {
		if recover() == nil {
			t.Error("no panic for another structure")
		}
	}()
	_, _ = FactorizeWith(context.Background(), laplacian1D(7), an, Options{})
}
