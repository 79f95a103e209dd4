package protocol

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"runtime"
	"runtime/debug"
	"sort"
	"sync"
	"time"
	"unicode/utf8"
)

// Handler runs one method. It receives the request's context (cancelled by
// a cancel request, the wall-time limit, or a failed write), the raw params
// (already validated against the method's schema) and a Stream for progress.
// It returns the result, or an error that Server maps to a wire error with
// Classify.
type Handler func(ctx context.Context, params json.RawMessage, stream Stream) (any, error)

// Stream sends progress notifications for one request. It is safe for
// concurrent use; calls after the request's final response are dropped.
type Stream interface {
	Progress(stage string, done, total int, partial any)
}

// Limits are the limits in force. A zero field takes its default.
type Limits struct {
	// MaxLineBytes is the largest message line accepted; default 64 MiB.
	MaxLineBytes int `json:"max_line_bytes"`
	// MaxNodes is the largest number of nodes in a model; default 1,000,000.
	MaxNodes int `json:"max_nodes"`
	// MaxMembers is the largest number of members in a model; default 2,000,000.
	MaxMembers int `json:"max_members"`
	// MaxSweepSteps is the largest number of steps in one sweep; default 100,000.
	MaxSweepSteps int `json:"max_sweep_steps"`
	// MaxCandidates is the largest number of candidate members in a layout
	// optimisation; default 5,000,000 (3.4 million candidates peak near
	// 300 MiB).
	MaxCandidates int `json:"max_candidates"`
	// Workers is the number of requests worked on at once; default the
	// number of CPUs.
	Workers int `json:"workers"`
	// MaxQueued is how many read requests may wait for a worker whatever
	// their size; default 1024.
	MaxQueued int `json:"max_queued"`
	// ReadAheadBytes lets more requests than max_queued wait while their
	// lines total less than this many bytes (each counted with 1 KiB for
	// its bookkeeping), so that a cancel or describe sent behind many
	// small requests is still read and answered at once. When both are
	// reached the server stops reading until a worker takes a request
	// (back-pressure); default 16 MiB.
	ReadAheadBytes int `json:"read_ahead_bytes"`
	// TimeLimitSeconds is the wall time allowed per request, 0 for none.
	TimeLimitSeconds float64 `json:"time_limit_seconds"`
}

// WithDefaults returns the limits with zero fields set to their defaults.
func (l Limits) WithDefaults() Limits {
	if l.MaxLineBytes <= 0 {
		l.MaxLineBytes = 64 << 20
	}
	if l.MaxNodes <= 0 {
		l.MaxNodes = 1_000_000
	}
	if l.MaxMembers <= 0 {
		l.MaxMembers = 2_000_000
	}
	if l.MaxSweepSteps <= 0 {
		l.MaxSweepSteps = 100_000
	}
	if l.MaxCandidates <= 0 {
		l.MaxCandidates = 5_000_000
	}
	if l.Workers <= 0 {
		l.Workers = runtime.NumCPU()
	}
	if l.MaxQueued <= 0 {
		l.MaxQueued = 1024
	}
	if l.ReadAheadBytes <= 0 {
		l.ReadAheadBytes = 16 << 20
	}
	return l
}

// Method describes a registered method.
type Method struct {
	// Name is the method name.
	Name string `json:"name"`
	// Summary says in one sentence what the method does.
	Summary string `json:"summary"`
	// Params is the name of the params definition in the schema's $defs.
	Params string `json:"params"`
	// Result is the name of the result definition in the schema's $defs.
	Result string `json:"result"`
}

// Server is the JSON-RPC server. Register methods with Handle, then call
// Serve once. Fields must be set before Serve.
type Server struct {
	Name     string
	Version  string
	SchemaID string
	Limits   Limits
	// Validate checks params against the method's schema; nil skips it.
	Validate func(method string, params json.RawMessage) *Error
	// Classify maps a handler's error to a wire error; nil uses
	// DefaultClassify. It must return a non-nil *Error.
	Classify func(err error) *Error
	// Log receives diagnostics (never protocol); nil discards them.
	Log io.Writer
	// OnProgress, if set, sees every progress notification (the run
	// command draws its progress bar with it). Called from many goroutines.
	OnProgress func(p *Progress)
	// OnResponse, if set, sees every final response before it is written.
	OnResponse func(r *Response)

	methods  map[string]Handler
	describe []Method
}

// Handle registers a method.
func (s *Server) Handle(m Method, h Handler) {
	if s.methods == nil {
		s.methods = map[string]Handler{}
	}
	if _, dup := s.methods[m.Name]; dup || m.Name == "cancel" || m.Name == "describe" {
		panic("protocol: method registered twice: " + m.Name)
	}
	s.methods[m.Name] = h
	s.describe = append(s.describe, m)
}

// DescribeResult is the result of describe.
type DescribeResult struct {
	// Name is the program's name.
	Name string `json:"name"`
	// Version is the program's version.
	Version string `json:"version"`
	// ProtocolVersion changes only if an existing field's meaning changes.
	ProtocolVersion string `json:"protocol_version"`
	// Methods lists the methods with their params and result definitions.
	Methods []Method `json:"methods"`
	// Limits are the limits in force.
	Limits Limits `json:"limits"`
	// SchemaID is the $id of the published schema the params follow.
	SchemaID string `json:"schema_id"`
}

// call is one request in flight.
type call struct {
	id     json.RawMessage
	key    string
	method string
	params json.RawMessage
	ctx    context.Context
	cancel context.CancelCauseFunc
	mu     sync.Mutex
	done   bool
	// stopped is set by a cancel that found the call still running; the
	// call is then answered with the cancelled error whatever its handler
	// returned, so the cancel's answer and the call's agree.
	stopped bool
	start   time.Time
	last    map[string]time.Time
}

var errCancelledByHost = errors.New("cancelled by a cancel request")

// Serve reads requests from in until end of input, answers them on out, and
// returns once every request read has been answered and the output flushed.
// It returns the number of error responses written and the first write
// error, if any. Cancelling ctx stops all work; requests in flight are still
// answered (with the cancelled error).
func (s *Server) Serve(ctx context.Context, in io.Reader, out io.Writer) (failures int, err error) {
	s.Limits = s.Limits.WithDefaults()
	ctx, stopAll := context.WithCancelCause(ctx)
	defer stopAll(nil)

	w := newWriter(out, func(err error) { stopAll(fmt.Errorf("output failed: %w", err)) })
	go w.loop()

	var (
		tableMu  sync.Mutex
		inFlight = map[string]*call{}
		failMu   sync.Mutex
	)
	finish := func(c *call, resp *Response) {
		if c != nil {
			c.mu.Lock()
			if c.stopped {
				resp = errorResponse(c.id, NewError(CodeCancelled, "cancelled", "The request was cancelled by a cancel request."))
			}
			c.done = true
			c.mu.Unlock()
			tableMu.Lock()
			if inFlight[c.key] == c {
				delete(inFlight, c.key)
			}
			tableMu.Unlock()
			if c.cancel != nil {
				c.cancel(nil)
			}
			if c.id == nil {
				return // a notification gets no response
			}
		}
		if resp.Error != nil {
			failMu.Lock()
			failures++
			failMu.Unlock()
		}
		if s.OnResponse != nil {
			s.OnResponse(resp)
		}
		w.send(marshalResponse(resp))
	}

	queue := newWaitQueue(s.Limits.MaxQueued, s.Limits.ReadAheadBytes)
	var workers sync.WaitGroup
	for i := 0; i < s.Limits.Workers; i++ {
		workers.Add(1)
		go func() {
			defer workers.Done()
			for c := queue.take(); c != nil; c = queue.take() {
				finish(c, s.run(c, w))
			}
		}()
	}

	reader := bufio.NewReaderSize(in, 64<<10)
	for {
		line, tooLong, rerr := readLine(reader, s.Limits.MaxLineBytes)
		if tooLong {
			finish(nil, errorResponse(nil, NewError(CodeParseError, "parse error",
				fmt.Sprintf("The line is longer than the line size limit of %d bytes; it was skipped. Send smaller requests or start the server with a larger --max-line-bytes.", s.Limits.MaxLineBytes))))
		} else if len(bytes.TrimSpace(line)) > 0 {
			c, resp := s.parse(line)
			switch {
			case resp != nil:
				finish(nil, resp)
			case c.method == "cancel":
				resp := s.cancel(c, &tableMu, inFlight)
				if c.id != nil { // a notification gets no response
					finish(nil, resp)
				}
			case c.method == "describe":
				if c.id != nil {
					finish(nil, &Response{JSONRPC: "2.0", ID: c.id, Result: s.describeResult()})
				}
			default:
				if ctx.Err() != nil {
					finish(nil, errorResponse(c.id, NewError(CodeShuttingDown, "shutting down", "The server is stopping and takes no new work.")))
					break
				}
				cctx, cancel := context.WithCancelCause(ctx)
				c.ctx, c.cancel = cctx, cancel
				if c.id != nil {
					tableMu.Lock()
					_, busy := inFlight[c.key]
					if !busy {
						inFlight[c.key] = c
					}
					tableMu.Unlock()
					if busy {
						c.cancel(nil)
						finish(nil, errorResponse(c.id, NewError(CodeInvalidRequest, "invalid request",
							"Another request with this id is still in flight; ids must be unique among requests in flight.", Problem{Path: "/id", Message: "id already in use"})))
						break
					}
				}
				queue.put(c, len(line))
			}
		}
		if rerr != nil {
			if !errors.Is(rerr, io.EOF) {
				s.logf("reading input: %v", rerr)
			}
			break
		}
	}
	queue.close()
	workers.Wait()
	werr := w.close()
	return failures, werr
}

var errTimeLimit = errors.New("time limit")

func (s *Server) logf(format string, args ...any) {
	if s.Log != nil {
		fmt.Fprintf(s.Log, "gusset: "+format+"\n", args...)
	}
}

// readLine reads one line without its newline. A line longer than limit is
// consumed and reported as tooLong with no data.
func readLine(r *bufio.Reader, limit int) (line []byte, tooLong bool, err error) {
	var buf []byte
	for {
		chunk, err := r.ReadSlice('\n')
		if len(buf)+len(chunk) > limit+2 { // allow for \r\n
			tooLong = true
		}
		if !tooLong {
			buf = append(buf, chunk...)
		}
		if err == bufio.ErrBufferFull {
			continue
		}
		if tooLong {
			return nil, true, err
		}
		buf = bytes.TrimRight(buf, "\r\n")
		if len(buf) > limit {
			return nil, true, err
		}
		return buf, false, err
	}
}

// parse decodes the envelope. It returns either a call or an error response.
func (s *Server) parse(line []byte) (*call, *Response) {
	if !utf8.Valid(line) {
		return nil, errorResponse(nil, NewError(CodeParseError, "parse error",
			"The line is not valid UTF-8. Send requests as UTF-8 JSON, one per line."))
	}
	if !json.Valid(line) {
		var raw any
		msg := "The line is not valid JSON"
		if err := json.Unmarshal(line, &raw); err != nil {
			msg += ": " + err.Error()
		}
		return nil, errorResponse(nil, NewError(CodeParseError, "parse error", msg+". Send one JSON-RPC request object per line."))
	}
	// Members are taken by their exact names (RFC 8259 §4): decoding into a
	// struct would also accept "ID" or "Method". The params stay raw.
	var members map[string]json.RawMessage
	if err := json.Unmarshal(line, &members); err != nil {
		return nil, errorResponse(nil, NewError(CodeInvalidRequest, "invalid request",
			"The message is not a JSON object. Send one JSON-RPC 2.0 request object per line.", Problem{Path: "", Message: "expected an object"}))
	}
	var id json.RawMessage
	if raw, has := members["id"]; has {
		var compact bytes.Buffer
		_ = json.Compact(&compact, raw)
		if c := compact.Bytes()[0]; c != '"' && c != '-' && (c < '0' || c > '9') {
			return nil, errorResponse(nil, NewError(CodeInvalidRequest, "invalid request",
				"The id must be a string or a number.", Problem{Path: "/id", Message: "expected a string or a number"}))
		}
		id = compact.Bytes()
	}
	var version, method string
	if json.Unmarshal(members["jsonrpc"], &version) != nil || version != "2.0" {
		return nil, errorResponse(id, NewError(CodeInvalidRequest, "invalid request",
			`The request lacks "jsonrpc": "2.0".`, Problem{Path: "/jsonrpc", Message: `must be "2.0"`}))
	}
	if json.Unmarshal(members["method"], &method) != nil || method == "" {
		return nil, errorResponse(id, NewError(CodeInvalidRequest, "invalid request",
			"The request lacks a method name (a string).", Problem{Path: "/method", Message: "expected a method name"}))
	}
	if method != "cancel" && method != "describe" && s.methods[method] == nil {
		return nil, errorResponse(id, NewError(CodeMethodNotFound, "method not found",
			fmt.Sprintf("There is no method %q; the methods are %s.", method, s.methodList()), Problem{Path: "/method", Message: "unknown method"}))
	}
	params := bytes.TrimSpace(members["params"])
	if len(params) == 0 || string(params) == "null" {
		params = json.RawMessage("{}")
	} else if params[0] != '{' {
		return nil, errorResponse(id, NewError(CodeInvalidParams, "invalid params",
			"The params must be an object with named members.", Problem{Path: "/params", Message: "expected an object"}))
	}
	if s.Validate != nil {
		if e := s.Validate(method, params); e != nil {
			return nil, errorResponse(id, e)
		}
	}
	return &call{id: id, key: string(id), method: method, params: params}, nil
}

func (s *Server) methodList() string {
	names := []string{"describe", "cancel"}
	for n := range s.methods {
		names = append(names, n)
	}
	sort.Strings(names)
	return fmt.Sprintf("%q", names)
}

// CancelParams are the params of cancel.
type CancelParams struct {
	// Request is the id of the request to cancel.
	Request json.RawMessage `json:"request" jsonschema:"oneof_type=string;number"`
}

// CancelResult is the result of cancel.
type CancelResult struct {
	// Cancelled is true when the request was in flight and is now being
	// stopped; it will still be answered, with the cancelled error.
	Cancelled bool `json:"cancelled"`
}

func (s *Server) cancel(c *call, mu *sync.Mutex, inFlight map[string]*call) *Response {
	var p CancelParams
	if err := json.Unmarshal(c.params, &p); err != nil || len(p.Request) == 0 {
		return errorResponse(c.id, NewError(CodeInvalidParams, "invalid params",
			`cancel needs {"request": <id of the request to cancel>}.`, Problem{Path: "/params/request", Message: "expected the id of a request in flight"}))
	}
	var compact bytes.Buffer
	_ = json.Compact(&compact, p.Request)
	mu.Lock()
	target := inFlight[compact.String()]
	mu.Unlock()
	stopped := false
	if target != nil {
		target.mu.Lock()
		if !target.done {
			target.stopped, stopped = true, true
			target.cancel(errCancelledByHost)
		}
		target.mu.Unlock()
	}
	return &Response{JSONRPC: "2.0", ID: c.id, Result: CancelResult{Cancelled: stopped}}
}

func (s *Server) describeResult() DescribeResult {
	methods := append([]Method{
		{Name: "describe", Summary: "Reports the name, versions, methods, limits and schema id.", Params: "DescribeParams", Result: "DescribeResult"},
		{Name: "cancel", Summary: "Stops a request in flight; it is then answered with the cancelled error.", Params: "CancelParams", Result: "CancelResult"},
	}, s.describe...)
	return DescribeResult{Name: s.Name, Version: s.Version, ProtocolVersion: Version, Methods: methods, Limits: s.Limits, SchemaID: s.SchemaID}
}

// run executes one call with panic recovery and maps its outcome.
func (s *Server) run(c *call, w *writer) (resp *Response) {
	defer func() {
		if r := recover(); r != nil {
			s.logf("panic in %s: %v\n%s", c.method, r, debug.Stack())
			resp = errorResponse(c.id, NewError(CodeInternal, "internal error",
				fmt.Sprintf("Gusset failed inside %s (%v). This is a bug: please report it with the request. The server goes on.", c.method, r)))
		}
	}()
	if err := context.Cause(c.ctx); err != nil {
		return errorResponse(c.id, s.contextError(c.ctx))
	}
	// The time limit counts from when a worker takes the request, so a
	// request queued behind long work is not charged for the wait.
	if s.Limits.TimeLimitSeconds > 0 {
		ctx, stop := context.WithTimeoutCause(c.ctx, time.Duration(s.Limits.TimeLimitSeconds*float64(time.Second)), errTimeLimit)
		defer stop()
		c.ctx = ctx
	}
	c.mu.Lock()
	c.start = time.Now()
	c.mu.Unlock()
	result, err := s.methods[c.method](c.ctx, c.params, &stream{s: s, c: c, w: w})
	if err == nil {
		if c.ctx.Err() != nil && context.Cause(c.ctx) != nil && !errors.Is(context.Cause(c.ctx), context.Canceled) {
			return errorResponse(c.id, s.contextError(c.ctx))
		}
		return &Response{JSONRPC: "2.0", ID: c.id, Result: result}
	}
	if c.ctx.Err() != nil && (errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded)) {
		return errorResponse(c.id, s.contextError(c.ctx))
	}
	classify := s.Classify
	if classify == nil {
		classify = DefaultClassify
	}
	return errorResponse(c.id, classify(err))
}

func (s *Server) contextError(ctx context.Context) *Error {
	cause := context.Cause(ctx)
	switch {
	case errors.Is(cause, errTimeLimit):
		return NewError(CodeTimeLimit, "time limit", fmt.Sprintf("The request ran longer than the time limit of %g s and was stopped. Start the server with a larger --time-limit or send a smaller model.", s.Limits.TimeLimitSeconds))
	case errors.Is(cause, errCancelledByHost):
		return NewError(CodeCancelled, "cancelled", "The request was cancelled by a cancel request.")
	default:
		return NewError(CodeShuttingDown, "shutting down", fmt.Sprintf("The request was stopped because the server is stopping (%v).", cause))
	}
}

// DefaultClassify maps an error to a wire error: an *Error keeps its code;
// anything else is an internal error.
func DefaultClassify(err error) *Error {
	var e *Error
	if errors.As(err, &e) {
		return e
	}
	return NewError(CodeInternal, "internal error", err.Error())
}

func errorResponse(id json.RawMessage, e *Error) *Response {
	if id == nil {
		id = json.RawMessage("null")
	}
	return &Response{JSONRPC: "2.0", ID: id, Error: e}
}

// marshalResponse encodes a response; a result that cannot be encoded (a
// NaN slipped through) becomes an internal error rather than a broken line.
func marshalResponse(r *Response) []byte {
	if r.ID == nil {
		r.ID = json.RawMessage("null")
	}
	b, err := encode(r)
	if err != nil {
		b, _ = encode(errorResponse(r.ID, NewError(CodeInternal, "internal error",
			fmt.Sprintf("The result could not be encoded as JSON (%v). This is a bug: please report it with the request.", err))))
	}
	return b
}

// stream sends a call's progress notifications. Notifications without a
// partial result start only once the request has run for progressDelay (a
// small request gets no chatter), and then come at most one per stage
// every progressInterval unless they start or finish the stage. Partial
// results are always sent.
type stream struct {
	s *Server
	c *call
	w *writer
}

const (
	progressDelay    = 50 * time.Millisecond
	progressInterval = 100 * time.Millisecond
)

func (st *stream) Progress(stage string, done, total int, partial any) {
	c := st.c
	c.mu.Lock()
	if c.done {
		c.mu.Unlock()
		return
	}
	now := time.Now()
	if partial == nil && now.Sub(c.start) < progressDelay {
		c.mu.Unlock()
		return
	}
	if partial == nil && done != total && done != 0 {
		if last, ok := c.last[stage]; ok && now.Sub(last) < progressInterval {
			c.mu.Unlock()
			return
		}
	}
	if c.last == nil {
		c.last = map[string]time.Time{}
	}
	c.last[stage] = now
	p := &Progress{Request: c.id, Stage: stage, Done: done, Total: total, Partial: partial}
	if c.id != nil {
		b, err := encode(Notification{JSONRPC: "2.0", Method: "progress", Params: p})
		if err == nil {
			st.w.send(b)
		}
	}
	c.mu.Unlock()
	if st.s.OnProgress != nil {
		st.s.OnProgress(p)
	}
}

// encode marshals v without HTML escaping, so that ids and strings go out
// byte for byte as the host sent them ("&" stays "&", not "\u0026").
func encode(v any) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimSuffix(buf.Bytes(), []byte("\n")), nil
}
