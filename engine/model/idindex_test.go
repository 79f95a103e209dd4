package model

import (
	"fmt"
	"slices"
	"testing"
)

// TestIDIndexAgreesWithMap checks idIndex against a plain map of each id
// to its first position, on dense ids (n0, n1, ...; a bare 0, 1, ...) and
// on ids that only nearly have the form (a leading zero, a gap, a swap, a
// repeat, another prefix, an empty id), for ids present and absent.
func TestIDIndexAgreesWithMap(t *testing.T) {
	dense := func(prefix string, n int) []string {
		ids := make([]string, n)
		for i := range ids {
			ids[i] = fmt.Sprintf("%s%d", prefix, i)
		}
		return ids
	}
	with := func(ids []string, k int, id string) []string {
		ids = slices.Clone(ids)
		ids[k] = id
		return ids
	}
	cases := []struct {
		name  string
		ids   []string
		dense bool
	}{
		{"n0..n120", dense("n", 121), true},
		{"0..30", dense("", 31), true},
		{"node-0..node-12", dense("node-", 13), true},
		{"one", []string{"m0"}, true},
		{"leading zero", with(dense("n", 20), 7, "n07"), false},
		{"gap", with(dense("n", 20), 7, "n8"), false},
		{"swap", with(with(dense("n", 20), 7, "n8"), 8, "n7"), false},
		{"repeat", with(dense("n", 20), 19, "n3"), false},
		{"other prefix", with(dense("n", 20), 12, "m12"), false},
		{"empty id", with(dense("n", 20), 5, ""), false},
		{"not from 0", dense("n", 20)[1:], false},
		{"names", []string{"A", "B", "A"}, false},
		{"none", nil, false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			want := map[string]int{}
			for i, id := range c.ids {
				if _, dup := want[id]; !dup && id != "" {
					want[id] = i
				}
			}
			cmp := &compiler{}
			x := cmp.newIDIndex("node", "nodes", len(c.ids), func(i int) string { return c.ids[i] })
			if x.dense != c.dense {
				t.Fatalf("dense %v, want %v", x.dense, c.dense)
			}
			probes := append(slices.Clone(c.ids), "", "n", "n-1", "n+1", "n1x", "n99999999999999999999", "n121", "31", "0", "n007", "A", "C")
			for _, id := range probes {
				j, ok := x.find(id)
				wantJ, wantOK := want[id]
				if ok != wantOK || j != wantJ && ok {
					t.Errorf("find(%q) = %d, %v; want %d, %v", id, j, ok, wantJ, wantOK)
				}
			}
			if c.dense && len(cmp.problems) > 0 {
				t.Errorf("dense ids reported problems: %v", cmp.problems)
			}
		})
	}
}
