package main

import (
	"encoding/json"
	"os"
	"reflect"
	"slices"
	"sort"
	"strings"
	"testing"

	"gusset/protocol"
	"gusset/schema"
)

// TestEveryBoundedArrayIsChecked walks the published schema: for every
// property of a definition with minItems or maxItems (JSON Schema 2020-12
// Validation §6.4.1–6.4.2), it finds the Go field the definition was
// reflected from, checks that the field is a slice (a Go array would drop
// extra entries on decoding, as "ends": ["A","B","NOPE"] once did), and
// that schema.CheckBounds reports one entry too many and one too few, with
// the field's pointer. The schema is the reference: the test derives every
// case from it.
func TestEveryBoundedArrayIsChecked(t *testing.T) {
	raw, err := os.ReadFile("../gusset.schema.json")
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Defs map[string]struct {
			Properties map[string]json.RawMessage `json:"properties"`
		} `json:"$defs"`
	}
	if err := json.Unmarshal(raw, &doc); err != nil {
		t.Fatal(err)
	}
	types := map[string]reflect.Type{}
	for _, v := range Definitions() {
		collectStructs(reflect.TypeOf(v), types)
	}
	checked := 0
	names := make([]string, 0, len(doc.Defs))
	for name := range doc.Defs {
		names = append(names, name)
	}
	sort.Strings(names)
	for _, def := range names {
		for prop, rawProp := range doc.Defs[def].Properties {
			var p struct {
				MinItems *int `json:"minItems"`
				MaxItems *int `json:"maxItems"`
			}
			if json.Unmarshal(rawProp, &p) != nil || (p.MinItems == nil && p.MaxItems == nil) {
				continue
			}
			t.Run(def+"/"+prop, func(t *testing.T) {
				typ, ok := types[def]
				if !ok {
					t.Fatalf("no Go type named %s", def)
				}
				field, ok := fieldByJSON(typ, prop)
				if !ok {
					t.Fatalf("%s has no field %q", def, prop)
				}
				if field.Type.Kind() != reflect.Slice {
					t.Fatalf("%s.%s is a %s; a bounded array must be a slice so that its length survives decoding", def, field.Name, field.Type.Kind())
				}
				var lengths []int
				if p.MaxItems != nil {
					lengths = append(lengths, *p.MaxItems+1)
				}
				if p.MinItems != nil && *p.MinItems > 0 {
					lengths = append(lengths, *p.MinItems-1)
				}
				for _, n := range lengths {
					v := reflect.New(typ)
					v.Elem().FieldByIndex(field.Index).Set(reflect.MakeSlice(field.Type, n, n))
					problems := schema.CheckBounds(v.Interface())
					if !slices.ContainsFunc(problems, func(p protocol.Problem) bool { return p.Path == "/"+prop }) {
						t.Errorf("%d entries: problems %+v, want one at /%s", n, problems, prop)
					}
				}
				checked++
			})
		}
	}
	if checked < 10 {
		t.Errorf("only %d bounded arrays found in the schema", checked)
	}
}

// collectStructs records every named struct type reachable from t.
func collectStructs(t reflect.Type, into map[string]reflect.Type) {
	for t.Kind() == reflect.Pointer || t.Kind() == reflect.Slice || t.Kind() == reflect.Array || t.Kind() == reflect.Map {
		t = t.Elem()
	}
	if t.Kind() != reflect.Struct || into[t.Name()] == t {
		return
	}
	into[t.Name()] = t
	for i := range t.NumField() {
		collectStructs(t.Field(i).Type, into)
	}
}

// fieldByJSON finds the field of t whose JSON name is name.
func fieldByJSON(t reflect.Type, name string) (reflect.StructField, bool) {
	for i := range t.NumField() {
		f := t.Field(i)
		if n, _, _ := strings.Cut(f.Tag.Get("json"), ","); n == name {
			return f, true
		}
	}
	return reflect.StructField{}, false
}
