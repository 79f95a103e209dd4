package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestTranscripts drives every testdata/transcripts/NAME.in.jsonl through
// run and checks the final responses against NAME.want.json: an object
// keyed by the raw JSON id whose values are subsets of the responses.
// Objects match key by key; arrays of objects match when every wanted
// element matches some element; other arrays element by element; numbers
// within a relative 1e-9 (absolute 1e-12), or as {"approx": x, "rel": r}
// within the relative tolerance r. Each want file names the source
// of its values under "_source".
func TestTranscripts(t *testing.T) {
	inputs, err := filepath.Glob("../../testdata/transcripts/*.in.jsonl")
	if err != nil || len(inputs) == 0 {
		t.Fatalf("no transcripts found: %v", err)
	}
	for _, in := range inputs {
		name := strings.TrimSuffix(filepath.Base(in), ".in.jsonl")
		t.Run(name, func(t *testing.T) {
			input, err := os.ReadFile(in)
			if err != nil {
				t.Fatal(err)
			}
			wantBytes, err := os.ReadFile(strings.TrimSuffix(in, ".in.jsonl") + ".want.json")
			if err != nil {
				t.Fatal(err)
			}
			var want map[string]any
			if err := json.Unmarshal(wantBytes, &want); err != nil {
				t.Fatal(err)
			}
			if _, ok := want["_source"]; !ok {
				t.Error("the want file does not name its source under _source")
			}
			delete(want, "_source")
			if len(want) == 0 {
				t.Fatal("the want file expects no response: the transcript would check nothing")
			}
			for _, jobs := range []string{"1", "2"} {
				_, out, _ := runCapture([]string{"run", "--jobs", jobs, "-"}, string(input))
				got := map[string]map[string]any{}
				for _, m := range readMessages(t, out) {
					if m["method"] != nil {
						continue
					}
					id, _ := json.Marshal(m["id"])
					if _, dup := got[string(id)]; dup && string(id) != "null" {
						t.Errorf("two responses with id %s", id)
					}
					got[string(id)] = m
				}
				for id, w := range want {
					g, ok := got[id]
					if !ok {
						t.Errorf("jobs=%s: no response with id %s", jobs, id)
						continue
					}
					var gv any
					b, _ := json.Marshal(g)
					json.Unmarshal(b, &gv)
					if err := match(w, gv, ""); err != nil {
						t.Errorf("jobs=%s: id %s: %v", jobs, id, err)
					}
				}
			}
		})
	}
}

// match reports where got differs from the subset want.
func match(want, got any, path string) error {
	switch w := want.(type) {
	case map[string]any:
		if target, isApprox := w["approx"].(float64); isApprox {
			rel, _ := w["rel"].(float64)
			g, ok := got.(float64)
			if !ok || math.Abs(g-target) > rel*math.Abs(target) {
				return fmt.Errorf("%s: want %v within %g relative, got %v", path, target, rel, brief(got))
			}
			return nil
		}
		g, ok := got.(map[string]any)
		if !ok {
			return fmt.Errorf("%s: want an object, got %v", path, brief(got))
		}
		for k, wv := range w {
			gv, ok := g[k]
			if !ok {
				return fmt.Errorf("%s/%s: missing (got %v)", path, k, brief(got))
			}
			if err := match(wv, gv, path+"/"+k); err != nil {
				return err
			}
		}
		return nil
	case []any:
		g, ok := got.([]any)
		if !ok {
			return fmt.Errorf("%s: want an array, got %v", path, brief(got))
		}
		if len(w) > 0 {
			if first, isObj := w[0].(map[string]any); isObj && first["approx"] == nil {
				for i, wv := range w {
					found := false
					for _, gv := range g {
						if match(wv, gv, "") == nil {
							found = true
							break
						}
					}
					if !found {
						return fmt.Errorf("%s/%d: no element matches %v in %v", path, i, brief(wv), brief(got))
					}
				}
				return nil
			}
		}
		if len(w) != len(g) {
			return fmt.Errorf("%s: want %d elements, got %d", path, len(w), len(g))
		}
		for i := range w {
			if err := match(w[i], g[i], fmt.Sprintf("%s/%d", path, i)); err != nil {
				return err
			}
		}
		return nil
	case float64:
		g, ok := got.(float64)
		if !ok || math.Abs(g-w) > 1e-12+1e-9*math.Abs(w) {
			return fmt.Errorf("%s: want %v, got %v", path, w, brief(got))
		}
		return nil
	default:
		if fmt.Sprint(want) != fmt.Sprint(got) {
			return fmt.Errorf("%s: want %v, got %v", path, want, brief(got))
		}
		return nil
	}
}

func brief(v any) string {
	b, _ := json.Marshal(v)
	if len(b) > 300 {
		return string(b[:300]) + "…"
	}
	return string(b)
}
