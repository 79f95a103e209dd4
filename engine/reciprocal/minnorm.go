package reciprocal

import (
	"context"
	"math"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
	"gusset/engine/sparse"
)

// denseRedrawColumns is the largest number of free coordinates that Reverse
// redraws by the dense singular value decomposition (a variable so that
// tests can send small networks down the sparse path).
var denseRedrawColumns = 200

// constraint is one row of the redrawing's linear system: the member's free
// ends (first coordinate column, or −1 for a fixed end), the coefficients
// of their x and y, and the right-hand side.
type constraint struct {
	cols [2]int
	coef [2][2]float64
	rhs  float64
}

// apply returns the row's value at x, Σ coef·x over its free ends.
func (c *constraint) apply(x []float64) float64 {
	v := 0.0
	for s := range 2 {
		if j := c.cols[s]; j >= 0 {
			v += c.coef[s][0]*x[j] + c.coef[s][1]*x[j+1]
		}
	}
	return v
}

// minNormDense returns the minimum-norm least-squares solution of the
// constraints over cols unknowns by gonum's singular value decomposition,
// with singular values below 1e-10 of the largest taken as zero.
func minNormDense(cons []constraint, cols int) ([]float64, error) {
	c := mat.NewDense(len(cons), cols, nil)
	r := mat.NewVecDense(len(cons), nil)
	for k, row := range cons {
		for s := range 2 {
			if j := row.cols[s]; j >= 0 {
				c.Set(k, j, row.coef[s][0])
				c.Set(k, j+1, row.coef[s][1])
			}
		}
		r.SetVec(k, row.rhs)
	}
	var svd mat.SVD
	if !svd.Factorize(c, mat.SVDThin) {
		return nil, fault.New(fault.NoSolution, "the redrawing could not be computed: the singular value decomposition did not converge")
	}
	var delta mat.VecDense
	svd.SolveVecTo(&delta, r, svd.Rank(1e-10))
	return delta.RawVector().Data, nil
}

// minNormSparse returns the minimum-norm least-squares solution of the
// constraints C·δ = r over cols unknowns by iterated Tikhonov
// regularisation: with N = CᵀC + λI factorised once by the sparse Cholesky,
// δ₀ = 0 and δ ← δ + N⁻¹Cᵀ(r − C·δ). Every iterate stays in the row space
// of C, and the error along a singular direction σ shrinks by λ/(σ² + λ)
// per step, so the iteration converges to the minimum-norm least-squares
// solution. Directions with σ² far below λ (1e-7 of the largest diagonal
// entry of CᵀC) barely move: a softer cut than the dense path's (σ below
// 1e-10 of the largest), which only nearly dependent constraints reach
// (A. N. Tikhonov, 1963, and the iterated form of its regularisation, e.g.
// Engl, Hanke & Neubauer, "Regularization of Inverse Problems", 1996, §5.1;
// from memory). The
// normal matrix has the sparsity of the network's node adjacency, so the
// cost grows like that of a stiffness solve of the same network.
func minNormSparse(ctx context.Context, cons []constraint, cols int) ([]float64, error) {
	b := sparse.NewBuilder(cols, 10*len(cons)+cols)
	for j := range cols {
		b.Add(j, j, 0) // every diagonal entry stored, for λ below
	}
	for _, row := range cons {
		// The row's nonzeros (distinct columns: a member's ends are two
		// nodes); each unordered pair of them adds one entry of CᵀC.
		var at [4]int
		var val [4]float64
		n := 0
		for s := range 2 {
			if j := row.cols[s]; j >= 0 {
				at[n], val[n], at[n+1], val[n+1] = j, row.coef[s][0], j+1, row.coef[s][1]
				n += 2
			}
		}
		for p := range n {
			for q := range p + 1 {
				b.Add(at[p], at[q], val[p]*val[q])
			}
		}
	}
	normal := b.Matrix()
	// A column's first stored entry is its diagonal (rows ascend from j).
	largest := 0.0
	for j := range cols {
		largest = math.Max(largest, normal.Val[normal.ColPtr[j]])
	}
	lambda := 1e-7 * math.Max(largest, 1e-300)
	for j := range cols {
		normal.Val[normal.ColPtr[j]] += lambda
	}
	chol, err := sparse.Factorize(ctx, normal, sparse.Options{})
	if err != nil {
		if ctx.Err() != nil {
			return nil, ctx.Err()
		}
		return nil, fault.New(fault.NoSolution, "the redrawing could not be computed: %v", err)
	}
	delta := make([]float64, cols)
	grad := make([]float64, cols)
	step := make([]float64, cols)
	previous := math.Inf(1)
	for range 200 {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		clear(grad)
		for _, row := range cons {
			res := row.rhs - row.apply(delta)
			for s := range 2 {
				if j := row.cols[s]; j >= 0 {
					grad[j] += row.coef[s][0] * res
					grad[j+1] += row.coef[s][1] * res
				}
			}
		}
		chol.Solve(step, grad)
		size, moved := 0.0, 0.0
		for j := range delta {
			delta[j] += step[j]
			size = math.Max(size, math.Abs(delta[j]))
			moved = math.Max(moved, math.Abs(step[j]))
		}
		if moved <= 1e-15*size || moved >= previous {
			break
		}
		previous = moved
	}
	return delta, nil
}
