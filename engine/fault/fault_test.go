package fault

import "testing"

// TestKindsTable checks the one table of kinds: every kind once, in code
// order from 1000 without gaps (the wire codes are fixed), with a name
// and a phrase saying when it is reported, and String reading it.
func TestKindsTable(t *testing.T) {
	names := map[string]bool{}
	for i, d := range Kinds() {
		if int(d.Kind) != 1000+i {
			t.Errorf("entry %d has code %d, want %d", i, d.Kind, 1000+i)
		}
		if d.Name == "" || d.When == "" || names[d.Name] {
			t.Errorf("entry %d: name %q (empty or repeated) or no when", i, d.Name)
		}
		names[d.Name] = true
		if d.Kind.String() != d.Name {
			t.Errorf("%d.String() = %q, want %q", d.Kind, d.Kind.String(), d.Name)
		}
	}
	if len(names) != int(UnknownCase)-int(InvalidModel)+1 {
		t.Errorf("%d kinds in the table, want every kind from InvalidModel to UnknownCase", len(names))
	}
}
