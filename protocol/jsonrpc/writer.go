package jsonrpc

import (
	"bufio"
	"io"
	"sync"
)

// writer owns the output: every message goes through its channel and is
// written whole, followed by a newline. It flushes whenever the channel is
// empty, so a host sees each message without delay. After a write error it
// drops further messages and reports the error once.
type writer struct {
	out     *bufio.Writer
	lines   chan []byte
	done    chan struct{}
	onError func(error)
	once    sync.Once
	err     error
}

func newWriter(out io.Writer, onError func(error)) *writer {
	return &writer{out: bufio.NewWriterSize(out, 64<<10), lines: make(chan []byte, 256), done: make(chan struct{}), onError: onError}
}

func (w *writer) send(line []byte) { w.lines <- line }

func (w *writer) loop() {
	defer close(w.done)
	for line := range w.lines {
		if w.err != nil {
			continue
		}
		w.out.Write(line)
		w.out.WriteByte('\n')
		if len(w.lines) == 0 {
			w.fail(w.out.Flush())
		}
	}
	w.fail(w.out.Flush())
}

func (w *writer) fail(err error) {
	if err != nil && w.err == nil {
		w.err = err
		w.once.Do(func() { w.onError(err) })
	}
}

// close stops the writer after the messages sent so far and returns the
// first write error.
func (w *writer) close() error {
	close(w.lines)
	<-w.done
	return w.err
}
