package jsonrpc

import (
	"bytes"
	"encoding/json"
	"fmt"

	"gusset/protocol"
)

func errorResponse(id json.RawMessage, e *protocol.Error) *protocol.Response {
	if id == nil {
		id = json.RawMessage("null")
	}
	return &protocol.Response{JSONRPC: "2.0", ID: id, Error: shortened(e)}
}

// marshalResponse encodes a response; a result that cannot be encoded (a
// NaN slipped through) becomes an internal error rather than a broken line,
// and r is changed to that error so that callers count and report what
// was written.
func marshalResponse(r *protocol.Response) []byte {
	if r.ID == nil {
		r.ID = json.RawMessage("null")
	}
	b, err := encode(r)
	if err != nil {
		*r = *errorResponse(r.ID, protocol.NewError(protocol.CodeInternal, "internal error",
			fmt.Sprintf("The result could not be encoded as JSON (%v). This is a bug: please report it with the request.", err)))
		b, _ = encode(r)
	}
	return b
}

// encode marshals v without HTML escaping, so that ids and strings go out
// byte for byte as the host sent them ("&" stays "&", not "\u0026"): by
// appendJSON (fastencode.go) when it handles v, else by encoding/json,
// whose bytes appendJSON's are.
func encode(v any) ([]byte, error) {
	if b, err := appendJSON(make([]byte, 0, 4096), v); err == nil {
		return b, nil
	}
	return encodeStandard(v)
}

// encodeStandard is encode by encoding/json alone.
func encodeStandard(v any) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimSuffix(buf.Bytes(), []byte("\n")), nil
}
