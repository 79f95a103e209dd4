package sparse

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"sync"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
)

const eps = 0x1p-52

// scaledResidual returns ‖A·x − b‖∞ / (‖A‖∞‖x‖∞ ε).
func scaledResidual(a *Matrix, x, b []float64) float64 {
	ax := make([]float64, a.N)
	a.MulVec(ax, x)
	r := 0.0
	for i := range ax {
		r = max(r, math.Abs(ax[i]-b[i]))
	}
	return r / (a.NormInf() * normInf(x) * eps)
}

func nanVec(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = math.NaN()
	}
	return v
}

func randomVec(n int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 1))
	v := make([]float64, n)
	for i := range v {
		v[i] = rng.NormFloat64()
	}
	return v
}

// factorEntry returns L(i, j) in the permuted numbering, 0 outside the
// stored structure.
func factorEntry(c *Cholesky, i, j int) float64 {
	sym := c.sym
	s := 0
	for sym.superFirst[s+1] <= j {
		s++
	}
	first := sym.superFirst[s]
	ns := sym.superFirst[s+1] - first
	rows := sym.rows[sym.rowPtr[s]:sym.rowPtr[s+1]]
	m := ns + len(rows)
	block := c.val[sym.valPtr[s]:sym.valPtr[s+1]]
	k := j - first
	if i < first+ns {
		if i < j {
			return 0
		}
		return block[k*m+(i-first)]
	}
	if t, ok := slices.BinarySearch(rows, i); ok {
		return block[k*m+ns+t]
	}
	return 0
}

// TestFactorizeAgainstGonum compares solutions and factors with gonum's
// dense Cholesky (reference library) on random SPD matrices of several
// patterns. The factor of P·A·Pᵀ with positive diagonal is unique, so L must
// match gonum's entry by entry to rounding. The scaled residual must stay
// below 3n+1, the constant of the backward-error bound for Cholesky solves
// (N. J. Higham, "Accuracy and Stability of Numerical Algorithms", 2nd ed.,
// SIAM 2002, Theorem 10.4, with ‖|Lᵀ||L|‖ ≤ n‖A‖ for SPD A; from memory).
func TestFactorizeAgainstGonum(t *testing.T) {
	for _, tc := range []struct {
		kind string
		n    int
	}{
		{"diagonal", 1}, {"diagonal", 9}, {"random", 7}, {"random", 150}, {"banded", 120},
		{"arrow", 80}, {"blocks", 64}, {"random", 400},
	} {
		a := randomSPD(tc.n, tc.kind, uint64(tc.n))
		b := randomVec(a.N, 2)
		var ref mat.Cholesky
		if !ref.Factorize(dense(a)) {
			t.Fatalf("%s n=%d: gonum Cholesky failed", tc.kind, tc.n)
		}
		var want mat.VecDense
		if err := ref.SolveVecTo(&want, mat.NewVecDense(a.N, b)); err != nil {
			t.Fatal(err)
		}
		for _, workers := range []int{1, 2} {
			c, err := Factorize(context.Background(), a, Options{Workers: workers})
			if err != nil {
				t.Fatalf("%s n=%d: %v", tc.kind, tc.n, err)
			}
			x := nanVec(a.N)
			c.Solve(x, b)
			for i := range x {
				// Diagonally dominant: κ is small, so 1e-12 relative is ample.
				if !scalar.EqualWithinAbsOrRel(x[i], want.AtVec(i), 1e-12, 1e-12) {
					t.Fatalf("%s n=%d workers=%d: x[%d] = %v, want %v", tc.kind, tc.n, workers, i, x[i], want.AtVec(i))
				}
			}
			if r := scaledResidual(a, x, b); r > float64(3*a.N+1) {
				t.Errorf("%s n=%d: scaled residual %.3g above 3n+1", tc.kind, tc.n, r)
			}
			// L against gonum's factor of the permuted matrix.
			perm := c.sym.perm
			d := dense(a)
			p := mat.NewSymDense(a.N, nil)
			for i := 0; i < a.N; i++ {
				for j := 0; j <= i; j++ {
					p.SetSym(i, j, d.At(perm[i], perm[j]))
				}
			}
			var pc mat.Cholesky
			pc.Factorize(p)
			var l mat.TriDense
			pc.LTo(&l)
			for i := 0; i < a.N; i++ {
				for j := 0; j <= i; j++ {
					if got, want := factorEntry(c, i, j), l.At(i, j); !scalar.EqualWithinAbsOrRel(got, want, 1e-13, 1e-12) {
						t.Fatalf("%s n=%d: L(%d,%d) = %v, want %v", tc.kind, tc.n, i, j, got, want)
					}
				}
			}
		}
	}
}

// TestLaplacian1D checks the factor and solution of tridiag(−1, 2, −1)
// against closed forms, derivable by induction: the pivots are
// d_i = (i+1)/i (1-based), since d_1 = 2 and d_{i+1} = 2 − 1/d_i, so
// L_ii = √((i+1)/i) and L_{i+1,i} = −1/L_ii = −√(i/(i+1)); the solution of
// A·x = 1 is x_i = i(n+1−i)/2, the discrete parabola (from memory; it
// satisfies −x_{i−1} + 2x_i − x_{i+1} = 1 with x_0 = x_{n+1} = 0).
func TestLaplacian1D(t *testing.T) {
	for _, n := range []int{1, 2, 10, 1000} {
		a := laplacian1D(n)
		natural, err := Factorize(context.Background(), a, Options{Perm: identity(n)})
		if err != nil {
			t.Fatal(err)
		}
		for i := 1; i <= n; i++ {
			if got, want := factorEntry(natural, i-1, i-1), math.Sqrt(float64(i+1)/float64(i)); !scalar.EqualWithinAbsOrRel(got, want, 1e-14, 1e-14) {
				t.Fatalf("n=%d: L_%d,%d = %v, want %v", n, i, i, got, want)
			}
			if i < n {
				if got, want := factorEntry(natural, i, i-1), -math.Sqrt(float64(i)/float64(i+1)); !scalar.EqualWithinAbsOrRel(got, want, 1e-14, 1e-14) {
					t.Fatalf("n=%d: L_%d,%d = %v, want %v", n, i+1, i, got, want)
				}
			}
		}
		ordered, err := Factorize(context.Background(), a, Options{})
		if err != nil {
			t.Fatal(err)
		}
		ones := make([]float64, n)
		for i := range ones {
			ones[i] = 1
		}
		for _, c := range []*Cholesky{natural, ordered} {
			x := nanVec(n)
			c.Solve(x, ones)
			for i := 1; i <= n; i++ {
				// κ(A) ≈ 4n²/π², so allow n² ulps (common practice).
				want := float64(i*(n+1-i)) / 2
				if !scalar.EqualWithinAbsOrRel(x[i-1], want, 1e-12, float64(n*n)*eps*10) {
					t.Fatalf("n=%d: x_%d = %v, want %v", n, i, x[i-1], want)
				}
			}
		}
	}
}

// TestStiffnessResidual solves grid truss and space grid stiffness matrices
// and checks the scaled residual after refinement against the same 3n+1
// bound (Higham 2002, Theorem 10.4, from memory); in practice it is a few ε.
func TestStiffnessResidual(t *testing.T) {
	for _, tc := range []struct {
		name string
		a    *Matrix
	}{
		{"grid truss 30×20", gridTruss2D(30, 20, 1)},
		{"double-layer grid 10×10", doubleLayerGrid(10, 2)},
	} {
		c, err := Factorize(context.Background(), tc.a, Options{})
		if err != nil {
			t.Fatal(err)
		}
		b := randomVec(tc.a.N, 3)
		x := nanVec(tc.a.N)
		rel := c.SolveRefined(tc.a, x, b, 3)
		r := scaledResidual(tc.a, x, b)
		t.Logf("%s: scaled residual %.3g, refined relative residual %.3g", tc.name, r, rel)
		if r > float64(3*tc.a.N+1) || math.IsNaN(r) {
			t.Errorf("%s: scaled residual %.3g", tc.name, r)
		}
		if rel > 100*eps {
			t.Errorf("%s: refinement left relative residual %.3g above 100ε", tc.name, rel)
		}
		// SolveRefined may overwrite its right-hand side.
		y := slices.Clone(b)
		c.SolveRefined(tc.a, y, y, 3)
		if !slices.Equal(x, y) {
			t.Errorf("%s: SolveRefined with dst aliasing b differs", tc.name)
		}
	}
}

// rankOf returns the numerical rank of a from gonum's SVD (reference
// library), counting singular values above n·ε·σ_max (common practice).
func rankOf(a *Matrix) int {
	var svd mat.SVD
	if !svd.Factorize(dense(a), mat.SVDNone) {
		panic("svd failed")
	}
	s := svd.Values(nil)
	r := 0
	for _, v := range s {
		if v > float64(a.N)*eps*s[0]*10 {
			r++
		}
	}
	return r
}

// withoutIndices returns a with every entry in the given rows and columns
// removed (a freedom with no stiffness at all).
func withoutIndices(a *Matrix, drop ...int) *Matrix {
	b := NewBuilder(a.N, a.Nonzeros())
	for j := 0; j < a.N; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			i := a.RowIdx[p]
			if !slices.Contains(drop, i) && !slices.Contains(drop, j) {
				b.Add(i, j, a.Val[p])
			}
		}
	}
	return b.Matrix()
}

// freeChain returns a matrix with a positive diagonal on [0, n) except for
// the block [lo, hi), which holds the stiffness of a free chain of springs:
// positive semidefinite with the rigid translation as its only null vector.
func freeChain(n, lo, hi int) *Matrix {
	b := NewBuilder(n, 3*n)
	for i := 0; i < n; i++ {
		if i < lo || i >= hi {
			b.Add(i, i, 3)
		}
	}
	for i := lo; i+1 < hi; i++ {
		b.Add(i, i, 1)
		b.Add(i+1, i+1, 1)
		b.Add(i, i+1, -1)
	}
	return b.Matrix()
}

// gridTrussFree returns the grid truss stiffness without springs to
// ground: a free body in the plane with three rigid-body motions.
func gridTrussFree(nx, ny int) *Matrix {
	a := gridTruss2D(nx, ny, 4)
	for j := 0; j < a.N; j++ {
		a.Val[a.Find(j, j)] -= 1e-3
	}
	return a
}

type deficientCase struct {
	name   string
	a      *Matrix
	perm   []int
	want   []int // exact deficient columns when known, else nil
	inside []int // when want is nil: the deficient columns must lie in here
}

func deficientCases() []deficientCase {
	return []deficientCase{
		{name: "zero row and column", a: withoutIndices(randomSPD(12, "random", 5), 5), want: []int{5}},
		{name: "two zero rows", a: withoutIndices(randomSPD(40, "banded", 6), 2, 31), want: []int{2, 31}},
		{name: "free chain, natural order", a: freeChain(10, 4, 8), perm: identity(10), want: []int{7}},
		{name: "free chain, minimum degree", a: freeChain(10, 4, 8), inside: []int{4, 5, 6, 7}},
		{name: "free plane truss", a: gridTrussFree(6, 5), inside: identity(60)},
	}
}

// TestDeficient checks that every deficient pivot is found: their number
// equals the nullity n − rank(A) from gonum's SVD, and the principal
// submatrix on the other columns is positive definite (gonum's Cholesky
// succeeds), so holding exactly those freedoms makes the matrix stable.
func TestDeficient(t *testing.T) {
	for _, tc := range deficientCases() {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Factorize(context.Background(), tc.a, Options{Perm: tc.perm})
			var pe *PivotError
			if !errors.As(err, &pe) {
				t.Fatalf("err = %v, want *PivotError", err)
			}
			if len(pe.Columns) != len(pe.Pivots) {
				t.Fatalf("%d columns but %d pivots", len(pe.Columns), len(pe.Pivots))
			}
			if tc.want != nil && !slices.Equal(pe.Columns, tc.want) {
				t.Fatalf("deficient columns %v, want %v", pe.Columns, tc.want)
			}
			for _, c := range pe.Columns {
				if tc.want == nil && !slices.Contains(tc.inside, c) {
					t.Fatalf("deficient column %d outside %v", c, tc.inside)
				}
			}
			if nullity := tc.a.N - rankOf(tc.a); len(pe.Columns) != nullity {
				t.Fatalf("%d deficient columns %v, nullity from SVD is %d", len(pe.Columns), pe.Columns, nullity)
			}
			var keep []int
			for i := 0; i < tc.a.N; i++ {
				if !slices.Contains(pe.Columns, i) {
					keep = append(keep, i)
				}
			}
			d := dense(tc.a)
			sub := mat.NewSymDense(len(keep), nil)
			for r, i := range keep {
				for s, j := range keep[:r+1] {
					sub.SetSym(r, s, d.At(i, j))
				}
			}
			var ch mat.Cholesky
			if !ch.Factorize(sub) {
				t.Errorf("matrix without columns %v is not positive definite", pe.Columns)
			}
		})
	}
}

// TestRegularize checks that with Regularize the same columns are listed,
// and that for a consistent right-hand side b = A·x₀ the solution satisfies
// A·x = b to round-off with x = 0 at the deficient freedoms (those freedoms
// are held; the argument: vᵀ(A + δ·e_j e_jᵀ)x = vᵀb = 0 for the null vector
// v forces x_j = 0 when v_j ≠ 0; derivable).
func TestRegularize(t *testing.T) {
	for _, tc := range deficientCases() {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Factorize(context.Background(), tc.a, Options{Perm: tc.perm})
			var pe *PivotError
			errors.As(err, &pe)
			c, err := Factorize(context.Background(), tc.a, Options{Perm: tc.perm, Regularize: true})
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(c.Deficient(), pe.Columns) {
				t.Fatalf("Deficient() = %v, PivotError lists %v", c.Deficient(), pe.Columns)
			}
			x0 := randomVec(tc.a.N, 8)
			b := make([]float64, tc.a.N)
			tc.a.MulVec(b, x0)
			x := nanVec(tc.a.N)
			c.Solve(x, b)
			for _, j := range c.Deficient() {
				if math.Abs(x[j]) > 1e-8*normInf(x) {
					t.Errorf("x[%d] = %v at a deficient freedom, want 0", j, x[j])
				}
			}
			// A loose multiple of the 3n+1 bound: the null space adds a
			// conditioning factor (common practice).
			if r := scaledResidual(tc.a, x, b); !(r < 100*float64(3*tc.a.N+1)) {
				t.Errorf("scaled residual %.3g for a consistent right-hand side", r)
			}
		})
	}
}

// TestBadPivots covers pivots that are negative, NaN or tiny: a diagonal
// matrix's pivots are its diagonal entries (trivially).
func TestBadPivots(t *testing.T) {
	b := NewBuilder(6, 6)
	for i, v := range []float64{4, -1, math.NaN(), 1e-15, 2, 0} {
		b.Add(i, i, v)
	}
	a := b.Matrix()
	_, err := Factorize(context.Background(), a, Options{})
	var pe *PivotError
	if !errors.As(err, &pe) {
		t.Fatalf("err = %v, want *PivotError", err)
	}
	// 1e-15 ≤ 1e-13·4: deficient under the default tolerance.
	if want := []int{1, 2, 3, 5}; !slices.Equal(pe.Columns, want) {
		t.Errorf("deficient columns %v, want %v", pe.Columns, want)
	}
	if pe.Pivots[0] != -1 || !math.IsNaN(pe.Pivots[1]) || pe.Pivots[2] != 1e-15 || pe.Pivots[3] != 0 {
		t.Errorf("pivots %v", pe.Pivots)
	}
	// A looser tolerance accepts the small pivot... and a tighter one
	// rejects more.
	_, err = Factorize(context.Background(), a, Options{PivotTolerance: 1e-17})
	errors.As(err, &pe)
	if want := []int{1, 2, 5}; !slices.Equal(pe.Columns, want) {
		t.Errorf("tolerance 1e-17: deficient columns %v, want %v", pe.Columns, want)
	}
}

type cancelReporter struct {
	mu     sync.Mutex
	cancel context.CancelFunc
	stages []string
	bad    bool
}

func (r *cancelReporter) Progress(stage string, done, total int, _ any) {
	r.mu.Lock()
	defer r.mu.Unlock()
	if len(r.stages) == 0 || r.stages[len(r.stages)-1] != stage {
		r.stages = append(r.stages, stage)
	}
	if done < 0 || (total > 0 && done > total) {
		r.bad = true
	}
	if stage == "factorising" && done > 0 && r.cancel != nil {
		r.cancel()
	}
}

func TestCancel(t *testing.T) {
	a := gridTruss2D(40, 40, 1)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Factorize(ctx, a, Options{}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled before: err = %v, want context.Canceled", err)
	}
	for _, workers := range []int{1, 2} {
		ctx, cancel := context.WithCancel(context.Background())
		rep := &cancelReporter{cancel: cancel}
		c, err := Factorize(ctx, a, Options{Workers: workers, Reporter: rep})
		if c != nil || !errors.Is(err, context.Canceled) {
			t.Errorf("workers=%d: cancelled while factorising: c=%v err=%v, want context.Canceled", workers, c, err)
		}
		cancel()
	}
}

func TestProgressStages(t *testing.T) {
	rep := &cancelReporter{}
	if _, err := Factorize(context.Background(), gridTruss2D(20, 20, 1), Options{Reporter: rep}); err != nil {
		t.Fatal(err)
	}
	if want := []string{"ordering", "symbolic", "factorising"}; !slices.Equal(rep.stages, want) || rep.bad {
		t.Errorf("stages %v (bad counts %v), want %v", rep.stages, rep.bad, want)
	}
}

// TestDeterminism: the factor and the solution are bit-identical whatever
// the number of workers (the package's contract).
func TestDeterminism(t *testing.T) {
	// The space grid has separators wider than the strips of the dense
	// kernels, so the shared dense operations are exercised too.
	for _, a := range []*Matrix{gridTruss2D(60, 50, 2), doubleLayerGrid(40, 3)} {
		b := randomVec(a.N, 4)
		var vals [][]float64
		var sols [][]float64
		for _, workers := range []int{1, 2, 2, 3} {
			c, err := Factorize(context.Background(), a, Options{Workers: workers})
			if err != nil {
				t.Fatal(err)
			}
			x := nanVec(a.N)
			c.Solve(x, b)
			vals = append(vals, c.val)
			sols = append(sols, x)
		}
		for k := 1; k < len(vals); k++ {
			if !slices.Equal(vals[0], vals[k]) || !slices.Equal(sols[0], sols[k]) {
				t.Errorf("n=%d: run %d differs from the single-worker factor", a.N, k)
			}
		}
	}
}

// TestConditionEstimate compares with κ₁ = ‖A‖₁‖A⁻¹‖₁ computed from gonum's
// dense inverse (reference library), and on the 1D Laplacian with the closed
// form: (A⁻¹)_ij = i(n+1−j)/(n+1) for i ≤ j, whose largest column sum is the
// largest x_i = i(n+1−i)/2 of the ones solve, so κ₁ = 4·max_i i(n+1−i)/2
// (from memory; derivable from the Green's function of −u” = f).
func TestConditionEstimate(t *testing.T) {
	a := laplacian1D(50)
	c, err := Factorize(context.Background(), a, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if got, want := c.ConditionEstimate(), 4*25.0*26/2; !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-9) {
		t.Errorf("1D Laplacian n=50: estimate %v, want %v", got, want)
	}
	for _, tc := range []struct {
		kind string
		a    *Matrix
	}{
		{"random", randomSPD(60, "random", 12)},
		{"banded", randomSPD(60, "banded", 12)},
		{"arrow", randomSPD(60, "arrow", 12)},
		{"2D truss", gridTruss2D(12, 9, 3)},
		{"double-layer grid", doubleLayerGrid(4, 5)},
		{"cube truss", cubeTruss(3, 7)},
	} {
		kind, a := tc.kind, tc.a
		c, err := Factorize(context.Background(), a, Options{})
		if err != nil {
			t.Fatal(err)
		}
		var inv mat.Dense
		if err := inv.Inverse(dense(a)); err != nil {
			t.Fatal(err)
		}
		exact := mat.Norm(dense(a), 1) * mat.Norm(&inv, 1)
		// Hager's estimate never exceeds the true norm and is usually within
		// a factor 3 of it (Higham 1988, from memory).
		if got := c.ConditionEstimate(); got > exact*(1+1e-9) || got < exact/3 {
			t.Errorf("%s: estimate %v, exact κ₁ %v", kind, got, exact)
		}
		// Stopping on a repeated sign vector changes the work, not the
		// estimate.
		if got, was := c.inverseNorm1(), hagerBaseline(c); got != was {
			t.Errorf("%s: ‖A⁻¹‖₁ estimate %v, Hager's loop as it was %v", kind, got, was)
		}
	}
}

// TestStats: a dense n×n matrix is one supernode whose factorisation costs
// n³/3 + O(n²) flops (G. H. Golub and C. F. Van Loan, "Matrix Computations",
// 4th ed., 2013, Algorithm 4.2.1: n³/3 flops); the natural order of the 2D
// Laplacian fills its envelope exactly (see TestGridFill).
func TestStats(t *testing.T) {
	n := 30
	b := NewBuilder(n, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < i; j++ {
			b.Add(i, j, 1)
		}
		b.Add(i, i, float64(n))
	}
	c, err := Factorize(context.Background(), b.Matrix(), Options{})
	if err != nil {
		t.Fatal(err)
	}
	st := c.Stats()
	if st.N != n || st.NonzerosA != n*(n+1)/2 || st.NonzerosL != n*(n+1)/2 || st.Supernodes != 1 {
		t.Errorf("dense stats %+v", st)
	}
	if want := float64(n*n*n) / 3; !scalar.EqualWithinAbsOrRel(st.Flops, want, 0, 1e-12) {
		t.Errorf("flops %v, want n³/3 = %v", st.Flops, want)
	}
	k := 12
	a := laplacian2D(k)
	c, err = Factorize(context.Background(), a, Options{Perm: identity(k * k)})
	if err != nil {
		t.Fatal(err)
	}
	if got, want := c.Stats().NonzerosL, (k*k-k)*(k+1)+2*k-1; got != want {
		t.Errorf("natural order: NonzerosL %d, want envelope %d", got, want)
	}
}

// TestRefactorize refills a fixed pattern with new values, as a sweep
// does, and compares the solution with gonum's dense Cholesky (reference
// library); a deficient refill fails and a later good one recovers.
func TestRefactorize(t *testing.T) {
	a := randomSPD(120, "random", 21)
	c, err := Factorize(context.Background(), a, Options{})
	if err != nil {
		t.Fatal(err)
	}
	b := randomVec(a.N, 22)
	for round, scale := range []float64{0.5, -0.25} {
		for j := 0; j < a.N; j++ {
			for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
				if a.RowIdx[p] != j {
					a.Val[p] *= scale
				}
			}
		}
		if err := c.Refactorize(context.Background(), a); err != nil {
			t.Fatal(err)
		}
		var ref mat.Cholesky
		ref.Factorize(dense(a))
		var want mat.VecDense
		ref.SolveVecTo(&want, mat.NewVecDense(a.N, b))
		x := nanVec(a.N)
		c.Solve(x, b)
		for i := range x {
			if !scalar.EqualWithinAbsOrRel(x[i], want.AtVec(i), 1e-12, 1e-12) {
				t.Fatalf("round %d: x[%d] = %v, want %v", round, i, x[i], want.AtVec(i))
			}
		}
	}
	// Zero one diagonal entry and its column: the freedom is unrestrained.
	saved := slices.Clone(a.Val)
	for j := 0; j < a.N; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			if a.RowIdx[p] == 17 || j == 17 {
				a.Val[p] = 0
			}
		}
	}
	var pe *PivotError
	if err := c.Refactorize(context.Background(), a); !errors.As(err, &pe) || !slices.Equal(pe.Columns, []int{17}) {
		t.Fatalf("err = %v, want a PivotError at column 17", err)
	}
	copy(a.Val, saved)
	if err := c.Refactorize(context.Background(), a); err != nil {
		t.Fatal(err)
	}
	x := nanVec(a.N)
	c.Solve(x, b)
	if r := scaledResidual(a, x, b); r > float64(3*a.N+1) {
		t.Errorf("scaled residual %.3g after recovery", r)
	}
	defer func() {
		if recover() == nil {
			t.Error("Refactorize with another structure did not panic")
		}
	}()
	c.Refactorize(context.Background(), randomSPD(120, "banded", 1))
}

// TestSolveMany: several load cases solved together equal separate solves
// (the contract), and each solves its system (scaled residual, Higham 2002
// Theorem 10.4 bound 3n+1, from memory).
func TestSolveMany(t *testing.T) {
	a := gridTruss2D(20, 15, 9)
	c, err := Factorize(context.Background(), a, Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	var bs, xs [][]float64
	for k := 0; k < 5; k++ {
		bs = append(bs, randomVec(a.N, uint64(30+k)))
		xs = append(xs, nanVec(a.N))
	}
	c.SolveMany(xs, bs)
	for k := range bs {
		one := nanVec(a.N)
		c.Solve(one, bs[k])
		if !slices.Equal(one, xs[k]) {
			t.Errorf("case %d differs from Solve", k)
		}
		if r := scaledResidual(a, xs[k], bs[k]); r > float64(3*a.N+1) {
			t.Errorf("case %d: scaled residual %.3g", k, r)
		}
	}
}

// TestEmpty: a 0×0 matrix factorises and solves trivially.
func TestEmpty(t *testing.T) {
	a := NewBuilder(0, 0).Matrix()
	c, err := Factorize(context.Background(), a, Options{})
	if err != nil {
		t.Fatal(err)
	}
	c.Solve(nil, nil)
	if got := c.SolveRefined(a, nil, nil, 2); got != 0 {
		t.Errorf("relative residual %v, want 0", got)
	}
	if got := c.ConditionEstimate(); got != 0 {
		t.Errorf("condition estimate %v, want 0", got)
	}
}
