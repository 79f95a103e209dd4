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
	b, _ := marshalResponseTo(r, nil)
	return b
}

// marshalResponseTo is marshalResponse that, given a sink, streams a large
// response to it as it is encoded (see streamJSON): it returns the text
// not yet sent and whether anything was sent. Before anything is sent the
// whole response is checked, so a response that cannot be encoded
// becomes the internal error, unstreamed, as in marshalResponse.
func marshalResponseTo(r *protocol.Response, sink partSink) (rest []byte, streamed bool) {
	if r.ID == nil {
		r.ID = json.RawMessage("null")
	}
	b, streamed, err := streamJSON(make([]byte, 0, 4096), r, sink, streamChunk)
	if err == nil || streamed {
		// An error once streaming has begun cannot happen: the dry pass
		// checked every value first.
		return b, streamed
	}
	if b, err = encodeStandard(r); err != nil {
		*r = *errorResponse(r.ID, protocol.NewError(protocol.CodeInternal, "internal error",
			fmt.Sprintf("The result could not be encoded as JSON (%v). This is a bug: please report it with the request.", err)))
		b, _ = encode(r)
	}
	return b, false
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
