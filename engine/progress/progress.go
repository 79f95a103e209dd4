// Package progress defines the small callback interface through which long
// engine work reports how far it has got.
package progress

// Reporter receives progress from long engine work. Stage is a short
// lower-case phrase ("ordering", "factorising", "step"); done counts from 0
// to total (total 0 when unknown); partial is an intermediate result that
// must marshal to JSON. Engine packages always pass nil: their intermediate
// results (a sweep's Step, a layout's Round, a form's Iteration) go through
// a typed Recorder; partial serves the transport's stream. Implementations
// must be safe for concurrent use: parallel work reports from several
// goroutines.
type Reporter interface {
	Progress(stage string, done, total int, partial any)
}

// Recorder receives long work's progress with a typed intermediate
// result, as gonum's optimize.Recorder receives typed locations: Record is
// called with the stage, done and total as for Reporter, and each partial
// result of type T (a sweep's Step). Implementations must be safe for
// concurrent use.
type Recorder[T any] interface {
	Record(stage string, done, total int, partial T)
}

// Drop is a Recorder that drops everything.
type Drop[T any] struct{}

// Record does nothing.
func (Drop[T]) Record(string, int, int, T) {}

// Discard is a Reporter that drops everything.
var Discard Reporter = discard{}

type discard struct{}

func (discard) Progress(string, int, int, any) {}

// Or returns r, or Discard when r is nil.
func Or(r Reporter) Reporter {
	if r == nil {
		return Discard
	}
	return r
}
