package stiffness

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// parallel calls body(i) for every i in [0, count) on up to workers
// goroutines, the calling one among them, handing out indices in ascending
// order, and returns the error of the lowest index that failed (later
// indices are then skipped). Only the calling goroutine calls report, after
// each of its own calls, with the number of calls finished so far, so a
// Reporter that is not safe for concurrent use can be given. A panic in a
// helper goroutine is carried back and raised again in the caller.
func parallel(workers, count int, body func(i int) error, report func(done int)) error {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, count)
	errs := make([]error, count)
	var next, done atomic.Int64
	var failed atomic.Bool
	work := func(caller bool) {
		for !failed.Load() {
			i := int(next.Add(1)) - 1
			if i >= count {
				return
			}
			if err := body(i); err != nil {
				errs[i] = err
				failed.Store(true)
			}
			d := int(done.Add(1))
			if caller && report != nil {
				report(d)
			}
		}
	}
	var wg sync.WaitGroup
	var crash atomic.Value
	for range workers - 1 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer func() {
				if r := recover(); r != nil {
					crash.CompareAndSwap(nil, panicValue{r})
					failed.Store(true)
				}
			}()
			work(false)
		}()
	}
	work(true)
	wg.Wait()
	if p := crash.Load(); p != nil {
		panic(p.(panicValue).v)
	}
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}

// panicValue boxes a recovered value for atomic.Value, which needs one
// concrete type.
type panicValue struct{ v any }
