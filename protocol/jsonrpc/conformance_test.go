package jsonrpc

import (
	"strings"
	"testing"

	"gusset/protocol"
)

// TestLoneSurrogate checks the detection of lone UTF-16 surrogate escapes
// in a JSON string's text (RFC 8259 §7: a character outside the BMP is a
// high-low pair of escapes; §8.2: a lone one is not Unicode).
func TestLoneSurrogate(t *testing.T) {
	for _, c := range []struct {
		text string
		lone bool
	}{
		{`"abc"`, false},
		{`"\ud83d\ude00"`, false}, // U+1F600, a pair
		{`"\uD83D\uDE00x"`, false},
		{`"\ud800"`, true},
		{`"a\udc00b"`, true},
		{`"\ud800\u0041"`, true},
		{`"\\ud800"`, false}, // an escaped backslash, then text
		{`"\n\u00e9"`, false},
	} {
		if got := loneSurrogate([]byte(c.text)); got != c.lone {
			t.Errorf("%s: %v, want %v", c.text, got, c.lone)
		}
	}
}

// TestExcerpt: a word longer than maxWord keeps its first 40 and last 16
// bytes around the count of what was left out (here 100 a and 10 é, two
// bytes each: 40 a kept, then 60 a and 2 é left out, then 8 é); short
// words are kept.
func TestExcerpt(t *testing.T) {
	long := strings.Repeat("a", 100) + strings.Repeat("é", 10)
	got := excerpt("name " + long + " at byte 7")
	want := "name " + strings.Repeat("a", 40) + "…[62 characters]…" + strings.Repeat("é", 8) + " at byte 7"
	if got != want {
		t.Errorf("got %q,\nwant %q", got, want)
	}
	if s := "short words stay"; excerpt(s) != s {
		t.Error("a short message changed")
	}
}

// TestIDNullBOMAndOwnMethodDuplicates: an id may be null (JSON-RPC 2.0 §4)
// and is answered with id null; a byte-order mark before the first line is
// ignored; describe and cancel with the id of a request in flight get
// -32600 at /id; notifications are never answered (§4.1).
func TestIDNullBOMAndOwnMethodDuplicates(t *testing.T) {
	p := startPipe(testServer(protocol.Limits{Workers: 2}))
	p.send("\xef\xbb\xbf" + `{"jsonrpc":"2.0","id":null,"method":"describe"}`)
	if m := p.next(t); string(m.ID) != "null" || m.Error != nil || m.Result == nil {
		t.Fatalf("id null after a BOM: %+v", m)
	}
	p.send(`{"jsonrpc":"2.0","id":5,"method":"slow"}`)
	for m := p.next(t); m.Method != "progress"; m = p.next(t) {
	}
	p.send(`{"jsonrpc":"2.0","method":"echo"}`)
	p.send(`{"jsonrpc":"2.0","method":"frobnicate"}`)
	p.send(`{"jsonrpc":"2.0","id":5,"method":"describe"}`)
	p.send(`{"jsonrpc":"2.0","id":5,"method":"cancel","params":{"request":5}}`)
	p.send(`{"jsonrpc":"2.0","id":6,"method":"cancel","params":{"request":5}}`)
	var refused, cancelled int
	for refused+cancelled < 3 {
		m := p.next(t)
		switch {
		case m.Method != "":
		case string(m.ID) == "5" && m.Error != nil && m.Error.Code == protocol.CodeInvalidRequest && m.Error.Data.Problems[0].Path == "/id":
			refused++
		case string(m.ID) == "5" && m.Error != nil && m.Error.Code == protocol.CodeCancelled:
			cancelled++
		case string(m.ID) == "6":
		default:
			t.Fatalf("unexpected answer %+v", m)
		}
	}
	if refused != 2 || cancelled != 1 {
		t.Errorf("%d refusals and %d cancelled, want 2 and 1", refused, cancelled)
	}
	p.in.Close()
	<-p.done
}
