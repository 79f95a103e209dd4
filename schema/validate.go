package schema

import (
	"bytes"
	_ "embed"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/santhosh-tekuri/jsonschema/v5"

	"gusset/protocol"
)

// ID is the published schema's $id.
const ID = "urn:gusset:protocol:1"

// Document is the published schema, embedded.
//
//go:embed gusset.schema.json
var Document []byte

// MaxProblems caps the problems reported for one request.
const MaxProblems = 50

// Validator validates params against the definition of each method.
type Validator struct {
	ready   chan struct{} // closed once schemas (or err) is set
	err     error
	schemas map[string]*jsonschema.Schema
	params  map[string]string // method -> params definition name
}

// NewValidator compiles the embedded schema's params definitions for the
// given methods (method name -> params definition name).
func NewValidator(params map[string]string) (*Validator, error) {
	v := StartValidator(params)
	<-v.ready
	return v, v.err
}

// StartValidator is NewValidator with the compiling done on another
// goroutine: it returns at once, and every validation waits until the
// schemas are compiled (about 50 ms, which a server spends reading its
// first request meanwhile). A compile failure, a defect of the build that
// the schema's tests catch, makes every validation an internal error.
func StartValidator(params map[string]string) *Validator {
	v := &Validator{ready: make(chan struct{}), params: params}
	go func() {
		defer close(v.ready)
		v.schemas, v.err = compileParams(params)
	}()
	return v
}

// compileParams compiles the params definition of each method.
func compileParams(params map[string]string) (map[string]*jsonschema.Schema, error) {
	c := jsonschema.NewCompiler()
	if err := c.AddResource(ID, bytes.NewReader(Document)); err != nil {
		return nil, fmt.Errorf("schema: embedded document: %w", err)
	}
	schemas := map[string]*jsonschema.Schema{}
	for method, def := range params {
		s, err := c.Compile(ID + "#/$defs/" + def)
		if err != nil {
			return nil, fmt.Errorf("schema: compiling %s: %w", def, err)
		}
		schemas[method] = s
	}
	return schemas, nil
}

// ElideAbove is the array length above which Validate checks only the
// first ElideAbove elements of an array against the schema.
const ElideAbove = 64

// Validate checks a method's params against the schema, looking at only the
// first ElideAbove elements of long arrays: the generic validator costs
// about twenty times a plain decode on a model of 100k members, and the
// rest of every long array is checked by the strict typed decode (unknown
// fields, types) and the model compiler (enums, lengths, ids, ranges) that
// follow it. ValidateFull checks everything; a test keeps the two paths in
// agreement. It returns nil when the params are valid, and otherwise an
// invalid-params error whose problems point into the request
// ("/params/...").
func (v *Validator) Validate(method string, params json.RawMessage) *protocol.Error {
	return v.validate(method, params, true)
}

// ValidateFull checks every element of the params against the schema.
func (v *Validator) ValidateFull(method string, params json.RawMessage) *protocol.Error {
	return v.validate(method, params, false)
}

func (v *Validator) validate(method string, params json.RawMessage, elide bool) *protocol.Error {
	<-v.ready
	if v.err != nil {
		return protocol.NewError(protocol.CodeInternal, "internal error", v.err.Error())
	}
	s := v.schemas[method]
	if s == nil {
		return nil
	}
	dec := json.NewDecoder(bytes.NewReader(params))
	dec.UseNumber()
	var doc any
	if err := dec.Decode(&doc); err != nil {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", "The params could not be read: "+err.Error()+".")
	}
	var problems []protocol.Problem
	outOfRange(doc, "/params", &problems)
	if len(problems) > 0 {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params",
			"A number is outside the range of double precision (about ±1.8e308); use finite values.", problems...)
	}
	if elide {
		doc = elided(doc)
	}
	err := s.Validate(doc)
	if err == nil {
		return nil
	}
	var ve *jsonschema.ValidationError
	if !errors.As(err, &ve) {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", err.Error())
	}
	if p := bareModel(v.params[method], doc); p != nil {
		return protocol.NewError(protocol.CodeInvalidParams, "invalid params", p.Message+".", *p)
	}
	leaves(ve, &problems)
	sort.SliceStable(problems, func(i, j int) bool { return problems[i].Path < problems[j].Path })
	problems = dedupe(problems)
	// A did-you-mean leads: it names the cause (a misspelt property),
	// where "missing properties" beside it names only the effect.
	sort.SliceStable(problems, func(i, j int) bool {
		return strings.Contains(problems[i].Message, didYouMean) && !strings.Contains(problems[j].Message, didYouMean)
	})
	total := len(problems)
	if total > MaxProblems {
		problems = problems[:MaxProblems]
	}
	msg := fmt.Sprintf("The params of %s do not follow the schema: %s at %s", method, problems[0].Message, displayPath(problems[0].Path))
	if total > 1 {
		msg += fmt.Sprintf(" (and %d more problems)", total-1)
	}
	return protocol.NewError(protocol.CodeInvalidParams, "invalid params", msg+".", problems...)
}

func displayPath(p string) string {
	if p == "/params" || p == "" {
		return "the params"
	}
	return p
}

// leaves collects the innermost causes; for a oneOf whose branches all
// fail, the branch errors are merged into one message at that location.
func leaves(e *jsonschema.ValidationError, out *[]protocol.Problem) {
	if len(e.Causes) == 0 {
		msg := e.Message
		if strings.HasSuffix(e.KeywordLocation, "/additionalProperties") {
			msg += suggestion(e.AbsoluteKeywordLocation, msg)
		}
		*out = append(*out, protocol.Problem{Path: "/params" + e.InstanceLocation, Message: msg})
		return
	}
	if strings.HasSuffix(e.KeywordLocation, "/oneOf") {
		var msgs []string
		for _, c := range e.Causes {
			var sub []protocol.Problem
			leaves(c, &sub)
			for _, p := range sub {
				msgs = append(msgs, p.Message)
			}
		}
		*out = append(*out, protocol.Problem{Path: "/params" + e.InstanceLocation, Message: "matches none of the allowed forms: " + strings.Join(msgs, "; or ")})
		return
	}
	for _, c := range e.Causes {
		leaves(c, out)
	}
}

func dedupe(ps []protocol.Problem) []protocol.Problem {
	out := ps[:0]
	for i, p := range ps {
		if i > 0 && p == ps[i-1] {
			continue
		}
		out = append(out, p)
	}
	return out
}

// outOfRange reports numbers that do not fit a float64 (1e400 parses as
// JSON but not as a double).
func outOfRange(v any, path string, out *[]protocol.Problem) {
	switch t := v.(type) {
	case json.Number:
		if f, err := strconv.ParseFloat(string(t), 64); err != nil || math.IsInf(f, 0) {
			*out = append(*out, protocol.Problem{Path: path, Message: fmt.Sprintf("%s is out of range for a double-precision number", string(t))})
		}
	case map[string]any:
		for k, e := range t {
			outOfRange(e, path+"/"+escape(k), out)
		}
	case []any:
		for i, e := range t {
			outOfRange(e, path+"/"+strconv.Itoa(i), out)
		}
	}
	if len(*out) > MaxProblems {
		*out = (*out)[:MaxProblems]
	}
}

func escape(s string) string {
	return strings.ReplaceAll(strings.ReplaceAll(s, "~", "~0"), "/", "~1")
}

// elided returns v with arrays longer than ElideAbove cut to their first
// ElideAbove elements, at every depth. It shares the elements.
func elided(v any) any {
	switch t := v.(type) {
	case map[string]any:
		for k, e := range t {
			t[k] = elided(e)
		}
	case []any:
		if len(t) > ElideAbove {
			t = t[:ElideAbove]
		}
		for i, e := range t {
			t[i] = elided(e)
		}
		return t
	}
	return v
}
