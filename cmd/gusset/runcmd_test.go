package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gusset/protocol"
)

func readTranscript(t *testing.T, name string) string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("../../testdata/transcripts", name))
	if err != nil {
		t.Fatal(err)
	}
	return strings.TrimSpace(string(b))
}

// answerIDs returns the ids of the final answers in output order.
func answerIDs(t *testing.T, out string) []string {
	t.Helper()
	var ids []string
	for _, m := range readMessages(t, out) {
		if id, ok := m["id"]; ok {
			b, _ := json.Marshal(id)
			ids = append(ids, string(b))
		}
	}
	return ids
}

// TestRunPrettyDocumentAndFlagsAfterFile checks that run takes a
// pretty-printed request and an array of requests, with flags after the
// file, and answers in file order.
func TestRunPrettyDocumentAndFlagsAfterFile(t *testing.T) {
	dir := t.TempDir()
	var requests []json.RawMessage
	for _, name := range []string{"two-bar-sweep.in.jsonl", "triangle-reciprocal.in.jsonl", "two-bar.in.jsonl"} {
		for _, line := range strings.Split(readTranscript(t, name), "\n") {
			requests = append(requests, json.RawMessage(line))
		}
	}
	requests = append(requests, json.RawMessage(`{"jsonrpc":"2.0","id":"last","method":"describe"}`))
	pretty, err := json.MarshalIndent(requests, "", "  ")
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(dir, "requests.json")
	os.WriteFile(file, pretty, 0o644)
	code, out, errOut := runCapture([]string{"run", file, "--jobs", "2", "--notifications", "none"}, "")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var want []string
	for _, r := range requests {
		var env struct{ ID json.RawMessage }
		json.Unmarshal(r, &env)
		if env.ID != nil {
			want = append(want, compactKey(env.ID))
		}
	}
	if got := answerIDs(t, out); strings.Join(got, " ") != strings.Join(want, " ") {
		t.Errorf("answers in order %v, want the file's order %v", got, want)
	}
	if strings.Contains(out, `"method":"progress"`) {
		t.Error("--notifications none left progress on stdout")
	}
	// One pretty-printed request alone, with a byte-order mark.
	one, _ := json.MarshalIndent(json.RawMessage(requests[len(requests)-1]), "", "    ")
	os.WriteFile(file, append([]byte("\xEF\xBB\xBF"), one...), 0o644)
	if code, out, errOut := runCapture([]string{"run", file}, ""); code != 0 || len(answerIDs(t, out)) != 1 {
		t.Errorf("one pretty request: exit %d, %q %s", code, out, errOut)
	}
}

// TestRunParseErrorsHaveLineNumbers checks that a broken document is
// refused with its line and column, and a broken NDJSON line is named.
func TestRunParseErrorsHaveLineNumbers(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "broken.json")
	os.WriteFile(file, []byte("{\n  \"jsonrpc\": \"2.0\",\n  \"id\": 1,\n  \"method\": \"describe\"\n  \"params\": {}\n}\n"), 0o644)
	code, _, errOut := runCapture([]string{"run", file}, "")
	if code != 2 || !strings.Contains(errOut, "broken.json:5:3:") {
		t.Errorf("exit %d, stderr %q; want exit 2 and broken.json:5:3", code, errOut)
	}
	os.WriteFile(file, []byte(`{"jsonrpc":"2.0","id":1,"method":"describe"}`+"\n"+`{"jsonrpc":`+"\n"), 0o644)
	code, out, errOut := runCapture([]string{"run", file}, "")
	if code != 1 || !strings.Contains(errOut, "broken.json:2:") || strings.Count(out, "\n") != 2 {
		t.Errorf("NDJSON with a broken line: exit %d, stderr %q, stdout %q", code, errOut, out)
	}
}

// TestRunNotificationsToStderr checks that --notifications stderr keeps
// stdout to answers alone and puts the sweep's progress on stderr.
func TestRunNotificationsToStderr(t *testing.T) {
	in := readTranscript(t, "two-bar-sweep.in.jsonl") + "\n"
	code, out, errOut := runCapture([]string{"run", "-", "--notifications", "stderr"}, in)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if strings.Count(strings.TrimSpace(out), "\n") != strings.Count(strings.TrimSpace(in), "\n") || strings.Contains(out, "progress") {
		t.Errorf("stdout holds more than the answers: %.300s", out)
	}
	if !strings.Contains(errOut, `"method":"progress"`) {
		t.Errorf("no progress on stderr: %.300s", errOut)
	}
	if code, _, _ := runCapture([]string{"run", "-", "--notifications", "elsewhere"}, in); code != 2 {
		t.Errorf("a bad --notifications: exit %d, want 2", code)
	}
}

// TestRunPicturesWithoutAsking checks that --pictures turns pictures on
// for every request that can draw one, and says so when none could.
func TestRunPicturesWithoutAsking(t *testing.T) {
	dir := t.TempDir()
	in := readTranscript(t, "triangle-reciprocal.in.jsonl") + "\n"
	if code, _, errOut := runCapture([]string{"run", "-", "--pictures", dir}, in); code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if b, err := os.ReadFile(filepath.Join(dir, "tri.svg")); err != nil || !bytes.Contains(b, []byte("<svg")) {
		t.Errorf("no picture written without \"picture\": true: %v", err)
	}
	empty := t.TempDir()
	_, _, errOut := runCapture([]string{"run", "-", "--pictures", empty}, `{"jsonrpc":"2.0","id":1,"method":"describe"}`+"\n")
	if !strings.Contains(errOut, "none was written") || !strings.Contains(errOut, "reciprocate") {
		t.Errorf("nothing written, and stderr says %q", errOut)
	}
}

// TestRunCSV checks --csv: one file per result table with a header line,
// the two-bar truss's bar forces −8.33 kN each (statics of the symmetric
// two-bar truss: N = −P/(2 sin θ) with sin θ = 3/5, P = 10 kN; common
// practice).
func TestRunCSV(t *testing.T) {
	dir := t.TempDir()
	in := readTranscript(t, "two-bar.in.jsonl") + "\n"
	if code, _, errOut := runCapture([]string{"run", "-", "--csv", dir}, in); code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	files, _ := filepath.Glob(filepath.Join(dir, "*-members-*.csv"))
	if len(files) == 0 {
		t.Fatal("no member CSV written")
	}
	b, _ := os.ReadFile(files[0])
	lines := strings.Split(strings.TrimSpace(string(b)), "\n")
	if !strings.HasPrefix(lines[0], "member,ends,") || len(lines) < 2 {
		t.Fatalf("CSV %s: %q", files[0], b)
	}
	if !strings.Contains(lines[1], "-8.33333") {
		t.Errorf("first member row %q lacks −8.333 kN", lines[1])
	}
}

func TestSchemaHelp(t *testing.T) {
	code, out, _ := runCapture([]string{"schema", "--help"}, "")
	if code != 0 || strings.Contains(out, "$schema") || !strings.Contains(out, "gusset schema") {
		t.Errorf("schema --help: %d %q", code, out)
	}
	if code, out, _ := runCapture([]string{"run", "--help"}, ""); code != 0 || !strings.Contains(out, "-ordered") || !strings.Contains(out, "-notifications") {
		t.Errorf("run --help: %d %.200q", code, out)
	}
}

// TestProgressBarWithoutTotal checks that a stage without a known total
// (a refinement's evaluations) is shown as a count, never as a bar.
func TestProgressBarWithoutTotal(t *testing.T) {
	var buf bytes.Buffer
	bar := &progressBar{out: &buf}
	bar.update(&protocol.Progress{Request: json.RawMessage(`"s"`), Stage: "refining", Done: 21})
	if got := buf.String(); strings.Contains(got, "/") || !strings.Contains(got, "21 done") {
		t.Errorf("progress line %q", got)
	}
}

// TestMessagesHintAndListWithCommas checks, through the command, that a
// misspelt method gets a did-you-mean leading its message, that a far one
// does not, and that lists of names print with commas.
func TestMessagesHintAndListWithCommas(t *testing.T) {
	in := `{"jsonrpc":"2.0","id":1,"method":"Solve"}` + "\n" +
		`{"jsonrpc":"2.0","id":2,"method":"load_path"}` + "\n" +
		`{"jsonrpc":"2.0","id":3,"method":"frobnicate"}` + "\n"
	_, out, _ := runCapture([]string{"run", "-"}, in)
	msgs := readMessages(t, out)
	if len(msgs) != 3 {
		t.Fatalf("%d answers", len(msgs))
	}
	message := func(m map[string]any) string { return m["error"].(map[string]any)["message"].(string) }
	for i, want := range []string{`did you mean "solve"?`, `did you mean "load-path"?`} {
		if msg := message(msgs[i]); !strings.Contains(msg, want) || strings.Index(msg, want) > strings.Index(msg, "The methods") {
			t.Errorf("answer %d: %q, want %q before the list", i+1, msg, want)
		}
	}
	if msg := message(msgs[2]); strings.Contains(msg, "did you mean") || !strings.Contains(msg, `"cancel", "describe", `) {
		t.Errorf("far name: %q, want no hint and a list with commas", msg)
	}
}

// TestSweepOneAxisObject checks that a sweep's parameters may be one axis
// object on the wire: the answer is the one of the same axis in an array,
// and a misspelt field in the object form is pointed at.
func TestSweepOneAxisObject(t *testing.T) {
	line := readTranscript(t, "two-bar-sweep.in.jsonl")
	var req map[string]any
	if err := json.Unmarshal([]byte(line), &req); err != nil {
		t.Fatal(err)
	}
	params := req["params"].(map[string]any)
	axes := params["parameters"].([]any)
	if len(axes) != 1 {
		t.Fatalf("the transcript sweeps %d axes", len(axes))
	}
	params["parameters"] = axes[0]
	one, _ := json.Marshal(req)
	_, outArray, _ := runCapture([]string{"run", "-", "--notifications", "none"}, line+"\n")
	code, outObject, errOut := runCapture([]string{"run", "-", "--notifications", "none"}, string(one)+"\n")
	if code != 0 || outObject != outArray {
		t.Errorf("one axis object: exit %d, answer differs from the array form:\n%.300s\n%.300s\n%s", code, outObject, outArray, errOut)
	}
	axis := axes[0].(map[string]any)
	axis["nam"] = axis["name"]
	delete(axis, "name")
	params["parameters"] = axis
	bad, _ := json.Marshal(req)
	_, out, _ := runCapture([]string{"run", "-"}, string(bad)+"\n")
	if !strings.Contains(out, "/params/parameters") || !strings.Contains(out, "did you mean 'name'") {
		t.Errorf("a misspelt field of one axis object: %.400s", out)
	}
}
