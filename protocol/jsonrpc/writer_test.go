package jsonrpc

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gusset/protocol"
)

// collectSink is a partSink that keeps what it is sent.
type collectSink struct {
	out   []byte
	parts int
}

func (c *collectSink) send(p []byte)  { c.out = append(c.out, p...); c.parts++ }
func (c *collectSink) buffer() []byte { return make([]byte, 0, 64) }

// TestStreamJSONEqualsWhole: the pieces streamJSON sends followed by the
// text it returns are appendJSON's bytes (themselves encoding/json's, see
// TestAppendJSONAgreesWithEncodingJSON), for every value of the encoder
// corpus and limits from one byte (a piece after every value) to more
// than the whole.
func TestStreamJSONEqualsWhole(t *testing.T) {
	for k, v := range encoderCorpus() {
		want, err := appendJSON(nil, v)
		if err != nil {
			t.Fatalf("value %d: %v", k, err)
		}
		for _, limit := range []int{1, 13, 4096, 1 << 30} {
			var sink collectSink
			rest, streamed, err := streamJSON([]byte("prefix:"), v, &sink, limit)
			if err != nil {
				t.Fatalf("value %d, limit %d: %v", k, limit, err)
			}
			got := append(sink.out, rest...)
			if !bytes.Equal(got, append([]byte("prefix:"), want...)) {
				t.Errorf("value %d, limit %d: streamed bytes differ from appendJSON's", k, limit)
			}
			if streamed != (sink.parts > 0) || limit == 1 && k == 0 && sink.parts < 100 {
				t.Errorf("value %d, limit %d: streamed %v in %d parts", k, limit, streamed, sink.parts)
			}
		}
	}
}

// TestStreamJSONSendsNothingItCannotFinish: a NaN or an infinity late in
// a large value, or a type left to encoding/json, is found by the dry pass
// before the first piece goes out, so nothing is sent and the caller can
// fall back as for an unstreamed response.
func TestStreamJSONSendsNothingItCannotFinish(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	late := randomCase(r, 2*parallelFloats)
	late.Stresses[len(late.Stresses)-1] = math.NaN()
	rows := randomCase(r, 100)
	rows.EndForces[99][5] = math.Inf(1)
	util := randomCase(r, 100)
	inf := math.Inf(-1)
	util.Utilisation[98] = &inf
	type embedded struct{ protocol.Problem }
	for k, v := range []any{
		protocol.SolveResult{Cases: []protocol.CaseResult{late}},
		protocol.SolveResult{Cases: []protocol.CaseResult{rows}},
		protocol.SolveResult{Cases: []protocol.CaseResult{util}},
		[]any{randomFloats(r, 1000), embedded{}},
	} {
		var sink collectSink
		_, streamed, err := streamJSON(nil, v, &sink, 16)
		if !errors.Is(err, errFallback) || streamed || sink.parts != 0 {
			t.Errorf("value %d: error %v, streamed %v, %d parts sent", k, err, streamed, sink.parts)
		}
	}
	resp := &protocol.Response{JSONRPC: "2.0", ID: json.RawMessage("4"), Result: protocol.SolveResult{Cases: []protocol.CaseResult{late}}}
	var sink collectSink
	line, streamed := marshalResponseTo(resp, &sink)
	if streamed || sink.parts != 0 || resp.Error == nil || resp.Error.Code != protocol.CodeInternal || !bytes.Contains(line, []byte(`"code":-32603`)) {
		t.Errorf("a NaN in a large result: streamed %v, %d parts, line %.200s", streamed, sink.parts, line)
	}
}

// largeServer is a server with a method "big" that sends progress and
// then returns a solve result of about n nodes (several MB for n in the
// tens of thousands), and a method "small".
func largeServer(n int) (*Server, *protocol.SolveResult) {
	r := rand.New(rand.NewPCG(7, 8))
	res := &protocol.SolveResult{Cases: []protocol.CaseResult{randomCase(r, n), randomCase(r, n/3)}, Warnings: []string{}, Caution: "check"}
	s := &Server{Name: "t", Version: "0", Limits: protocol.Limits{Workers: 2}}
	s.Handle(protocol.Method{Name: "big"}, func(ctx context.Context, _ json.RawMessage, st Stream) (any, error) {
		for i := range 3 {
			st.Progress("step", i, 3, map[string]int{"i": i})
		}
		return res, nil
	})
	s.Handle(protocol.Method{Name: "small"}, func(ctx context.Context, _ json.RawMessage, st Stream) (any, error) {
		return []int{1, 2, 3}, nil
	})
	return s, res
}

// TestLargeResponseStreamsWhole: through the server, a response larger
// than streamChunk is written as it is encoded, yet every line of the
// output is one whole message (no other message falls inside the long
// one while small requests answer beside it on two workers), the long
// line's bytes are those of the unstreamed encoding, and a request's
// progress precedes its response.
func TestLargeResponseStreamsWhole(t *testing.T) {
	s, res := largeServer(20000)
	var in strings.Builder
	for i := range 4 {
		fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%d,"method":"big"}`+"\n", 10*i)
		for j := 1; j < 5; j++ {
			fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%d,"method":"small"}`+"\n", 10*i+j)
		}
	}
	var out bytes.Buffer
	if failures, err := s.Serve(context.Background(), strings.NewReader(in.String()), &out); failures != 0 || err != nil {
		t.Fatalf("failures %d, error %v", failures, err)
	}
	want := marshalResponse(&protocol.Response{JSONRPC: "2.0", ID: json.RawMessage("0"), Result: res})
	if len(want) < 4*streamChunk {
		t.Fatalf("the large response is %d bytes, too small to stream", len(want))
	}
	answered := map[string]bool{}
	big := 0
	sc := bufio.NewScanner(&out)
	sc.Buffer(nil, 1<<30)
	for sc.Scan() {
		line := sc.Bytes()
		var m struct {
			ID     json.RawMessage
			Method string
			Params struct{ Request json.RawMessage }
		}
		if err := json.Unmarshal(line, &m); err != nil {
			t.Fatalf("a line is not one JSON message: %v (%.120s)", err, line)
		}
		if m.Method == "progress" {
			if answered[string(m.Params.Request)] {
				t.Errorf("progress of %s after its response", m.Params.Request)
			}
			continue
		}
		answered[string(m.ID)] = true
		if len(line) > streamChunk {
			big++
			want := bytes.Replace(want, []byte(`"id":0`), []byte(`"id":`+string(m.ID)), 1)
			if !bytes.Equal(line, want) {
				t.Errorf("response %s: streamed bytes differ from the unstreamed encoding", m.ID)
			}
		}
	}
	if big != 4 || len(answered) != 20 {
		t.Errorf("%d large responses of 4, %d answered of 20", big, len(answered))
	}
}

// failAfter is an output that fails once n bytes have been written.
type failAfter struct{ n int }

func (f *failAfter) Write(p []byte) (int, error) {
	if f.n -= len(p); f.n < 0 {
		return 0, errors.New("output closed")
	}
	return len(p), nil
}

// TestStreamedResponseOutputFails: an output that fails in the middle of
// a streamed response ends the session with the write error; the encoder
// is not left waiting on the writer.
func TestStreamedResponseOutputFails(t *testing.T) {
	s, _ := largeServer(20000)
	in := `{"jsonrpc":"2.0","id":1,"method":"big"}` + "\n" + `{"jsonrpc":"2.0","id":2,"method":"small"}` + "\n"
	_, err := s.Serve(context.Background(), strings.NewReader(in), &failAfter{n: 3 * streamChunk})
	if err == nil || !strings.Contains(err.Error(), "output closed") {
		t.Errorf("Serve returned %v, want the write error", err)
	}
}
