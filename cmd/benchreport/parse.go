package main

import (
	"bufio"
	"io"
	"regexp"
	"strconv"
	"strings"
)

// Result is one benchmark line of `go test -bench` output.
type Result struct {
	// Name is the benchmark's full name without the GOMAXPROCS suffix,
	// e.g. "BenchmarkSolve/pratt/members=97".
	Name string
	// Procs is the GOMAXPROCS suffix (1 when absent).
	Procs int
	// Iterations is b.N of the reported run.
	Iterations int
	// NsPerOp is the time per operation in nanoseconds.
	NsPerOp float64
	// BytesPerOp and AllocsPerOp come from -benchmem; negative when absent.
	BytesPerOp, AllocsPerOp float64
	// Metrics are the other value-unit pairs in the order reported (MB/s
	// from b.SetBytes and every b.ReportMetric).
	Metrics []Metric
}

// Metric is one value with its unit, e.g. 12.5 "factor-ms".
type Metric struct {
	Value float64
	Unit  string
}

var procsSuffix = regexp.MustCompile(`-(\d+)$`)

// ParseLine parses one line of benchmark output. It reports false for any
// line that is not a benchmark result (headers, PASS, ok, logs).
func ParseLine(line string) (Result, bool) {
	fields := strings.Fields(line)
	if len(fields) < 4 || !strings.HasPrefix(fields[0], "Benchmark") || len(fields)%2 != 0 {
		return Result{}, false
	}
	r := Result{Name: fields[0], Procs: 1, NsPerOp: -1, BytesPerOp: -1, AllocsPerOp: -1}
	if m := procsSuffix.FindStringSubmatch(r.Name); m != nil {
		r.Procs, _ = strconv.Atoi(m[1])
		r.Name = strings.TrimSuffix(r.Name, m[0])
	}
	n, err := strconv.Atoi(fields[1])
	if err != nil {
		return Result{}, false
	}
	r.Iterations = n
	for i := 2; i+1 < len(fields); i += 2 {
		v, err := strconv.ParseFloat(fields[i], 64)
		if err != nil {
			return Result{}, false
		}
		switch unit := fields[i+1]; unit {
		case "ns/op":
			r.NsPerOp = v
		case "B/op":
			r.BytesPerOp = v
		case "allocs/op":
			r.AllocsPerOp = v
		default:
			r.Metrics = append(r.Metrics, Metric{Value: v, Unit: unit})
		}
	}
	if r.NsPerOp < 0 {
		return Result{}, false
	}
	return r, true
}

// Parse reads benchmark output and returns its results in order and the
// CPU named on its "cpu:" header line, if any.
func Parse(r io.Reader) (results []Result, cpu string, err error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(nil, 1<<20)
	for sc.Scan() {
		line := sc.Text()
		if c, ok := strings.CutPrefix(line, "cpu: "); ok {
			cpu = strings.TrimSpace(c)
			continue
		}
		if res, ok := ParseLine(line); ok {
			results = append(results, res)
		}
	}
	return results, cpu, sc.Err()
}

// SplitSize separates the size parameters of a benchmark name (the path
// elements written key=value, as in "members=1000") from the rest:
// "BenchmarkSolve/pratt/members=97" gives "BenchmarkSolve/pratt" and
// "members=97".
func SplitSize(name string) (base, size string) {
	var keep, sizes []string
	for i, part := range strings.Split(name, "/") {
		if i > 0 && strings.Contains(part, "=") {
			sizes = append(sizes, part)
		} else {
			keep = append(keep, part)
		}
	}
	return strings.Join(keep, "/"), strings.Join(sizes, " ")
}
