package jsonrpc

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"gusset/protocol"
)

// fuzzLineLimit is small so that the fuzzer reaches the oversize-line path
// with short inputs.
const fuzzLineLimit = 200

// FuzzServe feeds arbitrary bytes to a Server as input lines and checks the
// envelope's promises (JSON-RPC 2.0 specification, sections 4, 5 and 5.1;
// README "Protocol reference"): every output line is one JSON object of
// version "2.0"; every final response has exactly one of result and error
// and an id that is null, a string or a number; each request line with a
// string or number id gets exactly one final response echoing that id byte
// for byte (compacted); lines that are not JSON objects, or whose id has
// another type, get a response with a null id; and no notification follows
// its request's final response. Member names are matched exactly (RFC 8259
// §4), so "ID" is not the id.
func FuzzServe(f *testing.F) {
	seeds := []string{
		`{"jsonrpc":"2.0","id":1,"method":"echo","params":{"a":1}}`,
		`{"jsonrpc":"2.0","id":"x","method":"describe"}` + "\n" + `{"jsonrpc":"2.0","id":"y","method":"cancel","params":{"request":"x"}}`,
		`{"jsonrpc":"2.0","method":"echo"}`,
		`{"jsonrpc":"2.0","id":1.50,"method":"echo"}` + "\r\n" + `not json` + "\n\n" + `[1,2]`,
		`{"jsonrpc":"2.0","id":{"a":1},"method":"echo"}`,
		`{"jsonrpc":"2.0","id":null,"method":"echo"}`,
		`{"jsonrpc":"1.0","id":2,"method":"echo"}`,
		`{"jsonrpc":"2.0","id":3,"method":"nope"}`,
		`{"jsonrpc":"2.0","id":4,"method":"echo","params":[1]}`,
		`{"jsonrpc":"2.0","id":"\u00fc","method":"echo"} {}`,
		`{"jsonrpc":"2.0","id":5,"ID":{"a":6},"method":"echo"}`,
		`{"jsonrpc":"2.0","id":"a&b<c>","method":"echo","params":{"s":"\u0026"}}`,
		"{\"jsonrpc\":\"2.0\",\"id\":\"\xff\",\"method\":\"echo\"}",
		`{"jsonrpc":"2.0","id":7,"method":"echo","params":{"s":"` + strings.Repeat("x", fuzzLineLimit) + `"}}`,
		`{"jsonrpc":"2.0","id":8,"method":"boom"}` + "\n" + `{"jsonrpc":"2.0","id":8,"method":"echo"}`,
		`{"jsonrpc":"2.0","id":9,"method":"wait"}` + "\n" + `{"jsonrpc":"2.0","id":10,"method":"cancel","params":{"request":9}}` + "\n" + `{"jsonrpc":"2.0","id":9,"method":"fail"}`,
		strings.Repeat("[", 300),
		"\xef\xbb\xbf" + `{"jsonrpc":"2.0","id":"bom","method":"echo"}` + "\n" + "\xef\xbb\xbf" + `{"jsonrpc":"2.0","id":"bom2","method":"echo"}`,
		`{"jsonrpc":"2.0","id":"\ud800","method":"echo"}` + "\n" + `{"jsonrpc":"2.0","id":"\ud83d\ude00","method":"echo"}`,
		`{"jsonrpc":"2.0","method":"nope"}` + "\n" + `{"jsonrpc":"2.0","method":"echo","params":[1]}`,
		`{"jsonrpc":"2.0","id":null,"method":"wait"}` + "\n" + `{"jsonrpc":"2.0","id":null,"method":"describe"}`,
		`[{"jsonrpc":"2.0","id":"b1","method":"echo"},{"jsonrpc":"2.0","method":"echo"},1,{"jsonrpc":"2.0","id":"b1","method":"wait"},[]]` + "\n" + `[]` + "\n" + `[{"jsonrpc":"2.0","method":"describe"}]`,
		`[{"jsonrpc":"2.0","id":"w","method":"wait"}]` + "\n" + `[{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"w"}},{"jsonrpc":"2.0","id":"d","method":"describe"}]`,
	}
	for _, s := range seeds {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, input []byte) {
		s := fuzzServer(protocol.Limits{Workers: 2, MaxLineBytes: fuzzLineLimit})
		var out bytes.Buffer
		if _, err := s.Serve(context.Background(), bytes.NewReader(input), &out); err != nil {
			t.Fatalf("Serve: %v", err)
		}
		wantIDs, minNull, maxNull := expectedResponses(input, fuzzLineLimit)
		gotIDs := map[string]int{}
		nulls := 0
		sc := bufio.NewScanner(&out)
		sc.Buffer(nil, 1<<24)
		for sc.Scan() {
			line := sc.Bytes()
			if !utf8.Valid(line) {
				t.Fatalf("output line is not UTF-8: %q", line)
			}
			if bytes.HasPrefix(line, []byte("[")) {
				// A batch's responses (JSON-RPC 2.0 §6): a non-empty array
				// of final responses, each checked as one on its own line.
				var members []json.RawMessage
				if err := json.Unmarshal(line, &members); err != nil || len(members) == 0 {
					t.Fatalf("output line is not a non-empty array of responses: %q", line)
				}
				for _, r := range members {
					var m map[string]json.RawMessage
					if json.Unmarshal(r, &m) != nil || m["method"] != nil {
						t.Fatalf("a batch's member is not a final response: %q", line)
					}
					checkFinal(t, r, m, gotIDs, &nulls)
				}
				continue
			}
			var m map[string]json.RawMessage
			if err := json.Unmarshal(line, &m); err != nil {
				t.Fatalf("output line is not a JSON object: %q", line)
			}
			if string(m["jsonrpc"]) != `"2.0"` {
				t.Fatalf("output line without jsonrpc 2.0: %q", line)
			}
			if _, isNote := m["method"]; isNote {
				var p struct {
					Params protocol.Progress `json:"params"`
				}
				if err := json.Unmarshal(line, &p); err != nil {
					t.Fatalf("bad notification %q: %v", line, err)
				}
				// An id may be reused once its request is answered, so a
				// notification is late only when every request with its id
				// has been answered.
				if req := string(p.Params.Request); gotIDs[req] > 0 && gotIDs[req] >= wantIDs[req] {
					t.Fatalf("notification after the final response: %q", line)
				}
				continue
			}
			checkFinal(t, line, m, gotIDs, &nulls)
		}
		for id, n := range wantIDs {
			if gotIDs[id] != n {
				t.Errorf("id %s: %d final responses, want %d", id, gotIDs[id], n)
			}
		}
		for id, n := range gotIDs {
			if wantIDs[id] == 0 {
				t.Errorf("id %s: %d responses to a request never sent", id, n)
			}
		}
		if nulls < minNull || nulls > maxNull {
			t.Errorf("%d responses with a null id, want between %d and %d", nulls, minNull, maxNull)
		}
	})
}

// checkFinal checks one final response (decoded as m from line): version
// 2.0, exactly one of result and error, and an id that is null (counted in
// nulls), a string or a number (counted in gotIDs).
func checkFinal(t *testing.T, line []byte, m map[string]json.RawMessage, gotIDs map[string]int, nulls *int) {
	t.Helper()
	if string(m["jsonrpc"]) != `"2.0"` {
		t.Fatalf("response without jsonrpc 2.0: %q", line)
	}
	_, hasResult := m["result"]
	_, hasError := m["error"]
	if hasResult == hasError {
		t.Fatalf("a response needs exactly one of result and error: %q", line)
	}
	id, ok := m["id"]
	if !ok {
		t.Fatalf("response without id: %q", line)
	}
	switch {
	case string(id) == "null":
		*nulls++
	case id[0] == '"' || id[0] == '-' || (id[0] >= '0' && id[0] <= '9'):
		gotIDs[string(id)]++
	default:
		t.Fatalf("response id is neither null, a string nor a number: %q", line)
	}
}

// fuzzServer has methods that finish on their own, whatever the input:
// echo returns its params after a partial result, wait reports progress
// for up to 2 ms or until cancelled, boom panics and fail returns an
// application error.
func fuzzServer(limits protocol.Limits) *Server {
	s := &Server{Name: "fuzz", Version: "0", Limits: limits}
	s.Handle(protocol.Method{Name: "echo"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		st.Progress("echoing", 0, 1, map[string]int{"bytes": len(p)})
		return p, nil
	})
	s.Handle(protocol.Method{Name: "wait"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		deadline := time.Now().Add(2 * time.Millisecond)
		for i := 0; time.Now().Before(deadline); i++ {
			if err := ctx.Err(); err != nil {
				return nil, err
			}
			st.Progress("waiting", i, 0, i)
		}
		return "waited", nil
	})
	s.Handle(protocol.Method{Name: "boom"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		panic("boom")
	})
	s.Handle(protocol.Method{Name: "fail"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
		return nil, protocol.NewError(1000, "invalid model", "fails on purpose")
	})
	return s
}

// expectedResponses is an oracle written from the JSON-RPC 2.0
// specification, independent of the server's parser: for each input line
// it counts the compacted ids that must be answered once each, and bounds
// the number of null-id responses. A line whose length is near the limit
// (where trailing carriage returns make the count ambiguous) or that is
// not an object with a usable id may or may not get one.
func expectedResponses(input []byte, limit int) (ids map[string]int, minNull, maxNull int) {
	ids = map[string]int{}
	lines := bytes.Split(input, []byte("\n"))
	if len(lines) > 0 && len(lines[len(lines)-1]) == 0 {
		lines = lines[:len(lines)-1]
	}
	for i, raw := range lines {
		if i == 0 {
			// A byte-order mark before the first line is ignored (README).
			raw = bytes.TrimPrefix(raw, []byte("\xef\xbb\xbf"))
		}
		content := bytes.TrimRight(raw, "\r")
		if len(raw) > limit+1 || len(content) > limit {
			// Oversize, or close enough that framing details decide: at
			// most one null-id response, at least one when clearly over.
			maxNull++
			if len(content) > limit {
				minNull++
			}
			continue
		}
		if len(bytes.TrimSpace(content)) == 0 {
			continue
		}
		requests := [][]byte{content}
		var batch []json.RawMessage
		if t := bytes.TrimSpace(content); t[0] == '[' && utf8.Valid(t) && json.Unmarshal(t, &batch) == nil {
			// A batch (JSON-RPC 2.0 §6): each member is answered as a line
			// of its own would be; an empty one gets one null-id error.
			requests = requests[:0]
			for _, r := range batch {
				requests = append(requests, r)
			}
			if len(batch) == 0 {
				minNull++
				maxNull++
			}
		}
		for _, r := range requests {
			id, kind := requestID(r)
			switch kind {
			case idValid:
				ids[id]++
			case idBad:
				minNull++
				maxNull++
			case idAbsent:
				maxNull++ // a notification, or an invalid one answered with null
			}
		}
	}
	return ids, minNull, maxNull
}

type idKind int

const (
	idBad    idKind = iota // not one JSON object, or an id that is not a string or a number
	idAbsent               // an object without the member "id"
	idValid                // an object whose "id" is a string or a number
)

// requestID finds the member named exactly "id" of a single JSON object
// (the last one when repeated, as a JSON object's later member wins) and
// returns its compacted text.
func requestID(line []byte) (string, idKind) {
	// RFC 8259 §8.1: JSON exchanged between systems is UTF-8.
	if !utf8.Valid(line) || !json.Valid(line) {
		return "", idBad
	}
	dec := json.NewDecoder(bytes.NewReader(line))
	if tok, err := dec.Token(); err != nil || tok != json.Delim('{') {
		return "", idBad
	}
	var id json.RawMessage
	for dec.More() {
		tok, err := dec.Token()
		if err != nil {
			return "", idBad
		}
		var value json.RawMessage
		if err := dec.Decode(&value); err != nil {
			return "", idBad
		}
		if tok == "id" {
			id = value
		}
	}
	if id == nil {
		return "", idAbsent
	}
	var compact bytes.Buffer
	if err := json.Compact(&compact, id); err != nil {
		return "", idBad
	}
	c := compact.Bytes()
	if c[0] == '"' && hasLoneSurrogate(c) {
		return "", idBad // not Unicode text (RFC 8259 §8.2): answered as a parse error
	}
	if c[0] == '"' || c[0] == '-' || (c[0] >= '0' && c[0] <= '9') {
		return string(c), idValid
	}
	return "", idBad
}

// hasLoneSurrogate reports a \u escape of a UTF-16 surrogate (D800–DFFF)
// that is not a high one (D800–DBFF) followed at once by a low one
// (DC00–DFFF), after removing escaped backslashes (RFC 8259 §7).
func hasLoneSurrogate(s []byte) bool {
	t := strings.ReplaceAll(string(s), `\\`, "")
	escapes := regexp.MustCompile(`\\u[0-9a-fA-F]{4}`).FindAllStringIndex(t, -1)
	value := func(k int) int64 {
		v, _ := strconv.ParseInt(t[escapes[k][0]+2:escapes[k][1]], 16, 32)
		return v
	}
	for k := 0; k < len(escapes); k++ {
		switch v := value(k); {
		case v >= 0xD800 && v <= 0xDBFF:
			if k+1 < len(escapes) && escapes[k+1][0] == escapes[k][1] && value(k+1) >= 0xDC00 && value(k+1) <= 0xDFFF {
				k++
				continue
			}
			return true
		case v >= 0xDC00 && v <= 0xDFFF:
			return true
		}
	}
	return false
}
