package jsonrpc

import "sync"

// callOverhead is the bookkeeping a waiting request is counted with, in
// bytes, besides its line.
const callOverhead = 1 << 10

// waitQueue holds the requests read but not yet taken by a worker, in the
// order they were read. put blocks only when more than maxCount requests
// wait and their lines (with callOverhead each) total more than maxBytes:
// many small requests are read ahead, so the reader keeps reaching cancel
// and describe lines behind them, while memory stays bounded by the larger
// of the two limits.
type waitQueue struct {
	mu       sync.Mutex
	changed  sync.Cond
	calls    []*call
	sizes    []int
	head     int
	bytes    int
	closed   bool
	maxCount int
	maxBytes int
	maxTotal int // bytes waiting, whatever their count (max_queued_bytes)
}

func newWaitQueue(maxCount, maxBytes, maxTotal int) *waitQueue {
	q := &waitQueue{maxCount: maxCount, maxBytes: maxBytes, maxTotal: maxTotal}
	q.changed.L = &q.mu
	return q
}

// put appends c, whose line was size bytes, waiting while the queue is
// full: by count and read-ahead bytes together, or by its total bytes
// (unless it is empty, so that any one line fits).
func (q *waitQueue) put(c *call, size int) {
	size += callOverhead
	q.mu.Lock()
	defer q.mu.Unlock()
	for q.full(size) {
		q.changed.Wait()
	}
	q.calls = append(q.calls, c)
	q.sizes = append(q.sizes, size)
	q.bytes += size
	q.changed.Broadcast()
}

// full reports whether a line of size bytes (overhead included) must wait.
func (q *waitQueue) full(size int) bool {
	waiting := len(q.calls) - q.head
	return (waiting >= q.maxCount && q.bytes+size > q.maxBytes) || (waiting > 0 && q.bytes+size > q.maxTotal)
}

// fits reports whether a line of size bytes would be queued at once.
func (q *waitQueue) fits(size int) bool {
	q.mu.Lock()
	defer q.mu.Unlock()
	return !q.full(size + callOverhead)
}

// take removes and returns the oldest request, waiting for one; it returns
// nil once the queue is closed and empty.
func (q *waitQueue) take() *call {
	q.mu.Lock()
	defer q.mu.Unlock()
	for q.head == len(q.calls) && !q.closed {
		q.changed.Wait()
	}
	if q.head == len(q.calls) {
		return nil
	}
	c := q.calls[q.head]
	q.bytes -= q.sizes[q.head]
	q.calls[q.head] = nil
	q.head++
	if q.head == len(q.calls) { // empty: reuse the storage from the start
		q.calls, q.sizes, q.head = q.calls[:0], q.sizes[:0], 0
	} else if q.head > 1024 && 2*q.head > len(q.calls) {
		n := copy(q.calls, q.calls[q.head:])
		copy(q.sizes, q.sizes[q.head:])
		clear(q.calls[n:])
		q.calls, q.sizes, q.head = q.calls[:n], q.sizes[:n], 0
	}
	q.changed.Broadcast()
	return c
}

// close lets take return nil once the waiting requests are taken.
func (q *waitQueue) close() {
	q.mu.Lock()
	q.closed = true
	q.mu.Unlock()
	q.changed.Broadcast()
}
