package sparse

import (
	"math"
	"slices"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
)

// Solve computes dst = A⁻¹·b with the factorisation. dst may alias b; both
// must have length N, or Solve panics. For a factorisation with deficient
// columns (Regularize), the result solves the matrix in which those freedoms
// are held fixed.
func (c *Cholesky) Solve(dst, b []float64) {
	sym := c.sym
	n := sym.n
	if len(dst) != n || len(b) != n {
		panic("sparse: Solve length mismatch")
	}
	if !c.ok {
		panic("sparse: Solve with a failed factorisation")
	}
	x := make([]float64, n)
	for k, old := range sym.perm {
		x[k] = b[old]
	}
	c.solvePermuted(x)
	for k, old := range sym.perm {
		dst[old] = x[k]
	}
}

// solvePermuted overwrites x with (L·Lᵀ)⁻¹·x in the permuted numbering.
func (c *Cholesky) solvePermuted(x []float64) {
	sym := c.sym
	maxRows := 0
	for s := 0; s < sym.nsuper; s++ {
		maxRows = max(maxRows, sym.rowPtr[s+1]-sym.rowPtr[s])
	}
	tmp := make([]float64, maxRows)
	// Forward: L·y = b.
	for s := 0; s < sym.nsuper; s++ {
		first := sym.superFirst[s]
		ns := sym.superFirst[s+1] - first
		rows := sym.rows[sym.rowPtr[s]:sym.rowPtr[s+1]]
		rs := len(rows)
		m := ns + rs
		block := c.val[sym.valPtr[s]:sym.valPtr[s+1]]
		xs := blas64.Vector{N: ns, Inc: 1, Data: x[first : first+ns]}
		blas64.Trsv(blas.Trans, blas64.Triangular{Uplo: blas.Upper, Diag: blas.NonUnit, N: ns, Stride: m, Data: block}, xs)
		if rs == 0 {
			continue
		}
		t := tmp[:rs]
		blas64.Gemv(blas.Trans, 1, blas64.General{Rows: ns, Cols: rs, Stride: m, Data: block[ns:]}, xs, 0, blas64.Vector{N: rs, Inc: 1, Data: t})
		for i, r := range rows {
			x[r] -= t[i]
		}
	}
	// Backward: Lᵀ·x = y.
	for s := sym.nsuper - 1; s >= 0; s-- {
		first := sym.superFirst[s]
		ns := sym.superFirst[s+1] - first
		rows := sym.rows[sym.rowPtr[s]:sym.rowPtr[s+1]]
		rs := len(rows)
		m := ns + rs
		block := c.val[sym.valPtr[s]:sym.valPtr[s+1]]
		xs := blas64.Vector{N: ns, Inc: 1, Data: x[first : first+ns]}
		if rs > 0 {
			t := tmp[:rs]
			for i, r := range rows {
				t[i] = x[r]
			}
			blas64.Gemv(blas.NoTrans, -1, blas64.General{Rows: ns, Cols: rs, Stride: m, Data: block[ns:]}, blas64.Vector{N: rs, Inc: 1, Data: t}, 1, xs)
		}
		blas64.Trsv(blas.NoTrans, blas64.Triangular{Uplo: blas.Upper, Diag: blas.NonUnit, N: ns, Stride: m, Data: block}, xs)
	}
}

// SolveRefined solves A·x = b into dst (which may alias b) and improves x
// by iterative refinement, x ← x + A⁻¹(b − A·x), while the scaled residual
// ‖b − A·x‖∞ / (‖A‖∞‖x‖∞ + ‖b‖∞) is above 100·ε and at most maxSteps
// refinement steps have been taken. a must be the matrix that was
// factorised. It returns the scaled residual of dst, never NaN (0 when b and
// x are both zero).
func (c *Cholesky) SolveRefined(a *Matrix, dst, b []float64, maxSteps int) (relResidual float64) {
	n := c.sym.n
	if a.N != n || len(dst) != n || len(b) != n {
		panic("sparse: SolveRefined size mismatch")
	}
	rhs := append([]float64(nil), b...)
	x := make([]float64, n)
	c.Solve(x, rhs)
	r := make([]float64, n)
	ax := make([]float64, n)
	normB := normInf(rhs)
	residual := func() float64 {
		a.MulVec(ax, x)
		for i := range r {
			r[i] = rhs[i] - ax[i]
		}
		den := c.normA*normInf(x) + normB
		if den == 0 {
			return 0
		}
		return normInf(r) / den
	}
	const target = 100 * 0x1p-52
	rel := residual()
	best := append([]float64(nil), x...)
	bestRel := rel
	for step := 0; step < maxSteps && rel > target && !math.IsNaN(rel); step++ {
		c.Solve(r, r)
		for i := range x {
			x[i] += r[i]
		}
		rel = residual()
		if !(rel < bestRel) {
			break
		}
		copy(best, x)
		bestRel = rel
	}
	copy(dst, best)
	return bestRel
}

func normInf(x []float64) float64 {
	m := 0.0
	for _, v := range x {
		m = max(m, math.Abs(v))
	}
	return m
}

func norm1(x []float64) float64 {
	s := 0.0
	for _, v := range x {
		s += math.Abs(v)
	}
	return s
}

// ConditionEstimate returns an estimate of the 1-norm condition number
// κ₁(A) = ‖A‖₁‖A⁻¹‖₁, where ‖A⁻¹‖₁ comes from Hager's method with Higham's
// safeguards (W. W. Hager, "Condition estimates", SIAM J. Sci. Stat. Comput.
// 5(2), 1984; N. J. Higham, "FORTRAN codes for estimating the one-norm of a
// real or complex matrix", ACM TOMS 14(4), 1988), costing a few solves. The
// estimate is a lower bound of κ₁ that is usually within a factor of a few of
// it. The first call computes it; later calls return the cached value until
// the next Refactorize.
func (c *Cholesky) ConditionEstimate() float64 {
	c.condMu.Lock()
	defer c.condMu.Unlock()
	if !c.condDone {
		c.condition = c.normA * c.inverseNorm1()
		c.condDone = true
	}
	return c.condition
}

// inverseNorm1 estimates ‖A⁻¹‖₁; A is symmetric, so A⁻ᵀ = A⁻¹. It runs
// Hager's iteration as Higham's code does, stopping as soon as a solve
// repeats the previous sign vector: the solve with that sign vector would
// repeat the previous one and change nothing, so the estimate is the one
// the full test gives, for one solve less (usually 4 where there were 5).
func (c *Cholesky) inverseNorm1() float64 {
	n := c.sym.n
	if n == 0 {
		return 0
	}
	x := make([]float64, n)
	for i := range x {
		x[i] = 1 / float64(n)
	}
	// Higham's alternating-sign vector guards against the cases where the
	// iteration stalls on a poor local maximum.
	alt := make([]float64, n)
	for i := range alt {
		sign := 1.0
		if i%2 == 1 {
			sign = -1
		}
		alt[i] = sign * (1 + float64(i)/float64(max(n-1, 1)))
	}
	y := make([]float64, n)
	c.Solve(y, x)
	c.Solve(alt, alt)
	altEst := 2 * norm1(alt) / (3 * float64(n))
	est := norm1(y)
	z := make([]float64, n)
	signs(z, y)
	sgn := append([]float64(nil), z...)
	last := -1
	for iter := 1; iter < 5; iter++ {
		c.Solve(z, z)
		j, zmax := 0, -1.0
		for i, v := range z {
			if math.Abs(v) > zmax {
				j, zmax = i, math.Abs(v)
			}
		}
		ztx := 0.0
		for i := range z {
			ztx += z[i] * x[i]
		}
		if zmax <= ztx || j == last {
			break
		}
		clear(x)
		x[j] = 1
		last = j
		c.Solve(y, x)
		est = max(est, norm1(y))
		if signs(z, y); slices.Equal(z, sgn) {
			break
		}
		copy(sgn, z)
	}
	return max(est, altEst)
}

// signs sets z to the signs of y, +1 for zero.
func signs(z, y []float64) {
	for i, v := range y {
		if v >= 0 {
			z[i] = 1
		} else {
			z[i] = -1
		}
	}
}

// SolveMany solves A·dst[k] = b[k] for every k, spreading the right-hand
// sides (load cases) over the workers given to Factorize; dst[k] may alias
// b[k]. Each solution is bit-identical to Solve's. SolveMany panics if the
// lengths disagree.
func (c *Cholesky) SolveMany(dst, b [][]float64) {
	if len(dst) != len(b) {
		panic("sparse: SolveMany length mismatch")
	}
	parallelFor(c.workers, len(b), func(k int) { c.Solve(dst[k], b[k]) })
}
