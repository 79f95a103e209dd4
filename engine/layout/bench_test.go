package layout

import (
	"context"
	"fmt"
	"math"
	"testing"
)

// BenchmarkThreePoint times member adding on the point load between two
// pinned supports (span 2, domain 2 × 1, full connectivity) and reports
// the error against Michell's volume (P L/σ)(1/2 + π/4) and the number of
// candidate members. Run with -benchtime=1x.
func BenchmarkThreePoint(b *testing.B) {
	michell := 2 * (0.5 + math.Pi/4)
	for _, nx := range []int{20, 32, 40, 60, 80} {
		if testing.Short() && nx > 40 {
			break // 60×30 and 80×40 take about 6 s and 22 s
		}
		b.Run(fmt.Sprintf("grid=%dx%d", nx, nx/2), func(b *testing.B) {
			p := threePoint(nx)
			var l *Layout
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				var err error
				if l, err = Optimise(context.Background(), p, Options{}, nil); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(100*(l.Volume/michell-1), "%error")
			b.ReportMetric(float64(l.Stats.Candidates), "candidates")
			b.ReportMetric(float64(l.Stats.MembersInProgram), "members_in_LP")
			b.ReportMetric(float64(l.Stats.Iterations), "rounds")
			b.ReportMetric(float64(l.Stats.InteriorPointIterations), "IPM_iterations")
		})
	}
}
