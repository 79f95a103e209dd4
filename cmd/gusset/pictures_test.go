package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"gusset/engine/render"
)

// TestPicturesHaveNoLabelCollisions counts label defects (a label's box
// over another label or an arrowhead, or a label without a halo on a
// drawn line; render.CheckLabels) in every picture the demo writes, every
// picture inlined in its report, every picture the transcripts draw
// through run --pictures, and the charts the Python and Node examples
// write. The target is none.
func TestPicturesHaveNoLabelCollisions(t *testing.T) {
	dir := t.TempDir()
	if code, _, errOut := runCapture([]string{"demo", "--out", dir}, ""); code != 0 {
		t.Fatalf("demo: exit %d: %s", code, errOut)
	}
	pictures := filepath.Join(dir, "run")
	var in strings.Builder
	for _, name := range []string{"two-bar.in.jsonl", "triangle-reciprocal.in.jsonl", "layout-two-bar.in.jsonl"} {
		in.WriteString(readTranscript(t, name) + "\n")
	}
	// A space frame (a column and a beam at right angles, loaded at the
	// beam's tip across both), for the 3D moment picture.
	in.WriteString(`{"jsonrpc":"2.0","id":"space-frame","method":"solve","params":{"picture":true,"model":{"dimension":3,` +
		`"materials":[{"id":"steel","elastic_modulus":2.1e8}],"sections":[{"id":"s","area":0.01,"second_moment":1e-4,"second_moment_y":5e-5,"torsion_constant":2e-5}],` +
		`"nodes":[{"id":"base","at":[0,0,0]},{"id":"knee","at":[0,0,3]},{"id":"tip","at":[4,0,3]}],` +
		`"members":[{"id":"column","ends":["base","knee"],"material":"steel","section":"s","type":"beam"},{"id":"arm","ends":["knee","tip"],"material":"steel","section":"s","type":"beam"}],` +
		`"supports":[{"node":"base","fix":["x","y","z","rx","ry","rz"]}],"load_cases":[{"id":"tip","loads":[{"node":"tip","force":[0,2,-10]}]}]}}}` + "\n")
	// A pitched portal hinged at its crown (both rafters released there),
	// for the hinge marks of the 2D moment picture; the demo's deck bay
	// has them in 3D.
	in.WriteString(`{"jsonrpc":"2.0","id":"hinged-portal","method":"solve","params":{"picture":true,"model":{"dimension":2,` +
		`"materials":[{"id":"steel","elastic_modulus":2.1e8}],"sections":[{"id":"frame","area":0.005,"second_moment":8e-5}],` +
		`"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[0,4]},{"id":"C","at":[4,5]},{"id":"D","at":[8,4]},{"id":"E","at":[8,0]}],` +
		`"members":[{"id":"AB","ends":["A","B"],"material":"steel","section":"frame","type":"beam"},` +
		`{"id":"BC","ends":["B","C"],"material":"steel","section":"frame","type":"beam","releases":{"second":["rz"]}},` +
		`{"id":"CD","ends":["C","D"],"material":"steel","section":"frame","type":"beam","releases":{"first":["rz"]}},` +
		`{"id":"DE","ends":["D","E"],"material":"steel","section":"frame","type":"beam"}],` +
		`"supports":[{"node":"A","fix":["x","y"]},{"node":"E","fix":["x","y"]}],"load_cases":[{"id":"wind and roof","loads":[{"node":"B","force":[10,0]}],` +
		`"member_loads":[{"member":"BC","kind":"uniform","value":[0,-10]},{"member":"CD","kind":"uniform","value":[0,-10]}]}]}}}` + "\n")
	runCapture([]string{"run", "-", "--pictures", pictures}, in.String())
	files, _ := filepath.Glob(filepath.Join(dir, "*.svg"))
	more, _ := filepath.Glob(filepath.Join(pictures, "*.svg"))
	files = append(files, more...)
	files = append(files, exampleCharts(t)...)
	if len(files) < 6 {
		t.Fatalf("only %d pictures to check: %v", len(files), files)
	}
	docs := map[string][]byte{}
	for _, f := range files {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		docs[filepath.Base(filepath.Dir(f))+"/"+filepath.Base(f)] = b
	}
	report, err := os.ReadFile(filepath.Join(dir, "report.html"))
	if err != nil {
		t.Fatal(err)
	}
	for i, svg := range regexp.MustCompile(`(?s)<svg.*?</svg>`).FindAll(report, -1) {
		docs["report.html#"+string(rune('a'+i))] = svg
	}
	spaceMoments, planeHinges, spaceHinges := false, 0, 0
	for _, doc := range docs {
		spaceMoments = spaceMoments || strings.Contains(string(doc), "My about local y")
		if hinges := strings.Count(string(doc), `class="hinge"`); strings.Contains(string(doc), "My about local y") {
			spaceHinges += hinges
		} else {
			planeHinges += hinges
		}
	}
	if !spaceMoments {
		t.Error("the space frame's picture has no moment diagrams")
	}
	// The portal's two rafter ends at its crown (2D), the deck bay's three
	// cross-beams released at both ends (3D): the labels are checked
	// against these marks below.
	if planeHinges < 2 || spaceHinges < 6 {
		t.Errorf("hinge marks: %d in plane pictures, %d in space pictures; want at least 2 and 6", planeHinges, spaceHinges)
	}
	for name, doc := range docs {
		rep, err := render.CheckLabels(doc)
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		if rep.Texts == 0 {
			t.Errorf("%s: no text found to check", name)
		}
		if rep.Defects() > 0 {
			t.Errorf("%s: %d label defects: %v %v %v %v", name, rep.Defects(), rep.TextOverlaps, rep.ArrowOverlaps, rep.HingeOverlaps, rep.UnhaloedOnLine)
		}
	}
}

// exampleCharts runs the clients' walkway examples, when their
// interpreters are here, and returns the charts they write.
func exampleCharts(t *testing.T) []string {
	bin := filepath.Join(t.TempDir(), "gusset")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	var files []string
	for _, ex := range []struct{ interpreter, script string }{
		{"python3", "../../clients/python/examples/walkway_variants.py"},
		{"node", "../../clients/node/examples/walkway-variants.mjs"},
	} {
		if _, err := exec.LookPath(ex.interpreter); err != nil {
			if os.Getenv("GUSSET_REQUIRE_CLIENTS") != "" {
				t.Fatalf("%s is missing", ex.interpreter)
			}
			continue
		}
		out := t.TempDir()
		cmd := exec.Command(ex.interpreter, ex.script, out)
		cmd.Env = append(os.Environ(), "GUSSET_BINARY="+bin)
		if b, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("%s %s: %v\n%s", ex.interpreter, ex.script, err, b)
		}
		found, _ := filepath.Glob(filepath.Join(out, "*.svg"))
		files = append(files, found...)
	}
	return files
}
