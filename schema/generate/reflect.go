package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"reflect"

	"github.com/invopop/jsonschema"

	"gusset/cmd/gusset/adapter"
	"gusset/protocol"
	"gusset/schema"
)

// Definitions lists the types whose definitions the schema publishes, by
// the name they get in $defs: the envelope, the transport's own methods,
// and the params and result of every method of the adapter's method table.
func Definitions() []any {
	return append([]any{
		protocol.Request{}, protocol.Response{}, protocol.Notification{}, protocol.Progress{},
		protocol.DescribeParams{}, protocol.DescribeResult{},
		protocol.CancelParams{}, protocol.CancelResult{}, protocol.SweepAxis{},
	}, adapter.SchemaTypes()...)
}

// Generate reflects the protocol types into the schema document. protocolDir
// is the directory of package protocol's source, read for the doc comments
// that become descriptions.
func Generate(protocolDir string) ([]byte, error) {
	r := &jsonschema.Reflector{Mapper: mapType}
	if err := r.AddGoComments("gusset/protocol", protocolDir); err != nil {
		return nil, fmt.Errorf("schema: reading doc comments: %w", err)
	}
	root := &jsonschema.Schema{
		Version:     jsonschema.Version,
		ID:          schema.ID,
		Title:       "Gusset wire protocol",
		Description: "JSON-RPC 2.0 messages, one per line, exchanged with the gusset solver process. Each method's params and result are definitions in $defs (see the describe method for which is which). Results are for preliminary design: a qualified engineer checks the design against the local codes and standards.",
		Ref:         "#/$defs/Request",
		Definitions: jsonschema.Definitions{},
	}
	for _, v := range Definitions() {
		s := r.Reflect(v)
		for name, def := range s.Definitions {
			if old, dup := root.Definitions[name]; dup {
				a, _ := json.Marshal(old)
				b, _ := json.Marshal(def)
				if !bytes.Equal(a, b) {
					return nil, fmt.Errorf("schema: two different types are named %s (%v)", name, reflect.TypeOf(v))
				}
			}
			root.Definitions[name] = def
		}
	}
	root.Definitions["ErrorCode"] = errorCodeSchema()
	out, err := json.MarshalIndent(root, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(out, '\n'), nil
}

var (
	numberType = reflect.TypeOf(protocol.Number{})
	axesType   = reflect.TypeOf(protocol.SweepAxes{})
)

// mapType gives protocol.Number its schema: a number, or an expression
// string (protocol imports nothing but the standard library, so the schema
// of its custom-encoded types lives here).
func mapType(t reflect.Type) *jsonschema.Schema {
	if t == axesType {
		return axesSchema()
	}
	if t != numberType {
		return nil
	}
	// "type": ["number", "string"] with minLength (which applies to strings
	// only) says the same as a oneOf of the two, and the validator checks
	// it without trying and failing a branch for every number.
	minLength := uint64(1)
	return &jsonschema.Schema{
		Description: "A number, or an expression string over the model's parameters: arithmetic (+ - * / ^), parentheses, sqrt, sin, cos, tan, atan2, abs, min, max and pi; angles in radians.",
		MinLength:   &minLength,
		Extras:      map[string]any{"type": []string{"number", "string"}},
	}
}

// axesSchema is a sweep's parameters: one axis object, or an array of one
// or two. if/then/else rather than oneOf, so that a bad axis is reported
// against the one form it was written in.
func axesSchema() *jsonschema.Schema {
	one, two := uint64(1), uint64(2)
	axis := &jsonschema.Schema{Ref: "#/$defs/SweepAxis"}
	return &jsonschema.Schema{
		Description: "The swept parameters: one axis object (a line), or an array of one or two axes (a grid, the second varying fastest).",
		If:          &jsonschema.Schema{Type: "array"},
		Then:        &jsonschema.Schema{Type: "array", Items: axis, MinItems: &one, MaxItems: &two},
		Else:        axis,
	}
}
