package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"gusset/cmd/gusset/adapter"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"syscall"
	"testing"
	"time"
	"unicode/utf8"

	"gusset/engine/model"
	"gusset/protocol"
)

// The reliability tests (reliability_*, badinput_*, determinism_*) drive
// the real binary through pipes, as a host does. This file holds what they
// share: building the binary, a process driver, and request builders.

// buildGusset compiles the command into a fresh temporary directory and
// returns the binary's path.
func buildGusset(t testing.TB) string {
	t.Helper()
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Skip("the go command is not on PATH")
	}
	bin := filepath.Join(t.TempDir(), "gusset")
	cmd := exec.Command(goTool, "build", "-o", bin, ".")
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
}

// wireMessage is one output line, decoded.
type wireMessage struct {
	JSONRPC string          `json:"jsonrpc"`
	ID      json.RawMessage `json:"id"`
	Method  string          `json:"method"`
	Params  struct {
		Request json.RawMessage `json:"request"`
		Stage   string          `json:"stage"`
	} `json:"params"`
	Result json.RawMessage `json:"result"`
	Error  *protocol.Error `json:"error"`
}

// isFinal tells a final response from a notification.
func (m *wireMessage) isFinal() bool { return m.Method == "" }

// process is a running gusset with its stdin, and its stdout read line by
// line by a goroutine that hands each line, with its decoded form, to
// onLine. Lines that are not one JSON object of version 2.0 in valid UTF-8
// are collected in bad.
type process struct {
	cmd     *exec.Cmd
	stdin   io.WriteCloser
	stdout  io.ReadCloser
	inMu    sync.Mutex
	stderr  bytes.Buffer
	read    chan struct{} // closed when stdout reaches end of file
	lines   int
	bad     []string
	exited  chan struct{}
	waitErr error
	hwm     atomic.Int64 // the largest VmHWM seen, bytes
}

// startGusset starts bin with args. onLine runs on the reading goroutine
// for every output line; it may call send.
func startGusset(t testing.TB, bin string, args []string, onLine func(raw []byte, m *wireMessage)) *process {
	t.Helper()
	p := &process{cmd: exec.Command(bin, args...), read: make(chan struct{}), exited: make(chan struct{})}
	p.cmd.Stderr = &p.stderr
	var err error
	if p.stdin, err = p.cmd.StdinPipe(); err != nil {
		t.Fatal(err)
	}
	if p.stdout, err = p.cmd.StdoutPipe(); err != nil {
		t.Fatal(err)
	}
	if err := p.cmd.Start(); err != nil {
		t.Fatal(err)
	}
	go p.watchMemory()
	go func() {
		defer close(p.read)
		r := bufio.NewReaderSize(p.stdout, 1<<20)
		for {
			line, err := r.ReadBytes('\n')
			if len(line) > 0 {
				p.lines++
				p.check(line, onLine)
			}
			if err != nil {
				return
			}
		}
	}()
	t.Cleanup(func() {
		select {
		case <-p.exited:
		default:
			p.cmd.Process.Kill()
			p.wait()
		}
	})
	return p
}

// check validates one output line and hands it on.
func (p *process) check(line []byte, onLine func(raw []byte, m *wireMessage)) {
	body := bytes.TrimSuffix(line, []byte("\n"))
	var m wireMessage
	var obj map[string]json.RawMessage
	switch {
	case len(line) == len(body):
		p.bad = append(p.bad, "unterminated line: "+abbrev(body))
	case !utf8.Valid(body):
		p.bad = append(p.bad, "not UTF-8: "+abbrev(body))
	case bytes.HasPrefix(body, []byte("[")):
		p.checkBatch(body, onLine)
	case json.Unmarshal(body, &obj) != nil || json.Unmarshal(body, &m) != nil:
		p.bad = append(p.bad, "not a JSON object: "+abbrev(body))
	case m.JSONRPC != "2.0":
		p.bad = append(p.bad, "not JSON-RPC 2.0: "+abbrev(body))
	default:
		if onLine != nil {
			onLine(body, &m)
		}
	}
}

// checkBatch validates a batch's answer (JSON-RPC 2.0 §6): a non-empty
// array of final responses of version 2.0, each handed on with the whole
// line as raw.
func (p *process) checkBatch(body []byte, onLine func(raw []byte, m *wireMessage)) {
	var ms []wireMessage
	if json.Unmarshal(body, &ms) != nil || len(ms) == 0 {
		p.bad = append(p.bad, "not a non-empty array of responses: "+abbrev(body))
		return
	}
	for i := range ms {
		if ms[i].JSONRPC != "2.0" || !ms[i].isFinal() {
			p.bad = append(p.bad, "a batch member is not a JSON-RPC 2.0 response: "+abbrev(body))
			return
		}
	}
	for i := range ms {
		if onLine != nil {
			onLine(body, &ms[i])
		}
	}
}

func abbrev(b []byte) string {
	if len(b) > 300 {
		return fmt.Sprintf("%q…", b[:300])
	}
	return fmt.Sprintf("%q", b)
}

// send writes one request line; concurrent sends never interleave.
func (p *process) send(line []byte) error {
	p.inMu.Lock()
	defer p.inMu.Unlock()
	if _, err := p.stdin.Write(line); err != nil {
		return err
	}
	_, err := p.stdin.Write([]byte("\n"))
	return err
}

// closeInput closes stdin: end of input for the server.
func (p *process) closeInput() {
	p.inMu.Lock()
	defer p.inMu.Unlock()
	p.stdin.Close()
}

// wait waits for the output to end and the process to exit.
func (p *process) wait() error {
	select {
	case <-p.exited:
		return p.waitErr
	default:
	}
	<-p.read
	p.waitErr = p.cmd.Wait()
	close(p.exited)
	return p.waitErr
}

// waitWithin waits at most d for the process to exit; it reports false when
// the process was still running (and kills it).
func (p *process) waitWithin(d time.Duration) (err error, exited bool) {
	done := make(chan error, 1)
	go func() { done <- p.wait() }()
	select {
	case err := <-done:
		return err, true
	case <-time.After(d):
		p.cmd.Process.Kill()
		<-done
		return nil, false
	}
}

// watchMemory samples the child's VmHWM (proc(5): its peak resident set
// size) until it exits. Linux's ru_maxrss cannot be used: a child started
// by vfork and exec inherits its parent's high-water mark at exec
// (signal->maxrss in fs/exec.c), so it reports at least the test
// process's own peak.
func (p *process) watchMemory() {
	path := fmt.Sprintf("/proc/%d/status", p.cmd.Process.Pid)
	for {
		if status, err := os.ReadFile(path); err == nil {
			for _, line := range strings.Split(string(status), "\n") {
				if rest, ok := strings.CutPrefix(line, "VmHWM:"); ok {
					if kb, err := strconv.ParseInt(strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(rest), "kB")), 10, 64); err == nil && kb*1024 > p.hwm.Load() {
						p.hwm.Store(kb * 1024)
					}
				}
			}
		}
		select {
		case <-p.exited:
			return
		case <-time.After(20 * time.Millisecond):
		}
	}
}

// peakRSS is the child's peak resident set size in bytes, sampled from
// /proc while it ran (see watchMemory); where /proc is missing, its
// rusage, which may overstate it.
func (p *process) peakRSS() int64 {
	if hwm := p.hwm.Load(); hwm > 0 {
		return hwm
	}
	if p.cmd.ProcessState == nil {
		return 0
	}
	if ru, ok := p.cmd.ProcessState.SysUsage().(*syscall.Rusage); ok {
		return ru.Maxrss * 1024
	}
	return 0
}

// request encodes one request line.
func request(id any, method string, params any) []byte {
	b, err := json.Marshal(map[string]any{"jsonrpc": "2.0", "id": id, "method": method, "params": params})
	if err != nil {
		panic("reliability: " + err.Error())
	}
	return b
}

// wireModel converts a generated model to its wire form, so tests can send
// modelgen's models as requests.
func wireModel(s *model.Spec) protocol.Model { return *adapter.WireModel(s) }

// registeredMethods asks a fresh process which methods it serves.
func registeredMethods(t testing.TB, bin string) map[string]bool {
	t.Helper()
	cmd := exec.Command(bin, "run", "-")
	cmd.Stdin = bytes.NewReader(request("d", "describe", map[string]any{}))
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("describe: %v", err)
	}
	var resp struct {
		Result protocol.DescribeResult `json:"result"`
	}
	if err := json.Unmarshal(out, &resp); err != nil {
		t.Fatalf("describe: %v: %s", err, out)
	}
	methods := map[string]bool{}
	for _, m := range resp.Result.Methods {
		methods[m.Name] = true
	}
	return methods
}

// Request builders shared by the load, fault and determinism tests. The
// two-bar truss is the README's: two bars from supports at (0,0) and (8,0)
// to a loaded apex at (4,h).
func twoBar(h any) map[string]any {
	return map[string]any{
		"dimension":  2,
		"parameters": map[string]any{"h": 3},
		"materials":  []any{map[string]any{"id": "steel", "elastic_modulus": 2.1e8, "tension_limit": 2.35e5, "compression_limit": 2.35e5}},
		"sections":   []any{map[string]any{"id": "tube", "area": 0.002, "second_moment": 3e-6}},
		"nodes": []any{map[string]any{"id": "A", "at": []any{0, 0}}, map[string]any{"id": "B", "at": []any{8, 0}},
			map[string]any{"id": "C", "at": []any{4, h}}},
		"members": []any{map[string]any{"id": "AC", "ends": []string{"A", "C"}, "material": "steel", "section": "tube"},
			map[string]any{"id": "BC", "ends": []string{"B", "C"}, "material": "steel", "section": "tube"}},
		"supports":   []any{map[string]any{"node": "A", "fix": []string{"x", "y"}}, map[string]any{"node": "B", "fix": []string{"x", "y"}}},
		"load_cases": []any{map[string]any{"id": "point", "loads": []any{map[string]any{"node": "C", "force": []any{0, -10}}}}},
	}
}

// layoutParams is a small least-volume layout problem: a 2:1 rectangle
// supported at its bottom corners with a point load at mid-span.
func layoutParams(divisions int) map[string]any {
	return map[string]any{
		"domain":    map[string]any{"outline": [][]float64{{0, 0}, {4, 0}, {4, 2}, {0, 2}}},
		"divisions": []int{2 * divisions, divisions},
		"supports": []any{map[string]any{"at": []float64{0, 0}, "fix": []string{"x", "y"}},
			map[string]any{"at": []float64{4, 0}, "fix": []string{"y"}}},
		"cases":             []any{map[string]any{"id": "point", "loads": []any{map[string]any{"at": []float64{2, 0}, "force": []float64{0, -10}}}}},
		"tension_limit":     235,
		"compression_limit": 235,
	}
}
