package main

import (
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"strings"
	"sync"
	"testing"
	"time"

	"gusset/engine/model/modelgen"
	"gusset/protocol"
)

// loadRequests is the number of requests the load test pipelines into one
// process, at each worker count.
const loadRequests = 10_000

// loadPeakRSSBound is the generous bound on the process's peak resident
// memory over a whole load run: the largest model in the mix needs a few
// MiB, and nothing may grow with the number of requests.
const loadPeakRSSBound = 256 << 20

// plannedRequest is one line of the load test and what must answer it.
type plannedRequest struct {
	id     string // "" for a line whose answer has a null id
	line   []byte
	code   int  // 0: a result; otherwise the error code
	cancel bool // a cancel request: its result says whether its target was stopped
	target string
	// longTarget marks a long sweep: the test waits for its first progress
	// notification and then cancels it, so it is stopped mid-way.
	longTarget bool
}

// loadMix builds the requests: mostly small models of every registered
// method, some large ones, invalid requests of several kinds, cancels sent
// blind right after their target (the race decides whether the target is
// stopped), and a few long sweeps cancelled mid-way.
func loadMix(t *testing.T, methods map[string]bool, n int) []plannedRequest {
	t.Helper()
	params := func(v any) string {
		b, err := json.Marshal(v)
		if err != nil {
			t.Fatal(err)
		}
		return string(b)
	}
	type template struct {
		method, params string
		code           int
	}
	rng := rand.New(rand.NewPCG(9, 9))
	// Small requests are mostly the cheapest solve, as a host's
	// interactive traffic is; every method appears.
	twoBarSolve := params(map[string]any{"model": twoBar(3)})
	small := []template{
		{"solve", twoBarSolve, 0},
		{"solve", params(map[string]any{"model": twoBar("h+1")}), 0},
		{"solve", twoBarSolve, 0},
		{"solve", params(protocol.SolveParams{Model: wireModel(modelgen.Pratt(4, 16, 2, 10))}), 0},
		{"solve", twoBarSolve, 0},
		{"load-path", params(map[string]any{"model": twoBar(3), "sizing": map[string]any{"shape": "tube", "diameter_to_thickness": 30}}), 0},
		{"solve", twoBarSolve, 0},
		{"sweep-parameter", params(map[string]any{"model": twoBar("h"), "parameters": []any{map[string]any{"name": "h", "values": []float64{2, 3, 4}}}}), 0},
		{"solve", twoBarSolve, 0},
		{"describe", "{}", 0},
	}
	if methods["reciprocate"] {
		small = append(small, template{"reciprocate", params(protocol.ReciprocateParams{Model: wireModel(modelgen.Pratt(3, 12, 2, 10))}), 0})
	}
	if methods["optimise-layout"] {
		small = append(small, template{"optimise-layout", params(layoutParams(1)), 0})
	}
	large := []template{
		{"solve", params(protocol.SolveParams{Model: wireModel(modelgen.GridTruss2D(40, 40))}), 0},
		{"solve", params(protocol.SolveParams{Model: wireModel(modelgen.SpaceTruss3D(10, 10))}), 0},
		{"load-path", params(protocol.LoadPathParams{Model: wireModel(modelgen.RandomPlanarTruss(rng, 1500))}), 0},
		{"sweep-parameter", params(map[string]any{"model": twoBar("h"), "parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 400}},
			"objective": map[string]any{"metric": "load_path"}}), 0},
	}
	if methods["reciprocate"] {
		large = append(large, template{"reciprocate", params(protocol.ReciprocateParams{Model: wireModel(modelgen.Pratt(150, 600, 4, 10))}), 0})
	}
	if methods["optimise-layout"] {
		large = append(large, template{"optimise-layout", params(layoutParams(6)), 0})
	}
	dangling := twoBar(3)
	dangling["members"].([]any)[1].(map[string]any)["ends"] = []string{"B", "Z"}
	mechanism := twoBar(3)
	mechanism["supports"] = []any{map[string]any{"node": "A", "fix": []string{"x", "y"}}}
	invalid := []template{
		{"solve", params(map[string]any{"model": dangling}), 1000},
		{"solve", params(map[string]any{"model": twoBar("1/(h-3)")}), 1001},
		{"solve", params(map[string]any{"model": mechanism}), 1002},
		{"solve", params(map[string]any{"model": twoBar(3), "cases": []string{"wind"}}), 1009},
		{"solve", params(map[string]any{"model": twoBar(true)}), protocol.CodeInvalidParams},
		{"load-path", params(map[string]any{"model": twoBar(3), "forces": []float64{1}}), protocol.CodeInvalidParams},
		{"sweep-parameter", params(map[string]any{"model": twoBar("h"), "parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 1_000_000}}}), protocol.CodeLimitExceeded},
		{"analyse", "{}", protocol.CodeMethodNotFound},
	}
	longSweep := params(map[string]any{"model": twoBar("h"), "parameters": []any{map[string]any{"name": "h", "from": 1, "to": 5, "count": 100_000}},
		"steps": "summary"})

	line := func(id, method, params string) []byte {
		return fmt.Appendf(nil, `{"jsonrpc":"2.0","id":%q,"method":%q,"params":%s}`, id, method, params)
	}
	var plan []plannedRequest
	add := func(tpl template) string {
		id := fmt.Sprintf("r%d", len(plan))
		plan = append(plan, plannedRequest{id: id, line: line(id, tpl.method, tpl.params), code: tpl.code})
		return id
	}
	for len(plan) < n {
		k := len(plan)
		switch {
		case k%2000 == 1000:
			id := fmt.Sprintf("r%d", k)
			plan = append(plan, plannedRequest{id: id, line: line(id, "sweep-parameter", longSweep), code: protocol.CodeCancelled, longTarget: true})
			cid := fmt.Sprintf("r%d", len(plan))
			plan = append(plan, plannedRequest{id: cid, line: line(cid, "cancel", fmt.Sprintf(`{"request":%q}`, id)), cancel: true, target: id})
		case k%1000 == 500:
			add(large[(k/1000)%len(large)])
		case k%97 == 3:
			plan = append(plan, plannedRequest{line: []byte(`{"jsonrpc":"2.0","id":"broken","method":`), code: protocol.CodeParseError})
		case k%50 == 7:
			add(invalid[(k/50)%len(invalid)])
		case k%50 == 21:
			target := add(small[(k/50)%len(small)])
			cid := fmt.Sprintf("r%d", len(plan))
			plan = append(plan, plannedRequest{id: cid, line: line(cid, "cancel", fmt.Sprintf(`{"request":%q}`, target)), cancel: true, target: target})
		default:
			add(small[k%len(small)])
		}
	}
	return plan
}

// TestLoadPipelined pipelines 10,000 mixed requests into one `gusset serve`
// with two workers and again with one, and checks the promises of the
// protocol (README, "Protocol reference"; JSON-RPC 2.0 §5): every request
// with an id gets exactly one final response with that id, with a result or
// the expected error code; every line that is not JSON gets one parse error
// with a null id; a cancelled request ends with -32000 exactly when its
// cancel said so; no progress notification follows its request's final
// response; every output line is one JSON-RPC object in UTF-8; the process
// exits 0; and its peak memory stays under a fixed bound.
func TestLoadPipelined(t *testing.T) {
	bin := buildGusset(t)
	methods := registeredMethods(t, bin)
	plan := loadMix(t, methods, loadRequests)
	for _, jobs := range []string{"2", "1"} {
		t.Run("jobs="+jobs, func(t *testing.T) {
			runLoad(t, bin, jobs, plan)
		})
	}
}

func runLoad(t *testing.T, bin, jobs string, plan []plannedRequest) {
	var (
		mu          sync.Mutex
		finals      = map[string][]wireMessage{}
		nullFinals  []wireMessage
		notes       = map[string]int{}
		lateNotes   []string
		progressed  = map[string]chan struct{}{}
		answered    = map[string]chan struct{}{}
		notifyFirst = func(m map[string]chan struct{}, id string) {
			if ch, ok := m[id]; ok {
				close(ch)
				delete(m, id)
			}
		}
	)
	// Maps of messages are keyed by the id as raw JSON; plan ids are bare.
	waiters := map[string][2]chan struct{}{}
	for _, r := range plan {
		if r.longTarget {
			key := fmt.Sprintf("%q", r.id)
			progressed[key] = make(chan struct{})
			answered[key] = make(chan struct{})
			waiters[r.id] = [2]chan struct{}{progressed[key], answered[key]}
		}
	}
	start := time.Now()
	p := startGusset(t, bin, []string{"serve", "--jobs", jobs}, func(raw []byte, m *wireMessage) {
		mu.Lock()
		defer mu.Unlock()
		if !m.isFinal() {
			id := string(m.Params.Request)
			notes[id]++
			if len(finals[id]) > 0 {
				lateNotes = append(lateNotes, string(raw))
			}
			notifyFirst(progressed, id)
			return
		}
		if string(m.ID) == "null" {
			nullFinals = append(nullFinals, *m)
			return
		}
		id := string(m.ID)
		finals[id] = append(finals[id], *m)
		notifyFirst(answered, id)
	})
	writeErr := make(chan error, 1)
	go func() {
		defer p.closeInput()
		for _, r := range plan {
			if r.cancel && waiters[r.target][0] != nil {
				// Cancel a long sweep only once it runs, so that it is
				// stopped mid-way and not before it starts.
				w := waiters[r.target]
				select {
				case <-w[0]:
				case <-w[1]:
				case <-time.After(60 * time.Second):
					writeErr <- fmt.Errorf("no progress from %s within 60 s", r.target)
					return
				}
			}
			if err := p.send(r.line); err != nil {
				writeErr <- err
				return
			}
		}
		writeErr <- nil
	}()
	err, exited := p.waitWithin(120 * time.Second)
	elapsed := time.Since(start)
	if !exited {
		t.Fatal("the process did not finish within 120 s")
	}
	if err != nil {
		t.Errorf("exit: %v; stderr: %.2000s", err, p.stderr.String())
	}
	if err := <-writeErr; err != nil {
		t.Fatalf("writing requests: %v", err)
	}
	rss := p.peakRSS()
	t.Logf("jobs=%s: %d requests, %d output lines, %d notifications, in %v (%.0f requests/s); peak RSS %.1f MiB",
		jobs, len(plan), p.lines, sumValues(notes), elapsed.Round(time.Millisecond), float64(len(plan))/elapsed.Seconds(), float64(rss)/(1<<20))
	if rss > loadPeakRSSBound {
		t.Errorf("peak RSS %d MiB, over the bound of %d MiB", rss>>20, loadPeakRSSBound>>20)
	}
	for i, b := range p.bad {
		if i == 5 {
			t.Errorf("and %d more bad lines", len(p.bad)-5)
			break
		}
		t.Errorf("bad output line: %s", b)
	}
	for i, l := range lateNotes {
		if i == 5 {
			break
		}
		t.Errorf("notification after its final response: %.300s", l)
	}

	cancelled := map[string]bool{}
	for _, r := range plan {
		if !r.cancel {
			continue
		}
		got := finals[fmt.Sprintf("%q", r.id)]
		if len(got) != 1 || got[0].Error != nil {
			continue // reported below
		}
		var res protocol.CancelResult
		if err := json.Unmarshal(got[0].Result, &res); err != nil {
			t.Errorf("cancel %s: result %s", r.id, got[0].Result)
		}
		cancelled[r.target] = res.Cancelled
	}
	var parseErrors, stopped, raced int
	var problems []string
	report := func(format string, args ...any) {
		if len(problems) < 20 {
			problems = append(problems, fmt.Sprintf(format, args...))
		}
	}
	for _, r := range plan {
		if r.id == "" {
			parseErrors++
			continue
		}
		got := finals[fmt.Sprintf("%q", r.id)]
		if len(got) != 1 {
			report("%s: %d final responses, want exactly 1", r.id, len(got))
			continue
		}
		g := got[0]
		wantCode := r.code
		stoppedByCancel := cancelled[r.id]
		if stoppedByCancel {
			wantCode = protocol.CodeCancelled
		} else if r.longTarget {
			report("%s: its cancel found it no longer in flight", r.id)
			continue
		}
		switch {
		case wantCode == 0 && g.Error != nil:
			report("%s: error %d (%s), want a result", r.id, g.Error.Code, g.Error.Message)
		case wantCode != 0 && g.Error == nil:
			if stoppedByCancel {
				// The cancel said it stopped the request, but the result
				// was already on its way (see the report of issue 9).
				raced++
				continue
			}
			report("%s: a result, want error %d", r.id, wantCode)
		case wantCode != 0 && g.Error.Code != wantCode:
			report("%s: error %d (%s), want %d", r.id, g.Error.Code, g.Error.Message, wantCode)
		}
		if stoppedByCancel {
			stopped++
		}
		if r.longTarget && notes[fmt.Sprintf("%q", r.id)] == 0 {
			report("%s: a long sweep cancelled without any progress", r.id)
		}
	}
	if len(nullFinals) != parseErrors {
		report("%d responses with a null id, want %d (one per line that is not JSON)", len(nullFinals), parseErrors)
	}
	for _, m := range nullFinals {
		if m.Error == nil || m.Error.Code != protocol.CodeParseError {
			report("a null-id response that is not a parse error: %+v", m)
			break
		}
	}
	for id := range finals {
		if !strings.HasPrefix(id, `"r`) {
			report("a response to id %s, which was never sent", id)
		}
	}
	for _, pr := range problems {
		t.Error(pr)
	}
	if raced > 0 {
		t.Errorf("%d requests whose cancel answered {\"cancelled\":true} still ended with a result", raced)
	}
	t.Logf("jobs=%s: %d requests stopped by cancel, %d parse errors", jobs, stopped, parseErrors)
}

func sumValues(m map[string]int) int {
	total := 0
	for _, v := range m {
		total += v
	}
	return total
}
