package main

import (
	"bytes"
	"encoding/json"
	"io"
	"sync"
)

// Where progress notifications go (--notifications).
const (
	notifyStdout = "stdout"
	notifyStderr = "stderr"
	notifyNone   = "none"
)

// outputRouter sits between the server and stdout. It sends progress
// notifications where --notifications says, and, when order is set, holds
// back each request's messages until every request before it in the file
// has been answered, so answers come out in file order. Messages it cannot
// pair with a request of the file pass straight through.
type outputRouter struct {
	mu     sync.Mutex
	out    io.Writer
	notify io.Writer // nil drops notifications
	// pending holds the partial line the server has written so far.
	pending []byte
	ordered bool
	slots   []slot
	byKey   map[string][]int // open slots by answer key, in file order
	next    int              // first slot not yet written out
	err     error
}

type slot struct {
	key      string
	held     [][]byte
	answered bool
}

func newOutputRouter(out, notify io.Writer, order []string) *outputRouter {
	r := &outputRouter{out: out, notify: notify}
	if order != nil {
		r.ordered = true
		r.byKey = map[string][]int{}
		for _, key := range order {
			if key == "" {
				continue // a notification gets no answer
			}
			r.byKey[key] = append(r.byKey[key], len(r.slots))
			r.slots = append(r.slots, slot{key: key})
		}
	}
	return r
}

// Write takes the server's output, which arrives in whole lines or in
// pieces of them.
func (r *outputRouter) Write(p []byte) (int, error) {
	r.mu.Lock()
	defer r.mu.Unlock()
	r.pending = append(r.pending, p...)
	for {
		i := bytes.IndexByte(r.pending, '\n')
		if i < 0 {
			break
		}
		line := append([]byte(nil), r.pending[:i+1]...)
		r.pending = r.pending[i+1:]
		r.route(line)
	}
	if len(r.pending) == 0 {
		r.pending = r.pending[:0:0]
	}
	return len(p), r.err
}

func (r *outputRouter) route(line []byte) {
	var msg struct {
		ID     json.RawMessage `json:"id"`
		Method string          `json:"method"`
		Params struct {
			Request json.RawMessage `json:"request"`
		} `json:"params"`
	}
	_ = json.Unmarshal(line, &msg)
	if msg.Method != "" && msg.ID == nil {
		if r.notify == nil {
			return
		}
		if r.notify != r.out || !r.ordered {
			r.write(r.notify, line)
			return
		}
		if k, ok := r.open(compactKey(msg.Params.Request)); ok && k != r.next {
			r.slots[k].held = append(r.slots[k].held, line)
			return
		}
		r.write(r.out, line)
		return
	}
	if !r.ordered {
		r.write(r.out, line)
		return
	}
	key := "null"
	if msg.ID != nil {
		key = compactKey(msg.ID)
	}
	k, ok := r.open(key)
	if !ok {
		r.write(r.out, line)
		return
	}
	r.byKey[key] = r.byKey[key][1:]
	r.slots[k].held = append(r.slots[k].held, line)
	r.slots[k].answered = true
	r.flush()
}

// open returns the first slot of key still waiting for its answer.
func (r *outputRouter) open(key string) (int, bool) {
	if list := r.byKey[key]; len(list) > 0 {
		return list[0], true
	}
	return 0, false
}

// flush writes out the answered slots at the head of the file order.
func (r *outputRouter) flush() {
	for r.next < len(r.slots) && r.slots[r.next].answered {
		for _, l := range r.slots[r.next].held {
			r.write(r.out, l)
		}
		r.slots[r.next].held = nil
		r.next++
	}
	// The head's own notifications go out as they come.
	if r.next < len(r.slots) {
		for _, l := range r.slots[r.next].held {
			r.write(r.out, l)
		}
		r.slots[r.next].held = nil
	}
}

// Close writes whatever is still held (requests the server never answered
// keep their place) and any unterminated last line.
func (r *outputRouter) Close() error {
	r.mu.Lock()
	defer r.mu.Unlock()
	for ; r.next < len(r.slots); r.next++ {
		for _, l := range r.slots[r.next].held {
			r.write(r.out, l)
		}
	}
	if len(r.pending) > 0 {
		r.write(r.out, r.pending)
	}
	return r.err
}

func (r *outputRouter) write(w io.Writer, line []byte) {
	if r.err != nil && w == r.out {
		return
	}
	if _, err := w.Write(line); err != nil && w == r.out {
		r.err = err
	}
}
