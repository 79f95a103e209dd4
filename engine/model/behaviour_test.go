package model

import (
	"strings"
	"testing"

	"gusset/engine/fault"
)

// TestBehaviourCompiles checks the one-sided members and pretension as
// compiled: a cable is a tension-only bar, a behaviour and a pretension
// are kept, and NonLinear says the model needs the iterated solve.
func TestBehaviourCompiles(t *testing.T) {
	s := triangle()
	s.Members[0].Type = "cable"
	s.Members[0].Pretension = fptr(5)
	s.Members[1].Behaviour = "compression-only"
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	if mem := m.Members[0]; mem.Kind != Bar || !mem.Cable || mem.Behaviour != TensionOnly || mem.Pretension != 5 {
		t.Errorf("cable compiled as %+v", mem)
	}
	if m.Members[1].Behaviour != CompressionOnly || m.Members[2].Behaviour != Both {
		t.Errorf("behaviours %v, %v", m.Members[1].Behaviour, m.Members[2].Behaviour)
	}
	if !m.NonLinear() {
		t.Error("NonLinear false with a cable")
	}
	plain, err := Compile(triangle())
	if err != nil || plain.NonLinear() {
		t.Errorf("plain triangle: NonLinear %v, err %v", plain != nil && plain.NonLinear(), err)
	}
}

// TestBehaviourProblems checks each refusal and its pointer.
func TestBehaviourProblems(t *testing.T) {
	for _, tc := range []struct {
		name   string
		mutate func(s *Spec)
		path   string
		text   string
	}{
		{"unknown behaviour", func(s *Spec) { s.Members[1].Behaviour = "tension" }, "members/1/behaviour", `"tension-only" or "compression-only"`},
		{"compression-only cable", func(s *Spec) { s.Members[1].Type, s.Members[1].Behaviour = "cable", "compression-only" }, "members/1/behaviour", "tension-only"},
		{"one-sided beam", func(s *Spec) { s.Members[1].Type, s.Members[1].Behaviour = "beam", "tension-only" }, "members/1/behaviour", "beam"},
		{"pretensioned beam", func(s *Spec) { s.Members[2].Type, s.Members[2].Pretension = "beam", fptr(1) }, "members/2/pretension", "beam"},
		{"negative pretension", func(s *Spec) { s.Members[0].Pretension = fptr(-1) }, "members/0/pretension", "at least 0"},
		{"pretensioned strut", func(s *Spec) { s.Members[0].Behaviour, s.Members[0].Pretension = "compression-only", fptr(2) }, "members/0/pretension", "compression-only"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := triangle()
			tc.mutate(s)
			_, err := Compile(s)
			if err == nil {
				t.Fatal("compiled without error")
			}
			fe, ok := fault.As(err)
			if !ok {
				t.Fatalf("error %T is not a *fault.Error: %v", err, err)
			}
			for _, p := range fe.Problems {
				if p.Path == tc.path && strings.Contains(p.Message, tc.text) {
					return
				}
			}
			t.Errorf("no problem at %q mentioning %q; got %+v", tc.path, tc.text, fe.Problems)
		})
	}
}
