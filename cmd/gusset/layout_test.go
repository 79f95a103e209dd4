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
	var solved struct {
		Cases []struct {
			AxialForces []float64 `json:"axial_forces"`
			Residual    float64   `json:"residual"`
		} `json:"cases"`
	}
	final(t, fmt.Sprintf(`{"jsonrpc":"2.0","id":2,"method":"solve","params":{"model":%s}}`, lay.Model), &solved)
	for e, m := range lay.Members {
		if got := solved.Cases[0].AxialForces[e]; math.Abs(got-m.Forces[0]) > 1e-8 {
			t.Errorf("member %d: solve gives %v, the layout %v", e, got, m.Forces[0])
		}
	}
	var lp struct {
		Cases []struct {
			LoadPath         float64 `json:"load_path"`
			RelativeResidual float64 `json:"relative_residual"`
		} `json:"cases"`
	}
	final(t, fmt.Sprintf(`{"jsonrpc":"2.0","id":3,"method":"load-path","params":{"model":%s}}`, lay.Model), &lp)
	// With σ_t = σ_c = 1 the volume is the load path.
	if c := lp.Cases[0]; math.Abs(c.LoadPath-lay.Volume) > 1e-9 || c.RelativeResidual > 1e-12 {
		t.Errorf("load path %v (residual %v), want the volume %v", c.LoadPath, c.RelativeResidual, lay.Volume)
	}
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
