package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
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

// TestFoundModelAsIs sends the model find-form returns for the thrust line
// of testdata/transcripts/find-form (4 panels, P = 10 kN, crown 2 m) to
// solve, reciprocate and load-path unchanged. The expected values are the
// transcript's hand derivation: forces −√(10² + 15²) in the outer and
// −√(10² + 5²) in the inner members, load path 90 kN·m; the force diagram
// closes (Maxwell 1864) to round-off.
func TestFoundModelAsIs(t *testing.T) {
	input, err := os.ReadFile("../../testdata/transcripts/find-form.in.jsonl")
	if err != nil {
		t.Fatal(err)
	}
	first := strings.SplitN(string(input), "\n", 2)[0]
	_, out, _ := runCapture([]string{"run", "-"}, first+"\n")
	var found struct {
		Result struct {
			Model     json.RawMessage `json:"model"`
			ModelCase string          `json:"model_case"`
		} `json:"result"`
	}
	if err := json.Unmarshal([]byte(strings.TrimSpace(out)), &found); err != nil {
		t.Fatal(err)
	}
	ask := func(method, extra string, v any) {
		t.Helper()
		req := `{"jsonrpc":"2.0","id":1,"method":"` + method + `","params":{"model":` + string(found.Result.Model) + extra + `}}`
		_, out, _ := runCapture([]string{"run", "-"}, req+"\n")
		lines := strings.Split(strings.TrimSpace(out), "\n")
		if err := json.Unmarshal([]byte(lines[len(lines)-1]), v); err != nil {
			t.Fatalf("%s: %v %s", method, err, out)
		}
	}
	cases := `,"cases":["` + found.Result.ModelCase + `"]`
	var solved struct {
		Result struct {
			Cases []struct {
				AxialForces []float64 `json:"axial_forces"`
			} `json:"cases"`
		} `json:"result"`
	}
	ask("solve", cases, &solved)
	outer, inner := -math.Sqrt(325), -math.Sqrt(125)
	for e, want := range []float64{outer, inner, inner, outer} {
		if len(solved.Result.Cases) != 1 || math.Abs(solved.Result.Cases[0].AxialForces[e]-want) > 1e-9*math.Abs(want) {
			t.Fatalf("solve: %+v, want member %d at %g", solved.Result, e, want)
		}
	}
	var lp struct {
		Result struct {
			Cases []struct {
				LoadPath float64 `json:"load_path"`
			} `json:"cases"`
		} `json:"result"`
	}
	ask("load-path", cases, &lp)
	if len(lp.Result.Cases) != 1 || math.Abs(lp.Result.Cases[0].LoadPath-90) > 1e-9 {
		t.Errorf("load-path: %+v, want 90", lp.Result)
	}
	var rec struct {
		Result struct {
			Closure struct {
				Max float64 `json:"max"`
			} `json:"closure"`
		} `json:"result"`
		Error any `json:"error"`
	}
	ask("reciprocate", `,"case":"`+found.Result.ModelCase+`"`, &rec)
	if rec.Error != nil || rec.Result.Closure.Max > 1e-9 {
		t.Errorf("reciprocate: closure %g, error %v", rec.Result.Closure.Max, rec.Error)
	}
}
