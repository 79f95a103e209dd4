package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os/exec"
	"sort"
	"testing"

	"gusset/engine/model/modelgen"
	"gusset/protocol"
)

// determinismRequests returns requests of every registered method, each
// sent twice under different ids: "<name>/a" and "<name>/b".
func determinismRequests(t *testing.T, methods map[string]bool) (names []string, input []byte) {
	t.Helper()
	rng := rand.New(rand.NewPCG(4, 2))
	mechanism := twoBar(3)
	mechanism["supports"] = []any{map[string]any{"node": "A", "fix": []string{"x", "y"}}}
	pratt := wireModel(modelgen.Pratt(12, 48, 4, 10))
	pratt.Parameters = map[string]float64{"depth": 4}
	requests := []struct {
		name, method string
		params       any
	}{
		{"solve-pratt", "solve", protocol.SolveParams{Model: wireModel(modelgen.Pratt(12, 48, 4, 10))}},
		{"solve-random", "solve", protocol.SolveParams{Model: wireModel(modelgen.RandomPlanarTruss(rng, 200))}},
		{"solve-space", "solve", protocol.SolveParams{Model: wireModel(modelgen.SpaceTruss3D(5, 4))}},
		{"solve-frame", "solve", protocol.SolveParams{Model: wireModel(modelgen.Frame2D(3, 4))}},
		{"solve-frame3d", "solve", protocol.SolveParams{Model: wireModel(modelgen.Frame3D(2, 2, 3))}},
		{"solve-mechanism", "solve", map[string]any{"model": mechanism}},
		{"load-path", "load-path", map[string]any{"model": wireModel(modelgen.RandomPlanarTruss(rng, 300)),
			"sizing": map[string]any{"shape": "tube", "diameter_to_thickness": 30}}},
		{"sweep-line", "sweep-parameter", map[string]any{"model": twoBar("h"),
			"parameters": []any{map[string]any{"name": "h", "from": 0.5, "to": 8, "count": 64}},
			"metrics":    []string{"load_path", "volume", "max_displacement"},
			"objective":  map[string]any{"metric": "volume"}}},
		{"sweep-grid", "sweep-parameter", map[string]any{"model": twoBar("h*k"),
			"parameters": []any{map[string]any{"name": "h", "values": []float64{1, 2, 3, 4}}, map[string]any{"name": "k", "from": 0.5, "to": 1.5, "count": 9}},
			"objective":  map[string]any{"metric": "load_path"}}},
	}
	// twoBar("h*k") needs k among the parameters.
	requests[len(requests)-1].params.(map[string]any)["model"].(map[string]any)["parameters"] = map[string]any{"h": 3, "k": 1}
	if methods["reciprocate"] {
		requests = append(requests,
			struct {
				name, method string
				params       any
			}{"reciprocate", "reciprocate", protocol.ReciprocateParams{Model: wireModel(modelgen.Pratt(8, 32, 4, 10)), Picture: true}},
			struct {
				name, method string
				params       any
			}{"reciprocate-random", "reciprocate", protocol.ReciprocateParams{Model: wireModel(modelgen.Pratt(30, 90, 5, 10))}})
	}
	if methods["optimise-layout"] {
		requests = append(requests, struct {
			name, method string
			params       any
		}{"optimise-layout", "optimise-layout", layoutParams(4)})
	}
	var buf bytes.Buffer
	for _, r := range requests {
		for _, copy := range []string{"a", "b"} {
			buf.Write(request(r.name+"/"+copy, r.method, r.params))
			buf.WriteByte('\n')
		}
		names = append(names, r.name)
	}
	return names, buf.Bytes()
}

// TestDeterminism checks the README's promise that identical requests give
// byte-identical results: each method's final response is the same, byte
// for byte, across processes and across --jobs 1 and --jobs 2, and two
// copies of a request in one stream differ only in their ids. Progress
// notifications are excluded: their timing is not part of the promise.
func TestDeterminism(t *testing.T) {
	bin := buildGusset(t)
	methods := registeredMethods(t, bin)
	names, input := determinismRequests(t, methods)
	runs := []string{"1", "2", "2", "1"}
	outputs := make([]map[string][]byte, len(runs))
	for i, jobs := range runs {
		cmd := exec.Command(bin, "run", "--jobs", jobs, "-")
		cmd.Stdin = bytes.NewReader(input)
		out, err := cmd.Output()
		if err != nil && len(out) == 0 {
			t.Fatalf("run %d (jobs %s): %v", i, jobs, err)
		}
		outputs[i] = finalLines(t, out)
		if len(outputs[i]) != 2*len(names) {
			t.Fatalf("run %d: %d final responses for %d requests", i, len(outputs[i]), 2*len(names))
		}
	}
	for _, name := range names {
		a := fmt.Sprintf("%q", name+"/a")
		b := fmt.Sprintf("%q", name+"/b")
		first := outputs[0][a]
		for i := range runs {
			if got := outputs[i][a]; !bytes.Equal(got, first) {
				t.Errorf("%s: run %d (jobs %s) differs from run 0 (jobs %s):\n%s", name, i, runs[i], runs[0], firstDifference(first, got))
			}
			withA := bytes.Replace(outputs[i][b], []byte(b), []byte(a), 1)
			if !bytes.Equal(withA, outputs[i][a]) {
				t.Errorf("%s: run %d: the two copies differ:\n%s", name, i, firstDifference(outputs[i][a], withA))
			}
		}
	}
	var sizes []string
	for _, name := range names {
		sizes = append(sizes, fmt.Sprintf("%s %d B", name, len(outputs[0][fmt.Sprintf("%q", name+"/a")])))
	}
	sort.Strings(sizes)
	t.Logf("compared %d responses in %d runs: %v", 2*len(names), len(runs), sizes)
}

// finalLines maps each final response's raw id to its whole line.
func finalLines(t *testing.T, out []byte) map[string][]byte {
	t.Helper()
	lines := map[string][]byte{}
	for _, line := range bytes.Split(out, []byte("\n")) {
		if len(line) == 0 {
			continue
		}
		var m wireMessage
		if err := json.Unmarshal(line, &m); err != nil {
			t.Fatalf("output line is not JSON: %.200q", line)
		}
		if m.isFinal() {
			lines[string(m.ID)] = line
		}
	}
	return lines
}

// firstDifference shows where two lines first differ.
func firstDifference(a, b []byte) string {
	i := 0
	for i < len(a) && i < len(b) && a[i] == b[i] {
		i++
	}
	from := max(0, i-80)
	return fmt.Sprintf("at byte %d:\n  %q\n  %q", i, a[from:min(len(a), i+80)], b[from:min(len(b), i+80)])
}
