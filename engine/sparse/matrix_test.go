package sparse

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
)

// TestMulVec compares the symmetric-storage product with gonum's dense
// symmetric matrix-vector product (reference library).
func TestMulVec(t *testing.T) {
	for _, kind := range []string{"random", "banded", "arrow", "blocks", "diagonal"} {
		a := randomSPD(37, kind, 3)
		rng := rand.New(rand.NewPCG(5, 5))
		x := make([]float64, a.N)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		got := make([]float64, a.N)
		for i := range got {
			got[i] = math.NaN()
		}
		a.MulVec(got, x)
		var want mat.VecDense
		want.MulVec(dense(a), mat.NewVecDense(a.N, x))
		for i := range got {
			if !scalar.EqualWithinAbsOrRel(got[i], want.AtVec(i), 1e-12, 1e-12) {
				t.Fatalf("%s: (A·x)[%d] = %v, want %v", kind, i, got[i], want.AtVec(i))
			}
		}
		// ‖A‖∞ against gonum's dense norm.
		if got, want := a.NormInf(), mat.Norm(dense(a), math.Inf(1)); !scalar.EqualWithinAbsOrRel(got, want, 1e-12, 1e-12) {
			t.Errorf("%s: NormInf = %v, want %v", kind, got, want)
		}
	}
}

func TestPatternAndFind(t *testing.T) {
	// A chain of 5 nodes, pairs given in both orders and repeated.
	pairs := [][2]int{{0, 1}, {2, 1}, {2, 3}, {3, 4}, {1, 0}}
	a := NewPattern(5, func(visit func(i, j int)) {
		for _, p := range pairs {
			visit(p[0], p[1])
		}
	})
	// Structure expected by hand: the diagonal plus four distinct pairs.
	if a.Nonzeros() != 5+4 {
		t.Fatalf("pattern has %d entries, want 9", a.Nonzeros())
	}
	for i := 0; i < 5; i++ {
		for j := 0; j < 5; j++ {
			want := i == j || (i-j == 1 || j-i == 1)
			if got := a.Find(i, j) >= 0; got != want {
				t.Errorf("Find(%d, %d) present = %v, want %v", i, j, got, want)
			}
		}
	}
	// Assembling through Find gives the 1D Laplacian built by Builder.
	for e := 0; e < 4; e++ {
		a.Val[a.Find(e, e)] += 1
		a.Val[a.Find(e+1, e+1)] += 1
		a.Val[a.Find(e, e+1)] -= 1
	}
	for _, v := range a.Val {
		if v != 2 && v != 1 && v != -1 {
			t.Fatalf("unexpected value %v", v)
		}
	}
	if a.Val[a.Find(0, 0)] != 1 || a.Val[a.Find(2, 2)] != 2 || a.Val[a.Find(3, 2)] != -1 {
		t.Errorf("assembled values wrong: %v", a.Val)
	}
}
