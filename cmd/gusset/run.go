package main

import (
	"context"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"runtime/debug"
	"strings"
	"sync"

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
  gusset run [flags] FILE|-   answer the requests in FILE (or stdin) and exit;
                              the exit status is 1 when any request failed
  gusset schema               print the published JSON Schema
  gusset demo [--out DIR]     run the built-in demonstration scenario
  gusset --version            print the version
  gusset --help               print this help

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
			fmt.Fprint(stdout, usage)
			f := newFlags(stdout)
			f.fs.PrintDefaults()
			return 0
		case "schema":
			stdout.Write(schema.Document)
			return 0
		case "demo":
			return runDemo(args[1:], stdout, stderr)
		case "serve":
			return serve(args[1:], stdin, stdout, stderr, false)
		case "run":
			return serve(args[1:], stdin, stdout, stderr, true)
		}
		if !strings.HasPrefix(args[0], "-") {
			fmt.Fprintf(stderr, "gusset: unknown command %q; try gusset --help\n", args[0])
			return 2
		}
	}
	return serve(args, stdin, stdout, stderr, false)
}

type flags struct {
	fs       *flag.FlagSet
	limits   protocol.Limits
	pictures string
}

func newFlags(out io.Writer) *flags {
	f := &flags{fs: flag.NewFlagSet("gusset", flag.ContinueOnError)}
	f.fs.SetOutput(out)
	d := protocol.Limits{}.WithDefaults()
	f.fs.IntVar(&f.limits.Workers, "jobs", d.Workers, "requests worked on at once")
	f.fs.IntVar(&f.limits.MaxLineBytes, "max-line-bytes", d.MaxLineBytes, "largest request line accepted, in bytes")
	f.fs.IntVar(&f.limits.MaxNodes, "max-nodes", d.MaxNodes, "most nodes in one model")
	f.fs.IntVar(&f.limits.MaxMembers, "max-members", d.MaxMembers, "most members in one model")
	f.fs.IntVar(&f.limits.MaxSweepSteps, "max-sweep-steps", d.MaxSweepSteps, "most steps in one sweep")
	f.fs.IntVar(&f.limits.MaxCandidates, "max-candidates", d.MaxCandidates, "most candidate members in one layout optimisation")
	f.fs.IntVar(&f.limits.MaxQueued, "max-queued", d.MaxQueued, "requests that may wait for a worker whatever their size")
	f.fs.IntVar(&f.limits.ReadAheadBytes, "read-ahead-bytes", d.ReadAheadBytes, "bytes of further waiting requests read ahead beyond --max-queued, so cancel is never held up behind small requests")
	f.fs.Float64Var(&f.limits.TimeLimitSeconds, "time-limit", 0, "wall time allowed per request in seconds (0: none)")
	f.fs.StringVar(&f.pictures, "pictures", "", "run only: write every picture a result carries into this folder, as ID.svg")
	return f
}

// newServer builds a server with every method registered.
func newServer(limits protocol.Limits, log io.Writer) (*jsonrpc.Server, error) {
	s := &jsonrpc.Server{Name: "gusset", Version: version, Limits: limits, Log: log}
	if err := adapter.Register(s); err != nil {
		return nil, err
	}
	return s, nil
}

func serve(args []string, stdin io.Reader, stdout, stderr io.Writer, oneShot bool) int {
	f := newFlags(stderr)
	if err := f.fs.Parse(args); err != nil {
		return 2
	}
	in := stdin
	if oneShot {
		if f.fs.NArg() != 1 {
			fmt.Fprintln(stderr, "gusset run: give one FILE of requests (one JSON-RPC request per line), or - for stdin")
			return 2
		}
		if name := f.fs.Arg(0); name != "-" {
			file, err := os.Open(name)
			if err != nil {
				fmt.Fprintf(stderr, "gusset run: %v\n", err)
				return 2
			}
			defer file.Close()
			in = file
		}
	} else if f.fs.NArg() > 0 {
		fmt.Fprintf(stderr, "gusset serve: unexpected argument %q\n", f.fs.Arg(0))
		return 2
	}
	tuneMemory()
	s, err := newServer(f.limits, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "gusset: %v\n", err)
		return 1
	}
	if f.pictures != "" {
		if !oneShot {
			fmt.Fprintln(stderr, "gusset serve: --pictures belongs to gusset run")
			return 2
		}
		if err := os.MkdirAll(f.pictures, 0o755); err != nil {
			fmt.Fprintf(stderr, "gusset run: %v\n", err)
			return 2
		}
		s.OnResponse = pictureWriter(f.pictures, stderr)
	}
	if oneShot && isTerminal(stderr) {
		bar := &progressBar{out: stderr}
		s.OnProgress = bar.update
		defer bar.clear()
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	failures, err := s.Serve(ctx, in, stdout)
	if err != nil {
		fmt.Fprintf(stderr, "gusset: writing output: %v\n", err)
		return 1
	}
	if oneShot && failures > 0 {
		return 1
	}
	return 0
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
	if p.Total > 0 {
		filled := width * p.Done / p.Total
		line += fmt.Sprintf(" [%s%s] %d/%d", strings.Repeat("#", filled), strings.Repeat(".", width-filled), p.Done, p.Total)
	} else {
		line += fmt.Sprintf(" %d", p.Done)
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
// (1.1× against 1.7× with 400, measured by BenchmarkStructuralSweep). The
// soft memory limit keeps large models from growing the heap fourfold:
// near it the collector runs as often as it must. GOGC and GOMEMLIMIT in
// the environment take precedence.
const (
	gcPercent   = 400
	memoryLimit = 4 << 30
)

func tuneMemory() {
	if os.Getenv("GOGC") == "" {
		debug.SetGCPercent(gcPercent)
	}
	if os.Getenv("GOMEMLIMIT") == "" {
		debug.SetMemoryLimit(memoryLimit)
	}
}

// pictureWriter returns a response hook that writes the SVG picture of a
// result (reciprocate and optimise-layout, when asked with "picture": true)
// into dir as ID.svg, the id made safe for a file name.
func pictureWriter(dir string, stderr io.Writer) func(r *protocol.Response) {
	var mu sync.Mutex
	return func(r *protocol.Response) {
		var picture string
		switch v := r.Result.(type) {
		case *protocol.ReciprocateResult:
			picture = v.Picture
		case *protocol.LayoutResult:
			picture = v.Picture
		}
		if picture == "" {
			return
		}
		name := strings.Map(func(c rune) rune {
			if c == '/' || c == '\\' || c == '"' || c < ' ' {
				return '_'
			}
			return c
		}, strings.Trim(string(r.ID), `"`))
		mu.Lock()
		defer mu.Unlock()
		file := filepath.Join(dir, name+".svg")
		if err := os.WriteFile(file, []byte(picture), 0o644); err != nil {
			fmt.Fprintf(stderr, "gusset run: writing %s: %v\n", file, err)
		}
	}
}
