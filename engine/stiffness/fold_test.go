package stiffness

import (
	"context"
	"reflect"
	"sync"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// TestFoldHandsOverEveryCase: with Options.Fold dropping every case, each
// case reaches Fold whole (equal to an ordinary solve's), Result.Cases
// keeps its summary, and the unchecked list and warnings are those of the
// ordinary solve (plumbing: the cases themselves are checked elsewhere).
func TestFoldHandsOverEveryCase(t *testing.T) {
	spec := modelgen.Frame2D(3, 4)
	spec.Materials[0].TensionLimit = nil // every member unchecked: notes to compare
	spec.Combos = append(spec.Combos, model.CombinationSpec{ID: "reverse", Factors: map[string]float64{"lateral": -1}})
	m := modelgen.Must(spec)
	whole, err := Solve(context.Background(), m, Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	var mu sync.Mutex
	folded := map[int]CaseResult{}
	res, err := Solve(context.Background(), m, Options{Workers: 2, Fold: func(i int, c *CaseResult) bool {
		mu.Lock()
		defer mu.Unlock()
		folded[i] = *c
		return i == 0 // keep the first whole
	}})
	if err != nil {
		t.Fatal(err)
	}
	if len(folded) != len(whole.Cases) || len(res.Cases) != len(whole.Cases) {
		t.Fatalf("%d cases folded, %d in the result, want %d", len(folded), len(res.Cases), len(whole.Cases))
	}
	for i := range whole.Cases {
		want := whole.Cases[i]
		if got := folded[i]; !reflect.DeepEqual(got, want) {
			t.Errorf("case %d reached Fold different from an ordinary solve", i)
		}
		got := res.Cases[i]
		if i == 0 {
			if !reflect.DeepEqual(got, want) {
				t.Errorf("case 0 was kept but differs")
			}
			continue
		}
		if got.ID != want.ID || got.Residual != want.Residual || got.MemberCount() != 0 || got.Displacements != nil {
			t.Errorf("case %d: summary %q residual %g, members %d; want %q %g and none", i, got.ID, got.Residual, got.MemberCount(), want.ID, want.Residual)
		}
	}
	if !reflect.DeepEqual(res.Unchecked, whole.Unchecked) || !reflect.DeepEqual(res.Warnings, whole.Warnings) {
		t.Errorf("folded solve's notes differ:\n%v\n%v\nwant\n%v\n%v", res.Unchecked, res.Warnings, whole.Unchecked, whole.Warnings)
	}
	if len(whole.Unchecked) == 0 {
		t.Errorf("the test model has no unchecked notes to compare")
	}
}
