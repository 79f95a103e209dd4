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
//
// A message is a whole line, or a line streamed in parts (see lineParts):
// the writer then writes the parts as the encoder hands them over and
// nothing else until the line ends, so no other message falls inside it.
type writer struct {
	out     *bufio.Writer
	lines   chan outMessage
	done    chan struct{}
	onError func(error)
	once    sync.Once
	err     error
}

// outMessage is a line to write: line whole, or, when parts is not nil, the
// parts that make it up, in order, until parts is closed; each part
// written goes back on free for the encoder to reuse.
type outMessage struct {
	line  []byte
	parts chan []byte
	free  chan []byte
}

func newWriter(out io.Writer, onError func(error)) *writer {
	return &writer{out: bufio.NewWriterSize(out, 64<<10), lines: make(chan outMessage, 256), done: make(chan struct{}), onError: onError}
}

func (w *writer) send(line []byte) { w.lines <- outMessage{line: line} }

func (w *writer) loop() {
	defer close(w.done)
	for m := range w.lines {
		if m.parts != nil {
			w.writeParts(m)
		} else if w.err == nil {
			w.out.Write(m.line)
		}
		if w.err != nil {
			continue
		}
		w.out.WriteByte('\n')
		if len(w.lines) == 0 {
			w.fail(w.out.Flush())
		}
	}
	w.fail(w.out.Flush())
}

// writeParts writes a streamed line's parts as they come (or, after a
// write error, takes and drops them, so the encoder never waits for
// good), returning each buffer for reuse.
func (w *writer) writeParts(m outMessage) {
	for p := range m.parts {
		if w.err == nil {
			if _, err := w.out.Write(p); err != nil {
				w.fail(err)
			}
		}
		select {
		case m.free <- p[:0]:
		default:
		}
	}
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

// streamChunk is the size from which a final response on a line of its
// own is written as it is encoded, in parts of about this size: a large
// result (the 33 MB of a 270,000-member solve) is then never held whole,
// and its writing overlaps its encoding. Smaller responses are encoded
// whole and written as before. A variable only so that tests can stream
// small responses (export_test.go).
var streamChunk = 512 << 10

// lineParts is the sink of one line streamed to the writer (a partSink):
// the first part sent queues the line's message behind the messages sent
// before it; finish sends the rest and ends the line. A few buffers go
// round between the encoder and the writer, so the line is never held
// whole.
type lineParts struct {
	w     *writer
	parts chan []byte
	free  chan []byte
}

func (w *writer) newLine() *lineParts { return &lineParts{w: w} }

func (l *lineParts) send(p []byte) {
	if l.parts == nil {
		l.parts, l.free = make(chan []byte, 2), make(chan []byte, 4)
		l.w.lines <- outMessage{parts: l.parts, free: l.free}
	}
	l.parts <- p
}

func (l *lineParts) buffer() []byte {
	select {
	case b := <-l.free:
		return b
	default:
		return make([]byte, 0, streamChunk+streamChunk/4)
	}
}

// finish writes rest as the line's last part (or the whole line, when
// nothing was sent before) and ends the line.
func (l *lineParts) finish(rest []byte) {
	if l.parts == nil {
		l.w.send(rest)
		return
	}
	if len(rest) > 0 {
		l.parts <- rest
	}
	close(l.parts)
}
