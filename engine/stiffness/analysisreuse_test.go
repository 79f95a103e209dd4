package stiffness

import (
	"context"
	"math"
	"reflect"
	"slices"
	"testing"

	"gusset/engine/sparse"
)

// TestAnalysisMatricesMatchAssemble: the matrices an Analysis builds for a
// step are Assemble's, bit for bit (values, scaling, numbering), and its
// order gives the same factor, so an eigenvalue analysis may take them
// after a static solve without ordering again (issue 19 item 5). The
// factor is checked by K·x = f for a random f (residual at round-off,
// common practice).
func TestAnalysisMatricesMatchAssemble(t *testing.T) {
	m0 := hungPratt(40)
	ctx := context.Background()
	for _, opt := range []Options{{Path: Sparse, Workers: 1}, {DenseLimit: 1 << 20}} {
		an := NewAnalysis(m0, opt)
		var first *sparse.Analysis
		for _, depth := range []float64{3, 4.5} {
			m, err := m0.WithParameters(map[string]float64{"depth": depth})
			if err != nil {
				t.Fatal(err)
			}
			want, err := Assemble(ctx, m, Options{Workers: 1})
			if err != nil {
				t.Fatal(err)
			}
			got, err := an.Matrices(ctx, m)
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(got.K.Val, want.K.Val) || !slices.Equal(got.K.RowIdx, want.K.RowIdx) ||
				!slices.Equal(got.Scale, want.Scale) || !slices.Equal(got.Node, want.Node) || !slices.Equal(got.Component, want.Component) {
				t.Fatalf("path %q depth %g: matrices differ from Assemble's", opt.Path, depth)
			}
			if opt.Path == Sparse && got.Symbolic != an.sym {
				t.Errorf("depth %g: the analysis's order was not reused", depth)
			}
			if first == nil {
				first = got.Symbolic
			} else if got.Symbolic != first {
				t.Errorf("path %q depth %g: the order was computed again for a later step", opt.Path, depth)
			}
			f := make([]float64, got.K.N)
			for i := range f {
				f[i] = float64(i%7) - 3
			}
			x1, x2 := make([]float64, len(f)), make([]float64, len(f))
			for k, mx := range []*Matrices{got, want} {
				c, err := sparse.FactorizeWith(ctx, mx.K, mx.Symbolic, sparse.Options{Workers: 1})
				if err != nil {
					t.Fatal(err)
				}
				c.Solve([]([]float64){x1, x2}[k], f)
			}
			if !slices.Equal(x1, x2) {
				t.Errorf("path %q depth %g: solutions with the reused and the fresh order differ", opt.Path, depth)
			}
			r := make([]float64, len(f))
			got.K.MulVec(r, x1)
			var worst float64
			for i := range r {
				worst = max(worst, math.Abs(r[i]-f[i]))
			}
			if worst > 1e-8 {
				t.Errorf("path %q depth %g: residual %g", opt.Path, depth, worst)
			}
		}
	}
}

// TestAnalysisWith: an analysis for other cases shares the topology and
// solves as Solve does with those options, bit for bit.
func TestAnalysisWith(t *testing.T) {
	m := hungPratt(30)
	base := NewAnalysis(m, Options{Path: Sparse, Workers: 1})
	opt := Options{Path: Sparse, Workers: 1, Cases: []string{m.Cases[0].ID}, SkipCondition: true, StabilityLimit: -1}
	an := base.With(opt)
	if an.sym != base.sym || an.pat != base.pat {
		t.Fatal("With did not share the order and the pattern")
	}
	got, err := an.Solve(context.Background(), m)
	if err != nil {
		t.Fatal(err)
	}
	want, err := Solve(context.Background(), m, opt)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(untimed(got), untimed(want)) {
		t.Error("results differ from Solve's")
	}
	dense := base.With(Options{DenseLimit: 1 << 20})
	if resolvePath(dense.opt, dense.nb.equations) != Dense {
		t.Error("a large dense limit did not choose the dense path")
	}
}
