package adapter

import (
	"context"
	"encoding/json"
	"runtime"
	"testing"
	"weak"

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

// TestCompiledModelHoldsNoInput checks that the compiled model does not
// keep the wire model's or the Spec's arrays live (through shared slices
// or the compiler's closures), so that releasing them frees their memory:
// once the request drops them, they are collected while the model stays.
func TestCompiledModelHoldsNoInput(t *testing.T) {
	v, err := schema.NewValidator(paramsDefinitions())
	if err != nil {
		t.Fatal(err)
	}
	a := &Adapter{Limits: protocol.Limits{}.WithDefaults(), validator: v}
	var p protocol.SolveParams
	m, spec, _, err := a.prepareModel(context.Background(), protocol.MethodSolve, json.RawMessage(`{"model":`+triangle+`}`), &p, &p.Model, nil)
	if err != nil {
		t.Fatal(err)
	}
	held := map[string]func() bool{
		"spec members": weakly(&spec.Members[0]), "spec nodes": weakly(&spec.Nodes[0]),
		"spec node coordinates": weakly(&spec.Nodes[0].At[0]),
	}
	if p.Model.Decoded == nil {
		// The generic decode: the wire arrays are the Spec's source.
		held["wire members"], held["wire nodes"] = weakly(&p.Model.Members[0]), weakly(&p.Model.Nodes[0])
		held["wire node coordinates"] = weakly(&p.Model.Nodes[0].At[0])
	} else if len(p.Model.Members) != 0 || len(p.Model.Nodes) != 0 {
		t.Error("the straight decode left elements in the wire arrays")
	}
	spec = nil
	releaseWire(&p.Model)
	for range 5 {
		runtime.GC()
	}
	for what, live := range held {
		if live() {
			t.Errorf("the compiled model keeps the %s live", what)
		}
	}
	if len(m.Members) != 3 || m.Members[2].ID != "AB" || m.NodeIDs[2] != "C" {
		t.Errorf("compiled model changed: %+v", m.Members)
	}
}

// weakly returns a function that reports whether the object p points
// into is still live.
func weakly[T any](p *T) func() bool {
	w := weak.Make(p)
	return func() bool { return w.Value() != nil }
}
