package schema

import (
	"strings"
	"testing"
)

// TestHintLeads checks that a misspelt required property leads the
// message with its did-you-mean, not with the "missing properties" it
// causes.
func TestHintLeads(t *testing.T) {
	v, err := NewValidator(map[string]string{"solve": "SolveParams"})
	if err != nil {
		t.Fatal(err)
	}
	params := `{"model":{"dimension":2,"materials":[{"id":"s","elastic_modulos":2e8}],"sections":[],"nodes":[],"members":[]}}`
	e := v.Validate("solve", []byte(params))
	if e == nil {
		t.Fatal("accepted a misspelt elastic_modulus")
	}
	if !strings.Contains(e.Data.Problems[0].Message, "did you mean 'elastic_modulus' for 'elastic_modulos'") {
		t.Errorf("first problem %q does not lead with the hint", e.Data.Problems[0].Message)
	}
	if i, j := strings.Index(e.Message, "did you mean"), strings.Index(e.Message, "missing"); i < 0 || (j >= 0 && j < i) {
		t.Errorf("message %q does not lead with the hint", e.Message)
	}
}

// TestBareModel checks that params holding a model's fields without the
// "model" wrapper are told to wrap it, instead of a hint pointing the
// wrong way.
func TestBareModel(t *testing.T) {
	v, err := NewValidator(map[string]string{"solve": "SolveParams"})
	if err != nil {
		t.Fatal(err)
	}
	params := `{"dimension":2,"materials":[],"sections":[],"nodes":[],"members":[],"load_cases":[]}`
	e := v.Validate("solve", []byte(params))
	if e == nil || !strings.Contains(e.Message, "wrap the model") || e.Data.Problems[0].Path != "/params" {
		t.Fatalf("bare model: %+v", e)
	}
	if strings.Contains(e.Message, "did you mean") {
		t.Errorf("bare model still gets a hint: %q", e.Message)
	}
	// One stray model field beside a model is left to the ordinary hint.
	params = `{"model":{"dimension":2,"materials":[],"sections":[],"nodes":[],"members":[]},"nodes":[]}`
	if e := v.Validate("solve", []byte(params)); e == nil || strings.Contains(e.Message, "wrap the model") {
		t.Errorf("a wrapped model with a stray field: %+v", e)
	}
}

// TestClosestMethod checks the hint for misspelt method names: a case
// slip and a separator slip find the method; a far name finds none.
func TestClosestMethod(t *testing.T) {
	methods := []string{"cancel", "describe", "load-path", "optimise-layout", "reciprocate", "solve", "sweep-parameter"}
	for name, want := range map[string]string{"Solve": "solve", "load_path": "load-path", "optimize-layout": "optimise-layout", "frobnicate": ""} {
		if got := Closest(name, methods); got != want {
			t.Errorf("Closest(%q) = %q, want %q", name, got, want)
		}
	}
}
