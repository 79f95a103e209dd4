package layout

import (
	"context"
	"fmt"
	"testing"
)

// spaceBridge is a space grid over the box [0, 2] × [0, 1] × [0, 1] with
// pins at the four lower corners and a unit load down at the middle of the
// lower face: the space counterpart of the three-point problem.
func spaceBridge(nx int) Problem {
	pin := [3]bool{true, true, true}
	p := Problem{
		Dim:          3,
		Solid:        Solid{Vertices: Box(vec{0, 0, 0}, vec{2, 1, 1})},
		Divisions:    [3]int{nx, nx / 2, nx / 2},
		Cases:        []Case{{ID: "P", Loads: []Load{{Node: -1, At: vec{1, 0.5, 0}, Force: vec{0, 0, -1}}}}},
		TensionLimit: 1, CompressionLimit: 1,
	}
	for _, c := range []vec{{0, 0, 0}, {2, 0, 0}, {0, 1, 0}, {2, 1, 0}} {
		p.Supports = append(p.Supports, Support{Node: -1, At: c, Fix: pin})
	}
	return p
}

// BenchmarkSpaceBridge times member adding on spaceBridge and reports the
// rounds, the members of the final program, the interior-point iterations,
// the warm-started programs and the optimality gap. The 20 × 10 × 10 grid has 2,541 nodes, 3.23
// million node pairs and 2.67 million candidates after the gcd pruning.
// Run with -benchtime=1x.
func BenchmarkSpaceBridge(b *testing.B) {
	for _, nx := range []int{8, 12, 16, 20} {
		if testing.Short() && nx > 12 {
			break
		}
		b.Run(fmt.Sprintf("grid=%dx%dx%d", nx, nx/2, nx/2), func(b *testing.B) {
			p := spaceBridge(nx)
			var l *Layout
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				var err error
				if l, err = Optimise(context.Background(), p, Options{}, nil); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(l.Volume, "volume")
			b.ReportMetric(float64(l.Stats.Candidates), "candidates")
			b.ReportMetric(float64(l.Stats.MembersInProgram), "members_in_LP")
			b.ReportMetric(float64(l.Stats.Iterations), "rounds")
			b.ReportMetric(float64(l.Stats.InteriorPointIterations), "IPM_iterations")
			b.ReportMetric(l.Stats.OptimalityGap, "gap")
			b.ReportMetric(float64(len(l.Members)), "members")
			b.ReportMetric(float64(l.Stats.WarmStarts), "warm_starts")
		})
	}
}
