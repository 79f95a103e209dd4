package jsonrpc

import (
	"fmt"
	"strings"
	"testing"

	"gusset/protocol"
)

// bigParams returns params of about n bytes, above bigLine for n ≥ 1 MiB,
// so that their line is parsed off the reader.
func bigParams(n int) string {
	return `{"s":"` + strings.Repeat("x", n) + `"}`
}

// TestLargeLineKeepsOrder checks that a line parsed off the reader keeps
// its place: a cancel for its id sent right behind it finds it in flight,
// a later request with the same id is the duplicate (not the large one),
// and the requests behind it are answered.
func TestLargeLineKeepsOrder(t *testing.T) {
	p := startPipe(testServer(protocol.Limits{Workers: 2}))
	p.send(fmt.Sprintf(`{"jsonrpc":"2.0","id":"big","method":"slow","params":%s}`, bigParams(3<<20)))
	p.send(`{"jsonrpc":"2.0","id":"big","method":"echo"}`)
	p.send(`{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"big"}}`)
	p.send(`{"jsonrpc":"2.0","id":"after","method":"echo","params":{"a":1}}`)
	answers := map[string][]message{}
	for len(answers[`"big"`]) < 2 || len(answers[`"c"`]) < 1 || len(answers[`"after"`]) < 1 {
		m := p.next(t)
		if m.Method == "" {
			answers[string(m.ID)] = append(answers[string(m.ID)], m)
		}
	}
	big := answers[`"big"`]
	// The duplicate is refused at once; the large request is cancelled.
	if big[0].Error == nil || big[0].Error.Code != protocol.CodeInvalidRequest {
		t.Errorf("first answer for id big: %+v, want the duplicate's -32600", big[0])
	}
	if big[1].Error == nil || big[1].Error.Code != protocol.CodeCancelled {
		t.Errorf("second answer for id big: %+v, want the large request cancelled", big[1])
	}
	if c := answers[`"c"`][0]; string(c.Result) != `{"cancelled":true}` {
		t.Errorf("cancel: %+v", c)
	}
	if a := answers[`"after"`][0]; string(a.Result) != `{"a":1}` {
		t.Errorf("request behind: %+v", a)
	}
	p.in.Close()
	if err := <-p.done; err != nil {
		t.Fatal(err)
	}
}

// TestLargeLinesAnsweredInOrder pipelines large and small lines into one
// worker and checks every one is answered, large parse errors included,
// and that the single worker took them in the order read.
func TestLargeLinesAnsweredInOrder(t *testing.T) {
	var in strings.Builder
	var want []string
	for i := range 12 {
		params := `{"i":` + fmt.Sprint(i) + `}`
		if i%3 == 0 {
			params = bigParams(1<<20 + i)
		}
		fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":%d,"method":"echo","params":%s}`+"\n", i, params)
		want = append(want, fmt.Sprint(i))
	}
	in.WriteString(`{"jsonrpc":"2.0","id":"bad","method":"echo","params":{"s":"` + strings.Repeat("y", 1<<20) + `"` + "\n")
	msgs := serveLines(t, testServer(protocol.Limits{Workers: 1}), in.String())
	var got []string
	var parseErrors int
	for _, m := range msgs {
		switch {
		case m.Method != "":
		case m.Error != nil && m.Error.Code == protocol.CodeParseError && string(m.ID) == "null":
			parseErrors++
		case m.Error == nil:
			got = append(got, string(m.ID))
		default:
			t.Errorf("unexpected error %+v", m)
		}
	}
	if strings.Join(got, ",") != strings.Join(want, ",") {
		t.Errorf("answered %v, want %v in that order", got, want)
	}
	if parseErrors != 1 {
		t.Errorf("%d parse errors for the broken large line, want 1", parseErrors)
	}
}
