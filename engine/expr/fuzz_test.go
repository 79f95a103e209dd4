package expr

import (
	"errors"
	"math"
	"testing"
)

// FuzzCompile checks, for any input: Compile does not panic; it returns a
// program or a *SyntaxError / *NameError with a position inside the
// source; a program evaluates to a finite number or one of the three
// evaluation errors; and its canonical String compiles again to a program
// with the same String and the same result, bit for bit.
func FuzzCompile(f *testing.F) {
	for _, seed := range []string{
		"1", "1e-3", "-2^2", "2^3^2", "depth*2", "sqrt(depth^2+(span/n)^2)",
		"atan2(depth, span)", "min(1,2,3)", "max(depth)", "1/0", "sqrt(-1)",
		"2*(depth", "dpeth", "foo(1)", "((((1))))", "pi*span", "- -+-1", "1e400", "10^400", "3\x00)))garbage", "1+\x7f", "((1))+2+3+4+5+6+7+8+9",
		".5e+1", "abs(-0)", "tan(pi/2)", "span/-0",
	} {
		f.Add(seed)
	}
	params := []string{"depth", "span", "n"}
	values := []float64{3, 24, 6}
	f.Fuzz(func(t *testing.T, src string) {
		p, err := Compile(src, params)
		if err != nil {
			var se *SyntaxError
			var ne *NameError
			switch {
			case errors.As(err, &se):
				if se.Pos < 0 || se.Pos > len(src) {
					t.Fatalf("%q: position %d outside the source", src, se.Pos)
				}
			case errors.As(err, &ne):
				if ne.Pos < 0 || ne.Pos+len(ne.Name) > len(src) || src[ne.Pos:ne.Pos+len(ne.Name)] != ne.Name {
					t.Fatalf("%q: name error %q at %d does not point at the name", src, ne.Name, ne.Pos)
				}
			default:
				t.Fatalf("%q: unexpected error type %T", src, err)
			}
			return
		}
		v, evalErr := p.Eval(values)
		if evalErr == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
			t.Fatalf("%q evaluated to %v without an error", src, v)
		}
		if evalErr != nil && !errors.Is(evalErr, ErrDivisionByZero) && !errors.Is(evalErr, ErrSqrtNegative) && !errors.Is(evalErr, ErrNotFinite) {
			t.Fatalf("%q: unexpected evaluation error %v", src, evalErr)
		}
		canon := p.String()
		q, err := Compile(canon, params)
		if err != nil {
			t.Fatalf("%q: canonical form %q does not compile: %v", src, canon, err)
		}
		if q.String() != canon {
			t.Fatalf("%q: canonical form not stable: %q then %q", src, canon, q.String())
		}
		w, err2 := q.Eval(values)
		if (evalErr == nil) != (err2 == nil) || (evalErr == nil && math.Float64bits(v) != math.Float64bits(w)) {
			t.Fatalf("%q = %v, %v but canonical %q = %v, %v", src, v, evalErr, canon, w, err2)
		}
	})
}
