package jsonrpc

import (
	"fmt"
	"strings"
	"unicode/utf8"

	"gusset/protocol"
)

// Messages quote the request where it helps, but never at length: a word
// (a run without spaces, such as a quoted expression) longer than
// maxWord bytes is cut to its first and last few characters around a note
// of its length, so that an error about a 100 kB expression stays a few
// hundred bytes while its position, a word of its own, survives.
const (
	maxWord  = 80
	wordHead = 40
	wordTail = 16
)

// shortened returns e with its message and its problems' messages cut to
// excerpts (e itself when nothing is long).
func shortened(e *protocol.Error) *protocol.Error {
	if e == nil {
		return nil
	}
	long := len(e.Message) > maxWord
	if e.Data != nil {
		for _, p := range e.Data.Problems {
			long = long || len(p.Message) > maxWord
		}
	}
	if !long {
		return e
	}
	out := *e
	out.Message = excerpt(e.Message)
	if e.Data != nil {
		data := *e.Data
		data.Problems = make([]protocol.Problem, len(e.Data.Problems))
		for i, p := range e.Data.Problems {
			data.Problems[i] = protocol.Problem{Path: p.Path, Message: excerpt(p.Message)}
		}
		out.Data = &data
	}
	return &out
}

// excerpt cuts every word of s longer than maxWord bytes.
func excerpt(s string) string {
	words := strings.Split(s, " ")
	changed := false
	for i, w := range words {
		if len(w) > maxWord {
			words[i] = cut(w)
			changed = true
		}
	}
	if !changed {
		return s
	}
	return strings.Join(words, " ")
}

// cut keeps a long word's first wordHead and last wordTail bytes (on rune
// boundaries) and says how many characters were left out.
func cut(w string) string {
	head, tail := wordHead, len(w)-wordTail
	for head > 0 && !utf8.RuneStart(w[head]) {
		head--
	}
	for tail < len(w) && !utf8.RuneStart(w[tail]) {
		tail++
	}
	return fmt.Sprintf("%s…[%d characters]…%s", w[:head], utf8.RuneCountInString(w[head:tail]), w[tail:])
}
