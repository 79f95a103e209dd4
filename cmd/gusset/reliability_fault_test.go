package main

import (
	"fmt"
	"slices"
	"sync"
	"syscall"
	"testing"
	"time"

	"gusset/engine/model/modelgen"
	"gusset/protocol"
)

// collector gathers the final responses and notification counts of one
// process, keyed by the raw JSON id.
type collector struct {
	mu     sync.Mutex
	finals map[string]wireMessage
	dups   []string
	notes  map[string]int
	late   []string
}

func newCollector() *collector {
	return &collector{finals: map[string]wireMessage{}, notes: map[string]int{}}
}

func (c *collector) onLine(raw []byte, m *wireMessage) {
	c.mu.Lock()
	defer c.mu.Unlock()
	if !m.isFinal() {
		id := string(m.Params.Request)
		c.notes[id]++
		if _, done := c.finals[id]; done {
			c.late = append(c.late, string(raw))
		}
		return
	}
	if _, dup := c.finals[string(m.ID)]; dup {
		c.dups = append(c.dups, string(m.ID))
	}
	c.finals[string(m.ID)] = *m
}

func (c *collector) get(id string) (wireMessage, bool) {
	c.mu.Lock()
	defer c.mu.Unlock()
	m, ok := c.finals[fmt.Sprintf("%q", id)]
	return m, ok
}

// checkStream reports the stream-level faults a collector saw.
func (c *collector) checkStream(t *testing.T, p *process) {
	t.Helper()
	for _, b := range p.bad {
		t.Errorf("bad output line: %s", b)
	}
	for _, id := range c.dups {
		t.Errorf("two final responses with id %s", id)
	}
	for _, l := range c.late {
		t.Errorf("notification after its final response: %.200s", l)
	}
}

// sweepRequest is a sweep of the two-bar truss's apex height over count
// steps, reporting only a summary at the end.
func sweepRequest(id string, count int) []byte {
	return request(id, "sweep-parameter", map[string]any{"model": twoBar("h"), "steps": "summary",
		"parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": count}}})
}

// TestFaults drives the real binary through the faults a host can cause:
// its input closing mid-stream, its output closing, a request running past
// the time limit, and models at and over the size limits. The expected
// behaviour is the README's ("the process ends cleanly at end of input
// after answering and flushing the work in flight"; "exceeding a limit is
// an error, never a crash or an unbounded wait") with the codes of its
// error table.
func TestFaults(t *testing.T) {
	bin := buildGusset(t)
	methods := registeredMethods(t, bin)

	t.Run("stdin-closed-mid-stream", func(t *testing.T) {
		// The input ends while a long sweep, large solves and small
		// requests are in flight or queued: every one is answered with
		// its result, then the process exits 0.
		c := newCollector()
		p := startGusset(t, bin, []string{"serve", "--jobs", "2"}, c.onLine)
		var ids []string
		send := func(id string, line []byte) {
			ids = append(ids, id)
			if err := p.send(line); err != nil {
				t.Fatal(err)
			}
		}
		send("sweep", sweepRequest("sweep", 20_000))
		send("grid", request("grid", "solve", protocol.SolveParams{Model: wireModel(modelgen.GridTruss2D(30, 30))}))
		for i := range 50 {
			id := fmt.Sprintf("small-%d", i)
			send(id, request(id, "solve", map[string]any{"model": twoBar(3)}))
		}
		send("space", request("space", "solve", protocol.SolveParams{Model: wireModel(modelgen.SpaceTruss3D(8, 8))}))
		p.closeInput()
		err, exited := p.waitWithin(60 * time.Second)
		if !exited {
			t.Fatal("the process did not exit within 60 s of the end of its input")
		}
		if err != nil {
			t.Errorf("exit: %v (want status 0); stderr: %s", err, p.stderr.String())
		}
		c.checkStream(t, p)
		for _, id := range ids {
			m, ok := c.get(id)
			switch {
			case !ok:
				t.Errorf("%s: no answer", id)
			case m.Error != nil:
				t.Errorf("%s: error %d (%s), want a result", id, m.Error.Code, m.Error.Message)
			}
		}
	})

	t.Run("stdout-closed", func(t *testing.T) {
		// The host closes its end of stdout while a long sweep streams:
		// the process must not hang, whatever the host does next.
		p := startGusset(t, bin, []string{"serve", "--jobs", "2"}, nil)
		if err := p.send(sweepRequest("sweep", 100_000)); err != nil {
			t.Fatal(err)
		}
		time.Sleep(100 * time.Millisecond)
		p.stdout.Close()
		for i := range 100 {
			if p.send(request(i, "solve", map[string]any{"model": twoBar(3)})) != nil {
				break // the process is gone: the pipe is broken
			}
		}
		start := time.Now()
		p.closeInput()
		err, exited := p.waitWithin(10 * time.Second)
		if !exited {
			t.Fatal("the process still ran 10 s after its output was closed and its input ended")
		}
		status := "exit 0"
		if err != nil {
			status = err.Error()
		}
		if ws, ok := p.cmd.ProcessState.Sys().(syscall.WaitStatus); ok && ws.Signaled() && ws.Signal() != syscall.SIGPIPE {
			t.Errorf("killed by %v, want SIGPIPE or an exit", ws.Signal())
		}
		t.Logf("after its output was closed the process ended (%s) %v after its input ended", status, time.Since(start).Round(time.Millisecond))
	})

	t.Run("stdout-closed-input-open", func(t *testing.T) {
		// As above, but the host keeps stdin open and sends nothing more:
		// the first write to the closed output must end the process.
		p := startGusset(t, bin, []string{"serve", "--jobs", "2"}, nil)
		p.stdout.Close()
		if err := p.send(sweepRequest("sweep", 1000)); err != nil {
			t.Fatal(err)
		}
		err, exited := p.waitWithin(10 * time.Second)
		if !exited {
			t.Fatal("the process still ran 10 s after writing to a closed output")
		}
		t.Logf("ended with %v", err)
	})

	t.Run("time-limit", func(t *testing.T) {
		// A sweep of 100,000 steps runs far longer than 0.5 s and must
		// end with -32004; the small requests sent after it are answered
		// with results by the other worker.
		c := newCollector()
		p := startGusset(t, bin, []string{"serve", "--jobs", "2", "--time-limit", "0.5"}, c.onLine)
		start := time.Now()
		p.send(sweepRequest("long", 100_000))
		for i := range 20 {
			p.send(request(fmt.Sprintf("small-%d", i), "solve", map[string]any{"model": twoBar(3)}))
		}
		p.closeInput()
		if err, exited := p.waitWithin(60 * time.Second); !exited || err != nil {
			t.Fatalf("exit %v (exited %v); stderr: %s", err, exited, p.stderr.String())
		}
		c.checkStream(t, p)
		m, ok := c.get("long")
		if !ok || m.Error == nil || m.Error.Code != protocol.CodeTimeLimit {
			t.Errorf("long sweep: %+v, want error -32004", m.Error)
		}
		if elapsed := time.Since(start); elapsed > 20*time.Second {
			t.Errorf("the stopped sweep still took %v", elapsed)
		}
		for i := range 20 {
			if m, ok := c.get(fmt.Sprintf("small-%d", i)); !ok || m.Error != nil {
				t.Errorf("small-%d: %+v, want a result", i, m.Error)
			}
		}
	})

	t.Run("time-limit-counts-running-time", func(t *testing.T) {
		// With one worker, a request queued behind a long one must not
		// use up its own time limit while it waits: the limit is "wall
		// time allowed per request" (protocol.Limits), and a queued
		// request has not started. The small solve takes well under the
		// limit once it runs.
		c := newCollector()
		p := startGusset(t, bin, []string{"serve", "--jobs", "1", "--time-limit", "0.5"}, c.onLine)
		p.send(sweepRequest("long", 100_000))
		p.send(request("queued", "solve", map[string]any{"model": twoBar(3)}))
		p.closeInput()
		if err, exited := p.waitWithin(60 * time.Second); !exited || err != nil {
			t.Fatalf("exit %v (exited %v)", err, exited)
		}
		if m, ok := c.get("long"); !ok || m.Error == nil || m.Error.Code != protocol.CodeTimeLimit {
			t.Errorf("long sweep: %+v, want error -32004", m.Error)
		}
		if m, ok := c.get("queued"); !ok || m.Error != nil {
			t.Errorf("the request queued behind the long one: %+v, want a result", m.Error)
		}
	})

	t.Run("size-limits", func(t *testing.T) {
		// A Pratt truss of 10 panels has 20 nodes and 37 members
		// (modelgen.Pratt: 2·panels nodes, 4·panels − 3 members). With the
		// limits set to exactly that it must succeed; one more node or
		// one more member fails with -32001 pointing at the array.
		const maxNodes, maxMembers = 20, 37
		atLimit := wireModel(modelgen.Pratt(10, 40, 4, 10))
		overNodes := wireModel(modelgen.Pratt(10, 40, 4, 10))
		overNodes.Nodes = append(overNodes.Nodes, protocol.Node{ID: "spare", At: []protocol.Number{{Value: 20}, {Value: 9}}})
		overMembers := wireModel(modelgen.Pratt(10, 40, 4, 10))
		extra := overMembers.Members[0]
		extra.ID, extra.Ends = "extra", []string{overMembers.Nodes[0].ID, overMembers.Nodes[len(overMembers.Nodes)-1].ID}
		overMembers.Members = append(overMembers.Members, extra)
		if len(atLimit.Nodes) != maxNodes || len(atLimit.Members) != maxMembers || len(overMembers.Nodes) != maxNodes {
			t.Fatalf("generated model has %d nodes and %d members", len(atLimit.Nodes), len(atLimit.Members))
		}
		type limitCase struct {
			id, method string
			params     any
			code       int
			path       string
		}
		var cases []limitCase
		for _, method := range []string{"solve", "load-path", "sweep-parameter", "reciprocate"} {
			if !methods[method] {
				continue
			}
			withModel := func(m protocol.Model) any {
				p := map[string]any{"model": m}
				if method == "sweep-parameter" {
					// The swept parameter scales the elastic modulus: a
					// parameter no expression reads is refused.
					m.Parameters = map[string]float64{"k": 1}
					m.Materials = slices.Clone(m.Materials)
					m.Materials[0].ElasticModulus = protocol.Number{Expr: fmt.Sprintf("%g*k", m.Materials[0].ElasticModulus.Value), IsExpr: true}
					p["model"] = m
					p["parameters"] = []any{map[string]any{"name": "k", "values": []float64{1, 2}}}
				}
				return p
			}
			cases = append(cases,
				limitCase{method + "-at", method, withModel(atLimit), 0, ""},
				limitCase{method + "-nodes", method, withModel(overNodes), protocol.CodeLimitExceeded, "/params/model/nodes"},
				limitCase{method + "-members", method, withModel(overMembers), protocol.CodeLimitExceeded, "/params/model/members"})
		}
		c := newCollector()
		p := startGusset(t, bin, []string{"serve", "--jobs", "2", "--max-nodes", fmt.Sprint(maxNodes), "--max-members", fmt.Sprint(maxMembers)}, c.onLine)
		for _, lc := range cases {
			p.send(request(lc.id, lc.method, lc.params))
		}
		p.closeInput()
		if err, exited := p.waitWithin(60 * time.Second); !exited || err != nil {
			t.Fatalf("exit %v (exited %v)", err, exited)
		}
		c.checkStream(t, p)
		for _, lc := range cases {
			m, ok := c.get(lc.id)
			switch {
			case !ok:
				t.Errorf("%s: no answer", lc.id)
			case lc.code == 0 && m.Error != nil:
				t.Errorf("%s: error %d (%s), want a result", lc.id, m.Error.Code, m.Error.Message)
			case lc.code != 0 && (m.Error == nil || m.Error.Code != lc.code):
				t.Errorf("%s: %+v, want error %d", lc.id, m.Error, lc.code)
			case lc.code != 0 && !hasProblemAt(m.Error, lc.path):
				t.Errorf("%s: problems %+v, want one at %s", lc.id, m.Error.Data.Problems, lc.path)
			}
		}
	})
}

func hasProblemAt(e *protocol.Error, path string) bool {
	if e == nil || e.Data == nil {
		return false
	}
	for _, p := range e.Data.Problems {
		if p.Path == path {
			return true
		}
	}
	return false
}
