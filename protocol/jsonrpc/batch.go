package jsonrpc

import (
	"bytes"
	"encoding/json"
	"sync"
	"unicode/utf8"

	"gusset/protocol"
)

// Batches (JSON-RPC 2.0 §6).
//
// A line holding a JSON array is a batch: each member is handled as a line
// of its own would be (admitted, queued, limited, cancelled and refused as
// a duplicate id alike, and its progress notifications sent as they
// happen), except that its final response is collected, and the responses
// of all the members are written as one array on one line once the last
// of them is ready. Notifications in a batch get no response; a batch of
// only notifications gets no line at all, and an empty array gets a single
// -32600 error object (not an array). The members are split and parsed on
// the reader, whatever the line's length.

// batch collects the final responses of one batch's members.
type batch struct {
	mu       sync.Mutex
	expected int  // responses owed, counted as the members are read
	sealed   bool // every member has been read
	lines    [][]byte
}

// expect counts one more response owed.
func (b *batch) expect() {
	b.mu.Lock()
	b.expected++
	b.mu.Unlock()
}

// add records one encoded response and returns the batch's array line when
// it completes the batch, or nil.
func (b *batch) add(line []byte) []byte {
	b.mu.Lock()
	defer b.mu.Unlock()
	b.lines = append(b.lines, line)
	return b.complete()
}

// seal marks the batch as read whole and returns its array line when every
// response is already in, or nil.
func (b *batch) seal() []byte {
	b.mu.Lock()
	defer b.mu.Unlock()
	b.sealed = true
	return b.complete()
}

// complete returns the array line once the batch is sealed and every
// response owed is in; nil otherwise, and for a batch owing none. Called
// under b.mu.
func (b *batch) complete() []byte {
	if !b.sealed || len(b.lines) < b.expected || b.expected == 0 {
		return nil
	}
	return append(append([]byte("["), bytes.Join(b.lines, []byte(","))...), ']')
}

// isBatch reports whether a line's first significant byte opens an array.
func isBatch(line []byte) bool {
	t := bytes.TrimLeft(line, " \t\r\n")
	return len(t) > 0 && t[0] == '['
}

// handleBatch splits a batch line into its members and handles each. A
// line that is not a valid JSON array (a syntax error, text that is not
// UTF-8) is answered with a single parse error, as any other line is.
func (c *conn) handleBatch(line []byte) {
	var members []json.RawMessage
	if !utf8.Valid(line) || json.Unmarshal(line, &members) != nil {
		_, resp := c.s.parse(line)
		c.respond(resp)
		return
	}
	if len(members) == 0 {
		c.respond(errorResponse(nil, protocol.NewError(protocol.CodeInvalidRequest, "invalid request",
			"The batch is an empty array. Send at least one request in a batch (JSON-RPC 2.0 §6).",
			protocol.Problem{Path: "", Message: "empty batch"})))
		return
	}
	b := &batch{}
	for _, m := range members {
		cl, resp := c.s.parse(m)
		if resp != nil || cl.id != nil {
			b.expect()
		}
		if cl != nil {
			cl.batch = b
		}
		c.handleParsed(cl, resp, len(m), b)
	}
	if out := b.seal(); out != nil {
		c.w.send(out)
	}
}

// reply sends a final response, or collects it into its batch when b is
// not nil (writing the batch's array when it is the last one owed). A
// large response on a line of its own is written as it is encoded.
func (c *conn) reply(b *batch, resp *protocol.Response) {
	if b == nil {
		out := c.w.newLine()
		rest, _ := c.account(resp, out)
		out.finish(rest)
		return
	}
	line, _ := c.account(resp, nil)
	if out := b.add(line); out != nil {
		c.w.send(out)
	}
}
