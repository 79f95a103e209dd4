package jsonrpc

import (
	"bufio"
	"context"
	"encoding/json"
	"io"
	"strings"
	"testing"
	"time"

	"gusset/protocol"
)

// serveRaw runs the server over the input and returns every output line.
func serveRaw(t *testing.T, s *Server, input string) []string {
	t.Helper()
	var out strings.Builder
	if _, err := s.Serve(context.Background(), strings.NewReader(input), &out); err != nil {
		t.Fatalf("Serve: %v", err)
	}
	return strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
}

// decodeBatch decodes an output line that must be an array of responses,
// by id (the last one of an id; all of them in dup).
func decodeBatch(t *testing.T, line string) (byID map[string]message, dup map[string][]message) {
	t.Helper()
	var ms []message
	if err := json.Unmarshal([]byte(line), &ms); err != nil {
		t.Fatalf("not an array of responses: %q: %v", line, err)
	}
	byID, dup = map[string]message{}, map[string][]message{}
	for _, m := range ms {
		if m.Method != "" {
			t.Errorf("a notification inside a batch's answer: %+v", m)
		}
		byID[string(m.ID)] = m
		dup[string(m.ID)] = append(dup[string(m.ID)], m)
	}
	return byID, dup
}

// TestBatch follows JSON-RPC 2.0 §6: a batch is answered with one array
// holding a response for every member that is not a notification (here
// two results, an unknown method, a member that is not an object, a bad
// envelope and a duplicate id), in any order; an empty array gets one
// -32600 object; a batch of notifications gets nothing; and a describe in
// a batch is answered inside the array.
func TestBatch(t *testing.T) {
	input := strings.Join([]string{
		`[{"jsonrpc":"2.0","id":1,"method":"echo","params":{"a":1}},` +
			`{"jsonrpc":"2.0","method":"echo"},` +
			`{"jsonrpc":"2.0","id":"2","method":"nope"},` +
			`7,` +
			`{"jsonrpc":"1.0","id":3,"method":"echo"},` +
			`{"jsonrpc":"2.0","id":"d","method":"describe"},` +
			`{"jsonrpc":"2.0","id":4,"method":"slow"},` +
			`{"jsonrpc":"2.0","id":4,"method":"echo"},` +
			`{"jsonrpc":"2.0","id":5,"method":"cancel","params":{"request":4}}]`,
		`[]`,
		`[{"jsonrpc":"2.0","method":"echo"},{"jsonrpc":"2.0","method":"describe"}]`,
		`{"jsonrpc":"2.0","id":"last","method":"echo"}`,
	}, "\n") + "\n"
	lines := serveRaw(t, testServer(protocol.Limits{Workers: 2}), input)
	var arrays, objects []string
	for _, l := range lines {
		if strings.HasPrefix(l, "[") {
			arrays = append(arrays, l)
		} else {
			objects = append(objects, l)
		}
	}
	if len(arrays) != 1 {
		t.Fatalf("%d array lines, want 1 (the batch of notifications gets none): %q", len(arrays), lines)
	}
	got, all := decodeBatch(t, arrays[0])
	want := map[string]int{`1`: 0, `"2"`: protocol.CodeMethodNotFound, `3`: protocol.CodeInvalidRequest,
		`"d"`: 0, `5`: 0, `null`: protocol.CodeInvalidRequest}
	for id, code := range want {
		m, ok := got[id]
		switch {
		case !ok:
			t.Errorf("no response with id %s in %q", id, arrays[0])
		case code == 0 && m.Error != nil:
			t.Errorf("id %s: error %+v", id, m.Error)
		case code != 0 && (m.Error == nil || m.Error.Code != code):
			t.Errorf("id %s: %+v, want code %d", id, m.Error, code)
		}
	}
	// The second member with id 4 is refused with -32600 while the first,
	// slow, is in flight; the slow one is then cancelled by member 5.
	codes := map[int]int{}
	for _, m := range all[`4`] {
		if m.Error != nil {
			codes[m.Error.Code]++
		}
	}
	if len(all[`4`]) != 2 || codes[protocol.CodeInvalidRequest] != 1 || codes[protocol.CodeCancelled] != 1 {
		t.Errorf("id 4: %+v, want one -32600 and one cancelled", all[`4`])
	}
	var ms []message
	json.Unmarshal([]byte(arrays[0]), &ms)
	if len(ms) != 8 {
		t.Errorf("%d responses in the array, want 8: %q", len(ms), arrays[0])
	}
	if string(got[`1`].Result) != `{"a":1}` || string(got[`5`].Result) != `{"cancelled":true}` {
		t.Errorf("echo %s, cancel %s", got[`1`].Result, got[`5`].Result)
	}
	emptyAnswered := false
	for _, l := range objects {
		var m message
		if err := json.Unmarshal([]byte(l), &m); err != nil {
			t.Fatalf("not an object: %q", l)
		}
		if m.Method == "" && string(m.ID) == "null" && m.Error != nil && m.Error.Code == protocol.CodeInvalidRequest {
			emptyAnswered = true
		}
	}
	if !emptyAnswered {
		t.Errorf("the empty batch got no single -32600 object: %q", objects)
	}
}

// TestBatchStreamsAndCancels: a member's progress notifications are
// written as they happen, before the batch's array; a cancel on a later
// line stops a member still running; the array waits for the last member.
func TestBatchStreamsAndCancels(t *testing.T) {
	inR, inW := io.Pipe()
	outR, outW := io.Pipe()
	s := testServer(protocol.Limits{Workers: 2})
	done := make(chan struct{})
	go func() {
		defer close(done)
		s.Serve(context.Background(), inR, outW)
		outW.Close()
	}()
	go io.WriteString(inW, `[{"jsonrpc":"2.0","id":"s","method":"slow"},{"jsonrpc":"2.0","id":"e","method":"echo","params":{"b":2}}]`+"\n")
	sc := bufio.NewScanner(outR)
	sc.Buffer(nil, 1<<20)
	progress, cancelled := 0, false
	var array string
	deadline := time.AfterFunc(20*time.Second, func() { inW.Close() })
	defer deadline.Stop()
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "[") {
			array = line
			inW.Close()
			continue
		}
		var m message
		if err := json.Unmarshal([]byte(line), &m); err != nil {
			t.Fatalf("bad line %q", line)
		}
		if array != "" {
			t.Errorf("a line after the batch's array: %q", line)
		}
		if m.Method == "progress" && string(m.Params.Request) == `"s"` {
			progress++
			if progress == 3 && !cancelled {
				cancelled = true
				go io.WriteString(inW, `{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"s"}}`+"\n")
			}
		}
		if m.Method == "" && string(m.ID) == `"c"` && string(m.Result) != `{"cancelled":true}` {
			t.Errorf("cancel answered %s", m.Result)
		}
	}
	<-done
	if progress < 3 {
		t.Fatalf("%d progress notifications of the batch's member before its array, want at least 3", progress)
	}
	got, _ := decodeBatch(t, array)
	if m := got[`"s"`]; m.Error == nil || m.Error.Code != protocol.CodeCancelled {
		t.Errorf("slow member: %+v, want cancelled", m)
	}
	if m := got[`"e"`]; string(m.Result) != `{"b":2}` {
		t.Errorf("echo member: %+v", m)
	}
}

// TestBatchTimeLimitPerMember: the time limit applies to each member, not
// to the batch: the slow member is stopped with the time-limit error and
// the quick one still answered.
func TestBatchTimeLimitPerMember(t *testing.T) {
	lines := serveRaw(t, testServer(protocol.Limits{Workers: 1, TimeLimitSeconds: 0.05}),
		`[{"jsonrpc":"2.0","id":1,"method":"slow"},{"jsonrpc":"2.0","id":2,"method":"echo"}]`+"\n")
	var array string
	for _, l := range lines {
		if strings.HasPrefix(l, "[") {
			array = l
		}
	}
	got, _ := decodeBatch(t, array)
	if m := got[`1`]; m.Error == nil || m.Error.Code != protocol.CodeTimeLimit {
		t.Errorf("slow member: %+v, want the time-limit error", m)
	}
	if m := got[`2`]; m.Error != nil {
		t.Errorf("echo member: %+v", m)
	}
}
