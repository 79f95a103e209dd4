package sparse

import (
	"context"
	"fmt"
	"math"
	"testing"
	"time"
)

// BenchmarkFactorize factorises and solves stiffness-like matrices: plane
// grid trusses (2 freedoms per node, 8-neighbour bars) of about 10k, 100k
// and 300k freedoms and a double-layer space grid (3 freedoms per node) of
// about 40k freedoms, and a cubic lattice truss of 22³ nodes (about 94k
// bars, 32k freedoms), with 1 and 2 workers. Each iteration is a whole
// Factorize (ordering, symbolic, numeric) plus one Solve. The phase times
// reported are the fastest over the iterations, which filters out the noise
// of a machine shared with other work.
func BenchmarkFactorize(b *testing.B) {
	for _, tc := range []struct {
		name string
		make func() *Matrix
	}{
		{"grid2d/n=10k", func() *Matrix { return gridTruss2D(71, 71, 1) }},
		{"spacegrid/n=40k", func() *Matrix { return doubleLayerGrid(82, 1) }},
		{"cube3d/n=32k", func() *Matrix { return cubeTruss(22, 1) }},
		{"grid2d/n=100k", func() *Matrix { return gridTruss2D(224, 224, 1) }},
		{"grid2d/n=300k", func() *Matrix { return gridTruss2D(388, 388, 1) }},
	} {
		var a *Matrix
		for _, workers := range []int{1, 2} {
			b.Run(fmt.Sprintf("%s/workers=%d", tc.name, workers), func(b *testing.B) {
				if a == nil {
					a = tc.make()
				}
				rhs := randomVec(a.N, 1)
				x := make([]float64, a.N)
				var st Stats
				best := Stats{Ordering: time.Hour, Symbolic: time.Hour, Numeric: time.Hour}
				solve, total := time.Hour, time.Hour
				b.ResetTimer()
				for range b.N {
					start := time.Now()
					c, err := Factorize(context.Background(), a, Options{Workers: workers})
					if err != nil {
						b.Fatal(err)
					}
					mid := time.Now()
					c.Solve(x, rhs)
					solve = min(solve, time.Since(mid))
					total = min(total, time.Since(start))
					st = c.Stats()
					best.Ordering = min(best.Ordering, st.Ordering)
					best.Symbolic = min(best.Symbolic, st.Symbolic)
					best.Numeric = min(best.Numeric, st.Numeric)
				}
				b.ReportMetric(float64(a.N), "n")
				b.ReportMetric(float64(st.NonzerosL), "nnzL")
				b.ReportMetric(st.Flops, "flops")
				b.ReportMetric(best.Ordering.Seconds()*1e3, "order-ms")
				b.ReportMetric(best.Symbolic.Seconds()*1e3, "symbolic-ms")
				b.ReportMetric(best.Numeric.Seconds()*1e3, "numeric-ms")
				b.ReportMetric(solve.Seconds()*1e3, "solve-ms")
				b.ReportMetric(total.Seconds()*1e3, "best-total-ms")
				b.ReportMetric(st.Flops/best.Numeric.Seconds()/1e9, "GFLOP/s")
			})
		}
	}
}

// BenchmarkOrder times the minimum-degree ordering alone on 2D grid trusses.
func BenchmarkOrder(b *testing.B) {
	for _, k := range []int{71, 224} {
		a := gridTruss2D(k, k, 1)
		b.Run(fmt.Sprintf("n=%d", a.N), func(b *testing.B) {
			b.ResetTimer()
			for range b.N {
				Order(a)
			}
		})
	}
}

// BenchmarkChooseOrder times the orderings Factorize chooses between, each
// alone and the choice (both side by side on two workers, with their
// column counts), on a plane grid truss of about 100k freedoms and a
// double-layer space grid of about 40k, reporting nnz(L) of each.
func BenchmarkChooseOrder(b *testing.B) {
	for _, tc := range []struct {
		name string
		make func() *Matrix
	}{
		{"grid2d/n=100k", func() *Matrix { return gridTruss2D(224, 224, 1) }},
		{"spacegrid/n=40k", func() *Matrix { return doubleLayerGrid(82, 1) }},
	} {
		a := tc.make()
		for _, o := range []struct {
			name  string
			order func() []int
		}{
			{"minimum-degree", func() []int { return Order(a) }},
			{"nested", func() []int { return OrderNested(a) }},
			{"chosen", func() []int { perm, _, _ := chooseOrder(a, 2); return perm }},
		} {
			b.Run(tc.name+"/"+o.name, func(b *testing.B) {
				var perm []int
				for range b.N {
					perm = o.order()
				}
				_, count := countsFor(a, perm)
				nnz := 0
				for _, c := range count {
					nnz += c
				}
				b.ReportMetric(float64(nnz), "nnzL")
			})
		}
	}
}

// BenchmarkConditionEstimate times the 1-norm condition estimate of a
// factorised 2D braced grid (gridTruss2D, 2 freedoms a node: Hager's
// iteration creeps along the grid and runs to its bound, 11 solves) and
// of the 2D Laplacian (the sign vector repeats on the second iterate)
// beside the estimate as it was before it stopped on a repeated sign
// vector (hagerBaseline), interleaved in one run; "ratio" is the mean
// time of the estimate over the baseline's, and both estimates must be
// equal.
func BenchmarkConditionEstimate(b *testing.B) {
	for _, tc := range []struct {
		name string
		a    *Matrix
	}{{"truss2D", gridTruss2D(100, 100, 1)}, {"laplacian2D", laplacian2D(300)}} {
		a := tc.a
		c, err := Factorize(context.Background(), a, Options{})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("%s/n=%d", tc.name, a.N), func(b *testing.B) {
			var now, was time.Duration
			for range b.N {
				start := time.Now()
				est := c.inverseNorm1()
				mid := time.Now()
				base := hagerBaseline(c)
				was += time.Since(mid)
				now += mid.Sub(start)
				if est != base {
					b.Fatalf("estimate %g, baseline %g", est, base)
				}
			}
			b.ReportMetric(now.Seconds()*1e3/float64(b.N), "estimate-ms")
			b.ReportMetric(was.Seconds()*1e3/float64(b.N), "baseline-ms")
			b.ReportMetric(now.Seconds()/was.Seconds(), "ratio")
		})
	}
}

// hagerBaseline is inverseNorm1 as it was: Hager's iteration with a test
// after every second solve, then the alternating-sign vector on its own.
func hagerBaseline(c *Cholesky) float64 {
	n := c.sym.n
	x := make([]float64, n)
	for i := range x {
		x[i] = 1 / float64(n)
	}
	y, z := make([]float64, n), make([]float64, n)
	est, last := 0.0, -1
	for range 5 {
		c.Solve(y, x)
		est = max(est, norm1(y))
		signs(z, y)
		c.Solve(z, z)
		j, zmax := 0, -1.0
		ztx := 0.0
		for i, v := range z {
			if math.Abs(v) > zmax {
				j, zmax = i, math.Abs(v)
			}
			ztx += v * x[i]
		}
		if zmax <= ztx || j == last {
			break
		}
		clear(x)
		x[j], last = 1, j
	}
	for i := range x {
		x[i] = (1 - 2*float64(i%2)) * (1 + float64(i)/float64(max(n-1, 1)))
	}
	c.Solve(y, x)
	return max(est, 2*norm1(y)/(3*float64(n)))
}
