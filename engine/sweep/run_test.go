package sweep

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"sync"
	"testing"
	"testing/synctest"
	"time"

	"gonum.org/v1/gonum/floats/scalar"
)

// recorder is a progress.Recorder of steps that keeps every report.
type recorder struct {
	mu      sync.Mutex
	stages  []string
	done    []int
	total   []int
	partial []Step
}

func (r *recorder) Record(stage string, done, total int, partial Step) {
	r.mu.Lock()
	defer r.mu.Unlock()
	r.stages = append(r.stages, stage)
	r.done = append(r.done, done)
	r.total = append(r.total, total)
	r.partial = append(r.partial, partial)
}

// jittery evaluates f after a random delay, so that steps finish out of
// order, and fails where f's value is not finite (a stand-in for a
// degenerate geometry).
func jittery(f func(x []float64) float64) Evaluator {
	var mu sync.Mutex
	rng := rand.New(rand.NewPCG(5, 5))
	return func(ctx context.Context, x []float64) (map[string]float64, error) {
		mu.Lock()
		d := time.Duration(rng.IntN(300)) * time.Microsecond
		mu.Unlock()
		time.Sleep(d)
		v := f(x)
		if math.IsInf(v, 0) {
			return nil, fmt.Errorf("degenerate geometry at %v", x)
		}
		return map[string]float64{"f": v, "x0": x[0]}, nil
	}
}

// TestDeterminism checks that the final result, failures included, is
// byte-identical in JSON for one and four workers (the design's rule that
// identical requests give identical results), and that every step streams
// exactly once with done counting up by one.
func TestDeterminism(t *testing.T) {
	xs, _ := Range(-2, 2, 41)
	ys, _ := Range(-1, 3, 9)
	f := func(x []float64) float64 {
		if x[0] == 0 {
			return math.Inf(1)
		}
		return math.Pow(1-x[0], 2) + 100*math.Pow(x[1]-x[0]*x[0], 2)
	}
	var out [2][]byte
	for k, workers := range []int{1, 4} {
		rec := &recorder{}
		plan := Plan{Axes: []Axis{{"x", xs}, {"y", ys}}, Workers: workers, Objective: "f", Tolerance: 1e-8, MaxEvaluations: 1000}
		res, err := Run(context.Background(), plan, jittery(f), rec)
		if err != nil {
			t.Fatal(err)
		}
		if out[k], err = json.Marshal(res); err != nil {
			t.Fatal(err)
		}
		steps := 0
		for i, s := range rec.stages {
			if s == StageStep {
				steps++
				if rec.done[i] != steps || rec.total[i] != len(xs)*len(ys) {
					t.Fatalf("workers=%d: report %d has done=%d total=%d", workers, i, rec.done[i], rec.total[i])
				}
			}
		}
		if steps != len(xs)*len(ys) || res.Failed != len(ys) {
			t.Errorf("workers=%d: %d step reports, %d failed", workers, steps, res.Failed)
		}
		for i, s := range res.Steps {
			if s.Index != i {
				t.Fatalf("step %d has index %d", i, s.Index)
			}
			if s.Values[0] == 0 && !strings.Contains(s.Message, "degenerate") {
				t.Errorf("step %d at x=0 should fail in place, got %+v", i, s)
			}
		}
	}
	if string(out[0]) != string(out[1]) {
		t.Error("results differ between 1 and 4 workers")
	}
}

// TestFailuresKeepGoing checks that failing steps, whether by an error or
// a non-finite metric, are reported in place and the others computed.
func TestFailuresKeepGoing(t *testing.T) {
	values, _ := Range(-1, 1, 5) // −1, −0.5, 0, 0.5, 1
	eval := func(_ context.Context, x []float64) (map[string]float64, error) {
		switch {
		case x[0] == 0:
			return nil, errors.New("members coincide")
		case x[0] < 0:
			return map[string]float64{"g": math.Sqrt(x[0])}, nil
		}
		return map[string]float64{"g": math.Sqrt(x[0])}, nil
	}
	res, err := Run(context.Background(), Plan{Axes: []Axis{{"t", values}}, Workers: 2}, eval, nil)
	if err != nil {
		t.Fatal(err)
	}
	wantFail := []bool{true, true, true, false, false}
	for i, s := range res.Steps {
		if s.Failed() != wantFail[i] || (s.Failed() && (s.Err == nil || s.Metrics != nil)) {
			t.Errorf("step %d: %+v", i, s)
		}
	}
	if res.Failed != 3 || !strings.Contains(res.Steps[2].Message, "coincide") || !errors.Is(res.Steps[0].Err, errNotFinite) {
		t.Errorf("failed=%d, messages %q %q", res.Failed, res.Steps[2].Message, res.Steps[0].Message)
	}
	// √0.5 and √1, the square roots (trivially external).
	if !scalar.EqualWithinAbsOrRel(res.Steps[3].Metrics["g"], math.Sqrt2/2, 0, 1e-15) || res.Steps[4].Metrics["g"] != 1 {
		t.Errorf("metrics %v %v", res.Steps[3].Metrics, res.Steps[4].Metrics)
	}
}

// TestCancellation checks that cancelling stops launching steps, that Run
// returns the context's error once the steps in flight end, within one
// step's time, and that the steps done so far had already streamed. It
// runs in a synctest bubble, so the clock is the bubble's fake one: the
// times are exact and the test does not depend on the machine's load.
func TestCancellation(t *testing.T) {
	synctest.Test(t, func(t *testing.T) {
		const stepTime = 50 * time.Millisecond
		values, _ := Range(0, 1, 1000)
		ctx, cancel := context.WithCancel(context.Background())
		var mu sync.Mutex
		started := 0
		eval := func(ctx context.Context, x []float64) (map[string]float64, error) {
			mu.Lock()
			started++
			mu.Unlock()
			time.Sleep(stepTime)
			return map[string]float64{"x": x[0]}, nil
		}
		rec := &recorder{}
		var cancelled time.Time
		go func() {
			time.Sleep(5 * stepTime)
			cancelled = time.Now()
			cancel()
		}()
		res, err := Run(ctx, Plan{Axes: []Axis{{"x", values}}, Workers: 2}, eval, rec)
		returned := time.Now()
		if !errors.Is(err, context.Canceled) || res != nil {
			t.Fatalf("got %v, %v", res, err)
		}
		if late := returned.Sub(cancelled); late > stepTime {
			t.Errorf("returned %v after cancel; one step takes %v", late, stepTime)
		}
		rec.mu.Lock()
		reports := len(rec.stages)
		rec.mu.Unlock()
		mu.Lock()
		defer mu.Unlock()
		// Two workers for five step times start 10 steps, or 12 when the
		// steps due at the cancel's instant start before it lands.
		if started > 12 || reports != started || reports < 2 {
			t.Errorf("started %d steps, streamed %d", started, reports)
		}
	})
}

// TestSharding checks that the shards of a sweep together hold each step
// of the whole sweep exactly once, with the same global index and result.
func TestSharding(t *testing.T) {
	xs, _ := Range(0, 1, 7)
	ys, _ := Range(5, 6, 5)
	eval := func(_ context.Context, x []float64) (map[string]float64, error) {
		return map[string]float64{"p": x[0] * x[1]}, nil
	}
	axes := []Axis{{"x", xs}, {"y", ys}}
	whole, err := Run(context.Background(), Plan{Axes: axes, Workers: 2}, eval, nil)
	if err != nil {
		t.Fatal(err)
	}
	seen := make([]int, len(whole.Steps))
	for index := 0; index < 3; index++ {
		part, err := Run(context.Background(), Plan{Axes: axes, Workers: 2, Shard: Shard{index, 3}}, eval, nil)
		if err != nil {
			t.Fatal(err)
		}
		if part.Total != whole.Total {
			t.Errorf("shard %d: total %d, want %d", index, part.Total, whole.Total)
		}
		for _, s := range part.Steps {
			seen[s.Index]++
			w := whole.Steps[s.Index]
			if s.Index%3 != index || s.Values[0] != w.Values[0] || s.Values[1] != w.Values[1] || s.Metrics["p"] != w.Metrics["p"] {
				t.Errorf("shard %d: step %+v, whole %+v", index, s, w)
			}
		}
	}
	for i, n := range seen {
		if n != 1 {
			t.Errorf("step %d appears %d times across the shards", i, n)
		}
	}
	// The grid index rule: i·len(ys) + j.
	if s := whole.Steps[3*len(ys)+2]; s.Values[0] != xs[3] || s.Values[1] != ys[2] {
		t.Errorf("step %d has values %v", s.Index, s.Values)
	}
}

// TestPanic checks that an evaluator's panic reaches the caller's
// goroutine, where a server's recover can catch it.
func TestPanic(t *testing.T) {
	values, _ := Range(0, 1, 50)
	eval := func(_ context.Context, x []float64) (map[string]float64, error) {
		if x[0] > 0.5 {
			panic("index out of range")
		}
		return map[string]float64{}, nil
	}
	defer func() {
		r := recover()
		if s, ok := r.(string); !ok || !strings.Contains(s, "index out of range") {
			t.Errorf("recovered %v", r)
		}
	}()
	_, _ = Run(context.Background(), Plan{Axes: []Axis{{"x", values}}, Workers: 2}, eval, nil)
	t.Error("Run returned")
}
