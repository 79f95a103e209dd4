package adapter

import (
	"context"
	"encoding/json"
	"testing"

	"gusset/protocol"
	"gusset/schema"
)

// TestCompiledRequestReleasesWire checks what a handler is given once the
// model is compiled: the wire model keeps its dimension, units and
// parameters but none of its arrays, and the Spec is kept only for the
// methods that read it (find-form), so that neither holds memory while
// the engine works on a large model.
func TestCompiledRequestReleasesWire(t *testing.T) {
	v, err := schema.NewValidator(paramsDefinitions())
	if err != nil {
		t.Fatal(err)
	}
	a := &Adapter{Limits: protocol.Limits{}.WithDefaults(), validator: v}
	params := `{"model":` + triangle + `}`
	for _, name := range []string{protocol.MethodSolve, protocol.MethodFindForm} {
		var seen *request[protocol.SolveParams]
		e := method(name, "", func(a *Adapter, ctx context.Context, r *request[protocol.SolveParams]) (*protocol.CancelResult, error) {
			seen = r
			return &protocol.CancelResult{}, nil
		})
		if _, err := e.bind(a)(context.Background(), json.RawMessage(params), discardStream{}); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		w := &seen.Params.Model
		if seen.Model == nil || len(seen.Model.Members) != 3 || len(seen.Model.NodeIDs) != 3 {
			t.Fatalf("%s: compiled model not given", name)
		}
		if w.Dimension != 2 || w.Nodes != nil || w.Members != nil || w.Materials != nil || w.Sections != nil || w.Supports != nil || w.LoadCases != nil {
			t.Errorf("%s: the wire model's arrays are still held: %+v", name, *w)
		}
		if keep := name == protocol.MethodFindForm; (seen.Spec != nil) != keep {
			t.Errorf("%s: Spec held %v, want %v", name, seen.Spec != nil, keep)
		} else if keep && (len(seen.Spec.Members) != 3 || seen.Spec.Members[2].ID != "AB" || len(seen.Spec.Nodes) != 3) {
			t.Errorf("%s: Spec %+v is not the request's model", name, seen.Spec)
		}
	}
}
