package adapter

import (
	"bytes"
	"context"
	"encoding/json"
	"os"
	"path/filepath"
	"testing"

	"gusset/protocol"
	"gusset/protocol/jsonrpc"
	"gusset/schema"
)

type discardStream struct{}

func (discardStream) Progress(string, int, int, any) {}

// FuzzMethodParams feeds arbitrary params to every method's handler with a
// cancelled context, so each decodes, validates and compiles its params and
// then stops at the engine's first check: errors are fine, panics are not.
// Seeds: the params of every transcript request.
func FuzzMethodParams(f *testing.F) {
	for _, r := range transcriptRequests(f) {
		f.Add(r.Method, []byte(r.Params))
	}
	v, err := schema.NewValidator(paramsDefinitions())
	if err != nil {
		f.Fatal(err)
	}
	a := &Adapter{Limits: protocol.Limits{}.WithDefaults(), validator: v}
	handlers := map[string]jsonrpc.Handler{}
	for _, e := range methods {
		handlers[e.name] = e.bind(a)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	f.Fuzz(func(t *testing.T, method string, body []byte) {
		h := handlers[method]
		if h == nil {
			return
		}
		_, _ = h(ctx, body, discardStream{})
	})
}

// transcriptRequest is a request of the transcripts in testdata.
type transcriptRequest struct {
	Method string          `json:"method"`
	Params json.RawMessage `json:"params"`
}

// transcriptRequests returns every request with params in
// testdata/transcripts, to seed the fuzz targets.
func transcriptRequests(tb testing.TB) []transcriptRequest {
	files, err := filepath.Glob("../../../testdata/transcripts/*.in.jsonl")
	if err != nil || len(files) == 0 {
		tb.Fatalf("no transcripts: %v", err)
	}
	var out []transcriptRequest
	for _, file := range files {
		b, err := os.ReadFile(file)
		if err != nil {
			tb.Fatal(err)
		}
		for _, line := range bytes.Split(b, []byte("\n")) {
			var r transcriptRequest
			if json.Unmarshal(line, &r) == nil && len(r.Params) > 0 {
				out = append(out, r)
			}
		}
	}
	return out
}
