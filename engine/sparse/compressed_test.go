package sparse

import (
	"slices"
	"testing"
)

// TestCompressedCounts checks the elimination tree and column counts taken
// from the graph of the groups of indistinguishable variables against the
// ones of the whole matrix (columnCounts, itself checked against the row
// subtrees of L in symbolic_test.go), for both orderings and for an order
// of the groups that neither would choose.
func TestCompressedCounts(t *testing.T) {
	for _, tc := range []struct {
		name string
		a    *Matrix
	}{
		{"empty", NewBuilder(0, 0).Matrix()},
		{"diagonal", randomSPD(50, "diagonal", 1)},
		{"no entries at all", NewBuilder(60, 0).Matrix()},
		{"random", randomSPD(300, "random", 2)},
		{"arrow", randomSPD(200, "arrow", 4)},
		{"blocks (disconnected)", randomSPD(301, "blocks", 5)},
		{"grid truss", gridTruss2D(30, 20, 6)},
		{"double-layer grid", doubleLayerGrid(12, 7)},
		{"cube", cubeTruss(7, 8)},
	} {
		c := compress(tc.a)
		reversed := c.minimumDegree()
		slices.Reverse(reversed)
		for name, order := range map[string][]int{"minimum degree": c.minimumDegree(), "nested": c.nested(), "reversed": reversed} {
			perm := c.expand(order)
			if !isPermutation(perm, tc.a.N) {
				t.Fatalf("%s, %s: not a permutation", tc.name, name)
			}
			parent, count := c.counts(order)
			wantParent, wantCount := countsFor(tc.a, perm)
			if !slices.Equal(parent, wantParent) || !slices.Equal(count, wantCount) {
				t.Errorf("%s, %s: counts from the groups differ from the matrix's\nparent %v\nwant   %v\ncount %v\nwant  %v", tc.name, name, parent, wantParent, count, wantCount)
			}
		}
	}
}
