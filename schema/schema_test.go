package schema

import (
	"encoding/json"
	"fmt"
	"strings"
	"testing"

	"gusset/protocol"
)

// TestDescriptionsPresent guards against the doc comments silently
// vanishing (a wrong base path for AddGoComments drops them all).
func TestDescriptionsPresent(t *testing.T) {
	var doc struct {
		Defs map[string]struct {
			Description string `json:"description"`
		} `json:"$defs"`
	}
	if err := json.Unmarshal(Document, &doc); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"Model", "Member", "SolveParams", "Request"} {
		if doc.Defs[name].Description == "" {
			t.Errorf("$defs/%s has no description", name)
		}
	}
}

func TestValidatorPointers(t *testing.T) {
	v, err := NewValidator(map[string]string{"solve": "SolveParams"})
	if err != nil {
		t.Fatal(err)
	}
	model := `{"dimension":2,"materials":[{"id":"s","elastic_modulus":1}],"sections":[{"id":"a","area":1}],` +
		`"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[1,%s]}],"members":[{"id":"AB","ends":["A","B"],"material":"s","section":"a"%s}]}`
	cases := []struct {
		name, coord, member string
		path                string
	}{
		{"valid", `0`, ``, ""},
		{"expression allowed", `"depth"`, ``, ""},
		{"number as string where no expression", `0`, `,"buckling_factor":"1"`, "/params/model/members/0/buckling_factor"},
		{"boolean coordinate", `true`, ``, "/params/model/nodes/1/at/1"},
		{"unknown field", `0`, `,"colour":"red"`, "/params/model/members/0"},
		{"huge number", `1e400`, ``, "/params/model/nodes/1/at/1"},
		{"bad type", `0`, `,"type":"rope"`, "/params/model/members/0/type"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			params := []byte(`{"model":` + fmt.Sprintf(model, c.coord, c.member) + `}`)
			e := v.Validate("solve", params)
			if c.path == "" {
				if e != nil {
					t.Fatalf("unexpected error: %+v", e.Data.Problems)
				}
				return
			}
			if e == nil {
				t.Fatal("no error")
			}
			if e.Code != protocol.CodeInvalidParams {
				t.Errorf("code %d", e.Code)
			}
			found := false
			for _, p := range e.Data.Problems {
				found = found || p.Path == c.path
			}
			if !found {
				t.Errorf("problems %+v lack path %s", e.Data.Problems, c.path)
			}
		})
	}
}

// TestUnknownPropertyHints: a misspelt or misremembered property name gets
// the nearest allowed name of that object; an unrelated one gets none.
func TestUnknownPropertyHints(t *testing.T) {
	v, err := NewValidator(map[string]string{"solve": "SolveParams"})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ field, hint string }{
		{"cases", "did you mean 'load_cases' for 'cases'?"},
		{"load_case", "did you mean 'load_cases' for 'load_case'?"},
		{"Supports", "did you mean 'supports' for 'Supports'?"},
		{"colour", ""},
	} {
		params := `{"model":{"dimension":2,"materials":[],"sections":[],"nodes":[],"members":[],"` + c.field + `":[]}}`
		e := v.Validate("solve", []byte(params))
		if e == nil || len(e.Data.Problems) != 1 {
			t.Fatalf("%s: %+v", c.field, e)
		}
		msg := e.Data.Problems[0].Message
		if c.hint == "" && strings.Contains(msg, "did you mean") || c.hint != "" && !strings.Contains(msg, c.hint) {
			t.Errorf("%s: message %q, want hint %q", c.field, msg, c.hint)
		}
	}
}

// TestEditDistance checks the Levenshtein distance on the textbook pairs
// kitten/sitting (3) and flaw/lawn (2) (common practice) and the empty
// string.
func TestEditDistance(t *testing.T) {
	for _, c := range []struct {
		a, b string
		want int
	}{{"kitten", "sitting", 3}, {"flaw", "lawn", 2}, {"", "abc", 3}, {"same", "same", 0}} {
		if got := editDistance(c.a, c.b); got != c.want {
			t.Errorf("editDistance(%q, %q) = %d, want %d", c.a, c.b, got, c.want)
		}
	}
}
