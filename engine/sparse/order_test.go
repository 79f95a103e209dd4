package sparse

import (
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"
)

func isPermutation(perm []int, n int) bool {
	if len(perm) != n {
		return false
	}
	seen := make([]bool, n)
	for _, p := range perm {
		if p < 0 || p >= n || seen[p] {
			return false
		}
		seen[p] = true
	}
	return true
}

func TestOrderIsPermutation(t *testing.T) {
	for _, tc := range []struct {
		name string
		a    *Matrix
	}{
		{"empty", NewBuilder(0, 0).Matrix()},
		{"single", randomSPD(1, "diagonal", 1)},
		{"no entries at all", NewBuilder(6, 0).Matrix()},
		{"diagonal", randomSPD(20, "diagonal", 1)},
		{"random", randomSPD(200, "random", 2)},
		{"banded", randomSPD(200, "banded", 3)},
		{"arrow", randomSPD(200, "arrow", 4)},
		{"blocks (disconnected)", randomSPD(201, "blocks", 5)},
		{"grid truss", gridTruss2D(15, 11, 6)},
		{"double-layer grid", doubleLayerGrid(6, 7)},
		{"big arrow (dense row)", randomSPD(3000, "arrow", 8)},
	} {
		perm := Order(tc.a)
		if !isPermutation(perm, tc.a.N) {
			t.Errorf("%s: Order returned %v, not a permutation of 0..%d", tc.name, perm, tc.a.N-1)
		}
	}
}

// denseFactorNonzeros counts the nonzero entries of the lower Cholesky
// factor of P·A·Pᵀ computed by gonum's dense Cholesky (reference library).
func denseFactorNonzeros(t *testing.T, a *Matrix, perm []int) int {
	n := a.N
	d := dense(a)
	p := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			p.SetSym(i, j, d.At(perm[i], perm[j]))
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(p) {
		t.Fatal("gonum Cholesky failed on an SPD matrix")
	}
	var l mat.TriDense
	ch.LTo(&l)
	count := 0
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			if l.At(i, j) != 0 {
				count++
			}
		}
	}
	return count
}

// TestSymbolicCountsMatchDenseFactor checks nnz(L) from the symbolic phase
// against the nonzeros of gonum's dense factor. With random values no entry
// of the structure cancels exactly, so the counts must agree (the structure
// theorem of the elimination tree, Liu 1990, guarantees the symbolic count
// is an upper bound that is attained in the absence of cancellation).
func TestSymbolicCountsMatchDenseFactor(t *testing.T) {
	for _, kind := range []string{"random", "banded", "arrow", "blocks", "diagonal"} {
		a := randomSPD(60, kind, 9)
		for _, perm := range [][]int{identity(a.N), Order(a)} {
			sym := analyse(a, perm)
			// analyse renumbers by a postorder, which changes no count.
			if got, want := sym.nnzL, denseFactorNonzeros(t, a, sym.perm); got != want {
				t.Errorf("%s: symbolic nnz(L) = %d, dense factor has %d", kind, got, want)
			}
		}
	}
}

func identity(n int) []int {
	p := make([]int, n)
	for i := range p {
		p[i] = i
	}
	return p
}

// TestGridFill checks the fill of the 5-point Laplacian on a k×k grid.
//
// Natural (row by row) order: the factor fills its envelope exactly (A. George
// and J. W. H. Liu, "Computer Solution of Large Sparse Positive Definite
// Systems", Prentice-Hall, 1981, ch. 4: fill stays inside the envelope, and
// for this M-matrix every update has the same sign so nothing cancels; from
// memory). Row i ≥ k starts at column i−k and rows 1..k−1 at column i−1, so
// nnz(L) = (n−k)(k+1) + 2k − 1.
//
// Minimum degree: far below the natural order, and nnz(L)/(n log₂ n) stays
// bounded, below George's nested-dissection constant 31/4 (A. George,
// "Nested dissection of a regular finite element mesh", SIAM J. Numer. Anal.
// 10(2), 1973: nnz(L) ≈ (31/4) n log₂ n; from memory) and growing by less
// than 1.5× from k = 20 to k = 80.
func TestGridFill(t *testing.T) {
	var ratios []float64
	for _, k := range []int{20, 40, 80} {
		a := laplacian2D(k)
		n := a.N
		natural := analyse(a, identity(n)).nnzL
		if want := (n-k)*(k+1) + 2*k - 1; natural != want {
			t.Errorf("k=%d: natural-order nnz(L) = %d, want envelope %d", k, natural, want)
		}
		amd := analyse(a, Order(a)).nnzL
		ratio := float64(amd) / (float64(n) * math.Log2(float64(n)))
		ratios = append(ratios, ratio)
		t.Logf("k=%d n=%d natural=%d amd=%d amd/(n log2 n)=%.3f", k, n, natural, amd, ratio)
		if ratio > 31.0/4 {
			t.Errorf("k=%d: nnz(L)/(n log₂ n) = %.2f above the nested-dissection constant 31/4", k, ratio)
		}
		if k >= 40 && float64(amd) > 0.4*float64(natural) {
			t.Errorf("k=%d: minimum-degree fill %d not far below natural fill %d", k, amd, natural)
		}
	}
	if ratios[2]/ratios[0] > 1.5 {
		t.Errorf("nnz(L)/(n log₂ n) grows from %.3f to %.3f between k=20 and k=80", ratios[0], ratios[2])
	}
	// The natural-order count is also confirmed by gonum's dense factor on a
	// small grid.
	a := laplacian2D(8)
	if got, want := analyse(a, identity(a.N)).nnzL, denseFactorNonzeros(t, a, identity(a.N)); got != want {
		t.Errorf("k=8: symbolic nnz(L) = %d, dense factor has %d", got, want)
	}
}

// TestOrderDenseRow: a matrix whose last row and column are full besides a
// path (an arrow) factorises with no fill when the dense variable comes last
// (its column of L is full, every other column has at most one entry below
// the diagonal from the path and one in the last row). The ordering sets
// such rows aside and numbers them last (Amestoy, Davis and Duff 1996,
// section on dense rows), so nnz(L) = n + (n−2) + (n−1) = 3n − 3.
func TestOrderDenseRow(t *testing.T) {
	n := 3000
	a := randomSPD(n, "arrow", 8)
	perm := Order(a)
	if perm[n-1] != n-1 {
		t.Errorf("dense variable numbered %d, want last", slices.Index(perm, n-1))
	}
	if got, want := analyse(a, perm).nnzL, 3*n-3; got != want {
		t.Errorf("nnz(L) = %d, want %d", got, want)
	}
}
