package envelope

import (
	"context"
	"fmt"
	"runtime"
	"syscall"
	"testing"
	"time"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/engine/stiffness"
)

// BenchmarkEnvelope compares, on a 2D frame of 100 bays and 500 storeys
// (100,500 beams, 50,601 nodes) with 20 combinations of its gravity and
// lateral cases, the 20 solves themselves ("solves": one factorisation,
// 20 combinations recovered and kept) with the same solves enveloped
// afterwards ("after") and folded into the envelope as each case is
// recovered and then dropped ("folded", what solve does with
// envelope.omit_cases), and the 20 additions alone ("add"). Issue 16's target: the envelope at most 1.2× the
// solves. cpu-s/op is the process's CPU time per operation (steadier than
// the wall time on a shared machine) and held-MiB the heap still held
// with the result (and envelope) alive. Run it alone:
//
//	go test -run '^$' -bench Envelope -benchtime 2x ./engine/envelope
func BenchmarkEnvelope(b *testing.B) {
	spec := modelgen.Frame2D(100, 500)
	spec.Combos = nil
	var ids []string
	for k := range 20 {
		id := fmt.Sprintf("c%d", k)
		ids = append(ids, id)
		spec.Combos = append(spec.Combos, model.CombinationSpec{ID: id,
			Factors: map[string]float64{"gravity": 1 + 0.05*float64(k), "lateral": float64(k%5) - 2}})
	}
	m := modelgen.Must(spec)
	b.Logf("%d members, %d nodes, %d combinations", len(m.Members), m.NodeCount(), len(ids))
	opt := stiffness.Options{Cases: ids, Stations: -1, SkipCondition: true}
	run := func(b *testing.B, once func() any) {
		b.Helper()
		cpu := cpuTime()
		var kept any
		for range b.N {
			kept = once()
		}
		b.ReportMetric((cpuTime()-cpu).Seconds()/float64(b.N), "cpu-s/op")
		runtime.GC()
		var ms runtime.MemStats
		runtime.ReadMemStats(&ms)
		b.ReportMetric(float64(ms.HeapAlloc)/(1<<20), "held-MiB")
		runtime.KeepAlive(kept)
	}
	b.Run("variant=solves", func(b *testing.B) {
		run(b, func() any {
			res, err := stiffness.Solve(context.Background(), m, opt)
			if err != nil {
				b.Fatal(err)
			}
			return res
		})
	})
	b.Run("variant=after", func(b *testing.B) {
		run(b, func() any {
			res, err := stiffness.Solve(context.Background(), m, opt)
			if err != nil {
				b.Fatal(err)
			}
			env := New(m, ids)
			for i := range res.Cases {
				env.Add(i, &res.Cases[i])
			}
			return [2]any{res, env}
		})
	})
	b.Run("variant=add", func(b *testing.B) {
		// The envelope's own work alone: 20 cases added, the solve done
		// once beforehand.
		res, err := stiffness.Solve(context.Background(), m, opt)
		if err != nil {
			b.Fatal(err)
		}
		b.ResetTimer()
		run(b, func() any {
			env := New(m, ids)
			for i := range res.Cases {
				env.Add(i, &res.Cases[i])
			}
			return env
		})
	})
	b.Run("variant=folded", func(b *testing.B) {
		run(b, func() any {
			env := New(m, ids)
			folded := opt
			folded.Fold = func(i int, c *stiffness.CaseResult) bool { env.Add(i, c); return false }
			res, err := stiffness.Solve(context.Background(), m, folded)
			if err != nil {
				b.Fatal(err)
			}
			return [2]any{res, env}
		})
	})
}

// cpuTime is the process's user and system CPU time so far: on a shared
// machine a steadier measure than the wall time.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
