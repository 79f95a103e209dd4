package reciprocal

import (
	"strconv"
	"testing"
)

// TestSpaceLetters checks the lettering beyond Z against the bijective
// base-26 sequence used for spreadsheet columns (A..Z, AA..AZ, BA..,
// ZZ, AAA; common practice).
func TestSpaceLetters(t *testing.T) {
	for _, c := range []struct {
		i    int
		want string
	}{{0, "A"}, {1, "B"}, {25, "Z"}, {26, "AA"}, {27, "AB"}, {51, "AZ"}, {52, "BA"}, {701, "ZZ"}, {702, "AAA"}} {
		if got := SpaceLetters(c.i); got != c.want {
			t.Errorf("SpaceLetters(%d) = %q, want %q", c.i, got, c.want)
		}
	}
	l := &labeller{spaces: 3}
	l.name(4)
	l.pair(2, 7)
	if got := l.strings(); got[0] != "2" || got[1] != "C-5" {
		t.Errorf("labels %q, want [2 C-5]", got)
	}
}

// spaceName returns the label of space or face f given the number of
// lettered spaces, as the package doc states: letters for the spaces,
// numbers from 1 for inner faces.
func spaceName(f, spaces int) string {
	if f < spaces {
		return SpaceLetters(f)
	}
	return strconv.Itoa(f - spaces + 1)
}
