package schema

import (
	"fmt"
	"reflect"
	"strconv"
	"strings"
	"sync"

	"gusset/protocol"
)

// maxBoundProblems caps the problems CheckBounds reports.
const maxBoundProblems = 100

// CheckBounds walks a decoded params value (a pointer to, or a value of, a
// protocol params type) and reports every array whose length lies outside
// the minItems and maxItems of its field's jsonschema tag, the bounds the
// published schema states, with its JSON pointer relative to the value
// ("/model/members/3/ends"). It sees every element, which the sampled
// validation does not, and it costs one pass over the value's slices.
// Fields that are Go arrays cannot be checked (decoding drops extra
// entries): the schema's bounded arrays are all slices, which a test keeps
// true.
func CheckBounds(value any) []protocol.Problem {
	var w boundsWalk
	if v := reflect.ValueOf(value); v.IsValid() {
		w.walk(v, boundsOf(v.Type()))
	}
	return w.problems
}

// bound is one bounded slice field of a struct type.
type bound struct {
	index    int
	name     string
	min, max int // −1 when absent
}

// deepField is a field whose values can hold a bounded slice.
type deepField struct {
	index int
	name  string
	tb    *typeBounds
}

// typeBounds is what the walk needs to know of a type, with the entries
// of the types inside it linked, so that the walk looks nothing up.
type typeBounds struct {
	// deep reports whether values of the type can hold a bounded slice
	// anywhere inside; the walk skips the others whole.
	deep    bool
	bounded []bound     // structs: the bounded slice fields
	fields  []deepField // structs: the deep fields
	elem    *typeBounds // pointers, slices, arrays, maps: the element's
}

var (
	boundsCache sync.Map // reflect.Type -> *typeBounds, complete entries only
	boundsMu    sync.Mutex
)

// boundsOf returns what the walk needs to know of t, building it (and the
// entries of every type inside t) once.
func boundsOf(t reflect.Type) *typeBounds {
	if tb, ok := boundsCache.Load(t); ok {
		return tb.(*typeBounds)
	}
	boundsMu.Lock()
	defer boundsMu.Unlock()
	building := map[reflect.Type]*typeBounds{}
	tb := buildBounds(t, building)
	settleDepth(building)
	for k, v := range building {
		boundsCache.Store(k, v)
	}
	return tb
}

func buildBounds(t reflect.Type, building map[reflect.Type]*typeBounds) *typeBounds {
	if tb, ok := boundsCache.Load(t); ok {
		return tb.(*typeBounds)
	}
	if tb, ok := building[t]; ok {
		return tb // a cycle: the entry is being filled
	}
	tb := &typeBounds{}
	building[t] = tb
	switch t.Kind() {
	case reflect.Pointer, reflect.Slice, reflect.Array, reflect.Map:
		tb.elem = buildBounds(t.Elem(), building)
	case reflect.Interface:
		tb.deep = true // the dynamic type decides
	case reflect.Struct:
		for i := range t.NumField() {
			f := t.Field(i)
			if !f.IsExported() {
				continue
			}
			b := bound{index: i, name: jsonName(f), min: tagInt(f, "minItems"), max: tagInt(f, "maxItems")}
			if b.min >= 0 || b.max >= 0 {
				tb.bounded = append(tb.bounded, b)
			}
			tb.fields = append(tb.fields, deepField{index: i, name: b.name, tb: buildBounds(f.Type, building)})
		}
	}
	return tb
}

// settleDepth marks deep every new entry that holds a bounded slice at
// any depth (repeating until nothing changes, for cycles) and keeps only
// the deep fields of each struct.
func settleDepth(building map[reflect.Type]*typeBounds) {
	for changed := true; changed; {
		changed = false
		for _, tb := range building {
			deep := tb.deep || len(tb.bounded) > 0 || (tb.elem != nil && tb.elem.deep)
			for _, f := range tb.fields {
				deep = deep || f.tb.deep
			}
			if deep && !tb.deep {
				tb.deep, changed = true, true
			}
		}
	}
	for _, tb := range building {
		kept := tb.fields[:0]
		for _, f := range tb.fields {
			if f.tb.deep {
				kept = append(kept, f)
			}
		}
		tb.fields = kept
	}
}

func jsonName(f reflect.StructField) string {
	name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
	if name == "" {
		return f.Name
	}
	return name
}

// tagInt returns the value of key=N in the field's jsonschema tag, or −1.
func tagInt(f reflect.StructField, key string) int {
	for _, part := range strings.Split(f.Tag.Get("jsonschema"), ",") {
		if v, ok := strings.CutPrefix(part, key+"="); ok {
			if n, err := strconv.Atoi(v); err == nil {
				return n
			}
		}
	}
	return -1
}

// segment is one step of a JSON pointer: a name, or an index when name is
// empty. The walk keeps a stack of them and joins them only for a problem,
// so that it allocates nothing per element.
type segment struct {
	name  string
	index int
}

type boundsWalk struct {
	path     []segment
	problems []protocol.Problem
}

func (w *boundsWalk) pointer(last string) string {
	var b strings.Builder
	for _, s := range w.path {
		b.WriteByte('/')
		if s.name != "" {
			b.WriteString(escape(s.name))
		} else {
			b.WriteString(strconv.Itoa(s.index))
		}
	}
	b.WriteByte('/')
	b.WriteString(last)
	return b.String()
}

func (w *boundsWalk) walk(v reflect.Value, tb *typeBounds) {
	if !tb.deep || len(w.problems) >= maxBoundProblems {
		return
	}
	switch v.Kind() {
	case reflect.Interface:
		if !v.IsNil() {
			w.walk(v.Elem(), boundsOf(v.Elem().Type()))
		}
	case reflect.Pointer:
		if !v.IsNil() {
			w.walk(v.Elem(), tb.elem)
		}
	case reflect.Slice, reflect.Array:
		if !tb.elem.deep {
			return
		}
		for i := range v.Len() {
			w.path = append(w.path, segment{index: i})
			w.walk(v.Index(i), tb.elem)
			w.path = w.path[:len(w.path)-1]
		}
	case reflect.Map:
		if !tb.elem.deep {
			return
		}
		iter := v.MapRange()
		for iter.Next() {
			w.path = append(w.path, segment{name: fmt.Sprint(iter.Key().Interface())})
			w.walk(iter.Value(), tb.elem)
			w.path = w.path[:len(w.path)-1]
		}
	case reflect.Struct:
		w.structure(v, tb)
	}
}

// structure checks the bounded fields of the struct v and walks into its
// deep fields.
func (w *boundsWalk) structure(v reflect.Value, tb *typeBounds) {
	for _, b := range tb.bounded {
		f := v.Field(b.index)
		if f.Kind() != reflect.Slice || f.IsNil() {
			continue // absent: required fields are the schema's to check
		}
		switch n := f.Len(); {
		case b.max >= 0 && n > b.max:
			w.problems = append(w.problems, protocol.Problem{Path: w.pointer(b.name),
				Message: fmt.Sprintf("%s has %d entries; at most %d are allowed", b.name, n, b.max)})
		case b.min >= 0 && n < b.min:
			w.problems = append(w.problems, protocol.Problem{Path: w.pointer(b.name),
				Message: fmt.Sprintf("%s has %d entries; at least %d are needed", b.name, n, b.min)})
		}
	}
	for _, f := range tb.fields {
		w.path = append(w.path, segment{name: f.name})
		w.walk(v.Field(f.index), f.tb)
		w.path = w.path[:len(w.path)-1]
	}
}
