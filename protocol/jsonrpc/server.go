package jsonrpc

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"reflect"
	"sort"
	"strings"

	"gusset/protocol"
)

// Handler runs one method. It receives the request's context (cancelled by
// a cancel request, the wall-time limit, or a failed write), the raw params
// and a Stream for progress. It returns the result, or an error that
// Server maps to a wire error with Classify.
type Handler func(ctx context.Context, params json.RawMessage, stream Stream) (any, error)

// Stream sends progress notifications for one request. It is safe for
// concurrent use; calls after the request's final response are dropped.
type Stream interface {
	Progress(stage string, done, total int, partial any)
}

// Server is the JSON-RPC server's configuration and its methods. Register
// methods with Handle, then call Serve (once per input). Serve does not
// change the Server: the limits in force for a session are Limits with
// their defaults (protocol.Limits.WithDefaults).
type Server struct {
	Name     string
	Version  string
	SchemaID string
	Limits   protocol.Limits
	// Validate checks params against the method's schema; nil skips it.
	Validate func(method string, params json.RawMessage) *protocol.Error
	// Classify maps a handler's error to a wire error; nil uses
	// DefaultClassify. It must return a non-nil *protocol.Error.
	Classify func(err error) *protocol.Error
	// Log receives diagnostics (never protocol); nil discards them.
	Log io.Writer
	// OnProgress, if set, sees every progress notification (the run
	// command draws its progress bar with it). Called from many goroutines.
	OnProgress func(p *protocol.Progress)
	// OnResponse, if set, sees every final response before it is written.
	OnResponse func(r *protocol.Response)
	// Suggest, if set, returns the name in names nearest to a misspelt
	// method name, or "": the method-not-found message then leads with
	// "did you mean ...?".
	Suggest func(name string, names []string) string

	methods  map[string]Handler
	describe []protocol.Method
}

// Handle registers a method; describe lists the methods in the order they
// were registered.
func (s *Server) Handle(m protocol.Method, h Handler) {
	if s.methods == nil {
		s.methods = map[string]Handler{}
	}
	if _, dup := s.methods[m.Name]; dup || m.Name == protocol.MethodCancel || m.Name == protocol.MethodDescribe {
		panic("jsonrpc: method registered twice: " + m.Name)
	}
	s.methods[m.Name] = h
	s.describe = append(s.describe, m)
}

// Serve reads requests from in until end of input, answers them on out, and
// returns once every request read has been answered and the output flushed.
// It returns the number of error responses written and the first write
// error, if any. Cancelling ctx (a signal: cancel it with a cause wrapping
// ErrInterrupted), or a failed write, stops reading at once, even while a
// read waits for input, and stops all work; requests in flight are still
// answered (with the cancelled error, or the shutting-down one).
func (s *Server) Serve(ctx context.Context, in io.Reader, out io.Writer) (failures int, err error) {
	c := newConn(ctx, s, out)
	defer c.stopAll(nil)
	c.startWorkers()
	read := make(chan struct{})
	go func() {
		defer close(read)
		c.read(in)
	}()
	select {
	case <-read:
	case <-c.ctx.Done():
		// The reading goroutine may wait in a read for good (a terminal,
		// an idle pipe): it is left there, and handles no further line.
		c.closeInput()
	}
	return c.close()
}

// ErrInterrupted is the cause to cancel Serve's context with when the
// process is told to stop (SIGINT, SIGTERM): requests in flight are then
// answered with the cancelled error (-32000).
var ErrInterrupted = errors.New("interrupted")

// own are the transport's own methods, listed first by describe.
var own = []protocol.Method{
	{Name: protocol.MethodDescribe, Summary: "Reports the name, versions, methods, limits and schema id.",
		Params: reflect.TypeFor[protocol.DescribeParams]().Name(), Result: reflect.TypeFor[protocol.DescribeResult]().Name()},
	{Name: protocol.MethodCancel, Summary: "Stops a request in flight; it is then answered with the cancelled error.",
		Params: reflect.TypeFor[protocol.CancelParams]().Name(), Result: reflect.TypeFor[protocol.CancelResult]().Name()},
}

// describeResult is describe's answer with the session's limits.
func (s *Server) describeResult(limits protocol.Limits) protocol.DescribeResult {
	methods := append(append([]protocol.Method(nil), own...), s.describe...)
	return protocol.DescribeResult{Name: s.Name, Version: s.Version, ProtocolVersion: protocol.Version,
		Methods: methods, Limits: limits, SchemaID: s.SchemaID}
}

// methodNames lists every method, sorted.
func (s *Server) methodNames() []string {
	names := []string{protocol.MethodDescribe, protocol.MethodCancel}
	for n := range s.methods {
		names = append(names, n)
	}
	sort.Strings(names)
	return names
}

// methodNotFound is the message for an unknown method: a did-you-mean
// first when Suggest finds a near name, then the methods as a list with
// commas ("cancel", "describe", ...).
func (s *Server) methodNotFound(method string) string {
	names := s.methodNames()
	quoted := make([]string, len(names))
	for i, n := range names {
		quoted[i] = fmt.Sprintf("%q", n)
	}
	msg := fmt.Sprintf("There is no method %q; the methods are %s.", method, strings.Join(quoted, ", "))
	if s.Suggest != nil {
		if near := s.Suggest(method, names); near != "" {
			msg = fmt.Sprintf("There is no method %q: did you mean %q? The methods are %s.", method, near, strings.Join(quoted, ", "))
		}
	}
	return msg
}

func (s *Server) logf(format string, args ...any) {
	if s.Log != nil {
		fmt.Fprintf(s.Log, "gusset: "+format+"\n", args...)
	}
}

// DefaultClassify maps an error to a wire error: a *protocol.Error keeps
// its code; anything else is an internal error.
func DefaultClassify(err error) *protocol.Error {
	var e *protocol.Error
	if errors.As(err, &e) {
		return e
	}
	return protocol.NewError(protocol.CodeInternal, "internal error", err.Error())
}
