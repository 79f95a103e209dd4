package layout

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestNormalEquations solves (A D Aᵀ) z = r for random sparse A with rows
// tied to random points (so the nested-dissection order is exercised) and
// checks the scaled residual ‖M z − r‖ / (‖M‖ ‖z‖ ε) and the agreement
// with gonum's dense Cholesky solve.
func TestNormalEquations(t *testing.T) {
	rnd := rand.New(rand.NewPCG(3, 5))
	for _, size := range []int{5, 60, 300} {
		t.Run(fmt.Sprintf("rows=%d", size), func(t *testing.T) {
			m, n := size, 3*size
			coords := make([]vec, m)
			for i := range coords {
				coords[i] = vec{rnd.Float64(), rnd.Float64()}
			}
			dense := mat.NewDense(m, n, nil)
			for j := 0; j < n; j++ {
				// Each column couples a row with up to three near rows, as a
				// member couples the freedoms of its two nodes.
				i := rnd.IntN(m)
				dense.Set(i, j, rnd.NormFloat64())
				for k := 0; k < 3; k++ {
					near := (i + 1 + rnd.IntN(4)) % m
					dense.Set(near, j, rnd.NormFloat64())
				}
			}
			for i := 0; i < m; i++ {
				dense.Set(i, i, dense.At(i, i)+3) // full row rank
			}
			d := make([]float64, n)
			for j := range d {
				d[j] = math.Exp(4 * rnd.NormFloat64())
			}
			ne := newNormalEquations(denseToColumns(dense), coords)
			ne.factorize(d)
			if ne.skipped != 0 {
				t.Fatalf("%d pivots skipped on a positive definite matrix", ne.skipped)
			}
			var scaled mat.Dense
			scaled.Apply(func(_, j int, v float64) float64 { return v * d[j] }, dense)
			var normal mat.Dense
			normal.Mul(&scaled, dense.T())
			r := make([]float64, m)
			for i := range r {
				r[i] = rnd.NormFloat64()
			}
			z := append([]float64(nil), r...)
			ne.solve(z)
			var mz mat.VecDense
			mz.MulVec(&normal, mat.NewVecDense(m, z))
			mz.SubVec(&mz, mat.NewVecDense(m, r))
			res := mat.Norm(&mz, 2) / (mat.Norm(&normal, 2) * mat.Norm(mat.NewVecDense(m, z), 2) * 0x1p-52)
			if res > 100 {
				t.Errorf("scaled residual %g", res)
			}
			var chol mat.Cholesky
			if !chol.Factorize(mat.NewSymDense(m, normal.RawMatrix().Data)) {
				t.Fatal("gonum Cholesky failed")
			}
			var want mat.VecDense
			if err := chol.SolveVecTo(&want, mat.NewVecDense(m, r)); err != nil {
				t.Fatal(err)
			}
			// Both solutions are backward stable: they differ by at most a
			// modest multiple of cond(M)·ε relative to the solution's size.
			bound := 100 * chol.Cond() * 0x1p-52 * mat.Norm(&want, math.Inf(1))
			for i := range z {
				if math.Abs(z[i]-want.AtVec(i)) > bound {
					t.Errorf("z[%d] = %g, gonum %g", i, z[i], want.AtVec(i))
					break
				}
			}
		})
	}
}
