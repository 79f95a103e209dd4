package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"testing"

	"gusset/protocol"
)

// TestCancelAnswerAgreesWithOutcome sends many quick requests, each
// followed at once by a cancel of it, so that cancels land at every moment
// of a request's life, including just as it finishes. The README promises
// that a cancel answering {"cancelled": true} is followed by the cancelled
// error -32000 for its target; with {"cancelled": false} the target keeps
// its own answer (here the invalid-model error 1000 of a dangling member
// end).
func TestCancelAnswerAgreesWithOutcome(t *testing.T) {
	const pairs = 20_000
	dangling := twoBar(3)
	dangling["members"].([]any)[1].(map[string]any)["ends"] = []string{"B", "Z"}
	params, err := json.Marshal(map[string]any{"model": dangling})
	if err != nil {
		t.Fatal(err)
	}
	var in bytes.Buffer
	for i := range pairs {
		fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%d,"method":"solve","params":%s}`+"\n", i, params)
		fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":"c%d","method":"cancel","params":{"request":%d}}`+"\n", i, i)
	}
	var out bytes.Buffer
	run([]string{"serve", "--jobs", "2"}, &in, &out, io.Discard)
	stopped := map[string]bool{}
	codes := map[string]int{}
	for _, line := range bytes.Split(out.Bytes(), []byte("\n")) {
		if len(line) == 0 {
			continue
		}
		var m struct {
			ID     json.RawMessage        `json:"id"`
			Result *protocol.CancelResult `json:"result"`
			Error  *protocol.Error        `json:"error"`
		}
		if err := json.Unmarshal(line, &m); err != nil {
			t.Fatalf("bad line %.200q", line)
		}
		id := string(m.ID)
		switch {
		case strings.HasPrefix(id, `"c`):
			if m.Result == nil {
				t.Fatalf("cancel failed: %s", line)
			}
			stopped[strings.Trim(id, `"c`)] = m.Result.Cancelled
		case m.Error != nil:
			codes[id] = m.Error.Code
		default:
			t.Fatalf("a result for an invalid model: %.200s", line)
		}
	}
	if len(stopped) != pairs || len(codes) != pairs {
		t.Fatalf("%d cancel answers and %d request answers, want %d of each", len(stopped), len(codes), pairs)
	}
	var broken, kept, cancelled int
	for id, s := range stopped {
		switch {
		case s && codes[id] != protocol.CodeCancelled:
			broken++
		case s:
			cancelled++
		case codes[id] == protocol.CodeCancelled:
			t.Errorf("request %s: cancel said it was not in flight, yet it ended cancelled", id)
		default:
			kept++
		}
	}
	t.Logf("%d stopped, %d finished first", cancelled, kept)
	if broken > 0 {
		t.Errorf("%d requests whose cancel answered {\"cancelled\":true} ended with their own answer instead of -32000", broken)
	}
}
