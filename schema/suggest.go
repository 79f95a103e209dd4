package schema

import (
	"encoding/json"
	"regexp"
	"sort"
	"strings"
	"sync"

	"gusset/protocol"
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
	return " (" + didYouMean + " " + strings.Join(hints, ", ") + "?)"
}

// didYouMean opens every hint, so that messages holding one can be found.
const didYouMean = "did you mean"

// Closest returns the name in allowed nearest to name, by the rule of the
// property hints (see closest), or "" when none is near: for a host's
// misspelt method or case name.
func Closest(name string, allowed []string) string { return closest(name, allowed) }

// bareModel returns a problem when params hold a model's own fields but
// no "model" although the method's params (definition def) take one: the
// host forgot the wrapper. It needs two of the model's fields present, so
// that one stray name is left to the ordinary hints.
func bareModel(def string, doc any) *protocol.Problem {
	params, ok := doc.(map[string]any)
	if !ok {
		return nil
	}
	if _, has := params["model"]; has {
		return nil
	}
	defs, _ := document()["$defs"].(map[string]any)
	paramsDef, _ := defs[def].(map[string]any)
	paramsProps, _ := paramsDef["properties"].(map[string]any)
	if _, takesModel := paramsProps["model"]; !takesModel {
		return nil
	}
	modelDef, _ := defs["Model"].(map[string]any)
	modelProps, _ := modelDef["properties"].(map[string]any)
	var found []string
	for name := range params {
		if _, isParam := paramsProps[name]; isParam {
			continue
		}
		if _, isModel := modelProps[name]; isModel {
			found = append(found, "'"+name+"'")
		}
	}
	if len(found) < 2 {
		return nil
	}
	sort.Strings(found)
	return &protocol.Problem{Path: "/params", Message: "the params hold a model's fields (" + strings.Join(found, ", ") +
		") but no 'model': wrap the model, as {\"model\": {\"dimension\": …, \"nodes\": …}}, and put the method's own params beside it"}
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
