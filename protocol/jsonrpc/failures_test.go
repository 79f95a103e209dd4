package jsonrpc

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"strings"
	"sync"
	"testing"

	"gusset/protocol"
)

// TestUnencodableResultCountsAsFailure checks that a result that cannot be
// encoded (a NaN: RFC 8259 §6 has no NaN, and encoding/json refuses it)
// goes out as an internal error and counts as a failure, so that `gusset
// run` exits 1 (issue 18: it exited 0 with a -32603 in its output), and
// that OnResponse sees the error that was written.
func TestUnencodableResultCountsAsFailure(t *testing.T) {
	s := &Server{Name: "test", Version: "0"}
	s.Handle(protocol.Method{Name: "nan"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		return map[string]float64{"x": math.NaN()}, nil
	})
	s.Handle(protocol.Method{Name: "fine"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		return map[string]float64{"x": 1}, nil
	})
	var seen []*protocol.Response
	var mu sync.Mutex // OnResponse is called from the workers
	s.OnResponse = func(r *protocol.Response) { mu.Lock(); seen = append(seen, r); mu.Unlock() }
	in := `{"jsonrpc":"2.0","id":1,"method":"nan"}` + "\n" + `{"jsonrpc":"2.0","id":2,"method":"fine"}` + "\n"
	var out bytes.Buffer
	failures, err := s.Serve(context.Background(), strings.NewReader(in), &out)
	if err != nil {
		t.Fatal(err)
	}
	if failures != 1 {
		t.Errorf("failures = %d, want 1; output:\n%s", failures, out.String())
	}
	if !strings.Contains(out.String(), `"code":-32603`) {
		t.Errorf("no internal error in the output:\n%s", out.String())
	}
	errors := 0
	for _, r := range seen {
		if r.Error != nil {
			errors++
		}
	}
	if errors != 1 {
		t.Errorf("OnResponse saw %d errors, want 1", errors)
	}
}
