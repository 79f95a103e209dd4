package main

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"
	"testing"
)

// TestLayoutModelGoesOn checks that the model optimise-layout returns is
// accepted as it is by solve, load-path and reciprocate, and that they agree
// with the layout: the three-point Michell layout on a 20 × 10 grid, whose
// volume approaches (PL/σ)(1/2 + π/4) from above (Michell 1904; the
// constant from memory, checked by hand in engine/layout's tests).
func TestLayoutModelGoesOn(t *testing.T) {
	request := `{"jsonrpc":"2.0","id":1,"method":"optimise-layout","params":{"domain":{"outline":[[0,0],[2,0],[2,1],[0,1]]},"divisions":[20,10],` +
		`"supports":[{"at":[0,0],"fix":["x","y"]},{"at":[2,0],"fix":["x","y"]}],"cases":[{"id":"P","loads":[{"at":[1,0],"force":[0,-1]}]}],` +
		`"tension_limit":1,"compression_limit":1,"picture":true}}`
	var lay struct {
		Volume  float64 `json:"volume"`
		Members []struct {
			Forces []float64 `json:"forces"`
		} `json:"members"`
		Model   json.RawMessage `json:"model"`
		Picture string          `json:"picture"`
	}
	final(t, request, &lay)
	michell := 2 * (0.5 + math.Pi/4)
	if lay.Volume < michell || lay.Volume > 1.01*michell {
		t.Errorf("volume %v, want within 1%% above Michell's %v", lay.Volume, michell)
	}
	if !strings.Contains(lay.Picture, "<svg") {
		t.Error("no picture")
	}
	forces := make([]float64, len(lay.Members))
	for e, m := range lay.Members {
		forces[e] = m.Forces[0]
	}
	checkReturnedModel(t, lay.Model, forces, lay.Volume)
	var rec struct {
		Closure struct {
			Max float64 `json:"max"`
		} `json:"closure"`
	}
	final(t, fmt.Sprintf(`{"jsonrpc":"2.0","id":4,"method":"reciprocate","params":{"model":%s}}`, lay.Model), &rec)
	if rec.Closure.Max > 1e-9 {
		t.Errorf("reciprocal closure %v", rec.Closure.Max)
	}
}

// final runs one request through the command and decodes its result.
func final(t *testing.T, request string, result any) {
	t.Helper()
	code, out, errOut := runCapture([]string{"run", "-"}, request+"\n")
	for _, m := range readMessages(t, out) {
		if m["method"] != nil {
			continue
		}
		if m["error"] != nil || code != 0 {
			t.Fatalf("request failed (exit %d): %v %s", code, m["error"], errOut)
		}
		b, _ := json.Marshal(m["result"])
		if err := json.Unmarshal(b, result); err != nil {
			t.Fatal(err)
		}
		return
	}
	t.Fatal("no response")
}

// TestLayoutJointCost sends the hanging load of engine/layout's joint-cost
// test over the wire: with joint_cost 2 the single vertical tie (volume
// 2.5, cost 4.5) beats the two ties at 45° (volume 2, cost 2 + 2√2), a hand
// result from equilibrium at the loaded node (Parkes 1975's joint cost,
// from memory).
func TestLayoutJointCost(t *testing.T) {
	request := `{"jsonrpc":"2.0","id":1,"method":"optimise-layout","params":{"nodes":[[0,0],[-1,1],[1,1],[0,2.5]],` +
		`"supports":[{"at":[-1,1],"fix":["x","y"]},{"at":[1,1],"fix":["x","y"]},{"at":[0,2.5],"fix":["x","y"]}],` +
		`"cases":[{"id":"P","loads":[{"at":[0,0],"force":[0,-1]}]}],"tension_limit":1,"compression_limit":1,"joint_cost":2}}`
	var lay struct {
		Volume    float64           `json:"volume"`
		Objective float64           `json:"objective"`
		Members   []json.RawMessage `json:"members"`
	}
	final(t, request, &lay)
	if len(lay.Members) != 1 || math.Abs(lay.Volume-2.5) > 1e-7 || math.Abs(lay.Objective-4.5) > 1e-7 {
		t.Errorf("%d members, volume %v, objective %v; want 1, 2.5, 4.5", len(lay.Members), lay.Volume, lay.Objective)
	}
}

// TestSpaceLayoutGoesOn sends a space layout problem (a 6 × 4 × 2 grid
// over a 2 × 1 × 1 box, pins at the four lower corners, a load at the
// middle of the lower face) and checks that the model it returns is a
// space model that solve and load-path take as it is and agree with:
// solve's axial forces are the layout's, and the load path equals the
// volume (σ = 1) with Maxwell's residual at round-off (Maxwell 1870).
func TestSpaceLayoutGoesOn(t *testing.T) {
	request := `{"jsonrpc":"2.0","id":1,"method":"optimise-layout","params":{"dimension":3,"domain":{"box":{"min":[0,0,0],"max":[2,1,1]}},"divisions":[6,4,2],` +
		`"supports":[{"at":[0,0,0],"fix":["x","y","z"]},{"at":[2,0,0],"fix":["x","y","z"]},{"at":[0,1,0],"fix":["x","y","z"]},{"at":[2,1,0],"fix":["x","y","z"]}],` +
		`"cases":[{"id":"P","loads":[{"at":[1,0.5,0],"force":[0,0,-1]}]}],"tension_limit":1,"compression_limit":1,"picture":true}}`
	var lay struct {
		Volume  float64 `json:"volume"`
		Members []struct {
			Forces []float64 `json:"forces"`
		} `json:"members"`
		Cases []struct {
			MaxwellResidual float64 `json:"maxwell_residual"`
		} `json:"cases"`
		Model   json.RawMessage `json:"model"`
		Picture string          `json:"picture"`
	}
	final(t, request, &lay)
	if !strings.Contains(lay.Picture, "Axonometric view") || !strings.Contains(lay.Picture, "qualified engineer") {
		t.Error("no space picture with the caution")
	}
	if !strings.Contains(string(lay.Model), `"dimension":3`) {
		t.Errorf("model is not a space model: %.200s", lay.Model)
	}
	if math.Abs(lay.Cases[0].MaxwellResidual) > 1e-12*lay.Volume {
		t.Errorf("Maxwell residual %v", lay.Cases[0].MaxwellResidual)
	}
	forces := make([]float64, len(lay.Members))
	for e, m := range lay.Members {
		forces[e] = m.Forces[0]
	}
	checkReturnedModel(t, lay.Model, forces, lay.Volume)
	// The host makes the load a parameter p and sweeps it: the forces of a
	// statically admissible truss scale with its load, so the load path is
	// p times the layout's (common practice: linear statics).
	var m map[string]any
	if err := json.Unmarshal(lay.Model, &m); err != nil {
		t.Fatal(err)
	}
	m["parameters"] = map[string]any{"p": 1}
	load := m["load_cases"].([]any)[0].(map[string]any)["loads"].([]any)[0].(map[string]any)
	load["force"] = []any{0, 0, "-p"}
	edited, _ := json.Marshal(m)
	var sw struct {
		Steps []struct {
			Values  []float64          `json:"values"`
			Metrics map[string]float64 `json:"metrics"`
		} `json:"steps"`
	}
	final(t, fmt.Sprintf(`{"jsonrpc":"2.0","id":4,"method":"sweep-parameter","params":{"model":%s,"parameters":[{"name":"p","values":[1,2.5]}],"metrics":["load_path"]}}`, edited), &sw)
	if len(sw.Steps) != 2 {
		t.Fatalf("%d sweep steps, want 2", len(sw.Steps))
	}
	for _, st := range sw.Steps {
		if got, want := st.Metrics["load_path"], st.Values[0]*lay.Volume; math.Abs(got-want) > 1e-9*want {
			t.Errorf("p = %v: load path %v, want %v", st.Values[0], got, want)
		}
	}
}

// TestLayoutRefusals checks the layout errors a host meets first, each
// with its pointer: a point with the wrong number of entries, a load
// inside a hole (said so), a support away from every node (with the
// nearest node and its distance), z fixed in a plane layout.
func TestLayoutRefusals(t *testing.T) {
	base := `"domain":{"box":{"min":[0,0],"max":[2,1]},"box_holes":[{"min":[0.5,0.25],"max":[1.5,0.75]}]},"divisions":[8,4],` +
		`"tension_limit":1,"compression_limit":1`
	for _, tc := range []struct {
		name, params, path, text string
	}{
		{"3 entries in 2D", base + `,"supports":[{"at":[0,0,0],"fix":["x","y"]},{"at":[2,0],"fix":["x","y"]}],"cases":[{"id":"P","loads":[{"at":[1,0],"force":[0,-1]}]}]`,
			"/params/supports/0/at", "3 entries, want 2"},
		{"load in a hole", base + `,"supports":[{"at":[0,0],"fix":["x","y"]},{"at":[2,0],"fix":["x","y"]}],"cases":[{"id":"P","loads":[{"at":[1,0.5],"force":[0,-1]}]}]`,
			"/params/cases/0/loads/0/at", "inside hole 0"},
		{"support off a node", base + `,"supports":[{"at":[0.1,0],"fix":["x","y"]},{"at":[2,0],"fix":["x","y"]}],"cases":[{"id":"P","loads":[{"at":[1,0],"force":[0,-1]}]}]`,
			"/params/supports/0/at", "the nearest node, at (0, 0), is 0.1 away"},
		{"z in 2D", base + `,"supports":[{"at":[0,0],"fix":["x","z"]},{"at":[2,0],"fix":["x","y"]}],"cases":[{"id":"P","loads":[{"at":[1,0],"force":[0,-1]}]}]`,
			"/params/supports/0/fix/1", "only x and y"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, out, _ := runCapture([]string{"run", "-"}, `{"jsonrpc":"2.0","id":1,"method":"optimise-layout","params":{`+tc.params+"}}\n")
			text := out
			if !strings.Contains(text, `"error"`) || !strings.Contains(text, tc.path) || !strings.Contains(text, tc.text) {
				t.Errorf("answer %s lacks %s and %q", text, tc.path, tc.text)
			}
		})
	}
}

// checkReturnedModel sends a layout's returned model (optimised with unit
// stress limits) to solve and load-path: solve reproduces the layout's
// first-case forces, and the load path equals the volume (with σ_t = σ_c = 1
// the volume Σ|N|·L/σ is the load path Σ|N|·L, Maxwell's residual at
// round-off).
func checkReturnedModel(t *testing.T, model json.RawMessage, forces []float64, volume float64) {
	t.Helper()
	var solved struct {
		Cases []struct {
			AxialForces []float64 `json:"axial_forces"`
		} `json:"cases"`
	}
	final(t, fmt.Sprintf(`{"jsonrpc":"2.0","id":2,"method":"solve","params":{"model":%s}}`, model), &solved)
	for e, want := range forces {
		if got := solved.Cases[0].AxialForces[e]; math.Abs(got-want) > 1e-8 {
			t.Errorf("member %d: solve gives %v, the layout %v", e, got, want)
		}
	}
	var lp struct {
		Cases []struct {
			LoadPath         float64 `json:"load_path"`
			RelativeResidual float64 `json:"relative_residual"`
		} `json:"cases"`
	}
	final(t, fmt.Sprintf(`{"jsonrpc":"2.0","id":3,"method":"load-path","params":{"model":%s}}`, model), &lp)
	if c := lp.Cases[0]; math.Abs(c.LoadPath-volume) > 1e-9 || c.RelativeResidual > 1e-12 {
		t.Errorf("load path %v (residual %v), want the volume %v", c.LoadPath, c.RelativeResidual, volume)
	}
}
