package main

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"testing"

	"gusset/cmd/gusset/adapter"
	"gusset/engine/model/modelgen"
	"gusset/protocol"
)

// BenchmarkSolveEndToEnd measures a solve from request line in to response
// line out through the whole command (decode, validate, compile, assemble,
// order, factorise, solve, recover, encode) for generated double-layer 3D
// space trusses. The goal: under 2 s at 100k members.
func BenchmarkSolveEndToEnd(b *testing.B) {
	for _, n := range []int{11, 35, 112} { // about 1k, 10k and 100k members
		spec := modelgen.SpaceTruss3D(n, n)
		params, err := json.Marshal(protocol.SolveParams{Model: *adapter.WireModel(spec)})
		if err != nil {
			b.Fatal(err)
		}
		line := fmt.Sprintf(`{"jsonrpc":"2.0","id":1,"method":"solve","params":%s}`+"\n", params)
		b.Run(fmt.Sprintf("members=%d", len(spec.Members)), func(b *testing.B) {
			b.SetBytes(int64(len(line)))
			for i := 0; i < b.N; i++ {
				var out bytes.Buffer
				if code := run([]string{"run", "--jobs", "1", "-"}, strings.NewReader(line), &out, io.Discard); code != 0 {
					b.Fatalf("exit %d: %.300s", code, out.String())
				}
			}
		})
	}
}

// BenchmarkDescribeRoundTrip measures one describe request answered by a
// warm server: write the line, read the answer, then the next.
func BenchmarkDescribeRoundTrip(b *testing.B) {
	s, err := newServer(protocol.Limits{Workers: 2}, io.Discard)
	if err != nil {
		b.Fatal(err)
	}
	inR, inW := io.Pipe()
	outR, outW := io.Pipe()
	done := make(chan struct{})
	go func() {
		s.Serve(context.Background(), inR, outW)
		outW.Close()
		close(done)
	}()
	reader := bufio.NewReader(outR)
	line := []byte(`{"jsonrpc":"2.0","id":1,"method":"describe"}` + "\n")
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := inW.Write(line); err != nil {
			b.Fatal(err)
		}
		if _, err := reader.ReadBytes('\n'); err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	inW.Close()
	io.Copy(io.Discard, reader)
	<-done
}
