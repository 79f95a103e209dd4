package sparse

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
)

type triplet struct {
	i, j int
	v    float64
}

// naiveDense accumulates triplets into a gonum dense symmetric matrix, the
// reference the compressed result is compared with.
func naiveDense(n int, ts []triplet) *mat.SymDense {
	d := mat.NewSymDense(n, nil)
	for _, t := range ts {
		d.SetSym(t.i, t.j, d.At(t.i, t.j)+t.v)
	}
	return d
}

// checkCompressed verifies the storage contract of Matrix and that its
// values equal the naive accumulation of the triplets.
func checkCompressed(t *testing.T, a *Matrix, n int, ts []triplet) {
	t.Helper()
	if a.N != n || len(a.ColPtr) != n+1 || a.ColPtr[0] != 0 {
		t.Fatalf("bad shape: N=%d len(ColPtr)=%d", a.N, len(a.ColPtr))
	}
	seen := map[[2]int]bool{}
	for _, tr := range ts {
		seen[[2]int{max(tr.i, tr.j), min(tr.i, tr.j)}] = true
	}
	if a.Nonzeros() != len(seen) {
		t.Fatalf("stored %d entries, want %d distinct", a.Nonzeros(), len(seen))
	}
	for j := 0; j < n; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			i := a.RowIdx[p]
			if i < j || (p > a.ColPtr[j] && a.RowIdx[p-1] >= i) {
				t.Fatalf("column %d: rows not in lower triangle or not strictly ascending", j)
			}
		}
	}
	if n == 0 {
		return
	}
	want := naiveDense(n, ts)
	got := dense(a)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			// Summation order may differ from the naive one: a relative
			// tolerance of a few ulps per summand (common practice).
			if !scalar.EqualWithinAbsOrRel(got.At(i, j), want.At(i, j), 1e-12, 1e-12) {
				t.Fatalf("entry (%d,%d) = %v, want %v", i, j, got.At(i, j), want.At(i, j))
			}
		}
	}
}

func TestBuilder(t *testing.T) {
	for _, tc := range []struct {
		name string
		n    int
		ts   []triplet
	}{
		{"empty", 0, nil},
		{"no entries", 3, nil},
		{"diagonal", 3, []triplet{{0, 0, 1}, {1, 1, 2}, {2, 2, 3}}},
		{"both triangles summed", 2, []triplet{{0, 1, 1.5}, {1, 0, 2.5}, {0, 0, 1}}},
		{"duplicates and zero kept", 4, []triplet{{3, 1, 1}, {3, 1, -1}, {1, 3, 0.25}, {2, 2, 0}, {0, 3, 7}}},
		{"reverse insertion", 5, []triplet{{4, 4, 1}, {4, 0, 2}, {3, 3, 3}, {2, 0, 4}, {1, 0, 5}, {0, 0, 6}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			b := NewBuilder(tc.n, 0)
			for _, tr := range tc.ts {
				b.Add(tr.i, tr.j, tr.v)
			}
			checkCompressed(t, b.Matrix(), tc.n, tc.ts)
		})
	}
}

func TestBuilderPanics(t *testing.T) {
	for _, tc := range []struct{ i, j int }{{-1, 0}, {0, 3}, {3, 3}} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("Add(%d, %d) on n=3 did not panic", tc.i, tc.j)
				}
			}()
			NewBuilder(3, 0).Add(tc.i, tc.j, 1)
		}()
	}
}

// FuzzBuilder feeds random triplets through Builder and checks the
// compressed matrix against the storage contract and a naive dense sum.
func FuzzBuilder(f *testing.F) {
	f.Add(uint8(5), []byte{1, 2, 3, 4, 5, 6, 7, 8, 9})
	f.Add(uint8(1), []byte{0, 0, 0})
	f.Add(uint8(30), []byte{29, 0, 1, 0, 29, 2, 3, 3, 200, 3, 3, 9})
	f.Fuzz(func(t *testing.T, size uint8, data []byte) {
		n := int(size%40) + 1
		var ts []triplet
		for len(data) >= 3 {
			i, j := int(data[0])%n, int(data[1])%n
			v := float64(int8(data[2])) / 4
			ts = append(ts, triplet{i, j, v})
			data = data[3:]
		}
		b := NewBuilder(n, len(ts)/2)
		for _, tr := range ts {
			b.Add(tr.i, tr.j, tr.v)
		}
		a := b.Matrix()
		checkCompressed(t, a, n, ts)
		a.check()
		for _, tr := range ts {
			p := a.Find(tr.i, tr.j)
			if p < 0 || a.RowIdx[p] != max(tr.i, tr.j) {
				t.Fatalf("Find(%d, %d) = %d", tr.i, tr.j, p)
			}
		}
	})
}
