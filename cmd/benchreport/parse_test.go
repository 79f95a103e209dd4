package main

import (
	"strings"
	"testing"
)

// The lines below follow the benchmark result format of the Go testing
// package ("go help testflag"; golang.org/design/14313-benchmark-format):
// name with GOMAXPROCS suffix, iterations, then value-unit pairs.
func TestParseLine(t *testing.T) {
	cases := []struct {
		line string
		ok   bool
		want Result
	}{
		{
			line: "BenchmarkSolve/pratt/members=97-2   \t       3\t   1234567 ns/op\t  1.37 MB/s\t 12.5 factor-ms\t262782 B/op\t 4379 allocs/op",
			ok:   true,
			want: Result{Name: "BenchmarkSolve/pratt/members=97", Procs: 2, Iterations: 3, NsPerOp: 1234567, BytesPerOp: 262782, AllocsPerOp: 4379,
				Metrics: []Metric{{1.37, "MB/s"}, {12.5, "factor-ms"}}},
		},
		{
			line: "BenchmarkRun/steps=1000/members=497/workers=2-8 1 98765 ns/op",
			ok:   true,
			want: Result{Name: "BenchmarkRun/steps=1000/members=497/workers=2", Procs: 8, Iterations: 1, NsPerOp: 98765, BytesPerOp: -1, AllocsPerOp: -1},
		},
		{
			line: "BenchmarkEval 1000000 1.5 ns/op 0 B/op 0 allocs/op",
			ok:   true,
			want: Result{Name: "BenchmarkEval", Procs: 1, Iterations: 1000000, NsPerOp: 1.5, BytesPerOp: 0, AllocsPerOp: 0},
		},
		{line: "goos: linux", ok: false},
		{line: "PASS", ok: false},
		{line: "ok  \tgusset/engine/sparse\t1.234s", ok: false},
		{line: "BenchmarkBroken-2 3 fast ns/op", ok: false},
		{line: "BenchmarkNoTime-2 3 5 B/op", ok: false},
		{line: "    bench_test.go:12: BenchmarkX logged 3 things", ok: false},
	}
	for _, c := range cases {
		got, ok := ParseLine(c.line)
		if ok != c.ok {
			t.Errorf("%q: ok %v, want %v", c.line, ok, c.ok)
			continue
		}
		if !ok {
			continue
		}
		w := c.want
		if got.Name != w.Name || got.Procs != w.Procs || got.Iterations != w.Iterations || got.NsPerOp != w.NsPerOp ||
			got.BytesPerOp != w.BytesPerOp || got.AllocsPerOp != w.AllocsPerOp || len(got.Metrics) != len(w.Metrics) {
			t.Errorf("%q:\n got %+v\nwant %+v", c.line, got, w)
			continue
		}
		for i := range w.Metrics {
			if got.Metrics[i] != w.Metrics[i] {
				t.Errorf("%q: metric %d is %+v, want %+v", c.line, i, got.Metrics[i], w.Metrics[i])
			}
		}
	}
}

func TestParseReadsCPUAndSkipsNoise(t *testing.T) {
	out := `goos: linux
goarch: amd64
pkg: gusset/engine/loadpath
cpu: Some Processor @ 2.0GHz
BenchmarkCompute/members=100-2         	       3	     41000 ns/op	   12000 B/op	      20 allocs/op
--- BENCH: BenchmarkCompute
    bench_test.go:20: note
BenchmarkCompute/members=10000-2       	       3	   5100000 ns/op	 1200000 B/op	    2000 allocs/op
PASS
ok  	gusset/engine/loadpath	0.321s
`
	results, cpu, err := Parse(strings.NewReader(out))
	if err != nil {
		t.Fatal(err)
	}
	if cpu != "Some Processor @ 2.0GHz" {
		t.Errorf("cpu %q", cpu)
	}
	if len(results) != 2 || results[0].Name != "BenchmarkCompute/members=100" || results[1].NsPerOp != 5100000 {
		t.Errorf("results %+v", results)
	}
}

func TestSplitSize(t *testing.T) {
	cases := []struct{ name, base, size string }{
		{"BenchmarkSolve/pratt/members=97", "BenchmarkSolve/pratt", "members=97"},
		{"BenchmarkRun/steps=1000/members=497/workers=2", "BenchmarkRun", "steps=1000 members=497 workers=2"},
		{"BenchmarkEval/chord", "BenchmarkEval/chord", ""},
		{"BenchmarkThroughputSmallSolve/requests=1000", "BenchmarkThroughputSmallSolve", "requests=1000"},
	}
	for _, c := range cases {
		if base, size := SplitSize(c.name); base != c.base || size != c.size {
			t.Errorf("SplitSize(%q) = %q, %q; want %q, %q", c.name, base, size, c.base, c.size)
		}
	}
}
