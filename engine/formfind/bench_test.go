package formfind

import (
	"context"
	"fmt"
	"testing"

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
