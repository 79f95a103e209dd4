package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"runtime"
	"runtime/debug"
	"runtime/metrics"
	"strings"
	"sync"
	"sync/atomic"
	"syscall"

	"gusset/cmd/gusset/adapter"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
	"gusset/schema"
)

// version is the program's version, reported by --version and describe.
const version = "0.1.0"

const usage = `gusset: a structural solver process driven by JSON-RPC lines.

Usage:
  gusset [serve] [flags]      read requests on stdin, answer on stdout (the default)
  gusset run FILE|- [flags]   answer the requests in FILE (or stdin) and exit;
                              flags may come before or after FILE. FILE holds
                              one request per line, or one JSON document (a
                              request, pretty-printed or not, or an array of
                              requests). Answers come out in the file's order
                              (--ordered=false: as they finish). The exit
                              status is 1 when any request failed.
  gusset schema               print the published JSON Schema
  gusset demo [--out DIR]     run the built-in demonstration scenario and write
                              its pictures and report.html into DIR
  gusset --version            print the version
  gusset --help               print this help (also: gusset COMMAND --help)

Progress notifications go to stdout with the answers unless
--notifications says stderr (as JSON lines) or none.

Flags of serve and run:
`

// run is main without the process: tests drive it directly.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	if len(args) > 0 {
		switch args[0] {
		case "--version", "-version", "version":
			fmt.Fprintf(stdout, "gusset %s (protocol %s)\n", version, protocol.Version)
			return 0
		case "--help", "-help", "-h", "help":
			printHelp(stdout)
			return 0
		case "schema":
			if len(args) > 1 {
				if isHelp(args[1]) {
					fmt.Fprint(stdout, "gusset schema: print the published JSON Schema (draft 2020-12) of every\nrequest, result and error to stdout. It takes no flags.\n")
					return 0
				}
				fmt.Fprintf(stderr, "gusset schema: unexpected argument %q; try gusset schema --help\n", args[1])
				return 2
			}
			stdout.Write(schema.Document)
			return 0
		case "demo":
			return runDemo(args[1:], stdout, stderr)
		case "serve":
			return serve(args[1:], stdin, stdout, stderr)
		case "run":
			return runFile(args[1:], stdin, stdout, stderr)
		}
		if !strings.HasPrefix(args[0], "-") {
			fmt.Fprintf(stderr, "gusset: unknown command %q; try gusset --help\n", args[0])
			return 2
		}
	}
	return serve(args, stdin, stdout, stderr)
}

type flags struct {
	fs            *flag.FlagSet
	limits        protocol.Limits
	pictures      string
	report        string
	csv           string
	ordered       bool
	notifications string
}

func newFlags(out io.Writer) *flags {
	f := &flags{fs: flag.NewFlagSet("gusset", flag.ContinueOnError)}
	f.fs.SetOutput(out)
	f.fs.Usage = func() {} // --help is answered by printHelp, on stdout
	d := protocol.Limits{}.WithDefaults()
	f.fs.IntVar(&f.limits.Workers, "jobs", d.Workers, "requests worked on at once")
	f.fs.IntVar(&f.limits.MaxLineBytes, "max-line-bytes", d.MaxLineBytes, "largest request line accepted, in bytes")
	f.fs.IntVar(&f.limits.MaxNodes, "max-nodes", d.MaxNodes, "most nodes in one model")
	f.fs.IntVar(&f.limits.MaxMembers, "max-members", d.MaxMembers, "most members in one model")
	f.fs.IntVar(&f.limits.MaxSweepSteps, "max-sweep-steps", d.MaxSweepSteps, "most steps in one sweep")
	f.fs.IntVar(&f.limits.MaxCandidates, "max-candidates", d.MaxCandidates, "most candidate members in one layout optimisation")
	f.fs.IntVar(&f.limits.MaxQueued, "max-queued", d.MaxQueued, "requests that may wait for a worker whatever their size")
	f.fs.IntVar(&f.limits.ReadAheadBytes, "read-ahead-bytes", d.ReadAheadBytes, "bytes of further waiting requests read ahead beyond --max-queued, so cancel is never held up behind small requests")
	f.fs.IntVar(&f.limits.MaxQueuedBytes, "max-queued-bytes", d.MaxQueuedBytes, "bytes of request lines that may wait for a worker, whatever their number; beyond them reading stops (back-pressure)")
	f.fs.Float64Var(&f.limits.TimeLimitSeconds, "time-limit", 0, "wall time allowed per request in seconds (0: none)")
	f.fs.StringVar(&f.pictures, "pictures", "", "run only: ask every request that can draw a picture for one, and write them into this folder as ID.svg")
	f.fs.StringVar(&f.report, "report", "", "run only: write one self-contained report.html of every answer into this folder")
	f.fs.StringVar(&f.csv, "csv", "", "run only: write the member and node results as CSV files (one per result table, with a header line) into this folder")
	f.fs.BoolVar(&f.ordered, "ordered", true, "run only: write answers in the file's order (false: as they finish)")
	f.fs.StringVar(&f.notifications, "notifications", notifyStdout, "where progress notifications go: stdout (with the answers), stderr, or none")
	return f
}

// newServer builds a server with every method registered.
func newServer(limits protocol.Limits, log io.Writer) (*jsonrpc.Server, error) {
	s := &jsonrpc.Server{Name: "gusset", Version: version, Limits: limits, Log: log, Suggest: schema.Closest}
	if err := adapter.Register(s); err != nil {
		return nil, err
	}
	return s, nil
}

// parseInterleaved parses flags that may come before or after the
// positional arguments, and returns the positional ones.
// parseCommand parses a command's flags and arguments (see
// parseInterleaved). done is true when the command must end at once with
// exit: 0 after printing the help asked for, 2 after a usage error (the flag
// package has already said what was wrong).
func (f *flags) parseCommand(args []string, stdout io.Writer) (positional []string, exit int, done bool) {
	positional, err := f.parseInterleaved(args)
	if errors.Is(err, flag.ErrHelp) {
		printHelp(stdout)
		return nil, 0, true
	}
	if err != nil {
		return nil, 2, true
	}
	return positional, 0, false
}

func (f *flags) parseInterleaved(args []string) ([]string, error) {
	var positional []string
	for {
		if err := f.fs.Parse(args); err != nil {
			return nil, err
		}
		rest := f.fs.Args()
		if len(rest) == 0 {
			return positional, nil
		}
		positional = append(positional, rest[0])
		args = rest[1:]
	}
}

func printHelp(w io.Writer) {
	fmt.Fprint(w, usage)
	f := newFlags(w)
	f.fs.PrintDefaults()
}

func isHelp(arg string) bool {
	return arg == "--help" || arg == "-help" || arg == "-h"
}

func serve(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	f := newFlags(stderr)
	positional, exit, done := f.parseCommand(args, stdout)
	if done {
		return exit
	}
	if len(positional) > 0 {
		fmt.Fprintf(stderr, "gusset serve: unexpected argument %q\n", positional[0])
		return 2
	}
	if f.pictures != "" || f.report != "" || f.csv != "" {
		fmt.Fprintln(stderr, "gusset serve: --pictures, --report and --csv belong to gusset run")
		return 2
	}
	out, notify, ok := f.outputs(stdout, stderr)
	if !ok {
		return 2
	}
	tuneMemory()
	s, err := newServer(f.limits, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "gusset: %v\n", err)
		return 1
	}
	var router *outputRouter
	if notify != out {
		router = newOutputRouter(out, notify, nil)
		out = router
	}
	ctx, signalled, release := stopOnSignals(stderr)
	defer release()
	_, err = s.Serve(ctx, stdin, out)
	if router != nil && err == nil {
		err = router.Close()
	}
	if code := signalled(); code != 0 {
		return code
	}
	if errors.Is(err, syscall.EPIPE) {
		// The reader of the answers went away: the session is over.
		fmt.Fprintln(stderr, "gusset: the output was closed (broken pipe); work in flight was stopped")
		return 0
	}
	if err != nil {
		fmt.Fprintf(stderr, "gusset: writing output: %v\n", err)
		return 1
	}
	return 0
}

// stopOnSignals returns a context that SIGINT or SIGTERM cancels (the
// server then stops reading, answers the requests in flight with the
// cancelled error and flushes), and a function giving the conventional
// exit status of the signal received, 128 + its number (130, 143), or 0;
// release stops listening. A second signal exits at once. A broken output
// pipe is a write error (EPIPE), not a fatal SIGPIPE.
func stopOnSignals(stderr io.Writer) (ctx context.Context, signalled func() int, release func()) {
	signal.Notify(make(chan os.Signal, 1), syscall.SIGPIPE)
	ctx, cancel := context.WithCancelCause(context.Background())
	sigs, done := make(chan os.Signal, 2), make(chan struct{})
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	var code atomic.Int32
	status := func(sig os.Signal) int32 {
		if n, ok := sig.(syscall.Signal); ok {
			return 128 + int32(n)
		}
		return 130
	}
	go func() {
		var sig os.Signal
		select {
		case sig = <-sigs:
		case <-done:
			return
		}
		code.Store(status(sig))
		fmt.Fprintf(stderr, "gusset: %v: stopping; requests in flight are answered as cancelled\n", sig)
		cancel(fmt.Errorf("%w by %v", jsonrpc.ErrInterrupted, sig))
		select {
		case sig = <-sigs:
			os.Exit(int(status(sig)))
		case <-done:
		}
	}()
	release = func() {
		signal.Stop(sigs)
		close(done)
		cancel(nil)
	}
	return ctx, func() int { return int(code.Load()) }, release
}

// outputs returns where answers and notifications go.
func (f *flags) outputs(stdout, stderr io.Writer) (out, notify io.Writer, ok bool) {
	switch f.notifications {
	case notifyStdout:
		return stdout, stdout, true
	case notifyStderr:
		return stdout, stderr, true
	case notifyNone:
		return stdout, nil, true
	}
	fmt.Fprintf(stderr, "gusset: --notifications is one of stdout, stderr, none; not %q\n", f.notifications)
	return nil, nil, false
}

func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	info, err := f.Stat()
	return err == nil && info.Mode()&os.ModeCharDevice != 0
}

// progressBar draws one line on a terminal for the latest progress.
type progressBar struct {
	mu    sync.Mutex
	out   io.Writer
	drawn bool
}

func (b *progressBar) update(p *protocol.Progress) {
	b.mu.Lock()
	defer b.mu.Unlock()
	const width = 30
	line := fmt.Sprintf("%s %s", string(p.Request), p.Stage)
	if p.Total > 0 && p.Done <= p.Total {
		filled := width * p.Done / p.Total
		line += fmt.Sprintf(" [%s%s] %d/%d", strings.Repeat("#", filled), strings.Repeat(".", width-filled), p.Done, p.Total)
	} else {
		line += fmt.Sprintf(": %d done", p.Done) // no total known: no bar
	}
	fmt.Fprintf(b.out, "\r\033[K%s", line)
	b.drawn = true
}

func (b *progressBar) clear() {
	b.mu.Lock()
	defer b.mu.Unlock()
	if b.drawn {
		fmt.Fprint(b.out, "\r\033[K")
	}
}

// gcPercent and memoryLimit tune the garbage collector for the server's
// load: many short requests over a small live heap (a sweep step of a
// 500-member truss allocates a few megabytes and frees them), where Go's
// default GOGC=100 collects so often that two workers gain little over one
// (1.1× against 1.7× with 400, measured by BenchmarkStructuralSweep). But
// 400 lets a large request's heap grow to five times its live size, and on
// this VM fresh pages are expensive (a page fault costs more than the
// collection that would have reused the page): so once the live heap
// passes largeHeap the collector goes back to largeHeapGCPercent, and to
// gcPercent when the live heap falls again (adaptGC, after each
// collection). Measured with the binary on a request file
// (/usr/bin/time, load average below 0.7, GOGC fixed by the environment):
// the 2D grid k = 300 (27.7 MB in, 33.4 MB out) 3.25 s wall, 3.03 s user,
// 1.92 s system, 884 MiB peak with 400; 3.10, 3.42, 1.65, 758 MiB with 200;
// 2.70, 2.97, 1.25, 681 MiB with 100; 2.80, 3.26, 1.40, 656 MiB with 50;
// the 3D grid k = 100 1.10 s, 306 MiB with 400; 1.27 s, 269 MiB with 100;
// 1.09 s, 255 MiB with 50. 100 is the fastest on the large 2D grid and
// near the smallest. The soft memory limit is a last guard: near it the
// collector runs as often as it must. GOGC and GOMEMLIMIT in the
// environment take precedence (GOGC then fixes the percentage).
const (
	gcPercent          = 400
	largeHeapGCPercent = 100
	largeHeap          = 64 << 20
	memoryLimit        = 4 << 30
)

func tuneMemory() {
	if os.Getenv("GOMEMLIMIT") == "" {
		debug.SetMemoryLimit(memoryLimit)
	}
	if os.Getenv("GOGC") == "" {
		adaptOnce.Do(func() {
			debug.SetGCPercent(gcPercent)
			adaptGC(new(gcCycle), gcPercent)
		})
	}
}

// adaptOnce arms adaptGC once per process (tests call run many times).
var adaptOnce sync.Once

// gcPercentFor is the collector's percentage for a live heap of live
// bytes.
func gcPercentFor(live uint64) int {
	if live >= largeHeap {
		return largeHeapGCPercent
	}
	return gcPercent
}

// gcCycle is an object whose finalizer runs once per collection: it is
// unreachable from the start, and the finalizer makes it reachable again
// and arms itself anew (it holds a pointer, so it is not packed with other
// small objects, whose finalizers may never run).
type gcCycle struct{ _ *gcCycle }

// adaptGC arms c's finalizer: after each collection it reads the live heap
// and sets the percentage gcPercentFor gives, when it changes (current is
// the percentage in force).
func adaptGC(c *gcCycle, current int) {
	runtime.SetFinalizer(c, func(c *gcCycle) {
		sample := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
		metrics.Read(sample)
		next := current
		if sample[0].Value.Kind() == metrics.KindUint64 {
			next = gcPercentFor(sample[0].Value.Uint64())
		}
		if next != current {
			debug.SetGCPercent(next)
		}
		adaptGC(c, next)
	})
}
