package protocol

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// membersAgree splits data with ObjectMembers and with json.Unmarshal into
// a map of raw values (the reference) and fails t when ObjectMembers
// accepts what encoding/json refuses or splits it differently. It
// reports whether ObjectMembers accepted the input.
func membersAgree(t *testing.T, name string, data []byte) bool {
	t.Helper()
	var want map[string]json.RawMessage
	stdErr := json.Unmarshal(data, &want)
	got, ok := ObjectMembers(data)
	switch {
	case ok && stdErr != nil:
		t.Errorf("%s: ObjectMembers accepted what encoding/json refuses (%v)", name, stdErr)
	case ok && !reflect.DeepEqual(got, want):
		t.Errorf("%s: ObjectMembers gives %q, encoding/json %q", name, got, want)
	case !ok && got != nil:
		t.Errorf("%s: ObjectMembers declined but returned %q", name, got)
	}
	return ok
}

// requestLines returns every line of the transcripts and bad-input files.
func requestLines(t testing.TB) [][]byte {
	var out [][]byte
	files, _ := filepath.Glob("../testdata/transcripts/*.in.jsonl")
	more, _ := filepath.Glob("../testdata/bad-input/*.jsonl")
	for _, f := range append(files, more...) {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		for _, line := range bytes.Split(b, []byte("\n")) {
			if len(bytes.TrimSpace(line)) > 0 {
				out = append(out, line)
			}
		}
	}
	if len(out) < 50 {
		t.Fatalf("only %d request lines", len(out))
	}
	return out
}

// TestObjectMembersAgreesWithEncodingJSON holds the envelope's split to
// json.Unmarshal into map[string]json.RawMessage (the reference) on every
// request line of the transcripts and bad-input files and on edge cases
// of the JSON grammar (RFC 8259): repeated keys, escapes, white space,
// trailing data, literals, numbers, depth.
func TestObjectMembersAgreesWithEncodingJSON(t *testing.T) {
	accepted, lines := 0, requestLines(t)
	for i, line := range lines {
		if membersAgree(t, fmt.Sprintf("line %d", i), line) {
			accepted++
		}
	}
	if accepted < len(lines)/2 {
		t.Errorf("ObjectMembers took only %d of %d lines", accepted, len(lines))
	}
	deep := strings.Repeat("[", 600) + strings.Repeat("]", 600)
	for _, s := range []string{
		`{}`, ` { } `, "\t{\"a\":1}\r\n", `{"a":1,"a":2}`, `{"a":{"b":[1,2,{"c":null}]},"d":"e"}`,
		`{"jsonrpc":"2.0","id":1,"method":"solve","params":{"x":[true,false,null,-0.5e+3,0,1E9]}}`,
		`{"a":"\u0041"}`, `{"\u0061":1}`, `{"a":"x\"y"}`, `{"a":"` + "\xff" + `"}`, `{"a":"é"}`, `{"a":"` + "\x01" + `"}`,
		`{"a":1,}`, `{"a":1}x`, `{"a":1}{}`, `{"a":}`, `{"a" 1}`, `{a:1}`, `{"a":01}`, `{"a":-}`, `{"a":1.}`, `{"a":.5}`,
		`{"a":tru}`, `{"a":truex}`, `{"a":[1 2]}`, `{"a":[1,]}`, `{"a":[}`, `{"a":{"b":1,}}`, `{"a":` + deep + `}`,
		`[]`, `[{"a":1}]`, `"s"`, `1`, `null`, ``, `   `, `{`, `{"a":1`, `{"a":"b`,
	} {
		membersAgree(t, s, []byte(s))
	}
}

// FuzzObjectMembers mutates the transcripts' request lines: whatever
// ObjectMembers accepts must split as encoding/json splits it. Its seed
// corpus runs with the tests; a campaign runs by hand:
// go test -run '^$' -fuzz FuzzObjectMembers ./protocol.
func FuzzObjectMembers(f *testing.F) {
	for _, line := range requestLines(f) {
		f.Add(line)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		membersAgree(t, "fuzz", data)
	})
}

// TestDecodeStrictLongArrays checks the paths taken by long arrays (an
// array of objects counted and sized once beyond presizeAfter elements,
// repeated string values shared between elements, lists decoded into
// reused scratch) against encoding/json, with strings holding brackets,
// commas and escaped quotes that the count must step over, and with
// malformed input the count does not check.
func TestDecodeStrictLongArrays(t *testing.T) {
	for _, n := range []int{presizeAfter - 1, presizeAfter, presizeAfter + 1, 3 * presizeAfter, 1000} {
		var nodes, members []string
		for i := range n {
			nodes = append(nodes, fmt.Sprintf(`{"id":"n%d","at":[%d,"h*%d"]}`, i, i, i%7))
			material := []string{"steel", "steel", "timber"}[i%3]
			members = append(members, fmt.Sprintf(`{"id":"m%d","ends":["n%d","n%d"],"material":%q,"section":"s,[]{}","type":"bar"}`, i, i, (i+1)%n, material))
		}
		model := `{"model":{"dimension":2,"nodes":[` + strings.Join(nodes, ",") + `],"members":[` + strings.Join(members, " , ") + `]}}`
		if !agree(t, fmt.Sprintf("n=%d", n), []byte(model), paramsOf["solve"]) {
			t.Errorf("n=%d: DecodeStrict declined a plain model", n)
		}
		// An escaped quote in a later element: declined, and decoded by
		// encoding/json alike.
		escaped := strings.Replace(model, `"section":"s,[]{}"`, `"section":"s\"]"`, 1)
		agree(t, fmt.Sprintf("n=%d escaped", n), []byte(escaped), paramsOf["solve"])
		for _, broken := range []string{`],"members"`, `}]}}`} {
			cut := strings.Replace(model, broken, "", 1)
			agree(t, fmt.Sprintf("n=%d without %s", n, broken), []byte(cut), paramsOf["solve"])
		}
	}
}
