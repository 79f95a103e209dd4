package jsonrpc

import (
	"fmt"
	"testing"
	"time"

	"gusset/protocol"
)

func TestWaitQueueOrderAndBackPressure(t *testing.T) {
	q := newWaitQueue(2, 3*callOverhead, 1<<30)
	calls := make([]*call, 4)
	for i := range calls {
		calls[i] = &call{key: fmt.Sprint(i)}
	}
	// Two calls fit by count, a third by bytes (3 overheads); a fourth
	// would exceed both.
	for _, c := range calls[:3] {
		q.put(c, 0)
	}
	put := make(chan struct{})
	go func() {
		q.put(calls[3], 0)
		close(put)
	}()
	select {
	case <-put:
		t.Fatal("put did not wait with both limits reached")
	case <-time.After(20 * time.Millisecond):
	}
	if got := q.take(); got != calls[0] {
		t.Fatalf("took %v, want the oldest", got.key)
	}
	<-put // taking one frees room
	q.close()
	for _, want := range []*call{calls[1], calls[2], calls[3]} {
		if got := q.take(); got != want {
			t.Fatalf("took %v, want %v", got.key, want.key)
		}
	}
	if got := q.take(); got != nil {
		t.Fatalf("took %v from a closed, empty queue", got.key)
	}
}

// TestCancelNotHeldUpBehindQueue keeps the only worker busy, queues more
// requests than max_queued behind it, and checks that a cancel sent after
// them is still read and answered, and stops the busy request.
func TestCancelNotHeldUpBehindQueue(t *testing.T) {
	p := startPipe(testServer(protocol.Limits{Workers: 1, MaxQueued: 2}))
	p.send(`{"jsonrpc":"2.0","id":"long","method":"slow"}`)
	for m := p.next(t); m.Method != "progress"; m = p.next(t) {
	}
	for i := range 50 {
		p.send(fmt.Sprintf(`{"jsonrpc":"2.0","id":%d,"method":"echo","params":{}}`, i))
	}
	p.send(`{"jsonrpc":"2.0","id":"d","method":"describe"}`)
	p.send(`{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"long"}}`)
	seen := map[string]bool{}
	for len(seen) < 53 {
		m := p.next(t)
		if m.Method == "progress" {
			continue
		}
		id := string(m.ID)
		if seen[id] {
			t.Fatalf("two answers for %s", id)
		}
		seen[id] = true
		if id == `"long"` && (m.Error == nil || m.Error.Code != protocol.CodeCancelled) {
			t.Errorf("long request: %+v", m)
		}
		if id == `"c"` && string(m.Result) != `{"cancelled":true}` {
			t.Errorf("cancel result %s", m.Result)
		}
	}
	p.in.Close()
	if err := <-p.done; err != nil {
		t.Fatal(err)
	}
}

// TestWaitQueueBoundsBytes: below max_queued requests, the queue still
// stops at max_queued_bytes of lines; an empty queue takes any one line.
func TestWaitQueueBoundsBytes(t *testing.T) {
	q := newWaitQueue(1000, 0, 10*callOverhead)
	big := &call{key: "big"}
	if !q.fits(50 * callOverhead) {
		t.Fatal("an empty queue refuses a line")
	}
	q.put(big, 50*callOverhead)
	if q.fits(0) {
		t.Fatal("a queue over its byte bound takes more")
	}
	put := make(chan struct{})
	go func() {
		q.put(&call{key: "small"}, 0)
		close(put)
	}()
	select {
	case <-put:
		t.Fatal("put did not wait with the byte bound reached")
	case <-time.After(20 * time.Millisecond):
	}
	if got := q.take(); got != big {
		t.Fatalf("took %v", got.key)
	}
	<-put
}
