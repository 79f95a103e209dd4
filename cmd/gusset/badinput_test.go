package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"gusset/protocol"
)

// badInputWant is a NAME.want.json of testdata/bad-input: the error code
// the request NAME.jsonl must end with (0 when it must succeed), the JSON
// pointer one of its problems must have (absent when the error has no
// location to point at), the serve flags the case needs, and why.
type badInputWant struct {
	Code  int      `json:"code"`
	Path  *string  `json:"path"`
	Flags []string `json:"flags"`
	Note  string   `json:"note"`
}

// TestBadInputCatalogue pipes every request of testdata/bad-input through
// `gusset serve` and checks its error code and pointer (the expected values
// come from the JSON-RPC 2.0 specification, RFC 8259, the published schema
// and the README's error table, as each want file's note says), that
// stdout stays valid NDJSON, that the next request on the same stream is
// still answered, and that the process exits 0. A case whose method the
// binary does not register is skipped. One more case, generated here, is a
// line one byte over the default 64 MiB line limit.
func TestBadInputCatalogue(t *testing.T) {
	bin := buildGusset(t)
	methods := registeredMethods(t, bin)
	files, err := filepath.Glob("../../testdata/bad-input/*.jsonl")
	if err != nil || len(files) == 0 {
		t.Fatalf("no bad-input files: %v", err)
	}
	for _, file := range files {
		name := strings.TrimSuffix(filepath.Base(file), ".jsonl")
		t.Run(name, func(t *testing.T) {
			line, err := os.ReadFile(file)
			if err != nil {
				t.Fatal(err)
			}
			wantBytes, err := os.ReadFile(strings.TrimSuffix(file, ".jsonl") + ".want.json")
			if err != nil {
				t.Fatal(err)
			}
			var want badInputWant
			if err := json.Unmarshal(wantBytes, &want); err != nil {
				t.Fatal(err)
			}
			if want.Note == "" {
				t.Error("the want file does not say why")
			}
			var envelope struct {
				Method string `json:"method"`
			}
			if json.Unmarshal(line, &envelope) == nil && envelope.Method != "" && !methods[envelope.Method] && want.Code != -32601 {
				t.Fatalf("method %s is not registered, yet the case expects code %d", envelope.Method, want.Code)
			}
			checkBadInput(t, bin, want, line)
		})
	}
	t.Run("line-over-default-limit", func(t *testing.T) {
		const limit = 64 << 20
		var line bytes.Buffer
		line.WriteString(`{"jsonrpc":"2.0","id":"big","method":"solve","params":{"model":{"dimension":2,"parameters":{"pad":0},"materials":[],"sections":[],"nodes":[],"members":[]},"cases":["`)
		line.WriteString(strings.Repeat("x", limit+1-line.Len()-len(`"]}}`)))
		line.WriteString(`"]}}`)
		if line.Len() != limit+1 {
			t.Fatalf("generated %d bytes, want %d", line.Len(), limit+1)
		}
		checkBadInput(t, bin, badInputWant{Code: -32700}, line.Bytes())
	})
}

// checkBadInput runs one case through a fresh process.
func checkBadInput(t *testing.T, bin string, want badInputWant, line []byte) {
	t.Helper()
	var finals []wireMessage
	var after *wireMessage
	p := startGusset(t, bin, append([]string{"serve", "--jobs", "2"}, want.Flags...), func(raw []byte, m *wireMessage) {
		if !m.isFinal() {
			return
		}
		if string(m.ID) == `"after"` {
			after = m
			return
		}
		finals = append(finals, *m)
	})
	input := append(bytes.TrimRight(line, "\n"), '\n')
	input = append(input, `{"jsonrpc":"2.0","id":"after","method":"describe"}`...)
	go func() {
		p.send(input)
		p.closeInput()
	}()
	err, exited := p.waitWithin(60 * time.Second)
	if !exited {
		t.Fatal("the process did not exit within 60 s after the end of its input")
	}
	if err != nil {
		t.Errorf("exit: %v; stderr: %s", err, p.stderr.String())
	}
	for _, b := range p.bad {
		t.Errorf("bad output line: %s", b)
	}
	if after == nil || after.Error != nil {
		t.Errorf("the request after the bad one was not answered: %+v", after)
	}
	if len(finals) != 1 {
		t.Fatalf("got %d final responses to the bad request, want 1: %+v", len(finals), finals)
	}
	got := finals[0]
	wantID := expectedID(line)
	if want.Code == protocol.CodeParseError {
		wantID = "null" // an oversize line is skipped unread (README, Errors)
	}
	if string(got.ID) != wantID {
		t.Errorf("response id %s, want %s", got.ID, wantID)
	}
	if want.Code == 0 {
		if got.Error != nil {
			t.Fatalf("want success, got error %d: %s (%+v)", got.Error.Code, got.Error.Message, got.Error.Data)
		}
		return
	}
	if got.Error == nil {
		t.Fatalf("want error %d, got a result: %.300s", want.Code, got.Result)
	}
	e := got.Error
	if e.Code != want.Code {
		t.Errorf("code %d, want %d: %s", e.Code, want.Code, e.Message)
	}
	if e.Message == "" || e.Data == nil || e.Data.Problems == nil {
		t.Fatalf("the error lacks a message or problems: %+v", e)
	}
	if want.Path != nil {
		var paths []string
		found := false
		for _, pr := range e.Data.Problems {
			paths = append(paths, pr.Path)
			found = found || pr.Path == *want.Path
		}
		if !found {
			t.Errorf("problem paths %q, want %q among them (%s)", paths, *want.Path, e.Message)
		}
	}
}

// expectedID is the id a response to line must carry (JSON-RPC 2.0 §5):
// the member named exactly "id" (RFC 8259 §4: names compare by their code
// units), compacted, when the line is one UTF-8 JSON object whose id is a
// string or a number; null otherwise.
func expectedID(line []byte) string {
	// A byte-order mark before the first line is tolerated (README).
	line = bytes.TrimPrefix(bytes.TrimRight(line, "\r\n"), []byte("\xef\xbb\xbf"))
	if !utf8.Valid(line) || !json.Valid(line) {
		return "null"
	}
	dec := json.NewDecoder(bytes.NewReader(line))
	if tok, err := dec.Token(); err != nil || tok != json.Delim('{') {
		return "null"
	}
	var id json.RawMessage
	for dec.More() {
		name, err := dec.Token()
		if err != nil {
			return "null"
		}
		var value json.RawMessage
		if err := dec.Decode(&value); err != nil {
			return "null"
		}
		if name == "id" {
			id = value
		}
	}
	var compact bytes.Buffer
	if id == nil || json.Compact(&compact, id) != nil {
		return "null"
	}
	if c := compact.Bytes()[0]; c == '"' || c == '-' || ('0' <= c && c <= '9') {
		return compact.String()
	}
	return "null"
}
