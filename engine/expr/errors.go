package expr

import (
	"errors"
	"fmt"
	"sort"
	"strings"
)

// SyntaxError is a malformed expression. Pos is the byte offset in the
// source where the problem was found (the length of the source when the
// expression ends too early).
type SyntaxError struct {
	Pos int
	Msg string
}

// Error returns the message with its position.
func (e *SyntaxError) Error() string {
	return fmt.Sprintf("at byte %d: %s", e.Pos, e.Msg)
}

// NameError is a name that is neither a parameter nor a function.
// Candidates are the known names closest to Name in spelling, best first.
type NameError struct {
	Pos        int
	Name       string
	Function   bool     // the name was called as a function
	Known      []string // every name of that kind, sorted
	Candidates []string
}

// Error returns a sentence naming the unknown name and the known ones,
// for example: unknown parameter "dpeth" (did you mean "depth"?);
// parameters are: depth, span.
func (e *NameError) Error() string {
	kind, kinds := "parameter", "parameters"
	if e.Function {
		kind, kinds = "function", "functions"
	}
	var b strings.Builder
	fmt.Fprintf(&b, "unknown %s %q", kind, e.Name)
	if len(e.Candidates) > 0 {
		fmt.Fprintf(&b, " (did you mean %q?)", e.Candidates[0])
	}
	if len(e.Known) == 0 {
		fmt.Fprintf(&b, "; there are no %s", kinds)
		return b.String()
	}
	const maxListed = 20
	listed := e.Known
	if len(listed) > maxListed {
		listed = listed[:maxListed]
	}
	fmt.Fprintf(&b, "; %s are: %s", kinds, strings.Join(listed, ", "))
	if len(e.Known) > maxListed {
		fmt.Fprintf(&b, " and %d more", len(e.Known)-maxListed)
	}
	return b.String()
}

func newNameError(pos int, name string, function bool, known []string) *NameError {
	sorted := append([]string(nil), known...)
	sort.Strings(sorted)
	type scored struct {
		name string
		dist int
	}
	var close []scored
	limit := max(1, len(name)/3)
	for _, k := range sorted {
		if d := editDistance(strings.ToLower(name), strings.ToLower(k)); d <= limit {
			close = append(close, scored{k, d})
		}
	}
	sort.SliceStable(close, func(i, j int) bool { return close[i].dist < close[j].dist })
	candidates := make([]string, len(close))
	for i, c := range close {
		candidates[i] = c.name
	}
	return &NameError{Pos: pos, Name: name, Function: function, Known: sorted, Candidates: candidates}
}

// editDistance is the Damerau–Levenshtein distance (optimal string
// alignment: insertions, deletions, substitutions and transpositions of
// adjacent bytes each cost 1), so "dpeth" is one step from "depth".
func editDistance(a, b string) int {
	prev2 := make([]int, len(b)+1)
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && a[i-1] == b[j-2] && a[i-2] == b[j-1] {
				cur[j] = min(cur[j], prev2[j-2]+1)
			}
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(b)]
}

// Evaluation errors. Eval returns these values (possibly wrapped by
// nothing else), so callers may compare with errors.Is.
var (
	ErrDivisionByZero = errors.New("division by zero")
	ErrSqrtNegative   = errors.New("square root of a negative number")
	ErrNotFinite      = errors.New("result is not a finite number (overflow or undefined operation)")
)
