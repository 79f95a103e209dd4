package main

import "testing"

// TestWithoutNegativeZeros checks the demo's text filter on the shapes of
// issue 21 ("(-0.0, 345.2)") and on numbers it must leave alone.
func TestWithoutNegativeZeros(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"A (-0.0, 345.2) kN;", "A (0.0, 345.2) kN;"},
		{"-0 and -0.000", "0 and 0.000"},
		{"(-0.0,-0.0)", "(0.0,0.0)"},
		{"-0.05 -10.0 -0.5 x-0.01 -100", "-0.05 -10.0 -0.5 x-0.01 -100"},
		{"M = -0.0 kN·m", "M = 0.0 kN·m"},
		{"at -0.0.", "at 0.0."},
		{"-0.", "0."},
	} {
		if got := withoutNegativeZeros(tc.in); got != tc.want {
			t.Errorf("withoutNegativeZeros(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}
