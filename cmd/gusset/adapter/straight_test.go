package adapter

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/protocol"
	"gusset/schema"
)

// genericModel is the reference the straight decode is checked against:
// the params decoded by encoding/json (strict, as the server's fallback
// decodes them), the wire model converted by specOf and compiled, with
// the compiler's errors replaced by the schema's when the schema rejects
// the params too (as decodeModel does).
func genericModel(a *Adapter, method string, params []byte, p any, w *protocol.Model) (*model.Model, error) {
	dec := json.NewDecoder(bytes.NewReader(params))
	dec.DisallowUnknownFields()
	if err := dec.Decode(p); err != nil {
		return nil, a.validator.ValidateFull(method, params)
	}
	if e := a.validator.ValidateSample(method, p); e != nil {
		return nil, e
	}
	m, _, err := a.compile(context.Background(), w, "/params/model")
	if err != nil {
		if e := a.validator.ValidateFull(method, params); e != nil {
			return nil, e
		}
	}
	return m, err
}

// varied returns the params of solve requests for generated models whose
// members and nodes carry every optional field at random (orientation,
// releases, buckling factor and curve, behaviour, pretension, type, mass,
// expression coordinates), some of which the compiler refuses; key order
// varies too (the dimension after the nodes).
func varied(t *testing.T) map[string][]byte {
	out := map[string][]byte{}
	rng := rand.New(rand.NewPCG(19, 1))
	for k := range 12 {
		var spec *model.Spec
		switch k % 3 {
		case 0:
			spec = modelgen.Frame3D(2, 2, 2)
		case 1:
			spec = modelgen.Frame2D(3, 2)
		default:
			spec = modelgen.SpaceTruss3D(3, 3)
		}
		spec.Parameters = append(spec.Parameters, model.ParameterSpec{Name: "h", Value: 0.5})
		for i := range spec.Members {
			vary(rng, &spec.Members[i], spec.Dimension)
		}
		for i := range spec.Nodes {
			n := &spec.Nodes[i]
			if rng.IntN(4) == 0 {
				mass := rng.Float64()
				n.Mass = &mass
			}
			if rng.IntN(5) == 0 {
				n.At[0] = model.Expr(fmt.Sprintf("%g + h", n.At[0].Num))
			}
		}
		b, err := json.Marshal(protocol.SolveParams{Model: *WireModel(spec)})
		if err != nil {
			t.Fatal(err)
		}
		if k%4 == 3 {
			// The dimension last: the coordinates' block is sized for 3D.
			b = bytes.Replace(b, []byte(fmt.Sprintf(`"dimension":%d,`, spec.Dimension)), nil, 1)
			b = bytes.Replace(b, []byte(`"members":[`), []byte(fmt.Sprintf(`"dimension":%d,"members":[`, spec.Dimension)), 1)
		}
		out[fmt.Sprintf("generated %d", k)] = b
	}
	return out
}

// vary sets a member's optional fields at random, as the compiler
// allows them: releases and orientation on beams, behaviour and
// pretension on bars and cables.
func vary(rng *rand.Rand, m *model.MemberSpec, dim int) {
	curves := []string{"", "a0", "b", "d"}
	m.BucklingCurve = curves[rng.IntN(len(curves))]
	if rng.IntN(3) == 0 {
		f := 0.5 + rng.Float64()
		m.BucklingFactor = &f
	}
	if m.Type == "beam" {
		if dim == 3 && rng.IntN(3) == 0 {
			m.Orientation = []float64{rng.Float64(), 1, rng.Float64()}
		}
		if rng.IntN(3) == 0 {
			m.Releases[rng.IntN(2)] = []string{"rz"}
		}
		return
	}
	types := []string{"", "bar", "cable"}
	m.Type = types[rng.IntN(len(types))]
	if m.Type != "cable" && rng.IntN(3) == 0 {
		m.Behaviour = []string{"tension-only", "compression-only"}[rng.IntN(2)]
	}
	if m.Behaviour != "compression-only" && rng.IntN(4) == 0 {
		p := 10 * rng.Float64()
		m.Pretension = &p
	}
}

// TestStraightDecodeCompilesAlike checks that the server's decode, which
// takes nodes and members straight into the compiler's input, gives the
// same compiled model, or the same error, as encoding/json's decode of
// the wire model converted by specOf, on the transcripts' requests and on
// generated models with every optional field at random; and that it did
// take the straight path where it can.
func TestStraightDecodeCompilesAlike(t *testing.T) {
	v, err := schema.NewValidator(paramsDefinitions())
	if err != nil {
		t.Fatal(err)
	}
	a := &Adapter{Limits: protocol.Limits{}.WithDefaults(), validator: v}
	types := map[string]reflect.Type{}
	for _, e := range methods {
		if field(e.params, "Model", wireModelType) >= 0 {
			types[e.name] = e.params
		}
	}
	cases := map[string]struct {
		method string
		params []byte
	}{}
	for k, r := range transcriptRequests(t) {
		if _, ok := types[r.Method]; ok {
			cases[fmt.Sprintf("transcript %d (%s)", k, r.Method)] = struct {
				method string
				params []byte
			}{r.Method, r.Params}
		}
	}
	for name, params := range varied(t) {
		cases[name] = struct {
			method string
			params []byte
		}{protocol.MethodSolve, params}
	}
	straightened := 0
	for name, c := range cases {
		pt := types[c.method]
		modelField := field(pt, "Model", wireModelType)
		p, q := reflect.New(pt), reflect.New(pt)
		w := p.Elem().Field(modelField).Addr().Interface().(*protocol.Model)
		got, _, gotErr := a.decodeModel(context.Background(), c.method, c.params, p.Interface(), w)
		if w.Decoded != nil {
			straightened++
		}
		want, wantErr := genericModel(a, c.method, c.params, q.Interface(), q.Elem().Field(modelField).Addr().Interface().(*protocol.Model))
		switch {
		case (gotErr == nil) != (wantErr == nil) || gotErr != nil && !reflect.DeepEqual(Classify(gotErr), Classify(wantErr)):
			t.Errorf("%s: errors differ:\n%v\n%v", name, gotErr, wantErr)
		case got != nil && !sameModel(got, want):
			t.Errorf("%s: compiled models differ", name)
		}
	}
	if straightened < len(cases)*3/4 {
		t.Errorf("only %d of %d requests took the straight path", straightened, len(cases))
	}
}

// TestStraightBoundsMatchSchema checks nodeBoundsOK and memberBoundsOK
// against schema.CheckBounds, which reads the published bounds from the
// wire types' tags, for every length from 0 to 4 of each bounded array
// of a node and a member, so that a bound added to the schema is not
// missed by the straight decode.
func TestStraightBoundsMatchSchema(t *testing.T) {
	strs := func(n int) []string { return strings.Split("rx ry rz rx", " ")[:n] }
	for n := range 5 {
		node := &protocol.Node{ID: "a", At: make([]protocol.Number, n)}
		if got, want := nodeBoundsOK(node), len(schema.CheckBounds(node)) == 0; got != want {
			t.Errorf("node with %d coordinates: nodeBoundsOK %v, schema %v", n, got, want)
		}
		members := map[string]*protocol.Member{
			"ends":        {Ends: strs(n)},
			"orientation": {Ends: strs(2), Orientation: make([]float64, n)},
			"first":       {Ends: strs(2), Releases: &protocol.MemberReleases{First: strs(n)}},
			"second":      {Ends: strs(2), Releases: &protocol.MemberReleases{Second: strs(n)}},
		}
		for name, m := range members {
			if got, want := memberBoundsOK(m), len(schema.CheckBounds(m)) == 0; got != want {
				t.Errorf("member's %s with %d entries: memberBoundsOK %v, schema %v", name, n, got, want)
			}
		}
	}
	// Every bounded array of a node or a member is one of those above.
	bounded := map[string]bool{}
	for _, typ := range []reflect.Type{reflect.TypeFor[protocol.Node](), reflect.TypeFor[protocol.Member](), reflect.TypeFor[protocol.MemberReleases]()} {
		for i := range typ.NumField() {
			tag := typ.Field(i).Tag.Get("jsonschema")
			if strings.Contains(tag, "minItems") || strings.Contains(tag, "maxItems") {
				bounded[typ.Name()+"."+typ.Field(i).Name] = true
			}
		}
	}
	want := map[string]bool{"Node.At": true, "Member.Ends": true, "Member.Orientation": true, "MemberReleases.First": true, "MemberReleases.Second": true}
	if !reflect.DeepEqual(bounded, want) {
		t.Errorf("bounded arrays of nodes and members are %v; the straight decode checks %v", bounded, want)
	}
}

// sameModel reports whether two compiled models are equal, field for
// field, and stay equal when every parameter is changed (through
// WithParameters, which runs the models' compiled expressions: functions,
// which deepEqual counts equal when both are set).
func sameModel(a, b *model.Model) bool {
	if !deepEqual(reflect.ValueOf(a), reflect.ValueOf(b)) {
		return false
	}
	if len(a.ParamNames) == 0 {
		return true
	}
	changed := map[string]float64{}
	for i, name := range a.ParamNames {
		changed[name] = a.ParamValues[i] * 1.1
	}
	a2, errA := a.WithParameters(changed)
	b2, errB := b.WithParameters(changed)
	return (errA == nil) == (errB == nil) && (errA != nil || deepEqual(reflect.ValueOf(a2), reflect.ValueOf(b2)))
}

// deepEqual is reflect.DeepEqual, except that two functions are equal
// when both are nil or both are not (reflect.DeepEqual counts two set
// functions unequal) and that it does not follow cycles.
func deepEqual(a, b reflect.Value) bool {
	if a.IsValid() != b.IsValid() || a.IsValid() && a.Type() != b.Type() {
		return false
	}
	if !a.IsValid() {
		return true
	}
	switch a.Kind() {
	case reflect.Func:
		return a.IsNil() == b.IsNil()
	case reflect.Pointer, reflect.Interface:
		if a.IsNil() || b.IsNil() {
			return a.IsNil() == b.IsNil()
		}
		return deepEqual(a.Elem(), b.Elem())
	case reflect.Slice, reflect.Array:
		if a.Kind() == reflect.Slice && (a.IsNil() != b.IsNil()) || a.Len() != b.Len() {
			return false
		}
		for i := range a.Len() {
			if !deepEqual(a.Index(i), b.Index(i)) {
				return false
			}
		}
		return true
	case reflect.Struct:
		for i := range a.NumField() {
			if !deepEqual(a.Field(i), b.Field(i)) {
				return false
			}
		}
		return true
	case reflect.Map:
		if a.IsNil() != b.IsNil() || a.Len() != b.Len() {
			return false
		}
		for _, k := range a.MapKeys() {
			if !deepEqual(a.MapIndex(k), b.MapIndex(k)) {
				return false
			}
		}
		return true
	case reflect.Float32, reflect.Float64:
		x, y := a.Float(), b.Float()
		return x == y || x != x && y != y
	case reflect.Bool:
		return a.Bool() == b.Bool()
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		return a.Int() == b.Int()
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		return a.Uint() == b.Uint()
	case reflect.String:
		return a.String() == b.String()
	}
	panic("deepEqual: a " + a.Kind().String() + " in a compiled model")
}
