package stiffness

import (
	"context"
	"fmt"
	"testing"
	"time"

	"gusset/engine/model"
)

// bracedRoof builds the plane of a roof's bracing as a 2D truss: an nx × ny
// grid of 1 m × 1 m cells with chords along both axes and two crossed
// diagonals per cell (tension-only when oneSided), pinned along the short
// edge x = 0 and, with twoWalls, along x = nx too, with a wind load of
// 1 kN along +y at every other node. Half of the diagonals go slack; with
// two walls the shear changes sign at mid-span, and the members near it
// take several passes to settle.
func bracedRoof(nx, ny int, oneSided, twoWalls bool) *model.Model {
	bl := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	id := func(i, j int) int { return j*(nx+1) + i }
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			bl.node(float64(i), float64(j))
		}
	}
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			if i < nx {
				bl.bar(id(i, j), id(i+1, j))
			}
			if j < ny {
				bl.bar(id(i, j), id(i, j+1))
			}
			if i < nx && j < ny {
				for _, e := range []int{bl.bar(id(i, j), id(i+1, j+1)), bl.bar(id(i+1, j), id(i, j+1))} {
					if oneSided {
						bl.m.Members[e].Behaviour = model.TensionOnly
					}
				}
			}
			if i == 0 || twoWalls && i == nx {
				bl.fix(id(i, j), pinned2...)
			} else {
				bl.force(id(i, j), [3]float64{0, 1}, [3]float64{})
			}
		}
	}
	return bl.m
}

// BenchmarkTensionOnlyRoof measures the active-set iteration on a braced
// roof of about 10k members (50 × 50 cells; pinned along one wall, or
// two) side by side with the linear solve of the same model with two-way
// diagonals, in one run: per iteration both are solved once. Metrics: the
// iterated solve's time over the linear solve's (ratio-to-solve) and over
// one numeric factorisation of the linear solve (factorisations-worth)
// and over one factorisation from scratch, ordering and symbolic analysis
// included (full-factorisations-worth; the target, under 5
// factorisations' worth, reusing the symbolic analysis), its solves and
// factorisations.
func BenchmarkTensionOnlyRoof(b *testing.B) {
	for _, walls := range []int{1, 2} {
		for _, n := range []int{25, 50} {
			iter, lin := bracedRoof(n, n, true, walls == 2), bracedRoof(n, n, false, walls == 2)
			b.Run(fmt.Sprintf("walls=%d/members=%d", walls, len(iter.Members)), func(b *testing.B) { benchRoof(b, iter, lin) })
		}
	}
}

// benchRoof solves lin (linear) and iter (one-sided) once per iteration
// and reports their ratios.
func benchRoof(b *testing.B, iter, lin *model.Model) {
	ctx := context.Background()
	var tLin, tIter, tFactor, tFull, iterFactor, iterAssemble time.Duration
	var solves, factors int
	b.ResetTimer()
	for range b.N {
		start := time.Now()
		lr, err := Solve(ctx, lin, Options{Path: Sparse})
		if err != nil {
			b.Fatal(err)
		}
		tLin += time.Since(start)
		tFactor += lr.Stats.Factor
		tFull += lr.Stats.Order + lr.Stats.Factor
		start = time.Now()
		ir, err := Solve(ctx, iter, Options{Path: Sparse})
		if err != nil {
			b.Fatal(err)
		}
		tIter += time.Since(start)
		iterFactor += ir.Stats.Factor
		iterAssemble += ir.Stats.Assemble
		solves += ir.Cases[0].Iteration.Iterations
		factors += ir.Cases[0].Iteration.Factorisations
	}
	b.ReportMetric(float64(tIter)/float64(tLin), "ratio-to-solve")
	b.ReportMetric(float64(tIter)/float64(tFactor), "factorisations-worth")
	b.ReportMetric(float64(tIter)/float64(tFull), "full-factorisations-worth")
	b.ReportMetric(float64(solves)/float64(b.N), "solves")
	b.ReportMetric(float64(factors)/float64(b.N), "factorisations")
	b.ReportMetric(float64(tLin.Microseconds())/1e3/float64(b.N), "linear-ms")
	b.ReportMetric(float64(tIter.Microseconds())/1e3/float64(b.N), "iterated-ms")
	b.ReportMetric(float64(iterFactor.Microseconds())/1e3/float64(b.N), "iterated-factor-ms")
	b.ReportMetric(float64(iterAssemble.Microseconds())/1e3/float64(b.N), "iterated-assemble-ms")
	b.ReportMetric(float64(tFactor.Microseconds())/1e3/float64(b.N), "linear-factor-ms")
}
