package main

import (
	"runtime"
	"runtime/debug"
	"testing"
	"time"
)

// TestGCPercentFollowsLiveHeap: the collector keeps gcPercent over a small
// live heap and goes to largeHeapGCPercent once the live heap passes
// largeHeap, then back when it is freed (adaptGC, run after collections).
func TestGCPercentFollowsLiveHeap(t *testing.T) {
	if gcPercentFor(largeHeap-1) != gcPercent || gcPercentFor(largeHeap) != largeHeapGCPercent {
		t.Fatalf("gcPercentFor: %d below the threshold, %d at it", gcPercentFor(largeHeap-1), gcPercentFor(largeHeap))
	}
	t.Setenv("GOGC", "")
	defer debug.SetGCPercent(debug.SetGCPercent(100))
	tuneMemory()
	percent := func() int { p := debug.SetGCPercent(-1); debug.SetGCPercent(p); return p }
	await := func(want int) {
		t.Helper()
		for range 100 {
			runtime.GC() // the finalizer runs after a collection
			time.Sleep(10 * time.Millisecond)
			if percent() == want {
				return
			}
		}
		t.Fatalf("GC percent %d, want %d", percent(), want)
	}
	hold := make([]byte, 2*largeHeap)
	for i := range hold {
		hold[i] = 1
	}
	await(largeHeapGCPercent)
	runtime.KeepAlive(hold)
	hold = nil
	await(gcPercent)
}
