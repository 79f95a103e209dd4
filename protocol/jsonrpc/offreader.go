package jsonrpc

import "gusset/protocol"

// Lines admitted off the reader.
//
// A large line's envelope is parsed on its own goroutine, so that the
// reader goes on to the lines behind it (a cancel behind a 46 MiB request
// is answered at once, not after the parse). Order is kept by a chain of
// links, one per line admitted off the reader: a line enters the in-flight
// table only after the line before it has (so duplicate ids are judged in
// the order read, and a cancel for an id still being parsed finds it), and
// enters the wait queue only after the line before it has (so workers take
// requests in the order read). While the chain is not empty, later
// requests for work join it too; describe, and a cancel whose target is
// already in flight, are answered at once.

// link is one line admitted off the reader.
type link struct {
	registered chan struct{} // closed once the line is in the table, answered or refused
	queued     chan struct{} // closed once the line is in the wait queue (or needs none)
}

// pendingLines accounts for the lines in the chain (guarded by conn.mu).
// Small lines may wait while they total less than read_ahead_bytes and
// number fewer than max_queued; a large line may start only when no other
// large line is pending or their total stays under read_ahead_bytes. Memory
// held by the chain is thus bounded by about twice read_ahead_bytes plus
// one line.
type pendingLines struct {
	lines, smallBytes, bigBytes, big int
}

// idle reports whether no line is pending off the reader, so the next one
// can be admitted on the reader itself.
func (c *conn) idle() bool {
	if c.tail == nil {
		return true
	}
	select {
	case <-c.tail.queued:
		c.tail = nil
		return true
	default:
		return false
	}
}

// later admits a line (or a member of batch b) off the reader: parse
// yields its call (parsing a large line there), which is then admitted
// after the line before it. The reader waits first while the chain is
// full.
func (c *conn) later(size int, b *batch, parse func() (*call, *protocol.Response)) {
	c.waitRoom(size)
	prev, l := c.tail, &link{registered: make(chan struct{}), queued: make(chan struct{})}
	c.tail = l
	c.async.Add(1)
	go func() {
		defer c.async.Done()
		defer c.leave(size)
		cl, resp := parse()
		if prev != nil {
			<-prev.registered
		}
		queue := c.dispatch(cl, resp, b)
		close(l.registered)
		if prev != nil {
			<-prev.queued
		}
		if queue {
			c.queue.put(cl, size)
		}
		close(l.queued)
	}()
}

// dispatch acts on a line admitted off the reader once the lines before it
// are in the table, and reports whether its call is to be queued; b is
// the batch it came in, or nil.
func (c *conn) dispatch(cl *call, resp *protocol.Response, b *batch) bool {
	switch {
	case resp != nil:
		c.reply(b, resp)
	case c.unanswered(cl), c.duplicate(cl):
	case cl.method == protocol.MethodDescribe:
		c.reply(b, &protocol.Response{JSONRPC: "2.0", ID: cl.id, Result: c.s.describeResult(c.limits)})
	case cl.method == protocol.MethodCancel:
		resp, _, stop := c.cancel(cl)
		if cl.id != nil {
			c.reply(b, resp)
		}
		stop()
	default:
		return c.admit(cl)
	}
	return false
}

// waitRoom blocks the reader while a line of size bytes does not fit the
// chain's bounds (see pendingLines), and then counts it in.
func (c *conn) waitRoom(size int) {
	c.mu.Lock()
	defer c.mu.Unlock()
	p := &c.pending
	for p.lines > 0 && !c.fits(size) {
		c.room.Wait()
	}
	p.lines++
	if size >= bigLine {
		p.big++
		p.bigBytes += size
	} else {
		p.smallBytes += size
	}
}

// fits reports whether a line of size bytes may join a non-empty chain.
func (c *conn) fits(size int) bool {
	p := &c.pending
	if p.lines >= c.limits.MaxQueued {
		return false
	}
	if size >= bigLine {
		return p.big == 0 || p.bigBytes+size <= c.limits.ReadAheadBytes
	}
	return p.smallBytes+size <= c.limits.ReadAheadBytes
}

// leave counts a line out of the chain.
func (c *conn) leave(size int) {
	c.mu.Lock()
	p := &c.pending
	p.lines--
	if size >= bigLine {
		p.big--
		p.bigBytes -= size
	} else {
		p.smallBytes -= size
	}
	c.mu.Unlock()
	c.room.Broadcast()
}
