package formfind

import (
	"context"
	"fmt"
	"syscall"
	"testing"
	"time"

	"gusset/engine/model"
)

// netModel is a k × k 3D net (2k(k − 1) members) with its border fixed and
// a unit load at every inner node.
func netModel(b *testing.B, k int) *model.Model {
	m, err := model.Compile(grid(k, 1).s)
	if err != nil {
		b.Fatal(err)
	}
	return m
}

// BenchmarkFind finds the form of nets up to 100k members by the linear
// method: one analysis, one factorisation, three solves.
func BenchmarkFind(b *testing.B) {
	for _, k := range []int{72, 225} {
		m := netModel(b, k)
		b.Run(fmt.Sprintf("members=%d", len(m.Members)), func(b *testing.B) {
			for b.Loop() {
				if _, err := Find(context.Background(), m, Problem{ForceDensity: one(2)}, Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkTargets runs 50 iterations of target lengths on a net of about
// 10k members: every member asked for 1.05 times its plan length (the
// fixed-point update, targets beyond newtonLimit), and 40 members along
// one line (Newton's method); the tolerance is set so that all 50 run.
func BenchmarkTargets(b *testing.B) {
	m := netModel(b, 72)
	for _, tc := range []struct {
		name  string
		every int
	}{{"fixed-point", 1}, {"newton", 0}} {
		var targets []Target
		for e, mem := range m.Members {
			line := m.Node(mem.Ends[0])[0] == 36 && m.Node(mem.Ends[1])[0] == 36 && len(targets) < 40
			if tc.every == 1 || line {
				l := 1.05 * m.Length(e)
				targets = append(targets, Target{Member: mem.ID, Length: &l})
			}
		}
		b.Run(fmt.Sprintf("members=%d/targets=%d/%s", len(m.Members), len(targets), tc.name), func(b *testing.B) {
			for b.Loop() {
				r, err := Find(context.Background(), m, Problem{ForceDensity: one(2), Targets: targets}, Options{MaxIterations: 50, Tolerance: 1e-300})
				if err != nil {
					b.Fatal(err)
				}
				if r.Iterations != 50 {
					b.Fatalf("%d iterations", r.Iterations)
				}
			}
		})
	}
}

// BenchmarkFindStep sets a later iteration of target lengths beside the
// first (issue 19: repeat solves stay cheap) on nets of about 10k and 45k
// members, every member asked for 1.05 times its plan length (the
// fixed-point update refactorises each iteration), in process CPU time
// (user + system), which a shared machine disturbs less than wall time:
// each iteration runs Find with one iteration (the order, the symbolic
// analysis, a factorisation and the solves) and then with five, and a
// later iteration is the difference over four.
func BenchmarkFindStep(b *testing.B) {
	for _, k := range []int{72, 150} {
		m := netModel(b, k)
		var targets []Target
		for e, mem := range m.Members {
			l := 1.05 * m.Length(e)
			targets = append(targets, Target{Member: mem.ID, Length: &l})
		}
		run := func(iterations int) time.Duration {
			start := cpuTime()
			if _, err := Find(context.Background(), m, Problem{ForceDensity: one(2), Targets: targets},
				Options{Workers: 1, MaxIterations: iterations, Tolerance: 1e-300}); err != nil {
				b.Fatal(err)
			}
			return cpuTime() - start
		}
		b.Run(fmt.Sprintf("members=%d", len(m.Members)), func(b *testing.B) {
			var first, five time.Duration
			for range b.N {
				first += run(1)
				five += run(5)
			}
			step := (five - first) / 4
			b.ReportMetric(first.Seconds()*1e3/float64(b.N), "first-cpu-ms")
			b.ReportMetric(step.Seconds()*1e3/float64(b.N), "step-cpu-ms")
			b.ReportMetric(step.Seconds()/first.Seconds(), "cpu-step/first")
		})
	}
}

// cpuTime returns the CPU time the process has used, user and system.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
