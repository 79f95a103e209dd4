package protocol

import (
	"errors"
	"reflect"
	"testing"
)

// agreeEach decodes data with DecodeStrictEach into a fresh value, with
// sinks that keep every node and member, and fails t unless it accepts
// exactly what DecodeStrict accepts and, with the kept elements put back
// into the model's arrays, gives want, encoding/json's value (the
// reference); a present array must be left empty and not nil, an absent
// or null one nil. It also checks that an error from a sink declines the
// input and leaves the value zero.
func agreeEach(t *testing.T, name string, data []byte, fresh func() any, want any, strictErr error) {
	t.Helper()
	var nodes []Node
	var members []Member
	starts := 0
	sinks := []Sink{
		&Each[Node]{Start: func(int) { starts++ }, Take: func(n *Node) error { nodes = append(nodes, *n); return nil }},
		&Each[Member]{Take: func(m *Member) error { members = append(members, *m); return nil }},
	}
	got := fresh()
	err := DecodeStrictEach(data, got, sinks...)
	if (err == nil) != (strictErr == nil) {
		t.Fatalf("%s: DecodeStrictEach gives %v, DecodeStrict %v", name, err, strictErr)
	}
	if err != nil {
		if !reflect.ValueOf(got).Elem().IsZero() {
			t.Errorf("%s: DecodeStrictEach declined but left %+v", name, got)
		}
		return
	}
	if f := reflect.ValueOf(got).Elem().FieldByName("Model"); f.IsValid() && f.Type() == reflect.TypeFor[Model]() {
		w := f.Addr().Interface().(*Model)
		if w.Nodes != nil && len(w.Nodes) != 0 || w.Members != nil && len(w.Members) != 0 {
			t.Fatalf("%s: DecodeStrictEach stored elements its sinks took", name)
		}
		if w.Nodes != nil {
			w.Nodes = append([]Node{}, nodes...)
		}
		if w.Members != nil {
			w.Members = append([]Member{}, members...)
		}
		if len(nodes) > 0 && starts != 1 {
			t.Errorf("%s: Start called %d times for one array of nodes", name, starts)
		}
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("%s: DecodeStrictEach with the elements put back gives\n%+v\nencoding/json gives\n%+v", name, got, want)
	}
	if len(members) > 0 {
		refuse := &Each[Member]{Take: func(*Member) error { return errors.New("no") }}
		got := fresh()
		if DecodeStrictEach(data, got, refuse) == nil || !reflect.ValueOf(got).Elem().IsZero() {
			t.Errorf("%s: a sink's error did not decline the input and zero the value", name)
		}
	}
}
