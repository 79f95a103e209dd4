package loadpath

import (
	"strings"
	"testing"

	"gusset/engine/fault"
)

// TestSelect checks case selection by id.
func TestSelect(t *testing.T) {
	cases := []Case{{ID: "dead"}, {ID: "wind"}, {ID: "ultimate"}}
	got, err := Select(cases, []string{"ultimate", "dead"})
	if err != nil || len(got) != 2 || got[0].ID != "ultimate" || got[1].ID != "dead" {
		t.Fatalf("got %v, %v", got, err)
	}
	_, err = Select(cases, []string{"dead", "snow"})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.UnknownCase || fe.Problems[0].Path != "/cases/1" || !strings.Contains(fe.Error(), "snow") {
		t.Fatalf("got %v", err)
	}
}
