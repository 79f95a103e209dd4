package modes

import (
	"context"
	"errors"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// TestRefuseOneSided checks that both analyses refuse a cable, a
// one-sided bar and a pretensioned bar with the member's pointer, rather
// than report factors of a structure whose slack members would count.
func TestRefuseOneSided(t *testing.T) {
	for _, tc := range []struct {
		set  func(mem *model.Member)
		path string
	}{
		{func(mem *model.Member) { mem.Cable, mem.Behaviour = true, model.TensionOnly }, "members/0/type"},
		{func(mem *model.Member) { mem.Behaviour = model.CompressionOnly }, "members/0/behaviour"},
		{func(mem *model.Member) { mem.Pretension = 3 }, "members/0/pretension"},
	} {
		m := &model.Model{Dim: 2, NodeIDs: []string{"a", "b"}, Coords: []float64{0, 0, 1, 0},
			Members: []model.Member{{ID: "ab", Ends: [2]int{0, 1}}}}
		tc.set(&m.Members[0])
		for _, run := range []func(context.Context, *model.Model, Options) (*Result, error){Buckling, Vibration} {
			_, err := run(context.Background(), m, Options{})
			var fe *fault.Error
			if !errors.As(err, &fe) || fe.Kind != fault.InvalidModel || len(fe.Problems) != 1 || fe.Problems[0].Path != tc.path {
				t.Errorf("error %v, want InvalidModel at %s", err, tc.path)
			}
		}
	}
}
