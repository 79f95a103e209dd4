// Package fault holds the typed errors that the engine packages return for
// data-dependent failures: each carries a Kind that the protocol layer maps to
// a wire error code, a sentence a person can act on, the JSON pointers of the
// offending parts of the input, and optional structured detail.
package fault

import (
	"errors"
	"fmt"
	"strings"
)

// Kind names a class of engine failure. Each kind maps to one application
// error code on the wire (see Code).
type Kind int

// The kinds of engine failure. Their wire codes are fixed: never renumber.
const (
	InvalidModel     Kind = 1000 // semantic errors in the model (dangling ids, zero length, ...)
	Expression       Kind = 1001 // an expression failed to parse or evaluate
	Unstable         Kind = 1002 // the structure is a mechanism (singular stiffness)
	NotPlanar        Kind = 1003 // members cross without a shared node
	NotInEquilibrium Kind = 1004 // forces do not balance within tolerance
	WrongDimension   Kind = 1005 // the method needs a 2D (or 3D) model
	MissingData      Kind = 1006 // data a method needs is absent (material limits for sizing, ...)
	Infeasible       Kind = 1007 // an optimisation problem has no solution (loads cannot reach supports)
	NoSolution       Kind = 1008 // a requested geometric construction does not exist
	UnknownCase      Kind = 1009 // a load case or combination named in the request does not exist
)

// Code returns the wire error code of the kind.
func (k Kind) Code() int { return int(k) }

// String returns the kind's short name.
func (k Kind) String() string {
	for _, d := range kinds {
		if d.Kind == k {
			return d.Name
		}
	}
	return fmt.Sprintf("kind %d", int(k))
}

// KindInfo describes a kind for the published schema and the clients,
// which are generated from Kinds.
type KindInfo struct {
	Kind Kind
	// Name is the kind's short name (Kind.String).
	Name string
	// When says in a phrase when the kind is reported.
	When string
}

// kinds is the one table of the kinds: their names and when each is
// reported.
var kinds = []KindInfo{
	{InvalidModel, "invalid model", "duplicate or dangling ids, zero-length members, coincident nodes, dimension mismatches, non-positive stiffness or area, an empty model, ..."},
	{Expression, "expression error", "unknown parameter, syntax error, division by zero, non-finite value"},
	{Unstable, "unstable structure", "a mechanism; `data.detail` carries its freedoms and node motions"},
	{NotPlanar, "not planar", "members cross without a shared node"},
	{NotInEquilibrium, "not in equilibrium", "forces that do not balance, with the closure error"},
	{WrongDimension, "wrong dimension", "a 2D-only method given a 3D model"},
	{MissingData, "missing data", "e.g. material limits needed for sizing"},
	{Infeasible, "infeasible", "loads that cannot reach a support"},
	{NoSolution, "no solution", "an edited force diagram no form fits"},
	{UnknownCase, "unknown case", "a case or combination id that does not exist"},
}

// Kinds returns every kind with its name and when it is reported, in code
// order.
func Kinds() []KindInfo { return append([]KindInfo(nil), kinds...) }

// Problem locates one defect in the input. Path is a JSON pointer (RFC 6901)
// relative to the object the engine was given (for a model, the model object;
// the protocol layer prefixes it with the pointer of that object in the
// request).
type Problem struct {
	Path    string
	Message string
}

// Error is an engine failure with its kind, message, problems and detail.
type Error struct {
	Kind     Kind
	Message  string
	Problems []Problem
	// Detail is extra structured data for the wire (for a mechanism, its
	// node motions). It must marshal to JSON without NaN or Inf.
	Detail any
}

// Error returns the message, with the first problems appended.
func (e *Error) Error() string {
	if len(e.Problems) == 0 {
		return e.Message
	}
	var b strings.Builder
	b.WriteString(e.Message)
	for i, p := range e.Problems {
		if i == 3 {
			fmt.Fprintf(&b, "; and %d more", len(e.Problems)-3)
			break
		}
		fmt.Fprintf(&b, "; %s: %s", p.Path, p.Message)
	}
	return b.String()
}

// Is reports whether target is an *Error of the same kind, so that
// errors.Is(err, &fault.Error{Kind: fault.Unstable}) works through wrapping.
func (e *Error) Is(target error) bool {
	t, ok := target.(*Error)
	return ok && t.Kind == e.Kind
}

// New returns an error of the given kind with a formatted message.
func New(kind Kind, format string, args ...any) *Error {
	return &Error{Kind: kind, Message: fmt.Sprintf(format, args...)}
}

// At returns an error of the given kind with one problem at path.
func At(kind Kind, path, format string, args ...any) *Error {
	msg := fmt.Sprintf(format, args...)
	return &Error{Kind: kind, Message: msg, Problems: []Problem{{Path: path, Message: msg}}}
}

// As returns the *Error inside err, if any.
func As(err error) (*Error, bool) {
	var e *Error
	ok := errors.As(err, &e)
	return e, ok
}
