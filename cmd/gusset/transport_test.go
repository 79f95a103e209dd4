package main

import (
	"encoding/json"
	"errors"
	"io"
	"math"
	"os/exec"
	"strings"
	"sync"
	"sync/atomic"
	"syscall"
	"testing"
	"time"
)

// transcriptOf runs lines through a fresh `gusset serve` and returns the
// final responses by id (as raw JSON text), the raw output lines and
// stderr. onLine, when set, sees every line as it arrives and may send
// more input.
func transcriptOf(t *testing.T, args []string, lines []string, onLine func(p *process, raw []byte, m *wireMessage)) (map[string][]*wireMessage, []string, string) {
	t.Helper()
	bin := buildGusset(t)
	var mu sync.Mutex
	finals := map[string][]*wireMessage{}
	var raws []string
	var p *process
	ready := make(chan struct{})
	p = startGusset(t, bin, append([]string{"serve"}, args...), func(raw []byte, m *wireMessage) {
		<-ready
		mu.Lock()
		raws = append(raws, string(raw))
		if m.isFinal() {
			mm := *m
			finals[string(m.ID)] = append(finals[string(m.ID)], &mm)
		}
		mu.Unlock()
		if onLine != nil {
			onLine(p, raw, m)
		}
	})
	close(ready)
	for _, l := range lines {
		if err := p.send([]byte(l)); err != nil {
			t.Fatal(err)
		}
	}
	if onLine == nil {
		p.closeInput()
	}
	if err, exited := p.waitWithin(60 * time.Second); !exited || err != nil {
		t.Fatalf("exit: %v (exited %v); stderr: %s", err, exited, p.stderr.String())
	}
	for _, b := range p.bad {
		t.Errorf("bad output line: %s", b)
	}
	return finals, raws, p.stderr.String()
}

// TestNotificationsAreNeverAnswered: JSON-RPC 2.0 §4.1 says a notification
// (a request without an id) is never answered. One that asks for work (a
// 100,000-step sweep) is not run, so it cannot hold the only worker; one
// naming an unknown method, or with bad params, gets no -32601/-32602 with
// id null; each is logged on stderr. A cancel notification still works,
// and a describe notification does nothing (issue 18 item 4).
func TestNotificationsAreNeverAnswered(t *testing.T) {
	sweep := string(request(nil, "sweep-parameter", map[string]any{"model": twoBar("h"),
		"parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 100000}}}))
	sweep = strings.Replace(sweep, `"id":null,`, ``, 1)
	lines := []string{
		sweep,
		`{"jsonrpc":"2.0","method":"no-such-method"}`,
		`{"jsonrpc":"2.0","method":"solve","params":{"model":{}}}`,
		`{"jsonrpc":"2.0","method":"describe"}`,
		`{"jsonrpc":"2.0","method":"cancel","params":{"request":"nothing"}}`,
		`{"jsonrpc":"2.0","id":"after","method":"solve","params":{"model":` + mustJSON(twoBar(3)) + `}}`,
	}
	start := time.Now()
	finals, raws, stderr := transcriptOf(t, []string{"--jobs", "1"}, lines, nil)
	if len(finals) != 1 || len(finals[`"after"`]) != 1 || finals[`"after"`][0].Error != nil {
		t.Fatalf("want exactly one answer, the solve's; got %q", raws)
	}
	if d := time.Since(start); d > 20*time.Second {
		t.Errorf("the request after the sweep notification took %v: the notification ran", d)
	}
	for _, want := range []string{"asks for sweep-parameter", `"no-such-method"`, "asks for solve"} {
		if !strings.Contains(stderr, want) {
			t.Errorf("stderr lacks %q: %s", want, stderr)
		}
	}
}

// TestDuplicateIDForEveryMethod: a describe or cancel carrying the id of a
// request still in flight is refused with -32600 at /id, as any other
// method is, so no two responses share an id (issue 18 item 8).
func TestDuplicateIDForEveryMethod(t *testing.T) {
	sweep := string(request("x", "sweep-parameter", map[string]any{"model": twoBar("h"),
		"parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 100000}}}))
	var once sync.Once
	finals, _, _ := transcriptOf(t, []string{"--jobs", "1"}, []string{sweep}, func(p *process, raw []byte, m *wireMessage) {
		if m.Method == "progress" && string(m.Params.Request) == `"x"` {
			once.Do(func() {
				p.send([]byte(`{"jsonrpc":"2.0","id":"x","method":"describe"}`))
				p.send([]byte(`{"jsonrpc":"2.0","id":"x","method":"cancel","params":{"request":"x"}}`))
				p.send([]byte(`{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"x"}}`))
				p.closeInput()
			})
		}
	})
	got := finals[`"x"`]
	if len(got) != 3 {
		t.Fatalf("%d answers with id x, want 3 (two refusals and the cancelled sweep)", len(got))
	}
	refused := 0
	for _, m := range got {
		switch {
		case m.Error != nil && m.Error.Code == -32600 && len(m.Error.Data.Problems) > 0 && m.Error.Data.Problems[0].Path == "/id":
			refused++
		case m.Error != nil && m.Error.Code == -32000:
		default:
			t.Errorf("unexpected answer %+v", m)
		}
	}
	if refused != 2 {
		t.Errorf("%d refusals with -32600 at /id, want 2", refused)
	}
	if c := finals[`"c"`]; len(c) != 1 || string(c[0].Result) != `{"cancelled":true}` {
		t.Errorf("cancel: %+v", c)
	}
}

// TestShortErrorExcerpts: an error about a 100 kB name quotes a short
// excerpt, not the whole name (issue 22 item 4): a member whose end names
// a node that does not exist, the name 100,000 characters long.
func TestShortErrorExcerpts(t *testing.T) {
	name := strings.Repeat("n", 100000)
	model := twoBar(3)
	model["members"] = []any{map[string]any{"id": "AC", "ends": []string{"A", name}, "material": "steel", "section": "tube"}}
	line := string(request("long", "solve", map[string]any{"model": model}))
	finals, raws, _ := transcriptOf(t, nil, []string{line}, nil)
	got := finals[`"long"`]
	if len(got) != 1 || got[0].Error == nil || got[0].Error.Code != 1000 {
		t.Fatalf("want one invalid-model error (1000), got %.300q", raws)
	}
	if n := len(raws[len(raws)-1]); n > 2000 {
		t.Errorf("the error answer is %d bytes for a %d-character name; want a short excerpt", n, len(name))
	}
	if !strings.Contains(raws[len(raws)-1], "99947 characters]") { // 100,000 n, the quotes and comma, less the 56 kept
		t.Errorf("the answer does not say how much was left out: %.500s", raws[len(raws)-1])
	}
}

func mustJSON(v any) string {
	b, err := json.Marshal(v)
	if err != nil {
		panic(err)
	}
	return string(b)
}

// TestQueuedBytesBounded: requests waiting for a busy worker are bounded by
// bytes, not only by count (issue 18 item 2). With --jobs 1 busy on a
// sweep and --max-queued-bytes 8 MiB, 40 request lines of 4 MiB each are
// not all read: reading stops once the queue holds 8 MiB and the read-ahead
// path 16 MiB more (back-pressure through the pipe), so the host's writes
// block; every request is answered once the worker is free. Before the
// bound all 40 lines (160 MiB) were read into memory at once.
func TestQueuedBytesBounded(t *testing.T) {
	bin := buildGusset(t)
	var mu sync.Mutex
	answered := map[string]bool{}
	started := make(chan struct{})
	var once sync.Once
	p := startGusset(t, bin, []string{"serve", "--jobs", "1", "--max-queued-bytes", "8388608"}, func(raw []byte, m *wireMessage) {
		if m.Method == "progress" && string(m.Params.Request) == `"busy"` {
			once.Do(func() { close(started) })
		}
		if m.isFinal() {
			mu.Lock()
			answered[string(m.ID)] = true
			mu.Unlock()
		}
	})
	for _, id := range []string{"busy", "busy2"} {
		p.send(request(id, "sweep-parameter", map[string]any{"model": twoBar("h"), "steps": "summary",
			"parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 100000}}}))
	}
	<-started
	var sent atomic.Int32
	pad := strings.Repeat("p", 4<<20)
	go func() {
		for i := range 40 {
			p.send(request(i, "solve", map[string]any{"model": twoBar(3), "cases": []string{pad}}))
			sent.Add(1)
		}
		p.closeInput()
	}()
	// Wait until the writes stop getting through (no change for 2 s) or
	// all are through; the two 100,000-step sweeps keep the worker busy
	// meanwhile.
	n, last := sent.Load(), time.Now()
	for n < 40 && time.Since(last) < 2*time.Second {
		time.Sleep(100 * time.Millisecond)
		if m := sent.Load(); m != n {
			n, last = m, time.Now()
		}
	}
	mu.Lock()
	busyDone := answered[`"busy2"`]
	mu.Unlock()
	if busyDone {
		t.Fatal("the sweeps ended before the writes stopped; the test needs a longer busy worker")
	}
	t.Logf("lines of 4 MiB written while the worker was busy: %d of 40; peak RSS so far %.0f MiB", n, float64(p.peakRSS())/(1<<20))
	if n >= 40 || n > 10 {
		t.Errorf("%d lines of 4 MiB were read behind a busy worker; want reading to stop near 8 + 16 MiB", n)
	}
	if err, exited := p.waitWithin(180 * time.Second); !exited || err != nil {
		t.Fatalf("exit: %v (exited %v); stderr: %s", err, exited, p.stderr.String())
	}
	mu.Lock()
	defer mu.Unlock()
	if len(answered) != 42 {
		t.Errorf("%d requests answered, want 42", len(answered))
	}
}

// TestSignalsStopServing: SIGINT and SIGTERM stop the process promptly
// although its input stays open: the request in flight (a 100,000-step
// sweep) is answered with the cancelled error (-32000), the output ends
// with whole lines, and the exit status is the conventional 128 + the
// signal's number, 130 and 143 (issue 18 item 3).
func TestSignalsStopServing(t *testing.T) {
	for _, c := range []struct {
		sig  syscall.Signal
		code int
	}{{syscall.SIGINT, 130}, {syscall.SIGTERM, 143}} {
		t.Run(c.sig.String(), func(t *testing.T) {
			bin := buildGusset(t)
			started := make(chan struct{})
			var once sync.Once
			var final *wireMessage
			p := startGusset(t, bin, []string{"serve", "--jobs", "1"}, func(raw []byte, m *wireMessage) {
				if m.Method == "progress" {
					once.Do(func() { close(started) })
				}
				if m.isFinal() {
					mm := *m
					final = &mm
				}
			})
			p.send(request("long", "sweep-parameter", map[string]any{"model": twoBar("h"), "steps": "summary",
				"parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 100000}}}))
			<-started
			sent := time.Now()
			p.cmd.Process.Signal(c.sig)
			err, exited := p.waitWithin(20 * time.Second)
			if !exited {
				t.Fatal("the process did not exit after the signal")
			}
			var exit *exec.ExitError
			if !errors.As(err, &exit) || exit.ExitCode() != c.code {
				t.Errorf("exit %v, want status %d; stderr: %s", err, c.code, p.stderr.String())
			}
			if final == nil || final.Error == nil || final.Error.Code != -32000 {
				t.Errorf("the request in flight was answered %+v, want -32000", final)
			}
			for _, b := range p.bad {
				t.Errorf("bad output line: %s", b)
			}
			t.Logf("%v: exited %v after the signal", c.sig, time.Since(sent))
		})
	}
}

// TestBrokenOutputEndsSession: when the reader of the answers goes away
// during a streaming sweep, the process ends quietly (no death by
// SIGPIPE, exit status 0) with a clear line on stderr (issue 18 item 11).
func TestBrokenOutputEndsSession(t *testing.T) {
	bin := buildGusset(t)
	cmd := exec.Command(bin, "serve", "--jobs", "1")
	stdin, _ := cmd.StdinPipe()
	stdout, _ := cmd.StdoutPipe()
	var stderr strings.Builder
	cmd.Stderr = &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	stdin.Write(append(request("long", "sweep-parameter", map[string]any{"model": twoBar("h"),
		"parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 100000}}}), '\n'))
	buf := make([]byte, 4096)
	if _, err := io.ReadAtLeast(stdout, buf, 1); err != nil {
		t.Fatal(err)
	}
	stdout.Close() // the host stops reading
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	select {
	case err := <-done:
		if err != nil {
			t.Errorf("exit: %v (want status 0, not death by SIGPIPE); stderr: %s", err, stderr.String())
		}
	case <-time.After(20 * time.Second):
		cmd.Process.Kill()
		t.Fatal("the process went on after its output was closed")
	}
	if !strings.Contains(stderr.String(), "the output was closed") {
		t.Errorf("stderr: %q", stderr.String())
	}
	stdin.Close()
}

// TestBatchThroughProcess: JSON-RPC 2.0 §6 batches through `gusset serve`
// (issue 22 item 1). One batch holds a long sweep, a solve, a describe, a
// notification and a member that is not an object; the sweep's progress
// streams before the batch's array; a second batch reusing the sweep's id
// while it runs is refused with -32600 inside its own array; a cancel on a
// later line stops the sweep; an empty array gets one -32600 object and a
// batch of notifications gets nothing. The solve's member forces are
// checked against hand statics: two bars from (0,0) and (8,0) to (4,3)
// under 10 kN down, each N = −10/(2·3/5) = −25/3 kN (method of joints,
// from memory: any statics text).
func TestBatchThroughProcess(t *testing.T) {
	sweep := string(request("bs", "sweep-parameter", map[string]any{"model": twoBar("h"),
		"parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 100000}}}))
	solve := string(request("b1", "solve", map[string]any{"model": twoBar(3)}))
	notify := strings.Replace(solve, `"id":"b1",`, ``, 1)
	lines := []string{
		`[]`,
		`[` + notify + `,{"jsonrpc":"2.0","method":"describe"}]`,
		`[` + sweep + `,` + solve + `,{"jsonrpc":"2.0","id":"bd","method":"describe"},` + notify + `,7]`,
	}
	var mu sync.Mutex
	var order []string // "progress", or the raw array line, as they came
	var once sync.Once
	finals, raws, _ := transcriptOf(t, []string{"--jobs", "2"}, lines, func(p *process, raw []byte, m *wireMessage) {
		mu.Lock()
		defer mu.Unlock()
		if m.Method == "progress" && string(m.Params.Request) == `"bs"` {
			order = append(order, "progress")
			once.Do(func() {
				go func() {
					p.send([]byte(`[{"jsonrpc":"2.0","id":"bs","method":"describe"}]`))
					p.send([]byte(`{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"bs"}}`))
					p.closeInput()
				}()
			})
		} else if raw[0] == '[' && (len(order) == 0 || order[len(order)-1] != string(raw)) {
			order = append(order, string(raw))
		}
	})
	var arrays []string
	for _, r := range raws {
		if strings.HasPrefix(r, "[") && !slicesContains(arrays, r) {
			arrays = append(arrays, r)
		}
	}
	if len(arrays) != 2 {
		t.Fatalf("%d array lines, want 2 (the big batch and the refused duplicate; none for the notifications): %q", len(arrays), raws)
	}
	if len(order) == 0 || order[0] != "progress" {
		t.Errorf("the sweep's progress did not come before the batch's array: %.200q", order)
	}
	// The empty array's single -32600 object, and the non-object member's.
	nulls := finals["null"]
	if len(nulls) != 2 {
		t.Fatalf("%d null-id answers, want 2 (the empty batch, the member 7): %+v", len(nulls), nulls)
	}
	for _, m := range nulls {
		if m.Error == nil || m.Error.Code != -32600 {
			t.Errorf("null-id answer %+v, want -32600", m)
		}
	}
	bs := finals[`"bs"`]
	codes := map[int]int{}
	for _, m := range bs {
		if m.Error != nil {
			codes[m.Error.Code]++
		}
	}
	if len(bs) != 2 || codes[-32600] != 1 || codes[-32000] != 1 {
		t.Errorf("answers with id bs: %+v, want the duplicate refused (-32600) and the sweep cancelled (-32000)", bs)
	}
	if c := finals[`"c"`]; len(c) != 1 || string(c[0].Result) != `{"cancelled":true}` {
		t.Errorf("cancel: %+v", c)
	}
	if d := finals[`"bd"`]; len(d) != 1 || d[0].Error != nil || !strings.Contains(string(d[0].Result), `"methods"`) {
		t.Errorf("describe in a batch: %+v", d)
	}
	b1 := finals[`"b1"`]
	if len(b1) != 1 || b1[0].Error != nil {
		t.Fatalf("solve in a batch: %+v", b1)
	}
	var res struct {
		Cases []struct {
			AxialForces []float64 `json:"axial_forces"`
		} `json:"cases"`
	}
	if err := json.Unmarshal(b1[0].Result, &res); err != nil || len(res.Cases) != 1 || len(res.Cases[0].AxialForces) != 2 {
		t.Fatalf("solve result: %v %.300s", err, b1[0].Result)
	}
	for i, n := range res.Cases[0].AxialForces {
		if math.Abs(n-(-25.0/3)) > 1e-9*25/3 {
			t.Errorf("member %d: N = %v kN, want −25/3", i, n)
		}
	}
}

func slicesContains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
