package sparse

import (
	"slices"
	"testing"
)

// TestColumnCountsAgreeWithRowSubtrees checks the skeleton-matrix column
// counts (Gilbert, Ng and Peyton, SIAM J. Matrix Anal. Appl. 15(4), 1994)
// column by column against the direct definition, row i of L being the
// union of the elimination-tree paths from the columns of row i of A up to
// i (Liu, SIAM J. Matrix Anal. Appl. 11(1), 1990, row subtrees), on
// matrices and orders of several shapes. Counts are integers: they must be
// equal.
func TestColumnCountsAgreeWithRowSubtrees(t *testing.T) {
	for _, tc := range []struct {
		name string
		a    *Matrix
	}{
		{"random", randomSPD(300, "random", 3)},
		{"arrow", randomSPD(200, "arrow", 4)},
		{"blocks", randomSPD(200, "blocks", 5)},
		{"diagonal", randomSPD(50, "diagonal", 6)},
		{"grid2d", gridTruss2D(20, 17, 1)},
		{"spacegrid", doubleLayerGrid(12, 2)},
		{"cube", cubeTruss(6, 3)},
	} {
		for _, order := range []struct {
			name string
			perm []int
		}{{"natural", identity(tc.a.N)}, {"amd", Order(tc.a)}, {"nested", OrderNested(tc.a)}} {
			iperm := make([]int, tc.a.N)
			for k, old := range order.perm {
				iperm[old] = k
			}
			parent, count := columnCounts(tc.a, iperm)
			wantParent, wantCount := columnCountsByRows(tc.a, iperm)
			if !slices.Equal(parent, wantParent) || !slices.Equal(count, wantCount) {
				t.Errorf("%s/%s: column counts differ from the row-subtree counts", tc.name, order.name)
			}
		}
	}
}
