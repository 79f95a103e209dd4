package protocol

import (
	"encoding/json"
	"fmt"
)

// Version is the protocol version reported by describe. It changes only if
// the meaning of an existing field must change.
const Version = "1.0"

// Server-state and JSON-RPC error codes.
const (
	CodeParseError     = -32700 // the line is not JSON (the id is null; the process goes on)
	CodeInvalidRequest = -32600 // not a JSON-RPC 2.0 request object
	CodeMethodNotFound = -32601 // no such method
	CodeInvalidParams  = -32602 // params fail the schema
	CodeInternal       = -32603 // a recovered panic or an unexpected failure; the process goes on
	CodeCancelled      = -32000 // the request was cancelled by a cancel request
	CodeLimitExceeded  = -32001 // a limit in force was exceeded (line size, nodes, members, steps)
	CodeOverloaded     = -32002 // too many requests waiting; send fewer at once
	CodeShuttingDown   = -32003 // the server is stopping and takes no new work
	CodeTimeLimit      = -32004 // the request ran longer than the wall-time limit
)

// CodeInfo describes an error code for the published schema's ErrorCode
// definition, from which the README's table and both clients' error
// classes are generated.
type CodeInfo struct {
	Code int
	// Kind is the code's short name, error.data.kind on the wire.
	Kind string
	// When says in a phrase when the code is sent.
	When string
}

// ServerCodes are the JSON-RPC and server-state codes. Application codes
// (1000 and up) come from the engine's fault kinds (engine/fault.Kinds);
// the adapter joins the two tables.
var ServerCodes = []CodeInfo{
	{CodeParseError, "parse error", "the line is not JSON, or is longer than `--max-line-bytes` (id null; reading goes on)"},
	{CodeInvalidRequest, "invalid request", "not a JSON-RPC 2.0 request object; an id already in flight"},
	{CodeMethodNotFound, "method not found", "unknown method"},
	{CodeInvalidParams, "invalid params", "params do not follow the schema (wrong types, unknown fields, numbers out of double range)"},
	{CodeInternal, "internal error", "a bug (a recovered panic); the process goes on"},
	{CodeCancelled, "cancelled", "stopped by `cancel`"},
	{CodeLimitExceeded, "limit exceeded", "a model or sweep over the limits"},
	{CodeOverloaded, "overloaded", "reserved for too many waiting requests"},
	{CodeShuttingDown, "shutting down", "the server is stopping"},
	{CodeTimeLimit, "time limit", "the request ran longer than `--time-limit`"},
}

// Request is one JSON-RPC 2.0 request or notification as read from a line.
// ID is kept as raw JSON and echoed byte for byte.
type Request struct {
	// JSONRPC must be "2.0".
	JSONRPC string `json:"jsonrpc" jsonschema:"enum=2.0"`
	// ID pairs the response with the request: a string or a number. A
	// request without id is a notification and gets no response.
	ID json.RawMessage `json:"id,omitempty" jsonschema:"oneof_type=string;number"`
	// Method is the method name: describe, solve, reciprocate, load-path,
	// sweep-parameter, optimise-layout or cancel.
	Method string `json:"method"`
	// Params are the method's parameters (an object).
	Params json.RawMessage `json:"params,omitempty" jsonschema:"type=object"`
}

// Response is the final answer to a request: exactly one of Result and
// Error is set.
type Response struct {
	JSONRPC string          `json:"jsonrpc"`
	ID      json.RawMessage `json:"id"`
	Result  any             `json:"result,omitempty"`
	Error   *Error          `json:"error,omitempty"`
}

// Error is a JSON-RPC error object.
type Error struct {
	// Code is the error code: JSON-RPC's reserved codes, the server's own
	// states in -32000..-32099, or an application code 1000 and up.
	Code int `json:"code"`
	// Message is a sentence a person can act on.
	Message string `json:"message"`
	// Data carries the problems and, for some codes, structured detail.
	Data *ErrorData `json:"data,omitempty"`
}

// ErrorData is the data member of every error.
type ErrorData struct {
	// Kind is a short name of the error class ("invalid params",
	// "unstable structure", ...).
	Kind string `json:"kind"`
	// Problems locate the causes in the request: JSON pointers (RFC 6901)
	// from the root of the request object, for example
	// "/params/model/members/3/ends/1".
	Problems []Problem `json:"problems"`
	// Detail is structured data for the error: for an unstable structure,
	// the mechanism's freedoms and node motions; for a limit, the limit and
	// the value.
	Detail any `json:"detail,omitempty"`
}

// Problem locates one defect in a request.
type Problem struct {
	// Path is a JSON pointer into the request ("" for the whole request).
	Path string `json:"path"`
	// Message says what is wrong there.
	Message string `json:"message"`
}

// Error makes *Error an error.
func (e *Error) Error() string { return fmt.Sprintf("%s (code %d)", e.Message, e.Code) }

// Is reports whether target is an *Error with the same code, so that codes
// survive %w wrapping.
func (e *Error) Is(target error) bool {
	t, ok := target.(*Error)
	return ok && t.Code == e.Code
}

// NewError returns an error with a code, kind, message and problems.
func NewError(code int, kind, message string, problems ...Problem) *Error {
	if problems == nil {
		problems = []Problem{}
	}
	return &Error{Code: code, Message: message, Data: &ErrorData{Kind: kind, Problems: problems}}
}

// Notification is a server-to-host message without id.
type Notification struct {
	JSONRPC string `json:"jsonrpc"`
	Method  string `json:"method"`
	Params  any    `json:"params"`
}

// Progress is the params of a "progress" notification.
type Progress struct {
	// Request is the id of the request this progress belongs to.
	Request json.RawMessage `json:"request"`
	// Stage names the phase ("ordering", "factorising", "step", ...).
	Stage string `json:"stage"`
	// Done counts finished units of the stage.
	Done int `json:"done"`
	// Total is the number of units in the stage (0 when unknown).
	Total int `json:"total"`
	// Partial is an intermediate result, for a sweep the step just
	// computed.
	Partial any `json:"partial,omitempty"`
}
