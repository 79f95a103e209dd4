package jsonrpc_test

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"testing"

	"gusset/cmd/gusset/adapter"
	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// BenchmarkEncodeSolved encodes the responses of real solves, computed
// once through the real methods: issue 19's 2D braced grid k = 300 (a
// truss, 33 MB out) and 3D building frames with 11 stations per member
// (issue 14's results along members, about 10 kB per member). Sub-
// benchmarks, side by side: encoding/json, encode (the whole line in
// memory) and serve (the response written by the server as it is
// encoded, through its writer, to a counting sink). MB/s is the rate of
// the response's bytes in wall time (issue 19's target: 200 MB/s),
// MB/cpu-s the rate per second of the process's CPU time.
func BenchmarkEncodeSolved(b *testing.B) {
	for _, tc := range []struct {
		name string
		spec func() *model.Spec
	}{
		{"grid2d-300", func() *model.Spec { return modelgen.GridTruss2D(300, 300) }},
		{"frame3d-10k", func() *model.Spec { return modelgen.Frame3D(20, 20, 8) }},
	} {
		resp := solvedResponse(b, tc.spec())
		want, err := jsonrpc.EncodeStandard(resp)
		if err != nil {
			b.Fatal(err)
		}
		size := float64(len(want))
		run := func(name string, enc func() (int, error)) {
			b.Run(tc.name+"/"+name, func(b *testing.B) {
				b.SetBytes(int64(size))
				b.ReportMetric(size/1e6, "MB-out")
				cpu0 := jsonrpc.CPUTime()
				for b.Loop() {
					n, err := enc()
					if err != nil || n != len(want) {
						b.Fatalf("%d bytes (want %d), error %v", n, len(want), err)
					}
				}
				b.ReportMetric(size*float64(b.N)/1e6/(jsonrpc.CPUTime()-cpu0).Seconds(), "MB/cpu-s")
			})
		}
		got, err := jsonrpc.Encode(resp)
		if err != nil || !bytes.Equal(got, want) {
			b.Fatalf("%s: encode differs from encoding/json (error %v)", tc.name, err)
		}
		got = nil
		run("encoding-json", func() (int, error) { out, err := jsonrpc.EncodeStandard(resp); return len(out), err })
		run("encode", func() (int, error) { out, err := jsonrpc.Encode(resp); return len(out), err })
		s := &jsonrpc.Server{Name: "gusset", Version: "bench", Limits: protocol.Limits{Workers: 1}}
		s.Handle(protocol.Method{Name: "replay"}, func(context.Context, json.RawMessage, jsonrpc.Stream) (any, error) {
			return resp.Result, nil
		})
		line := []byte(`{"jsonrpc":"2.0","id":1,"method":"replay"}` + "\n")
		run("serve", func() (int, error) {
			var out countWriter
			_, err := s.Serve(context.Background(), bytes.NewReader(line), &out)
			return int(out.n) - 1, err // without the newline
		})
	}
}

// solvedResponse solves spec through the real solve method and returns
// its response, result and all, as the server was about to write it.
func solvedResponse(b *testing.B, spec *model.Spec) *protocol.Response {
	params, err := json.Marshal(protocol.SolveParams{Model: *adapter.WireModel(spec)})
	if err != nil {
		b.Fatal(err)
	}
	s := &jsonrpc.Server{Name: "gusset", Version: "bench"}
	if err := adapter.Register(s); err != nil {
		b.Fatal(err)
	}
	var resp *protocol.Response
	s.OnResponse = func(r *protocol.Response) { resp = r }
	line := fmt.Appendf(nil, `{"jsonrpc":"2.0","id":1,"method":"solve","params":%s}`+"\n", params)
	var out countWriter
	if failures, err := s.Serve(context.Background(), bytes.NewReader(line), &out); failures != 0 || err != nil || resp == nil {
		b.Fatalf("failures %d, error %v", failures, err)
	}
	return resp
}
