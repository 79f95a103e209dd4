package main

import (
	"encoding/json"
	"strings"
	"testing"

	"gusset/protocol"
)

// solveLine runs one solve request through run and returns its result.
func solveLine(t *testing.T, model string) protocol.SolveResult {
	t.Helper()
	code, out, errOut := runCapture([]string{"run", "-"}, `{"jsonrpc":"2.0","id":1,"method":"solve","params":{"cases":["w"],"model":`+model+`}}`+"\n")
	if code != 0 {
		t.Fatalf("run: exit %d: %s", code, errOut)
	}
	var resp struct {
		Result protocol.SolveResult `json:"result"`
	}
	if err := json.Unmarshal([]byte(out), &resp); err != nil {
		t.Fatalf("%v: %s", err, out)
	}
	return resp.Result
}

// TestSummaryLineNeverFlatters checks the demo's summary line on issue
// 14's beam that fails in bending (10 m simply supported, 10 kN/m,
// E = 2.1e8, I = 1e-4: 5wL⁴/384EI = 62.0 mm and wL²/8 = 125 kN·m, so
// 125/(W·f) = 1.06 with W = 5e-4 and f = 2.35e5; Roark, from memory):
// with the section modulus the line gives the failing utilisation;
// without it the line says the utilisation is not known instead of
// printing 0. Hung at B from D (13, 4) by a 5 m tie loaded across its
// length (0.1 kN/m), the girder's end reaction wL/2 = 50 kN needs a tie
// force of 50·5/4 = 62.5 kN (statics), about 63 with the tie's own load,
// 0.05 of A·f = 1175 kN; the tie bends under its load as a simple span,
// but its section gives no section modulus, so the line
// must say that the largest utilisation covers the checked members only
// and how far the tie's axial check alone goes.
func TestSummaryLineNeverFlatters(t *testing.T) {
	const material = `"materials":[{"id":"steel","elastic_modulus":2.1e8,"tension_limit":2.35e5,"compression_limit":2.35e5}]`
	beam := func(section string) string {
		return `{"dimension":2,` + material + `,"sections":[{"id":"s","area":0.005,"second_moment":1e-4` + section + `}],
"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[10,0]}],
"members":[{"id":"girder","ends":["A","B"],"material":"steel","section":"s","type":"beam"}],
"supports":[{"node":"A","fix":["x","y"]},{"node":"B","fix":["y"]}],
"load_cases":[{"id":"w","member_loads":[{"member":"girder","kind":"uniform","value":[0,-10]}]}]}`
	}
	const hung = `{"dimension":2,` + material + `,"sections":[{"id":"s","area":0.005,"second_moment":1e-4,"section_modulus":5e-4},{"id":"t","area":0.005,"second_moment":1e-4}],
"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[10,0]},{"id":"D","at":[13,4]}],
"members":[{"id":"girder","ends":["A","B"],"material":"steel","section":"s","type":"beam"},{"id":"tie","ends":["B","D"],"material":"steel","section":"t","type":"bar"}],
"supports":[{"node":"A","fix":["x","y"]},{"node":"D","fix":["x","y"]}],
"load_cases":[{"id":"w","member_loads":[{"member":"girder","kind":"uniform","value":[0,-10]},{"member":"tie","kind":"uniform","value":[0,-0.1]}]}]}`
	for _, c := range []struct {
		name, model string
		want, never []string
	}{
		{"checked", beam(`,"section_modulus":5e-4`), []string{"deflection  62.0 mm at girder", "utilisation 1.06 (girder)"}, []string{"not checked"}},
		{"no section modulus", beam(""), []string{"deflection  62.0 mm at girder", "utilisation not known", "1 not"}, []string{"utilisation 0.00"}},
		{"hung from a tie loaded across", hung, []string{"(girder) of the checked members; 1 not checked", "whose axial checks alone reach 0.05"}, nil},
	} {
		t.Run(c.name, func(t *testing.T) {
			line := summaryLine(solveLine(t, c.model).Cases[0])
			for _, w := range c.want {
				if !strings.Contains(line, w) {
					t.Errorf("line %q lacks %q", line, w)
				}
			}
			for _, n := range c.never {
				if strings.Contains(line, n) {
					t.Errorf("line %q says %q", line, n)
				}
			}
		})
	}
}

// TestWrapped checks the demo's line breaking: no line beyond the width
// unless one word is longer, later lines indented, the words and the
// runs of spaces of each line kept.
func TestWrapped(t *testing.T) {
	text := "   deflection  73.4 mm at U4, utilisation 0.24 (L6-U6) of the checked members; 22 not checked (see unchecked), whose axial checks alone reach 0.74"
	got := wrapped(text, "      ", 40)
	lines := strings.Split(got, "\n")
	if len(lines) < 4 || !strings.HasPrefix(got, "   deflection  73.4 mm") {
		t.Fatalf("wrapped into %q", lines)
	}
	for i, l := range lines {
		if len([]rune(l)) > 40 || (i > 0 && !strings.HasPrefix(l, "      ")) {
			t.Errorf("line %d %q: longer than 40 or not indented", i, l)
		}
	}
	if strings.Join(strings.Fields(got), " ") != strings.Join(strings.Fields(text), " ") {
		t.Errorf("words changed: %q", got)
	}
	if got := wrapped("ab "+strings.Repeat("x", 50), "  ", 10); got != "ab\n  "+strings.Repeat("x", 50) {
		t.Errorf("a long word: %q", got)
	}
}
