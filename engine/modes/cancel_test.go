package modes

import (
	"context"
	"errors"
	"sync"
	"testing"
)

// cancelAt cancels its context when a stage is first reported, and
// records the stages seen.
type cancelAt struct {
	mu     sync.Mutex
	stage  string
	cancel context.CancelFunc
	seen   map[string]int
}

func (c *cancelAt) Progress(stage string, done, total int, partial any) {
	c.mu.Lock()
	defer c.mu.Unlock()
	c.seen[stage]++
	if stage == c.stage && c.cancel != nil {
		c.cancel()
	}
}

// TestCancelAndProgress checks that both analyses report their stages
// ("assembling", "factorising", "lanczos") and stop with the context's
// error when it is cancelled inside the Lanczos process.
func TestCancelAndProgress(t *testing.T) {
	for _, kind := range []Kind{KindBuckling, KindVibration} {
		t.Run(string(kind), func(t *testing.T) {
			run := func(ctx context.Context, rep *cancelAt) error {
				var err error
				if kind == KindBuckling {
					_, err = Buckling(ctx, frame2D(3, 4), Options{Count: 4, Reporter: rep})
				} else {
					_, err = Vibration(ctx, frame2D(3, 4), Options{Count: 4, Reporter: rep})
				}
				return err
			}
			rep := &cancelAt{seen: map[string]int{}}
			if err := run(context.Background(), rep); err != nil {
				t.Fatal(err)
			}
			for _, stage := range []string{"assembling", "factorising", "lanczos"} {
				if rep.seen[stage] == 0 {
					t.Errorf("stage %q never reported (%v)", stage, rep.seen)
				}
			}
			ctx, cancel := context.WithCancel(context.Background())
			defer cancel()
			if err := run(ctx, &cancelAt{stage: "lanczos", cancel: cancel, seen: map[string]int{}}); !errors.Is(err, context.Canceled) {
				t.Errorf("cancelled in the Lanczos process: %v, want context.Canceled", err)
			}
		})
	}
}
