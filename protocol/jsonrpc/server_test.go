package jsonrpc

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"sync"
	"testing"
	"time"

	"gusset/protocol"
)

// testServer has three methods: echo returns its params, slow waits for
// cancellation while reporting progress, and boom panics.
func testServer(limits protocol.Limits) *Server {
	s := &Server{Name: "test", Version: "0", Limits: limits}
	s.Handle(protocol.Method{Name: "echo"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		st.Progress("echoing", 1, 1, nil)
		return p, nil
	})
	s.Handle(protocol.Method{Name: "slow"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		for i := 0; ; i++ {
			st.Progress("waiting", i, 0, map[string]int{"i": i})
			select {
			case <-ctx.Done():
				return nil, ctx.Err()
			case <-time.After(time.Millisecond):
			}
		}
	})
	s.Handle(protocol.Method{Name: "boom"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		var m map[string]int
		m["x"] = 1 // panics: assignment to a nil map
		return nil, nil
	})
	s.Handle(protocol.Method{Name: "fail"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		return nil, fmt.Errorf("wrapped: %w", protocol.NewError(1002, "unstable structure", "mechanism"))
	})
	return s
}

type message struct {
	JSONRPC string             `json:"jsonrpc"`
	ID      json.RawMessage    `json:"id"`
	Method  string             `json:"method"`
	Params  *protocol.Progress `json:"params"`
	Result  json.RawMessage    `json:"result"`
	Error   *protocol.Error    `json:"error"`
}

// serveLines runs the server over the input and returns every output line,
// decoded, checking that each line is one whole JSON object.
func serveLines(t *testing.T, s *Server, input string) []message {
	t.Helper()
	var out bytes.Buffer
	if _, err := s.Serve(context.Background(), strings.NewReader(input), &out); err != nil {
		t.Fatalf("Serve: %v", err)
	}
	var msgs []message
	sc := bufio.NewScanner(&out)
	sc.Buffer(nil, 1<<26)
	for sc.Scan() {
		var m message
		if err := json.Unmarshal(sc.Bytes(), &m); err != nil {
			t.Fatalf("output line is not JSON: %q: %v", sc.Text(), err)
		}
		msgs = append(msgs, m)
	}
	return msgs
}

func finals(msgs []message) map[string]message {
	out := map[string]message{}
	for _, m := range msgs {
		if m.Method == "" {
			out[string(m.ID)] = m
		}
	}
	return out
}

// TestBadInputKeepsGoing sends each kind of malformed line followed by a
// valid request and checks the error code, the pointer, and that the valid
// request after it is still answered. Codes from the JSON-RPC 2.0
// specification, section 5.1.
func TestBadInputKeepsGoing(t *testing.T) {
	deep := strings.Repeat("[", 20000) + strings.Repeat("]", 20000)
	cases := []struct {
		name string
		line string
		code int
		path string
	}{
		{"not JSON", `{"jsonrpc": "2.0", "id": 1, "method": "echo"`, protocol.CodeParseError, ""},
		{"not an object", `42`, protocol.CodeInvalidRequest, ""},
		{"empty batch", `[ ]`, protocol.CodeInvalidRequest, ""},
		{"missing jsonrpc", `{"id": 7, "method": "echo"}`, protocol.CodeInvalidRequest, "/jsonrpc"},
		{"wrong jsonrpc", `{"jsonrpc": "1.0", "id": 7, "method": "echo"}`, protocol.CodeInvalidRequest, "/jsonrpc"},
		{"missing method", `{"jsonrpc": "2.0", "id": 7}`, protocol.CodeInvalidRequest, "/method"},
		{"unknown method", `{"jsonrpc": "2.0", "id": 7, "method": "frobnicate"}`, protocol.CodeMethodNotFound, "/method"},
		{"params not an object", `{"jsonrpc": "2.0", "id": 7, "method": "echo", "params": [1]}`, protocol.CodeInvalidParams, "/params"},
		{"id an object", `{"jsonrpc": "2.0", "id": {"a": 1}, "method": "echo"}`, protocol.CodeInvalidRequest, "/id"},
		{"deeply nested", deep, protocol.CodeParseError, ""},
		{"two values", `{} {}`, protocol.CodeParseError, ""},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			msgs := serveLines(t, testServer(protocol.Limits{Workers: 2}), c.line+"\n"+`{"jsonrpc":"2.0","id":"next","method":"echo","params":{"a":1}}`+"\n")
			var errs []message
			for _, m := range msgs {
				if m.Error != nil {
					errs = append(errs, m)
				}
			}
			if len(errs) != 1 {
				t.Fatalf("got %d error responses, want 1: %+v", len(errs), msgs)
			}
			e := errs[0].Error
			if e.Code != c.code {
				t.Errorf("code %d, want %d (%s)", e.Code, c.code, e.Message)
			}
			if e.Message == "" || e.Data == nil {
				t.Errorf("error lacks message or data: %+v", e)
			}
			if c.path != "" && (len(e.Data.Problems) == 0 || e.Data.Problems[0].Path != c.path) {
				t.Errorf("problems %+v, want path %q", e.Data.Problems, c.path)
			}
			if next, ok := finals(msgs)[`"next"`]; !ok || next.Error != nil || string(next.Result) != `{"a":1}` {
				t.Errorf("the request after the bad line was not answered properly: %+v", next)
			}
		})
	}
}

func TestOversizeLineIsSkipped(t *testing.T) {
	big := `{"jsonrpc":"2.0","id":1,"method":"echo","params":{"s":"` + strings.Repeat("x", 5000) + `"}}`
	msgs := serveLines(t, testServer(protocol.Limits{MaxLineBytes: 1000}), big+"\n"+`{"jsonrpc":"2.0","id":2,"method":"echo"}`+"\n")
	f := finals(msgs)
	if e := f["null"].Error; e == nil || e.Code != protocol.CodeParseError || !strings.Contains(e.Message, "1000 bytes") {
		t.Errorf("oversize line: got %+v", f["null"])
	}
	if f["2"].Error != nil || f["2"].Result == nil {
		t.Errorf("request after the oversize line: %+v", f["2"])
	}
}

func TestIDsEchoedByteForByte(t *testing.T) {
	ids := []string{`1`, `"a"`, `1.50`, `-0`, `"ü→"`, `12345678901234567890`}
	var in strings.Builder
	for _, id := range ids {
		fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%s,"method":"echo"}`+"\n", id)
	}
	f := finals(serveLines(t, testServer(protocol.Limits{Workers: 3}), in.String()))
	for _, id := range ids {
		if _, ok := f[id]; !ok {
			t.Errorf("no response with id %s; got %v", id, f)
		}
	}
}

func TestPanicBecomesInternalError(t *testing.T) {
	f := finals(serveLines(t, testServer(protocol.Limits{}), `{"jsonrpc":"2.0","id":1,"method":"boom"}`+"\n"+`{"jsonrpc":"2.0","id":2,"method":"echo"}`+"\n"))
	if e := f["1"].Error; e == nil || e.Code != protocol.CodeInternal {
		t.Errorf("panic: got %+v", f["1"])
	}
	if f["2"].Error != nil {
		t.Errorf("after panic: %+v", f["2"])
	}
}

func TestWrappedErrorKeepsCode(t *testing.T) {
	f := finals(serveLines(t, testServer(protocol.Limits{}), `{"jsonrpc":"2.0","id":1,"method":"fail"}`+"\n"))
	if e := f["1"].Error; e == nil || e.Code != 1002 {
		t.Errorf("got %+v, want code 1002", f["1"])
	}
}

// TestNotificationGetsNoResponse checks the JSON-RPC 2.0 rule (section 4.1)
// that a request without an id is a notification and is not answered, for
// engine methods and the server's own.
func TestNotificationGetsNoResponse(t *testing.T) {
	msgs := serveLines(t, testServer(protocol.Limits{}), `{"jsonrpc":"2.0","method":"echo"}`+"\n"+
		`{"jsonrpc":"2.0","method":"describe"}`+"\n"+`{"jsonrpc":"2.0","method":"cancel","params":{"request":5}}`+"\n"+
		`{"jsonrpc":"2.0","id":2,"method":"echo"}`+"\n")
	if f := finals(msgs); len(f) != 1 || f["2"].Result == nil {
		t.Errorf("got %+v", msgs)
	}
}

func TestDescribe(t *testing.T) {
	f := finals(serveLines(t, testServer(protocol.Limits{Workers: 3}), `{"jsonrpc":"2.0","id":1,"method":"describe"}`+"\n"))
	var d protocol.DescribeResult
	if err := json.Unmarshal(f["1"].Result, &d); err != nil {
		t.Fatal(err)
	}
	if d.Name != "test" || d.ProtocolVersion != protocol.Version || d.Limits.Workers != 3 || len(d.Methods) != 6 {
		t.Errorf("describe: %+v", d)
	}
}

// pipeServer runs a server on pipes so a test can write requests while
// reading responses.
type pipeServer struct {
	in   *io.PipeWriter
	out  *bufio.Reader
	done chan error
}

func startPipe(s *Server) *pipeServer {
	inR, inW := io.Pipe()
	outR, outW := io.Pipe()
	p := &pipeServer{in: inW, out: bufio.NewReader(outR), done: make(chan error, 1)}
	go func() {
		_, err := s.Serve(context.Background(), inR, outW)
		outW.Close()
		p.done <- err
	}()
	return p
}

func (p *pipeServer) send(line string) { io.WriteString(p.in, line+"\n") }

func (p *pipeServer) next(t testing.TB) message {
	t.Helper()
	line, err := p.out.ReadBytes('\n')
	if err != nil {
		t.Fatalf("reading: %v", err)
	}
	var m message
	if err := json.Unmarshal(line, &m); err != nil {
		t.Fatalf("bad line %q", line)
	}
	return m
}

func TestCancelStopsRequestAndItIsStillAnswered(t *testing.T) {
	p := startPipe(testServer(protocol.Limits{Workers: 2}))
	p.send(`{"jsonrpc":"2.0","id":"long","method":"slow"}`)
	for m := p.next(t); m.Method != "progress"; m = p.next(t) {
	}
	p.send(`{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"long"}}`)
	var gotCancel, gotFinal bool
	for !(gotCancel && gotFinal) {
		m := p.next(t)
		switch {
		case m.Method == "progress":
			if gotFinal {
				t.Fatal("progress after the final response")
			}
		case string(m.ID) == `"c"`:
			gotCancel = true
			if string(m.Result) != `{"cancelled":true}` {
				t.Errorf("cancel result %s", m.Result)
			}
		case string(m.ID) == `"long"`:
			gotFinal = true
			if m.Error == nil || m.Error.Code != protocol.CodeCancelled {
				t.Errorf("cancelled request: %+v", m)
			}
		}
	}
	p.in.Close()
	if err := <-p.done; err != nil {
		t.Fatal(err)
	}
}

func TestTimeLimit(t *testing.T) {
	f := finals(serveLines(t, testServer(protocol.Limits{TimeLimitSeconds: 0.05, Workers: 2}),
		`{"jsonrpc":"2.0","id":1,"method":"slow"}`+"\n"+`{"jsonrpc":"2.0","id":2,"method":"echo"}`+"\n"))
	if e := f["1"].Error; e == nil || e.Code != protocol.CodeTimeLimit {
		t.Errorf("time limit: %+v", f["1"])
	}
	if f["2"].Error != nil {
		t.Errorf("other request: %+v", f["2"])
	}
}

func TestDuplicateIDInFlight(t *testing.T) {
	p := startPipe(testServer(protocol.Limits{Workers: 2}))
	p.send(`{"jsonrpc":"2.0","id":5,"method":"slow"}`)
	for m := p.next(t); m.Method != "progress"; m = p.next(t) {
	}
	p.send(`{"jsonrpc":"2.0","id":5,"method":"echo"}`)
	for {
		m := p.next(t)
		if m.Method == "" {
			if m.Error == nil || m.Error.Code != protocol.CodeInvalidRequest {
				t.Fatalf("duplicate id: %+v", m)
			}
			break
		}
	}
	p.send(`{"jsonrpc":"2.0","id":6,"method":"cancel","params":{"request":5}}`)
	p.in.Close()
	for {
		line, err := p.out.ReadBytes('\n')
		if err != nil {
			break
		}
		_ = line
	}
	<-p.done
}

// TestManyRequestsOneAnswerEach pipelines requests of every kind into a
// server with several workers and checks that each gets exactly one final
// response, after all of its notifications.
func TestManyRequestsOneAnswerEach(t *testing.T) {
	for _, workers := range []int{1, 4} {
		t.Run(fmt.Sprintf("workers=%d", workers), func(t *testing.T) {
			var in strings.Builder
			const n = 2000
			for i := 0; i < n; i++ {
				switch i % 4 {
				case 0, 1:
					fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%d,"method":"echo","params":{"i":%d}}`+"\n", i, i)
				case 2:
					fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%d,"method":"nothing"}`+"\n", i)
				case 3:
					fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%d,"method":"echo","params":7}`+"\n", i)
				}
			}
			msgs := serveLines(t, testServer(protocol.Limits{Workers: workers}), in.String())
			seen := map[string]int{}
			for _, m := range msgs {
				if m.Method == "progress" {
					if seen[string(m.Params.Request)] > 0 {
						t.Fatalf("notification after final response of %s", m.Params.Request)
					}
					continue
				}
				seen[string(m.ID)]++
			}
			if len(seen) != n {
				t.Errorf("workers=%d: %d distinct responses, want %d", workers, len(seen), n)
			}
			for id, c := range seen {
				if c != 1 {
					t.Errorf("id %s answered %d times", id, c)
				}
			}
		})
	}
}

type failingWriter struct{ mu sync.Mutex }

func (w *failingWriter) Write(p []byte) (int, error) { return 0, errors.New("pipe closed") }

func TestClosedOutputEndsServe(t *testing.T) {
	s := testServer(protocol.Limits{Workers: 2})
	pr, pw := io.Pipe()
	done := make(chan error, 1)
	go func() {
		_, err := s.Serve(context.Background(), pr, &failingWriter{})
		done <- err
	}()
	io.WriteString(pw, `{"jsonrpc":"2.0","id":1,"method":"slow"}`+"\n")
	io.WriteString(pw, `{"jsonrpc":"2.0","id":2,"method":"echo"}`+"\n")
	pw.Close()
	select {
	case err := <-done:
		if err == nil {
			t.Error("want the write error")
		}
	case <-time.After(10 * time.Second):
		t.Fatal("Serve hung after its output failed")
	}
}
