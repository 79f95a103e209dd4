package jsonrpc_test

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"slices"
	"testing"

	"gusset/cmd/gusset/adapter"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// TestTranscriptsStreamedAsWhole runs every transcript through the real
// methods twice, once with every response written whole and once with
// every response streamed in parts of a few bytes, and compares the
// final responses byte for byte (progress notifications depend on timing
// and are left out; the lines are compared in sorted order, since
// describe and cancel are answered on the reader, ahead of queued work).
func TestTranscriptsStreamedAsWhole(t *testing.T) {
	inputs, err := filepath.Glob("../../testdata/transcripts/*.in.jsonl")
	if err != nil || len(inputs) == 0 {
		t.Fatalf("no transcripts: %v", err)
	}
	for _, path := range inputs {
		input, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		whole := serveWith(t, 1<<40, input)
		streamed := serveWith(t, 5, input)
		if !bytes.Equal(whole, streamed) {
			wl, sl := bytes.Split(whole, []byte("\n")), bytes.Split(streamed, []byte("\n"))
			for i := range min(len(wl), len(sl)) {
				if !bytes.Equal(wl[i], sl[i]) {
					t.Errorf("%s: streamed responses differ from whole ones: line %d\n%.300s\n%.300s", filepath.Base(path), i, wl[i], sl[i])
					break
				}
			}
		}
		if len(whole) == 0 {
			t.Errorf("%s: no responses", filepath.Base(path))
		}
	}
}

// serveWith serves input on one worker with responses streamed from
// chunk bytes, and returns the output without progress notifications.
func serveWith(t *testing.T, chunk int, input []byte) []byte {
	defer jsonrpc.SetStreamChunk(chunk)()
	s := &jsonrpc.Server{Name: "gusset", Version: "test", Limits: protocol.Limits{Workers: 1}}
	if err := adapter.Register(s); err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	s.Serve(context.Background(), bytes.NewReader(input), &out)
	var kept [][]byte
	for _, line := range bytes.SplitAfter(out.Bytes(), []byte("\n")) {
		if !bytes.Contains(line, []byte(`"method":"progress"`)) {
			kept = append(kept, line)
		}
	}
	slices.SortFunc(kept, bytes.Compare)
	return bytes.Join(kept, nil)
}
