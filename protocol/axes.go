package protocol

import (
	"bytes"
	"encoding/json"
	"errors"
)

// SweepAxes are a sweep's parameters: on the wire one axis object (a line)
// or an array of one or two (a grid, the second varying fastest).
type SweepAxes []SweepAxis

// UnmarshalJSON reads one axis object as a list of one, or an array of
// axes; unknown fields are refused in either form, as everywhere else.
func (a *SweepAxes) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	if len(b) > 0 && b[0] == '{' {
		var axis SweepAxis
		if err := strictDecode(b, &axis); err != nil {
			return err
		}
		*a = SweepAxes{axis}
		return nil
	}
	var list []SweepAxis
	if err := strictDecode(b, &list); err != nil {
		return err
	}
	*a = list
	return nil
}

func strictDecode(b []byte, v any) error {
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(v); err != nil {
		return err
	}
	if dec.More() {
		return errors.New("protocol: trailing data after the sweep's parameters")
	}
	return nil
}
