package jsonrpc

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"sync"
	"time"

	"gusset/protocol"
)

// call is one request read from the input.
type call struct {
	id     json.RawMessage // nil for a notification
	key    string          // the compacted id, the in-flight table's key
	method string
	params json.RawMessage
	// refused says why a notification failed; it is logged, not answered.
	refused string
	// batch collects the final response when the call came in a batch;
	// nil for a call on a line of its own.
	batch  *batch
	ctx    context.Context
	cancel context.CancelCauseFunc

	// sendMu orders the call's messages: a progress notification is
	// written whole before the final response is queued.
	sendMu sync.Mutex

	// Guarded by conn.mu.
	done bool
	// stopped is set by a cancel that found the call still running; the
	// call is then answered with the cancelled error whatever its handler
	// returned, so the cancel's answer and the call's agree.
	stopped bool
	start   time.Time
	last    map[string]time.Time
}

// conn is one session: one input, one output, the workers and the state of
// the requests in flight.
type conn struct {
	s       *Server
	limits  protocol.Limits
	ctx     context.Context
	stopAll context.CancelCauseFunc
	w       *writer
	queue   *waitQueue
	workers sync.WaitGroup
	// async counts the goroutines that parse large lines and admit lines
	// off the reader (see offreader.go).
	async sync.WaitGroup
	// tail is the last line admitted off the reader, nil when none; only
	// the reader goroutine touches it.
	tail *link
	// inMu is held while the reader handles a line; inputClosed, set under
	// it, makes the reader stop before its next line.
	inMu        sync.Mutex
	inputClosed bool

	// mu is the state lock; room is signalled when off-reader lines finish.
	mu       sync.Mutex
	room     sync.Cond
	inFlight map[string]*call
	failures int
	pending  pendingLines
}

func newConn(ctx context.Context, s *Server, out io.Writer) *conn {
	c := &conn{s: s, limits: s.Limits.WithDefaults(), inFlight: map[string]*call{}}
	c.ctx, c.stopAll = context.WithCancelCause(ctx)
	c.room.L = &c.mu
	c.w = newWriter(out, func(err error) { c.stopAll(fmt.Errorf("output failed: %w", err)) })
	go c.w.loop()
	c.queue = newWaitQueue(c.limits.MaxQueued, c.limits.ReadAheadBytes, c.limits.MaxQueuedBytes)
	return c
}

// startWorkers starts the pool that runs queued calls.
func (c *conn) startWorkers() {
	for i := 0; i < c.limits.Workers; i++ {
		c.workers.Add(1)
		go func() {
			defer c.workers.Done()
			for cl := c.queue.take(); cl != nil; cl = c.queue.take() {
				c.finish(cl, c.run(cl))
			}
		}()
	}
}

// takeParams returns the call's params and forgets them: they alias the
// request's line, which would otherwise stay live through the whole of
// the work (the in-flight table and the stream hold the call), when the
// handler needs them only to decode (28 MB on a 270,000-member model).
// Only the worker that runs the call reads its params.
func (cl *call) takeParams() json.RawMessage {
	params := cl.params
	cl.params = nil
	return params
}

// closeInput stops the reader before its next line, waiting for the line
// it handles now, if any.
func (c *conn) closeInput() {
	c.inMu.Lock()
	c.inputClosed = true
	c.inMu.Unlock()
}

// close waits for every line read to be answered and the output flushed.
func (c *conn) close() (failures int, err error) {
	c.async.Wait()
	c.queue.close()
	c.workers.Wait()
	err = c.w.close()
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.failures, err
}

// admit records a call for work in the in-flight table and reports whether
// it is to be queued; a refused call (the server stopping, or its id
// already in flight) is answered here.
func (c *conn) admit(cl *call) bool {
	if c.ctx.Err() != nil {
		c.reply(cl.batch, errorResponse(cl.id, protocol.NewError(protocol.CodeShuttingDown, "shutting down", "The server is stopping and takes no new work.")))
		return false
	}
	cl.ctx, cl.cancel = context.WithCancelCause(c.ctx)
	if cl.id == nil {
		return true
	}
	c.mu.Lock()
	_, busy := c.inFlight[cl.key]
	if !busy {
		c.inFlight[cl.key] = cl
	}
	c.mu.Unlock()
	if busy {
		cl.cancel(nil)
		c.reply(cl.batch, errorResponse(cl.id, idInUse()))
	}
	return !busy
}

func idInUse() *protocol.Error {
	return protocol.NewError(protocol.CodeInvalidRequest, "invalid request",
		"Another request with this id is still in flight; ids must be unique among requests in flight.",
		protocol.Problem{Path: "/id", Message: "id already in use"})
}

// duplicate answers a describe or cancel whose id is that of a request in
// flight with -32600, as admit answers any other method, so that no two
// responses share an id.
func (c *conn) duplicate(cl *call) bool {
	if cl.id == nil || (cl.method != protocol.MethodDescribe && cl.method != protocol.MethodCancel) {
		return false
	}
	c.mu.Lock()
	_, busy := c.inFlight[cl.key]
	c.mu.Unlock()
	if busy {
		c.reply(cl.batch, errorResponse(cl.id, idInUse()))
	}
	return busy
}

// unanswered handles the notifications (requests without an id) that get
// no response, as JSON-RPC 2.0 §4.1 requires of every notification: one
// that failed, and one asking for work, which is not run (nothing could
// stop it, and no one would see its result); both are logged on stderr.
// A cancel notification still stops its target; a describe one does
// nothing.
func (c *conn) unanswered(cl *call) bool {
	if cl.id != nil {
		return false
	}
	switch {
	case cl.refused != "":
		c.s.logf("a notification (a request without an id) for %q was not answered: %s", cl.method, cl.refused)
	case cl.method == protocol.MethodCancel:
		return false
	case cl.method != protocol.MethodDescribe:
		c.s.logf("a notification (a request without an id) asks for %s: work runs only for requests with an id, so it was not run", cl.method)
	}
	return true
}

// finish marks a call done, removes it from the table and sends its final
// response (a notification's is dropped). A call stopped by a cancel is
// answered with the cancelled error.
func (c *conn) finish(cl *call, resp *protocol.Response) {
	cl.sendMu.Lock()
	c.mu.Lock()
	if cl.stopped {
		resp = errorResponse(cl.id, protocol.NewError(protocol.CodeCancelled, "cancelled", "The request was cancelled by a cancel request."))
	}
	cl.done = true
	if c.inFlight[cl.key] == cl {
		delete(c.inFlight, cl.key)
	}
	c.mu.Unlock()
	cl.sendMu.Unlock()
	cl.cancel(nil)
	if cl.id != nil {
		c.reply(cl.batch, resp)
	}
}

// respond counts a failure and sends a final response on a line of its
// own.
func (c *conn) respond(resp *protocol.Response) { c.reply(nil, resp) }

// account encodes a final response, counts it if it is an error and shows
// it to OnResponse; it returns the encoded response, or with a sink the
// text not yet streamed to it (see marshalResponseTo).
func (c *conn) account(resp *protocol.Response, sink partSink) (line []byte, streamed bool) {
	// Encoded first: a result that cannot be encoded becomes an internal
	// error, which counts and is what OnResponse sees.
	line, streamed = marshalResponseTo(resp, sink)
	if resp.Error != nil {
		c.mu.Lock()
		c.failures++
		c.mu.Unlock()
	}
	if c.s.OnResponse != nil {
		c.s.OnResponse(resp)
	}
	return line, streamed
}

// cancel answers a cancel request: it marks the target stopped if it is
// in flight, and the caller runs stop once the answer is sent, so that
// the answer goes out before the stopped request's own (JSON-RPC leaves
// the order of independent responses open; hosts read it this way).
// found is false when the target is not in the table, so that a caller
// whose earlier lines are still being admitted can look again later.
func (c *conn) cancel(cl *call) (resp *protocol.Response, found bool, stop func()) {
	stop = func() {}
	var p protocol.CancelParams
	if err := json.Unmarshal(cl.params, &p); err != nil || len(p.Request) == 0 {
		return errorResponse(cl.id, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
			`cancel needs {"request": <id of the request to cancel>}.`,
			protocol.Problem{Path: "/params/request", Message: "expected the id of a request in flight"})), true, stop
	}
	key := compactID(p.Request)
	stopped := false
	c.mu.Lock()
	target := c.inFlight[key]
	if target != nil && !target.done {
		target.stopped, stopped = true, true
		stop = func() { target.cancel(errCancelledByHost) }
	}
	c.mu.Unlock()
	return &protocol.Response{JSONRPC: "2.0", ID: cl.id, Result: protocol.CancelResult{Cancelled: stopped}}, target != nil, stop
}
