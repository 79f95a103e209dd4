package expr

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestControlCharacters checks that a control character anywhere in an
// expression is an error at its byte offset, not the end of the
// expression: "3\x00)))garbage" once evaluated to 3 because the parser
// read the NUL as the end of its input. Tab, newline and carriage return
// stay white space. (C0 controls are U+0000–U+001F and DEL is U+007F:
// The Unicode Standard 15.0, §23.1.)
func TestControlCharacters(t *testing.T) {
	for _, tc := range []struct {
		src string
		pos int
	}{
		{"3\x00)))garbage", 1},
		{"\x00", 0},
		{"1+\x01", 2},
		{"depth\x1f*2", 5},
		{"2*\x7f", 2},
	} {
		t.Run(strings.ToValidUTF8(tc.src, "?"), func(t *testing.T) {
			_, err := Compile(tc.src, testParams)
			var se *SyntaxError
			if !errors.As(err, &se) {
				t.Fatalf("%q: got %v, want a *SyntaxError", tc.src, err)
			}
			if se.Pos != tc.pos || !strings.Contains(se.Msg, "control character") {
				t.Errorf("%q: error at %d (%s), want a control character at %d", tc.src, se.Pos, se.Msg, tc.pos)
			}
		})
	}
	p, err := Compile("depth\t*\r\n2", testParams)
	if err != nil {
		t.Fatal(err)
	}
	if v, err := p.Eval(testValues); err != nil || v != 6 {
		t.Errorf("white space with tab and line breaks: %v, %v; want 6", v, err)
	}
}

// TestLengthLimit checks that an expression longer than MaxLength is a
// syntax error at the byte where the limit is crossed, and that one just
// within it compiles: a sum of n ones is exactly n (integers below 2⁵³ add
// exactly in IEEE 754 binary64, IEEE 754-2019 §3.3), and n copies of depth
// = 3 sum to 3n exactly for the same reason.
func TestLengthLimit(t *testing.T) {
	over := strings.Repeat("1+", MaxLength/2) + "1"
	_, err := Compile(over, testParams)
	var se *SyntaxError
	if !errors.As(err, &se) || se.Pos != MaxLength || !strings.Contains(se.Msg, "longer than") {
		t.Fatalf("an expression of %d bytes: got %v, want a syntax error at byte %d", len(over), err, MaxLength)
	}

	n := (MaxLength - 1) / 2
	ones := strings.Repeat("1+", n) + "1"
	p, err := Compile(ones, testParams)
	if err != nil {
		t.Fatalf("%d bytes: %v", len(ones), err)
	}
	if v, ok := p.Constant(); !ok || v != float64(n+1) {
		t.Errorf("a sum of %d ones folds to %v (constant %v), want %d", n+1, v, ok, n+1)
	}

	k := (MaxLength - 5) / 6
	depths := strings.Repeat("depth+", k) + "depth"
	p, err = Compile(depths, testParams)
	if err != nil {
		t.Fatal(err)
	}
	if v, err := p.Eval(testValues); err != nil || v != 3*float64(k+1) {
		t.Errorf("a sum of %d depths = %v, %v; want %v", k+1, v, err, 3*float64(k+1))
	}
	// The canonical form of a long flat sum is written without recursion
	// and compiles back to the same value.
	q, err := Compile(p.String(), testParams)
	if err != nil {
		t.Fatal(err)
	}
	if w, err := q.Eval(testValues); err != nil || math.Float64bits(w) != math.Float64bits(3*float64(k+1)) {
		t.Errorf("canonical form evaluates to %v, %v", w, err)
	}
}

// TestCompileMemory checks that compiling costs a small multiple of the
// source: every instruction (16 bytes) comes from at least one byte of
// source, so the parser's buffer is at most 16 bytes per byte and the
// program's exact copy at most as much again; a sum of constants, which
// folds as it is read, keeps one instruction. The measurement is
// testing.Benchmark's allocation count, not a time. Before the parser
// wrote postfix code directly, the three cases allocated 48, 104 and 77
// bytes per byte.
func TestCompileMemory(t *testing.T) {
	if testing.Short() {
		t.Skip("allocates a few megabytes")
	}
	for _, tc := range []struct {
		name    string
		src     string
		perByte float64
	}{
		{"parameter-sum", strings.Repeat("depth+", (MaxLength-5)/6) + "depth", 32},
		{"constant-sum", strings.Repeat("1+", (MaxLength-1)/2) + "1", 17},
		{"mixed", strings.Repeat("sqrt(depth^2+1)*2-", (MaxLength-1)/18) + "1", 32},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := testing.Benchmark(func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := Compile(tc.src, testParams); err != nil {
						b.Fatal(err)
					}
				}
			})
			got := float64(r.AllocedBytesPerOp()) / float64(len(tc.src))
			if got > tc.perByte {
				t.Errorf("%d bytes of source allocate %.1f bytes per byte, want at most %v", len(tc.src), got, tc.perByte)
			}
		})
	}
}
