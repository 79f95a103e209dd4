package expr

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

var testParams = []string{"depth", "span", "n", "theta"}
var testValues = []float64{3, 24, 6, 0.5}

func TestEval(t *testing.T) {
	depth, span, n, theta := 3.0, 24.0, 6.0, 0.5
	// Reference values are computed with Go's math package, an
	// implementation independent of this parser and evaluator.
	for _, tc := range []struct {
		src  string
		want float64
	}{
		{"1", 1},
		{"1e-3", 1e-3},
		{"2.5E+2", 250},
		{".5", 0.5},
		{"1 + 2 * 3", 7},
		{"(1 + 2) * 3", 9},
		{"10 - 4 - 3", 3},
		{"24 / 4 / 3", 2},
		// ^ binds tighter than unary minus and is right-associative, as in
		// standard mathematical notation (common practice).
		{"-2^2", -4},
		{"(-2)^2", 4},
		{"2^3^2", 512},
		{"2^-1", 0.5},
		{"- -3", 3},
		{"+3", 3},
		{"depth", depth},
		{"span / n", span / n},
		{"sqrt(depth^2 + (span/n)^2)", math.Hypot(depth, span/n)},
		{"sin(theta)^2 + cos(theta)^2", math.Pow(math.Sin(theta), 2) + math.Pow(math.Cos(theta), 2)},
		{"tan(theta)", math.Tan(theta)},
		{"atan2(depth, span/2)", math.Atan2(depth, span/2)},
		{"abs(-depth)", depth},
		{"min(depth)", depth},
		{"min(span, depth, n)", 3},
		{"max(span, depth, n)", 24},
		{"pi", math.Pi},
		{"2*pi*depth", 2 * math.Pi * depth},
		{"depth*1e3/span", depth * 1e3 / span},
		{" \tdepth\n*2 ", 6},
		{"-depth^2", -depth * depth},
		{"2*-depth", -6},
	} {
		p, err := Compile(tc.src, testParams)
		if err != nil {
			t.Errorf("%q: %v", tc.src, err)
			continue
		}
		got, err := p.Eval(testValues)
		if err != nil {
			t.Errorf("%q: %v", tc.src, err)
			continue
		}
		if !scalar.EqualWithinAbsOrRel(got, tc.want, 1e-15, 1e-14) {
			t.Errorf("%q = %v, want %v", tc.src, got, tc.want)
		}
	}
}

func TestEvalErrors(t *testing.T) {
	for _, tc := range []struct {
		src  string
		want error
	}{
		{"1/0", ErrDivisionByZero},
		{"depth/(n-6)", ErrDivisionByZero},
		{"sqrt(-1)", ErrSqrtNegative},
		{"sqrt(depth - span)", ErrSqrtNegative},
		{"10^400", ErrNotFinite},
		{"span^1000", ErrNotFinite},
		{"(-8)^(1/3)", ErrNotFinite}, // a negative base with a non-integer exponent is NaN in IEEE 754 pow
	} {
		p, err := Compile(tc.src, testParams)
		if err != nil {
			t.Errorf("%q: compile: %v", tc.src, err)
			continue
		}
		got, err := p.Eval(testValues)
		if !errors.Is(err, tc.want) {
			t.Errorf("%q = %v, %v; want error %v", tc.src, got, err, tc.want)
		}
	}
	p, _ := Compile("depth", testParams)
	if _, err := p.Eval([]float64{math.Inf(1), 0, 0, 0}); !errors.Is(err, ErrNotFinite) {
		t.Errorf("infinite parameter: got %v, want ErrNotFinite", err)
	}
}

func TestSyntaxErrors(t *testing.T) {
	for _, tc := range []struct {
		src  string
		pos  int
		text string
	}{
		{"", 0, "empty"},
		{"   ", 3, "empty"},
		{"1 +", 3, "ends too early"},
		{"2*(depth", 8, "missing \")\""},
		{"depth)", 5, "without a matching"},
		{"3 4", 2, "expected an operator"},
		{"1 # 2", 2, "\"#\""},
		{"1e", 1, "exponent"},
		{"1e400", 0, "out of range"},
		{".", 0, "digit"},
		{"atan2(1)", 0, "atan2 takes 2 arguments, got 1"},
		{"sqrt(1, 2)", 0, "sqrt takes 1 argument, got 2"},
		{"min()", 0, "min takes at least 1 argument, got 0"},
		{"max(1 2)", 6, "expected \",\" or \")\""},
		{"sin(1", 5, "missing \")\""},
		{"()", 1, "unexpected \")\""},
		{strings.Repeat("(", 300) + "1" + strings.Repeat(")", 300), 0, "nested too deeply"},
	} {
		_, err := Compile(tc.src, testParams)
		var se *SyntaxError
		if !errors.As(err, &se) {
			t.Errorf("%q: got %v, want a *SyntaxError", tc.src, err)
			continue
		}
		if tc.text != "nested too deeply" && se.Pos != tc.pos {
			t.Errorf("%q: position %d, want %d (%s)", tc.src, se.Pos, tc.pos, se.Msg)
		}
		if !strings.Contains(se.Msg, tc.text) {
			t.Errorf("%q: message %q does not mention %q", tc.src, se.Msg, tc.text)
		}
	}
}

func TestNameErrors(t *testing.T) {
	for _, tc := range []struct {
		src, msg   string
		pos        int
		candidates []string
	}{
		{"2*dpeth", `unknown parameter "dpeth" (did you mean "depth"?); parameters are: depth, span`, 2, []string{"depth"}},
		{"spam + 1", `unknown parameter "spam" (did you mean "span"?); parameters are: depth, span`, 0, []string{"span"}},
		{"height", `unknown parameter "height"; parameters are: depth, span`, 0, nil},
		{"sqr(2)", `unknown function "sqr" (did you mean "sqrt"?); functions are: abs, atan2, cos, max, min, sin, sqrt, tan`, 0, []string{"sqrt"}},
	} {
		_, err := Compile(tc.src, []string{"span", "depth"})
		var ne *NameError
		if !errors.As(err, &ne) {
			t.Errorf("%q: got %v, want a *NameError", tc.src, err)
			continue
		}
		if err.Error() != tc.msg || ne.Pos != tc.pos || strings.Join(ne.Candidates, ",") != strings.Join(tc.candidates, ",") {
			t.Errorf("%q: got %q at %d with %v; want %q at %d with %v", tc.src, err, ne.Pos, ne.Candidates, tc.msg, tc.pos, tc.candidates)
		}
	}
	if _, err := Compile("x", nil); err == nil || !strings.Contains(err.Error(), "there are no parameters") {
		t.Errorf("no parameters: got %v", err)
	}
}

func TestUsesAndFolding(t *testing.T) {
	for _, tc := range []struct {
		src      string
		uses     []int
		constant bool
	}{
		{"2*pi + sqrt(16)", nil, true},
		{"theta + depth*depth", []int{0, 3}, false},
		{"span*0 + 1", []int{1}, false}, // no algebraic simplification: span could be non-finite
		{"1/0", nil, false},             // a failing constant stays code so Eval reports it
	} {
		p, err := Compile(tc.src, testParams)
		if err != nil {
			t.Fatal(err)
		}
		if got := p.Uses(); len(got) != len(tc.uses) || (len(got) > 0 && !equalInts(got, tc.uses)) {
			t.Errorf("%q: uses %v, want %v", tc.src, got, tc.uses)
		}
		if _, ok := p.Constant(); ok != tc.constant {
			t.Errorf("%q: constant %v, want %v", tc.src, ok, tc.constant)
		}
	}
}

func equalInts(a, b []int) bool {
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return len(a) == len(b)
}

// TestEditDistance checks the optimal-string-alignment distance against
// hand-counted edits (Damerau, "A technique for computer detection and
// correction of spelling errors", CACM 7(3), 1964: one transposition
// counts as one edit).
func TestEditDistance(t *testing.T) {
	for _, tc := range []struct {
		a, b string
		want int
	}{
		{"", "", 0}, {"a", "", 1}, {"depth", "dpeth", 1}, {"kitten", "sitting", 3}, {"span", "spam", 1}, {"ca", "abc", 3},
	} {
		if got := editDistance(tc.a, tc.b); got != tc.want {
			t.Errorf("editDistance(%q, %q) = %d, want %d", tc.a, tc.b, got, tc.want)
		}
	}
}

func TestEvalAllocatesNothing(t *testing.T) {
	p, err := Compile("sqrt(depth^2 + (span/n)^2) * max(1, theta, 2) - min(depth, 1)", testParams)
	if err != nil {
		t.Fatal(err)
	}
	allocs := testing.AllocsPerRun(100, func() { _, _ = p.Eval(testValues) })
	if allocs != 0 {
		t.Errorf("Eval allocates %v times per call", allocs)
	}
}
