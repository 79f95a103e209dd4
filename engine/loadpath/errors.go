package loadpath

import "errors"

// ErrInvalidInput is matched (with errors.Is) by every *InputError: forces,
// cases or options that the request itself got wrong, as opposed to model
// data that a method lacks (those are *fault.Error values).
var ErrInvalidInput = errors.New("loadpath: invalid input")

// InputError reports a defect in the cases or options passed to Compute.
// Path is a JSON pointer relative to the call: "/cases/k/..." for the k-th
// case, "/options/..." for an option (field names in snake case).
type InputError struct {
	Path    string
	Message string
}

// Error returns the message with its path.
func (e *InputError) Error() string { return "loadpath: " + e.Path + ": " + e.Message }

// Is reports whether target is ErrInvalidInput.
func (e *InputError) Is(target error) bool { return target == ErrInvalidInput }
