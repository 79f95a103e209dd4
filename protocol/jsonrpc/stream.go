package jsonrpc

import (
	"time"

	"gusset/protocol"
)

// stream sends a call's progress notifications. Notifications without a
// partial result start only once the request has run for progressDelay (a
// small request gets no chatter), and then come at most one per stage
// every progressInterval unless they start or finish the stage. Partial
// results are always sent.
type stream struct {
	c  *conn
	cl *call
}

const (
	progressDelay    = 50 * time.Millisecond
	progressInterval = 100 * time.Millisecond
)

func (st *stream) Progress(stage string, done, total int, partial any) {
	cl := st.cl
	p := &protocol.Progress{Request: cl.id, Stage: stage, Done: done, Total: total, Partial: partial}
	cl.sendMu.Lock()
	if !st.c.due(cl, stage, done, total, partial != nil) {
		cl.sendMu.Unlock()
		return
	}
	if cl.id != nil {
		if b, err := encode(protocol.Notification{JSONRPC: "2.0", Method: "progress", Params: p}); err == nil {
			st.c.w.send(b)
		}
	}
	cl.sendMu.Unlock()
	if st.c.s.OnProgress != nil {
		st.c.s.OnProgress(p)
	}
}

// due reports whether a notification is to be sent now, and if so records
// when, under the state lock.
func (c *conn) due(cl *call, stage string, done, total int, partial bool) bool {
	c.mu.Lock()
	defer c.mu.Unlock()
	if cl.done {
		return false
	}
	now := time.Now()
	if !partial && now.Sub(cl.start) < progressDelay {
		return false
	}
	if !partial && done != total && done != 0 {
		if last, ok := cl.last[stage]; ok && now.Sub(last) < progressInterval {
			return false
		}
	}
	if cl.last == nil {
		cl.last = map[string]time.Time{}
	}
	cl.last[stage] = now
	return true
}
