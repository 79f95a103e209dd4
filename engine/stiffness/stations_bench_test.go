package stiffness

import (
	"context"
	"fmt"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// BenchmarkStations compares Solve with no stations (the exact extremes
// along each member are still found) and with 11 stations per beam on
// frames of about 10k members whose every beam carries a uniform load and
// a point load; the target is at most 1.3× (issue 14).
func BenchmarkStations(b *testing.B) {
	frames := []struct {
		name string
		spec func() *model.Spec
	}{
		{"frame2D", func() *model.Spec { return modelgen.Frame2D(50, 100) }},
		{"frame3D", func() *model.Spec { return modelgen.Frame3D(10, 10, 30) }},
	}
	for _, fr := range frames {
		m := modelgen.Must(fr.spec())
		lc := &m.Cases[0]
		for e, mem := range m.Members {
			if mem.Kind != model.Beam {
				continue
			}
			var q [3]float64
			q[m.Dim-1] = -1
			lc.MemberLoads = append(lc.MemberLoads,
				model.MemberLoad{Member: e, Kind: model.Uniform, Value: q},
				model.MemberLoad{Member: e, Kind: model.Point, Value: q, Distance: 0.3 * m.Length(e)})
		}
		for _, stations := range []int{-1, 11} {
			b.Run(fmt.Sprintf("%s/members=%d/stations=%d", fr.name, len(m.Members), max(stations, 0)), func(b *testing.B) {
				var st Stats
				b.ResetTimer()
				for range b.N {
					res, err := Solve(context.Background(), m, Options{Stations: stations, SkipCondition: true})
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
