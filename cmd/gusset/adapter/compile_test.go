package adapter

import (
	"context"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"reflect"
	"testing"

	"gusset/engine/model/modelgen"
	"gusset/protocol"
	"gusset/schema"
)

// solveRequestParams returns the params of a solve request for a generated
// 3D space truss with about the given number of members.
func solveRequestParams(members int) []byte {
	n := 1
	for 8*n*n < members {
		n++
	}
	b, err := json.Marshal(protocol.SolveParams{Model: *WireModel(modelgen.SpaceTruss3D(n, n))})
	if err != nil {
		panic(err)
	}
	return b
}

// prepare is what every method does before engine work: validate and
// decode the params, and compile the model (decodeModel, the server's
// path, with nodes and members decoded straight into the compiler's
// input).
func prepare(v *schema.Validator, params []byte) error {
	a := &Adapter{Limits: protocol.Limits{}.WithDefaults(), validator: v}
	var p protocol.SolveParams
	_, _, err := a.decodeModel(context.Background(), "solve", params, &p, &p.Model)
	return err
}

func newSolveValidator(tb testing.TB) *schema.Validator {
	v, err := schema.NewValidator(map[string]string{"solve": "SolveParams"})
	if err != nil {
		tb.Fatal(err)
	}
	return v
}

func TestPrepareGeneratedModels(t *testing.T) {
	v := newSolveValidator(t)
	for _, members := range []int{100, 2000} {
		t.Run(fmt.Sprintf("members=%d", members), func(t *testing.T) {
			if err := prepare(v, solveRequestParams(members)); err != nil {
				t.Fatal(err)
			}
		})
	}
}

// TestSemanticProblemsArePointers checks that compiler problems reach the
// wire with pointers from the root of the request.
func TestSemanticProblemsArePointers(t *testing.T) {
	v := newSolveValidator(t)
	base := `{"model":{"dimension":2,"materials":[{"id":"s","elastic_modulus":1}],"sections":[{"id":"a","area":1}],` +
		`"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[1,0]}%s],"members":[%s]%s}}`
	cases := []struct {
		name, nodes, members, extra string
		code                        int
		path                        string
	}{
		{"dangling node", ``, `{"id":"AB","ends":["A","C"],"material":"s","section":"a"}`, ``, 1000, "/params/model/members/0/ends/1"},
		{"zero length", ``, `{"id":"AA","ends":["A","A"],"material":"s","section":"a"}`, ``, 1000, "/params/model/members/0/ends/1"},
		{"duplicate node id", `,{"id":"A","at":[2,0]}`, `{"id":"AB","ends":["A","B"],"material":"s","section":"a"}`, ``, 1000, "/params/model/nodes/2/id"},
		{"unknown parameter", `,{"id":"C","at":["spann",1]}`, `{"id":"AB","ends":["A","B"],"material":"s","section":"a"}`, `,"parameters":{"span":3}`, 1001, "/params/model/nodes/2/at/0"},
		{"division by zero", `,{"id":"C","at":["1/(span-3)",1]}`, `{"id":"AB","ends":["A","B"],"material":"s","section":"a"}`, `,"parameters":{"span":3}`, 1001, "/params/model/nodes/2/at/0"},
		{"syntax error", `,{"id":"C","at":["2*(span",1]}`, `{"id":"AB","ends":["A","B"],"material":"s","section":"a"}`, `,"parameters":{"span":3}`, 1001, "/params/model/nodes/2/at/0"},
		{"empty model", ``, ``, ``, 1000, "/params/model/members"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := prepare(v, []byte(fmt.Sprintf(base, c.nodes, c.members, c.extra)))
			e := Classify(err)
			if err == nil || e.Code != c.code {
				t.Fatalf("got %v, want code %d", err, c.code)
			}
			found := false
			for _, p := range e.Data.Problems {
				found = found || p.Path == c.path
			}
			if !found {
				t.Errorf("problems %+v lack %s", e.Data.Problems, c.path)
			}
		})
	}
}

// BenchmarkPrepare measures decode + validate + compile against a plain
// json.Unmarshal of the same bytes (the goal: within 3×, and under
// 0.5 s for 100k members).
func BenchmarkPrepare(b *testing.B) {
	v := newSolveValidator(b)
	for _, members := range []int{1000, 10000, 100000} {
		params := solveRequestParams(members)
		b.Run(fmt.Sprintf("members=%d/prepare", members), func(b *testing.B) {
			b.SetBytes(int64(len(params)))
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				if err := prepare(v, params); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(fmt.Sprintf("members=%d/unmarshal", members), func(b *testing.B) {
			b.SetBytes(int64(len(params)))
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				var p protocol.SolveParams
				if err := json.Unmarshal(params, &p); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// FuzzPrepare feeds arbitrary params through validation, decoding and
// compilation: errors are fine, panics are not.
func FuzzPrepare(f *testing.F) {
	f.Add(solveRequestParams(20))
	f.Add([]byte(`{"model":{"dimension":2,"parameters":{"h":2},"materials":[{"id":"s","elastic_modulus":"1/h"}],"sections":[{"id":"a","area":1}],"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":["h",0]}],"members":[{"id":"AB","ends":["A","B"],"material":"s","section":"a"}]}}`))
	f.Add([]byte(`{"model":{"dimension":3,"materials":[],"sections":[],"nodes":[],"members":[]}}`))
	// Seed with the params of every transcript request too.
	for _, r := range transcriptRequests(f) {
		f.Add([]byte(r.Params))
	}
	rng := rand.New(rand.NewPCG(1, 2))
	f.Add([]byte(fmt.Sprintf(`{"model":{"dimension":2,"nodes":[{"id":"x","at":[%g,1e308]}]}}`, rng.Float64())))
	v := newSolveValidator(f)
	f.Fuzz(func(t *testing.T, params []byte) {
		_ = prepare(v, params)
	})
}

// TestFastPathAgreesWithSchema mutates model elements, which the validated
// sample leaves out, in ways the published schema rejects, and checks that
// the fast path (strict decode + sample + compiler) rejects them too, so
// the published schema stays authoritative.
func TestFastPathAgreesWithSchema(t *testing.T) {
	v := newSolveValidator(t)
	// The sample keeps none of a model's arrays: mutate the first element
	// and one further in.
	for _, k := range []int{0, 3} {
		t.Run(fmt.Sprintf("element %d", k), func(t *testing.T) { fastPathAgrees(t, v, k) })
	}
}

func fastPathAgrees(t *testing.T, v *schema.Validator, k int) {
	mutations := []struct {
		name   string
		mutate func(m map[string]any)
	}{
		{"member type", func(m map[string]any) { member(m, k)["type"] = "rope" }},
		{"member behaviour", func(m map[string]any) { member(m, k)["behaviour"] = "tension" }},
		{"member pretension negative", func(m map[string]any) { member(m, k)["pretension"] = -1.0 }},
		{"member unknown field", func(m map[string]any) { member(m, k)["colour"] = "red" }},
		{"member id empty", func(m map[string]any) { member(m, k)["id"] = "" }},
		{"member ends count", func(m map[string]any) { member(m, k)["ends"] = []any{"n0"} }},
		{"member buckling factor string", func(m map[string]any) { member(m, k)["buckling_factor"] = "1" }},
		{"member orientation length", func(m map[string]any) { member(m, k)["orientation"] = []any{0.0, 1.0} }},
		{"member releases component", func(m map[string]any) { member(m, k)["releases"] = map[string]any{"first": []any{"x"}} }},
		{"member releases end", func(m map[string]any) { member(m, k)["releases"] = map[string]any{"middle": []any{"rz"}} }},
		{"member releases repeated", func(m map[string]any) { member(m, k)["releases"] = map[string]any{"second": []any{"rz", "rz"}} }},
		{"node at too long", func(m map[string]any) { node(m, k)["at"] = []any{0.0, 1.0, 2.0, 3.0} }},
		{"node at too short", func(m map[string]any) { node(m, k)["at"] = []any{0.0} }},
		{"node at boolean", func(m map[string]any) { node(m, k)["at"] = []any{0.0, true, 1.0} }},
		{"node id empty", func(m map[string]any) { node(m, k)["id"] = "" }},
		{"node empty expression", func(m map[string]any) { node(m, k)["at"] = []any{"", 0.0, 0.0} }},
		{"load force too long", func(m map[string]any) { load(m, k)["force"] = []any{0.0, 1.0, 2.0, 3.0} }},
		{"load unknown field", func(m map[string]any) { load(m, k)["torque"] = 1.0 }},
		{"load node missing", func(m map[string]any) { delete(load(m, k), "node") }},
		{"support fix repeated", func(m map[string]any) { support(m, k)["fix"] = []any{"x", "x"} }},
		{"support node empty", func(m map[string]any) { support(m, k)["node"] = 7.0 }},
		{"support spring string", func(m map[string]any) { support(m, k)["springs"] = map[string]any{"x": "stiff"} }},
		{"support directions three", func(m map[string]any) {
			support(m, k)["directions"] = []any{[]any{1.0, 0.0, 0.0}, []any{0.0, 1.0, 0.0}, []any{0.0, 0.0, 1.0}}
		}},
		{"support directions none", func(m map[string]any) { support(m, k)["directions"] = []any{} }},
		{"area load two nodes", func(m map[string]any) {
			m["load_cases"].([]any)[0].(map[string]any)["area_loads"] = []any{map[string]any{"nodes": []any{"n0", "n1"}, "pressure": 1.0}}
		}},
		{"area load span", func(m map[string]any) {
			m["load_cases"].([]any)[0].(map[string]any)["area_loads"] = []any{map[string]any{"nodes": []any{"n0", "n1", "n2"}, "pressure": 1.0, "span": "both"}}
		}},
		{"member material missing", func(m map[string]any) { delete(member(m, k), "material") }},
		{"member ends numbers", func(m map[string]any) { member(m, k)["ends"] = []any{1.0, 2.0} }},
	}
	for _, c := range mutations {
		t.Run(c.name, func(t *testing.T) {
			var params map[string]any
			if err := json.Unmarshal(solveRequestParams(900), &params); err != nil {
				t.Fatal(err)
			}
			m := params["model"].(map[string]any)
			if len(m["nodes"].([]any)) <= k || len(m["members"].([]any)) <= k {
				t.Fatal("generated model too small for the test")
			}
			c.mutate(m)
			b, _ := json.Marshal(params)
			if v.ValidateFull("solve", b) == nil {
				t.Fatal("the full schema accepts the mutation; the test is wrong")
			}
			full := v.ValidateFull("solve", b)
			if err := prepare(v, b); err == nil {
				t.Error("the fast path accepted what the schema rejects")
			} else if !reflect.DeepEqual(Classify(err), full) {
				// The schema's own code and pointers, not the compiler's.
				t.Errorf("the fast path reports\n%+v\nthe schema\n%+v", Classify(err).Data, full.Data)
			}
		})
	}
}

func member(m map[string]any, i int) map[string]any { return m["members"].([]any)[i].(map[string]any) }
func support(m map[string]any, i int) map[string]any {
	return m["supports"].([]any)[i].(map[string]any)
}
func node(m map[string]any, i int) map[string]any { return m["nodes"].([]any)[i].(map[string]any) }

// load returns the i-th nodal load of the first case, adding loads when the
// case has fewer.
func load(m map[string]any, i int) map[string]any {
	lc := m["load_cases"].([]any)[0].(map[string]any)
	loads, _ := lc["loads"].([]any)
	for len(loads) <= i {
		loads = append(loads, map[string]any{"node": "n0", "force": []any{0.0, 0.0, -1.0}})
	}
	lc["loads"] = loads
	return loads[i].(map[string]any)
}
