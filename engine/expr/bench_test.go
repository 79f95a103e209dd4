package expr

import "testing"

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
