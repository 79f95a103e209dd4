package protocol

import "encoding/json"

// ObjectMembers splits data, one JSON object with optional white space
// around it, into its members' raw values, exactly as json.Unmarshal into
// a map[string]json.RawMessage would, in one checking pass and without
// copying: the values alias data. A repeated key's last value wins. On
// any input it does not handle (not an object, an escape in a string,
// invalid UTF-8 in a string, nesting deeper than 500, a syntax error) it
// reports ok false, and the caller decodes data with encoding/json, which
// gives the precise error or the same members.
// TestObjectMembersAgreesWithEncodingJSON checks the two agree.
func ObjectMembers(data []byte) (members map[string]json.RawMessage, ok bool) {
	d := &decoder{data: data}
	d.space()
	if d.pos >= len(d.data) || d.data[d.pos] != '{' {
		return nil, false
	}
	members = make(map[string]json.RawMessage, 4)
	err := d.members(func(key []byte) error {
		start := d.pos
		if err := d.valid(1); err != nil {
			return err
		}
		members[string(key)] = d.data[start:d.pos:d.pos]
		return nil
	})
	d.space()
	if err != nil || d.pos != len(d.data) {
		return nil, false
	}
	return members, true
}

// valid moves past the value at pos, checking its syntax, with no
// closure per element: a request's params are most of its
// line, and this is the one pass that checks their syntax before a
// worker decodes them.
func (d *decoder) valid(depth int) error {
	if depth > maxDepth || d.pos >= len(d.data) {
		return errUnhandled
	}
	switch c := d.data[d.pos]; {
	case c == '{':
		return d.validObject(depth)
	case c == '[':
		return d.validArray(depth)
	case c == '"':
		_, err := d.strBytes()
		return err
	case c == '-' || c >= '0' && c <= '9':
		_, err := d.numberToken()
		return err
	case d.literal("true") || d.literal("false") || d.literal("null"):
		return nil
	}
	return errUnhandled
}

func (d *decoder) validObject(depth int) error {
	empty, err := d.open('{', '}')
	for !empty && err == nil {
		if _, err = d.strBytes(); err != nil {
			return err
		}
		d.space()
		if d.pos >= len(d.data) || d.data[d.pos] != ':' {
			return errUnhandled
		}
		d.pos++
		d.space()
		if err = d.valid(depth + 1); err == nil {
			empty, err = d.next('}')
		}
	}
	return err
}

func (d *decoder) validArray(depth int) error {
	empty, err := d.open('[', ']')
	for !empty && err == nil {
		if err = d.valid(depth + 1); err == nil {
			empty, err = d.next(']')
		}
	}
	return err
}
