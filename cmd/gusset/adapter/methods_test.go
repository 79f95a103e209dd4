package adapter

import (
	"context"
	"encoding/json"
	"math"
	"testing"

	"gusset/protocol"
	"gusset/schema"
)

// call runs one method of the table on raw params, as the server does.
func call(t *testing.T, method, params string) (any, error) {
	t.Helper()
	v, err := schema.NewValidator(paramsDefinitions())
	if err != nil {
		t.Fatal(err)
	}
	a := &Adapter{Limits: protocol.Limits{}.WithDefaults(), validator: v}
	for _, e := range methods {
		if e.name == method {
			return e.bind(a)(context.Background(), json.RawMessage(params), discardStream{})
		}
	}
	t.Fatalf("no method %s", method)
	return nil, nil
}

// triangle is a triangle truss: A (0, 0) pinned, B (4, 0) on a roller,
// C (2, 2) loaded by 10 kN downward.
const triangle = `{"dimension":2,"materials":[{"id":"s","elastic_modulus":2.1e8}],"sections":[{"id":"a","area":0.001}],
"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[4,0]},{"id":"C","at":[2,2]}],
"members":[{"id":"AC","ends":["A","C"],"material":"s","section":"a"},{"id":"BC","ends":["B","C"],"material":"s","section":"a"},
{"id":"AB","ends":["A","B"],"material":"s","section":"a"}],
"supports":[{"node":"A","fix":["x","y"]},{"node":"B","fix":["y"]}],
"load_cases":[{"id":"P","loads":[{"node":"C","force":[0,-10]}]}]}`

// TestLoadPathGivenForces sends the triangle's member forces to load-path
// as given forces: by the method of joints at C the 45° members carry
// −10/(2·sin 45°) = −7.0711 kN each and the tie +5 kN (hand statics), so
// Z = 2·7.0711·2.8284 + 5·4 = 60 kN·m, Z_T = 20, Z_C = 40, and Maxwell's
// residual Z_T − Z_C − Σ F·r = 20 − 40 − (−10·2) = 0 (Maxwell 1864). With
// AC 10% too strong (−7.7782) the supports still balance (their external
// forces are whatever balances the members there), but C does not: the
// members need (−0.5, −10.5) there against the load (0, −10), so the
// residual is (−0.5, −0.5)·(2, 2) = −2 and Z = 22 + 20 + 20 = 62.
func TestLoadPathGivenForces(t *testing.T) {
	for _, c := range []struct {
		name        string
		ac          float64
		z, residual float64
	}{{"balanced", 1, 60, 0}, {"AC 10% too strong", 1.1, 62, -2}} {
		t.Run(c.name, func(t *testing.T) {
			n := -10 / (2 * math.Sin(math.Pi/4))
			forces, _ := json.Marshal([]float64{c.ac * n, n, 5})
			out, err := call(t, protocol.MethodLoadPath, `{"model":`+triangle+`,"forces":`+string(forces)+`}`)
			if err != nil {
				t.Fatal(err)
			}
			r := out.(*protocol.LoadPathResult).Cases[0]
			z := c.z
			if d := r.LoadPath - z; d > 1e-9 || d < -1e-9 {
				t.Errorf("load path %g, want %g", r.LoadPath, z)
			}
			if d := r.Residual - c.residual; d > 1e-9 || d < -1e-9 {
				t.Errorf("residual %g, want %g", r.Residual, c.residual)
			}
			if r.ID != "P" {
				t.Errorf("case %q, want P (the model's first case)", r.ID)
			}
		})
	}
}

// TestLoadPathGivenForcesErrors: a forces array of the wrong length and an
// unknown case are refused with their pointers.
func TestLoadPathGivenForcesErrors(t *testing.T) {
	for _, c := range []struct {
		name, params string
		code         int
		path         string
	}{
		{"two forces for three members", `{"model":` + triangle + `,"forces":[1,2]}`, protocol.CodeInvalidParams, "/params/forces"},
		{"unknown case", `{"model":` + triangle + `,"forces":[1,2,3],"cases":["Q"]}`, 1009, "/params/cases/0"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := call(t, protocol.MethodLoadPath, c.params)
			e, ok := err.(*protocol.Error)
			if !ok || e.Code != c.code || len(e.Data.Problems) == 0 || e.Data.Problems[0].Path != c.path {
				t.Fatalf("got %v, want code %d at %s", err, c.code, c.path)
			}
		})
	}
}

// TestLayoutDefaultModulusFollowsUnits runs optimise-layout in every unit
// system the schema allows (protocol.Units: five lengths by five forces)
// and checks the returned model's default modulus: steel's 210 GPa
// (EN 1993-1-1 §3.2.6) converted with the factors of NIST Special
// Publication 811 (2008, Appendix B.8; from memory: ft 0.3048 m, in
// 0.0254 m, lbf 4.448 222 N, kip 4448.222 N), to NIST's 7 digits. Before
// this, N and mm got the kN/m² value 2.1e8, a model 1000× too stiff. A
// modulus given in the request is kept.
func TestLayoutDefaultModulusFollowsUnits(t *testing.T) {
	metres := map[string]float64{"m": 1, "cm": 1e-2, "mm": 1e-3, "ft": 0.3048, "in": 0.0254}
	newtons := map[string]float64{"N": 1, "kN": 1e3, "MN": 1e6, "lbf": 4.448222, "kip": 4448.222}
	const bracket = `"domain":{"outline":[[0,-1],[1,-1],[1,1],[0,1]]},"divisions":[2,4],` +
		`"supports":[{"at":[0,1],"fix":["x","y"]},{"at":[0,-1],"fix":["x","y"]}],` +
		`"cases":[{"id":"tip","loads":[{"at":[1,0],"force":[0,-1]}]}],"tension_limit":1,"compression_limit":1`
	modulus := func(t *testing.T, params string) float64 {
		out, err := call(t, protocol.MethodOptimiseLayout, params)
		if err != nil {
			t.Fatal(err)
		}
		return out.(*protocol.LayoutResult).Model.Materials[0].ElasticModulus.Value
	}
	for length, l := range metres {
		for force, f := range newtons {
			t.Run(force+"/"+length+"²", func(t *testing.T) {
				got := modulus(t, `{`+bracket+`,"units":{"length":"`+length+`","force":"`+force+`"}}`)
				if want := 210e9 * l * l / f; math.Abs(got-want) > 1e-6*want {
					t.Errorf("default modulus %g, want %g", got, want)
				}
			})
		}
	}
	if got := modulus(t, `{`+bracket+`}`); got != 2.1e8 {
		t.Errorf("no units (kN, m): %g, want 2.1e8", got)
	}
	if got := modulus(t, `{`+bracket+`,"units":{"length":"mm","force":"N"},"elastic_modulus":70000}`); got != 70000 {
		t.Errorf("given modulus: %g, want 70000", got)
	}
}
