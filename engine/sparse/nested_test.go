package sparse

import (
	"math"
	"testing"
)

func TestOrderNestedIsPermutation(t *testing.T) {
	for _, tc := range []struct {
		name string
		a    *Matrix
	}{
		{"empty", NewBuilder(0, 0).Matrix()},
		{"no entries at all", NewBuilder(600, 0).Matrix()},
		{"random", randomSPD(2000, "random", 2)},
		{"arrow", randomSPD(1000, "arrow", 4)},
		{"blocks (disconnected)", randomSPD(2001, "blocks", 5)},
		{"grid truss", gridTruss2D(40, 30, 6)},
		{"double-layer grid", doubleLayerGrid(16, 7)},
		{"cube", cubeTruss(9, 8)},
	} {
		if perm := OrderNested(tc.a); !isPermutation(perm, tc.a.N) {
			t.Errorf("%s: OrderNested did not return a permutation of 0..%d", tc.name, tc.a.N-1)
		}
	}
}

// TestOrderNestedGrowth checks the asymptotics of nested dissection on
// regular meshes (A. George and J. W. H. Liu, "Computer Solution of Large
// Sparse Positive Definite Systems", Prentice-Hall, 1981, ch. 8, from
// memory): on a k×k grid nnz(L) = O(n log n), here below George's constant
// 31/4 for the 5-point grid (George 1973); on a k×k×k lattice the
// factorisation costs O(n²) flops, so flops/n² stays bounded as k grows.
func TestOrderNestedGrowth(t *testing.T) {
	var ratios2D []float64
	for _, k := range []int{20, 40, 80} {
		a := laplacian2D(k)
		n := float64(a.N)
		r := float64(analyse(a, OrderNested(a)).nnzL) / (n * math.Log2(n))
		ratios2D = append(ratios2D, r)
		if r > 31.0/4 {
			t.Errorf("2D k=%d: nnz(L)/(n log₂ n) = %.2f", k, r)
		}
	}
	if ratios2D[2]/ratios2D[0] > 1.5 {
		t.Errorf("2D: nnz(L)/(n log₂ n) grows from %.3f to %.3f", ratios2D[0], ratios2D[2])
	}
	var ratios3D []float64
	for _, k := range []int{12, 16, 20} {
		a := cubeTruss(k, 1)
		n := float64(a.N)
		ratios3D = append(ratios3D, factorFlops(a, OrderNested(a))/(n*n))
	}
	t.Logf("3D flops/n²: %.1f", ratios3D)
	if ratios3D[2]/ratios3D[0] > 1.5 {
		t.Errorf("3D: flops/n² grows from %.1f to %.1f between k=12 and k=20", ratios3D[0], ratios3D[2])
	}
}
