package jsonrpc

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"unicode/utf8"

	"gusset/protocol"
)

// bigLine is the line length from which the envelope is parsed off the
// reader: parsing costs about 18 ns a byte (a 1 MiB line about 20 ms), so
// a line below it holds the reader up for no longer than that.
const bigLine = 1 << 20

// read reads lines until end of input and hands each to handle.
func (c *conn) read(in io.Reader) {
	reader := bufio.NewReaderSize(in, 64<<10)
	for first := true; ; first = false {
		line, tooLong, err := readLine(reader, c.limits.MaxLineBytes)
		if first {
			// A byte-order mark before the first line (files saved by some
			// editors) is not part of the JSON text (RFC 8259 §8.1).
			line = bytes.TrimPrefix(line, []byte("\xef\xbb\xbf"))
		}
		if tooLong {
			c.respond(errorResponse(nil, protocol.NewError(protocol.CodeParseError, "parse error",
				fmt.Sprintf("The line is longer than the line size limit of %d bytes; it was skipped. Send smaller requests or start the server with a larger --max-line-bytes.", c.limits.MaxLineBytes))))
		} else if len(bytes.TrimSpace(line)) > 0 && !c.handleOpen(line) {
			return
		}
		if err != nil {
			if !errors.Is(err, io.EOF) {
				c.s.logf("reading input: %v", err)
			}
			return
		}
	}
}

// handle parses one line and acts on it: parse errors are answered,
// describe is answered at once, cancel stops its target, and other
// requests are admitted and queued for the workers, in the order read. A
// large line is parsed off the reader (see offreader.go), so that the
// lines behind it are read meanwhile.
func (c *conn) handle(line []byte) {
	if isBatch(line) {
		c.handleBatch(line)
		return
	}
	if len(line) >= bigLine {
		c.later(len(line), nil, func() (*call, *protocol.Response) { return c.s.parse(line) })
		return
	}
	cl, resp := c.s.parse(line)
	c.handleParsed(cl, resp, len(line), nil)
}

// handleParsed acts on one parsed request of size bytes (a line, or a
// member of batch b, nil for a line of its own).
func (c *conn) handleParsed(cl *call, resp *protocol.Response, size int, b *batch) {
	switch {
	case resp != nil:
		c.reply(b, resp)
	case c.unanswered(cl), c.duplicate(cl):
	case cl.method == protocol.MethodDescribe:
		c.reply(b, &protocol.Response{JSONRPC: "2.0", ID: cl.id, Result: c.s.describeResult(c.limits)})
	case cl.method == protocol.MethodCancel:
		resp, found, stop := c.cancel(cl)
		if !found && !c.idle() {
			// The target may be a line still being parsed or admitted
			// off the reader: look again once those before it are in.
			c.later(size, b, func() (*call, *protocol.Response) { return cl, nil })
		} else if cl.id != nil {
			c.reply(b, resp)
		}
		stop()
	case c.idle() && c.queue.fits(size):
		if c.admit(cl) {
			c.queue.put(cl, size)
		}
	default:
		c.later(size, b, func() (*call, *protocol.Response) { return cl, nil })
	}
}

// handleOpen handles a line unless the input was closed meanwhile, and
// reports whether it was open.
func (c *conn) handleOpen(line []byte) bool {
	c.inMu.Lock()
	defer c.inMu.Unlock()
	if c.inputClosed {
		return false
	}
	c.handle(line)
	return true
}

// readLine reads one line without its newline. A line longer than limit is
// consumed and reported as tooLong with no data. The line is returned in
// a buffer of its own, allocated once at its exact size: a line longer
// than the reader's buffer is gathered in blocks of lineBlock bytes first
// (growing one buffer by append would allocate about five times the line,
// since append grows large slices by a quarter, and touch as many fresh
// pages).
func readLine(r *bufio.Reader, limit int) (line []byte, tooLong bool, err error) {
	chunk, err := r.ReadSlice('\n')
	if err != bufio.ErrBufferFull {
		return lineOf(limit, err, chunk)
	}
	var blocks [][]byte
	block := make([]byte, 0, lineBlock)
	size := 0
	for {
		size += len(chunk)
		if size > limit+2 { // allow for \r\n
			tooLong, blocks, block = true, nil, block[:0]
		}
		for !tooLong && len(chunk) > 0 {
			if len(block) == cap(block) {
				blocks = append(blocks, block)
				block = make([]byte, 0, lineBlock)
			}
			n := min(len(chunk), cap(block)-len(block))
			block, chunk = append(block, chunk[:n]...), chunk[n:]
		}
		if err != bufio.ErrBufferFull {
			break
		}
		chunk, err = r.ReadSlice('\n')
	}
	if tooLong {
		return nil, true, err
	}
	return lineOf(limit, err, append(blocks, block)...)
}

// lineBlock is the size of the blocks readLine gathers a long line in.
const lineBlock = 1 << 20

// lineOf joins parts into one new buffer of the exact size without the
// line's ending (its trailing \r and \n bytes, which may straddle two
// parts), or reports tooLong when that exceeds limit.
func lineOf(limit int, err error, parts ...[]byte) ([]byte, bool, error) {
	size := 0
	for _, p := range parts {
		size += len(p)
	}
	for k := len(parts) - 1; k >= 0; k-- {
		p, i := parts[k], len(parts[k])
		for i > 0 && (p[i-1] == '\n' || p[i-1] == '\r') {
			i--
		}
		size -= len(p) - i
		if i > 0 {
			break
		}
	}
	if size > limit {
		return nil, true, err
	}
	line := make([]byte, 0, size)
	for _, p := range parts {
		line = append(line, p[:min(len(p), size-len(line))]...)
	}
	return line, false, err
}

// parse decodes the envelope. It returns either a call or an error
// response. The one decode of the line checks its syntax too: a syntax
// error is a parse error, any other JSON value an invalid request.
func (s *Server) parse(line []byte) (*call, *protocol.Response) {
	if !utf8.Valid(line) {
		return nil, errorResponse(nil, protocol.NewError(protocol.CodeParseError, "parse error",
			"The line is not valid UTF-8. Send requests as UTF-8 JSON, one per line."))
	}
	// Members are taken by their exact names (RFC 8259 §4): decoding into a
	// struct would also accept "ID" or "Method". The params stay raw, and
	// alias the line: ObjectMembers checks the syntax in one pass without
	// copying, and leaves what it declines to encoding/json.
	members, ok := protocol.ObjectMembers(line)
	var err error
	if !ok {
		err = json.Unmarshal(line, &members)
	}
	if err == nil {
		cl, resp := s.request(members)
		if _, hasID := members["id"]; !hasID && resp != nil && resp.Error.Code != protocol.CodeInvalidRequest {
			// A well-formed notification that fails is not answered.
			var method string
			_ = json.Unmarshal(members["method"], &method)
			return &call{method: method, refused: resp.Error.Message}, nil
		}
		return cl, resp
	}
	var syntax *json.SyntaxError
	if errors.As(err, &syntax) {
		return nil, errorResponse(nil, protocol.NewError(protocol.CodeParseError, "parse error",
			"The line is not valid JSON: "+err.Error()+". Send one JSON-RPC request object per line."))
	}
	return nil, errorResponse(nil, protocol.NewError(protocol.CodeInvalidRequest, "invalid request",
		"The message is not a JSON object. Send one JSON-RPC 2.0 request object per line, or a batch: an array of them.", protocol.Problem{Path: "", Message: "expected an object"}))
}

// request checks the envelope's members and builds the call.
func (s *Server) request(members map[string]json.RawMessage) (*call, *protocol.Response) {
	var id json.RawMessage
	if raw, has := members["id"]; has {
		id = json.RawMessage(compactID(raw))
		switch c := id[0]; {
		case string(id) == "null":
			// Allowed, if discouraged (JSON-RPC 2.0 §4): answered with id
			// null, and one such request in flight at a time.
		case c != '"' && c != '-' && (c < '0' || c > '9'):
			return nil, errorResponse(nil, protocol.NewError(protocol.CodeInvalidRequest, "invalid request",
				"The id must be a string, a number or null.", protocol.Problem{Path: "/id", Message: "expected a string, a number or null"}))
		case c == '"' && loneSurrogate(id):
			// Answered as the parse layer answers other text that is not
			// Unicode (RFC 8259 §8.2): the id cannot be echoed.
			return nil, errorResponse(nil, protocol.NewError(protocol.CodeParseError, "parse error",
				`The id holds a lone UTF-16 surrogate escape (such as "\ud800" alone), which is not Unicode text. Send ids as valid strings.`,
				protocol.Problem{Path: "/id", Message: "lone surrogate escape"}))
		}
	}
	var version, method string
	if json.Unmarshal(members["jsonrpc"], &version) != nil || version != "2.0" {
		return nil, errorResponse(id, protocol.NewError(protocol.CodeInvalidRequest, "invalid request",
			`The request lacks "jsonrpc": "2.0".`, protocol.Problem{Path: "/jsonrpc", Message: `must be "2.0"`}))
	}
	if json.Unmarshal(members["method"], &method) != nil || method == "" {
		return nil, errorResponse(id, protocol.NewError(protocol.CodeInvalidRequest, "invalid request",
			"The request lacks a method name (a string).", protocol.Problem{Path: "/method", Message: "expected a method name"}))
	}
	if method != protocol.MethodCancel && method != protocol.MethodDescribe && s.methods[method] == nil {
		return nil, errorResponse(id, protocol.NewError(protocol.CodeMethodNotFound, "method not found",
			s.methodNotFound(method), protocol.Problem{Path: "/method", Message: "unknown method"}))
	}
	params := bytes.TrimSpace(members["params"])
	if len(params) == 0 || string(params) == "null" {
		params = json.RawMessage("{}")
	} else if params[0] != '{' {
		return nil, errorResponse(id, protocol.NewError(protocol.CodeInvalidParams, "invalid params",
			"The params must be an object with named members.", protocol.Problem{Path: "/params", Message: "expected an object"}))
	}
	if s.Validate != nil {
		if e := s.Validate(method, params); e != nil {
			return nil, errorResponse(id, e)
		}
	}
	return &call{id: id, key: string(id), method: method, params: params}, nil
}

// loneSurrogate reports whether a JSON string's text holds a \u escape of
// a UTF-16 surrogate that is not part of a high-low pair.
func loneSurrogate(s []byte) bool {
	hex := func(i int) (rune, bool) {
		if i+6 > len(s) || s[i] != '\\' || s[i+1] != 'u' {
			return 0, false
		}
		var r rune
		for _, h := range s[i+2 : i+6] {
			switch {
			case h >= '0' && h <= '9':
				r = r<<4 | rune(h-'0')
			case h >= 'a' && h <= 'f':
				r = r<<4 | rune(h-'a'+10)
			case h >= 'A' && h <= 'F':
				r = r<<4 | rune(h-'A'+10)
			default:
				return 0, false
			}
		}
		return r, true
	}
	for i := 0; i < len(s); i++ {
		if s[i] != '\\' {
			continue
		}
		r, ok := hex(i)
		if !ok {
			i++ // another escape: skip its letter
			continue
		}
		switch {
		case r >= 0xD800 && r <= 0xDBFF:
			if low, ok := hex(i + 6); ok && low >= 0xDC00 && low <= 0xDFFF {
				i += 11
				continue
			}
			return true
		case r >= 0xDC00 && r <= 0xDFFF:
			return true
		}
		i += 5
	}
	return false
}

// compactID returns an id's JSON text without insignificant space, the
// form it is echoed and looked up in.
func compactID(raw json.RawMessage) string {
	var compact bytes.Buffer
	if json.Compact(&compact, raw) != nil || compact.Len() == 0 {
		return string(bytes.TrimSpace(raw))
	}
	return compact.String()
}
