package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"sort"
	"strings"
	"sync"

	"gusset/protocol"
	"gusset/protocol/jsonrpc"
	"gusset/schema"
)

// answered is one request of a run file with its answer, for the
// pictures, the report and the CSV files written after the run.
type answered struct {
	ID       json.RawMessage
	Method   string
	Params   json.RawMessage
	Response *protocol.Response
}

// runFile is `gusset run`: it reads the whole file, answers every request
// and writes the answers (in file order unless --ordered=false), then the
// pictures, report and CSV files asked for.
func runFile(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	f := newFlags(stderr)
	positional, exit, done := f.parseCommand(args, stdout)
	if done {
		return exit
	}
	if len(positional) != 1 {
		fmt.Fprintln(stderr, "gusset run: give one FILE of requests (one request per line, or one JSON document), or - for stdin; flags may come before or after it")
		return 2
	}
	rf, err := loadRequestFile(positional[0], stdin, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "gusset run: %v\n", err)
		return 2
	}
	out, notify, ok := f.outputs(stdout, stderr)
	if !ok {
		return 2
	}
	if err := makeOutputDirs(f); err != nil {
		fmt.Fprintf(stderr, "gusset run: %v\n", err)
		return 2
	}
	tuneMemory()
	s, err := newServer(f.limits, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "gusset: %v\n", err)
		return 1
	}
	drawing := pictureMethods(s)
	if f.pictures != "" || f.report != "" {
		rf.askForPictures(drawing)
	}
	var order []string
	if f.ordered {
		order = rf.keys
	}
	router := newOutputRouter(out, notify, order)
	var col *answerCollector
	if f.pictures != "" || f.report != "" || f.csv != "" {
		col = &answerCollector{byKey: map[string][]*protocol.Response{}}
		s.OnResponse = col.add
	}
	if isTerminal(stderr) {
		bar := &progressBar{out: stderr}
		s.OnProgress = bar.update
		defer bar.clear()
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	failures, err := s.Serve(ctx, bytes.NewReader(rf.ndjson()), router)
	if cerr := router.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		fmt.Fprintf(stderr, "gusset: writing output: %v\n", err)
		return 1
	}
	if col != nil {
		if code := writeArtefacts(f, col.pair(rf), drawing, stderr); code != 0 {
			return code
		}
	}
	if failures > 0 {
		return 1
	}
	return 0
}

// loadRequestFile reads the request file name ("-" reads stdin, named
// "stdin" in messages) and parses it, writing its diagnostics to diag.
func loadRequestFile(name string, stdin io.Reader, diag io.Writer) (*requestFile, error) {
	var data []byte
	var err error
	if name == "-" {
		name = "stdin"
		data, err = io.ReadAll(stdin)
	} else {
		data, err = os.ReadFile(name)
	}
	if err != nil {
		return nil, err
	}
	return readRequestFile(name, data, diag)
}

// makeOutputDirs creates the picture, report and CSV directories the flags
// name, stopping at the first that cannot be made.
func makeOutputDirs(f *flags) error {
	for _, dir := range []string{f.pictures, f.report, f.csv} {
		if dir == "" {
			continue
		}
		if err := os.MkdirAll(dir, 0o755); err != nil {
			return err
		}
	}
	return nil
}

// writeArtefacts writes the pictures, the report and the CSV files.
func writeArtefacts(f *flags, list []answered, drawing map[string]bool, stderr io.Writer) int {
	if f.pictures != "" {
		n, err := writePictures(f.pictures, list)
		if err != nil {
			fmt.Fprintf(stderr, "gusset run: %v\n", err)
			return 1
		}
		if n == 0 {
			fmt.Fprintf(stderr, "gusset run: --pictures %s: no answer carried a picture, so none was written; the methods that draw one are %s\n",
				f.pictures, strings.Join(sortedKeys(drawing), ", "))
		}
	}
	if f.report != "" {
		if err := writeReport(filepath.Join(f.report, "report.html"), "Gusset report", list); err != nil {
			fmt.Fprintf(stderr, "gusset run: %v\n", err)
			return 1
		}
	}
	if f.csv != "" {
		files, err := writeCSV(f.csv, list)
		if err != nil {
			fmt.Fprintf(stderr, "gusset run: %v\n", err)
			return 1
		}
		if files == 0 {
			fmt.Fprintf(stderr, "gusset run: --csv %s: no answer held a member or node table, so no file was written\n", f.csv)
		}
	}
	return 0
}

// answerCollector keeps every answer by its id, for pairing with the requests.
type answerCollector struct {
	mu    sync.Mutex
	byKey map[string][]*protocol.Response
}

func (c *answerCollector) add(r *protocol.Response) {
	c.mu.Lock()
	defer c.mu.Unlock()
	key := compactKey(r.ID)
	c.byKey[key] = append(c.byKey[key], r)
}

// pair returns the requests of the file, in order, with their answers.
func (c *answerCollector) pair(rf *requestFile) []answered {
	c.mu.Lock()
	defer c.mu.Unlock()
	var list []answered
	for i, line := range rf.lines {
		key := rf.keys[i]
		if key == "" || key == "null" || len(c.byKey[key]) == 0 {
			continue
		}
		var envelope struct {
			ID     json.RawMessage `json:"id"`
			Method string          `json:"method"`
			Params json.RawMessage `json:"params"`
		}
		_ = json.Unmarshal(line, &envelope)
		list = append(list, answered{ID: envelope.ID, Method: envelope.Method, Params: envelope.Params, Response: c.byKey[key][0]})
		c.byKey[key] = c.byKey[key][1:]
	}
	return list
}

// pictureMethods returns the methods whose params take "picture", read
// from describe and the published schema.
func pictureMethods(s *jsonrpc.Server) map[string]bool {
	var buf bytes.Buffer
	_, _ = s.Serve(context.Background(), strings.NewReader(`{"jsonrpc":"2.0","id":0,"method":"describe"}`+"\n"), &buf)
	var resp struct {
		Result struct {
			Methods []struct {
				Name   string `json:"name"`
				Params string `json:"params"`
			} `json:"methods"`
		} `json:"result"`
	}
	var doc struct {
		Defs map[string]struct {
			Properties map[string]json.RawMessage `json:"properties"`
		} `json:"$defs"`
	}
	out := map[string]bool{}
	if json.Unmarshal(buf.Bytes(), &resp) != nil || json.Unmarshal(schema.Document, &doc) != nil {
		return out
	}
	for _, m := range resp.Result.Methods {
		if _, ok := doc.Defs[m.Params].Properties["picture"]; ok {
			out[m.Name] = true
		}
	}
	return out
}

// askForPictures sets "picture": true in every request of a method that
// draws one, unless the request says otherwise.
func (rf *requestFile) askForPictures(drawing map[string]bool) {
	for i, line := range rf.lines {
		var envelope map[string]json.RawMessage
		if json.Unmarshal(line, &envelope) != nil {
			continue
		}
		var method string
		if json.Unmarshal(envelope["method"], &method) != nil || !drawing[method] {
			continue
		}
		var params map[string]json.RawMessage
		if json.Unmarshal(envelope["params"], &params) != nil {
			continue
		}
		if _, set := params["picture"]; set {
			continue
		}
		params["picture"] = json.RawMessage("true")
		b, err := json.Marshal(params)
		if err != nil {
			continue
		}
		envelope["params"] = b
		if b, err = json.Marshal(envelope); err == nil {
			rf.lines[i] = b
		}
	}
}

// writePictures writes each answer's picture into dir as ID.svg, the id
// made safe for a file name, and returns how many it wrote.
func writePictures(dir string, list []answered) (int, error) {
	n := 0
	for _, a := range list {
		picture := pictureOf(a.Response)
		if picture == "" {
			continue
		}
		file := filepath.Join(dir, fileName(a.ID)+".svg")
		if err := os.WriteFile(file, []byte(picture), 0o644); err != nil {
			return n, fmt.Errorf("writing %s: %v", file, err)
		}
		n++
	}
	return n, nil
}

// pictureOf returns the SVG picture a result carries in its "picture"
// field, or "".
func pictureOf(r *protocol.Response) string {
	if r == nil || r.Result == nil {
		return ""
	}
	b, err := json.Marshal(r.Result)
	if err != nil {
		return ""
	}
	var v struct {
		Picture string `json:"picture"`
	}
	_ = json.Unmarshal(b, &v)
	return v.Picture
}

// fileName makes a request id safe for a file name.
func fileName(id json.RawMessage) string {
	name := strings.Map(func(c rune) rune {
		if c == '/' || c == '\\' || c == '"' || c == ':' || c < ' ' {
			return '_'
		}
		return c
	}, strings.Trim(string(id), `"`))
	if name == "" || name == "." || name == ".." {
		name = "_"
	}
	return name
}

func sortedKeys(m map[string]bool) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}
