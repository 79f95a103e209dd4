package sparse_test

import (
	"context"
	"fmt"

	"gusset/engine/sparse"
)

// The 1D Laplacian tridiag(−1, 2, −1) with a unit load everywhere has the
// solution x_i = i(n+1−i)/2 (1-based): for n = 5, 2.5, 4, 4.5, 4, 2.5, and
// indeed −x_{i−1} + 2x_i − x_{i+1} = 1 at every row (derived by hand).
func ExampleFactorize() {
	n := 5
	b := sparse.NewBuilder(n, 2*n)
	for i := 0; i < n; i++ {
		b.Add(i, i, 2)
		if i > 0 {
			b.Add(i, i-1, -1)
		}
	}
	a := b.Matrix()
	chol, err := sparse.Factorize(context.Background(), a, sparse.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	x := []float64{1, 1, 1, 1, 1}
	chol.Solve(x, x)
	fmt.Printf("%.4g\n", x)
	// Output: [2.5 4 4.5 4 2.5]
}

// A free spring chain can move as a rigid body: the factorisation names the
// freedom whose pivot vanishes. The chain of two unit springs has the
// stiffness matrix [[1, −1, 0], [−1, 2, −1], [0, −1, 1]], whose rows sum
// to zero (rigid translation); eliminating in order leaves pivots 1, 1 and
// 0, so the third column is the deficient one (derived by hand).
func ExamplePivotError() {
	b := sparse.NewBuilder(3, 6)
	for i := 0; i < 2; i++ {
		b.Add(i, i, 1)
		b.Add(i+1, i+1, 1)
		b.Add(i, i+1, -1)
	}
	identity := []int{0, 1, 2}
	_, err := sparse.Factorize(context.Background(), b.Matrix(), sparse.Options{Perm: identity})
	fmt.Println(err)
	// Output: sparse: matrix not positive definite: 1 deficient pivot(s) at column(s) 2 (0)
}
