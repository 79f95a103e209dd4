package model

import (
	"strings"
	"testing"

	"gusset/engine/fault"
)

// TestCompileReleases checks that releases compile to the per-end bits
// in the member's local components, and that the compiler refuses them on
// bars, refuses components a plane beam has not and repeated components,
// each with the pointer to the offending entry.
func TestCompileReleases(t *testing.T) {
	s := portal()
	s.Members[1].Releases = [2][]string{{"rx", "rz"}, {"ry"}}
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	mem := m.Members[1]
	if !mem.Released(0, RX) || mem.Released(0, RY) || !mem.Released(0, RZ) ||
		mem.Released(1, RX) || !mem.Released(1, RY) || mem.Released(1, RZ) || m.Members[0].HasReleases() {
		t.Errorf("releases %v, want first {rx, rz}, second {ry}", mem.Releases)
	}
	for _, tc := range []struct {
		name   string
		base   func() *Spec
		member int
		rel    [2][]string
		path   string
		text   string
	}{
		{"on a bar", triangle, 0, [2][]string{{"rz"}, nil}, "members/0/releases", "beams only"},
		{"on a default bar", triangle, 1, [2][]string{nil, {"rz"}}, "members/1/releases", "is a bar"},
		{"ry in 2D", func() *Spec { s := triangle(); s.Members[1].Type = "beam"; return s }, 1,
			[2][]string{{"rz"}, {"ry"}}, "members/1/releases/second/0", `"rz" only`},
		{"unknown", portal, 0, [2][]string{{"x"}, nil}, "members/0/releases/first/0", `"rx", "ry" or "rz"`},
		{"twice", portal, 1, [2][]string{{"ry", "rz", "ry"}, nil}, "members/1/releases/first/2", "twice"},
	} {
		s := tc.base()
		s.Members[tc.member].Releases = tc.rel
		_, err := Compile(s)
		if err == nil {
			t.Errorf("%s: compiled", tc.name)
			continue
		}
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.InvalidModel {
			t.Errorf("%s: error %v is not an InvalidModel fault", tc.name, err)
			continue
		}
		found := false
		for _, p := range fe.Problems {
			found = found || (p.Path == tc.path && strings.Contains(p.Message, tc.text))
		}
		if !found {
			t.Errorf("%s: no problem at %q mentioning %q: %v", tc.name, tc.path, tc.text, err)
		}
	}
}
