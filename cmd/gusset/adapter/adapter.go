package adapter

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"strconv"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/render"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
	"gusset/schema"
)

// Caution is carried by every result a person might build from: the one
// sentence, engine/render's, which every drawing carries too.
const Caution = render.Caution

// Adapter holds the limits the handlers enforce and the schema validator.
type Adapter struct {
	Limits    protocol.Limits
	validator *schema.Validator
}

// Register adds every engine method to the server, with schema validation
// of params and the mapping of engine errors to wire codes.
func Register(s *jsonrpc.Server) error {
	s.Limits = s.Limits.WithDefaults()
	// The schemas compile while the server starts reading.
	v := schema.StartValidator(paramsDefinitions())
	a := &Adapter{Limits: s.Limits, validator: v}
	for _, e := range methods {
		s.Handle(e.describe(), e.bind(a))
	}
	// Engine methods validate their params in decode; the server checks
	// only the small params of its own methods.
	s.Validate = func(method string, params json.RawMessage) *protocol.Error {
		if method == protocol.MethodCancel || method == protocol.MethodDescribe {
			return v.ValidateFull(method, params)
		}
		return nil
	}
	s.Classify = Classify
	s.SchemaID = schema.ID
	return nil
}

// Classify maps an error to a wire error: protocol errors keep their code,
// engine faults get their kind's application code, anything else is an
// internal error.
func Classify(err error) *protocol.Error {
	var pe *protocol.Error
	if errors.As(err, &pe) {
		return pe
	}
	if fe, ok := fault.As(err); ok {
		return located("", fe)
	}
	return protocol.NewError(protocol.CodeInternal, "internal error", err.Error())
}

// located converts an engine fault to a wire error, prefixing its problem
// paths with the pointer of the object the engine was given.
func located(prefix string, fe *fault.Error) *protocol.Error {
	problems := make([]protocol.Problem, len(fe.Problems))
	for i, p := range fe.Problems {
		path := p.Path
		if path != "" && !strings.HasPrefix(path, "/") {
			path = "/" + path
		}
		problems[i] = protocol.Problem{Path: prefix + path, Message: p.Message}
	}
	e := protocol.NewError(fe.Kind.Code(), fe.Kind.String(), fe.Message, problems...)
	e.Data.Detail = fe.Detail
	return e
}

// at converts err to a wire error located under prefix when it is an engine
// fault, and leaves other errors as they are.
func at(prefix string, err error) error {
	if err == nil {
		return nil
	}
	if fe, ok := fault.As(err); ok {
		return located(prefix, fe)
	}
	return err
}

// decode validates params against the method's schema and unmarshals them
// into v (a zero value), before any engine code runs. The fast path
// decodes strictly (unknown fields and wrong types are errors), in one
// pass with protocol.DecodeStrict or, for input it declines, with
// encoding/json, and validates a sample of the result (see
// schema.Validator.ValidateSample); the model compiler then checks every
// element. When either step fails, the full schema validation of the
// original bytes supplies precise pointers.
func (a *Adapter) decode(method string, params json.RawMessage, v any) error {
	_, err := a.decodeEach(method, params, v)
	return err
}

// decodeEach is decode with sinks for protocol.DecodeStrictEach; it
// reports whether the sinks took their arrays' elements (strict true),
// which they did not when the input went to encoding/json.
func (a *Adapter) decodeEach(method string, params json.RawMessage, v any, sinks ...protocol.Sink) (strict bool, err error) {
	err = protocol.DecodeStrictEach(params, v, sinks...)
	strict = err == nil
	if err != nil {
		dec := json.NewDecoder(bytes.NewReader(params))
		dec.DisallowUnknownFields()
		err = dec.Decode(v)
	}
	if err == nil {
		if e := a.validator.ValidateSample(method, v); e == nil {
			return strict, nil
		} else if full := a.validator.ValidateFull(method, params); full != nil {
			return false, full
		} else {
			return false, e
		}
	}
	if e := a.validator.ValidateFull(method, params); e != nil {
		return false, e
	}
	return false, protocol.NewError(protocol.CodeInvalidParams, "invalid params", "The params could not be decoded: "+err.Error()+".")
}

// decodeModel decodes params into p (see decode) and compiles the model w
// that p holds; it returns the compiled model and the Spec it was
// compiled from. The model's nodes and members are decoded straight into
// the compiler's input and kept in w.Decoded (see straight).
func (a *Adapter) decodeModel(ctx context.Context, method string, params json.RawMessage, p any, w *protocol.Model) (*model.Model, *model.Spec, error) {
	st := &straight{}
	strict, err := a.decodeEach(method, params, p, st.sinks(w)...)
	if err != nil {
		return nil, nil, err
	}
	if strict {
		w.Decoded = st
	}
	m, spec, err := a.compile(ctx, w, "/params/model")
	if err != nil && a.validator != nil {
		// The sample left the model's elements to the compiler; when it
		// finds fault, report what the schema says if the schema rejects
		// the params too, so codes and pointers are the schema's.
		if e := a.validator.ValidateFull(method, params); e != nil {
			return nil, nil, e
		}
	}
	return m, spec, err
}

// compile checks the model against the size limits and compiles it; it
// returns the compiled model and the Spec it was compiled from (nil
// when the limits refuse the model).
func (a *Adapter) compile(ctx context.Context, w *protocol.Model, pointer string) (*model.Model, *model.Spec, error) {
	nodes, members := len(w.Nodes), len(w.Members)
	if st, ok := w.Decoded.(*straight); ok {
		nodes, members = len(st.nodes), len(st.members)
	}
	if n := nodes; n > a.Limits.MaxNodes {
		e := protocol.NewError(protocol.CodeLimitExceeded, "limit exceeded",
			fmt.Sprintf("The model has %d nodes, more than the limit of %d. Start the server with a larger --max-nodes or split the model.", n, a.Limits.MaxNodes),
			protocol.Problem{Path: pointer + "/nodes", Message: fmt.Sprintf("%d nodes; the limit is %d", n, a.Limits.MaxNodes)})
		e.Data.Detail = map[string]int{"limit": a.Limits.MaxNodes, "value": n}
		return nil, nil, e
	}
	if n := members; n > a.Limits.MaxMembers {
		e := protocol.NewError(protocol.CodeLimitExceeded, "limit exceeded",
			fmt.Sprintf("The model has %d members, more than the limit of %d. Start the server with a larger --max-members or split the model.", n, a.Limits.MaxMembers),
			protocol.Problem{Path: pointer + "/members", Message: fmt.Sprintf("%d members; the limit is %d", n, a.Limits.MaxMembers)})
		e.Data.Detail = map[string]int{"limit": a.Limits.MaxMembers, "value": n}
		return nil, nil, e
	}
	if err := ctx.Err(); err != nil {
		return nil, nil, err
	}
	spec := specOf(w)
	m, err := model.Compile(spec)
	return m, spec, at(pointer, err)
}

// checkCases reports every id in ids that names neither a load case nor a
// combination of m, with its pointer (pointer/k for the k-th id).
func checkCases(m *model.Model, ids []string, pointer string) error {
	var problems []protocol.Problem
	for k, id := range ids {
		if m.CaseIndex(id) < 0 && m.CombinationIndex(id) < 0 {
			problems = append(problems, protocol.Problem{Path: fmt.Sprintf("%s/%d", pointer, k),
				Message: fmt.Sprintf("no load case or combination is called %q", id)})
		}
	}
	if problems == nil {
		return nil
	}
	known := make([]string, 0, len(m.Cases)+len(m.Combinations))
	for _, c := range m.Cases {
		known = append(known, c.ID)
	}
	for _, c := range m.Combinations {
		known = append(known, c.ID)
	}
	return protocol.NewError(fault.UnknownCase.Code(), fault.UnknownCase.String(),
		fmt.Sprintf("%s; the model's cases and combinations are %s.", problems[0].Message, quotedList(known)), problems...)
}

// quotedList writes names quoted and separated by commas: "a", "b".
func quotedList(names []string) string {
	quoted := make([]string, len(names))
	for i, n := range names {
		quoted[i] = strconv.Quote(n)
	}
	return strings.Join(quoted, ", ")
}
