package protocol

import (
	"encoding"
	"encoding/json"
	"errors"
	"reflect"
	"strconv"
	"strings"
	"sync"
	"unicode/utf8"
)

// errUnhandled is DecodeStrict's answer for input it leaves to
// encoding/json.
var errUnhandled = errors.New("protocol: input left to encoding/json")

// DecodeStrict decodes data, one JSON value with optional white space
// around it, into the value v points to, exactly as a json.Decoder with
// DisallowUnknownFields would, in one pass and without encoding/json's
// reflection per value, for the inputs it handles: objects whose keys
// match a field's name exactly, strings without escapes, numbers, booleans,
// null, arrays and maps with string keys, and the Number and SweepAxes
// types. On any other input (an escape in a string, a key that matches
// only case-insensitively or not at all, invalid UTF-8, a number out of
// range, a value of the wrong type, a syntax error) it returns an error
// without saying more, having perhaps written part of v: the caller then
// decodes v again with encoding/json, which gives the precise error or the
// same result: v must point to a zero value, and DecodeStrict leaves it
// zero when it fails. TestDecodeStrictAgreesWithEncodingJSON checks that
// whatever DecodeStrict accepts decodes to the same value as encoding/json.
func DecodeStrict(data []byte, v any) error {
	rv := reflect.ValueOf(v)
	if rv.Kind() != reflect.Pointer || rv.IsNil() {
		return errUnhandled
	}
	d := &decoder{data: data}
	return d.top(rv)
}

// top decodes data, one value with optional white space around it, into
// the value the pointer rv points to, and zeroes that value when it
// declines.
func (d *decoder) top(rv reflect.Value) error {
	d.space()
	err := d.value(rv.Elem(), codecOf(rv.Elem().Type()), 0)
	d.space()
	if err == nil && d.pos != len(d.data) {
		err = errUnhandled
	}
	if err != nil {
		rv.Elem().SetZero()
	}
	return err
}

// decoder reads data from pos on.
type decoder struct {
	data []byte
	pos  int
	// last holds the last string decoded into each string field, by the
	// field's slot: a model's members mostly repeat one material, section
	// and type, and a repeated value is then not allocated again.
	last []string
	// The lists being decoded, reused: each list is then allocated once,
	// at its length.
	numberList []Number
	floatList  []float64
	stringList []string
	// Blocks the lists are cut from (see carve).
	numberSlab []Number
	floatSlab  []float64
	stringSlab []string
	// sinks take the elements of some arrays (see DecodeStrictEach).
	sinks []Sink
}

// maxDepth bounds the nesting DecodeStrict follows (encoding/json's own
// bound is 10,000).
const maxDepth = 500

var (
	numberPtrType       = reflect.TypeOf((*Number)(nil))
	numberSliceType     = reflect.TypeOf([]Number(nil))
	float64SliceType    = reflect.TypeOf([]float64(nil))
	stringSliceType     = reflect.TypeOf([]string(nil))
	unmarshalerType     = reflect.TypeOf((*json.Unmarshaler)(nil)).Elem()
	textUnmarshalerType = reflect.TypeOf((*encoding.TextUnmarshaler)(nil)).Elem()
)

func (d *decoder) space() {
	for d.pos < len(d.data) {
		switch d.data[d.pos] {
		case ' ', '\t', '\n', '\r':
			d.pos++
		default:
			return
		}
	}
}

// value decodes the value at pos into v, whose type's codec is c.
// Pointers are followed (and allocated) first, then a type with its own
// decoding gets the raw value, as encoding/json's indirect does.
func (d *decoder) value(v reflect.Value, c *codec, depth int) error {
	if depth > maxDepth || d.pos >= len(d.data) {
		return errUnhandled
	}
	if d.data[d.pos] == 'n' {
		return d.null(v, c)
	}
	switch c.how {
	case viaPointer:
		if v.IsNil() {
			v.Set(reflect.New(c.t.Elem()))
		}
		return d.value(v.Elem(), c.elem, depth+1)
	case asNumber:
		return d.number(v.Addr().Interface().(*Number))
	case asNumbers:
		return d.numbers(v.Addr().Interface().(*[]Number))
	case asFloats:
		return d.floats(v.Addr().Interface().(*[]float64))
	case asStrings:
		return d.strings(v.Addr().Interface().(*[]string))
	case viaUnmarshaler:
		return d.unmarshaler(v.Addr().Interface().(json.Unmarshaler))
	case asStruct:
		return d.object(v, c, depth)
	case asSlice:
		return d.array(v, c, depth)
	case asMap:
		return d.mapping(v, c, depth)
	case asString:
		s, err := d.str()
		v.SetString(s)
		return err
	case asBool:
		return d.boolean(v)
	case asFloat:
		f, err := d.parseFloat()
		v.SetFloat(f)
		return err
	case asInt:
		return d.integer(v)
	}
	return errUnhandled
}

// null reads a null: it sets a pointer, slice, map or interface to nil
// and leaves any other value as it is, as encoding/json does; a value
// with its own decoding, which would get the null, is left to
// encoding/json.
func (d *decoder) null(v reflect.Value, c *codec) error {
	if !d.literal("null") {
		return errUnhandled
	}
	switch {
	case c.how == viaPointer:
		v.SetZero()
	case c.ownNull:
		return errUnhandled
	case c.how == asSlice || c.how == asMap || c.how == asNumbers || c.how == asFloats || c.how == asStrings:
		v.SetZero()
	}
	return nil
}

// literal consumes word if it stands at pos.
func (d *decoder) literal(word string) bool {
	if !strings.HasPrefix(string(d.data[d.pos:min(len(d.data), d.pos+len(word))]), word) {
		return false
	}
	d.pos += len(word)
	return true
}

func (d *decoder) boolean(v reflect.Value) error {
	switch {
	case d.literal("true"):
		v.SetBool(true)
	case d.literal("false"):
		v.SetBool(false)
	default:
		return errUnhandled
	}
	return nil
}

// unmarshaler hands the raw value at pos to u's own decoding.
func (d *decoder) unmarshaler(u json.Unmarshaler) error {
	start := d.pos
	if err := d.valid(0); err != nil {
		return err
	}
	if u.UnmarshalJSON(d.data[start:d.pos]) != nil {
		return errUnhandled
	}
	return nil
}

// numberToken returns the number at pos, checked against JSON's grammar
// (RFC 8259, section 6), and moves past it.
func (d *decoder) numberToken() ([]byte, error) {
	b, i := d.data, d.pos
	start := i
	if i < len(b) && b[i] == '-' {
		i++
	}
	switch {
	case i < len(b) && b[i] == '0':
		i++
	case i < len(b) && b[i] >= '1' && b[i] <= '9':
		for i < len(b) && b[i] >= '0' && b[i] <= '9' {
			i++
		}
	default:
		return nil, errUnhandled
	}
	if i < len(b) && b[i] == '.' {
		i++
		if i >= len(b) || b[i] < '0' || b[i] > '9' {
			return nil, errUnhandled
		}
		for i < len(b) && b[i] >= '0' && b[i] <= '9' {
			i++
		}
	}
	if i < len(b) && (b[i] == 'e' || b[i] == 'E') {
		i++
		if i < len(b) && (b[i] == '+' || b[i] == '-') {
			i++
		}
		if i >= len(b) || b[i] < '0' || b[i] > '9' {
			return nil, errUnhandled
		}
		for i < len(b) && b[i] >= '0' && b[i] <= '9' {
			i++
		}
	}
	d.pos = i
	return b[start:i], nil
}

// parseFloat reads a number as encoding/json does for a float64.
func (d *decoder) parseFloat() (float64, error) {
	tok, err := d.numberToken()
	if err != nil {
		return 0, err
	}
	f, err := strconv.ParseFloat(string(tok), 64)
	if err != nil {
		return 0, errUnhandled
	}
	return f, nil
}

func (d *decoder) integer(v reflect.Value) error {
	tok, err := d.numberToken()
	if err != nil {
		return err
	}
	n, err := strconv.ParseInt(string(tok), 10, 64)
	if err != nil || v.OverflowInt(n) {
		return errUnhandled
	}
	v.SetInt(n)
	return nil
}

// str reads a string without escapes or control characters, in valid
// UTF-8, and moves past it.
func (d *decoder) str() (string, error) {
	b, err := d.strBytes()
	return string(b), err
}

// strBytes is str without the copy: the bytes alias the input.
func (d *decoder) strBytes() ([]byte, error) {
	b := d.data
	if d.pos >= len(b) || b[d.pos] != '"' {
		return nil, errUnhandled
	}
	start := d.pos + 1
	ascii := true
	for i := start; i < len(b); i++ {
		if plainText[b[i]] {
			continue
		}
		switch c := b[i]; {
		case c == '"':
			if !ascii && !utf8.Valid(b[start:i]) {
				return nil, errUnhandled
			}
			d.pos = i + 1
			return b[start:i], nil
		case c == '\\' || c < 0x20:
			return nil, errUnhandled
		case c >= utf8.RuneSelf:
			ascii = false
		}
	}
	return nil, errUnhandled
}

// plainText marks the bytes a string holds as they are: printable ASCII
// other than the quote and the backslash.
var plainText = func() (t [256]bool) {
	for c := 0x20; c < 0x80; c++ {
		t[c] = c != '"' && c != '\\'
	}
	return t
}()

// number reads a Number: a plain number, or a string holding an
// expression.
func (d *decoder) number(n *Number) error {
	if d.pos < len(d.data) && d.data[d.pos] == '"' {
		s, err := d.str()
		*n = Number{Expr: s, IsExpr: true}
		return err
	}
	f, err := d.parseFloat()
	*n = Number{Value: f}
	return err
}

// open consumes the opening bracket at pos and reports whether the
// container closes at once (an empty array or object).
func (d *decoder) open(opening, closing byte) (empty bool, err error) {
	if d.pos >= len(d.data) || d.data[d.pos] != opening {
		return false, errUnhandled
	}
	d.pos++
	d.space()
	if d.pos < len(d.data) && d.data[d.pos] == closing {
		d.pos++
		return true, nil
	}
	return false, nil
}

// next consumes the comma or the closing bracket after an element and
// reports whether the container has ended.
func (d *decoder) next(closing byte) (done bool, err error) {
	d.space()
	switch {
	case d.pos >= len(d.data):
		return false, errUnhandled
	case d.data[d.pos] == ',':
		d.pos++
		d.space()
		return false, nil
	case d.data[d.pos] == closing:
		d.pos++
		return true, nil
	}
	return false, errUnhandled
}

// elements calls each for every element of the array at pos; each
// decodes one element at pos.
func (d *decoder) elements(each func() error) error {
	empty, err := d.open('[', ']')
	for !empty && err == nil {
		if d.pos >= len(d.data) {
			return errUnhandled
		}
		if err = each(); err == nil {
			empty, err = d.next(']')
		}
	}
	return err
}

// list decodes the array at pos with one into a slice of T: never nil,
// as encoding/json makes an empty array an empty slice. A null element
// gets null's value, or declines the input when null is nil.
func list[T any](d *decoder, scratch, slab *[]T, one func() (T, error), null func() (T, bool)) ([]T, error) {
	out := (*scratch)[:0]
	defer func() { *scratch = out[:0] }()
	err := d.elements(func() error {
		if d.data[d.pos] == 'n' {
			v, ok := null()
			if !ok || !d.literal("null") {
				return errUnhandled
			}
			out = append(out, v)
			return nil
		}
		v, err := one()
		out = append(out, v)
		return err
	})
	return append(carve(slab, len(out)), out...), err
}

// slabSize is the number of elements in a block that carve cuts lists
// from.
const slabSize = 1024

// carve returns an empty slice with room for n elements, cut from the
// block slab (allocated again when the rest is too short) when n is small,
// so that the many short lists of a model (a node's coordinates, a
// member's ends) are not one allocation each. The slice's capacity is n:
// appending to it never writes into the block.
func carve[T any](slab *[]T, n int) []T {
	switch {
	case n == 0:
		return []T{}
	case n > slabSize/8:
		return make([]T, 0, n)
	case len(*slab) < n:
		*slab = make([]T, slabSize)
	}
	out := (*slab)[:0:n]
	*slab = (*slab)[n:]
	return out
}

func (d *decoder) numbers(dst *[]Number) (err error) {
	// A null into a Number is its own decoding's error: declined.
	*dst, err = list(d, &d.numberList, &d.numberSlab, func() (n Number, err error) { return n, d.number(&n) }, func() (Number, bool) { return Number{}, false })
	return err
}

func (d *decoder) floats(dst *[]float64) (err error) {
	// A null leaves a float as it is: zero here.
	*dst, err = list(d, &d.floatList, &d.floatSlab, d.parseFloat, func() (float64, bool) { return 0, true })
	return err
}

func (d *decoder) strings(dst *[]string) (err error) {
	*dst, err = list(d, &d.stringList, &d.stringSlab, d.str, func() (string, bool) { return "", true })
	return err
}

// array decodes an array into the slice v, which is nil (a zero value is
// decoded into: see DecodeStrict); c is the slice type's codec.
func (d *decoder) array(v reflect.Value, c *codec, depth int) error {
	if s := d.sinkFor(c.elem.t); s != nil {
		return d.drain(v, c, s, depth)
	}
	out := reflect.New(c.t).Elem() // addressable, so that it grows
	out.Set(reflect.MakeSlice(c.t, 0, 0))
	n, counted := 0, c.elem.how != asStruct
	err := d.elements(func() error {
		if n == out.Cap() {
			grow := max(4, n)
			if n >= presizeAfter && !counted {
				// A long array of objects (a model's nodes or members):
				// size it once rather than allocate and copy it again
				// at every doubling.
				grow, counted = max(grow, d.remaining()), true
			}
			out.Grow(grow)
		}
		out.SetLen(n + 1)
		n++
		return d.value(out.Index(n-1), c.elem, depth+1)
	})
	v.Set(out)
	return err
}

// presizeAfter is the number of elements of an array of objects after
// which DecodeStrict counts the rest before it grows the slice.
const presizeAfter = 64

// remaining returns the number of elements from pos, the start of an
// element, to the end of the array that holds it, by counting the array's
// own commas outside strings. It does not check the syntax (the decode
// does): on malformed input the count is only a poor capacity.
func (d *decoder) remaining() int {
	b := d.data
	depth, n := 0, 1
	for i := d.pos; i < len(b); i++ {
		if !structural[b[i]] {
			continue
		}
		switch b[i] {
		case '"':
			for i++; i < len(b) && b[i] != '"'; i++ {
				if b[i] == '\\' {
					i++
				}
			}
		case '[', '{':
			depth++
		case ']', '}':
			if depth == 0 {
				return n
			}
			depth--
		case ',':
			if depth == 0 {
				n++
			}
		}
	}
	return n
}

// structural marks the bytes remaining looks at.
var structural = [256]bool{'"': true, '[': true, '{': true, ']': true, '}': true, ',': true}

// how tells how DecodeStrict decodes a type.
type how uint8

const (
	unhandled      how = iota
	viaPointer         // allocate, then decode the element
	asNumber           // Number
	asNumbers          // []Number
	asFloats           // []float64
	asStrings          // []string
	viaUnmarshaler     // the type's own UnmarshalJSON on the raw value
	asStruct
	asSlice
	asMap // with string keys
	asString
	asBool
	asFloat // float64
	asInt
)

// codec is how DecodeStrict decodes one type: for a pointer, slice or map
// its element's codec; for a struct its fields by exact JSON name.
type codec struct {
	how     how
	t       reflect.Type
	elem    *codec
	fields  map[string]field
	order   []namedField // a struct's fields in declaration order
	count   int          // a struct's fields
	ownNull bool         // a null goes to the type's own decoding
}

// namedField is a struct field with its JSON name.
type namedField struct {
	name string
	field
}

// field is a struct field: its index and codec, and for a string field
// its slot in decoder.last.
type field struct {
	index int
	codec *codec
	slot  int
}

var (
	codecsMu    sync.Mutex
	codecs      = map[reflect.Type]*codec{}
	stringSlots int // string fields numbered so far
)

// codecOf returns t's codec, built once per type.
func codecOf(t reflect.Type) *codec {
	codecsMu.Lock()
	defer codecsMu.Unlock()
	return buildCodec(t)
}

// buildCodec builds t's codec; codecsMu is held. A codec enters the map
// before its elements are built, so recursive types terminate.
func buildCodec(t reflect.Type) *codec {
	if c, ok := codecs[t]; ok {
		return c
	}
	c := &codec{t: t}
	codecs[t] = c
	pt := reflect.PointerTo(t)
	c.ownNull = t.Kind() != reflect.Pointer && pt.Implements(unmarshalerType)
	switch {
	case t.Kind() == reflect.Pointer:
		c.how, c.elem = viaPointer, buildCodec(t.Elem())
	case t == numberType:
		c.how = asNumber
	case t == numberSliceType:
		c.how = asNumbers
	case t == float64SliceType:
		c.how = asFloats
	case t == stringSliceType:
		c.how = asStrings
	case pt.Implements(unmarshalerType):
		c.how = viaUnmarshaler
	case pt.Implements(textUnmarshalerType):
		c.how = unhandled
	default:
		buildPlain(c)
	}
	return c
}

// buildPlain fills the codec of a type without its own decoding.
func buildPlain(c *codec) {
	t := c.t
	switch t.Kind() {
	case reflect.Struct:
		c.how, c.fields, c.count = asStruct, map[string]field{}, t.NumField()
		if !structFields(c) {
			c.how, c.fields, c.order = unhandled, nil, nil
		}
	case reflect.Slice:
		c.how, c.elem = asSlice, buildCodec(t.Elem())
	case reflect.Map:
		if t.Key() == reflect.TypeOf("") {
			c.how, c.elem = asMap, buildCodec(t.Elem())
		}
	case reflect.String:
		c.how = asString
	case reflect.Bool:
		c.how = asBool
	case reflect.Float64:
		c.how = asFloat
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		c.how = asInt
	}
}

// structFields fills a struct codec's fields by JSON name; it reports
// false for a struct DecodeStrict leaves to encoding/json (an embedded
// field, a ",string" option, a name encoding/json would not take from the
// tag).
func structFields(c *codec) bool {
	for i := range c.t.NumField() {
		f := c.t.Field(i)
		if f.Anonymous {
			return false
		}
		if !f.IsExported() {
			continue
		}
		tag := f.Tag.Get("json")
		if tag == "-" {
			continue
		}
		name, opts, _ := strings.Cut(tag, ",")
		if strings.Contains(","+opts+",", ",string,") || !plainName(name) {
			return false
		}
		if name == "" {
			name = f.Name
		}
		fc := buildCodec(f.Type)
		c.fields[name] = field{index: i, codec: fc, slot: stringSlots}
		c.order = append(c.order, namedField{name, c.fields[name]})
		if fc.how == asString {
			stringSlots++
		}
	}
	return true
}

// plainName reports whether a tag name is made of letters, digits, '_'
// and '-' only, which encoding/json takes as it is.
func plainName(s string) bool {
	for _, c := range s {
		if !(c == '_' || c == '-' || c >= '0' && c <= '9' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z') {
			return false
		}
	}
	return true
}

// members calls each for every key of the object at pos, with pos at its
// value; each decodes the value.
func (d *decoder) members(each func(key []byte) error) error {
	empty, err := d.open('{', '}')
	for !empty && err == nil {
		var key []byte
		if key, err = d.strBytes(); err != nil {
			return err
		}
		d.space()
		if d.pos >= len(d.data) || d.data[d.pos] != ':' {
			return errUnhandled
		}
		d.pos++
		d.space()
		if err = each(key); err == nil {
			empty, err = d.next('}')
		}
	}
	return err
}

// object decodes an object into the struct v, whose codec is c. A key
// that names no field exactly, or names one twice, is left to
// encoding/json (which matches keys case-insensitively and merges
// repeated ones).
func (d *decoder) object(v reflect.Value, c *codec, depth int) error {
	var seenSmall [64]bool
	seen := seenSmall[:]
	if c.count > len(seen) {
		seen = make([]bool, c.count)
	}
	next := 0 // where the next key is looked for first
	return d.members(func(key []byte) error {
		f, ok := c.field(key, &next)
		if !ok || seen[f.index] {
			return errUnhandled
		}
		seen[f.index] = true
		if f.codec.how == asString && d.pos < len(d.data) && d.data[d.pos] == '"' {
			b, err := d.strBytes()
			v.Field(f.index).SetString(d.intern(f.slot, b))
			return err
		}
		return d.value(v.Field(f.index), f.codec, depth+1)
	})
}

// field returns the field named key. Encoders write an object's keys in
// the order of its type's fields, some left out, so the fields from next
// on are tried first, by name, and next moves past the one found; a key
// out of that order is looked up by hash.
func (c *codec) field(key []byte, next *int) (field, bool) {
	for k := *next; k < len(c.order); k++ {
		if c.order[k].name == string(key) {
			*next = k + 1
			return c.order[k].field, true
		}
	}
	f, ok := c.fields[string(key)]
	return f, ok
}

// intern returns b as a string, the last one decoded into the field of
// that slot when it is the same.
func (d *decoder) intern(slot int, b []byte) string {
	if slot >= len(d.last) {
		d.last = append(d.last, make([]string, slot+1-len(d.last))...)
	}
	if d.last[slot] != string(b) {
		d.last[slot] = string(b)
	}
	return d.last[slot]
}

// mapping decodes an object into the map v with string keys, which is nil
// (see DecodeStrict); a repeated key's last value wins, as in
// encoding/json.
func (d *decoder) mapping(v reflect.Value, c *codec, depth int) error {
	out := reflect.MakeMap(c.t)
	elem := reflect.New(c.t.Elem()).Elem()
	err := d.members(func(key []byte) error {
		elem.SetZero()
		if err := d.value(elem, c.elem, depth+1); err != nil {
			return err
		}
		out.SetMapIndex(reflect.ValueOf(string(key)), elem)
		return nil
	})
	v.Set(out)
	return err
}
