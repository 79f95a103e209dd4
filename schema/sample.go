package schema

import (
	"encoding/json"
	"reflect"

	"gusset/protocol"
)

// ValidateSample validates a decoded params value against the method's
// schema, looking only at the first ElideAbove elements of every array. It
// is the fast path for large models: the caller decoded the params strictly
// (unknown fields and wrong types are errors there) and the model compiler
// checks enums, lengths, ids and ranges of every element; the schema checks
// the rest of the structure on this sample. Fields absent from the input
// appear as zero values in the sample, so when it fails the caller should
// report ValidateFull of the original bytes, which has precise pointers.
// Every array's length is checked in full first (CheckBounds), since the
// sample leaves out most elements.
func (v *Validator) ValidateSample(method string, value any) *protocol.Error {
	if problems := CheckBounds(value); len(problems) > 0 {
		for i := range problems {
			problems[i].Path = "/params" + problems[i].Path
		}
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", problems[0].Path+": "+problems[0].Message+".", problems...)
	}
	sample := truncated(reflect.ValueOf(value), ElideAbove)
	b, err := json.Marshal(sample.Interface())
	if err != nil {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", "The params could not be encoded for validation: "+err.Error()+".")
	}
	return v.validate(method, b, false)
}

var (
	marshalerType = reflect.TypeOf((*json.Marshaler)(nil)).Elem()
	modelType     = reflect.TypeOf(protocol.Model{})
)

// modelSample is how many elements of each of a model's arrays the sample
// keeps: none. The strict decode checks every element's fields and types
// and the model compiler every element's values (enums, lengths, ids,
// ranges), so the generic validator, which costs more than the whole solve
// of a small model, sees the model's own fields and the rest of the params.
// TestFastPathAgreesWithSchema in the adapter keeps this honest.
const modelSample = 0

// truncated returns a copy of v in which the slice v (or the slices of the
// struct v) hold at most limit elements, and deeper slices at most
// ElideAbove, except that a model's element arrays hold modelSample. Types
// with their own JSON encoding are copied whole.
func truncated(v reflect.Value, limit int) reflect.Value {
	if !v.IsValid() || v.Type().Implements(marshalerType) {
		return v
	}
	switch v.Kind() {
	case reflect.Pointer:
		if v.IsNil() {
			return v
		}
		p := reflect.New(v.Type().Elem())
		p.Elem().Set(truncated(v.Elem(), limit))
		return p
	case reflect.Struct:
		// A struct's arrays get the usual limit, a model's element
		// arrays the model sample.
		limit = ElideAbove
		if v.Type() == modelType {
			limit = modelSample
		}
		out := reflect.New(v.Type()).Elem()
		for i := 0; i < v.NumField(); i++ {
			if out.Field(i).CanSet() {
				out.Field(i).Set(truncated(v.Field(i), limit))
			}
		}
		return out
	case reflect.Slice:
		if v.IsNil() {
			return v
		}
		n := min(v.Len(), limit)
		out := reflect.MakeSlice(v.Type(), n, n)
		for i := 0; i < n; i++ {
			out.Index(i).Set(truncated(v.Index(i), ElideAbove))
		}
		return out
	case reflect.Map:
		if v.IsNil() {
			return v
		}
		out := reflect.MakeMapWithSize(v.Type(), v.Len())
		iter := v.MapRange()
		for iter.Next() {
			out.SetMapIndex(iter.Key(), truncated(iter.Value(), limit))
		}
		return out
	}
	return v
}
