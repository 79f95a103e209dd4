package protocol

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// paramsOf returns a fresh params value for each method whose params
// DecodeStrict may decode.
var paramsOf = map[string]func() any{
	"solve":           func() any { return new(SolveParams) },
	"reciprocate":     func() any { return new(ReciprocateParams) },
	"load-path":       func() any { return new(LoadPathParams) },
	"sweep-parameter": func() any { return new(SweepParams) },
	"optimise-layout": func() any { return new(LayoutParams) },
	"modes":           func() any { return new(ModesParams) },
	"find-form":       func() any { return new(FindFormParams) },
}

// agree decodes data into fresh values of fresh's type with encoding/json
// (a Decoder with DisallowUnknownFields, the reference) and with
// DecodeStrict, and fails t when DecodeStrict accepts what encoding/json
// refuses, decodes to a different value, or leaves a value behind when it
// declines. It reports whether DecodeStrict accepted the input.
func agree(t *testing.T, name string, data []byte, fresh func() any) bool {
	t.Helper()
	want := fresh()
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	stdErr := dec.Decode(want)
	if stdErr == nil && dec.More() {
		stdErr = json.Unmarshal(data, new(any)) // trailing data: refused as one value
	}
	got := fresh()
	err := DecodeStrict(data, got)
	switch {
	case err != nil && !reflect.ValueOf(got).Elem().IsZero():
		t.Errorf("%s: DecodeStrict declined but left %+v", name, got)
	case err == nil && stdErr != nil:
		t.Errorf("%s: DecodeStrict accepted what encoding/json refuses (%v)", name, stdErr)
	case err == nil && !reflect.DeepEqual(got, want):
		t.Errorf("%s: DecodeStrict gives\n%+v\nencoding/json gives\n%+v", name, got, want)
	case stdErr == nil:
		agreeEach(t, name, data, fresh, want, err)
	}
	return err == nil
}

// corpus returns the params of every request in the transcripts and the
// bad-input files, by method.
func corpus(t testing.TB) map[string][][]byte {
	out := map[string][][]byte{}
	files, _ := filepath.Glob("../testdata/transcripts/*.in.jsonl")
	more, _ := filepath.Glob("../testdata/bad-input/*.jsonl")
	for _, f := range append(files, more...) {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		for _, line := range bytes.Split(b, []byte("\n")) {
			var req struct {
				Method string          `json:"method"`
				Params json.RawMessage `json:"params"`
			}
			if json.Unmarshal(line, &req) == nil && paramsOf[req.Method] != nil && len(req.Params) > 0 {
				out[req.Method] = append(out[req.Method], req.Params)
			}
		}
	}
	if len(out) < 5 {
		t.Fatalf("corpus has requests of only %d methods", len(out))
	}
	return out
}

// TestDecodeStrictAgreesWithEncodingJSON holds DecodeStrict to the
// standard library's decoding (the reference) on every request of the
// transcripts and bad-input files, and on edge cases of the JSON grammar
// (RFC 8259) and of encoding/json's rules (case-insensitive keys,
// repeated keys, null, escapes, numbers out of range). It also checks
// that DecodeStrict takes the transcripts' requests itself, not only by
// declining them.
func TestDecodeStrictAgreesWithEncodingJSON(t *testing.T) {
	accepted, total := 0, 0
	for method, list := range corpus(t) {
		for i, params := range list {
			total++
			if agree(t, method+"#"+string(rune('0'+i%10)), params, paramsOf[method]) {
				accepted++
			}
		}
	}
	t.Logf("DecodeStrict took %d of the corpus's %d requests", accepted, total)
	if accepted < total/2 {
		t.Errorf("DecodeStrict took only %d of %d requests", accepted, total)
	}
	base := `{"model":{"dimension":2,"materials":[{"id":"s","elastic_modulus":2e8}],"sections":[{"id":"a","area":0.01}],` +
		`"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[4,"h"]}],"members":[{"id":"m","ends":["A","B"],"material":"s","section":"a"}],` +
		`"supports":[{"node":"A","fix":["x","y"],"springs":{"rz":5}}],"load_cases":[{"id":"c","loads":[{"node":"B","force":[0,-1]}]}]}%s}`
	for _, tail := range []string{
		``, `,"cases":["c"]`, `,"cases":null`, `,"cases":[]`, `,"stations":3`, `,"stations":3.5`, `,"stations":1e400`,
		`,"stations":null`, `,"picture":true`, `,"Picture":true`, `,"picture":true,"picture":false`, `,"unknown":1`,
		`,"cases":["\u0063"]`, `,"cases":["caf\u00e9"]`, `,"cases":["café"]`, "," + `"cases":["` + "\xff" + `"]`,
		`,"cases":[1]`, `,"stations":-0`, `,"stations":01`, `,"stations":+1`, `,"cases":["c",]`, `}`, ` `, `,"stations":3 x`,
	} {
		agree(t, "solve"+tail, []byte(strings.Replace(base, "%s", tail, 1)), paramsOf["solve"])
	}
	for _, model := range []string{
		`{"dimension":2,"nodes":[{"id":"A","at":[1e400,0]}]}`, `{"dimension":2,"nodes":[{"id":"A","at":[null,0]}]}`,
		`{"dimension":2,"nodes":[{"id":"A","at":[-0.0,1E-3,2.5e+2]}]}`, `{"dimension":2,"nodes":[{"id":"A","mass":null}]}`,
		`{"dimension":2,"materials":[{"id":"s","shear_modulus":null}]}`, `{"dimension":2,"materials":[{"id":"s","shear_modulus":"E/2"}]}`,
		`{"dimension":2,"parameters":{"h":1,"h":2}}`, `{"dimension":2,"parameters":{"h":null}}`, `{"dimension":2,"parameters":null}`,
		`{"dimension":2,"nodes":null}`, `{"dimension":2,"nodes":[null]}`, `{"dimension":2.0}`, `{"dimension":"2"}`,
		`{"dimension":2,"nodes":[{"id":"A","at":[1,2],"ID":"B"}]}`, `{"dimension":2,"members":[{"ends":["A","B"],"type":"beam"}]}`,
		`[]`, `"x"`, `{"dimension":2,"nodes":[{"id":"A","at":[1,2]}],}`,
	} {
		agree(t, "model "+model, []byte(`{"model":`+model+`}`), paramsOf["solve"])
	}
}

// FuzzDecodeStrict mutates the transcripts' requests: whatever
// DecodeStrict accepts must decode as encoding/json decodes it. Its seed
// corpus runs with the tests; a campaign runs by hand:
// go test -fuzz FuzzDecodeStrict ./protocol.
func FuzzDecodeStrict(f *testing.F) {
	methods := []string{}
	for method, list := range corpus(f) {
		methods = append(methods, method)
		for _, params := range list {
			f.Add(len(methods)-1, params)
		}
	}
	f.Fuzz(func(t *testing.T, k int, data []byte) {
		if k < 0 || k >= len(methods) {
			return
		}
		agree(t, methods[k], data, paramsOf[methods[k]])
	})
}
