package jsonrpc_test

import (
	"bytes"
	"cmp"
	"encoding/json"
	"fmt"
	"os"
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
		b.Run(tc.name, func(b *testing.B) { encodeSolved(b, solvedResponse(b, tc.spec())) })
	}
}

// encodeSolved runs BenchmarkEncodeSolved's sub-benchmarks on one
// response, after checking that encode's bytes are encoding/json's.
func encodeSolved(b *testing.B, resp *protocol.Response) {
	want, err := jsonrpc.EncodeStandard(resp)
	if err != nil {
		b.Fatal(err)
	}
	size := float64(len(want))
	run := func(name string, enc func() (int, error)) {
		b.Run(name, func(b *testing.B) {
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
	if got, err := jsonrpc.Encode(resp); err != nil || !bytes.Equal(got, want) {
		b.Fatalf("encode differs from encoding/json (error %v)", err)
	}
	run("encoding-json", func() (int, error) { out, err := jsonrpc.EncodeStandard(resp); return len(out), err })
	run("encode", func() (int, error) { out, err := jsonrpc.Encode(resp); return len(out), err })
	replay := replayer(resp.Result)
	run("serve", func() (int, error) {
		var out countWriter
		err := replay(&out)
		return int(out.n) - 1, err // without the newline
	})
}

// solvedResponse solves spec through the real solve method and returns
// its response, result and all, as the server was about to write it.
func solvedResponse(b *testing.B, spec *model.Spec) *protocol.Response {
	return solvedResponseOf(b, protocol.SolveParams{Model: *adapter.WireModel(spec)})
}

// TestWriteFrameRequest is a tool run by hand, not a test: with
// GUSSET_FRAME_REQUEST=FILE (and GUSSET_FRAME_SIZE=NXxNYxSTOREYS, default
// 20x20x78: 100,254 members) it writes a solve request of that 3D
// building frame with the default 11 stations per member to FILE, for
// measuring the real binary on a response of about 1 GB (issue 14: the
// results of a 100k-member frame hold one copy of the station arrays),
// for example (10x10x294 is a taller, narrower frame of as many members
// whose factor has 87M entries)
//
//	GUSSET_FRAME_REQUEST=/tmp/f.jsonl go test -count=1 -run TestWriteFrameRequest ./protocol/jsonrpc
//	/usr/bin/time -f '%e s %M KiB' env GODEBUG=gctrace=1 gusset serve < /tmp/f.jsonl | wc -c
//
// Without the variable it is skipped: the file is far too large for the
// repository and the run too long for the shared machine's tests.
func TestWriteFrameRequest(t *testing.T) {
	path := os.Getenv("GUSSET_FRAME_REQUEST")
	if path == "" {
		t.Skip("GUSSET_FRAME_REQUEST not set")
	}
	var nx, ny, storeys int
	size := cmp.Or(os.Getenv("GUSSET_FRAME_SIZE"), "20x20x78")
	if _, err := fmt.Sscanf(size, "%dx%dx%d", &nx, &ny, &storeys); err != nil {
		t.Fatalf("GUSSET_FRAME_SIZE %q: %v", size, err)
	}
	spec := modelgen.Frame3D(nx, ny, storeys)
	params, err := json.Marshal(protocol.SolveParams{Model: *adapter.WireModel(spec)})
	if err != nil {
		t.Fatal(err)
	}
	line := fmt.Appendf(nil, `{"jsonrpc":"2.0","id":1,"method":"solve","params":%s}`+"\n", params)
	if err := os.WriteFile(path, line, 0o644); err != nil {
		t.Fatal(err)
	}
	t.Logf("%s: %d members, %d nodes, %.1f MB", path, len(spec.Members), len(spec.Nodes), float64(len(line))/1e6)
}
