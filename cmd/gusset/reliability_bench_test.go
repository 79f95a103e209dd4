package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"testing"

	"gusset/engine/model/modelgen"
	"gusset/protocol"
)

// countingWriter counts output lines without keeping them.
type countingWriter struct{ lines int }

func (w *countingWriter) Write(p []byte) (int, error) {
	w.lines += bytes.Count(p, []byte("\n"))
	return len(p), nil
}

// BenchmarkThroughputSmallSolve pipes requests small solve requests (a
// four-panel Pratt truss: 8 nodes, 13 bars) through one in-process server
// with two workers, from the first byte read to the last answer flushed,
// and reports requests per second. The goal of issue 9 is at least 5,000
// on a 2-core machine.
func BenchmarkThroughputSmallSolve(b *testing.B) {
	params, err := json.Marshal(protocol.SolveParams{Model: wireModel(modelgen.Pratt(4, 16, 2, 10))})
	if err != nil {
		b.Fatal(err)
	}
	for _, requests := range []int{1000, 10000} {
		if testing.Short() && requests > 1000 {
			continue
		}
		var input bytes.Buffer
		for i := range requests {
			fmt.Fprintf(&input, `{"jsonrpc":"2.0","id":%d,"method":"solve","params":%s}`+"\n", i, params)
		}
		b.Run(fmt.Sprintf("requests=%d", requests), func(b *testing.B) {
			b.SetBytes(int64(input.Len()))
			b.ReportAllocs()
			b.ResetTimer()
			for range b.N {
				out := &countingWriter{}
				if code := run([]string{"serve", "--jobs", "2"}, bytes.NewReader(input.Bytes()), out, io.Discard); code != 0 {
					b.Fatalf("exit %d", code)
				}
				if out.lines < requests {
					b.Fatalf("%d output lines for %d requests", out.lines, requests)
				}
			}
			b.ReportMetric(float64(requests)*float64(b.N)/b.Elapsed().Seconds(), "requests/s")
		})
	}
}
