package main

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"
	"testing"
)

// TestFindFormThenSweepRise finds a thrust line through its crown over the
// wire, then sweeps the returned model's rise parameter with sweep-parameter
// (each step solved by the stiffness method) and the load-path metric, and
// checks the least-material rise against its closed form (derived in
// engine/formfind's TestLeastMaterialRise): for n panels of width d under
// equal loads, Z(f) = 2Pf(n² − 1)/(3n) + Pn³d²/(8f), least at
// f* = (n²d/4)·√(3/(n² − 1)).
func TestFindFormThenSweepRise(t *testing.T) {
	const n, d, P = 8, 2.0, 5.0
	var nodes, members, loads []string
	for i := 0; i <= n; i++ {
		nodes = append(nodes, fmt.Sprintf(`{"id":"v%d","at":[%g,0]}`, i, float64(i)*d))
		if i > 0 {
			members = append(members, fmt.Sprintf(`{"id":"s%d","ends":["v%d","v%d"],"material":"stone","section":"ring"}`, i, i-1, i))
		}
		if i > 0 && i < n {
			loads = append(loads, fmt.Sprintf(`{"node":"v%d","force":[0,%g]}`, i, -P))
		}
	}
	model := `{"dimension":2,"materials":[{"id":"stone","elastic_modulus":1e7}],"sections":[{"id":"ring","area":0.1}],` +
		`"nodes":[` + strings.Join(nodes, ",") + `],"members":[` + strings.Join(members, ",") + `],` +
		`"supports":[{"node":"v0","fix":["x","y"]},{"node":"v8","fix":["x","y"]}],` +
		`"load_cases":[{"id":"deck","loads":[` + strings.Join(loads, ",") + `]}]}`
	req := `{"jsonrpc":"2.0","id":1,"method":"find-form","params":{"model":` + model + `,"force_density":-1,"through":{"node":"v4","at":[8,3]}}}`
	_, out, errOut := runCapture([]string{"run", "-"}, req+"\n")
	var found struct {
		Result struct {
			Model         json.RawMessage `json:"model"`
			ModelCase     string          `json:"model_case"`
			RiseParameter string          `json:"rise_parameter"`
		} `json:"result"`
	}
	if err := json.Unmarshal([]byte(strings.TrimSpace(out)), &found); err != nil || found.Result.RiseParameter != "rise" {
		t.Fatalf("find-form: %v %q %s", err, found.Result.RiseParameter, errOut)
	}
	sweep := `{"jsonrpc":"2.0","id":2,"method":"sweep-parameter","params":{"model":` + string(found.Result.Model) +
		`,"parameters":[{"name":"rise","from":2,"to":12,"count":11}],"metrics":["load_path"],"cases":["deck"],` +
		`"objective":{"metric":"load_path","tolerance":1e-9}}}`
	_, out, errOut = runCapture([]string{"run", "-"}, sweep+"\n")
	var swept struct {
		Result struct {
			Failed     int `json:"failed"`
			Refinement struct {
				Values    []float64 `json:"values"`
				Objective float64   `json:"objective"`
			} `json:"refinement"`
		} `json:"result"`
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if err := json.Unmarshal([]byte(lines[len(lines)-1]), &swept); err != nil || len(swept.Result.Refinement.Values) != 1 {
		t.Fatalf("sweep-parameter: %v %s %s", err, lines[len(lines)-1], errOut)
	}
	want := n * n * d / 4 * math.Sqrt(3.0/(n*n-1))
	zWant := 2*P*want*(n*n-1)/(3*n) + P*n*n*n*d*d/(8*want)
	got := swept.Result.Refinement
	if swept.Result.Failed != 0 || math.Abs(got.Values[0]-want) > 1e-5*want || math.Abs(got.Objective-zWant) > 1e-9*zWant {
		t.Errorf("least-material rise %.8g (load path %.10g), want %.8g (%.10g); %d steps failed", got.Values[0], got.Objective, want, zWant, swept.Result.Failed)
	}
}
