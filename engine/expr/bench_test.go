package expr

import (
	"strings"
	"testing"
)

func BenchmarkEval(b *testing.B) {
	for _, bc := range []struct{ name, src string }{
		{"param", "depth"},
		{"chord", "sqrt(depth^2 + (span/n)^2)"},
		{"long", "max(depth, 1) * sin(theta) + min(span/n, 4)^2 - atan2(depth, span) * 2*pi / (1 + abs(theta))"},
	} {
		p, err := Compile(bc.src, testParams)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(bc.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := p.Eval(testValues); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkCompile(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Compile("sqrt(depth^2 + (span/n)^2) * max(1, theta)", testParams); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCompileLong compiles an expression of MaxLength bytes that does
// not fold (sqrt of a parameter), the worst case for memory per byte.
func BenchmarkCompileLong(b *testing.B) {
	src := strings.Repeat("sqrt(depth^2+1)*2-", (MaxLength-1)/18) + "1"
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Compile(src, testParams); err != nil {
			b.Fatal(err)
		}
	}
}
