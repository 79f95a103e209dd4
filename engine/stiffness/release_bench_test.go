package stiffness

import (
	"context"
	"fmt"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// BenchmarkReleases compares Solve on a plane frame of about 1k and 10k
// beams with and without releases (rz at the second end of every other
// beam), in one run: the condensation adds a small dense elimination per
// released element to assembly, the right-hand side and recovery.
func BenchmarkReleases(b *testing.B) {
	for _, size := range [][2]int{{20, 24}, {50, 100}} {
		base := modelgen.Must(modelgen.Frame2D(size[0], size[1]))
		released := *base
		released.Members = append([]model.Member(nil), base.Members...)
		for e := range released.Members {
			if e%2 == 0 && released.Members[e].Kind == model.Beam {
				released.Members[e].Releases[1] = model.ReleaseBit(model.RZ)
			}
		}
		for _, c := range []struct {
			name string
			m    *model.Model
		}{{"rigid", base}, {"released", &released}} {
			b.Run(fmt.Sprintf("%s/members=%d", c.name, len(c.m.Members)), func(b *testing.B) {
				var st Stats
				b.ResetTimer()
				for range b.N {
					res, err := Solve(context.Background(), c.m, Options{})
					if err != nil {
						b.Fatal(err)
					}
					st = res.Stats
				}
				reportStats(b, st)
			})
		}
	}
}
