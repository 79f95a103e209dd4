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
func (v *Validator) ValidateSample(method string, value any) *protocol.Error {
	sample := truncated(reflect.ValueOf(value))
	b, err := json.Marshal(sample.Interface())
	if err != nil {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", "The params could not be encoded for validation: "+err.Error()+".")
	}
	return v.validate(method, b, false)
}

var marshalerType = reflect.TypeOf((*json.Marshaler)(nil)).Elem()

// truncated returns a copy of v in which every slice holds at most
// ElideAbove elements. Types with their own JSON encoding are copied whole.
func truncated(v reflect.Value) reflect.Value {
	if !v.IsValid() || v.Type().Implements(marshalerType) {
		return v
	}
	switch v.Kind() {
	case reflect.Pointer:
		if v.IsNil() {
			return v
		}
		p := reflect.New(v.Type().Elem())
		p.Elem().Set(truncated(v.Elem()))
		return p
	case reflect.Struct:
		out := reflect.New(v.Type()).Elem()
		for i := 0; i < v.NumField(); i++ {
			if out.Field(i).CanSet() {
				out.Field(i).Set(truncated(v.Field(i)))
			}
		}
		return out
	case reflect.Slice:
		if v.IsNil() {
			return v
		}
		n := min(v.Len(), ElideAbove)
		out := reflect.MakeSlice(v.Type(), n, n)
		for i := 0; i < n; i++ {
			out.Index(i).Set(truncated(v.Index(i)))
		}
		return out
	case reflect.Map:
		if v.IsNil() {
			return v
		}
		out := reflect.MakeMapWithSize(v.Type(), v.Len())
		iter := v.MapRange()
		for iter.Next() {
			out.SetMapIndex(iter.Key(), truncated(iter.Value()))
		}
		return out
	}
	return v
}
