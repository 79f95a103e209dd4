package adapter

// How to add a method: this table is the only list of methods. describe's
// list, the schema's definitions, the validator's params map and dispatch
// are all derived from it.
//
//  1. In protocol/, add the method-name constant (e.g. MethodModes =
//     "modes") and the params and result types (their doc comments become
//     the schema's descriptions; fields without omitempty are required).
//  2. In cmd/gusset/adapter/<method>.go, write the handler:
//
//     func (a *Adapter) modes(ctx context.Context, r *request[protocol.ModesParams]) (*protocol.ModesResult, error)
//
//     r.Params holds the params, decoded strictly and checked against the
//     schema. When the params type has a field `Model protocol.Model`,
//     r.Model is that model compiled (its errors located at
//     /params/model); when it has a field `Cases []string`, those ids are
//     checked to name the model's cases or combinations (errors at
//     /params/cases) before the handler runs.
//  3. Add one line to methods below, at the place describe should list it:
//
//     method(protocol.MethodModes, "One sentence saying what it does.", (*Adapter).modes),
//
//     Types that appear only as an error's detail go in detailTypes.
//  4. Run `go generate ./protocol` and commit schema/gusset.schema.json.

import (
	"context"
	"encoding/json"
	"reflect"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// methods lists the engine methods in the order a newcomer meets them,
// which is the order describe reports.
var methods = []entry{
	method(protocol.MethodSolve,
		"Linear-elastic stiffness analysis: displacements, axial and end forces, reactions, stresses, utilisation and the stability report.",
		(*Adapter).solve),
	method(protocol.MethodReciprocate,
		"The reciprocal force diagram of a planar network in Bow's notation, its closure and its Airy stress function; with edit, the form that fits an edited force diagram.",
		(*Adapter).reciprocate),
	method(protocol.MethodLoadPath,
		"Maxwell's load path and theorem residual, member sizing, volume, mass and embodied carbon, enveloped over cases.",
		(*Adapter).loadPath),
	method(protocol.MethodSweepParameter,
		"Varies one or two parameters, streams every step's metrics, and refines the best step to an optimum (Brent's method; Nelder–Mead for two).",
		(*Adapter).sweep),
	method(protocol.MethodOptimiseLayout,
		"The least-volume pin-jointed layout over a design domain by the ground-structure method with member adding, returned as a model ready for analysis.",
		(*Adapter).optimiseLayout),
	method(protocol.MethodModes,
		"Linear buckling load factors of a load case, or natural frequencies with participation factors, and their mode shapes, by shift-invert Lanczos.",
		(*Adapter).modes),
	method(protocol.MethodFindForm,
		"Equilibrium forms of pin-jointed networks from force densities (Schek's force density method) in 2D and 3D, through a point, to target lengths or forces, with loads that follow the form; the answer is a model.",
		(*Adapter).findForm),
}

// detailTypes are published in the schema because errors carry them as
// their detail (error.data.detail), not as any method's result.
var detailTypes = []any{protocol.Mechanism{}}

// request is what a handler receives.
type request[P any] struct {
	// Params are the decoded params.
	Params *P
	// Model is the compiled model of Params.Model, nil when P has no model.
	// Once it is compiled, Params.Model keeps only its dimension, units
	// and parameters (see releaseWire).
	Model *model.Model
	// Spec is the Spec Model was compiled from, for the methods in
	// keepsSpec only; nil otherwise, so that it is not held while the
	// request runs.
	Spec *model.Spec
	// Stream sends the request's progress notifications.
	Stream jsonrpc.Stream
	// Warnings locate what the request leaves out of its model: load cases
	// and combinations it does not use that have problems.
	Warnings []protocol.Problem
}

// entry is one method of the table.
type entry struct {
	name, summary  string
	params, result reflect.Type
	bind           func(a *Adapter) jsonrpc.Handler
}

var (
	wireModelType = reflect.TypeFor[protocol.Model]()
	idsType       = reflect.TypeFor[[]string]()
)

// method declares a method: its name, one-sentence summary and handler;
// the params and result types are the handler's. The returned entry's
// handler decodes and checks the params (see Adapter.decode), compiles the
// model and checks the case ids when P has them (see the comment at the
// top of this file), then calls h.
func method[P, R any](name, summary string, h func(a *Adapter, ctx context.Context, r *request[P]) (*R, error)) entry {
	pt := reflect.TypeFor[P]()
	modelField, casesField := field(pt, "Model", wireModelType), field(pt, "Cases", idsType)
	bind := func(a *Adapter) jsonrpc.Handler {
		return func(ctx context.Context, raw json.RawMessage, st jsonrpc.Stream) (any, error) {
			r := &request[P]{Params: new(P), Stream: st}
			fields := reflect.ValueOf(r.Params).Elem()
			if modelField < 0 {
				if err := a.decode(name, raw, r.Params); err != nil {
					return nil, err
				}
			} else {
				w := fields.Field(modelField).Addr().Interface().(*protocol.Model)
				var cases func() []string
				if casesField >= 0 {
					cases = func() []string { return fields.Field(casesField).Interface().([]string) }
				}
				m, spec, warnings, err := a.prepareModel(ctx, name, raw, r.Params, w, cases)
				if err != nil {
					return nil, err
				}
				r.Model, r.Warnings = m, warnings
				if keepsSpec[name] {
					r.Spec = spec
				}
				releaseWire(w)
			}
			out, err := h(a, ctx, r)
			if err != nil {
				return nil, err
			}
			return out, nil
		}
	}
	return entry{name: name, summary: summary, params: pt, result: reflect.TypeFor[R](), bind: bind}
}

// prepareModel decodes raw into params (see Adapter.decode), compiles the
// model w that params hold and, when cases is not nil, checks that the ids
// it returns name the model's cases or combinations (errors at
// /params/cases). Problems only in cases the request does not use are
// warnings: the model is then compiled again without those cases. It
// returns the compiled model, the Spec it was compiled from and the
// warnings.
func (a *Adapter) prepareModel(ctx context.Context, name string, raw json.RawMessage, params any, w *protocol.Model, cases func() []string) (*model.Model, *model.Spec, []protocol.Problem, error) {
	m, spec, err := a.decodeModel(ctx, name, raw, params, w)
	var warnings []protocol.Problem
	if err != nil && cases != nil {
		if dropped, ok := dropUnusedBadCases(w, cases(), err); ok {
			if m, spec, err = a.compile(ctx, w, "/params/model"); err == nil {
				warnings = dropped
			}
		}
	}
	if err != nil {
		return nil, nil, nil, err
	}
	if cases != nil {
		if err := checkCases(m, cases(), "/params/cases"); err != nil {
			return nil, nil, nil, err
		}
	}
	return m, spec, warnings, nil
}

// keepsSpec names the methods whose handlers read request.Spec: find-form
// builds the model of its answer from the Spec it was given.
var keepsSpec = map[string]bool{protocol.MethodFindForm: true}

// releaseWire drops the arrays of a compiled request's wire model, so
// that the memory they hold (tens of megabytes for a large model) can
// serve the engine while the request runs; handlers read the compiled
// model, and the Spec when they keep it, never the wire model's arrays.
// Dimension, units and parameters stay.
func releaseWire(w *protocol.Model) {
	*w = protocol.Model{Dimension: w.Dimension, Units: w.Units, Parameters: w.Parameters}
}

// field returns the index of t's top-level field called name of type ft,
// or -1.
func field(t reflect.Type, name string, ft reflect.Type) int {
	if f, ok := t.FieldByName(name); ok && len(f.Index) == 1 && f.Type == ft {
		return f.Index[0]
	}
	return -1
}

// describe returns the entry as describe lists it.
func (e entry) describe() protocol.Method {
	return protocol.Method{Name: e.name, Summary: e.summary, Params: e.params.Name(), Result: e.result.Name()}
}

// paramsDefinitions maps every method the server answers, the transport's
// own describe and cancel included, to its params definition in the
// schema.
func paramsDefinitions() map[string]string {
	defs := map[string]string{
		protocol.MethodDescribe: reflect.TypeFor[protocol.DescribeParams]().Name(),
		protocol.MethodCancel:   reflect.TypeFor[protocol.CancelParams]().Name(),
	}
	for _, e := range methods {
		defs[e.name] = e.params.Name()
	}
	return defs
}

// SchemaTypes returns a zero value of every engine method's params and
// result type and of the error detail types, in table order, for the
// schema generator.
func SchemaTypes() []any {
	var out []any
	for _, e := range methods {
		out = append(out, reflect.Zero(e.params).Interface(), reflect.Zero(e.result).Interface())
	}
	return append(out, detailTypes...)
}

// ErrorCodes returns every error code the server sends: the transport's
// (protocol.ServerCodes) and then the engine's fault kinds, for the
// schema's ErrorCode definition and the clients generated from it.
func ErrorCodes() []protocol.CodeInfo {
	out := append([]protocol.CodeInfo(nil), protocol.ServerCodes...)
	for _, k := range fault.Kinds() {
		out = append(out, protocol.CodeInfo{Code: k.Kind.Code(), Kind: k.Name, When: k.When})
	}
	return out
}
