package layout

import (
	"errors"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize/convex/lp"
)

// denseSimplex solves a one-case program with gonum's dense simplex method.
// Ground-structure programs are highly degenerate (most right-hand sides
// are zero) and Dantzig's rule can cycle on them, so the right-hand side is
// perturbed by a tiny random amount, which makes every basis
// nondegenerate (Charnes, "Optimality and degeneracy in linear
// programming", Econometrica 20, 1952); the optimal basis found is then
// re-solved with the true right-hand side. Dual feasibility of a basis does
// not depend on b, so the basis stays optimal when its re-solved primal
// values are non-negative.
func denseSimplex(prog *program) ([]float64, error) {
	a := prog.a
	dense := mat.NewDense(a.rows, a.cols, nil)
	for j := 0; j < a.cols; j++ {
		for q := a.colStart[j]; q < a.colStart[j+1]; q++ {
			dense.Set(int(a.rowIndex[q]), j, a.value[q])
		}
	}
	scale := maxAbs(prog.b)
	if scale == 0 {
		return make([]float64, a.cols), nil
	}
	rnd := rand.New(rand.NewPCG(1, 2))
	perturbed := make([]float64, len(prog.b))
	for i, v := range prog.b {
		perturbed[i] = v + scale*1e-7*(0.5+rnd.Float64())
	}
	_, x, err := lp.Simplex(prog.c, dense, perturbed, 1e-10, prog.artificialBasis())
	if err != nil {
		return nil, err
	}
	var basis []int
	for j, v := range x {
		if v > 0 {
			basis = append(basis, j)
		}
	}
	if len(basis) != a.rows {
		return nil, errors.New("degenerate optimal basis after perturbation")
	}
	bm := mat.NewDense(a.rows, a.rows, nil)
	for k, j := range basis {
		bm.SetCol(k, mat.Col(nil, j, dense))
	}
	var xb mat.VecDense
	if err := xb.SolveVec(bm, mat.NewVecDense(a.rows, append([]float64(nil), prog.b...))); err != nil {
		return nil, err
	}
	out := make([]float64, a.cols)
	for k, j := range basis {
		v := xb.AtVec(k)
		if v < -1e-9*scale {
			return nil, errors.New("perturbed optimal basis is not feasible for the true loads")
		}
		out[j] = math.Max(v, 0)
	}
	return out, nil
}
