package protocol

import "reflect"

// Each hands the elements of every array of T in a value that
// DecodeStrictEach decodes to Take, one at a time, instead of storing
// them in the array: a caller that converts the elements to a form of its
// own (a model's nodes and members, tens of megabytes in a large request)
// then never holds the decoded array and its converted copy together.
type Each[T any] struct {
	// Start, when not nil, is called before the first element of such an
	// array with the number of its elements, counted by its commas: exact
	// for well-formed input, only a capacity hint otherwise.
	Start func(n int)
	// Take receives each element, decoded as DecodeStrict decodes it into
	// a zero T. The next element is decoded into the same T: Take copies
	// what it keeps (strings, slices and pointers inside the element are
	// its own and may be kept). An error from Take makes DecodeStrictEach
	// decline the input.
	Take    func(e *T) error
	scratch T
}

// Sink is an *Each of some element type, for DecodeStrictEach.
type Sink interface {
	elemType() reflect.Type
	target() reflect.Value
	start(n int)
	take() error
}

func (e *Each[T]) elemType() reflect.Type { return reflect.TypeFor[T]() }
func (e *Each[T]) target() reflect.Value  { return reflect.ValueOf(&e.scratch).Elem() }
func (e *Each[T]) take() error            { return e.Take(&e.scratch) }

func (e *Each[T]) start(n int) {
	if e.Start != nil {
		e.Start(n)
	}
}

// DecodeStrictEach is DecodeStrict, except that the elements of every
// array (anywhere in v) whose element type is that of one of sinks go to
// that sink rather than into the array. Such an array is left empty and
// not nil, as the sample validation and the size checks expect of a
// present array (a null or absent one stays nil). When it declines the
// input, as DecodeStrict does, the sinks may have taken some elements:
// the caller discards what they collected and decodes again without them.
func DecodeStrictEach(data []byte, v any, sinks ...Sink) error {
	rv := reflect.ValueOf(v)
	if rv.Kind() != reflect.Pointer || rv.IsNil() {
		return errUnhandled
	}
	d := &decoder{data: data, sinks: sinks}
	return d.top(rv)
}

// sinkFor returns the sink of arrays of t, or nil.
func (d *decoder) sinkFor(t reflect.Type) Sink {
	for _, s := range d.sinks {
		if s.elemType() == t {
			return s
		}
	}
	return nil
}

// drain decodes the array at pos into its sink s, element by element,
// and leaves the slice v (of codec c) empty and not nil.
func (d *decoder) drain(v reflect.Value, c *codec, s Sink, depth int) error {
	v.Set(reflect.MakeSlice(c.t, 0, 0))
	first := true
	target := s.target()
	return d.elements(func() error {
		if first {
			s.start(d.remaining())
			first = false
		}
		target.SetZero()
		if err := d.value(target, c.elem, depth+1); err != nil {
			return err
		}
		if s.take() != nil {
			return errUnhandled
		}
		return nil
	})
}
