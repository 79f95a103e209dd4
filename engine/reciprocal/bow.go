package reciprocal

import "strconv"

// SpaceLetters returns the Bow's-notation name of lettered space i (from
// 0): A, B, ..., Z, then AA, AB, ..., AZ, BA, ... (bijective base 26, like
// spreadsheet columns). It panics for negative i.
func SpaceLetters(i int) string {
	if i < 0 {
		panic("reciprocal: negative space index")
	}
	var buf [16]byte
	k := len(buf)
	for i++; i > 0; i = (i - 1) / 26 {
		k--
		buf[k] = byte('A' + (i-1)%26)
	}
	return string(buf[k:])
}

// labeller builds many labels into one backing string, so that a network
// of 100k members does not cost 100k small allocations.
type labeller struct {
	buf    []byte
	spans  [][2]int
	spaces int
}

// name appends the name of face f and returns its span index.
func (l *labeller) name(f int) int {
	begin := len(l.buf)
	if f < l.spaces {
		l.buf = append(l.buf, SpaceLetters(f)...)
	} else {
		l.buf = strconv.AppendInt(l.buf, int64(f-l.spaces+1), 10)
	}
	l.spans = append(l.spans, [2]int{begin, len(l.buf)})
	return len(l.spans) - 1
}

// pair appends "a-b" for faces a and b in the given order and returns its
// span index.
func (l *labeller) pair(a, b int) int {
	begin := len(l.buf)
	l.name(a)
	l.buf = append(l.buf, '-')
	l.name(b)
	l.spans = l.spans[:len(l.spans)-2]
	l.spans = append(l.spans, [2]int{begin, len(l.buf)})
	return len(l.spans) - 1
}

// strings returns the labels by span index, all sharing one string.
func (l *labeller) strings() []string {
	all := string(l.buf)
	out := make([]string, len(l.spans))
	for k, s := range l.spans {
		out[k] = all[s[0]:s[1]]
	}
	return out
}
