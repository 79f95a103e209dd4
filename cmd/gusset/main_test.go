package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gusset/schema"
)

func runCapture(args []string, stdin string) (code int, stdout, stderr string) {
	var out, errOut bytes.Buffer
	code = run(args, strings.NewReader(stdin), &out, &errOut)
	return code, out.String(), errOut.String()
}

func TestVersionHelpSchema(t *testing.T) {
	if code, out, _ := runCapture([]string{"--version"}, ""); code != 0 || !strings.HasPrefix(out, "gusset ") {
		t.Errorf("--version: %d %q", code, out)
	}
	if code, out, _ := runCapture([]string{"--help"}, ""); code != 0 || !strings.Contains(out, "gusset run") || !strings.Contains(out, "-jobs") {
		t.Errorf("--help: %d %q", code, out)
	}
	if code, out, _ := runCapture([]string{"schema"}, ""); code != 0 || out != string(schema.Document) {
		t.Errorf("schema: %d", code)
	}
	if code, _, errOut := runCapture([]string{"frobnicate"}, ""); code != 2 || !strings.Contains(errOut, "unknown command") {
		t.Errorf("unknown command: %d %q", code, errOut)
	}
	if code, _, _ := runCapture([]string{"--jobs", "x"}, ""); code != 2 {
		t.Errorf("bad flag: %d", code)
	}
}

// TestRunExitStatus checks that run exits 0 when every request succeeded
// and 1 when any failed, answering all of them either way.
func TestRunExitStatus(t *testing.T) {
	dir := t.TempDir()
	good := filepath.Join(dir, "good.jsonl")
	os.WriteFile(good, []byte(`{"jsonrpc":"2.0","id":1,"method":"describe"}`+"\n"), 0o644)
	if code, out, _ := runCapture([]string{"run", good}, ""); code != 0 || strings.Count(out, "\n") != 1 {
		t.Errorf("good file: %d %q", code, out)
	}
	bad := filepath.Join(dir, "bad.jsonl")
	os.WriteFile(bad, []byte(`{"jsonrpc":"2.0","id":1,"method":"describe"}`+"\nnot json\n"), 0o644)
	if code, out, _ := runCapture([]string{"run", bad}, ""); code != 1 || strings.Count(out, "\n") != 2 {
		t.Errorf("bad file: %d %q", code, out)
	}
	if code, _, _ := runCapture([]string{"run", "-"}, `{"jsonrpc":"2.0","id":1,"method":"describe"}`+"\n"); code != 0 {
		t.Errorf("stdin: %d", code)
	}
	if code, _, errOut := runCapture([]string{"run", filepath.Join(dir, "missing.jsonl")}, ""); code != 2 || errOut == "" {
		t.Errorf("missing file: %d %q", code, errOut)
	}
}

// TestServeDescribe checks describe through the whole command: every
// engine method registered, limits from flags, the schema's id.
func TestServeDescribe(t *testing.T) {
	code, out, _ := runCapture([]string{"serve", "--jobs", "3", "--max-nodes", "500"}, `{"jsonrpc":"2.0","id":"d","method":"describe"}`+"\n")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	var resp struct {
		Result struct {
			Methods []struct{ Name string } `json:"methods"`
			Limits  struct {
				Workers  int `json:"workers"`
				MaxNodes int `json:"max_nodes"`
			} `json:"limits"`
			SchemaID string `json:"schema_id"`
		} `json:"result"`
	}
	if err := json.Unmarshal([]byte(out), &resp); err != nil {
		t.Fatal(err)
	}
	if resp.Result.Limits.Workers != 3 || resp.Result.Limits.MaxNodes != 500 || resp.Result.SchemaID != schema.ID {
		t.Errorf("describe: %+v", resp.Result)
	}
}

// readMessages splits output into decoded messages, failing on any line
// that is not a whole JSON object.
func readMessages(t *testing.T, out string) []map[string]any {
	t.Helper()
	var msgs []map[string]any
	sc := bufio.NewScanner(strings.NewReader(out))
	sc.Buffer(nil, 1<<28)
	for sc.Scan() {
		var m map[string]any
		dec := json.NewDecoder(bytes.NewReader(sc.Bytes()))
		dec.UseNumber()
		if err := dec.Decode(&m); err != nil {
			t.Fatalf("output line is not a JSON object: %.200q", sc.Text())
		}
		msgs = append(msgs, m)
	}
	return msgs
}

// TestRunWritesPictures checks --pictures: the picture a reciprocate result
// carries lands in the folder as ID.svg.
func TestRunWritesPictures(t *testing.T) {
	dir := t.TempDir()
	input, err := os.ReadFile("../../testdata/transcripts/triangle-reciprocal.in.jsonl")
	if err != nil {
		t.Fatal(err)
	}
	request := strings.Replace(string(input), `"method":"reciprocate","params":{`, `"method":"reciprocate","params":{"picture":true,`, 1)
	if code, _, errOut := runCapture([]string{"run", "--pictures", dir, "-"}, request); code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	b, err := os.ReadFile(filepath.Join(dir, "tri.svg"))
	if err != nil || !strings.Contains(string(b), "<svg") || !strings.Contains(string(b), "qualified engineer") {
		t.Errorf("picture not written: %v", err)
	}
	if code, _, _ := runCapture([]string{"serve", "--pictures", dir}, ""); code != 2 {
		t.Errorf("serve --pictures: exit %d, want 2", code)
	}
}
