package adapter

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"runtime"
	"runtime/debug"
	"sync"
	"syscall"
	"testing"
	"time"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
	"gusset/schema"
)

// requestLine returns a solve request line (with its newline) for the
// model, as a host sends it.
func requestLine(tb testing.TB, spec *model.Spec) []byte {
	params, err := json.Marshal(protocol.SolveParams{Model: *WireModel(spec)})
	if err != nil {
		tb.Fatal(err)
	}
	return fmt.Appendf(nil, `{"jsonrpc":"2.0","id":1,"method":"solve","params":%s}`+"\n", params)
}

// pipeReader hands out at most 64 KiB a read, as a pipe from the host does.
type pipeReader struct{ r *bytes.Reader }

func (p pipeReader) Read(b []byte) (int, error) { return p.r.Read(b[:min(len(b), 64<<10)]) }

// cpuTime is the process's user + system time so far.
func cpuTime() time.Duration {
	var u syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &u) != nil {
		return 0
	}
	return time.Duration(u.Utime.Nano() + u.Stime.Nano())
}

// BenchmarkRequestIn measures the request-in path of the server, the
// issue 19 item 2 target (≥ 150 MB/s): reading the line, the JSON-RPC
// envelope, the strict decode, the schema sample, the conversion to the
// engine's spec and the compiler, up to the solve's first progress
// notification ("assembling"), where the request is cancelled
// (to-assembling, which includes the solve's own work before it
// assembles), or to the end of a method that stops after the compile
// (prepare). MB/s is of the request line; wall-ms is the wall time from
// the start of Serve, cpu-ms the process's CPU time (user + system) over
// the same span, so that the figure is usable on a busy machine. The sizes: a 3D space truss of 100,352 members and the 2D
// braced grid of 300×300 squares (270,600 members; the reference
// benchmark's grid2d-300, 27.7 MB).
func BenchmarkRequestIn(b *testing.B) {
	sizes := []struct {
		name string
		spec func() *model.Spec
	}{
		{"members=100352", func() *model.Spec { return modelgen.SpaceTruss3D(112, 112) }},
		{"grid2d-300", func() *model.Spec { return modelgen.GridTruss2D(300, 300) }},
	}
	if os.Getenv("GOGC") == "" {
		// The collector as the server sets it (cmd/gusset/run.go,
		// tuneMemory).
		defer debug.SetGCPercent(debug.SetGCPercent(400))
	}
	for _, size := range sizes {
		line := requestLine(b, size.spec())
		for _, stage := range []struct {
			name  string
			serve func(*testing.B, []byte) (wall, cpu time.Duration)
		}{{"prepare", untilPrepared}, {"to-assembling", untilAssembling}} {
			in := line
			if stage.name == "prepare" {
				in = bytes.Replace(line, []byte(`"method":"solve"`), []byte(`"method":"prepare"`), 1)
			}
			b.Run(size.name+"/"+stage.name, func(b *testing.B) {
				b.SetBytes(int64(len(in)))
				var wall, cpu time.Duration
				for range b.N {
					w, c := stage.serve(b, in)
					wall, cpu = wall+w, cpu+c
				}
				b.ReportMetric(float64(wall.Microseconds())/1e3/float64(b.N), "wall-ms")
				b.ReportMetric(float64(cpu.Microseconds())/1e3/float64(b.N), "cpu-ms")
				b.ReportMetric(float64(len(in))/cpu.Seconds()*float64(b.N)/1e6, "cpu-MB/s")
			})
		}
	}
}

// untilPrepared serves line, a request for the method "prepare", which does what
// every model method does before engine work (the solve table entry's
// decode, sample validation and compile) and answers at once; it returns
// the wall and CPU time of Serve, to the end of input.
func untilPrepared(b *testing.B, line []byte) (wall, cpu time.Duration) {
	s := &jsonrpc.Server{Name: "gusset", Version: "bench", Limits: protocol.Limits{Workers: 1}}
	if err := Register(s); err != nil {
		b.Fatal(err)
	}
	v, err := schema.NewValidator(paramsDefinitions())
	if err != nil {
		b.Fatal(err)
	}
	a := &Adapter{Limits: s.Limits, validator: v}
	prepared := method(protocol.MethodSolve, "", func(a *Adapter, ctx context.Context, r *request[protocol.SolveParams]) (*protocol.CancelResult, error) {
		if r.Model == nil {
			return nil, errors.New("no model")
		}
		return &protocol.CancelResult{}, nil
	})
	s.Handle(protocol.Method{Name: "prepare"}, prepared.bind(a))
	runtime.GC() // each request starts with the same heap
	startWall, startCPU := time.Now(), cpuTime()
	failures, err := s.Serve(context.Background(), pipeReader{bytes.NewReader(line)}, io.Discard)
	wall, cpu = time.Since(startWall), cpuTime()-startCPU
	if err != nil || failures != 0 {
		b.Fatalf("%d failures, %v", failures, err)
	}
	return wall, cpu
}

// untilAssembling serves line until the solve reports "assembling" and
// returns the wall and CPU time from the start of Serve to then.
func untilAssembling(b *testing.B, line []byte) (wall, cpu time.Duration) {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	s := &jsonrpc.Server{Name: "gusset", Version: "bench", Limits: protocol.Limits{Workers: 1}}
	if err := Register(s); err != nil {
		b.Fatal(err)
	}
	var once sync.Once
	runtime.GC() // each request starts with the same heap
	startWall, startCPU := time.Now(), cpuTime()
	s.OnProgress = func(p *protocol.Progress) {
		if p.Stage == "assembling" {
			once.Do(func() {
				wall, cpu = time.Since(startWall), cpuTime()-startCPU
				cancel()
			})
		}
	}
	if _, err := s.Serve(ctx, pipeReader{bytes.NewReader(line)}, io.Discard); err != nil {
		b.Fatal(err)
	}
	if wall == 0 {
		b.Fatal("the request never reached assembling")
	}
	return wall, cpu
}
