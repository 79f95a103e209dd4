package jsonrpc_test

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"testing"

	"gusset/cmd/gusset/adapter"
	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// TestEncodeSolvedAgreesWithEncodingJSON encodes real solve results (a 2D
// and a 3D frame with results along their members, a truss, and a frame
// without stations) by encode and through the server, streamed in parts
// of 4 KiB, and compares both with encoding/json's bytes.
func TestEncodeSolvedAgreesWithEncodingJSON(t *testing.T) {
	defer jsonrpc.SetStreamChunk(4 << 10)()
	none := 0
	for _, tc := range []struct {
		name     string
		spec     *model.Spec
		stations *int
	}{
		{"frame2d", modelgen.Frame2D(40, 30), nil}, // 2,430 members
		{"frame3d", modelgen.Frame3D(3, 3, 3), nil},
		{"frame3d-no-stations", modelgen.Frame3D(3, 3, 3), &none},
		{"truss2d", modelgen.GridTruss2D(40, 30), nil},
	} {
		params := protocol.SolveParams{Model: *adapter.WireModel(tc.spec), Stations: tc.stations}
		resp := solvedResponseOf(t, params)
		want, err := jsonrpc.EncodeStandard(resp)
		if err != nil {
			t.Fatal(err)
		}
		got, err := jsonrpc.Encode(resp)
		if err != nil || !bytes.Equal(got, want) {
			t.Errorf("%s: encode differs from encoding/json (%d and %d bytes, error %v)", tc.name, len(got), len(want), err)
		}
		var out bytes.Buffer
		if err := replayer(resp.Result)(&out); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(out.Bytes(), append(want, '\n')) {
			t.Errorf("%s: the streamed response differs from encoding/json's (%d and %d bytes)", tc.name, out.Len(), len(want)+1)
		}
	}
}

// replayer returns a function that serves one request of a method
// answering result, with id 1, writing the server's output to w.
func replayer(result any) func(w io.Writer) error {
	s := &jsonrpc.Server{Name: "gusset", Version: "test", Limits: protocol.Limits{Workers: 1}}
	s.Handle(protocol.Method{Name: "replay"}, func(context.Context, json.RawMessage, jsonrpc.Stream) (any, error) {
		return result, nil
	})
	line := []byte(`{"jsonrpc":"2.0","id":1,"method":"replay"}` + "\n")
	return func(w io.Writer) error {
		_, err := s.Serve(context.Background(), bytes.NewReader(line), w)
		return err
	}
}

// solvedResponseOf solves through the real solve method and returns the
// response as the server was about to write it.
func solvedResponseOf(tb testing.TB, params protocol.SolveParams) *protocol.Response {
	raw, err := json.Marshal(params)
	if err != nil {
		tb.Fatal(err)
	}
	s := &jsonrpc.Server{Name: "gusset", Version: "test"}
	if err := adapter.Register(s); err != nil {
		tb.Fatal(err)
	}
	var resp *protocol.Response
	s.OnResponse = func(r *protocol.Response) { resp = r }
	line := fmt.Appendf(nil, `{"jsonrpc":"2.0","id":1,"method":"solve","params":%s}`+"\n", raw)
	var out countWriter
	if failures, err := s.Serve(context.Background(), bytes.NewReader(line), &out); failures != 0 || err != nil || resp == nil {
		tb.Fatalf("failures %d, error %v", failures, err)
	}
	return resp
}
