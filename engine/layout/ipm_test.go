package layout

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize/convex/lp"
)

// denseToColumns converts a dense matrix to compressed sparse columns.
func denseToColumns(a *mat.Dense) *sparseColumns {
	m, n := a.Dims()
	sc := &sparseColumns{rows: m, cols: n, colStart: make([]int, n+1)}
	for j := 0; j < n; j++ {
		for i := 0; i < m; i++ {
			if v := a.At(i, j); v != 0 {
				sc.rowIndex = append(sc.rowIndex, int32(i))
				sc.value = append(sc.value, v)
			}
		}
		sc.colStart[j+1] = len(sc.rowIndex)
	}
	return sc
}

// TestInteriorPointAgainstSimplex checks the interior-point objective against
// gonum's dense simplex method on random feasible, bounded programs. The
// programs are built from a primal point x₀ ≥ 0 (b = A x₀) and a dual point
// with s₀ ≥ 0 (c = Aᵀy₀ + s₀), so by weak duality (Dantzig, Linear
// Programming and Extensions, 1963) an optimum exists; the two methods must
// agree on its value.
func TestInteriorPointAgainstSimplex(t *testing.T) {
	rnd := rand.New(rand.NewPCG(7, 11))
	for trial := 0; trial < 40; trial++ {
		m := 2 + rnd.IntN(8)
		n := m + 1 + rnd.IntN(12)
		t.Run(fmt.Sprintf("trial=%d,m=%d,n=%d", trial, m, n), func(t *testing.T) {
			a := mat.NewDense(m, n, nil)
			for i := 0; i < m; i++ {
				for j := 0; j < n; j++ {
					if rnd.Float64() < 0.6 {
						a.Set(i, j, rnd.NormFloat64())
					}
				}
			}
			for j := 0; j < n; j++ {
				a.Set(rnd.IntN(m), j, 1+rnd.Float64()) // no empty column
			}
			x0, y0 := make([]float64, n), make([]float64, m)
			for j := range x0 {
				if rnd.Float64() < 0.5 {
					x0[j] = rnd.Float64() * 3
				}
			}
			for i := range y0 {
				y0[i] = rnd.NormFloat64()
			}
			b := make([]float64, m)
			c := make([]float64, n)
			mat.NewVecDense(m, b).MulVec(a, mat.NewVecDense(n, x0))
			mat.NewVecDense(n, c).MulVec(a.T(), mat.NewVecDense(m, y0))
			for j := range c {
				c[j] += rnd.Float64() * 2
			}
			want, _, err := lp.Simplex(c, a, b, 1e-10, nil)
			if err != nil {
				// The program is feasible and bounded by construction, so
				// the reference must solve it; skipping would let every
				// trial pass unchecked.
				t.Fatalf("simplex failed on a feasible, bounded program: %v", err)
			}
			got, err := interiorPoint(context.Background(), denseToColumns(a), b, c, nil, 1e-10, nil, nil)
			if err != nil {
				t.Fatalf("interior point: %v", err)
			}
			if !scalar.EqualWithinAbsOrRel(got.objective, want, 1e-7, 1e-7) {
				t.Errorf("objective %.12g, simplex %.12g", got.objective, want)
			}
			for j, v := range got.x {
				if v < 0 {
					t.Errorf("x[%d] = %g < 0", j, v)
				}
			}
		})
	}
}

// TestInteriorPointWarmStart solves random programs whose first k columns
// already admit a feasible point, first over those columns to 1e-4, then
// over all columns from the first solve's central iterate (the new
// columns marked NaN), as member adding does. The optimum must be that of
// gonum's dense simplex method over all columns (weak duality bounds it,
// as in TestInteriorPointAgainstSimplex; Dantzig 1963), whatever the start.
func TestInteriorPointWarmStart(t *testing.T) {
	rnd := rand.New(rand.NewPCG(13, 17))
	for trial := 0; trial < 30; trial++ {
		m := 2 + rnd.IntN(8)
		k := m + 1 + rnd.IntN(6)
		n := k + 1 + rnd.IntN(8)
		t.Run(fmt.Sprintf("trial=%d,m=%d,k=%d,n=%d", trial, m, k, n), func(t *testing.T) {
			a := mat.NewDense(m, n, nil)
			for i := 0; i < m; i++ {
				for j := 0; j < n; j++ {
					if rnd.Float64() < 0.6 {
						a.Set(i, j, rnd.NormFloat64())
					}
				}
			}
			for j := 0; j < n; j++ {
				a.Set(rnd.IntN(m), j, 1+rnd.Float64())
			}
			x0, y0 := make([]float64, n), make([]float64, m)
			for j := range x0[:k] {
				x0[j] = 0.1 + rnd.Float64()*3 // feasible over the first k columns
			}
			for i := range y0 {
				y0[i] = rnd.NormFloat64()
			}
			b, c := make([]float64, m), make([]float64, n)
			mat.NewVecDense(m, b).MulVec(a, mat.NewVecDense(n, x0))
			mat.NewVecDense(n, c).MulVec(a.T(), mat.NewVecDense(m, y0))
			for j := range c {
				c[j] += rnd.Float64() * 2
			}
			want, _, err := lp.Simplex(c, a, b, 1e-10, nil)
			if err != nil {
				t.Fatalf("simplex failed on a feasible, bounded program: %v", err)
			}
			first, err := interiorPoint(context.Background(), denseToColumns(a.Slice(0, m, 0, k).(*mat.Dense)), b, c[:k], nil, 1e-4, nil, nil)
			if err != nil {
				t.Fatalf("first program: %v", err)
			}
			if first.centred == nil {
				t.Fatal("no central iterate kept")
			}
			warm := &warmPoint{y: first.centred.y, x: make([]float64, n), s: make([]float64, n)}
			copy(warm.x, first.centred.x)
			copy(warm.s, first.centred.s)
			for j := k; j < n; j++ {
				warm.x[j], warm.s[j] = math.NaN(), math.NaN()
			}
			got, err := interiorPoint(context.Background(), denseToColumns(a), b, c, nil, 1e-10, warm, nil)
			if err != nil {
				t.Fatalf("warm-started program: %v", err)
			}
			if !scalar.EqualWithinAbsOrRel(got.objective, want, 1e-7, 1e-7) {
				t.Errorf("objective %.12g, simplex %.12g", got.objective, want)
			}
			for j, v := range got.x {
				if !(v >= 0) {
					t.Errorf("x[%d] = %g", j, v)
				}
			}
		})
	}
}
