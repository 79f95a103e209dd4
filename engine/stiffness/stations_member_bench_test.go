package stiffness

import (
	"context"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// BenchmarkAlongMembers times the recovery of every member of a solved
// 10,100-member 2D frame (each beam under a uniform and a point load), one
// worker, without stations: the element, its end forces and the exact
// extremes along it. It isolates the work that BenchmarkStations measures
// inside a whole solve.
func BenchmarkAlongMembers(b *testing.B) {
	m := modelgen.Must(modelgen.Frame2D(50, 100))
	loadEveryBeam(m)
	res, err := Solve(context.Background(), m, Options{Stations: -1, SkipCondition: true})
	if err != nil {
		b.Fatal(err)
	}
	nb := newNumbering(m)
	u := make([]float64, nb.total)
	c := &res.Cases[0]
	for n := range c.Displacements {
		copy(u[nb.first[n]:], c.Displacements[n])
		copy(u[nb.first[n]+m.Dim:], c.Rotations[n])
	}
	ls := newLoadSet(m, nb, []model.Term{{Case: 0, Factor: 1}})
	cr := newCaseResult(m, nb, ls, u, recovery{})
	var el element
	var sc memberScratch
	var fg, fe [12]float64
	b.ResetTimer()
	before := cpuTime()
	for range b.N {
		for e := range m.Members {
			recoverMember(m, nb, ls, u, cr, e, &el, &sc, fg[:], fe[:])
		}
	}
	b.StopTimer()
	// The process's CPU time: on a shared machine it varies far less than
	// the wall-clock time.
	b.ReportMetric(float64((cpuTime()-before).Microseconds())/1000/float64(b.N), "cpu-ms/op")
	for e := range m.Members {
		if got, want := cr.Member(e, nil).PeakMomentZ, c.Member(e, nil).PeakMomentZ; got != want {
			b.Fatalf("member %d: peak moment %+v, want %+v", e, got, want)
		}
	}
}
