// Command benchreport runs the benchmarks of every engine method and of the
// request path at their sizes and writes one Markdown table that a reviewer
// can compare between commits:
//
//	go run ./cmd/benchreport [-out FILE] [-short] [-benchtime 3x] [-bench REGEXP] [-packages LIST]
//
// For each package it builds the test binary once (go test -c), lists its
// benchmarks, and runs each top-level benchmark in its own process with
// -benchmem, so that the peak resident memory reported belongs to that
// benchmark alone (measured by /usr/bin/time when installed, else from the
// child's rusage, which on Linux also counts benchreport's own peak of a
// few MiB). Custom metrics
// reported with b.ReportMetric (phase times such as factor-ms, counts,
// requests/s) get their own columns. -short passes -test.short to the
// benchmarks (which may then skip their largest sizes) and runs each size
// once.
package main

import (
	"bytes"
	"flag"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"syscall"
	"time"
)

// defaultPackages are the packages whose benchmarks make the report; those
// that do not exist in the checkout are skipped.
var defaultPackages = []string{
	"gusset/engine/sparse",
	"gusset/engine/stiffness",
	"gusset/engine/loadpath",
	"gusset/engine/sweep",
	"gusset/engine/reciprocal",
	"gusset/engine/layout",
	"gusset/cmd/gusset/adapter",
	"gusset/cmd/gusset",
}

// run is one benchmark process: its results and peak memory.
type run struct {
	pkg     string
	bench   string
	results []Result
	peakRSS int64 // bytes; 0 when unknown
	wall    time.Duration
	err     error
}

func main() {
	out := flag.String("out", "", "write the report to `FILE` instead of standard output")
	short := flag.Bool("short", false, "pass -test.short and run each benchmark once")
	benchtime := flag.String("benchtime", "3x", "the -test.benchtime of every benchmark (-short sets 1x)")
	filter := flag.String("bench", ".", "run only the top-level benchmarks matching `REGEXP`")
	packages := flag.String("packages", strings.Join(defaultPackages, ","), "comma-separated import paths")
	flag.Parse()
	if *short {
		*benchtime = "1x"
	}
	root, err := moduleRoot()
	if err != nil {
		fatalf("%v", err)
	}
	work, err := os.MkdirTemp("", "benchreport-")
	if err != nil {
		fatalf("%v", err)
	}
	defer os.RemoveAll(work)

	var runs []run
	var cpu string
	for _, pkg := range strings.Split(*packages, ",") {
		pkg = strings.TrimSpace(pkg)
		dir := filepath.Join(root, strings.TrimPrefix(pkg, "gusset/"))
		if _, err := os.Stat(dir); err != nil {
			fmt.Fprintf(os.Stderr, "benchreport: skipping %s: %v\n", pkg, err)
			continue
		}
		bin := filepath.Join(work, strings.ReplaceAll(pkg, "/", "_")+".test")
		build := exec.Command("go", "test", "-c", "-o", bin, pkg)
		build.Dir = root
		if msg, err := build.CombinedOutput(); err != nil {
			runs = append(runs, run{pkg: pkg, err: fmt.Errorf("build: %v: %s", err, firstLine(msg))})
			continue
		}
		if _, err := os.Stat(bin); err != nil {
			continue // no test files
		}
		names, err := listBenchmarks(bin, dir, *filter)
		if err != nil {
			runs = append(runs, run{pkg: pkg, err: err})
			continue
		}
		for _, name := range names {
			fmt.Fprintf(os.Stderr, "benchreport: %s %s\n", pkg, name)
			r, c := runBenchmark(bin, dir, name, *benchtime, *short)
			r.pkg = pkg
			if c != "" {
				cpu = c
			}
			runs = append(runs, r)
		}
	}
	var report bytes.Buffer
	writeReport(&report, runs, header(root, cpu, *benchtime, *short))
	if *out == "" {
		os.Stdout.Write(report.Bytes())
		return
	}
	if err := os.WriteFile(*out, report.Bytes(), 0o644); err != nil {
		fatalf("%v", err)
	}
}

func fatalf(format string, args ...any) {
	fmt.Fprintf(os.Stderr, "benchreport: "+format+"\n", args...)
	os.Exit(1)
}

func firstLine(b []byte) string {
	line, _, _ := strings.Cut(strings.TrimSpace(string(b)), "\n")
	return line
}

// moduleRoot is the directory of the main module's go.mod.
func moduleRoot() (string, error) {
	out, err := exec.Command("go", "env", "GOMOD").Output()
	if err != nil {
		return "", fmt.Errorf("go env GOMOD: %v", err)
	}
	gomod := strings.TrimSpace(string(out))
	if gomod == "" || gomod == os.DevNull {
		return "", fmt.Errorf("run benchreport inside the gusset module")
	}
	return filepath.Dir(gomod), nil
}

// listBenchmarks returns the top-level benchmarks of a test binary that
// match filter.
func listBenchmarks(bin, dir, filter string) ([]string, error) {
	cmd := exec.Command(bin, "-test.list", "^Benchmark")
	cmd.Dir = dir
	out, err := cmd.Output()
	if err != nil {
		return nil, fmt.Errorf("listing benchmarks: %v", err)
	}
	var names []string
	for _, line := range strings.Split(string(out), "\n") {
		if strings.HasPrefix(line, "Benchmark") {
			names = append(names, strings.TrimSpace(line))
		}
	}
	if filter == "." || filter == "" {
		return names, nil
	}
	cmd = exec.Command(bin, "-test.list", filter)
	cmd.Dir = dir
	out, err = cmd.Output()
	if err != nil {
		return nil, fmt.Errorf("listing benchmarks matching %q: %v", filter, err)
	}
	match := map[string]bool{}
	for _, line := range strings.Split(string(out), "\n") {
		match[strings.TrimSpace(line)] = true
	}
	var kept []string
	for _, n := range names {
		if match[n] {
			kept = append(kept, n)
		}
	}
	return kept, nil
}

// runBenchmark runs one top-level benchmark (all its sizes) in its own
// process, from the package's directory as go test would.
func runBenchmark(bin, dir, name, benchtime string, short bool) (run, string) {
	args := []string{"-test.run", "^$", "-test.bench", "^" + name + "$", "-test.benchmem", "-test.benchtime", benchtime}
	if short {
		args = append(args, "-test.short")
	}
	// GNU time forks before it execs the benchmark, so the figure it
	// reports is the benchmark's own; the rusage of a child we start
	// ourselves would include our own peak (Linux carries the parent's
	// high-water mark across a vfork and exec).
	var rssFile string
	cmd := exec.Command(bin, args...)
	if _, err := os.Stat(gnuTime); err == nil {
		f, err := os.CreateTemp("", "benchreport-rss-")
		if err == nil {
			rssFile = f.Name()
			f.Close()
			defer os.Remove(rssFile)
			cmd = exec.Command(gnuTime, append([]string{"-f", "%M", "-o", rssFile, bin}, args...)...)
		}
	}
	cmd.Dir = dir
	var stdout, stderr bytes.Buffer
	cmd.Stdout = &stdout
	cmd.Stderr = &stderr
	start := time.Now()
	err := cmd.Run()
	r := run{bench: name, wall: time.Since(start)}
	if rssFile != "" {
		if b, rerr := os.ReadFile(rssFile); rerr == nil {
			// The last line holds %M (KiB); a failed command adds a line
			// with its status before it.
			fields := strings.Fields(string(b))
			if len(fields) > 0 {
				if kib, perr := strconv.ParseInt(fields[len(fields)-1], 10, 64); perr == nil {
					r.peakRSS = kib * 1024
				}
			}
		}
	} else if cmd.ProcessState != nil {
		if ru, ok := cmd.ProcessState.SysUsage().(*syscall.Rusage); ok {
			r.peakRSS = maxRSSBytes(ru.Maxrss)
		}
	}
	results, cpu, perr := Parse(&stdout)
	r.results = results
	switch {
	case err != nil:
		r.err = fmt.Errorf("%v: %s", err, firstLine(append(stdout.Bytes(), stderr.Bytes()...)))
	case perr != nil:
		r.err = perr
	}
	return r, cpu
}

// gnuTime is GNU time, used for the peak memory when present.
const gnuTime = "/usr/bin/time"

// maxRSSBytes converts ru_maxrss to bytes: kilobytes on Linux, bytes on
// macOS (getrusage(2) on each).
func maxRSSBytes(maxrss int64) int64 {
	if runtime.GOOS == "darwin" {
		return maxrss
	}
	return maxrss * 1024
}

// header describes where and how the figures were taken.
func header(root, cpu, benchtime string, short bool) string {
	commit := "unknown"
	if out, err := exec.Command("git", "-C", root, "rev-parse", "--short", "HEAD").Output(); err == nil {
		commit = strings.TrimSpace(string(out))
		if st, err := exec.Command("git", "-C", root, "status", "--porcelain", "--untracked-files=no").Output(); err == nil && len(bytes.TrimSpace(st)) > 0 {
			commit += " (with uncommitted changes)"
		}
	}
	if cpu == "" {
		cpu = "unknown"
	}
	mode := ""
	if short {
		mode = ", -short"
	}
	return fmt.Sprintf("Commit %s, %s, %s/%s, %d CPUs (%s), -benchtime %s%s, %s.",
		commit, runtime.Version(), runtime.GOOS, runtime.GOARCH, runtime.NumCPU(), cpu, benchtime, mode, time.Now().UTC().Format("2006-01-02 15:04 UTC"))
}

// writeReport writes one Markdown table: a row per benchmark size with
// its custom metrics (b.ReportMetric: phase times, counts, rates) in one
// column, and the peak memory of the process that ran the benchmark.
func writeReport(w io.Writer, runs []run, head string) {
	fmt.Fprintf(w, "# Benchmark report\n\n%s\n\n", head)
	fmt.Fprint(w, "| package | benchmark | size | time/op | B/op | allocs/op | metrics | peak RSS |\n")
	fmt.Fprint(w, "|---|---|---|---:|---:|---:|---|---:|\n")
	var failures []string
	for _, r := range runs {
		if r.err != nil {
			failures = append(failures, fmt.Sprintf("- %s %s: %v", r.pkg, r.bench, r.err))
		}
		for _, res := range r.results {
			base, size := SplitSize(res.Name)
			var metrics []string
			for _, m := range res.Metrics {
				metrics = append(metrics, number(m.Value)+" "+m.Unit)
			}
			fmt.Fprintf(w, "| %s | %s | %s | %s | %s | %s | %s | %s |\n", strings.TrimPrefix(r.pkg, "gusset/"), base, size,
				duration(res.NsPerOp), quantity(res.BytesPerOp, "B"), quantity(res.AllocsPerOp, ""),
				strings.Join(metrics, ", "), quantity(float64(r.peakRSS), "B"))
		}
	}
	fmt.Fprint(w, "\nPeak RSS is that of the process that ran the benchmark, all its sizes and the Go runtime included.\n")
	if len(failures) > 0 {
		fmt.Fprintf(w, "\n## Failures\n\n%s\n", strings.Join(failures, "\n"))
	}
}

// duration formats nanoseconds with three significant figures.
func duration(ns float64) string {
	switch {
	case ns < 0:
		return ""
	case ns < 1e3:
		return fmt.Sprintf("%.3g ns", ns)
	case ns < 1e6:
		return fmt.Sprintf("%.3g µs", ns/1e3)
	case ns < 1e9:
		return fmt.Sprintf("%.3g ms", ns/1e6)
	default:
		return fmt.Sprintf("%.3g s", ns/1e9)
	}
}

// quantity formats a count with a binary (bytes) or decimal prefix.
func quantity(v float64, unit string) string {
	if v < 0 {
		return ""
	}
	if unit == "B" {
		switch {
		case v >= 1<<30:
			return fmt.Sprintf("%.3f GiB", v/(1<<30))
		case v >= 1<<20:
			return fmt.Sprintf("%.1f MiB", v/(1<<20))
		case v >= 1<<10:
			return fmt.Sprintf("%.1f KiB", v/(1<<10))
		}
		return fmt.Sprintf("%.0f B", v)
	}
	return number(v)
}

// number formats a metric: integers as they are, others with four
// significant figures.
func number(v float64) string {
	if v == float64(int64(v)) && v < 1e15 {
		return fmt.Sprintf("%d", int64(v))
	}
	return fmt.Sprintf("%.4g", v)
}
