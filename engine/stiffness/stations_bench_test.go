package stiffness

import (
	"context"
	"fmt"
	"syscall"
	"testing"
	"time"

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
		loadEveryBeam(m)
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

// BenchmarkStationsRatio alternates a solve without stations and one with
// 11 on the same 10k-member frames and reports the ratio of their process
// CPU times (user + system, getrusage): on a machine shared with other
// work the wall-clock times of two separate runs are not comparable, the
// CPU time the process itself spends is.
func BenchmarkStationsRatio(b *testing.B) {
	for _, fr := range []struct {
		name string
		spec func() *model.Spec
	}{
		{"frame2D", func() *model.Spec { return modelgen.Frame2D(50, 100) }},
		{"frame3D", func() *model.Spec { return modelgen.Frame3D(10, 10, 30) }},
	} {
		m := modelgen.Must(fr.spec())
		loadEveryBeam(m)
		b.Run(fmt.Sprintf("%s/members=%d", fr.name, len(m.Members)), func(b *testing.B) {
			var spent [2]time.Duration
			for range b.N {
				for k, stations := range []int{-1, 11} {
					before := cpuTime()
					if _, err := Solve(context.Background(), m, Options{Stations: stations, SkipCondition: true, Workers: 1}); err != nil {
						b.Fatal(err)
					}
					spent[k] += cpuTime() - before
				}
			}
			b.ReportMetric(float64(spent[0].Milliseconds())/float64(b.N), "cpu-ms-without")
			b.ReportMetric(float64(spent[1].Milliseconds())/float64(b.N), "cpu-ms-with11")
			b.ReportMetric(float64(spent[1])/float64(spent[0]), "ratio")
		})
	}
}

// loadEveryBeam adds a uniform load and a point load to every beam of m.
func loadEveryBeam(m *model.Model) {
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
}

// cpuTime is the process's user and system CPU time so far.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
