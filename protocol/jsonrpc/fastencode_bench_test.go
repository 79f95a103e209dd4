package jsonrpc

import (
	"math/rand/v2"
	"syscall"
	"testing"
	"time"

	"gusset/protocol"
)

// BenchmarkEncodeSolveResult encodes the response of a solve of the size
// of issue 19's 80,000-member grid (20,201 nodes, 80,000 bars, one case;
// computed numbers carry 15–17 significant digits, here random ones of
// the same magnitudes) by encoding/json and by encode, side by side; MB/s
// is the rate of the response's bytes (issue 19's target: 200 MB/s) in
// wall time, MB/cpu-s the rate per second of the process's CPU time (user
// and system, all threads), which other work on a shared machine
// disturbs less.
func BenchmarkEncodeSolveResult(b *testing.B) {
	const nodes, members = 20201, 80000
	r := rand.New(rand.NewPCG(8, 9))
	scaled := func(n int, scale float64) []float64 {
		x := make([]float64, n)
		for i := range x {
			x[i] = r.NormFloat64() * scale
		}
		return x
	}
	c := protocol.CaseResult{ID: "gravity", Kind: "case", Displacements: make([][]float64, nodes), Rotations: make([][]float64, nodes),
		AxialForces: scaled(members, 50), EndForces: make([][]float64, members), Stresses: scaled(members, 2e4),
		Utilisation: make([]*float64, members), Members: make([]*protocol.MemberResult, members)}
	for i := range nodes {
		c.Displacements[i] = scaled(3, 1e-3)
		c.Rotations[i] = []float64{}
	}
	for i := range members {
		c.EndForces[i] = scaled(6, 50)
		u := r.Float64()
		c.Utilisation[i] = &u
	}
	resp := &protocol.Response{JSONRPC: "2.0", ID: []byte("1"), Result: &protocol.SolveResult{Cases: []protocol.CaseResult{c}, Caution: "check"}}
	line, err := encodeStandard(resp)
	if err != nil {
		b.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		enc  func(any) ([]byte, error)
	}{{"encoding-json", encodeStandard}, {"encode", encode}} {
		b.Run(tc.name, func(b *testing.B) {
			b.SetBytes(int64(len(line)))
			b.ReportMetric(float64(len(line))/1e6, "MB-out")
			cpu0 := cpuTime()
			for b.Loop() {
				if _, err := tc.enc(resp); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(len(line))*float64(b.N)/1e6/(cpuTime()-cpu0).Seconds(), "MB/cpu-s")
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
