package schema

import (
	"encoding/json"
	"regexp"
	"sort"
	"strings"
	"sync"
)

// document is the published schema decoded once, for looking up the
// property names allowed where a request has an unknown one.
var document = sync.OnceValue(func() map[string]any {
	var d map[string]any
	if err := json.Unmarshal(Document, &d); err != nil {
		return nil
	}
	return d
})

// quotedNames matches the names in the validator's message
// "additionalProperties 'a', 'b' not allowed".
var quotedNames = regexp.MustCompile(`'([^']*)'`)

// suggestion returns " (did you mean 'x'?)" for each unknown property named
// in message that is close to an allowed property of the object whose
// additionalProperties keyword (at keywordURL, the absolute keyword
// location) refused it, or "" when none is close.
func suggestion(keywordURL, message string) string {
	_, fragment, ok := strings.Cut(keywordURL, "#")
	if !ok {
		return ""
	}
	node := any(document())
	parts := strings.Split(strings.TrimPrefix(fragment, "/"), "/")
	for _, part := range parts[:len(parts)-1] { // the object holding additionalProperties
		m, isMap := node.(map[string]any)
		if !isMap {
			return ""
		}
		node = m[strings.ReplaceAll(strings.ReplaceAll(part, "~1", "/"), "~0", "~")]
	}
	object, _ := node.(map[string]any)
	properties, _ := object["properties"].(map[string]any)
	allowed := make([]string, 0, len(properties))
	for name := range properties {
		allowed = append(allowed, name)
	}
	sort.Strings(allowed)
	var hints []string
	for _, match := range quotedNames.FindAllStringSubmatch(message, -1) {
		if best := closest(match[1], allowed); best != "" {
			hints = append(hints, "'"+best+"' for '"+match[1]+"'")
		}
	}
	if len(hints) == 0 {
		return ""
	}
	return " (did you mean " + strings.Join(hints, ", ") + "?)"
}

// closest returns the allowed name nearest to name: the one at the smallest
// edit distance when that is at most a third of the name's length (at
// least 1), or else one that contains name or is contained in it, ignoring
// case, separators and a plural s; "" when none is near.
func closest(name string, allowed []string) string {
	fold := func(s string) string {
		s = strings.ToLower(strings.NewReplacer("_", "", "-", "", " ", "").Replace(s))
		return strings.TrimSuffix(s, "s")
	}
	folded := make([]string, len(allowed))
	for i, a := range allowed {
		folded[i] = fold(a)
	}
	fn := fold(name)
	best, bestDistance := "", max(1, len([]rune(name))/3)+1
	for i, fa := range folded {
		if d := editDistance(fn, fa); d < bestDistance {
			best, bestDistance = allowed[i], d
		}
	}
	if best != "" {
		return best
	}
	for i, fa := range folded {
		if len(fn) >= 3 && len(fa) >= 3 && (strings.Contains(fa, fn) || strings.Contains(fn, fa)) {
			return allowed[i]
		}
	}
	return ""
}

// editDistance is the Levenshtein distance between a and b (insertions,
// deletions and substitutions of single characters; V. I. Levenshtein,
// 1965), by the usual two-row dynamic programme. engine/expr keeps its own
// (with transpositions) for names in expressions: schema may not import
// engine packages, nor they it.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
