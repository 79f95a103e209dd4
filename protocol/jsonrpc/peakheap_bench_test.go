package jsonrpc_test

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"runtime"
	"runtime/metrics"
	"testing"
	"time"

	"gusset/cmd/gusset/adapter"
	"gusset/engine/model/modelgen"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// BenchmarkSolveFramePeakHeap serves a solve of a 3D building frame with
// 11 stations per member (the default) through the real methods and the
// server's encoder and writer, output discarded, and reports the peak of
// the heap's objects (runtime/metrics, sampled every millisecond) above
// the heap before the request as peak-heap-MiB, beside the response's
// size: a response streamed as it is encoded is never held whole (issue
// 14: a 100k-member frame's results hold one copy of the station arrays).
func BenchmarkSolveFramePeakHeap(b *testing.B) {
	// 100,000 members (20×20×78) answer about 1 GB: too much for the
	// shared two-core machine the benchmarks run on.
	for _, size := range [][3]int{{10, 10, 8}, {20, 20, 8}} { // about 2,700 and 10,000 members
		spec := modelgen.Frame3D(size[0], size[1], size[2])
		params, err := json.Marshal(protocol.SolveParams{Model: *adapter.WireModel(spec)})
		if err != nil {
			b.Fatal(err)
		}
		line := fmt.Appendf(nil, `{"jsonrpc":"2.0","id":1,"method":"solve","params":%s}`+"\n", params)
		params = nil
		b.Run(fmt.Sprintf("members=%d", len(spec.Members)), func(b *testing.B) {
			s := &jsonrpc.Server{Name: "gusset", Version: "bench", Limits: protocol.Limits{Workers: 1}}
			if err := adapter.Register(s); err != nil {
				b.Fatal(err)
			}
			var peak, out float64
			for range b.N {
				runtime.GC()
				p, n := servePeak(b, s, line)
				peak, out = max(peak, p), float64(n)
			}
			b.ReportMetric(peak/(1<<20), "peak-heap-MiB")
			b.ReportMetric(out/1e6, "response-MB")
		})
	}
}

// servePeak serves line and returns the peak heap above the starting one
// and the bytes written.
func servePeak(b *testing.B, s *jsonrpc.Server, line []byte) (peak float64, written int64) {
	sample := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}}
	metrics.Read(sample)
	base := sample[0].Value.Uint64()
	stop, done := make(chan struct{}), make(chan uint64)
	go func() {
		var high uint64
		tick := time.NewTicker(time.Millisecond)
		defer tick.Stop()
		for {
			metrics.Read(sample)
			high = max(high, sample[0].Value.Uint64())
			select {
			case <-stop:
				done <- high
				return
			case <-tick.C:
			}
		}
	}()
	var out countWriter
	if failures, err := s.Serve(context.Background(), bytes.NewReader(line), &out); failures != 0 || err != nil {
		b.Fatalf("failures %d, error %v", failures, err)
	}
	close(stop)
	high := <-done
	return float64(high - min(base, high)), out.n
}

// countWriter counts and discards what is written.
type countWriter struct{ n int64 }

func (c *countWriter) Write(p []byte) (int, error) { c.n += int64(len(p)); return len(p), nil }

var _ io.Writer = (*countWriter)(nil)
