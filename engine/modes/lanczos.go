package modes

import (
	"context"
	"math"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"

	"gusset/engine/progress"
	"gusset/engine/sparse"
)

// pencil is the generalised symmetric eigenproblem S·x = λ·B·x with S
// positive semi-definite (the scaled stiffness) and B symmetric (a mass
// matrix, or minus a geometric stiffness, which is indefinite), solved by
// shift and invert about σ: with A = S − σ·B positive definite and
// factorised, the operator T = A⁻¹·B has the eigenvalues θ = 1/(λ − σ)
// and the eigenvectors of the pencil, and T is self-adjoint in the inner
// product ⟨x, y⟩_A = xᵀ·A·y whatever the signs of B. The eigenvalues
// nearest σ are those of T largest in magnitude, which a Krylov method
// finds first (T. Ericsson and A. Ruhe, "The spectral transformation
// Lanczos method for the numerical solution of large sparse generalized
// symmetric eigenvalue problems", Math. Comp. 35(152), 1980; the
// A-inner product for an indefinite B as in R. G. Grimes, J. G. Lewis and
// H. D. Simon, "A shifted block Lanczos algorithm for solving sparse
// symmetric generalized eigenproblems", SIAM J. Matrix Anal. Appl. 15(1),
// 1994, from memory).
type pencil struct {
	s, b, a *sparse.Matrix
	shift   float64
	factor  *sparse.Cholesky
	// positiveOnly asks for the largest θ rather than the largest |θ|
	// (vibration: λ − σ > 0 for every eigenvalue).
	positiveOnly bool
	// sNorm and bNorm are ‖S‖∞ and ‖B‖∞, set on first use.
	sNorm, bNorm float64
}

// eigenPair is an eigenpair of the pencil with its residual, the
// normwise backward error ‖S·x − λ·B·x‖₂ / ((‖S‖∞ + |λ|·‖B‖∞)·‖x‖₂)
// (the symmetric matrices' ∞-norms bounding their 2-norms; N. J. Higham
// and D. J. Higham, "Structured backward error and condition of
// generalized eigenvalue problems", SIAM J. Matrix Anal. Appl. 20(2),
// 1998, from memory): the relative change of S and B that makes (λ, x)
// exact. Unlike ‖r‖/‖S·x‖ it reaches round-off for the lowest modes of a
// stiff structure too.
type eigenPair struct {
	value    float64
	vector   []float64
	residual float64
}

// lanczosStats counts the work of one eigen-solution.
type lanczosStats struct {
	Iterations int // Lanczos steps: one solve with A each
	Solves     int // solves with A's factor, starting vectors included
	Restarts   int // thick restarts and fresh starting vectors
	Converged  bool
}

// lanczosOptions tunes the iteration.
type lanczosOptions struct {
	count     int
	tolerance float64
	maxBasis  int
	// maxIterations bounds the Lanczos steps.
	maxIterations int
	reporter      progress.Reporter
}

// lanczos finds the count eigenpairs of p nearest its shift by the
// Lanczos process on T in the A-inner product with full
// reorthogonalisation, and the Rayleigh–Ritz projection H = Qᵀ·B·Q of the
// pencil on the basis Q (QᵀAQ = I), formed entry by entry rather than
// trusted to be tridiagonal, so that the same projection serves after a
// restart. Every few steps the wanted Ritz pairs are formed and their
// residuals measured on S and B themselves.
//
// Restarts are thick (K. Wu and H. Simon, "Thick-restart Lanczos method
// for large symmetric eigenvalue problems", SIAM J. Matrix Anal. Appl.
// 22(2), 2000, from memory): the basis is replaced by its best Ritz
// vectors, on which H is diagonal, and the process goes on from T times
// the first unconverged wanted Ritz vector. That happens when the basis
// is full, and when no further pair has converged for max(count, 10)
// steps after the first has (a cluster). Once every wanted pair has
// converged, the process restarts once more from a random vector: one
// Krylov sequence holds one vector of each eigenspace, so a second copy
// of a repeated eigenvalue appears only from a fresh start; it stops
// when after count further steps the wanted set is converged and
// unchanged. Orthogonalisation is classical Gram–Schmidt applied twice
// ("twice is enough": L. Giraud, J. Langou and M. Rozložník, Comput.
// Math. Appl. 50, 2005, from memory).
//
// lanczos returns the pairs with Converged set when all met the
// tolerance within the iteration bound, and ctx.Err() when ctx is
// cancelled.
func lanczos(ctx context.Context, p *pencil, opt lanczosOptions) ([]eigenPair, lanczosStats, error) {
	n := p.a.N
	rep := progress.Or(opt.reporter)
	k := &krylov{p: p, maxBasis: min(n, opt.maxBasis), rng: rand.New(rand.NewPCG(0x5eed, uint64(n))),
		bq: make([]float64, n), z: make([]float64, n), az: make([]float64, n)}
	k.random()
	if !k.extend() {
		return nil, k.st, nil
	}
	var (
		best      []eigenPair
		verifying = -1 // iteration at which the check for missed eigenvalues ends
		previous  []float64
		progress  int // iteration at which the count of converged pairs last grew
		converged int
		patience  = max(opt.count, 10)
		limit     = max(opt.maxIterations, opt.count)
	)
	for k.st.Iterations < limit {
		if err := ctx.Err(); err != nil {
			return nil, k.st, err
		}
		k.step()
		it := k.st.Iterations
		rep.Progress("lanczos", it, limit, nil)
		full := len(k.q) == k.maxBasis
		if len(k.q) < opt.count || !(it%4 == 0 || full || it == verifying) {
			if !k.extend() && !k.restartRandom() {
				return k.finish(p, opt)
			}
			continue
		}
		pr := project(p, k.h)
		pairs, done := pr.pairs(p, k.q, opt)
		best = pairs

		values := pairValues(pairs)
		if done > converged {
			converged, progress = done, it
		}
		ok := done == opt.count
		switch {
		case ok && verifying < 0:
			verifying, previous = it+max(opt.count, 4), values
			k.thick(pr, opt.count, -1)
			if !k.restartRandom() {
				return k.finish(p, opt)
			}
			continue
		case ok && it >= verifying && sameValues(values, previous, opt.tolerance):
			k.st.Converged = true
			return pairs, k.st, nil
		case ok && it >= verifying:
			verifying, previous = it+max(opt.count, 4), values
		case full || (!ok && converged > 0 && it-progress >= patience):
			progress = it
			k.thick(pr, opt.count, done)
			if !k.extend() && !k.restartRandom() {
				return k.finish(p, opt)
			}
			continue
		}
		if !k.extend() && !k.restartRandom() {
			return k.finish(p, opt)
		}
	}
	return best, k.st, nil
}

// krylov is the state of the Lanczos process: the basis, A times it, the
// projection and the work vectors.
type krylov struct {
	p        *pencil
	maxBasis int
	rng      *rand.Rand
	st       lanczosStats
	q, aq    [][]float64 // the basis and A times it
	h        [][]float64 // rows of Qᵀ·B·Q, lower triangle
	bq, z    []float64
	az       []float64
}

// extend A-orthogonalises z against the basis and appends it normalised,
// or reports false when the basis is full or z lies in its span (to
// round-off: a breakdown).
func (k *krylov) extend() bool {
	if len(k.q) >= k.maxBasis {
		return false
	}
	before := norm2A(k.p.a, k.z, k.az)
	for range 2 {
		for i := range k.q {
			floats.AddScaled(k.z, -floats.Dot(k.aq[i], k.z), k.q[i])
		}
	}
	beta := norm2A(k.p.a, k.z, k.az)
	if !(beta > 1e-10*before) {
		return false
	}
	k.q = append(k.q, scaled(k.z, 1/beta))
	k.aq = append(k.aq, scaled(k.az, 1/beta))
	return true
}

// random puts into z the image under T of a random vector: a vector of
// T's range, weighted towards the wanted end of the spectrum.
func (k *krylov) random() {
	for i := range k.z {
		k.z[i] = k.rng.Float64() - 0.5
	}
	k.p.b.MulVec(k.bq, k.z)
	k.p.factor.Solve(k.z, k.bq)
	k.st.Solves++
}

// restartRandom goes on from a random vector (a few tries, since one may
// fall in the span of the basis); false means the basis spans the whole
// space or has reached its bound.
func (k *krylov) restartRandom() bool {
	k.st.Restarts++
	for range 3 {
		k.random()
		if k.extend() {
			return true
		}
	}
	return false
}

// finish returns the Ritz pairs of the whole basis when it can grow no
// further (it spans an invariant subspace, all of the space for a small
// problem).
func (k *krylov) finish(p *pencil, opt lanczosOptions) ([]eigenPair, lanczosStats, error) {
	if len(k.h) < len(k.q) {
		k.step()
	}
	pairs, done := project(p, k.h).pairs(p, k.q, opt)
	k.st.Converged = done == opt.count
	return pairs, k.st, nil
}

// step projects B on the newest basis vector q_j (the row j of H) and
// puts T·q_j into z.
func (k *krylov) step() {
	j := len(k.q) - 1
	k.p.b.MulVec(k.bq, k.q[j])
	row := make([]float64, j+1)
	for i := range row {
		row[i] = floats.Dot(k.q[i], k.bq)
	}
	k.h = append(k.h, row)
	k.p.factor.Solve(k.z, k.bq)
	k.st.Iterations++
	k.st.Solves++
}

// thick replaces the basis by the Ritz vectors of the 2·count + 4 Ritz
// values nearest the shift (at most half the basis bound), on which H is
// diagonal, and, when next ≥ 0, puts T times the Ritz vector of rank next
// into z to go on from.
func (k *krylov) thick(pr *projection, count, next int) {
	keep := min(len(pr.order), 2*count+4, max(k.maxBasis/2, count+1))
	q := make([][]float64, keep)
	aq := make([][]float64, keep)
	h := make([][]float64, keep)
	n := len(k.z)
	for r, c := range pr.order[:keep] {
		q[r], aq[r] = make([]float64, n), make([]float64, n)
		for i := range k.q {
			floats.AddScaled(q[r], pr.s.At(i, c), k.q[i])
			floats.AddScaled(aq[r], pr.s.At(i, c), k.aq[i])
		}
		h[r] = make([]float64, r+1)
		h[r][r] = pr.theta[c]
	}
	if next >= 0 && next < keep {
		k.p.b.MulVec(k.bq, q[next])
		k.p.factor.Solve(k.z, k.bq)
		k.st.Solves++
	}
	k.q, k.aq, k.h = q, aq, h
	k.st.Restarts++
}

// norm2A returns ‖x‖ in the A-inner product, using work for A·x.
func norm2A(a *sparse.Matrix, x, work []float64) float64 {
	a.MulVec(work, x)
	return math.Sqrt(math.Max(floats.Dot(x, work), 0))
}

func scaled(x []float64, c float64) []float64 {
	y := make([]float64, len(x))
	floats.AddScaled(y, c, x)
	return y
}

// projection is the eigen-decomposition H·s = θ·s of the projected
// pencil, with the nonzero θ ordered nearest the shift first (largest |θ|,
// or largest θ when only positive ones are wanted).
type projection struct {
	theta []float64
	s     mat.Dense
	order []int
}

// project decomposes H by gonum's dense symmetric eigensolver.
func project(p *pencil, h [][]float64) *projection {
	m := len(h)
	hs := mat.NewSymDense(m, nil)
	var hMax float64
	for i := range m {
		for j := 0; j <= i; j++ {
			hs.SetSym(i, j, h[i][j])
			hMax = max(hMax, math.Abs(h[i][j]))
		}
	}
	pr := &projection{}
	var es mat.EigenSym
	if !es.Factorize(hs, true) {
		return pr
	}
	pr.theta = es.Values(nil)
	es.VectorsTo(&pr.s)
	for i, t := range pr.theta {
		// θ = 0 carries no eigenvalue (a null vector of B).
		if math.Abs(t) > 1e-12*hMax && (!p.positiveOnly || t > 0) {
			pr.order = append(pr.order, i)
		}
	}
	slices.SortStableFunc(pr.order, func(a, b int) int {
		return -cmpFloat(math.Abs(pr.theta[a]), math.Abs(pr.theta[b]))
	})
	return pr
}

// pairs forms the count wanted Ritz pairs x = Q·s, λ = σ + 1/θ, and
// measures their residuals on the pencil. done counts the leading pairs
// (nearest the shift) that meet the tolerance.
func (pr *projection) pairs(p *pencil, q [][]float64, opt lanczosOptions) (pairs []eigenPair, done int) {
	n := p.a.N
	sx, bx := make([]float64, n), make([]float64, n)
	if p.sNorm == 0 {
		p.sNorm, p.bNorm = p.s.NormInf(), p.b.NormInf()
	}
	leading := true
	for _, k := range pr.order[:min(len(pr.order), opt.count)] {
		x := make([]float64, n)
		for i := range q {
			floats.AddScaled(x, pr.s.At(i, k), q[i])
		}
		lambda := p.shift + 1/pr.theta[k]
		p.s.MulVec(sx, x)
		p.b.MulVec(bx, x)
		den := (p.sNorm + math.Abs(lambda)*p.bNorm) * floats.Norm(x, 2)
		floats.AddScaled(sx, -lambda, bx)
		res := 0.0
		if den > 0 {
			res = floats.Norm(sx, 2) / den
		}
		leading = leading && res <= opt.tolerance
		if leading {
			done++
		}
		pairs = append(pairs, eigenPair{value: lambda, vector: x, residual: res})
	}
	return pairs, done
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

func pairValues(pairs []eigenPair) []float64 {
	v := make([]float64, len(pairs))
	for i, p := range pairs {
		v[i] = p.value
	}
	return v
}

// sameValues reports whether a and b hold the same eigenvalues to a
// relative tolerance of √tol (eigenvalues converge as the square of
// their vectors' residuals, so this is loose).
func sameValues(a, b []float64, tol float64) bool {
	if len(a) != len(b) {
		return false
	}
	rel := math.Sqrt(tol)
	for i := range a {
		if math.Abs(a[i]-b[i]) > rel*math.Max(math.Abs(a[i]), math.Abs(b[i])) {
			return false
		}
	}
	return true
}
