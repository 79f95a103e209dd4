package model

import (
	"strconv"
	"strings"
)

// idIndex finds the elements of one input array by id. When the ids are
// in the dense form prefix+i (n0, n1, n2, ... with i the element's
// position, written in decimal without leading zeros, as generated models
// and many hosts number them), an id is resolved by reading its number,
// without a map: on a model of 100,000 members a map lookup per member end
// was most of the compiler's time. Other ids go through a map holding the
// first element of each id.
type idIndex struct {
	n      int
	id     func(int) string
	prefix string
	dense  bool
	index  map[string]int
}

// newIDIndex indexes the n ids id(0), ..., id(n-1), and reports each empty
// or repeated id to the compiler with its pointer (see compiler.ids).
func (c *compiler) newIDIndex(kind, array string, n int, id func(int) string) *idIndex {
	x := &idIndex{n: n, id: id}
	if x.prefix, x.dense = denseIDs(n, id); !x.dense {
		x.index = make(map[string]int, n)
		c.ids(kind, array, n, id, x.index)
	}
	return x
}

// denseIDs reports whether the n ids are prefix+i for one prefix, and
// returns that prefix. Such ids are neither empty nor repeated.
func denseIDs(n int, id func(int) string) (prefix string, ok bool) {
	if n == 0 {
		return "", false
	}
	first := id(0)
	if !strings.HasSuffix(first, "0") {
		return "", false
	}
	prefix = first[:len(first)-1]
	var digits [20]byte
	for i := range n {
		s := id(i)
		number := strconv.AppendInt(digits[:0], int64(i), 10)
		if len(s) != len(prefix)+len(number) || s[:len(prefix)] != prefix || s[len(prefix):] != string(number) {
			return "", false
		}
	}
	return prefix, true
}

// find returns the position of the element with the given id (the first,
// should the id repeat) and whether there is one.
func (x *idIndex) find(s string) (int, bool) {
	if !x.dense {
		j, ok := x.index[s]
		return j, ok
	}
	digits, ok := strings.CutPrefix(s, x.prefix)
	if !ok || len(digits) == 0 || len(digits) > 18 {
		return 0, false
	}
	j := 0
	for k := 0; k < len(digits); k++ {
		d := digits[k]
		if d < '0' || d > '9' {
			return 0, false
		}
		j = 10*j + int(d-'0')
	}
	// The position's own id is the one candidate: "n007" names no node
	// when node 7 is "n7".
	if j >= x.n || x.id(j) != s {
		return 0, false
	}
	return j, true
}
