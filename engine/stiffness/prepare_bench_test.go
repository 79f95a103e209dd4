package stiffness

import (
	"context"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/engine/statics"
)

// BenchmarkPrepare times what Solve does between the compiled model and
// assembly on the reference benchmark's 2D grid (k = 300: 270,600 bars,
// 180,600 equations): number the freedoms, check the model and its parts,
// count its stability (the equilibrium matrix's layout) and build the
// pattern of K. B/op is the fresh memory these phases take, which on a
// fresh process costs a page fault per 4 KiB.
func BenchmarkPrepare(b *testing.B) {
	m, err := model.Compile(modelgen.GridTruss2D(300, 300))
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		nb := newNumbering(m)
		if err := validate(m, nb); err != nil {
			b.Fatal(err)
		}
		if _, err := checkParts(m, nb); err != nil {
			b.Fatal(err)
		}
		if _, err := statics.Analyse(context.Background(), m, statics.Options{DenseLimit: -1}); err != nil {
			b.Fatal(err)
		}
		newPattern(m, nb)
	}
}
