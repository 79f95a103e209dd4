package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
)

// requestFile is a run file read whole: the requests as NDJSON lines for
// the server, and each request's position, for answering in file order.
type requestFile struct {
	lines [][]byte
	// keys holds, for each line, the compact id its answer will carry:
	// "null" for a line the server answers with id null (not JSON, not an
	// object), "" for a notification (no answer).
	keys []string
}

// byteOrderMark is UTF-8's byte-order mark, which some editors write at
// the start of a file.
var byteOrderMark = []byte{0xEF, 0xBB, 0xBF}

// readRequestFile reads the requests of a run file in either of its
// forms: NDJSON (one request per line, the protocol's own framing), or one
// JSON document spread over lines (a pretty-printed request, an array of
// requests, or several documents one after another). The form is chosen
// by the first line: when it holds a whole JSON value the file is NDJSON,
// and each line that is not JSON is reported on diag with its line number
// (the server answers it with -32700 too); otherwise the file is read as
// documents and a syntax error stops it with its line and column. A first
// line that does not open an object or array is NDJSON's too (a bad line).
func readRequestFile(name string, data []byte, diag io.Writer) (*requestFile, error) {
	data = bytes.TrimPrefix(data, byteOrderMark)
	raw := bytes.Split(data, []byte("\n"))
	first := -1
	for i, l := range raw {
		if len(bytes.TrimSpace(l)) > 0 {
			first = i
			break
		}
	}
	rf := &requestFile{}
	if first < 0 {
		return rf, nil
	}
	head := bytes.TrimSpace(raw[first])
	if json.Valid(head) || (head[0] != '{' && head[0] != '[') {
		for i, l := range raw {
			l = bytes.TrimRight(l, "\r")
			if len(bytes.TrimSpace(l)) == 0 {
				continue
			}
			if !json.Valid(l) {
				fmt.Fprintf(diag, "%s:%d: not a whole JSON value on this line (one request per line, or one pretty-printed document for the whole file)\n", name, i+1)
			}
			rf.add(l)
		}
		return rf, nil
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	for {
		var v json.RawMessage
		err := dec.Decode(&v)
		if err == io.EOF {
			return rf, nil
		}
		if err != nil {
			return nil, locate(name, data, dec.InputOffset(), err)
		}
		if trimmed := bytes.TrimSpace(v); len(trimmed) > 0 && trimmed[0] == '[' {
			var items []json.RawMessage
			if err := json.Unmarshal(trimmed, &items); err != nil {
				return nil, fmt.Errorf("%s: %v", name, err)
			}
			if len(items) == 0 {
				return nil, fmt.Errorf("%s: the array of requests is empty", name)
			}
			for _, item := range items {
				rf.addCompact(item)
			}
			continue
		}
		rf.addCompact(v)
	}
}

func (rf *requestFile) addCompact(v json.RawMessage) {
	var b bytes.Buffer
	if err := json.Compact(&b, v); err != nil {
		rf.add(v)
		return
	}
	rf.add(b.Bytes())
}

func (rf *requestFile) add(line []byte) {
	rf.lines = append(rf.lines, line)
	rf.keys = append(rf.keys, answerKey(line))
}

// answerKey returns the compact id the answer to line carries: "null" for
// a line the server cannot read as a request object, "" for a notification.
func answerKey(line []byte) string {
	var envelope map[string]json.RawMessage
	if err := json.Unmarshal(line, &envelope); err != nil {
		return "null"
	}
	id, ok := envelope["id"]
	if !ok {
		return ""
	}
	return compactKey(id)
}

func compactKey(id json.RawMessage) string {
	var b bytes.Buffer
	if err := json.Compact(&b, id); err != nil {
		return "null"
	}
	return b.String()
}

// ndjson joins the lines for the server.
func (rf *requestFile) ndjson() []byte {
	var b bytes.Buffer
	for _, l := range rf.lines {
		b.Write(l)
		b.WriteByte('\n')
	}
	return b.Bytes()
}

// locate turns a decoding error into "FILE:LINE:COLUMN: message", counting
// lines and columns (in bytes, from 1) up to the error's offset.
func locate(name string, data []byte, offset int64, err error) error {
	var syntax *json.SyntaxError
	if errors.As(err, &syntax) {
		offset = syntax.Offset
	}
	if offset > int64(len(data)) {
		offset = int64(len(data))
	}
	before := data[:offset]
	line := bytes.Count(before, []byte("\n")) + 1
	column := int(offset) - (bytes.LastIndexByte(before, '\n') + 1)
	if column < 1 {
		column = 1
	}
	msg := strings.TrimPrefix(err.Error(), "json: ")
	if errors.Is(err, io.ErrUnexpectedEOF) {
		msg = "the file ends inside a JSON value (a missing } or ]?)"
	}
	return fmt.Errorf("%s:%d:%d: %s", name, line, column, msg)
}
