package jsonrpc

import (
	"bytes"
	"encoding"
	"encoding/json"
	"errors"
	"math"
	"reflect"
	"runtime"
	"slices"
	"strconv"
	"sync"
	"unicode/utf8"
	"unsafe"

	"gusset/protocol"
)

// appendJSON appends the JSON encoding of v to b exactly as a json.Encoder
// with SetEscapeHTML(false) writes it (without the newline), for the
// values it handles: structs without embedded fields or ",string" options,
// pointers, slices (not []byte), maps with string keys, interfaces,
// strings, booleans, integers, float64 and types with a value-receiver
// MarshalJSON (their output compacted, as encoding/json does). Numbers are
// written with strconv.AppendFloat straight into b, large arrays of
// numbers on all processors at once, with no reflection per element. It
// returns errFallback for any other type and for a value encoding/json
// refuses (a NaN or an infinity): the caller then encodes with
// encoding/json, which gives the same bytes or its own error. New fields
// of the wire types need nothing here: the encoder of each struct type is
// built from its fields, once per type. TestAppendJSONAgreesWithEncodingJSON
// compares the bytes with encoding/json's.
func appendJSON(b []byte, v any) ([]byte, error) {
	out, _, err := streamJSON(b, v, nil, 0)
	return out, err
}

// streamJSON is appendJSON that, given a sink, hands the encoding out in
// pieces as it goes: once the text held passes limit bytes (checked
// between values), it first checks that the whole value encodes (a dry
// pass that formats no numbers: no NaN, infinity or type left to
// encoding/json anywhere), then sends what it holds to the sink and goes
// on in a buffer the sink gives. It returns the text not yet sent and
// whether anything was sent; the pieces sent followed by the text
// returned are appendJSON's bytes. An error with streamed false means
// nothing was sent, so the caller can fall back to encoding/json as
// appendJSON's callers do; with a nil sink it is appendJSON.
func streamJSON(b []byte, v any, sink partSink, limit int) (rest []byte, streamed bool, err error) {
	if v == nil {
		return append(b, "null"...), false, nil
	}
	rv := reflect.ValueOf(v)
	e := encodeState{sink: sink, limit: limit, root: rv}
	last, err := encoderOf(rv.Type())(&e, b, rv)
	if err != nil {
		return b, e.started, err
	}
	if e.chunks == nil {
		return last, e.started, nil
	}
	// Join the pieces once, into a buffer of the exact size.
	size := len(last)
	for _, c := range e.chunks {
		size += len(c)
	}
	out := make([]byte, 0, size)
	for _, c := range e.chunks {
		out = append(out, c...)
	}
	return append(out, last...), e.started, nil
}

// partSink takes the pieces of a line being written as it is encoded.
type partSink interface {
	// send hands p out; the encoder does not touch it again.
	send(p []byte)
	// buffer returns an empty buffer to go on encoding into.
	buffer() []byte
}

// encodeState holds the finished pieces of one encoding, in order: the
// text before a large array of numbers, then the array's pieces, each in
// a buffer of its own sized for it, so that no buffer is copied as it
// grows. When it streams (sink set) the pieces go to the sink instead;
// a dry state checks a value without writing its numbers.
type encodeState struct {
	chunks [][]byte

	sink    partSink
	limit   int           // bytes held before they go to the sink
	root    reflect.Value // the value encoded, for the dry pass
	started bool          // something went to the sink
	dry     bool
}

// spill is called between values: when the text held passes the limit,
// a streaming state sends it to the sink (after the dry pass, the first
// time) and a dry state drops it.
func (e *encodeState) spill(b []byte) ([]byte, error) {
	if len(b) < e.limit || e.sink == nil && !e.dry {
		return b, nil
	}
	if e.dry {
		return b[:0], nil
	}
	if err := e.start(); err != nil {
		return b, err
	}
	e.sink.send(b)
	return e.sink.buffer(), nil
}

// start runs the dry pass over the whole value once, before the first
// piece is sent: after it, the encoding cannot fail half written.
func (e *encodeState) start() error {
	if e.started {
		return nil
	}
	dry := encodeState{dry: true, limit: 64 << 10}
	if _, err := encoderOf(e.root.Type())(&dry, make([]byte, 0, 80<<10), e.root); err != nil {
		return err
	}
	e.started = true
	return nil
}

// errFallback says a value is left to encoding/json.
var errFallback = errors.New("jsonrpc: value left to encoding/json")

// encoderFunc appends the encoding of v, whose type it was built for.
type encoderFunc func(e *encodeState, b []byte, v reflect.Value) ([]byte, error)

var (
	encoders   sync.Map // reflect.Type → encoderFunc
	encodersMu sync.Mutex
	building   = map[reflect.Type]bool{}

	marshalerType     = reflect.TypeFor[json.Marshaler]()
	textMarshalerType = reflect.TypeFor[encoding.TextMarshaler]()
	numberType        = reflect.TypeFor[protocol.Number]()
	floatsType        = reflect.TypeFor[[]float64]()
	floatRowsType     = reflect.TypeFor[[][]float64]()
)

// encoderOf returns t's encoder, built once per type.
func encoderOf(t reflect.Type) encoderFunc {
	if f, ok := encoders.Load(t); ok {
		return f.(encoderFunc)
	}
	encodersMu.Lock()
	defer encodersMu.Unlock()
	return buildEncoder(t)
}

// buildEncoder builds t's encoder; encodersMu is held. A type met again
// while its own encoder is being built (a recursive type) gets a function
// that looks the finished encoder up when called.
func buildEncoder(t reflect.Type) encoderFunc {
	if f, ok := encoders.Load(t); ok {
		return f.(encoderFunc)
	}
	if building[t] {
		return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) { return encoderOf(t)(e, b, v) }
	}
	building[t] = true
	f := newEncoder(t)
	delete(building, t)
	encoders.Store(t, f)
	return f
}

func fallback(_ *encodeState, b []byte, _ reflect.Value) ([]byte, error) { return b, errFallback }

// newEncoder chooses t's encoder in the order encoding/json does: a
// type's own MarshalJSON first, then its kind.
func newEncoder(t reflect.Type) encoderFunc {
	switch {
	case t == numberType:
		return encodeNumber
	case t.Implements(marshalerType):
		return encodeMarshaler
	case reflect.PointerTo(t).Implements(marshalerType), t.Implements(textMarshalerType),
		reflect.PointerTo(t).Implements(textMarshalerType):
		// Which method encoding/json calls depends on addressability.
		return fallback
	case t == floatsType:
		return encodeFloats
	case t == floatRowsType:
		return encodeFloatRows
	}
	switch t.Kind() {
	case reflect.Bool:
		return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
			return strconv.AppendBool(b, v.Bool()), nil
		}
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
			return strconv.AppendInt(b, v.Int(), 10), nil
		}
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
			return strconv.AppendUint(b, v.Uint(), 10), nil
		}
	case reflect.Float64:
		return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
			if e.dry {
				return b, checkFinite(v.Float())
			}
			return appendFloat(b, v.Float())
		}
	case reflect.String:
		return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
			return appendString(b, v.String()), nil
		}
	case reflect.Interface:
		return encodeInterface
	case reflect.Pointer:
		return pointerEncoder(t)
	case reflect.Slice:
		if t.Elem().Kind() == reflect.Uint8 {
			return fallback // base64
		}
		return sliceEncoder(t)
	case reflect.Map:
		if t.Key().Kind() != reflect.String || t.Key().Implements(textMarshalerType) {
			return fallback
		}
		return mapEncoder(t)
	case reflect.Struct:
		return structEncoder(t)
	}
	return fallback // float32, arrays, complex numbers, channels, functions
}

func encodeNumber(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
	n := v.Interface().(protocol.Number)
	if n.IsExpr {
		return encodeMarshaler(e, b, v)
	}
	return appendFloat(b, n.Value)
}

// encodeMarshaler appends the compacted output of the value's MarshalJSON
// (null for a nil pointer), as encoding/json does.
func encodeMarshaler(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
	if v.Kind() == reflect.Pointer && v.IsNil() {
		return append(b, "null"...), nil
	}
	raw, err := v.Interface().(json.Marshaler).MarshalJSON()
	if err != nil {
		return b, errFallback
	}
	buf := bytes.NewBuffer(b) // appends after b's contents
	if err := json.Compact(buf, raw); err != nil {
		return b, errFallback
	}
	return buf.Bytes(), nil
}

func encodeInterface(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
	if v.IsNil() {
		return append(b, "null"...), nil
	}
	x := v.Elem()
	return encoderOf(x.Type())(e, b, x)
}

func pointerEncoder(t reflect.Type) encoderFunc {
	elem := buildEncoder(t.Elem())
	return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
		if v.IsNil() {
			return append(b, "null"...), nil
		}
		return elem(e, b, v.Elem())
	}
}

func sliceEncoder(t reflect.Type) encoderFunc {
	elem := buildEncoder(t.Elem())
	return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
		if v.IsNil() {
			return append(b, "null"...), nil
		}
		b = append(b, '[')
		for i := range v.Len() {
			if i > 0 {
				b = append(b, ',')
			}
			var err error
			if b, err = elem(e, b, v.Index(i)); err != nil {
				return b, err
			}
			if b, err = e.spill(b); err != nil {
				return b, err
			}
		}
		return append(b, ']'), nil
	}
}

func mapEncoder(t reflect.Type) encoderFunc {
	elem := buildEncoder(t.Elem())
	return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
		if v.IsNil() {
			return append(b, "null"...), nil
		}
		keys := v.MapKeys()
		slices.SortFunc(keys, func(x, y reflect.Value) int {
			switch {
			case x.String() < y.String():
				return -1
			case x.String() > y.String():
				return 1
			}
			return 0
		})
		b = append(b, '{')
		for i, k := range keys {
			if i > 0 {
				b = append(b, ',')
			}
			b = appendString(b, k.String())
			b = append(b, ':')
			var err error
			if b, err = elem(e, b, v.MapIndex(k)); err != nil {
				return b, err
			}
			if b, err = e.spill(b); err != nil {
				return b, err
			}
		}
		return append(b, '}'), nil
	}
}

// structField is one encoded field: its index, its key written out
// (`"name":`), whether it is left out when empty, and its encoder.
type structField struct {
	index     int
	key       []byte
	omitEmpty bool
	enc       encoderFunc
}

// structEncoder encodes the exported fields in declaration order under
// their tag names, as encoding/json does; a struct with an embedded field,
// a ",string" option or a tag name encoding/json would not take is left
// to encoding/json.
func structEncoder(t reflect.Type) encoderFunc {
	var fields []structField
	for i := range t.NumField() {
		f := t.Field(i)
		if f.Anonymous {
			return fallback
		}
		if !f.IsExported() {
			continue
		}
		tag := f.Tag.Get("json")
		if tag == "-" {
			continue
		}
		name, opts, _ := cutComma(tag)
		if name == "" {
			name = f.Name
		}
		if !plainKey(name) || hasOption(opts, "string") || hasOption(opts, "omitzero") {
			return fallback
		}
		fields = append(fields, structField{index: i, key: append(appendString(nil, name), ':'),
			omitEmpty: hasOption(opts, "omitempty"), enc: buildEncoder(f.Type)})
	}
	return func(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
		b = append(b, '{')
		first := true
		for _, f := range fields {
			fv := v.Field(f.index)
			if f.omitEmpty && isEmpty(fv) {
				continue
			}
			if !first {
				b = append(b, ',')
			}
			first = false
			b = append(b, f.key...)
			var err error
			if b, err = f.enc(e, b, fv); err != nil {
				return b, err
			}
			if b, err = e.spill(b); err != nil {
				return b, err
			}
		}
		return append(b, '}'), nil
	}
}

func cutComma(tag string) (name, opts string, found bool) {
	for i := range len(tag) {
		if tag[i] == ',' {
			return tag[:i], tag[i+1:], true
		}
	}
	return tag, "", false
}

func hasOption(opts, want string) bool {
	for opts != "" {
		var o string
		o, opts, _ = cutComma(opts)
		if o == want {
			return true
		}
	}
	return false
}

// plainKey reports whether a tag name is made of letters, digits and
// "_-" only: such a name encoding/json takes as it is, and it needs no
// escaping.
func plainKey(name string) bool {
	for _, r := range name {
		if !(r == '_' || r == '-' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9') {
			return false
		}
	}
	return name != ""
}

// isEmpty is encoding/json's test for omitempty.
func isEmpty(v reflect.Value) bool {
	switch v.Kind() {
	case reflect.Array, reflect.Map, reflect.Slice, reflect.String:
		return v.Len() == 0
	case reflect.Bool:
		return !v.Bool()
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		return v.Int() == 0
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		return v.Uint() == 0
	case reflect.Float32, reflect.Float64:
		return v.Float() == 0
	case reflect.Interface, reflect.Pointer:
		return v.IsNil()
	}
	return false
}

// appendFloat writes f as encoding/json writes a float64: the shortest
// decimal that reads back as f, in plain notation for 1e-6 ≤ |f| < 1e21
// (and 0, "-0" for negative zero) and in exponent notation otherwise, with
// a one-digit negative exponent unpadded ("1e-7", not "1e-07"). NaN and
// infinities are refused.
func appendFloat(b []byte, f float64) ([]byte, error) {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return b, errFallback
	}
	abs := math.Abs(f)
	format := byte('f')
	if abs != 0 && (abs < 1e-6 || abs >= 1e21) {
		format = 'e'
	}
	b = strconv.AppendFloat(b, f, format, -1, 64)
	if format == 'e' {
		if n := len(b); n >= 4 && b[n-4] == 'e' && b[n-3] == '-' && b[n-2] == '0' {
			b[n-2] = b[n-1]
			b = b[:n-1]
		}
	}
	return b, nil
}

// checkFinite refuses what appendFloat refuses.
func checkFinite(f float64) error {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return errFallback
	}
	return nil
}

// checkAllFinite is checkFinite of every value.
func checkAllFinite(x []float64) error {
	for _, f := range x {
		if err := checkFinite(f); err != nil {
			return err
		}
	}
	return nil
}

// parallelFloats is the number of values from which an array of numbers
// is written in pieces on all processors at once (each piece into a buffer
// of its own, joined in order, so the bytes do not depend on the number of
// processors).
const parallelFloats = 1 << 14

func encodeFloats(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
	if v.IsNil() {
		return append(b, "null"...), nil
	}
	x := floatsOf(v)
	if e.dry {
		return b, checkAllFinite(x)
	}
	b = append(b, '[')
	b, err := e.inPieces(b, len(x), len(x), func(b []byte, lo, hi int) ([]byte, error) {
		return appendFloats(b, x[lo:hi], lo == 0)
	})
	if err != nil {
		return b, err
	}
	return append(b, ']'), nil
}

func encodeFloatRows(e *encodeState, b []byte, v reflect.Value) ([]byte, error) {
	if v.IsNil() {
		return append(b, "null"...), nil
	}
	rows := unsafe.Slice((*[]float64)(v.UnsafePointer()), v.Len())
	if e.dry {
		for _, r := range rows {
			if err := checkAllFinite(r); err != nil {
				return b, err
			}
		}
		return b, nil
	}
	count := 0
	for _, r := range rows {
		count += len(r)
	}
	b = append(b, '[')
	b, err := e.inPieces(b, len(rows), count, func(b []byte, lo, hi int) ([]byte, error) {
		for i, r := range rows[lo:hi] {
			if lo+i > 0 {
				b = append(b, ',')
			}
			if r == nil {
				b = append(b, "null"...)
				continue
			}
			b = append(b, '[')
			var err error
			if b, err = appendFloats(b, r, true); err != nil {
				return b, err
			}
			b = append(b, ']')
		}
		return b, nil
	})
	if err != nil {
		return b, err
	}
	return append(b, ']'), nil
}

// floatsOf returns the []float64 v holds, without the allocation that
// v.Interface() makes for a slice reached through a pointer or a field
// (one per array: a frame's members have eight each).
func floatsOf(v reflect.Value) []float64 {
	return unsafe.Slice((*float64)(v.UnsafePointer()), v.Len())
}

// appendFloats writes x separated by commas, with a comma before the first
// unless first.
func appendFloats(b []byte, x []float64, first bool) ([]byte, error) {
	for i, f := range x {
		if i > 0 || !first {
			b = append(b, ',')
		}
		var err error
		if b, err = appendFloat(b, f); err != nil {
			return b, err
		}
	}
	return b, nil
}

// inPieces appends write(b, 0, n). When the values number at least
// parallelFloats it splits [0, n) into one piece per processor, written
// side by side, each into a buffer of its own sized for its values (24
// bytes each with the comma, their usual width at most); b and the pieces
// go to e's chunks (or, streaming, to the sink) and the text after them
// to a fresh buffer, which it returns. The bytes do not depend on the number of processors.
func (e *encodeState) inPieces(b []byte, n, values int, write func(b []byte, lo, hi int) ([]byte, error)) ([]byte, error) {
	if values < parallelFloats || n < 2 {
		return write(slices.Grow(b, 24*values+n+2), 0, n)
	}
	pieces := min(runtime.GOMAXPROCS(0), n)
	out := make([][]byte, pieces)
	errs := make([]error, pieces)
	var wg sync.WaitGroup
	for k := 1; k < pieces; k++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			lo, hi := k*n/pieces, (k+1)*n/pieces
			out[k], errs[k] = write(make([]byte, 0, (24*values/n+1)*(hi-lo)), lo, hi)
		}()
	}
	out[0], errs[0] = write(make([]byte, 0, (24*values/n+1)*(n/pieces)), 0, n/pieces)
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return b, err
		}
	}
	if e.sink != nil {
		return e.sendPieces(b, out)
	}
	e.chunks = append(append(e.chunks, b), out...)
	return make([]byte, 0, 4096), nil
}

// sendPieces sends b and an array's pieces to the sink, in order (after
// the dry pass, the first time), and returns a buffer to go on in.
func (e *encodeState) sendPieces(b []byte, pieces [][]byte) ([]byte, error) {
	if err := e.start(); err != nil {
		return b, err
	}
	e.sink.send(b)
	for _, p := range pieces {
		e.sink.send(p)
	}
	return e.sink.buffer(), nil
}

const hexDigits = "0123456789abcdef"

// appendString writes s as a JSON string as encoding/json does without
// HTML escaping: quote, backslash and control characters escaped (\b, \f,
// \n, \r, \t by name, the others as \u00XX), invalid UTF-8 as \ufffd, and
// U+2028 and U+2029 as \u2028 and \u2029.
func appendString(b []byte, s string) []byte {
	b = append(b, '"')
	start := 0
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			if c >= 0x20 && c != '"' && c != '\\' {
				i++
				continue
			}
			b = append(b, s[start:i]...)
			switch c {
			case '"', '\\':
				b = append(b, '\\', c)
			case '\b':
				b = append(b, '\\', 'b')
			case '\f':
				b = append(b, '\\', 'f')
			case '\n':
				b = append(b, '\\', 'n')
			case '\r':
				b = append(b, '\\', 'r')
			case '\t':
				b = append(b, '\\', 't')
			default:
				b = append(b, '\\', 'u', '0', '0', hexDigits[c>>4], hexDigits[c&0xf])
			}
			i++
			start = i
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			b = append(b, s[start:i]...)
			b = append(b, `\ufffd`...)
			i += size
			start = i
			continue
		}
		if r == '\u2028' || r == '\u2029' {
			b = append(b, s[start:i]...)
			b = append(b, '\\', 'u', '2', '0', '2', hexDigits[r&0xf])
			i += size
			start = i
			continue
		}
		i += size
	}
	b = append(b, s[start:]...)
	return append(b, '"')
}
